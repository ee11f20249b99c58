/**
 * A text that names an administrative unit is georeferenced as that unit, never as a town that shares
 * its name: by the unit's polygon where one is loaded (its corrected center and radial, method §4),
 * otherwise declined with the reason (METHOD_DEFAULTS.unitWithoutPolygon [CHOICE]). Pure: the
 * gazetteer is reached only through the CandidateFinder it is given.
 */
import type { CandidateFinder, Candidate, Feature } from '../match/types.ts';
import { administrativeKey, countryCodeForName, countryExonymLanguage, looseUnitReader, shortFormKey } from '../match/context.ts';
import { foldName, LEADING_ARTICLES } from '../match/fold.ts';
import { formerUnitName } from '../match/former-unit-names.ts';
import { isNearSpellingOfUnit } from '../match/unit-spelling.ts';
import type { AdministrativeContext, AdministrativeLevel, Interpretation, NamedUnit } from '../parse/types.ts';
import { readingOf } from './other-clauses.ts';
import { SETTLEMENTS } from './feature-kind.ts';
import { METHOD_DEFAULTS } from '../georef/method-defaults.ts';

/**
 * The record fields whose value, written alone, names the unit, widest last. Not the municipality: a
 * municipality usually bears its seat's name, and a label that writes it alone means the town
 * ("Mun. Brusque: … Brusque").
 */
const RECORD_LEVELS = [
  ['county', 'county'],
  ['stateProvince', 'stateProvince'],
  ['country', 'country'],
] as const satisfies readonly (readonly [keyof AdministrativeContext, AdministrativeLevel])[];

/**
 * The unit the reading names, or null: an 'administrative-unit' reading, or a lone named place
 * whose name is one of the record's own units (its country, state/province or county) and that no word of the
 * text calls a town.
 * @example unitNamed(parseLocality('Alisos'), { countryCode: 'QV', county: 'Alisos' }) // { name: 'Alisos', level: 'county', written: 'Alisos' }
 */
export function unitNamed(interpretation: Interpretation, context: AdministrativeContext): NamedUnit | null {
  if (interpretation.type === 'administrative-unit') {
    const name = interpretation.unit?.name ?? interpretation.features[0];
    return name ? interpretation.unit ?? { name, level: 'unit', written: name } : null;
  }
  if (interpretation.type !== 'named-place' || interpretation.features.length !== 1) return null;
  // "Ciudad de Panamá", "Guatemala City": the text's own word says the town, not the country or state of its name.
  if (interpretation.featureKind === 'populated-place') return null;
  const written = interpretation.features[0]!;
  const key = foldName(written);
  for (const [field, level] of RECORD_LEVELS) {
    const value = context[field];
    if (value && foldName(value) === key) return { name: value, level, written };
  }
  // "Comitán" for the record's county "Comitán de Domínguez": the unit's short form names it too.
  if (context.county && shortFormKey(context.county) === key) return { name: context.county, level: 'county', written };
  // A record with only a country code: the country's name in any of the four languages ("Brasil"), or
  // in another language of older labels ("a Brasilia", Latin), after a leading article or "a" ("from").
  const code = context.countryCode?.trim().toUpperCase();
  if (!code) return null;
  const name = withoutLeadingArticle(written);
  if (countryCodeForName(name) === code) return { name, level: 'country', written };
  const exonymLanguage = countryExonymLanguage(name, code);
  return exonymLanguage ? { name, level: 'country', written, exonymLanguage } : null;
}

/**
 * "Hacienda de Jovo, Hitamalco" with the record's county Hueytamalco: a clause that is only a near spelling of the
 * record's county (isNearSpellingOfUnit) is read as the county's name, with a note [CHOICE countyNearSpellings]; so
 * it is read as the county's own name would be (named alone: its seat; standing in for a place not found: the
 * town of the county's name, widened). The reading unchanged with 'off' or no county stated.
 * @example countyAsSpelled(parseLocality('Hitamalco'), { countryCode: 'MX', county: 'Hueytamalco' }, 'on').features // ['Hueytamalco']
 */
export function countyAsSpelled(interpretation: Interpretation, context: AdministrativeContext, rule: 'on' | 'off'): Interpretation {
  const county = context.county;
  if (rule === 'off' || !county) return interpretation;
  const written: string[] = [];
  const spelled = <R extends Pick<Interpretation, 'type' | 'features'>>(r: R): R => {
    if (r.type !== 'named-place' || r.features.length !== 1 || !isNearSpellingOfUnit(r.features[0]!, county)) return r;
    written.push(r.features[0]!);
    return { ...r, features: [county] };
  };
  const reading = spelled(interpretation);
  const otherClauses = interpretation.otherClauses.map(spelled);
  if (written.length === 0) return interpretation;
  const notes = written.map((name) => `"${name}" read as the record's county "${county}", a near spelling of it [CHOICE countyNearSpellings, src/georef/method-defaults.ts]`);
  return { ...reading, otherClauses, notes: [...interpretation.notes, ...notes] };
}

/** The name without a leading article ("o Brasil", "the United States"); a lone word is kept. */
function withoutLeadingArticle(written: string): string {
  const words = written.trim().split(/\s+/);
  return words.length > 1 && LEADING_ARTICLES.has(foldName(words[0]!)) ? words.slice(1).join(' ') : written.trim();
}

/**
 * "Brazil, Bahia, Ilhéus" with the record's country and state: a clause that names one of the record's own
 * units, followed by other clauses, heads a hierarchy written with commas or periods; it is context, and the
 * next clause is the reading (each such head noted; a state or county head also written into its administrative context). A unit
 * named alone is left for `unitNamed`. So is a clause the loaded gazetteer holds as a unit of the record's
 * country (headUnitLoaded: "Isla Verdemar. Poniente. Puerto Lindo" with only the country code QV), when the
 * clause after it is no unit as wide.
 * @example pastUnitHeads(store, parseLocality('Isla Verdemar, Poniente, Puerto Lindo'), { countryCode: 'QV' }).features // ['Puerto Lindo']
 */
export function pastUnitHeads(finder: CandidateFinder, interpretation: Interpretation, context: AdministrativeContext, headStates: 'on' | 'off' = METHOD_DEFAULTS.headStateByPlace): Interpretation {
  let reading = interpretation;
  while (reading.type === 'named-place' && reading.otherClauses.length > 0) {
    const next = readingOf(reading, reading.otherClauses[0]!);
    const own = unitNamed(reading, context);
    const loaded = own ? null : headUnitLoaded(finder, reading, context);
    const holding = own || loaded || headStates === 'off' ? null : headStateHolding(finder, reading, next, context);
    const unit = own ?? (loaded && !isAsWide(headUnitLoaded(finder, next, context), loaded) ? loaded : null) ?? holding;
    if (!unit) break;
    // Context written into the text, as a hierarchy's link is: a county's town may stand in for a place not
    // found (standInsNamed). Not a country: its name in another language may be a town's ("Brasilia").
    const administrative = unit.level === 'country' || unit.level === 'unit' ? next.administrative : { [unit.level]: unit.name, ...next.administrative };
    const why = own ? `names the record's ${LEVEL_WORDS[unit.level]}`
      : holding ? `names a state or province the loaded gazetteer records (named after no town of the record's country, or holding the place after it there) [CHOICE headStateByPlace, src/georef/method-defaults.ts]`
        : `names the loaded gazetteer's ${LEVEL_WORDS[unit.level]} "${unit.name}", in the record's country`;
    reading = { ...next, administrative, notes: [...next.notes, `"${unit.written}" ${why}: read as context, the clause after it used`] };
  }
  return reading;
}

/** Unit levels from the widest. */
const LEVEL_ORDER: readonly AdministrativeLevel[] = ['country', 'stateProvince', 'county'];

/** Whether `unit` (if any) is as wide as `than` or wider: then it is no more specific clause. */
function isAsWide(unit: NamedUnit | null, than: NamedUnit): boolean {
  return unit !== null && LEVEL_ORDER.indexOf(unit.level) <= LEVEL_ORDER.indexOf(than.level);
}

/**
 * The unit of the record's country that the loaded gazetteer holds under the reading's lone name, exactly (its
 * name or an alternate name): a country or state/province, or a county one of whose names is the record's
 * county; null otherwise, and for a record with no country code (a state's name alone, anywhere, too often is a town's).
 * @example headUnitLoaded(store, parseLocality('Verdemar'), { countryCode: 'QV' }) // { name: 'Isla Verdemar', level: 'country', written: 'Verdemar' }
 */
function headUnitLoaded(finder: CandidateFinder, interpretation: Interpretation, context: AdministrativeContext): NamedUnit | null {
  const code = context.countryCode?.trim().toUpperCase();
  if (!code || interpretation.type !== 'named-place' || interpretation.features.length !== 1) return null;
  const written = interpretation.features[0]!;
  const county = context.county ? foldName(context.county) : undefined;
  const isUnit = ({ feature }: Candidate) =>
    feature.featureType === 'country' || feature.featureType === 'stateProvince'
    || (county !== undefined && [feature.name, ...feature.alternateNames].some((name) => foldName(name) === county));
  const found = finder
    .findCandidates({ name: written, context: { countryCode: code }, featureTypes: ['country', 'stateProvince', 'county'] })
    .find((c) => c.score >= 1 && c.feature.countryCode?.toUpperCase() === code && isUnit(c));
  return found ? { name: found.feature.name, level: found.feature.featureType as AdministrativeLevel, written } : null;
}

/**
 * "BOCAS DEL TORO: Cordillera de Talamanca", "San José: Pérez Zeledón": the head of a hierarchy written into the
 * text ("X:", "X |") is read as a country by its place in the chain; when it is no country's name but names a
 * state or province of the record (its stated one, by any name the gazetteer's unit-name table holds; with none
 * stated, one of the table's states holding a place of that name or a place of the text in the record's
 * country, or one no town of the country is named after), it is that state: context bounding the search, never a town standing in for the place
 * [CHOICE headStateByPlace]. The reading unchanged otherwise.
 * @example headAsState(store, parseLocality('Colorado: Vail'), { countryCode: 'US' }).administrative // { stateProvince: 'Colorado' }
 */
export function headAsState(finder: CandidateFinder, interpretation: Interpretation, context: AdministrativeContext): Interpretation {
  const { country: head, ...rest } = interpretation.administrative;
  const code = context.countryCode?.trim().toUpperCase();
  if (!head || !code || rest.stateProvince || !finder.unitNames || countryCodeForName(head) !== null || countryExonymLanguage(head, code)) return interpretation;
  const units = new Set(finder.unitNames(1, administrativeKey(head)).map((name) => name.unitKey));
  if (units.size === 0) return interpretation;
  const stated = context.stateProvince ? finder.unitNames(1, administrativeKey(context.stateProvince)).map((name) => name.unitKey) : [];
  const names = context.stateProvince ? stated.some((unit) => units.has(unit)) : !townNamed(finder, head, code) || [head, ...interpretation.features].some((name) => placeInState(finder, name, head, code));
  if (!names) return interpretation;
  const why = context.stateProvince ? 'the record\'s state or province' : 'a state or province the loaded gazetteer records (named after no town of the record\'s country, or holding a place of the text there)';
  return {
    ...interpretation,
    administrative: { ...rest, stateProvince: head },
    notes: [...interpretation.notes, `"${head}", at the head of the text's hierarchy, names ${why}: read as that state, context and not a place [CHOICE headStateByPlace, src/georef/method-defaults.ts]`],
  };
}

/**
 * "US, Colorado, Vail" on a record stating no state: a head that is one of the names of a state or province in
 * the gazetteer's unit-name table (gazetteers that load states only as codes of their towns hold no feature of
 * it) is that state when the clause after it names a place the gazetteer records in a state of that name, in
 * the record's country, or when no town of the record's country bears its name ("British Columbia") [CHOICE
 * headStateByPlace]; null otherwise. A state's name that is also a town's of the country ("Paraná") needs the
 * place after it.
 * @example headStateHolding(store, parseLocality('Colorado, Vail'), parseLocality('Vail'), { countryCode: 'US' }) // { name: 'Colorado', level: 'stateProvince', written: 'Colorado' }
 */
function headStateHolding(finder: CandidateFinder, head: Interpretation, next: Interpretation, context: AdministrativeContext): NamedUnit | null {
  const code = context.countryCode?.trim().toUpperCase();
  if (!code || context.stateProvince || !finder.unitNames || head.type !== 'named-place' || head.features.length !== 1) return null;
  const written = head.features[0]!;
  if (finder.unitNames(1, administrativeKey(written)).length === 0) return null;
  const held = next.features.length > 0 && placeInState(finder, next.features[0]!, written, code);
  return held || !townNamed(finder, written, code) ? { name: written, level: 'stateProvince', written } : null;
}

/**
 * The towns the gazetteer records under that name as written (or by a documented reading of it, never a near
 * spelling) within the context.
 */
function townsNamed(finder: CandidateFinder, name: string, context: AdministrativeContext): Candidate[] {
  return finder
    .findCandidates({ name, context, nearSpellings: 'off' })
    .filter((c) => c.score >= 1 && SETTLEMENTS.has(c.feature.featureType ?? ''));
}

/** Whether the gazetteer records a town of that name, as written, in the country. */
function townNamed(finder: CandidateFinder, name: string, countryCode: string): boolean {
  return townsNamed(finder, name, { countryCode }).some((c) => c.feature.countryCode?.toUpperCase() === countryCode);
}

/** Whether the gazetteer records a town of that name, as written, in a state of that name of the country. */
function placeInState(finder: CandidateFinder, name: string, state: string, countryCode: string): boolean {
  return townsNamed(finder, name, { countryCode, stateProvince: state })
    .some((c) => c.feature.countryCode?.toUpperCase() === countryCode && c.feature.stateProvince !== null);
}

/**
 * Towns the text's own administrative clauses name, most specific first, to stand in for a place the
 * gazetteers lack: the municipality's and the county's towns (a municipality or, on labels in English, a
 * county usually bears its seat's name), and the head of a hierarchy written into the text ("Alisos:
 * Fazenda X") when it is no country name in the four languages.
 * @example standInsNamed(parseLocality('Mun. Alisos: Fazenda Nunca Vista')) // [{ name: 'Alisos', what: 'the town of the municipality the text names' }]
 */
export function standInsNamed(interpretation: Interpretation): { name: string; what: string }[] {
  const { municipality, county, country } = interpretation.administrative;
  const named = [
    municipality && { name: municipality, what: 'the town of the municipality the text names' },
    county && { name: county, what: 'the town of the county the text names' },
    country && countryCodeForName(country) === null && { name: country, what: 'the place the text writes at the head of its hierarchy' },
  ];
  return named.filter((n): n is { name: string; what: string } => !!n && !interpretation.features.includes(n.name));
}

/** Feature types a unit of each level is stored under in a gazetteer. */
const FEATURE_TYPES: Readonly<Record<AdministrativeLevel, string[]>> = {
  country: ['country'],
  stateProvince: ['stateProvince'],
  county: ['county'],
  municipality: ['municipality', 'county'],
  unit: ['municipality', 'county', 'stateProvince', 'country'],
};

const LEVEL_WORDS: Readonly<Record<AdministrativeLevel, string>> = {
  country: 'country',
  stateProvince: 'state or province',
  county: 'county',
  municipality: 'municipality',
  unit: 'administrative unit',
};

/** The unit's feature, or why there is none; `loaded`: a polygon of its name is loaded in the country but none in the record's units, so no seat stands in. */
export type UnitLookup = { feature: Feature; candidates: Candidate[]; remark: string } | { feature: null; candidates: Candidate[]; reason: string; loaded: boolean };

/**
 * The unit's own feature with its polygon, or the reason there is none to georeference by.
 * `acceptScore` is the least score that counts as the unit's name (FUZZY_ACCEPTANCE.readingScore).
 * @example findUnit(store, { name: 'Alisos', level: 'county', written: 'Alisos' }, { countryCode: 'QV' }, 0.95).feature?.featureType // 'county'
 */
export function findUnit(finder: CandidateFinder, unit: NamedUnit, context: AdministrativeContext, acceptScore: number): UnitLookup {
  const words = LEVEL_WORDS[unit.level];
  const unitsIn = (within: AdministrativeContext) => finder
    .findCandidates({ name: unit.name, context: within, featureTypes: FEATURE_TYPES[unit.level], withGeometry: true })
    .filter((c) => c.score >= acceptScore);
  const isPolygon = (c: Candidate) => c.feature.geometryType === 'Polygon' || c.feature.geometryType === 'MultiPolygon';
  const candidates = unitsIn(contextAbove(unit.level, context));
  const polygons = candidates.filter(isPolygon);
  if (polygons.length === 1) {
    const feature = polygons[0]!.feature;
    return { feature, candidates, remark: `"${unit.written}" names the ${words} "${feature.name}": georeferenced as that unit by its polygon, never as a place that shares its name` };
  }
  // A polygon of the unit's name that the stated state set aside (a county file recording its state by a code,
  // "ID", where the record writes "Idaho"): the unit is loaded, so no town stands in for it (a seat of that name
  // may lie in another county).
  const elsewhere = polygons.length === 0 && unit.level !== 'country' ? unitsIn({ countryCode: context.countryCode, country: context.country }).filter(isPolygon) : [];
  const why = polygons.length > 1
    ? `${polygons.length} units of that name are loaded`
    : elsewhere.length > 0
      ? `its polygon is loaded, but recorded in other units than the record's (${elsewhere.map(({ feature: f }) => `"${f.name}" in ${f.stateProvince ?? f.countryCode ?? 'no unit'}, ${f.sourceId}:${f.featureId}`).join('; ')})${unknownStates(finder, elsewhere)}`
      : 'no polygon of it is loaded [CHOICE unitWithoutPolygon \'decline\', src/georef/method-defaults.ts]';
  return { feature: null, candidates, loaded: elsewhere.length > 0, reason: `"${unit.written}" names the ${words} "${unit.name}", not a place; ${why}, and a town of that name with a town's radius would not be honest, so no georeference is given` };
}


/**
 * The states the units found elsewhere record that name no loaded state or province by any of its names or
 * codes (a county file's "ID" with no states file loaded, or one loaded without its codes), said plainly.
 * @example unknownStates(store, [shoshoneCounty]) // '; "ID" names no state or province loaded (…)'
 */
function unknownStates(finder: CandidateFinder, units: readonly Candidate[]): string {
  if (!finder.unitNames) return '';
  const unknown = [...new Set(units.flatMap(({ feature }) => feature.stateProvince ?? []))].filter((state) => finder.unitNames!(1, administrativeKey(state)).length === 0);
  if (unknown.length === 0) return '';
  return `; ${unknown.map((state) => `"${state}"`).join(', ')} name${unknown.length === 1 ? 's' : ''} no state or province loaded by any of its names or codes (import the states with ${unknown.length === 1 ? 'that code' : 'those codes'} among their names or codes: import --alternate-names-field, --unit-code-field)`;
}

/**
 * The feature when it is an administrative unit's polygon, else undefined.
 * @example unitArea(alisosCounty)?.name // 'Alisos'
 */
export function unitArea(feature: Feature): Feature | undefined {
  const polygon = feature.geometryType === 'Polygon' || feature.geometryType === 'MultiPolygon';
  return polygon && FEATURE_TYPES.unit.includes(feature.featureType ?? '') ? feature : undefined;
}

/** The record's units wider than `level`: a unit is looked for within them, not within itself. */
function contextAbove(level: AdministrativeLevel, context: AdministrativeContext): AdministrativeContext {
  const wider: AdministrativeContext = { countryCode: context.countryCode, country: context.country };
  if (level === 'county' || level === 'municipality') wider.stateProvince = context.stateProvince;
  if (level === 'municipality') wider.county = context.county;
  return level === 'country' ? {} : wider;
}

/**
 * The names a unit's seat may be held under, in the order tried: the unit's name as the record or text gives
 * it, the name as the text writes it, and the unit's short form, the words before the first "de" (folded:
 * shortFormKey), for an official long form that adds an honoree's name to its seat's ("Alisos de Juárez",
 * whose seat is the town Alisos). Common practice in Spanish-speaking countries' official unit names, no source.
 * @example seatNames({ name: 'ALISOS DE JUAREZ', level: 'county', written: 'Alisos' }) // ['ALISOS DE JUAREZ', 'Alisos']
 */
export function seatNames(unit: NamedUnit): string[] {
  const names = [unit.name, unit.written, shortFormKey(unit.name)];
  return names.filter((name, k) => names.findIndex((other) => foldName(other) === foldName(name)) === k);
}


/**
 * The record's stated state or province read as the one loaded unit it names by a looser reading
 * (looseUnitReading: "Labrador" for Newfoundland and Labrador, "Aisén" for Aysén), with the note saying so;
 * with none such, a unit within the one state of the towns of its name (withinSeatState); the context
 * unchanged when the stated name names a loaded unit as written or by another of its names, when it names
 * several by the looser readings or no state is found, or when the gazetteer records no unit names.
 * Else every place would be walled off as outside a unit the gazetteer does not know [CHOICE
 * statedUnitReadings, src/georef/method-defaults.ts].
 * @example readStatedState(store, { countryCode: 'CA', stateProvince: 'Labrador' }).context.stateProvince // 'newfoundland and labrador'
 */
export function readStatedState(
  finder: CandidateFinder,
  context: AdministrativeContext,
  choices: { statedUnitReadings: 'on' | 'off'; formerUnitNames: 'on' | 'off' } = METHOD_DEFAULTS,
): { context: AdministrativeContext; note?: string } {
  const stated = context.stateProvince;
  if (!stated || !finder.unitNames) return { context };
  // First, as the unit-name table is not held by country: Mexico's former "Distrito Federal" is also a name of Brazil's.
  const renamed = choices.formerUnitNames === 'on' ? renamedUnit(finder, context.countryCode, stated) : undefined;
  if (renamed) return renamed(context);
  if (choices.statedUnitReadings === 'off') return { context };
  // Named as the matcher names it: by its key, or by the short form of an official long name either side.
  const key = administrativeKey(stated);
  const short = shortFormKey(stated);
  if (finder.unitNames(1, key).length > 0 || finder.unitNames(1, short).length > 0) return { context };
  const names = finder.unitNames(1);
  const reading = looseUnitReader(key);
  const named = (unitKey: string) => unitKey.startsWith(`${short} `) && !reading(unitKey);
  if (names.length === 0 || names.some((name) => named(name.key))) return { context };
  const read = new Map<string, string>();
  for (const name of names) {
    const how = reading(name.key);
    if (how && !read.has(name.unitKey)) read.set(name.unitKey, how);
  }
  if (read.size === 1) {
    const [[unit, how]] = [...read];
    return {
      context: { ...context, stateProvince: unit },
      note: `the record's state/province "${stated}" names no loaded unit as written; read as the loaded unit "${unit}" (${how}) [CHOICE statedUnitReadings, src/georef/method-defaults.ts]`,
    };
  }
  return read.size === 0 ? withinSeatState(finder, context, stated) : { context };
}

/**
 * A stated state or province written by the former name of a renamed unit (src/match/former-unit-names.ts:
 * "Distrito Federal" in Mexico), when the gazetteer loads the unit by one of its present names: the context
 * read as that unit, with the note naming the change and its source [CHOICE formerUnitNames,
 * src/georef/method-defaults.ts]; undefined otherwise.
 */
function renamedUnit(finder: CandidateFinder, countryCode: string | undefined, stated: string): ((context: AdministrativeContext) => { context: AdministrativeContext; note: string }) | undefined {
  const renamed = formerUnitName(countryCode, stated);
  const unit = renamed?.current.flatMap((name) => finder.unitNames!(1, administrativeKey(name)))[0]?.unitKey;
  if (!renamed || unit === undefined) return undefined;
  return (context) => ({
    context: { ...context, stateProvince: unit },
    note: `the record's state/province "${stated}" is the former name of the unit now named ${renamed.current.map((name) => `"${name}"`).join(' or ')} (${renamed.source}); read as the loaded unit "${unit}" [CHOICE formerUnitNames, src/georef/method-defaults.ts]`,
  });
}

/**
 * A stated state or province that names no loaded unit but is the name of towns of the record's country all
 * recorded in one state ("Valdivia", a province named after its seat, in the Los Ríos region): read as a unit
 * within that state, which then bounds the search; the context unchanged otherwise.
 */
function withinSeatState(finder: CandidateFinder, context: AdministrativeContext, stated: string): { context: AdministrativeContext; note?: string } {
  if (!context.countryCode) return { context };
  const towns = townsNamed(finder, stated, { countryCode: context.countryCode });
  const states = new Set(towns.map((c) => c.feature.stateProvince));
  const state = states.size === 1 ? [...states][0] : null;
  if (!state) return { context };
  return {
    context: { ...context, stateProvince: state },
    note: `the record's state/province "${stated}" names no loaded unit; read as a unit within "${state}", where the gazetteer records the town${towns.length > 1 ? 's' : ''} of that name, as a unit is usually named after its seat [CHOICE statedUnitReadings, src/georef/method-defaults.ts]`,
  };
}
