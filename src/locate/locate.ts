/**
 * One locality from text to georeference: parse → candidates → georeference, with the georeferencer's
 * edits applied on the way (a chosen feature replaces the chooser's pick for its name; a distance
 * precision changes the interpretation before the method runs), so the bounding unit, the path line
 * and the clip hold for an edited record as for the first answer. The finder is the only door to data,
 * so this module stays free of I/O; the edges reach it through `georeferenceRecord`.
 */
import { parseCoordinates, parseLocality, protectedAreaNamesake, stationNamesake } from '../parse/index.ts';
import type { AdministrativeContext, Interpretation, NamedUnit } from '../parse/types.ts';
import type { Candidate, CandidateFinder, CandidateQuery, Feature, GeometryType } from '../match/types.ts';
import { coverGeoreferences } from '../georef/cover.ts';
import { georeference } from '../georef/georeference.ts';
import type { Georeference, MethodOptions, UncertaintyComponents } from '../georef/types.ts';
import type { LocateStatus } from '../record/verification-status.ts';
import { chosenFeatureFor, EditRefused, withDistancePrecision, type EditProblem, type LocateEdits } from './edits.ts';
import { readDatumOption } from '../geodesy/datum-option.ts';
import type { PlausibilityFlag } from '../georef/plausibility.ts';
import { checkPlausibility } from '../georef/plausibility-check.ts';
import { METHOD_DEFAULTS } from '../georef/method-defaults.ts';
import { checkOtherClauses, conflictWith, readingOf, unusedPlaces, type OtherClauseCheck } from './other-clauses.ts';
import { countyAsSpelled, findUnit, headAsState, pastUnitHeads, readStatedState, seatNames, standInsNamed, unitArea, unitNamed } from './administrative-unit.ts';
import { justOutside } from './just-outside.ts';
import { farFromCountySeat } from './county-reach.ts';
import { namesakeByResult, reachMeters } from './namesakes-by-result.ts';
import { judgeKind, SETTLEMENTS, type KindVerdict } from './feature-kind.ts';
import { secondNameReading } from './second-name.ts';
import { inverse } from '../geodesy/geodesic.ts';
import { lookupsOnce } from './lookups-once.ts';
import { foldName } from '../match/fold.ts';
import { administrativeKey, contextMismatch, foundByUnitNames, foundUnderUnitKeys, resolveContext, shortFormKey, UNIT_FIELD_LEVELS } from '../match/context.ts';
import { routeJudgement } from './route.ts';
import { wholeNameRead } from './whole-name.ts';

/** One record to georeference: its locality text and the administrative fields the record carries. */
export interface LocateRequest extends AdministrativeContext {
  locality: string;
  /** Coordinates as written on the label or in the record; used when they can be read. */
  verbatimCoordinates?: string;
  /**
   * Datum of the record's coordinates as its own field states it: applies to written coordinates (in the
   * text or verbatimCoordinates) that carry no datum of their own; options.datum, when given, wins.
   */
  geodeticDatum?: string;
  options?: LocateOptions;
  /** The georeferencer's edits, applied inside the pipeline. */
  edits?: LocateEdits;
}

export interface LocateOptions extends MethodOptions {
  /** For an ambiguous name, give one georeference whose circle covers every candidate. */
  coverAmbiguous?: boolean;
  /** For text that names no place, fall back to the most specific administrative unit of the record. */
  administrativeFallback?: boolean;
}

export type { LocateStatus };

export interface LocateResult {
  status: LocateStatus;
  georeference?: Georeference;
  /** The uncertainty budget in meters by source (same object as georeference.components). */
  components?: UncertaintyComponents;
  interpretation: Interpretation;
  /** Every candidate considered, for each name in the text, best first. */
  candidates: Candidate[];
  /** Why no georeference was made, in plain words. */
  reason?: string;
  /** What the plausibility checks found about a georeference (empty when nothing); each also has a remark. */
  flags?: PlausibilityFlag[];
}

/**
 * How candidates are judged [CHOICE]. Below `plausibleScore` a candidate is only a near name (the
 * feature counts as not found, the near names are listed). A fuzzy match may stand alone when its score
 * reaches `minimumScore` and leads the next plausible candidate by `minimumLead`. Exact matches always
 * win over fuzzy ones; two exact matches are ambiguous. `readingScore` is the least a match through a
 * documented reading of the name (an abbreviation, a generic word left out) scores: enough to name a
 * bounding unit, where a fuzzy match would clip to the wrong one.
 */
export const FUZZY_ACCEPTANCE = { plausibleScore: 0.7, minimumScore: 0.8, minimumLead: 0.1, readingScore: 0.95 } as const;

const LINES: GeometryType[] = ['LineString', 'MultiLineString'];
const ADMINISTRATIVE_LEVELS = [
  { field: 'municipality', featureType: 'municipality' },
  { field: 'county', featureType: 'county' },
  { field: 'stateProvince', featureType: 'stateProvince' },
  { field: 'country', featureType: 'country' },
] as const;
type AdministrativeLevel = (typeof ADMINISTRATIVE_LEVELS)[number]['field'];

/**
 * Georeference one locality.
 * @example
 *   locate(store, { locality: '10 km NE of Puerto Lindo', countryCode: 'QV' }).status // 'georeferenced'
 */
export function locate(finder: CandidateFinder, request: LocateRequest): LocateResult {
  const once = lookupsOnce(finder);
  return checkLocated(once, request, locateOne(once, request));
}

/**
 * The plausibility checks (src/georef/plausibility-check.ts) of a result made for this request: flags
 * and remarks added, the point left as it is. Country outlines and a clause georeferenced alone are
 * asked of `once`, this record's lookups.
 * @example checkLocated(lookupsOnce(store), request, result).flags // e.g. ['outside-record-country']
 */
function checkLocated(once: CandidateFinder, request: LocateRequest, result: LocateResult): LocateResult {
  const g = result.georeference;
  if (result.status !== 'georeferenced' || !g) return result;
  const findings = checkPlausibility(once, {
    georeference: g,
    interpretation: result.interpretation,
    candidates: result.candidates,
    countryCode: contextOf(request, result.interpretation).countryCode,
    locateClause: (text) => locateOne(once, { ...request, locality: text, verbatimCoordinates: undefined, edits: undefined }).georeference,
  });
  if (findings.length === 0) return { ...result, flags: [] };
  const georeference = { ...g, remarks: [...g.remarks, ...findings.map((f) => f.remark)] };
  return { ...result, georeference, components: georeference.components, flags: findings.map((f) => f.flag) };
}

/** The method alone, without the plausibility checks. */
function locateOne(finder: CandidateFinder, request: LocateRequest): LocateResult {
  const edits = request.edits ?? {};
  const read = interpretationOf(request);
  const edited = edits.distancePrecision ? withDistancePrecision(read, edits.distancePrecision) : read;
  const headStates = request.options?.headStateByPlace ?? METHOD_DEFAULTS.headStateByPlace;
  const headed = headStates === 'on' ? headAsState(finder, edited, contextOf(request, edited)) : edited;
  const headless = pastUnitHeads(finder, headed, contextOf(request, headed), headStates);
  const datum = datumGiven(request);
  if ('problem' in datum) return { status: 'unparseable', interpretation: headless, candidates: [], reason: datum.problem };
  const options = { ...request.options, datum: datum.epsg };
  // A state or county the text's hierarchy names bounds the search as the record's would; a stated state the
  // gazetteer knows by another form [CHOICE statedUnitReadings] or by its former name [CHOICE formerUnitNames] is read as that unit.
  const stated = contextOf(request, headless);
  const { context, note } = readStatedState(finder, stated, {
    statedUnitReadings: options.statedUnitReadings ?? METHOD_DEFAULTS.statedUnitReadings,
    formerUnitNames: options.formerUnitNames ?? METHOD_DEFAULTS.formerUnitNames,
  });
  const spelled = countyAsSpelled(note ? { ...headless, notes: [...headless.notes, note] } : headless, context, options.countyNearSpellings ?? METHOD_DEFAULTS.countyNearSpellings);
  // A text whose words name no place may be, whole, a town's name ("Forks", "Country Homes") [CHOICE wordNamedTown].
  const interpretation = wholeNameRead(finder, spelled, context, options);
  if (edits.chosenFeatures?.length && interpretation.features.length === 0) {
    throw new EditRefused({ kind: 'names-no-place', namesInText: 0 });
  }

  if (interpretation.type === 'no-locality' && options.administrativeFallback) {
    return locateAdministrativeUnit(finder, interpretation, context, options);
  }
  const chainEnd = interpretation.type === 'no-locality' ? hierarchyEndSeat(finder, interpretation, context, options) : null;
  if (chainEnd) return chainEnd;
  if (interpretation.type === 'unparseable' && interpretation.kilometrePost && interpretation.clauses.every((c) => c.kind !== 'coordinates')) {
    // "km 23": a person who knows the road can place it; the text alone cannot.
    return { status: 'not-found', interpretation, candidates: [], reason: `${interpretation.reason ?? `road kilometre post ("${interpretation.kilometrePost}")`}: left for a person who knows the road to georeference` };
  }
  if (interpretation.type === 'no-locality' || interpretation.type === 'unparseable') {
    return { status: 'unparseable', interpretation, candidates: [], reason: interpretation.reason ?? 'the text could not be read' };
  }
  const unit = unitNamed(interpretation, context);
  const townOfExonym = unit?.exonymLanguage ? townSharingName(finder, interpretation, context, options) : undefined;
  const exonymRule = options.countryExonymTown ?? METHOD_DEFAULTS.countryExonymTown;
  if (unit && townOfExonym && exonymRule === 'review') {
    const reason = `"${unit.written}" is the ${unit.exonymLanguage} name of the record's country ${context.countryCode?.trim().toUpperCase()}, and also ${townOfExonym.towns}: which one the label means is left for a person to confirm, never answered as the town [CHOICE countryExonymTown, src/georef/method-defaults.ts]`;
    return { status: 'ambiguous', interpretation, candidates: townOfExonym.candidates, reason };
  }
  if (unit && !(townOfExonym && exonymRule === 'town')) {
    const found = findUnit(finder, unit, context, FUZZY_ACCEPTANCE.readingScore);
    if (!found.feature) return (found.loaded ? null : locateSeat(finder, unit, interpretation, context, options)) ?? { status: 'not-found', interpretation, candidates: found.candidates, reason: found.reason };
    return georeferenceUnit(found.feature, interpretation, found.remark, found.candidates, options);
  }

  const kindRule = options.settlementNamedLikeFeature ?? METHOD_DEFAULTS.settlementNamedLikeFeature;
  // The georeferencer's chosen feature may be a candidate of any reading tried (a second name, a later clause
  // standing in): a reading it does not fit is resolved as if unedited, and the edit is refused only when the
  // reading used has not taken it. Readings tried but not used keep their candidates, for a person to choose from.
  const tried: ReadingsTried = { aside: [] };
  const resolveEdited = (r: Interpretation, readingOptions: LocateOptions = options) => judgedByKind(resolveFeatures(finder, r, context, readingOptions, edits, tried), r, kindRule);
  // The reading's place, under its name or else its second name written in brackets, judged by its kind.
  // A named place that may be a route ("Ipala to Amatillo") is one name if the gazetteer holds it, else the
  // route between its two ends (src/locate/route.ts) [CHOICE routeReading]. An end is not read by the short form
  // of a longer name [CHOICE honoreeShortForms]: splitting the text is a guess already, and the two guesses
  // together placed the one route they reached on the real records 60 km from the publisher's point.
  const resolveReading = (reading: Interpretation): { reading: Interpretation; resolution: Resolution } => {
    const routing = routeJudgement(finder, reading, context, options, FUZZY_ACCEPTANCE.readingScore, (r) => resolveEdited(r, { ...options, honoreeShortForms: 'off' }));
    if ('decline' in routing && routing.final) return { reading, resolution: { ok: false, result: { status: routing.final, interpretation: reading, candidates: [], reason: routing.decline } } };
    if ('route' in routing) return { reading: routing.route, resolution: routing.resolved };
    const first = resolveEdited(reading);
    const second = !first.ok && first.result.status === 'not-found' ? secondNameReading(reading, context) : undefined;
    const attempt = second && resolveEdited(second);
    if (attempt && !attempt.ok && attempt.result.status === 'ambiguous') tried.aside.push({ what: `its second name written in brackets, "${second!.features[0]}",`, candidates: attempt.result.candidates, why: attempt.result.reason });
    if (!attempt?.ok && 'decline' in routing && !first.ok && first.result.status === 'not-found') return { reading, resolution: { ...first, result: { ...first.result, reason: routing.decline } } };
    if (!attempt?.ok) return { reading, resolution: first };
    return { reading: second!, resolution: { ...attempt, candidates: [...(first.ok ? [] : first.result.candidates), ...attempt.candidates] } };
  };
  let { reading: used, resolution: resolved } = resolveReading(interpretation);
  let fallbackFrom: { name: string; as?: string } | undefined;
  const missed = !resolved.ok && resolved.result.status === 'not-found' ? resolved : undefined;
  // A later clause may name the findable place ("Cerro Azul, Alisos" with only Alisos loaded, "Finca Las
  // Palmas, Alisos" with only a town Las Palmas loaded); failing that, the town the text's own units name
  // ("Mun. Alisos: Fazenda X" with no farm loaded). Either is widened as any place named but not loaded is.
  for (const { reading: standIn, what } of missed ? standInReadings(interpretation, context, options) : []) {
    const { reading, resolution: attempt } = resolveReading(standIn);
    // Only a place the gazetteer holds under that very name, inside a stated state or county: a guess
    // at a second name, or a name met anywhere in the country, too often is another place of that name.
    // A feature the georeferencer chose for it is no guess.
    const refused = attempt.ok ? standInRefused(attempt, context) : undefined;
    if (!attempt.ok || (refused && attempt.chosenNotes.length === 0)) {
      if (attempt.ok) tried.aside.push({ what, candidates: attempt.candidates, why: refused });
      else if (attempt.result.status === 'ambiguous') tried.aside.push({ what, candidates: attempt.result.candidates, why: attempt.result.reason });
      continue;
    }
    fallbackFrom = { name: interpretation.features.join('", "'), as: missed!.missingAs };
    const where = missed!.missingAs
      ? `is not in the loaded gazetteers ${missed!.missingAs}, only as a settlement that shares its name`
      : missed!.result.reason?.includes('is loaded only outside') ? 'is loaded only outside the record\'s stated units' : 'is not in the loaded gazetteers';
    const onChoice = refused ? ` on the georeferencer's choice of its feature (else not taken: ${refused})` : '';
    used = { ...reading, notes: [...reading.notes, `"${fallbackFrom.name}" ${where}: ${what} is used instead${onChoice}`] };
    resolved = { ...attempt, candidates: [...missed!.result.candidates, ...attempt.candidates] };
    break;
  }
  if (tried.refused && !(resolved.ok && resolved.chosenNotes.length > 0)) throw new EditRefused(tried.refused);
  if (!resolved.ok) return withReadingsAside(resolved.result, tried.aside);
  const { candidates, readings, matchRemarks, chosenNotes } = resolved;
  if (chosenNotes.length) used = { ...used, notes: [...used.notes, ...chosenNotes] };

  const lone = lonelyName(used) && readings[0]?.length === 1 ? readings[0][0]! : undefined;
  const far = lone && farFromCountySeat(finder, lone, context, FUZZY_ACCEPTANCE.readingScore, options.countyReachMeters ?? METHOD_DEFAULTS.countyReachMeters);
  if (far) return { status: 'ambiguous', interpretation: used, candidates, reason: far };

  const others = withRoadOfPost(checkOtherClauses(finder, used.otherClauses, context, FUZZY_ACCEPTANCE.readingScore), used);
  const withinUnit = readings.length === 1 && readings[0]!.length === 1 ? unitArea(readings[0]![0]!) : undefined;
  const unused = unusedPlaces(others, fallbackFrom, {
    rule: options.unusedFeatureRule ?? METHOD_DEFAULTS.unusedFeatureRule,
    meters: options.unusedFeatureMeters ?? METHOD_DEFAULTS.unusedFeatureMeters,
  }, withinUnit, used.type === 'coordinates' ? used.coordinates?.written : undefined);
  if ('decline' in unused) return { status: 'not-found', interpretation: used, candidates, reason: unused.decline };
  const widening = unused.widening ?? (lone && !fallbackFrom ? seatWidening(used, lone, context, options) : undefined);
  if (unused.note) used = { ...used, notes: [...used.notes, unused.note] };
  const pathLine = findPathLine(finder, used, context);
  // The stated municipality, county or province clips the footprint; a heading alone may also be bounded by the country.
  const boundingUnit = findBoundingUnit(finder, context, used.type === 'heading-only' ? 'country' : 'stateProvince');
  const combinations = cartesian(readings);
  if (combinations.length > MAX_COVERED_READINGS) {
    return { status: 'ambiguous', interpretation: used, candidates, reason: `${combinations.length} combinations of candidates: too many to cover with one circle (at most ${MAX_COVERED_READINGS})` };
  }
  const outcomes = combinations.map((features) => georeference({ interpretation: used, features, pathLine, boundingUnit, widening, options }));
  const refused = outcomes.find((o) => !o.ok);
  if (refused && !refused.ok) return { status: 'unparseable', interpretation: used, candidates, reason: refused.reason };
  const georefs = outcomes.flatMap((o) => (o.ok ? [o.georeference] : []));
  const georef = georefs.length === 1 ? georefs[0] : coverGeoreferences(georefs);
  const conflict = conflictWith(georef, others.found);
  if (conflict) return { status: 'unparseable', interpretation: used, candidates, reason: conflict };
  return georeferenced({ ...georef, remarks: [...matchRemarks, ...georef.remarks] }, used, candidates);
}

/**
 * The other clauses' check with the road of a kilometre post written beside the place used ("Manaus, km 23") among
 * the places named but not loaded: the specimen lies on that road, whose origin no clause gives, so the answer is
 * widened or declined as for any such place, never the town's own circle alone.
 * @example withRoadOfPost({ missing: [], found: [] }, parseLocality('Manaus, km 23')).missing // [{ clause: 1, name: 'the road of km 23' }]
 */
function withRoadOfPost(check: OtherClauseCheck, used: Interpretation): OtherClauseCheck {
  const post = used.kilometrePost;
  if (!post || used.type === 'coordinates') return check;
  const clause = used.clauses.findIndex((c) => c.text.includes(post));
  return { ...check, missing: [...check.missing, { clause, name: `the road of ${post}` }] };
}

/**
 * The town a name shares, found as written or by a documented reading (never by a near spelling), in
 * plain words with the candidates; several such towns are named together; undefined when none is. For
 * a country's name in another language that a town also bears.
 * @example townSharingName(store, parseLocality('a Brasilia'), { countryCode: 'BR' }, {})?.towns // 'the town Brasília (city, Federal District, BR; …)'
 */
function townSharingName(finder: CandidateFinder, interpretation: Interpretation, context: AdministrativeContext, options: LocateOptions): { towns: string; candidates: Candidate[] } | undefined {
  const resolved = resolveFeatures(finder, interpretation, context, options, {});
  const candidates = resolved.ok ? resolved.candidates : resolved.result.candidates;
  const taken = resolved.ok
    ? (resolved.guessed ? [] : candidates.filter((c) => resolved.readings.flat().includes(c.feature)))
    : resolved.result.status === 'ambiguous' ? candidates.filter((c) => c.score >= FUZZY_ACCEPTANCE.readingScore) : [];
  if (taken.length === 0) return undefined;
  return { towns: `${taken.length === 1 ? 'the town' : 'the towns'} ${taken.map(describeCandidate).join('; ')}`, candidates };
}

/**
 * A county or municipality named alone, with no polygon of it loaded: its seat, the one town of the unit's
 * name in the stated state, with the unit level's default extent added to the town's radius
 * [CHOICE unitSeatMeters]; null when the choice is 0, the level is wider, or no such town is held. The town
 * is looked for under the unit's name, the name as written, and its short form, the words before the first
 * "de" (seatNames: "ZACUALTIPAN DE ANGELES", whose seat is Zacualtipán); a name that is ambiguous or found
 * only by a near spelling ends the search. A town whose own long form shortens to the unit's name is not
 * taken: measured, it added one answer, and that one false.
 */
function locateSeat(finder: CandidateFinder, unit: NamedUnit, interpretation: Interpretation, context: AdministrativeContext, options: LocateOptions): LocateResult | null {
  const meters = options.unitSeatMeters ?? METHOD_DEFAULTS.unitSeatMeters;
  if (!meters || !context.stateProvince || (unit.level !== 'county' && unit.level !== 'municipality')) return null;
  for (const name of seatNames(unit)) {
    const town: Interpretation = { ...interpretation, type: 'named-place', features: [name], otherClauses: [], featureKind: undefined, secondName: undefined };
    // Not by [CHOICE honoreeShortForms]: a seat whose own long form shortens to the unit's name is not taken (above).
    const resolved = resolveFeatures(finder, town, { ...context, [unit.level]: undefined }, { ...options, honoreeShortForms: 'off' }, {});
    if (!resolved.ok && resolved.result.status === 'not-found') continue;
    if (!resolved.ok || resolved.guessed || resolved.readings[0]?.length !== 1) return null;
    const level = unit.level === 'county' ? 'county' : 'municipality';
    const short = shortFormKey(unit.name);
    const named = foldName(name) === short && short !== foldName(unit.name)
      ? `the town "${resolved.readings[0][0]!.name}", the ${level}'s name without the "de <honoree>" of its official long form`
      : 'the town of that name';
    const remark = `"${unit.written}" names the ${level} "${unit.name}", whose polygon is not loaded: georeferenced at its seat, ${named}, with the radius widened by ${(meters / 1000).toFixed(0)} km, a default extent for the unit, never a town's radius alone [CHOICE unitSeatMeters, src/georef/method-defaults.ts]`;
    const outcome = georeference({ interpretation: town, features: resolved.readings[0], widening: { meters, remark }, options });
    if (!outcome.ok) return null;
    return georeferenced({ ...outcome.georeference, remarks: [...resolved.matchRemarks, ...outcome.georeference.remarks] }, town, resolved.candidates);
  }
  return null;
}

/**
 * A text that is only a hierarchy ("CRI | Puntarenas | San Vito", read as country, state, county) whose last
 * link is a county or municipality the store holds no unit of: that link may name a place as well as a unit, so
 * it is georeferenced as a county named alone is, at its seat, the one town of its name in the stated state,
 * widened by the unit's default extent [CHOICE unitSeatMeters]; null otherwise (a unit the store holds stays the
 * unit, no town of the name is declined as before).
 * @example hierarchyEndSeat(store, parseLocality('CRI | Puntarenas | San Vito'), { countryCode: 'CR', stateProvince: 'Puntarenas' }, {})?.georeference?.features[0]?.name // 'San Vito'
 */
function hierarchyEndSeat(finder: CandidateFinder, interpretation: Interpretation, context: AdministrativeContext, options: LocateOptions): LocateResult | null {
  const { municipality, county } = interpretation.administrative;
  const name = municipality ?? county;
  if (!name || !interpretation.clauses.every((clause) => clause.kind === 'administrative')) return null;
  const unit: NamedUnit = { name, level: municipality ? 'municipality' : 'county', written: name };
  if (findUnit(finder, unit, context, FUZZY_ACCEPTANCE.readingScore).feature) return null;
  return locateSeat(finder, unit, interpretation, context, options);
}

/**
 * The widening of a bare name (the whole text one place name, nothing else) found as a town that may be the
 * seat of a municipality of its name: the gazetteer records it in no county or municipality of another
 * name, and the record states none of another name (its short form, shortFormKey, is its name too) [CHOICE bareNameSeatMeters]; undefined when the choice is 0.
 * @example seatWidening(parseLocality('Alisos'), townAlisos, { countryCode: 'QV' }, { bareNameSeatMeters: 20000 }) // { meters: 20000, remark: '"Alisos" is only a place name, …' }
 */
function seatWidening(used: Interpretation, town: Feature, context: AdministrativeContext, options: LocateOptions): { meters: number; remark: string } | undefined {
  const meters = options.bareNameSeatMeters ?? METHOD_DEFAULTS.bareNameSeatMeters;
  // A unit named by the town's short form ("Xalapa" for the town Xalapa de Enríquez) is of its own name too.
  const ownName = (unit: string | null | undefined) => !unit || foldName(unit) === foldName(town.name) || foldName(unit) === shortFormKey(town.name);
  if (!meters || used.clauses.length !== 1 || used.featureKind || !SETTLEMENTS.has(town.featureType ?? '')) return undefined;
  if (!ownName(town.county) || !ownName(context.county) || !ownName(context.municipality)) return undefined;
  const remark = `"${used.features[0]}" is only a place name, found as the town ${town.name}, which may be the seat of a municipality of that name: the radius widened by ${(meters / 1000).toFixed(0)} km, as the label may mean anywhere in the municipality [CHOICE bareNameSeatMeters, src/georef/method-defaults.ts]`;
  return { meters, remark };
}

/**
 * The readings that may stand in for a missing place, in order: a name in brackets that is the record's own
 * unit, not a second name ("Cerro Azul (Alisos)" in the county Alisos), the other clauses, the towns the text's
 * protected areas and stations are named after ([CHOICE protectedAreaTown], [CHOICE stationTown]), then the towns of the text's units.
 */
function standInReadings(interpretation: Interpretation, context: AdministrativeContext, options: LocateOptions): { reading: Interpretation; what: string }[] {
  const unitInBrackets = interpretation.secondName && !secondNameReading(interpretation, context) ? [{ name: interpretation.secondName, what: 'the record\'s unit written in brackets' }] : [];
  return [
    ...interpretation.otherClauses.map((clause) => ({
      reading: readingOf(interpretation, clause),
      what: `the next clause, "${interpretation.clauses[clause.clause]?.text ?? clause.features.join(', ')}",`,
    })),
    ...[...unitInBrackets, ...namesakeTowns(interpretation, options), ...standInsNamed(interpretation)].map(({ name, what }) => ({
      reading: { ...interpretation, type: 'named-place' as const, features: [name], offsets: [], featureKind: undefined, secondName: undefined },
      what: `${what}, "${name}",`,
    })),
  ];
}

/**
 * The towns the text's protected areas and stations are named after ("Reserva Biológica de Una": Una; "Alisos
 * Station": Alisos), its first clause's first: with no polygon or point of the area or station loaded, the town it
 * is named after may stand in for it, widened as any place named but not loaded is, since how far the area reaches
 * or the station lies from the town is unknown. A protected area by [CHOICE protectedAreaTown]: 'of' only a name
 * joined by "of" (de, do, du…: the area of a place), 'any' also one in apposition ("P. N. Alisos", "Alisos
 * Provincial Park", often an honoree's), 'decline' none; a station by [CHOICE stationTown], 'town' or 'decline'.
 * @example namesakeTowns(parseLocality('Reserva Biológica de Alisos. Sendero'), {}) // [{ name: 'Alisos', what: 'the town the protected area "Reserva Biológica de Alisos" is named after [CHOICE protectedAreaTown, …]' }]
 */
function namesakeTowns(interpretation: Interpretation, options: LocateOptions): { name: string; what: string }[] {
  const areaRule = options.protectedAreaTown ?? METHOD_DEFAULTS.protectedAreaTown;
  const stationRule = options.stationTown ?? METHOD_DEFAULTS.stationTown;
  return [interpretation, ...interpretation.otherClauses].flatMap((r) => {
    if (r.features.length !== 1) return [];
    const written = r.features[0]!;
    const area = r.featureKind === 'protected-area' && areaRule !== 'decline' ? protectedAreaNamesake(written) : undefined;
    if (area && (areaRule === 'any' || area.of)) return [{ name: area.name, what: `the town the protected area "${written}" is named after [CHOICE protectedAreaTown, src/georef/method-defaults.ts]` }];
    const station = stationRule === 'town' ? stationNamesake(written) : undefined;
    return station ? [{ name: station, what: `the town the station "${written}" is named after [CHOICE stationTown, src/georef/method-defaults.ts]` }] : [];
  });
}

/**
 * Why a stand-in for a missing place is not taken, or undefined when it is: it must be found as written or
 * by a documented reading of it (an abbreviation, a generic word left out: FUZZY_ACCEPTANCE.readingScore),
 * never a near spelling or a place outside the stated units, and inside a stated state, county or municipality.
 * @example standInRefused(resolved, { countryCode: 'QV' }) // 'the record states no state, county or municipality …'
 */
function standInRefused(resolution: Extract<Resolution, { ok: true }>, context: AdministrativeContext): string | undefined {
  if (resolution.guessed) return 'found only by a near spelling, as one of several, or outside the stated units';
  if (!(context.stateProvince || context.county || context.municipality)) return 'the record states no state, county or municipality, and a name met anywhere in the country is too often another place';
  return undefined;
}

/** The readings a not-found answer tried and set aside, and an edit that did not fit a reading tried. */
interface ReadingsTried {
  aside: { what: string; candidates: Candidate[]; why?: string }[];
  refused?: EditProblem;
}

/**
 * A not-found answer with the candidates of the readings it set aside (a second name or a later clause
 * matching several features, a later clause found but not taken), so that a person may choose among them,
 * and the reason saying why each was set aside.
 * @example withReadingsAside(notFound, [{ what: 'the next clause, "Los Pinos",', candidates, why: '"Los Pinos" matches several features: …' }]).reason
 *   // 'no feature named "Villa Quimera" …; the next clause, "Los Pinos", was tried: "Los Pinos" matches several features: …'
 */
function withReadingsAside(result: LocateResult, aside: ReadingsTried['aside']): LocateResult {
  if (result.status !== 'not-found' || aside.length === 0) return result;
  const key = (c: Candidate) => `${c.feature.sourceId}:${c.feature.featureId}`;
  const listed = new Set(result.candidates.map(key));
  const candidates = [...result.candidates];
  for (const candidate of aside.flatMap((a) => a.candidates)) {
    if (listed.has(key(candidate))) continue;
    listed.add(key(candidate));
    candidates.push(candidate);
  }
  const reason = [result.reason, ...aside.map((a) => `${a.what} was tried: ${a.why}`)].filter(Boolean).join('; ');
  return { ...result, candidates, reason };
}

type Resolution =
  | { ok: true; candidates: Candidate[]; readings: Feature[][]; matchRemarks: string[]; chosenNotes: string[]; guessed: boolean }
  /** `missingAs`: the place was found only as another kind of place ("as a farm or estate"), so counts as not loaded. */
  | { ok: false; result: LocateResult; missingAs?: string };

/**
 * The resolution judged by what the text says its place is (judgeKind, [CHOICE] settlementNamedLikeFeature):
 * when every feature found for the first name is a settlement the generic word rules out, the clause's place
 * counts as not loaded as that kind (`missingAs`), so a later clause may stand in for it as for any missing
 * place; otherwise the remarks on the features taken are added.
 * @example judgedByKind(resolveFeatures(store, parseLocality('Finca Las Palmas'), …), parseLocality('Finca Las Palmas'), 'settlement')
 *   // { ok: false, missingAs: 'as a farm or estate', result: { status: 'not-found', reason: '"Finca Las Palmas" names a farm or estate; …' } }
 */
function judgedByKind(resolution: Resolution, reading: Interpretation, rule: 'settlement' | 'decline'): Resolution {
  if (!resolution.ok) return resolution;
  const verdicts = (resolution.readings[0] ?? []).map((feature) => judgeKind(reading.featureKind, reading.features[0] ?? '', feature, rule));
  const declines = verdicts.filter((v): v is Extract<KindVerdict, { decline: string }> => !!v && 'decline' in v);
  if (verdicts.length > 0 && declines.length === verdicts.length) {
    const result: LocateResult = { status: 'not-found', interpretation: reading, candidates: resolution.candidates, reason: declines[0]!.decline };
    return { ok: false, result, missingAs: declines[0]!.missing };
  }
  const remarks = verdicts.flatMap((v) => (v && 'remark' in v ? [v.remark] : []));
  return { ...resolution, matchRemarks: [...new Set([...resolution.matchRemarks, ...remarks])] };
}

/**
 * `resolveNames` with the georeferencer's chosen features. A reading they do not fit (they are candidates of
 * its second name or of a later clause standing in for it) is resolved as if unedited, the first refusal kept
 * in `tried` for the caller, who raises it when the reading used has not taken the edit; without `tried` it is raised here.
 */
function resolveFeatures(finder: CandidateFinder, interpretation: Interpretation, context: AdministrativeContext, options: LocateOptions, edits: LocateEdits, tried?: ReadingsTried): Resolution {
  if (!edits.chosenFeatures?.length || !tried) return resolveNames(finder, interpretation, context, options, edits);
  try {
    return resolveNames(finder, interpretation, context, options, edits);
  } catch (error) {
    if (!(error instanceof EditRefused)) throw error;
    tried.refused ??= error.problem;
    return resolveNames(finder, interpretation, context, options, {});
  }
}

/** For each name of the reading, the features it may mean: one when resolved, several only with coverAmbiguous. */
function resolveNames(finder: CandidateFinder, interpretation: Interpretation, context: AdministrativeContext, options: LocateOptions, edits: LocateEdits): Resolution {
  const candidates: Candidate[] = [];
  const readings: Feature[][] = [];
  const matchRemarks: string[] = [];
  const chosenNotes: string[] = [];
  // A near spelling, a place just outside the stated units, or one of several taken.
  let guessed = false;
  for (const name of interpretation.features) {
    const all = finder.findCandidates(featureQuery(name, context, interpretation, options));
    candidates.push(...all);
    const { found, remark: ownUnit } = withoutOwnUnit(all, context, finder);
    if (ownUnit) matchRemarks.push(ownUnit);
    const chosen = chosenFeatureFor(name, interpretation.features, found, edits.chosenFeatures);
    if (chosen) {
      readings.push([chosen.feature]);
      chosenNotes.push(`feature chosen by the georeferencer: ${chosen.feature.name} (${chosen.feature.sourceId}:${chosen.feature.featureId}) for "${name}"`);
      continue;
    }
    const choice = chooseCandidate(found);
    // The point, not the town, must lie in the stated unit: a town may lie as far out as the offset reaches.
    const reach = reachMeters(interpretation, options.justOutsideMeters ?? METHOD_DEFAULTS.justOutsideMeters);
    if ((options.namesakesJudgedBy ?? METHOD_DEFAULTS.namesakesJudgedBy) === 'result' && choice.kind !== 'weak') {
      const taken = choice.kind === 'one' ? [choice.candidate] : choice.kind === 'several' ? choice.candidates : [];
      const wallUnit = context.county || context.stateProvince || context.municipality ? findBoundingUnit(finder, context, 'stateProvince') : undefined;
      const byResult = namesakeByResult(finder, featureQuery(name, context, interpretation, options), taken, wallUnit, interpretation, findPathLine(finder, interpretation, context), options, reach);
      if (byResult && 'ambiguous' in byResult) return { ok: false, result: { status: 'ambiguous', interpretation, candidates, reason: byResult.ambiguous } };
      if (byResult) {
        if (!taken.includes(byResult.candidate)) candidates.push(byResult.candidate);
        readings.push([byResult.candidate.feature]);
        matchRemarks.push(byResult.remark);
        guessed ||= !taken.includes(byResult.candidate);
        continue;
      }
    }
    if (choice.kind === 'none') {
      const wallUnit = findBoundingUnit(finder, context, 'stateProvince');
      const outside = justOutside(finder, featureQuery(name, context, interpretation, options), wallUnit, FUZZY_ACCEPTANCE.readingScore, reach, unitsWritten(interpretation), options.unitEdgeByPlaces);
      if (outside?.candidate) {
        candidates.push(outside.candidate);
        readings.push([outside.candidate.feature]);
        matchRemarks.push(outside.remark);
        guessed = true;
        continue;
      }
      const reason = [notFoundReason(name, context, found), outside?.reason].filter(Boolean).join('; ');
      return { ok: false, result: { status: 'not-found', interpretation, candidates, reason } };
    }
    if (choice.kind === 'weak') {
      const reason = `no feature named "${name}" in the loaded gazetteers; the only near name, ${describeCandidate(choice.candidate)}, scores below the ${FUZZY_ACCEPTANCE.minimumScore} a lone near match needs to be taken: verify the name`;
      return { ok: false, result: { status: 'not-found', interpretation, candidates, reason } };
    }
    if (choice.kind === 'several') {
      const names = choice.candidates.map(describeCandidate).join('; ');
      const namesakesMeters = options.namesakesWithinMeters ?? METHOD_DEFAULTS.namesakesWithinMeters;
      if (!options.coverAmbiguous && namesakes(choice.candidates.map((c) => c.feature), namesakesMeters)) {
        readings.push(choice.candidates.map((c) => c.feature));
        guessed = true;
        matchRemarks.push(`"${name}" matches ${choice.candidates.length} features within ${(namesakesMeters / 1000).toFixed(0)} km of each other (${names}): one circle covers them all [CHOICE namesakesWithinMeters, src/georef/method-defaults.ts]`);
        continue;
      }
      if (!options.coverAmbiguous) {
        return { ok: false, result: { status: 'ambiguous', interpretation, candidates, reason: `"${name}" matches several features: ${names}` } };
      }
      readings.push(choice.candidates.map((c) => c.feature));
      matchRemarks.push(`"${name}" is ambiguous (${names}); every candidate covered, as asked`);
      guessed = true;
      continue;
    }
    if (choice.candidate.score < FUZZY_ACCEPTANCE.readingScore && lonelyName(interpretation) && (options.fuzzyLoneName ?? METHOD_DEFAULTS.fuzzyLoneName) === 'review') {
      const reason = `no feature named "${name}" as written in the loaded gazetteers; the only near spelling, ${describeCandidate(choice.candidate)}, is not corroborated by anything else in the text, so it is left for a person to confirm [CHOICE fuzzyLoneName, src/georef/method-defaults.ts]`;
      return { ok: false, result: { status: 'ambiguous', interpretation, candidates, reason } };
    }
    if (choice.candidate.score < FUZZY_ACCEPTANCE.readingScore && firstWordsOf(name, choice.candidate.matchedName) && (options.nameAsFirstWords ?? METHOD_DEFAULTS.nameAsFirstWords) === 'review') {
      const reason = `no feature named "${name}" in the loaded gazetteers; the nearest, ${describeCandidate(choice.candidate)}, only begins with it, and a longer name is most often another place named after it (a town after its region, lake or range), so it is left for a person to confirm [CHOICE nameAsFirstWords, src/georef/method-defaults.ts]`;
      return { ok: false, result: { status: 'ambiguous', interpretation, candidates, reason } };
    }
    readings.push([choice.candidate.feature]);
    if (choice.candidate.score < 1) matchRemarks.push(fuzzyRemark(name, choice.candidate));
    guessed ||= choice.candidate.score < FUZZY_ACCEPTANCE.readingScore;
  }
  return { ok: true, candidates, readings, matchRemarks, chosenNotes, guessed };
}

/**
 * True when every word of `name` begins `longer`, which has more words: "Redmere" of "Redmere Springs" (folded).
 * @example firstWordsOf('Labrador', 'Labrador City') // true
 */
function firstWordsOf(name: string, longer: string): boolean {
  const words = foldName(name).split(' ');
  const longerWords = foldName(longer).split(' ');
  return longerWords.length > words.length && words.every((word, k) => longerWords[k] === word);
}

/** The units the text itself writes: its administrative clauses and the fields read from them. */
function unitsWritten(interpretation: Interpretation): string[] {
  const fields = Object.values(interpretation.administrative).filter((v): v is string => typeof v === 'string' && v.trim() !== '');
  return [...interpretation.clauses.filter((c) => c.kind === 'administrative').map((c) => c.text), ...fields];
}

/** True when the text is one place's name and nothing else: no offset, no second name, no other clause to check it against. */
function lonelyName(interpretation: Interpretation): boolean {
  return interpretation.type === 'named-place' && interpretation.features.length === 1 && interpretation.otherClauses.length === 0;
}

/**
 * A name shared by the record's own county, state or municipality and other features ("10 km N of Rio
 * Fundo" in county Rio Fundo, which holds the town Rio Fundo): the unit is the record's context, not the
 * place measured from, so it is left out, and the remark says so. Kept when it is the only candidate.
 * @example withoutOwnUnit([countyRioFundo, townRioFundo], { county: 'Rio Fundo' }).found // [townRioFundo]
 */
function withoutOwnUnit(found: Candidate[], context: AdministrativeContext, finder: CandidateFinder): { found: Candidate[]; remark?: string } {
  // The record may give its unit by a code or another name the store's unit names hold ("2513208", "PB").
  const names = (field: AdministrativeLevel, written: string, unitName: string) => foldName(written) === foldName(unitName)
    || (field !== 'country' && (finder.unitNames?.(UNIT_FIELD_LEVELS[field], administrativeKey(written)) ?? []).some((n) => n.unitKey === administrativeKey(unitName)));
  const own = (c: Candidate) => ADMINISTRATIVE_LEVELS.some((l) => l.featureType === c.feature.featureType && !!context[l.field] && names(l.field, context[l.field]!, c.feature.name));
  const units = found.filter((c) => c.score >= 1 && own(c));
  const rest = found.filter((c) => !units.includes(c));
  if (units.length === 0 || !rest.some((c) => c.score >= 1)) return { found };
  const unit = units[0]!.feature;
  return { found: rest, remark: `"${unit.name}" is also the record's ${unit.featureType}: read as its context, not as the place measured from` };
}

/**
 * True when the features are one kind of place in one state or province, no two farther apart than
 * `meters` (geodesics on WGS84, geographiclib): a town held twice, or two hamlets of a name side by side.
 */
function namesakes(features: Feature[], meters: number): boolean {
  const [first] = features;
  if (!first?.stateProvince || !features.every((f) => f.featureType === first.featureType && f.stateProvince === first.stateProvince)) return false;
  return features.every((a, k) => features.slice(k + 1).every((b) => inverse(a.latitude, a.longitude, b.latitude, b.longitude).meters <= meters));
}

/** At most this many readings of an ambiguous text are covered by one circle [CHOICE]. */
export const MAX_COVERED_READINGS = 50;

function cartesian<T>(lists: T[][]): T[][] {
  return lists.reduce<T[][]>((acc, list) => acc.flatMap((prefix) => list.map((item) => [...prefix, item])), [[]]);
}

function georeferenced(georef: Georeference, interpretation: Interpretation, candidates: Candidate[]): LocateResult {
  return { status: 'georeferenced', georeference: georef, components: georef.components, interpretation, candidates };
}

function fuzzyRemark(name: string, chosen: Candidate): string {
  return `"${name}" is not in the gazetteer as written; taken as "${chosen.matchedName}" (${chosen.why}; score ${chosen.score.toFixed(2)}), the only close match: verify the name`;
}

/** The reading of the record: verbatim coordinates, when they can be read, are its most specific part. */
function interpretationOf(request: LocateRequest): Interpretation {
  const interpretation = parseLocality(request.locality ?? '');
  const verbatim = request.verbatimCoordinates?.trim();
  if (!verbatim || interpretation.type === 'coordinates') return interpretation;
  const written = parseCoordinates(verbatim);
  if ('problem' in written) {
    return { ...interpretation, notes: [...interpretation.notes, `verbatimCoordinates "${verbatim}" not used: ${written.problem}`] };
  }
  return {
    ...interpretation,
    type: 'coordinates',
    features: [],
    offsets: [],
    coordinates: written,
    notes: [...interpretation.notes, 'georeferenced from the record\'s verbatimCoordinates, the most specific part of the record'],
  };
}

/**
 * The datum given with the record for coordinates that write none (one rule for CLI, HTTP and batch;
 * see readDatumOption): the request's options.datum, else its geodeticDatum field; an unknown value is refused.
 */
function datumGiven(request: LocateRequest): { epsg?: string } | { problem: string } {
  const field = readDatumOption(request.geodeticDatum, 'geodeticDatum');
  const option = readDatumOption(request.options?.datum, 'options.datum');
  if ('problem' in option) return option;
  if ('problem' in field) return field;
  return { epsg: option.epsg ?? field.epsg };
}

/** The record's own fields come first; administrative clauses of the text fill the gaps. */
function contextOf(request: LocateRequest, interpretation: Interpretation): AdministrativeContext {
  const fromText = interpretation.administrative;
  const pick = (a?: string, b?: string) => (a?.trim() ? a.trim() : b?.trim() || undefined);
  return {
    countryCode: pick(request.countryCode, fromText.countryCode)?.toUpperCase(),
    country: pick(request.country, fromText.country),
    stateProvince: pick(request.stateProvince, fromText.stateProvince),
    county: pick(request.county, fromText.county),
    municipality: pick(request.municipality, fromText.municipality),
  };
}

function featureQuery(name: string, context: AdministrativeContext, interpretation: Interpretation, options: LocateOptions): CandidateQuery {
  // [CHOICE olderSpellings, src/georef/method-defaults.ts]: the places of the text may be written in an older spelling;
  // [CHOICE honoreeShortForms]: or by the short form of an official long name; [CHOICE connectorReadings]: or
  // without the words joining its parts, inside a stated state.
  const spelling = {
    olderSpellings: options.olderSpellings ?? METHOD_DEFAULTS.olderSpellings,
    honoreeShortForms: options.honoreeShortForms ?? METHOD_DEFAULTS.honoreeShortForms,
    connectorReadings: options.connectorReadings ?? METHOD_DEFAULTS.connectorReadings,
    language: interpretation.language,
  };
  return interpretation.type === 'junction'
    ? { name, context, geometryTypes: LINES, withGeometry: true, ...spelling }
    : { name, context, ...spelling };
}

type Choice = { kind: 'none' } | { kind: 'one'; candidate: Candidate } | { kind: 'weak'; candidate: Candidate } | { kind: 'several'; candidates: Candidate[] };

/** Applies FUZZY_ACCEPTANCE: never a silent pick among equally good candidates. */
function chooseCandidate(found: Candidate[]): Choice {
  const exact = found.filter((c) => c.score >= 1);
  if (exact.length === 1) return { kind: 'one', candidate: exact[0] };
  if (exact.length > 1) return { kind: 'several', candidates: exact };
  const ranked = found.filter((c) => c.score >= FUZZY_ACCEPTANCE.plausibleScore).sort((a, b) => b.score - a.score);
  if (ranked.length === 0) return { kind: 'none' };
  const [best, next] = ranked;
  const leads = !next || best.score - next.score >= FUZZY_ACCEPTANCE.minimumLead;
  if (best.score >= FUZZY_ACCEPTANCE.minimumScore && leads) return { kind: 'one', candidate: best };
  // One near name too weak to stand alone is not a choice between several: say so.
  return next ? { kind: 'several', candidates: ranked } : { kind: 'weak', candidate: best };
}

function findPathLine(finder: CandidateFinder, interpretation: Interpretation, context: AdministrativeContext): Feature | undefined {
  const lineName = interpretation.offsets.find((o) => o.path?.lineName)?.path?.lineName;
  if (interpretation.type !== 'offset-path' || !lineName) return undefined;
  const choice = chooseCandidate(finder.findCandidates({ name: lineName, context, geometryTypes: LINES, withGeometry: true }));
  return choice.kind === 'one' ? choice.candidate.feature : undefined;
}

/**
 * The most specific administrative unit the record names, down to `widest`, when the gazetteer holds it
 * under that name or a documented reading of it (a fuzzy match would clip to the wrong unit), or the record
 * gives it by a code or name the store's unit names hold for it ("2504108", a municipality's code): the one unit
 * feature that code is tied to, though another unit shares its name, else the units of the names it is recorded for.
 */
function findBoundingUnit(finder: CandidateFinder, context: AdministrativeContext, widest: AdministrativeLevel): Feature | undefined {
  const levels = ADMINISTRATIVE_LEVELS.slice(0, ADMINISTRATIVE_LEVELS.findIndex((l) => l.field === widest) + 1);
  for (const level of levels) {
    const name = context[level.field];
    if (!name) continue;
    const named = (written: string) => finder
      .findCandidates({ name: written, context, featureTypes: [level.featureType], withGeometry: true })
      .filter((c) => c.score >= FUZZY_ACCEPTANCE.readingScore);
    let exact = foundByUnitNames(name, named).map((c) => c.feature);
    if (exact.length === 0 && level.field !== 'country') {
      const unitLevel = UNIT_FIELD_LEVELS[level.field];
      const country = resolveContext({ countryCode: context.countryCode, country: context.country });
      exact = (finder.unitFeatures?.(unitLevel, administrativeKey(name)) ?? []).filter((unit) => contextMismatch(unit, country) === null);
      if (exact.length === 0 && finder.unitNames) {
        const unitKeys = finder.unitNames(unitLevel, administrativeKey(name)).map((unitName) => unitName.unitKey);
        const byKey = (key: string) => finder.findCandidates({ name: key, context, featureTypes: [level.featureType], withGeometry: true });
        exact = foundUnderUnitKeys(name, unitKeys, byKey, (c) => c.feature).map((c) => c.feature);
      }
    }
    if (exact.length === 1) return exact[0];
  }
  return undefined;
}

function locateAdministrativeUnit(
  finder: CandidateFinder,
  interpretation: Interpretation,
  context: AdministrativeContext,
  options: LocateOptions,
): LocateResult {
  const unit = findBoundingUnit(finder, context, 'country');
  if (!unit) {
    return { status: 'unparseable', interpretation, candidates: [], reason: `${interpretation.reason ?? 'the text names no place'}; no administrative unit of the record was found in the gazetteer` };
  }
  return georeferenceUnit(unit, interpretation, `the text names no place; georeferenced to the record's ${unit.featureType} "${unit.name}" as asked`, [], options);
}

/** A unit's own feature as the place: its polygon's corrected center and radial (method §4). */
function georeferenceUnit(unit: Feature, interpretation: Interpretation, note: string, candidates: Candidate[], options: LocateOptions): LocateResult {
  const asNamedPlace: Interpretation = { ...interpretation, type: 'named-place', features: [unit.name], notes: [...interpretation.notes, note] };
  const outcome = georeference({ interpretation: asNamedPlace, features: [unit], options });
  if (!outcome.ok) return { status: 'unparseable', interpretation, candidates, reason: outcome.reason };
  return georeferenced(outcome.georeference, asNamedPlace, candidates);
}

function describeCandidate(c: Candidate): string {
  const f = c.feature;
  const where = [f.county, f.stateProvince, f.countryCode].filter(Boolean).join(', ');
  return `${f.name} (${f.featureType ?? 'feature'}${where ? `, ${where}` : ''}; ${f.sourceId}:${f.featureId}; score ${c.score.toFixed(2)})`;
}

function notFoundReason(name: string, context: AdministrativeContext, near: Candidate[]): string {
  const where = [context.county, context.stateProvince, context.country, context.countryCode].filter(Boolean).join(', ');
  const nearNames = near.length ? `; nearest names: ${near.slice(0, 5).map(describeCandidate).join('; ')}` : '';
  return `no feature named "${name}"${where ? ` in ${where}` : ''} in the loaded gazetteers${nearNames}`;
}
