/**
 * Older spellings: a place name written as it was spelled before a spelling reform, read in the
 * spelling of today ("Curityba" → "curitiba"). These are documented readings, not typing errors: each
 * rule says what the older spelling wrote and which reform changed it. Only the rules of the record's
 * country or the text's language are read, and only while [CHOICE olderSpellings,
 * src/georef/method-defaults.ts] is 'on' (the query's `olderSpellings`). Pure, no I/O.
 *
 * Sources (the rules as the reforms state them; the details marked "from memory" were not checked
 * against the reform's text):
 * - Portuguese: Portugal's spelling reform of 1911 and Brazil's Formulário Ortográfico of 1943 (the
 *   Academia Brasileira de Letras' Pequeno Vocabulário Ortográfico) dropped the Greek digraphs ph, th,
 *   rh and ch for /k/, the letters y, k and w (y → i; k → qu before e and i, c elsewhere; w → v or u),
 *   most doubled consonants, and the silent h between vowels; they fixed j or g before e and i by the
 *   word's origin (Lages → Lajes). From memory; "Bahia" kept its h by custom, which is why each rule is
 *   only a possible reading and the gazetteer decides. The same reforms write a word's final nasal a
 *   with the til, "ã", where older spellings wrote "an" ("Camaquan" → Camaquã); gazetteers hold towns
 *   in either spelling ("Camacan" beside the labels' "Camacã"), so the til is read both ways. From memory.
 * - Spanish: the Real Academia Española's Ortografía of 1815 wrote j, not x, for the sound /x/
 *   (Xalapa → Jalapa, Méjico for México), and i, not y, for the vowel (Ysla → Isla). Many Mexican
 *   names kept or took back the x, so x and j are read both ways. From memory.
 */
import type { Language } from '../parse/types.ts';
import { nameVariants, type NameVariant } from './fold.ts';

/** The spelling reforms whose older forms a name may be written in. */
export type SpellingReform = 'portuguese' | 'spanish';

/** One rule: the older letters (a pattern over a folded name) and the modern letters they may stand for. */
interface SpellingRule {
  reform: SpellingReform;
  older: RegExp;
  modern: readonly string[];
  /** The rule in plain words, for the remarks. */
  says: string;
  /** True when the reform's letters were written either way for long after it (j and g, x and j): neither spelling is the older. */
  eitherWay?: true;
}

const PORTUGUESE_SOURCE = 'Portuguese reform of 1911, Brazilian Formulário Ortográfico of 1943; from memory';
const SPANISH_SOURCE = 'Real Academia Española, Ortografía of 1815; from memory';

/** The rules, most specific first: where two rules start at one letter, the first one written reads it. */
const RULES: readonly SpellingRule[] = [
  { reform: 'portuguese', older: /ph/g, modern: ['f'], says: "'ph' for 'f'" },
  { reform: 'portuguese', older: /th/g, modern: ['t'], says: "'th' for 't'" },
  { reform: 'portuguese', older: /rh/g, modern: ['r'], says: "'rh' for 'r'" },
  { reform: 'portuguese', older: /ch(?=[rl])/g, modern: ['c'], says: "'ch' for 'c' before r or l" },
  { reform: 'portuguese', older: /y/g, modern: ['i'], says: "'y' for 'i'" },
  { reform: 'portuguese', older: /k(?=[eiy])/g, modern: ['qu'], says: "'k' for 'qu' before e or i" },
  { reform: 'portuguese', older: /k/g, modern: ['c'], says: "'k' for 'c'" },
  { reform: 'portuguese', older: /w/g, modern: ['v', 'u'], says: "'w' for 'v' or 'u'" },
  { reform: 'portuguese', older: /(?<=[aeiouy])ss(?=[aeiouy])/g, modern: ['c'], says: "'ss' for 'ç'" },
  { reform: 'portuguese', older: /([bcdfglmnpt])\1/g, modern: ['$1'], says: 'a doubled consonant for a single one' },
  { reform: 'portuguese', older: /(?<=[aeiouy])h(?=[aeiouy])/g, modern: [''], says: "a silent 'h' between vowels" },
  { reform: 'portuguese', older: /g(?=[eiy])/g, modern: ['j'], says: "'g' and 'j' before e or i", eitherWay: true },
  { reform: 'portuguese', older: /j(?=[eiy])/g, modern: ['g'], says: "'g' and 'j' before e or i", eitherWay: true },
  // A folded "ã" is "a": "an" ending a word of two syllables or more stands for it.
  { reform: 'portuguese', older: /(?<=[a-z][aeiouy][^aeiouy ]?)an(?= |$)/g, modern: ['a'], says: "'an' for a final 'ã'" },
  { reform: 'spanish', older: /x/g, modern: ['j'], says: "'x' and 'j' for one sound", eitherWay: true },
  { reform: 'spanish', older: /j/g, modern: ['x'], says: "'x' and 'j' for one sound", eitherWay: true },
  { reform: 'spanish', older: /y(?![aeiou])/g, modern: ['i'], says: "'y' for the vowel 'i'" },
];

const SOURCES: Record<SpellingReform, string> = { portuguese: PORTUGUESE_SOURCE, spanish: SPANISH_SOURCE };

/** Countries where Spanish is the official language (ISO 3166-1 alpha-2; Puerto Rico with English). */
export const SPANISH_SPEAKING_COUNTRIES: ReadonlySet<string> = new Set(['AR', 'BO', 'CL', 'CO', 'CR', 'CU', 'DO', 'EC', 'ES', 'GQ', 'GT', 'HN', 'MX', 'NI', 'PA', 'PE', 'PR', 'PY', 'SV', 'UY', 'VE']);

/** Countries whose place names follow each reform (ISO 3166-1 alpha-2): Portuguese for Brazil and Portugal, Spanish where it is the official language. */
const COUNTRIES: Record<SpellingReform, ReadonlySet<string>> = {
  portuguese: new Set(['BR', 'PT']),
  spanish: SPANISH_SPEAKING_COUNTRIES,
};
const LANGUAGES: Partial<Record<Language, SpellingReform>> = { pt: 'portuguese', es: 'spanish' };

/** At most this many older-spelling readings of one name are looked up (common practice, no source). */
export const MAX_OLDER_SPELLINGS = 48;

/**
 * The reforms a name may be read through: those of the countries the lookup is held to and of the
 * text's language; none when neither is known.
 * @example spellingReforms(['BR'], undefined) // ['portuguese']
 * @example spellingReforms([], 'es') // ['spanish']
 */
export function spellingReforms(countryCodes: Iterable<string>, language: Language | undefined): SpellingReform[] {
  const codes = [...countryCodes].map((code) => code.toUpperCase());
  const byLanguage = language === undefined ? undefined : LANGUAGES[language];
  return (Object.keys(COUNTRIES) as SpellingReform[]).filter((reform) => reform === byLanguage || codes.some((code) => COUNTRIES[reform].has(code)));
}

/**
 * The modern spellings a folded name may stand for under the reforms' rules, each with the rules it
 * took in plain words (its `change`), every place read in the modern way first; the name itself is not among them. Every
 * rule is optional at every place it applies (a reform left some names as they were), so a name with
 * n such places has up to 2ⁿ readings, cut at MAX_OLDER_SPELLINGS.
 * @example olderSpellingReadings('curityba', ['portuguese'])[0]
 * // { key: 'curitiba', change: "'curityba' read as an older spelling of 'curitiba' ('y' for 'i'; Portuguese reform of 1911, …)" }
 * @example olderSpellingReadings('jalapa', ['spanish'])[0].key // 'xalapa'
 */
export function olderSpellingReadings(folded: string, reforms: readonly SpellingReform[]): NameVariant[] {
  if (reforms.length === 0) return [];
  const places = rulePlaces(folded, RULES.filter((rule) => reforms.includes(rule.reform)));
  if (places.length === 0) return [];
  const readings: { key: string; rules: SpellingRule[] }[] = [];
  // Every choice of the places to modernise, as a binary count: all of them first (an older spelling
  // is usually older throughout), then fewer.
  const choices = Math.min(2 ** places.length, 1 << 16);
  for (let mask = choices - 1; mask > 0 && readings.length < MAX_OLDER_SPELLINGS * 2; mask--) {
    let partial: { key: string; rules: SpellingRule[] }[] = [{ key: '', rules: [] }];
    let at = 0;
    places.forEach((place, index) => {
      const before = folded.slice(at, place.start);
      at = place.end;
      const taken = (mask & (1 << index)) !== 0;
      partial = partial.flatMap((p) => (taken
        ? place.modern.map((modern) => ({ key: p.key + before + modern, rules: [...p.rules, place.rule] }))
        : [{ key: p.key + before + folded.slice(place.start, place.end), rules: p.rules }]));
    });
    for (const p of partial) readings.push({ key: p.key + folded.slice(at), rules: p.rules });
  }
  const seen = new Set([folded]);
  const variants: NameVariant[] = [];
  for (const { key, rules } of readings) {
    if (seen.has(key) || variants.length >= MAX_OLDER_SPELLINGS) continue;
    seen.add(key);
    const reading = rules.every((rule) => rule.eitherWay) ? 'the same name in the other spelling of a reform,' : 'an older spelling of';
    variants.push({ key, change: `'${folded}' read as ${reading} '${key}' (${describeRules(rules)})` });
  }
  return variants;
}

/** A word's final "ã" as written (before folding erases the til), the letters the older spelling wrote for it. */
const FINAL_TIL = /ã(?!\p{L})/giu;

/**
 * The older spellings of a name as written whose words end in "ã" ("Camacã" → "Camacan"), for
 * gazetteers that keep a town's older spelling; the til is erased by folding, so this reads the written
 * name. Each reading is folded with its other readings (nameVariants); none unless the Portuguese reform is read.
 * @example tilSpellingReadings('Camacã', ['portuguese'])[0]
 * // { key: 'camacan', change: "'camacã' read as the modern spelling of 'camacan' ('an' for a final 'ã'; Portuguese reform of 1911, …)" }
 */
export function tilSpellingReadings(written: string, reforms: readonly SpellingReform[]): NameVariant[] {
  const composed = written.normalize('NFC');
  const older = composed.replace(FINAL_TIL, (til) => (til === 'Ã' ? 'AN' : 'an'));
  if (!reforms.includes('portuguese') || older === composed) return [];
  const says = `'${composed.toLowerCase()}' read as the modern spelling of '${older.toLowerCase()}' ('an' for a final 'ã'; ${PORTUGUESE_SOURCE})`;
  return nameVariants(older).map((variant) => ({ key: variant.key, change: variant.change ? `${says}, ${variant.change}` : says }));
}

/** Where each rule applies in a name, the places not overlapping (the earlier rule keeps a letter). */
function rulePlaces(folded: string, rules: readonly SpellingRule[]): { start: number; end: number; modern: string[]; rule: SpellingRule }[] {
  const places: { start: number; end: number; modern: string[]; rule: SpellingRule }[] = [];
  for (const rule of rules) {
    for (const match of folded.matchAll(rule.older)) {
      const start = match.index;
      const end = start + match[0].length;
      if (places.some((p) => start < p.end && p.start < end)) continue;
      places.push({ start, end, modern: rule.modern.map((m) => m.replace('$1', match[1] ?? '')), rule });
    }
  }
  return places.sort((a, b) => a.start - b.start);
}

/** The rules taken, each once, with the source of each reform. */
function describeRules(rules: readonly SpellingRule[]): string {
  const byReform = new Map<SpellingReform, Set<string>>();
  for (const rule of rules) byReform.set(rule.reform, (byReform.get(rule.reform) ?? new Set()).add(rule.says));
  return [...byReform].map(([reform, says]) => `${[...says].join(', ')}; ${SOURCES[reform]}`).join('; ');
}
