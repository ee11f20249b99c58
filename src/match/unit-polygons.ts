/**
 * The administrative filter by polygon: when the gazetteer holds the polygon of the stated municipality,
 * county or state, a candidate whose center lies outside every polygon of that unit is dropped, and that
 * level's name no longer filters (contextMismatch). A line (a road, a river) is kept when any part of it
 * lies in the unit: a road that leaves the county is still the county's road. A polygon (a county tested
 * against its state) is kept when most of its area lies in the unit. Pure: the units come from the caller.
 */
import type { MultiPolygon, Polygon } from 'geojson';
import { booleanPointInPolygon } from '@turf/boolean-point-in-polygon';
import { feature as turfFeature, featureCollection } from '@turf/helpers';
import { intersect } from '@turf/intersect';
import { lineIntersect } from '@turf/line-intersect';
import { geometryAreaSquareMeters } from '../geodesy/geodesic.ts';
import { administrativeKey, foundByUnitNames, foundUnderUnitKeys, UNIT_FIELD_LEVELS, unitAliases, type ResolvedContext, type SpatiallyDecided } from './context.ts';
import type { Candidate, CandidateQuery, Feature, UnitLevel } from './types.ts';

/** Administrative levels from the smallest up, for the spatial test. */
const UNIT_RANK: Readonly<Record<string, number>> = { municipality: 1, county: 2, stateProvince: 3, country: 4 };
/** How each tested level is named in notes and reasons. */
const LEVEL_WORDS = { municipality: 'municipality', county: 'county', stateProvince: 'state/province' } as const;

/** The levels a polygon decided, and the test a candidate's center must pass. */
export interface UnitPolygonFilter {
  decided: SpatiallyDecided;
  /** Why the feature lies outside a stated unit's polygon, or null. */
  outside: (feature: Feature) => string | null;
}

/**
 * The polygon filter of a query: `exactCandidates` finds the stated units by name, `tiedUnits` the unit features a
 * code or other name of a level is tied to (CandidateFinder.unitFeatures), `keyCandidates` the units of a feature
 * type by a unit-name key (near spellings too: a key may lack a word of the name), `attachGeometry` loads their
 * polygons; a note for each unit used is added to `notes`.
 * @example unitPolygonFilter({ name: 'Alto', context: { county: 'Norte' } }, context, notes, exact, attach, byKey, tied).outside(feature)
 * // "center outside the polygon of county 'Norte' (demo:c-3)"
 */
export function unitPolygonFilter(
  query: CandidateQuery,
  context: ResolvedContext,
  notes: string[],
  exactCandidates: (name: string) => Candidate[],
  attachGeometry: (feature: Feature) => void,
  keyCandidates: (key: string, featureType: string) => Candidate[],
  tiedUnits: (level: UnitLevel, key: string) => Feature[],
): UnitPolygonFilter {
  const levels: { level: keyof typeof LEVEL_WORDS; written: string | undefined }[] = [
    { level: 'municipality', written: query.context.municipality },
    { level: 'county', written: query.context.county },
    { level: 'stateProvince', written: query.context.stateProvince },
  ];
  const tests: { level: keyof typeof LEVEL_WORDS; units: Feature[] }[] = [];
  const decided: SpatiallyDecided = {};
  for (const { level, written } of levels) {
    if (written === undefined || written.trim() === '' || query.featureTypes?.includes(level)) continue;
    const isPolygonHere = (feature: Feature) => feature.featureType === level
      && (feature.geometryType === 'Polygon' || feature.geometryType === 'MultiPolygon')
      && (context.countryCodes.size === 0 || feature.countryCode === null || context.countryCodes.has(feature.countryCode));
    const unitsNamed = (name: string) => exactCandidates(name).map((candidate) => candidate.feature).filter(isPolygonHere);
    // A unit the record gives by a code or name its feature lacks ("2401701", a municipalities file's
    // --unit-code-field): the one unit feature the code is tied to, though another unit shares its name; failing
    // that ("US-WA" from the dump's admin code files), found under the own name of each loaded unit that the unit
    // names say it names.
    const aliases = unitAliases(context, level);
    let units = foundByUnitNames(written, unitsNamed);
    if (units.length === 0) units = tiedUnits(UNIT_FIELD_LEVELS[level], administrativeKey(written)).filter(isPolygonHere);
    if (units.length === 0 && aliases !== undefined) {
      units = foundUnderUnitKeys(written, aliases, (key) => keyCandidates(key, level).map((candidate) => candidate.feature).filter(isPolygonHere), (unit) => unit);
    }
    if (units.length === 0) continue;
    for (const unit of units) attachGeometry(unit);
    decided[level] = true;
    tests.push({ level, units });
    notes.push(`${LEVEL_WORDS[level]} '${written}' checked against its polygon (${units.map((u) => `${u.sourceId}:${u.featureId}`).join(', ')})`);
  }
  return {
    decided,
    outside: (feature) => {
      for (const { level, units } of tests) {
        if (units.some((unit) => unit.sourceId === feature.sourceId && unit.featureId === feature.featureId)) continue;
        // A state is not inside its county: units above the tested level are not tested.
        if (UNIT_RANK[feature.featureType ?? ''] > UNIT_RANK[level]) continue;
        const area = areaOf(feature, attachGeometry);
        const inside = area !== undefined ? mostlyInside(area, units)
          : units.some((unit) => booleanPointInPolygon([feature.longitude, feature.latitude], unit.geometry as Polygon | MultiPolygon));
        if (!inside && !lineReaches(feature, units, attachGeometry)) {
          return `center outside the polygon of ${LEVEL_WORDS[level]} '${units[0].name}' (${units.map((u) => `${u.sourceId}:${u.featureId}`).join(', ')})`;
        }
      }
      return null;
    },
  };
}

/** A polygon feature's geometry, or undefined for points and lines. */
function areaOf(feature: Feature, attachGeometry: (feature: Feature) => void): Polygon | MultiPolygon | undefined {
  if (feature.geometryType !== 'Polygon' && feature.geometryType !== 'MultiPolygon') return undefined;
  attachGeometry(feature);
  const geometry = feature.geometry;
  return geometry?.type === 'Polygon' || geometry?.type === 'MultiPolygon' ? geometry : undefined;
}

/**
 * True when more than half of a polygon's area lies in one of the units' polygons (the share a majority
 * rule gives; common practice, no source). A unit's corrected center may lie on its own boundary (the point
 * of the polygon nearest a center that fell outside it, method §4), and a state's polygon drawn at another
 * scale then leaves it out: Shoshone County's corrected center lies on Idaho's border with Montana, outside
 * Natural Earth's 1:50m Idaho (test/e2e/real-files.test.ts). The share is of ellipsoidal areas (geodesic.ts),
 * the intersection planar in longitude and latitude (turf's intersect): between two tracings of one border
 * the difference is a sliver, far from deciding a share of one half.
 * @example mostlyInside(shoshoneCounty, [idaho]) // true
 */
function mostlyInside(area: Polygon | MultiPolygon, units: Feature[]): boolean {
  const whole = geometryAreaSquareMeters(area);
  if (whole === 0) return false;
  return units.some((unit) => {
    const shared = intersect(featureCollection([turfFeature(area), turfFeature(unit.geometry as Polygon | MultiPolygon)]));
    return shared !== null && geometryAreaSquareMeters(shared.geometry) > whole / 2;
  });
}

/**
 * True when a line feature has a vertex inside one of the units' polygons or crosses one's boundary
 * (turf's planar intersection: segments taken as straight in longitude and latitude, not as geodesics, so a
 * boundary grazed within that difference may be missed). False for points, whose center decides, and for polygons, which mostlyInside decides.
 * @example lineReaches(estradaDoSul, [countyRioFundo], attach) // true: the road leaves the county
 */
function lineReaches(feature: Feature, units: Feature[], attachGeometry: (feature: Feature) => void): boolean {
  if (feature.geometryType !== 'LineString' && feature.geometryType !== 'MultiLineString') return false;
  attachGeometry(feature);
  const line = feature.geometry;
  if (!line || (line.type !== 'LineString' && line.type !== 'MultiLineString')) return false;
  const vertices = line.type === 'LineString' ? line.coordinates : line.coordinates.flat();
  return units.some((unit) => {
    const polygon = unit.geometry as Polygon | MultiPolygon;
    return vertices.some((v) => booleanPointInPolygon(v, polygon)) || lineIntersect(line, polygon).features.length > 0;
  });
}
