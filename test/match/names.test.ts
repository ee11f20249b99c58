/**
 * Name folding, readings of abbreviations, the edit distance and the deletion-neighbourhood index keys.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { editDistance, MIN_FUZZY_TOKEN_LENGTH, MIN_HALVES_LENGTH, MIN_TWO_EDIT_LENGTH, oneEditQueryKeys, queryTokenKeys, storedTokenKeys } from '../../src/match/edit-distance.ts';
import { foldName, nameVariants } from '../../src/match/fold.ts';
import { administrativeKey, contextMismatch, countryCodeForName, countryExonymLanguage, foundUnderUnitKeys, resolveContext, shortFormKey, unitLookupNames } from '../../src/match/context.ts';
import { DEFAULT_RADII } from '../../src/georef/default-radii.ts';
import type { UnitLevel } from '../../src/match/types.ts';

describe('foldName', () => {
  // Canonical decompositions from the Unicode Standard (UAX #15, normalization forms): é = e + U+0301,
  // ã = a + U+0303, ç = c + U+0327; the marks are dropped after NFKD.
  it.each([
    ['São Tomé', 'sao tome'],
    ['Peña  Blanca', 'pena blanca'],
    ['Saint-Laurent-des-Brumes', 'saint laurent des brumes'],
    ["L'Anse-à-l'Âne", 'l anse a l ane'],
    ['Straße', 'strasse'],
    ['Ærøskøbing', 'aeroskobing'],
    ['Łódź', 'lodz'],
    ['  Sta.Rosa (ca.) ', 'sta rosa ca'],
    ['Москва', 'москва'],
  ])('folds %s to %s', (written, folded) => {
    expect(foldName(written)).toBe(folded);
  });

  it('folds the composed and the decomposed form alike (UAX #15 canonical equivalence)', () => {
    expect(foldName('Bogot\u00e1')).toBe(foldName('Bogota\u0301'));
  });
});

describe('nameVariants', () => {
  it('reads each abbreviation every way it may be meant', () => {
    const keys = nameVariants('S. Tomé').map((v) => v.key);
    expect(keys).toEqual(['s tome', 'san tome', 'santa tome', 'santo tome', 'sao tome']);
  });

  it('leaves out optional generic words and a leading article', () => {
    expect(nameVariants('Hacienda El Carmen').map((v) => v.key)).toEqual(['hacienda el carmen', 'el carmen', 'carmen']);
    expect(nameVariants('Estancia La Paloma')[1]).toEqual({ key: 'la paloma', change: 'generic word left out' });
  });

  it('never reads a one-word name as an abbreviation', () => {
    expect(nameVariants('Co').map((v) => v.key)).toEqual(['co']);
  });
});

describe('administrative names and countries', () => {
  it('compares units without the words for their kind', () => {
    expect(administrativeKey('Provincia de Salta')).toBe('salta');
    expect(administrativeKey('Departamento del Cauca')).toBe('cauca');
    expect(administrativeKey('Worcester County')).toBe('worcester');
    expect(administrativeKey('County')).toBe('county');
  });

  it('looks a stated unit up as written, then without its kind word, as set 3 writes counties ("Grand Co.", "Duchesne County")', () => {
    // records-3.csv (test/fixtures/real/README.md) states counties as "Grand Co." and "Grand" alike
    expect(unitLookupNames('Grand Co.')).toEqual(['Grand Co.', 'grand']);
    expect(unitLookupNames('Duchesne County')).toEqual(['Duchesne County', 'duchesne']);
    expect(unitLookupNames('Grand')).toEqual(['Grand']);
  });

  it('compares a unit\'s official long form "X de <honoree>" by its short form, and no other "de"', () => {
    // Official names of Mexican states as their constitutions give them (from memory): "Veracruz de Ignacio de
    // la Llave", "Michoacán de Ocampo", "Coahuila de Zaragoza"; the gazetteer writes "Veracruz".
    expect(shortFormKey('Veracruz de Ignacio de la Llave')).toBe('veracruz');
    expect(shortFormKey('Michoacán de Ocampo')).toBe('michoacan');
    expect(shortFormKey('Provincia de Salta')).toBe('salta');
    expect(shortFormKey('Mato Grosso do Sul')).toBe('mato grosso sul');
    const veracruz = { stateProvince: 'Veracruz', countryCode: 'MX' } as Parameters<typeof contextMismatch>[0];
    expect(contextMismatch(veracruz, resolveContext({ countryCode: 'MX', stateProvince: 'VERACRUZ DE IGNACIO DE LA LLAVE' }))).toBeNull();
    expect(contextMismatch(veracruz, resolveContext({ countryCode: 'MX', stateProvince: 'Puebla' }))).not.toBeNull();
  });

  it('reads a feature\'s recorded state code as the loaded unit holding it, and a unit\'s own name as that unit only', () => {
    // The loaded unit names of Natural Earth's 1:50m admin-1 Washington and Idaho imported with their postal and
    // ISO 3166-2 codes (public domain; test/e2e/real-files.test.ts imports the file itself): key → unit keys
    const loaded: Record<string, string[]> = { wa: ['washington'], 'us wa': ['washington'], washington: ['washington'], id: ['idaho'], idaho: ['idaho'] };
    const stated = (stateProvince: string) => {
      const context = resolveContext({ countryCode: 'US', stateProvince });
      return { ...context, stateProvinceAliases: new Set(loaded[context.stateProvinceKey!] ?? []), unitsNamed: (_level: UnitLevel, key: string) => loaded[key] ?? [] };
    };
    const county = (stateProvince: string) => ({ name: 'Pierce', featureType: 'county', stateProvince, countryCode: 'US' }) as Parameters<typeof contextMismatch>[0];
    const town = (stateProvince: string) => ({ name: 'Tacoma', featureType: 'populated place', stateProvince, countryCode: 'US' }) as Parameters<typeof contextMismatch>[0];
    // input (the feature's recorded state, the record's) side by side with the expected reading
    const cases: [recorded: string, record: string, fits: boolean][] = [
      ['WA', 'Washington', true], ['WA', 'US-WA', true], ['US-WA', 'Washington', true], ['WA', 'Idaho', false],
      // "Washington" is a loaded unit's own name: it names that unit, whatever other names it shares
      ['Washington', 'Idaho', false], ['XX', 'Washington', false],
    ];
    for (const [recorded, record, fits] of cases) expect(contextMismatch(town(recorded), stated(record)) === null, `${recorded} / ${record}`).toBe(fits);
    // a county's own state is its parent: the same reading (a county is compared by its state, not by its name)
    expect(contextMismatch(county('WA'), stated('Washington'))).toBeNull();
    // without the loaded units the code stays unread, as before
    expect(contextMismatch(town('WA'), resolveContext({ countryCode: 'US', stateProvince: 'Washington' }))).toBe("state/province 'WA', not the one given");
  });

  it('finds a unit written by a code under its own name, whose key may lack a word of the name ("rio grande norte")', () => {
    // The unit names of Natural Earth's 1:50m admin-1 Rio Grande do Norte (public domain; postal code "RN") and of
    // IBGE's municipality 2412401 São José do Seridó (github.com/tbrugz/geodata-br, CC0 1.0): the key a code names
    // is the unit's administrativeKey, which drops "do"; the lookup by that key may bring near names, kept only
    // when their own key is that key. Input and expected side by side.
    const unit = (name: string, featureId: string) => ({ sourceId: 'units', featureId, name, alternateNames: [] as string[] }) as unknown as Parameters<typeof contextMismatch>[0];
    const near = [unit('Rio Grande do Norte', 'RN'), unit('Rio Grande do Sul', 'RS'), unit('São José do Seridó', '2412401'), unit('Santana do Seridó', '2411429')];
    const find = () => near;
    const cases: [written: string, unitKeys: string[], found: string[]][] = [
      ['RN', ['rio grande norte'], ['RN']],
      ['2412401', ['sao jose serido'], ['2412401']],
      // the written name's own key is no other name of it
      ['Rio Grande do Norte', ['rio grande norte'], []],
      ['XX', [], []],
    ];
    for (const [written, unitKeys, found] of cases) {
      expect(foundUnderUnitKeys(written, unitKeys, find, (f) => f).map((f) => f.featureId), written).toEqual(found);
    }
  });

  it('resolves country names in four languages to ISO 3166-1 alpha-2 codes (CLDR names through Intl)', () => {
    expect(countryCodeForName('Brasil')).toBe('BR');
    expect(countryCodeForName('Brazil')).toBe('BR');
    expect(countryCodeForName('Estados Unidos')).toBe('US');
    expect(countryCodeForName('Allemagne')).toBe('DE');
    expect(countryCodeForName('México')).toBe('MX');
    expect(countryCodeForName('ar')).toBe('AR');
    expect(countryCodeForName('Atlantis')).toBeNull();
  });

  it('knows a country\'s name in German, Italian and Dutch (Unicode CLDR region names through Intl) and in Latin (from memory), accents as written', () => {
    // CLDR 48 (ICU 78.2 of the Node 20 used here), region names: de "Brasilien", it "Messico", nl "Verenigde Staten".
    expect(countryExonymLanguage('Brasilien', 'BR')).toBe('German');
    expect(countryExonymLanguage('messico', 'MX')).toBe('Italian');
    expect(countryExonymLanguage('Verenigde Staten', 'US')).toBe('Dutch');
    // New Latin "Brasilia" for Brazil (from memory); the capital is written "Brasília" and is no country name.
    expect(countryExonymLanguage('Brasilia', 'BR')).toBe('Latin');
    expect(countryExonymLanguage('Brasília', 'BR')).toBeNull();
    // Only the given country's names, and none of the four languages' names (countryCodeForName reads those).
    expect(countryExonymLanguage('Brasilia', 'PT')).toBeNull();
    expect(countryExonymLanguage('Canada', 'CA')).toBeNull();
  });
});

describe('editDistance (optimal string alignment)', () => {
  // Values as in the definition of Damerau–Levenshtein distance with the restricted (OSA) edit set:
  // CA → ABC is 3 under OSA (2 under unrestricted transpositions), kitten → sitting is 3
  // (Levenshtein 1966's measure, the usual textbook example; from memory).
  it.each([
    ['kitten', 'sitting', 3],
    ['ca', 'abc', 3],
    ['rosario', 'rosraio', 1],
    ['', 'abc', 3],
    ['abc', 'abc', 0],
  ])('%s → %s = %i', (a, b, distance) => {
    expect(editDistance(a as string, b as string)).toBe(distance);
  });

  it('stops at the bound it is given', () => {
    expect(editDistance('rosario', 'lima', 2)).toBe(3);
    expect(editDistance('rosario', 'rosarios', 2)).toBe(1);
  });

  it('within a bound, gives the unbounded distance or bound + 1 (only the cells near the diagonal are computed)', () => {
    // The unbounded distance is checked against the textbook values above; near strings (a few typing
    // errors apart) walk the band's edges, other strings leave it at once.
    const word = fc.stringMatching(/^[abc]{0,12}$/);
    fc.assert(fc.property(word, word, fc.integer({ min: 0, max: 5 }), (a, b, max) => {
      expect(editDistance(a, b, max)).toBe(Math.min(editDistance(a, b), max + 1));
    }), { numRuns: 5000 });
    fc.assert(fc.property(token(3), fc.array(edit, { maxLength: 3 }), fc.integer({ min: 0, max: 4 }), (stored, edits, max) => {
      const query = edits.reduce((text, [kind, at, letter]) => typo(text, kind, at, letter), stored);
      expect(editDistance(query, stored, max)).toBe(Math.min(editDistance(query, stored), max + 1));
    }), { numRuns: 5000 });
  });
});

/** One typing error: insertion, deletion, substitution or adjacent transposition. */
const typo = (token: string, kind: number, at: number, letter: string): string => {
  const i = at % token.length;
  if (kind === 0) return token.slice(0, i) + letter + token.slice(i);
  if (kind === 1) return token.slice(0, i) + token.slice(i + 1);
  if (kind === 2) return token.slice(0, i) + letter + token.slice(i + 1);
  return i + 1 < token.length ? token.slice(0, i) + token[i + 1] + token[i] + token.slice(i + 2) : token;
};
const token = (minLength: number) => fc.stringMatching(new RegExp(`^[a-z]{${minLength},14}$`));
const edit = fc.tuple(fc.integer({ min: 0, max: 3 }), fc.nat(), fc.constantFrom(...'abcdefghijklmnopqrstuvwxyz'));
const shareKey = (stored: string, query: string, queryKeys = queryTokenKeys) => {
  const keys = new Set(queryKeys(query));
  return storedTokenKeys(stored).some((key) => keys.has(key));
};

describe('the deletion-neighbourhood index finds what it promises (fast-check properties)', () => {
  it.each([
    ['all the query keys', queryTokenKeys],
    ['the one-edit query keys alone', oneEditQueryKeys],
  ])('every stored token within one edit of the query, through %s', (_, queryKeys) => {
    fc.assert(fc.property(token(MIN_FUZZY_TOKEN_LENGTH), edit, (stored, [kind, at, letter]) => {
      const query = typo(stored, kind, at, letter);
      fc.pre(query.length >= 2);
      expect(shareKey(stored, query, queryKeys)).toBe(true);
    }), { numRuns: 2000 });
  });

  it(`every stored token of ${MIN_TWO_EDIT_LENGTH} letters or more within two edits`, () => {
    fc.assert(fc.property(token(MIN_TWO_EDIT_LENGTH), edit, edit, (stored, [k1, a1, l1], [k2, a2, l2]) => {
      const query = typo(typo(stored, k1, a1, l1), k2, a2, l2);
      expect(shareKey(stored, query)).toBe(true);
    }), { numRuns: 2000 });
  });

  // Every string within two edits of a query (its own letters and one other inserted or substituted):
  // the halves' keys (fronts with a letter deleted, backs whole) leave out none long enough to be kept by halves.
  it.each(['abcdefgh', 'abcdefghij', 'abcdefghijk', 'abcdefghijklm'])(`every stored token of ${MIN_HALVES_LENGTH} letters or more within two edits of %s`, (query) => {
    const letters = [...query, 'z'];
    const oneEdit = (text: string) => [
      ...Array.from({ length: text.length + 1 }, (_, i) => letters.map((letter) => text.slice(0, i) + letter + text.slice(i))).flat(),
      ...Array.from({ length: text.length }, (_, i) => [text.slice(0, i) + text.slice(i + 1), ...letters.map((letter) => text.slice(0, i) + letter + text.slice(i + 1))]).flat(),
      ...Array.from({ length: text.length - 1 }, (_, i) => text.slice(0, i) + text[i + 1] + text[i] + text.slice(i + 2)),
    ];
    const keys = new Set(queryTokenKeys(query));
    const missed = [...new Set(oneEdit(query).flatMap((once) => [once, ...oneEdit(once)]))]
      .filter((stored) => stored.length >= MIN_HALVES_LENGTH && !storedTokenKeys(stored).some((key) => keys.has(key)));
    expect(missed).toEqual([]);
  });
});

describe('default radii', () => {
  it('cover the whole feature vocabulary, each with its reasoning', () => {
    const vocabulary = ['city', 'town', 'village', 'hamlet', 'locality', 'farm', 'estate', 'station', 'bridge', 'island',
      'mountain', 'peak', 'hill', 'pass', 'lake', 'bay', 'cape', 'beach', 'waterfall', 'river', 'stream', 'river mouth',
      'road', 'trail', 'country', 'stateProvince', 'county', 'municipality', 'district', 'administrative unit', 'sea', 'channel',
      'wetland', 'spring', 'water body', 'valley', 'ridge', 'plain', 'terrain feature', 'building', 'airport', 'spot', 'park', 'area',
      'forest', 'undersea feature'];
    expect(Object.keys(DEFAULT_RADII).sort()).toEqual([...vocabulary].sort());
    for (const type of vocabulary) expect(DEFAULT_RADII[type].reasoning).toMatch(/no source|polygon|line/);
  });

  it('grow with the size of the settlement (common practice, no source)', () => {
    const { hamlet, village, town, city } = DEFAULT_RADII;
    expect(hamlet.meters < village.meters && village.meters < town.meters && town.meters < city.meters).toBe(true);
  });
});
