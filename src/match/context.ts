/**
 * Administrative context as a filter on candidate features: country names to ISO codes, and the
 * comparison of state and county names. Pure functions, no I/O.
 */
import type { AdministrativeContext } from '../parse/types.ts';
import { COUNTRY_NAME_LANGUAGES, countryCodeWritten, EXONYM_LANGUAGES, LATIN_COUNTRY_NAMES, regionNames } from '../parse/country-names.ts';
import { editDistance } from './edit-distance.ts';
import { foldName } from './fold.ts';
import type { Feature, UnitLevel } from './types.ts';

let countryNameIndex: Map<string, string> | undefined;

/**
 * The ISO 3166-1 alpha-2 code of a country name written in English, Spanish, Portuguese or French,
 * from the CLDR region names that Node's Intl carries; null when the name is not one of them.
 * @example countryCodeForName('Brasil') // 'BR'
 * @example countryCodeForName('Côte d’Ivoire') // 'CI'
 * @example countryCodeForName('BRA') // 'BR' (an alpha-3 code written in capitals, as a hierarchy's head may be)
 */
export function countryCodeForName(name: string): string | null {
  if (countryNameIndex === undefined) {
    countryNameIndex = new Map();
    for (const { code, name: regionName } of regionNames(COUNTRY_NAME_LANGUAGES)) countryNameIndex.set(foldName(regionName), code);
  }
  const folded = foldName(name);
  if (/^[a-z]{2}$/.test(folded)) return folded.toUpperCase();
  const alpha3 = /^[a-z]{3}$/.test(folded) ? countryCodeWritten(name) : null;
  if (alpha3) return alpha3;
  return countryNameIndex.get(folded) ?? null;
}

let exonymIndex: Map<string, Map<string, string>> | undefined;

/** Case and spacing folded, accents kept: "Brasília" (the capital) stays apart from "Brasilia" (Latin for Brazil). */
function caseFolded(name: string): string {
  return name.normalize('NFC').toLocaleLowerCase('und').replace(/\s+/g, ' ').trim();
}

/**
 * The language in which `name` is, letter for letter (case aside, accents kept), another name of the
 * country `code` than those of the four languages (countryCodeForName): its German, Italian or Dutch
 * name from CLDR, or its Latin name (LATIN_COUNTRY_NAMES, from memory); null when it is none of them.
 * Accents are kept because such a name is often also a town's, which a label writes with its accents;
 * what a name so found does when a town bears it too is [CHOICE countryExonymTown, src/georef/method-defaults.ts].
 * @example countryExonymLanguage('Brasilia', 'BR') // 'Latin'
 * @example countryExonymLanguage('Brasília', 'BR') // null (the spelling of the capital)
 * @example countryExonymLanguage('Brasilien', 'BR') // 'German'
 */
export function countryExonymLanguage(name: string, code: string): string | null {
  if (exonymIndex === undefined) {
    exonymIndex = new Map();
    const add = (country: string, exonym: string, language: string) => {
      if (countryCodeForName(exonym) === country) return;
      const names = exonymIndex!.get(country) ?? new Map<string, string>();
      if (!names.has(caseFolded(exonym))) names.set(caseFolded(exonym), language);
      exonymIndex!.set(country, names);
    };
    const languageNames = new Intl.DisplayNames(['en'], { type: 'language' });
    for (const { code, name: exonym, language } of regionNames(EXONYM_LANGUAGES)) add(code, exonym, languageNames.of(language) ?? language);
    for (const [country, exonyms] of Object.entries(LATIN_COUNTRY_NAMES)) for (const exonym of exonyms) add(country, exonym, 'Latin');
  }
  return exonymIndex.get(code.toUpperCase())?.get(caseFolded(name)) ?? null;
}

/** Words that name the kind of unit rather than the unit ("Provincia de Salta" = "Salta"); common practice, no source. */
const ADMINISTRATIVE_WORDS = new Set([
  'province', 'provincia', 'prov', 'state', 'estado', 'etat', 'county', 'condado', 'co', 'cty', 'comte',
  'department', 'departamento', 'depto', 'dpto', 'departement', 'dept', 'municipio', 'municipality', 'mun',
  'district', 'distrito', 'region', 'parish', 'parroquia', 'paroisse', 'canton', 'partido', 'mrc', 'of', 'de', 'del', 'do', 'da', 'du',
]);

/**
 * The comparison key of an administrative unit's name: folded, with words for the kind of unit left out.
 * @example administrativeKey('Provincia de Salta') // 'salta'
 * @example administrativeKey('Orange County') // 'orange'
 */
export function administrativeKey(name: string): string {
  const tokens = foldName(name).split(' ');
  const kept = tokens.filter((token) => !ADMINISTRATIVE_WORDS.has(token));
  return (kept.length > 0 ? kept : tokens).join(' ');
}

/**
 * The names a stated unit is looked up by, in this order: as written, then without its words for the unit's
 * kind ("Pierce Co.", as records write counties, is looked up as "pierce"), the key the context filter
 * compares (administrativeKey). A unit's name as written is tried first, since a kind word may belong to it.
 * @example unitLookupNames('Pierce Co.') // ['Pierce Co.', 'pierce']
 * @example unitLookupNames('Pierce') // ['Pierce']
 */
export function unitLookupNames(written: string): string[] {
  const key = administrativeKey(written);
  return key === foldName(written) ? [written] : [written, key];
}

/**
 * What `find` gives for the first of the unit's lookup names (unitLookupNames) that finds anything: the
 * next name is asked only when the one before found nothing.
 * @example foundByUnitNames('Pierce Co.', (name) => store.findCandidates({ name, featureTypes: ['county'] })) // Pierce County, found as "pierce"
 */
export function foundByUnitNames<T>(written: string, find: (name: string) => T[]): T[] {
  for (const name of unitLookupNames(written)) {
    const found = find(name);
    if (found.length > 0) return found;
  }
  return [];
}

/**
 * The units a record's unit field names only through the store's unit names (a code, "US-WA", "2504108", or a
 * name its feature lacks): for each of the keys `unitKeys` but the written one's own (the administrativeKey of
 * the name of a loaded unit one of whose names or codes it is), what `find` gives for that key whose name or
 * an alternate name has that key, each unit once. A key may lack words the name has ("rio grande norte" for
 * Rio Grande do Norte), so `find` may look up near spellings; its answers are kept by their key alone.
 * @example foundUnderUnitKeys('WA', ['wa', 'washington'], find, (c) => c.feature) // [Washington]
 */
export function foundUnderUnitKeys<T>(written: string, unitKeys: Iterable<string>, find: (key: string) => T[], featureOf: (found: T) => Feature): T[] {
  const own = administrativeKey(written);
  const found = new Map<string, T>();
  for (const key of unitKeys) {
    if (key === own) continue;
    for (const unit of find(key)) {
      const feature = featureOf(unit);
      if ([feature.name, ...feature.alternateNames].some((name) => administrativeKey(name) === key)) found.set(`${feature.sourceId}:${feature.featureId}`, unit);
    }
  }
  return [...found.values()];
}

/**
 * The short form of a unit's official long name, "X de <honoree>" ("Veracruz de Ignacio de la Llave",
 * "Michoacán de Ocampo", "Comitán de Domínguez"): the folded words before the first "de"; the whole key
 * when there is none. Only "de": "Mato Grosso do Sul" and "Santiago del Estero" are names of their own.
 * Common practice in Spanish-speaking countries' official unit names, no source.
 * @example shortFormKey('Veracruz de Ignacio de la Llave') // 'veracruz'
 */
export function shortFormKey(name: string): string {
  const tokens = foldName(name).split(' ');
  // Words for the unit's kind lead some names ("Provincia de Salta"): the cut is after them.
  let start = 0;
  while (start < tokens.length && ADMINISTRATIVE_WORDS.has(tokens[start]!)) start++;
  const cut = tokens.indexOf('de', start);
  return cut > start ? administrativeKey(tokens.slice(start, cut).join(' ')) : administrativeKey(name);
}

/** Words joining the two names of a unit ("Newfoundland and Labrador", "Arica y Parinacota"), read alike. */
const CONJUNCTIONS = new Set(['and', 'y', 'e', 'et']);

/**
 * How a stated unit's comparison key (administrativeKey) names the loaded unit with key `unitKey` by a looser
 * reading, or null: written with or without spaces ("Bío Bío", "Biobío"), joined by another language's "and"
 * ("Arica and Parinacota", "Arica y Parinacota"), one of the two names joined ("Labrador" of "Newfoundland and
 * Labrador", "Magallanes y Antártica Chilena" of "Magallanes"), or one letter apart in a name of 5 letters or
 * more ("Aisén", "Aysén"; "Quezaltenango", "Quetzaltenango"). Used only for a stated unit that names no loaded
 * unit as written [CHOICE statedUnitReadings, src/georef/method-defaults.ts]. Common practice, no source.
 * @example looseUnitReading('labrador', 'newfoundland and labrador') // 'one of the names the unit joins'
 * @example looseUnitReading('aisen', 'aysen') // 'one letter apart'
 */
export function looseUnitReading(statedKey: string, unitKey: string): string | null {
  return looseUnitReader(statedKey)(unitKey);
}

/**
 * looseUnitReading with the stated key read once, for a stated unit compared with every loaded unit's
 * name: the stated side's words and parts are not worked out again for each of thousands of names.
 * @example ['aysen', 'ohio'].map(looseUnitReader('aisen')) // ['one letter apart', null]
 */
export function looseUnitReader(statedKey: string): (unitKey: string) => string | null {
  const stated = unitKeyReading(statedKey);
  const statedParts = stated.parts.length > 1 ? new Set(stated.parts) : new Set<string>();
  return (unitKey) => {
    // Most loaded names neither join two names nor come within a letter of the stated one's length: told
    // apart by their length alone (their words unchanged, without spaces), as the readings below would.
    if (statedParts.size === 0 && !JOINING_WORD.test(unitKey) && Math.abs(lengthWithoutSpaces(unitKey) - stated.compact.length) > 1) return null;
    const unit = unitKeyReading(unitKey);
    if (stated.compact === unit.compact) return stated.joined === unit.joined ? 'another language\'s "and"' : 'written with or without spaces';
    if (unit.parts.length > 1 && unit.parts.includes(stated.joined)) return 'one of the names the unit joins';
    if (statedParts.has(unit.joined)) return 'one of the names the unit joins';
    if (Math.min(stated.compact.length, unit.compact.length) >= 5 && editDistance(stated.compact, unit.compact, 1) <= 1) return 'one letter apart';
    return null;
  };
}

/** A conjunction (CONJUNCTIONS) written as a word of a key. */
const JOINING_WORD = new RegExp(`(?:^| )(?:${[...CONJUNCTIONS].join('|')})(?= |$)`);

function lengthWithoutSpaces(key: string): number {
  let spaces = 0;
  for (let i = 0; i < key.length; i++) if (key.charCodeAt(i) === 32) spaces++;
  return key.length - spaces;
}

/** A unit key's words with every conjunction read as "and": joined by spaces, joined without them, and the names it joins. */
function unitKeyReading(key: string): { joined: string; compact: string; parts: string[] } {
  const words = key.split(' ').map((word) => (CONJUNCTIONS.has(word) ? 'and' : word));
  const joined = words.join(' ');
  return { joined, compact: words.join(''), parts: joined.split(' and ').filter((part) => part !== '') };
}

/**
 * The level of the store's unit names (UnitLevel) each record field that names a unit is read at: a state
 * field among the states' names and codes, a county field among the counties', a municipality field among
 * the municipalities'. A unit's feature type is its field's name, so the store files a unit's names by it too.
 */
export const UNIT_FIELD_LEVELS = { stateProvince: 1, county: 2, municipality: 3 } as const satisfies Readonly<Record<string, UnitLevel>>;

/**
 * The keys of the units a field's value names by any of their names or codes (ResolvedContext's aliases).
 * @example unitAliases(context, 'municipality') // Set {'bom jesus'} for a municipality written by its code
 */
export function unitAliases(context: ResolvedContext, field: keyof typeof UNIT_FIELD_LEVELS): ReadonlySet<string> | undefined {
  return field === 'stateProvince' ? context.stateProvinceAliases : field === 'county' ? context.countyAliases : context.municipalityAliases;
}

/** The context a candidate must fit, resolved once per query. */
export interface ResolvedContext {
  /** Allowed country codes; empty when the context names no country. */
  countryCodes: Set<string>;
  stateProvinceKey?: string;
  /** The state's short form (shortFormKey), matched against the short form of a feature's state. */
  stateProvinceShortKey?: string;
  countyKey?: string;
  municipalityKey?: string;
  /**
   * Keys of the names of units known by the state (county, municipality) name given in any of their names
   * or codes, from the gazetteer's unit names.
   */
  stateProvinceAliases?: ReadonlySet<string>;
  countyAliases?: ReadonlySet<string>;
  municipalityAliases?: ReadonlySet<string>;
  /**
   * The keys of the loaded units one of whose names or codes has `key` (NameIndex.unitKeys): a feature
   * recording its state by a code ("WA", "US-WA") is read as the unit holding that code.
   */
  unitsNamed?: (level: UnitLevel, key: string) => readonly string[];
  /** Country written in the context that no table resolved (then it does not filter). */
  unresolvedCountry?: string;
}

/**
 * Resolves a record's administrative context: the country code, the country name through the CLDR
 * table or the gazetteer's own country features (`gazetteerCountryCodes`), the state and county keys.
 * @example resolveContext({ country: 'Argentina', stateProvince: 'Prov. de Salta' }).countryCodes // Set {'AR'}
 */
export function resolveContext(context: AdministrativeContext, gazetteerCountryCodes: readonly string[] = []): ResolvedContext {
  const countryCodes = new Set<string>();
  if (context.countryCode !== undefined && context.countryCode.trim() !== '') countryCodes.add(context.countryCode.trim().toUpperCase());
  let unresolvedCountry: string | undefined;
  if (context.country !== undefined && context.country.trim() !== '') {
    const code = countryCodeForName(context.country);
    if (code !== null) countryCodes.add(code);
    for (const gazetteerCode of gazetteerCountryCodes) countryCodes.add(gazetteerCode);
    if (code === null && gazetteerCountryCodes.length === 0) unresolvedCountry = context.country;
  }
  return {
    countryCodes,
    stateProvinceKey: context.stateProvince?.trim() ? administrativeKey(context.stateProvince) : undefined,
    stateProvinceShortKey: context.stateProvince?.trim() ? shortFormKey(context.stateProvince) : undefined,
    countyKey: context.county?.trim() ? administrativeKey(context.county) : undefined,
    municipalityKey: context.municipality?.trim() ? administrativeKey(context.municipality) : undefined,
    unresolvedCountry,
  };
}

/** Which administrative levels a polygon already decides (then the name of that level does not filter). */
export interface SpatiallyDecided {
  stateProvince?: boolean;
  county?: boolean;
  municipality?: boolean;
}

/**
 * Why a feature does not fit the context, or null when it fits. A feature that does not record a level
 * (no state, say) is not dropped for it: the text cannot be checked against what is not there.
 * @example contextMismatch(feature, resolveContext({ countryCode: 'AR' })) // "country BR, not AR"
 */
export function contextMismatch(feature: Feature, context: ResolvedContext, decided: SpatiallyDecided = {}): string | null {
  if (context.countryCodes.size > 0 && feature.countryCode !== null && !context.countryCodes.has(feature.countryCode)) {
    return `country ${feature.countryCode}, not ${[...context.countryCodes].join(' or ')}`;
  }
  if (!decided.stateProvince && context.stateProvinceKey !== undefined && feature.stateProvince !== null
    && feature.featureType !== 'stateProvince' && feature.featureType !== 'country'
    && !sameUnit(feature.stateProvince, context.stateProvinceKey, context.stateProvinceAliases, context.unitsNamed, UNIT_FIELD_LEVELS.stateProvince)
    && shortFormKey(feature.stateProvince) !== context.stateProvinceShortKey) {
    return `state/province '${feature.stateProvince}', not the one given`;
  }
  if (!decided.county && context.countyKey !== undefined && feature.county !== null
    && feature.featureType !== 'county' && feature.featureType !== 'stateProvince' && feature.featureType !== 'country'
    && !sameUnit(feature.county, context.countyKey, context.countyAliases, context.unitsNamed, UNIT_FIELD_LEVELS.county)) {
    return `county '${feature.county}', not the one given`;
  }
  return null;
}

/**
 * The unit a feature records is the one given: by its key, by another name of that unit, or (for a feature
 * recording a code or another name of a loaded unit, "WA" in a county file) as the loaded unit that holds
 * it. A recorded name that is a loaded unit's own name names that unit only.
 * @example sameUnit('WA', 'washington', new Set(['washington']), () => ['washington'], 1) // true
 */
function sameUnit(recorded: string, key: string, aliases: ReadonlySet<string> | undefined, unitsNamed: ResolvedContext['unitsNamed'], level: UnitLevel): boolean {
  const recordedKey = administrativeKey(recorded);
  if (recordedKey === key || aliases?.has(recordedKey) === true) return true;
  if (aliases === undefined || aliases.size === 0) return false;
  const named = unitsNamed?.(level, recordedKey) ?? [];
  return !named.includes(recordedKey) && named.some((unitKey) => aliases.has(unitKey));
}
