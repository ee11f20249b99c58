/**
 * The locality clauses a georeference does not rest on, checked against the gazetteer: a place the
 * gazetteer lacks widens the radius ([CHOICE] unusedFeatureMeters), a place it holds must agree with
 * the answer. Pure: the gazetteer is reached only through the CandidateFinder it is given.
 */
import type { Candidate, CandidateFinder, Feature } from '../match/types.ts';
import { foldName } from '../match/fold.ts';
import { inverse } from '../geodesy/geodesic.ts';
import type { Georeference } from '../georef/types.ts';
import type { AdministrativeContext, ClauseReading, Interpretation } from '../parse/types.ts';

/** What the gazetteer says about the names of the clauses not used. */
export interface OtherClauseCheck {
  /** Names the gazetteer lacks (or holds only as near spellings): the specimen may come from there. */
  missing: { clause: number; name: string }[];
  /** Named places the gazetteer holds under that very name (or a documented reading of it). */
  found: { clause: number; name: string; features: Feature[] }[];
}

/** Types whose only feature is where the clause says the place is (no offset from it). */
const PLACE_TYPES = new Set(['named-place', 'near']);

/**
 * Looks up the feature names of `clauses`, leaving out names that are the record's own administrative
 * units (they bound the answer; they are not a place it could come from) and administrative-unit clauses.
 * `acceptScore` is the least score that counts as the name itself (FUZZY_ACCEPTANCE.readingScore).
 * @example checkOtherClauses(store, [{ clause: 1, type: 'named-place', features: ['Laguna Negra'], offsets: [] }], { countryCode: 'QV' }, 0.95)
 *   // { missing: [{ clause: 1, name: 'Laguna Negra' }], found: [] } when no lake is loaded
 */
export function checkOtherClauses(finder: CandidateFinder, clauses: ClauseReading[], context: AdministrativeContext, acceptScore: number): OtherClauseCheck {
  const units = new Set([context.country, context.stateProvince, context.county, context.municipality].filter((n): n is string => !!n?.trim()).map(foldName));
  const check: OtherClauseCheck = { missing: [], found: [] };
  for (const reading of clauses) {
    if (reading.type === 'administrative-unit') continue;
    for (const name of reading.features) {
      if (units.has(foldName(name))) continue;
      const lookUp = (n: string) => finder.findCandidates({ name: n, context }).filter((c: Candidate) => c.score >= acceptScore);
      // "Alisos (Alisitos)": the place is found under either name.
      const second = reading.secondName && reading.features.length === 1 && !units.has(foldName(reading.secondName)) ? reading.secondName : undefined;
      let named = lookUp(name);
      let as = name;
      if (named.length === 0 && second) [named, as] = [lookUp(second), second];
      if (named.length === 0) check.missing.push({ clause: reading.clause, name });
      else if (PLACE_TYPES.has(reading.type)) check.found.push({ clause: reading.clause, name: as, features: named.map((c) => c.feature) });
    }
  }
  return check;
}

/**
 * What the places the answer cannot rest on do to it: the missing names of the other clauses, and the
 * name of the chosen clause when a later clause had to be used instead (`fallbackFrom`, with `as` when it was
 * found only as another kind of place, "as a farm or estate"). By the
 * [CHOICE]s unusedFeatureRule and unusedFeatureMeters: a radius term with its remark, or the reason to
 * decline; nothing when every named place was found. When the place used is an administrative unit's
 * polygon (`withinUnit`), the text places the missing ones in it: a note, and no term. So too when the answer
 * rests on coordinates written in the text (`writtenCoordinates`): they say where the specimen was taken,
 * more precisely than any place named beside them.
 * @example unusedPlaces({ missing: [{ clause: 1, name: 'Laguna Negra' }], found: [] }, undefined, { rule: 'widen', meters: 120000 })
 *   // { widening: { meters: 120000, remark: '"Laguna Negra" is named but not in the loaded gazetteers: …' } }
 */
export function unusedPlaces(
  check: OtherClauseCheck,
  fallbackFrom: { name: string; as?: string } | undefined,
  choice: { rule: 'widen' | 'decline'; meters: number },
  withinUnit?: Feature,
  writtenCoordinates?: string,
): { widening?: { meters: number; remark: string }; note?: string } | { decline: string } {
  const names = [...(fallbackFrom ? [fallbackFrom] : []), ...check.missing.map((m) => ({ name: m.name, as: undefined }))];
  if (names.length === 0) return {};
  // "Finca Las Palmas" with only a town of that name loaded: not loaded as the kind of place the text names.
  const quoted = names.map((n) => `"${n.name}"${n.as ? ` (${n.as})` : ''}`).join(', ');
  const verb = names.length === 1 ? 'is' : 'are';
  if (withinUnit) {
    // "Cerro Azul, Alisos": the text places it in the unit, whose own polygon already bounds the answer.
    return { note: `${quoted} ${verb} named but not in the loaded gazetteers; the text places ${names.length === 1 ? 'it' : 'them'} in the ${withinUnit.featureType} "${withinUnit.name}", whose polygon is the answer's extent` };
  }
  if (writtenCoordinates !== undefined) {
    // "Lago Escondido, 54° 15' N 130° 20' W": the coordinates locate the record; a missing lake widens nothing.
    return { note: `${quoted} ${verb} named but not in the loaded gazetteers; the written coordinates, "${writtenCoordinates}", locate the record, so the radius is not widened for ${names.length === 1 ? 'it' : 'them'}` };
  }
  if (choice.rule === 'decline') {
    return { decline: `${quoted} ${verb} named but not in the loaded gazetteers: the specimen may come from there, so no georeference is given [CHOICE unusedFeatureRule 'decline', src/georef/method-defaults.ts]` };
  }
  if (choice.meters <= 0) return {};
  return {
    widening: {
      meters: choice.meters,
      remark: `${quoted} ${verb} named but not in the loaded gazetteers: the specimen may come from there, so the radius grows by ${(choice.meters / 1000).toFixed(0)} km, the distance such a place is taken to lie from the place used [CHOICE unusedFeatureMeters, src/georef/method-defaults.ts]`,
    },
  };
}

/**
 * Why the answer disagrees with a named place of another clause, or null: every feature the name can
 * mean lies farther from the answer's center than the answer's radius and the feature's own radius.
 * Distances are WGS84 geodesics (geographiclib, about 15 nm), far finer than the radii compared.
 * @example conflictWith(georef, [{ clause: 2, name: 'Rio de Janeiro', features: [rio] }]) // '"Rio de Janeiro" … 720 km …'
 */
export function conflictWith(georef: Georeference, found: OtherClauseCheck['found']): string | null {
  for (const { name, features } of found) {
    const gaps = features.map((f) => inverse(georef.latitude, georef.longitude, f.latitude, f.longitude).meters - f.radiusMeters - georef.uncertaintyMeters);
    if (gaps.every((gap) => gap > 0)) {
      const nearest = Math.min(...gaps) + georef.uncertaintyMeters;
      return `the text also names "${name}", ${(nearest / 1000).toFixed(0)} km from the answer's center, beyond its ${(georef.uncertaintyMeters / 1000).toFixed(1)} km radius: the clauses disagree, so no georeference is given`;
    }
  }
  return null;
}

/**
 * The interpretation as if `clause` had been the chosen one: used when the chosen clause's place is
 * not in the gazetteer and a later, findable clause stands in for it.
 * @example readingOf(parseLocality('Cerro Azul, Alisos'), { clause: 1, type: 'named-place', features: ['Alisos'], offsets: [] }).features // ['Alisos']
 */
export function readingOf(interpretation: Interpretation, clause: ClauseReading): Interpretation {
  // The parser's note that this clause is "not used for the point" no longer holds.
  const text = interpretation.clauses[clause.clause]?.text;
  const stale = (note: string) => text !== undefined && (note.startsWith(`also named: "${text}"`) || note.startsWith(`also read: "${text}"`));
  return {
    ...interpretation,
    notes: interpretation.notes.filter((note) => !stale(note)),
    chosenClause: clause.clause,
    type: clause.type,
    features: clause.features,
    offsets: clause.offsets,
    featureKind: clause.featureKind,
    route: clause.route,
    secondName: clause.secondName,
    otherClauses: interpretation.otherClauses.filter((c) => c.clause !== clause.clause),
  };
}
