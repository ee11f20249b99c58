/**
 * The plausibility stage after a georeference is made (src/georef/plausibility.ts has the rules): the
 * record's country outline from the gazetteer where one is loaded, otherwise Natural Earth's; land from
 * the gazetteer's country outlines, then Natural Earth's; and every other locality clause of the text
 * georeferenced on its own to see whether it agrees. Findings become flags and remarks; the point and
 * status stay as the method made them, for the reviewer to decide (src/locate.ts adds them to the result).
 */
import type { MultiPolygon, Polygon } from 'geojson';
import type { Candidate, CandidateFinder, Feature } from '../match/types.ts';
import type { Interpretation } from '../parse/types.ts';
import { NATURAL_EARTH, naturalEarthCountry, naturalEarthLand } from './natural-earth.ts';
import { insideOutlines, outlinesOf } from './outlines.ts';
import { atSea, clausesConflict, outsideRecordCountry, type NamedOutlines, type PlausibilityFinding } from './plausibility.ts';
import type { Georeference } from './types.ts';

/** A georeference to check, with what it was made from. */
export interface CheckedGeoreference {
  georeference: Georeference;
  interpretation: Interpretation;
  /** The candidates considered; those the georeference used give the countries whose land counts. */
  candidates: Candidate[];
  /** The record's ISO 3166-1 alpha-2 country code, when it has one. */
  countryCode?: string;
  /** Georeferences one clause of the text alone, with the record's context (undefined when it cannot). */
  locateClause: (text: string) => Georeference | undefined;
}

/**
 * What the plausibility checks find about a georeference (empty when all is plausible).
 * @example checkPlausibility(store, { georeference, interpretation, candidates, countryCode: 'QV', locateClause }) // []
 */
export function checkPlausibility(finder: CandidateFinder, checked: CheckedGeoreference): PlausibilityFinding[] {
  const { georeference: g, countryCode } = checked;
  const circle = { latitude: g.latitude, longitude: g.longitude, radiusMeters: g.uncertaintyMeters };
  const gazetteerCountry = (code: string) => gazetteerCountryOutlines(finder, code);
  const findings: (PlausibilityFinding | undefined)[] = [];

  if (countryCode) {
    const country = gazetteerCountry(countryCode) ?? naturalEarthCountryOutlines(countryCode);
    const onLand = (latitude: number, longitude: number) => insideOutlines(latitude, longitude, naturalEarthLand());
    if (country) findings.push(outsideRecordCountry(circle, countryCode, country, onLand));
  }

  const used = checked.candidates
    .filter((c) => g.features.some((f) => f.sourceId === c.feature.sourceId && f.featureId === c.feature.featureId))
    .map((c) => c.feature);
  const codes = [...new Set([countryCode, ...used.map((f) => f.countryCode)].filter((c): c is string => Boolean(c)))];
  findings.push(atSea(circle, used, [
    ...codes.map((code) => () => gazetteerCountry(code)),
    () => ({ name: `${NATURAL_EARTH.name} land`, outlines: naturalEarthLand(), toleranceMeters: NATURAL_EARTH.toleranceMeters }),
  ]));

  const { clauses, chosenClause } = checked.interpretation;
  const usedClause = chosenClause === null ? undefined : clauses[chosenClause];
  // A point from the record's verbatimCoordinates rests on no clause of the text: the batch's coordinate check compares those.
  const fromText = usedClause && (checked.interpretation.type !== 'coordinates' || usedClause.kind === 'coordinates');
  if (usedClause && fromText) {
    for (const [i, clause] of clauses.entries()) {
      if (i === chosenClause || (clause.kind !== 'locality' && clause.kind !== 'coordinates')) continue;
      const other = checked.locateClause(clause.text);
      if (other) findings.push(clausesConflict({ text: usedClause.text, ...circle }, { text: clause.text, latitude: other.latitude, longitude: other.longitude, radiusMeters: other.uncertaintyMeters }));
    }
  }

  return findings.filter((f): f is PlausibilityFinding => f !== undefined);
}

/**
 * A gazetteer's outlines of a country, or undefined when it holds none. Made once for each array the
 * finder hands out: a country polygon can hold many thousand vertices, and a batch checks every
 * locality against it; the store hands out the same array until its file changes, and a new one then.
 */
function gazetteerCountryOutlines(finder: CandidateFinder, code: string): NamedOutlines | undefined {
  const features = finder.countryOutlines?.(code) ?? [];
  if (features.length === 0) return undefined;
  let outlines = outlinesByFeatures.get(features);
  if (outlines === undefined) {
    outlines = {
      name: `gazetteer ${features.map((f) => `${f.sourceId}:${f.featureId}`).join(', ')}`,
      outlines: features.flatMap((f) => outlinesOf(f.geometry as Polygon | MultiPolygon)),
      toleranceMeters: 0,
    };
    outlinesByFeatures.set(features, outlines);
  }
  return outlines;
}

const outlinesByFeatures = new WeakMap<readonly Feature[], NamedOutlines>();

function naturalEarthCountryOutlines(code: string): NamedOutlines | undefined {
  const outlines = naturalEarthCountry(code);
  return outlines && { name: `${NATURAL_EARTH.name} country outline`, outlines, toleranceMeters: NATURAL_EARTH.toleranceMeters };
}
