/**
 * The point-radius method (docs/method.md §3): one interpretation of a locality text and its matched
 * features in, a point, a radius built from separate components and a footprint out. Pure: no I/O.
 */
import type { Feature } from '../match/types.ts';
import { describeAlsoIn } from '../match/same-place.ts';
import type { DistanceUnit, Interpretation, Offset, WrittenCoordinates } from '../parse/types.ts';
import { METERS_PER_UNIT } from '../parse/units.ts';
import { coordinatePrecisionMeters } from '../geodesy/coordinate-precision.ts';
import { datumDefinition, datumFromName, toWgs84 } from '../geodesy/datums.ts';
import { utmToGeographic } from '../geodesy/utm.ts';
import { regionalDatumBound } from '../geodesy/unknown-datum.ts';
import { direct, inverse } from '../geodesy/geodesic.ts';
import { normaliseLongitude } from '../geodesy/azimuthal-equidistant.ts';
import { unwrapGeometry } from '../geodesy/unwrap.ts';
import { lineIntersect } from '@turf/line-intersect';
import { enclosingCircle, featureExtent } from './feature-extent.ts';
import { circleWKT, clipCircleToUnit, clipRingToUnit, sectorRing } from './footprint.ts';
import { mapScaleErrorMeters } from './map-scale.ts';
import { METHOD_DEFAULTS } from './method-defaults.ts';
import { distanceOnlyUncertainty, offsetUncertainty, orthogonalOffsetUncertainty } from './offset-uncertainty.ts';
import { pathEnds } from './path-offset.ts';
import type { Georeference, MethodOptions, UncertaintyComponents } from './types.ts';

export interface GeoreferenceInput {
  interpretation: Interpretation;
  /** One feature per interpretation.features entry, in the same order (empty for type 'coordinates'). */
  features: Feature[];
  /** The line a path offset follows, with geometry, when the gazetteer has it. */
  pathLine?: Feature;
  /** The administrative unit (with polygon geometry) that bounds a heading-only locality or clips the footprint. */
  boundingUnit?: Feature;
  /** A term added to the radius because a place the text names could not be used, with the remark that says why. */
  widening?: { meters: number; remark: string };
  options?: MethodOptions;
}

export type GeoreferenceOutcome = { ok: true; georeference: Georeference } | { ok: false; reason: string };

type Settings = Required<Pick<MethodOptions, 'unknownDatumMeters' | 'nearMinimumMeters' | 'junctionExtentMeters' | 'footprintSegments' | 'mapStandard' | 'unitlessDistanceUnits' | 'roadNumberFromPlace' | 'typedUpTo'>> &
  MethodOptions;

/** What a type's rule yields before the shared terms, footprint and remarks are added. */
interface Placement {
  latitude: number;
  longitude: number;
  components: Pick<UncertaintyComponents, 'extent' | 'offset'> & Partial<UncertaintyComponents>;
  remarks: string[];
  /** Features the result rests on, beyond input.features (the path line, the bounding unit). */
  alsoUsed?: Feature[];
}

class Refusal extends Error {}
/** Stop with a reason: no georeference (docs/method.md §2 step 5). */
function refuse(reason: string): never {
  throw new Refusal(reason);
}

/**
 * Point, radius and footprint for one interpretation (docs/method.md §3), with every uncertainty term
 * separately (§5) and summed (§5.6), remarks naming the offset as read, the features used, every default
 * and [CHOICE] rule used, and the datum assumption. Refuses, with a reason, when the method gives no
 * georeference (no locality, heading without a bounding unit, lines that do not meet, flagged coordinates).
 * Accuracy: geodesics by geographiclib (~15 nm); the radius is exact for the rule, the footprint polygon
 * lies within 0.12 % of r inside the circle (64 segments).
 * @example
 *   georeference({ interpretation, features: [puertoLindo] })
 *   // { ok: true, georeference: { latitude, longitude, uncertaintyMeters: 6030.1, components: {…}, … } }
 */
export function georeference(input: GeoreferenceInput): GeoreferenceOutcome {
  const settings: Settings = { ...METHOD_DEFAULTS, ...definedOptions(input.options) };
  try {
    checkSettings(settings);
    const read = withUnitlessDistances(fromRoadStart(withUpToSlip(input, settings.typedUpTo), settings.roadNumberFromPlace), settings.unitlessDistanceUnits);
    const placement = place(read, settings);
    return { ok: true, georeference: finish(read, placement, settings) };
  } catch (error) {
    if (error instanceof Refusal) return { ok: false, reason: error.message };
    throw error;
  }
}

/**
 * Distances written with no unit, read as the range between their kilometre and mile readings
 * (METHOD_DEFAULTS.unitlessDistanceUnits [CHOICE]; range rule of docs/method.md §5.1), with a remark.
 * @example "0.5 NW of X" → d = 0.5 × (1000 + 1609.344)/2 m, δ = 0.5 × (1609.344 − 1000)/2 m + the written δ in miles
 */
function withUnitlessDistances(input: GeoreferenceInput, units: Settings['unitlessDistanceUnits']): GeoreferenceInput {
  const { interpretation } = input;
  if (!interpretation.offsets.some((o) => o.distance?.unitAssumed)) return input;
  const [low, high] = units.split(' ').map((unit) => METERS_PER_UNIT[unit as DistanceUnit]) as [number, number];
  const remarks: string[] = [];
  const offsets = interpretation.offsets.map((offset): Offset => {
    const d = offset.distance;
    if (!d?.unitAssumed) return offset;
    const meters = (d.value * (low + high)) / 2;
    // The written δ (from the number's precision) is taken in the larger unit, so it is never understated.
    const uncertaintyMeters = (d.value * (high - low)) / 2 + d.uncertainty * high;
    remarks.push(`"${d.written}" has no unit: read between ${d.value} ${units.replace(' ', ` and ${d.value} `)}, ${meters.toFixed(0)} m ± ${uncertaintyMeters.toFixed(0)} m [CHOICE unitlessDistanceUnits] (docs/method.md §5.1 range rule)`);
    return { ...offset, distance: { ...d, meters, uncertaintyMeters } };
  });
  return { ...input, interpretation: { ...interpretation, offsets, notes: [...interpretation.notes, ...remarks] } };
}

/**
 * A distance written before "of the road from" a place ("13.5 da estrada de X"): the road's distance from that
 * place, read as an offset along a path from it, with a remark; refused with 'decline'
 * (METHOD_DEFAULTS.roadNumberFromPlace [CHOICE]).
 * @example "13.5 da estrada de X" → the remark '"13.5" before "da estrada de X": read as the distance along that road from X …'
 */
function fromRoadStart(input: GeoreferenceInput, rule: 'from the place' | 'decline'): GeoreferenceInput {
  const { interpretation } = input;
  const offset = interpretation.offsets.find((o) => o.distance?.fromRoadStart);
  if (!offset) return input;
  const written = `"${offset.distance!.written}" before "${offset.path?.written ?? ''} ${interpretation.features[0] ?? ''}"`;
  if (rule === 'decline') refuse(`${written}: the road's count may begin elsewhere than the place named, so no georeference is given [CHOICE roadNumberFromPlace, src/georef/method-defaults.ts]`);
  const remark = `${written}: read as the distance along that road from ${interpretation.features[0] ?? 'the place'}, where the road's count is said to begin (a kilometre post with "km" left out) [CHOICE roadNumberFromPlace, src/georef/method-defaults.ts]`;
  return { ...input, interpretation: { ...interpretation, notes: [...interpretation.notes, remark] } };
}

/**
 * "ato" read as "até" where "até" is read ("13.5 da estrada de X ato Y": the way's direction, not used for the
 * point), with a remark; refused with 'as written', as the place's name would then run on into it
 * (METHOD_DEFAULTS.typedUpTo [CHOICE]).
 * @example "12 km de X ato Y" → the remark '"ato" before "Y" read as "até" (towards), a common typing slip …'
 */
function withUpToSlip(input: GeoreferenceInput, rule: 'até' | 'as written'): GeoreferenceInput {
  const { interpretation } = input;
  const offset = interpretation.offsets.find((o) => o.upToSlip);
  if (!offset) return input;
  const written = `"${offset.upToSlip}" before "${offset.toward ?? ''}"`;
  if (rule === 'as written') refuse(`${written} is not read as "até": the place's name runs on into it, and no such place is loaded [CHOICE typedUpTo, src/georef/method-defaults.ts]`);
  const remark = `${written} read as "até" (towards), a common typing slip, where "até" would be read: the direction of travel, not used for the point [CHOICE typedUpTo, src/georef/method-defaults.ts]`;
  return { ...input, interpretation: { ...interpretation, notes: [...interpretation.notes, remark] } };
}

function definedOptions(options: MethodOptions | undefined): MethodOptions {
  return Object.fromEntries(Object.entries(options ?? {}).filter(([, value]) => value !== undefined));
}

/** Options a caller sets must make sense; a bad one is refused by name, never silently replaced. */
function checkSettings(settings: Settings): void {
  const nonNegative = ['unknownDatumMeters', 'nearMinimumMeters', 'junctionExtentMeters', 'measurementErrorMeters'] as const;
  for (const name of nonNegative) {
    const value = settings[name];
    if (value !== undefined && !(Number.isFinite(value) && value >= 0)) refuse(`option ${name} must be a number of meters ≥ 0, got ${JSON.stringify(value)}`);
  }
  if (settings.mapScale !== undefined && !(Number.isFinite(settings.mapScale) && settings.mapScale >= 1)) {
    refuse(`option mapScale must be the scale's denominator (24000 for 1:24 000), got ${JSON.stringify(settings.mapScale)}`);
  }
  if (!['us-nmas', 'australian', 'unknown'].includes(settings.mapStandard)) {
    refuse(`option mapStandard must be us-nmas, australian or unknown, got ${JSON.stringify(settings.mapStandard)}`);
  }
  const [low, high] = settings.unitlessDistanceUnits.split(' ').map((unit) => METERS_PER_UNIT[unit as DistanceUnit]);
  if (!(low !== undefined && high !== undefined && low < high)) {
    refuse(`option unitlessDistanceUnits must be two distance units, smaller first (e.g. "km mi"), got ${JSON.stringify(settings.unitlessDistanceUnits)}`);
  }
  if (!(Number.isInteger(settings.footprintSegments) && settings.footprintSegments >= 8 && settings.footprintSegments <= 4096)) {
    refuse(`option footprintSegments must be a whole number from 8 to 4096, got ${JSON.stringify(settings.footprintSegments)}`);
  }
}

function place(input: GeoreferenceInput, settings: Settings): Placement {
  const { interpretation } = input;
  switch (interpretation.type) {
    case 'no-locality':
    case 'unparseable':
      return refuse(interpretation.reason ?? `the text was read as "${interpretation.type}" and names no place`);
    case 'coordinates':
      return placeCoordinates(interpretation.coordinates, settings);
    case 'named-place':
    // The feature given is the unit itself: its polygon or stated extent is the radius, never a town's.
    case 'administrative-unit':
      return placeNamedPlace(input);
    case 'offset-heading':
      return placeOffsetHeading(input);
    case 'offset-orthogonal':
      return placeOrthogonal(input);
    case 'distance-only':
      return placeDistanceOnly(input);
    case 'offset-path':
      return placeOffsetPath(input);
    case 'heading-only':
      return placeHeadingOnly(input);
    case 'between':
      return placeBetween(input);
    case 'near':
      return placeNear(input, settings);
    case 'junction':
      return placeJunction(input, settings);
  }
}

// ——— the rules of §3 ———

function placeCoordinates(coordinates: WrittenCoordinates | undefined, settings: Settings): Placement {
  if (!coordinates) return refuse('the locality was read as coordinates, but no coordinates came with it');
  if (coordinates.problems.length > 0) {
    return refuse(`the coordinates "${coordinates.written}" are flagged: ${coordinates.problems.join('; ')} (docs/method.md §2, step 5)`);
  }
  const { latitude, longitude, precisionDegrees } = coordinates;
  if (!(Math.abs(latitude) <= 90 && Math.abs(longitude) <= 180)) {
    return refuse(`the coordinates "${coordinates.written}" are out of range (latitude ${latitude}, longitude ${longitude})`);
  }
  const remarks = [`coordinates as written: "${coordinates.written}" (${coordinates.format}), docs/method.md §3`];
  // A datum written beside the coordinates is theirs; the one given with the record (settings.datum)
  // applies only when none is written. Only datums of the table count as stated; any other code or
  // name is reported as not convertible.
  const writtenDatum = coordinates.datumWritten ?? coordinates.datum;
  const stated = writtenDatum ?? settings.datum;
  const datum = stated ? datumFromName(stated) : undefined;
  const how = writtenDatum ? `as written ("${writtenDatum}")` : 'as given with the record';
  // A UTM reference is converted on the ellipsoid of the datum used (WGS84 when none is known), then shifted.
  const grid = coordinates.utm;
  const inDatum = grid ? utmToGeographic(grid, datum ?? 'EPSG:4326') : { latitude, longitude };
  if (grid) {
    const ellipsoidOf = datum ? datumDefinition(datum) : undefined;
    remarks.push(
      `UTM zone ${grid.zone}${grid.hemisphere} ${grid.easting} m E ${grid.northing} m N converted to latitude/longitude on the ellipsoid of ${ellipsoidOf?.name ?? 'WGS 84'} (${ellipsoidOf?.ellipsoid ?? '+ellps=WGS84'}) by the transverse Mercator of EPSG Guidance Note 7-2`,
    );
  }
  let position = inDatum;
  let datumMeters: number;
  const converted = datum ? toWgs84(inDatum.latitude, inDatum.longitude, datum) : undefined;
  if (converted && !converted.withinAreaOfUse) {
    // A datum stated for a place outside its area of use is doubtful: treated as unknown [CHOICE].
    position = converted;
    datumMeters = settings.unknownDatumMeters;
    remarks.push(
      `datum: ${datum} ${how}, but the point lies outside its EPSG area of use, so the statement is doubtful: converted by ${converted.transformation}, datum term the unknown-datum ${meters(datumMeters)} [CHOICE] (docs/method.md §5.4)`,
    );
  } else if (converted) {
    position = converted;
    datumMeters = converted.accuracyMeters;
    remarks.push(
      datum === 'EPSG:4326'
        ? `datum: WGS84 (EPSG:4326) ${how}; datum term 0 m (docs/method.md §5.4)`
        : `datum: ${datum} ${how}, converted to WGS84 by ${converted.transformation}; datum term ${meters(datumMeters)}, the transformation's stated accuracy (docs/method.md §5.4)`,
    );
  } else {
    const unknown = `${stated ? `datum written as "${stated}" is not one we can convert` : 'datum not recorded'}: coordinates taken as WGS84`;
    // Bounded where the point lies when the datums in use there are known, never above the global figure.
    const regional = regionalDatumBound(inDatum, grid);
    if (regional && regional.meters < settings.unknownDatumMeters) {
      datumMeters = regional.meters;
      remarks.push(
        `${unknown}, datum term ${meters(datumMeters)}: the largest distance between its readings in the datums whose EPSG area of use holds the point ` +
          `(${regional.datums.join(', ')}) [CHOICE]; their transformations' stated accuracies (at most ${meters(regional.accuracyMeters)}) are not added (docs/method.md §5.4)`,
      );
    } else {
      datumMeters = settings.unknownDatumMeters;
      remarks.push(`${unknown}, datum term ${meters(datumMeters)}${regional ? '' : ', no regional datum applies here'} (docs/method.md §5.4)`);
    }
  }
  const precision = coordinatePrecisionMeters(position.latitude, precisionDegrees);
  remarks.push(`coordinate precision ${formatDegrees(precisionDegrees)} → ${meters(precision)} at this latitude (docs/method.md §5.3)`);
  return { ...position, components: { extent: 0, offset: 0, coordinatePrecision: precision, datum: datumMeters }, remarks };
}

function placeNamedPlace(input: GeoreferenceInput): Placement {
  const feature = featureAt(input, 0);
  return { latitude: feature.latitude, longitude: feature.longitude, components: { extent: feature.radiusMeters, offset: 0 }, remarks: [] };
}

function placeOffsetHeading(input: GeoreferenceInput): Placement {
  const feature = featureAt(input, 0);
  const offset = offsetAt(input.interpretation, 0);
  const distance = offset.distance ?? refuse('an offset at a heading needs a distance, and none was read');
  const heading = offset.heading ?? refuse('an offset at a heading needs a heading, and none was read');
  const end = direct(feature.latitude, feature.longitude, heading.azimuth, distance.meters);
  const term = offsetUncertainty(distance.meters, distance.uncertaintyMeters, heading.halfWidth);
  return {
    latitude: end.latitude,
    longitude: end.longitude,
    components: { extent: feature.radiusMeters, offset: term },
    remarks: [
      `offset as read: ${describeDistance(offset)} at ${describeHeading(offset)}${offset.byAir ? ', by air' : ''}; ` +
        `point by geodesic from the corrected center; offset term ${meters(term)} = sqrt((d+δ)² + d² − 2d(d+δ)cos Δ) (docs/method.md §5.2)`,
    ],
  };
}

function placeOrthogonal(input: GeoreferenceInput): Placement {
  const feature = featureAt(input, 0);
  const offsets = input.interpretation.offsets;
  const axis = (wanted: 'north-south' | 'east-west') =>
    offsets.find((o) => o.distance && o.heading && (wanted === 'north-south' ? [0, 180] : [90, 270]).includes(o.heading.azimuth)) ??
    refuse(`two orthogonal offsets need one due north or south and one due east or west; read: ${offsets.map(describeOffset).join(' and ')}`);
  const northSouth = axis('north-south');
  const eastWest = axis('east-west');
  const moved = direct(feature.latitude, feature.longitude, northSouth.heading!.azimuth, northSouth.distance!.meters);
  const end = direct(moved.latitude, moved.longitude, eastWest.heading!.azimuth, eastWest.distance!.meters);
  const term = orthogonalOffsetUncertainty(northSouth.distance!.uncertaintyMeters, eastWest.distance!.uncertaintyMeters);
  return {
    latitude: end.latitude,
    longitude: end.longitude,
    components: { extent: feature.radiusMeters, offset: term },
    remarks: [
      `offsets as read: ${describeOffset(northSouth)}, then ${describeOffset(eastWest)}; moved north/south first, then east/west, geodesically; ` +
        `headings exact by convention, offset term sqrt(δx² + δy²) = ${meters(term)} (docs/method.md §3)`,
    ],
  };
}

function placeDistanceOnly(input: GeoreferenceInput): Placement {
  const feature = featureAt(input, 0);
  const offset = offsetAt(input.interpretation, 0);
  const distance = offset.distance ?? refuse('a distance from a place needs a distance, and none was read');
  const term = distanceOnlyUncertainty(distance.meters, distance.uncertaintyMeters);
  return {
    latitude: feature.latitude,
    longitude: feature.longitude,
    components: { extent: feature.radiusMeters, offset: term },
    remarks: [`distance without heading as read: ${describeDistance(offset)}; point at the corrected center, offset term d + δ = ${meters(term)} [CHOICE] (docs/method.md §3)`],
  };
}

function placeOffsetPath(input: GeoreferenceInput): Placement {
  const feature = featureAt(input, 0);
  const offset = offsetAt(input.interpretation, 0);
  const distance = offset.distance ?? refuse('an offset along a path needs a distance, and none was read');
  const path = offset.path;
  const read = `offset as read: ${describeDistance(offset)}${path ? ` ${path.written}` : ''}${offset.heading ? ` heading ${describeHeading(offset)}` : ''}`;
  const fallback = (why: string): Placement => {
    const term = distanceOnlyUncertainty(distance.meters, distance.uncertaintyMeters);
    return {
      latitude: feature.latitude,
      longitude: feature.longitude,
      components: { extent: feature.radiusMeters, offset: term },
      remarks: [`${read}; ${why}: point at the corrected center, offset term d + δ = ${meters(term)} [CHOICE] (docs/method.md §3)`],
    };
  };
  const line = input.pathLine;
  if (!line?.geometry || !['LineString', 'MultiLineString'].includes(line.geometry.type)) {
    return fallback(`no line${path?.lineName ? ` for "${path.lineName}"` : ''} with geometry in the gazetteer`);
  }
  const ends = pathEnds(line.geometry, feature.latitude, feature.longitude, feature.radiusMeters, distance.meters);
  if (ends.length === 0) return fallback(`the line "${line.name}" does not leave the feature's extent circle and run on for ${meters(distance.meters)}`);
  let end = ends[0]!;
  let how = `the only way out along "${line.name}"`;
  if (ends.length > 1) {
    if (!offset.heading) return fallback(`"${line.name}" leaves the feature in ${ends.length} directions and no heading tells which`);
    const heading = offset.heading;
    const apart = (e: (typeof ends)[number]) => Math.abs(normaliseLongitude(e.azimuthFromCenter - heading.azimuth));
    end = ends.reduce((best, e) => (apart(e) < apart(best) ? e : best));
    how = `of ${ends.length} ways out along "${line.name}", the one ending nearest heading ${heading.written} (${apart(end).toFixed(0)}° off)`;
  }
  return {
    latitude: end.latitude,
    longitude: end.longitude,
    components: { extent: feature.radiusMeters, offset: distance.uncertaintyMeters },
    remarks: [`${read}; followed ${how} for ${meters(distance.meters)} from where it leaves the feature's extent circle; offset term δ = ${meters(distance.uncertaintyMeters)}, no heading term (docs/method.md §3)`],
    alsoUsed: [line],
  };
}

function placeHeadingOnly(input: GeoreferenceInput): Placement {
  const feature = featureAt(input, 0);
  const offset = offsetAt(input.interpretation, 0);
  const heading = offset.heading ?? refuse('a heading-only locality needs a heading, and none was read');
  const unit = input.boundingUnit;
  if (!unit?.geometry || !['Polygon', 'MultiPolygon'].includes(unit.geometry.type)) {
    return refuse(`"${heading.written} of ${feature.name}" has no distance and no bounding unit with a polygon to limit it: not georeferenced (docs/method.md §3)`);
  }
  const reach = inverse(feature.latitude, feature.longitude, unit.latitude, unit.longitude).meters + unit.radiusMeters;
  // "due N" (Δ = 0) is a line; a sector 0.01° wide stands for it, so that the clip has an area.
  const sector = sectorRing(feature.latitude, feature.longitude, heading.azimuth, Math.max(heading.halfWidth, 0.01), Math.max(reach, 1));
  const clipped = clipRingToUnit(sector, unit.geometry) ?? refuse(`no part of ${unit.name} lies ${heading.written} of ${feature.name}`);
  const part = featureExtent(clipped.geometry);
  return {
    latitude: part.latitude,
    longitude: part.longitude,
    components: { extent: part.radiusMeters, offset: 0 },
    remarks: [
      `heading only, as read: ${describeHeading(offset)} of ${feature.name}, bounded by ${unit.featureType ?? 'unit'} "${unit.name}": ` +
        `point and radial of the part of the unit inside the sector ${heading.written} (±${heading.halfWidth}°) from the corrected center [CHOICE] (docs/method.md §3)`,
      ...(clipped.unclippedBecause ? [`${clipped.unclippedBecause}: the whole sector out to the far side of "${unit.name}" was used instead, a larger radius than the clip would give`] : []),
    ],
    alsoUsed: [unit],
  };
}

function placeBetween(input: GeoreferenceInput): Placement {
  const features = input.features;
  if (features.length < 2) return refuse(`"between" needs two features, got ${features.length}`);
  const largest = Math.max(...features.map((f) => f.radiusMeters));
  if (features.length === 2) {
    const [a, b] = [features[0]!, features[1]!];
    const joining = inverse(a.latitude, a.longitude, b.latitude, b.longitude);
    const middle = direct(a.latitude, a.longitude, joining.azimuth1, joining.meters / 2);
    return {
      latitude: middle.latitude,
      longitude: middle.longitude,
      components: { extent: largest, offset: joining.meters / 2 },
      remarks: [`between ${a.name} and ${b.name}: midpoint of the geodesic joining their corrected centers (D = ${meters(joining.meters)}); radius D/2 + max(r_f1, r_f2) [CHOICE] (docs/method.md §3)`],
    };
  }
  const circle = enclosingCircle(features.map((f) => [f.longitude, f.latitude]));
  return {
    latitude: circle.latitude,
    longitude: circle.longitude,
    components: { extent: largest, offset: circle.radiusMeters },
    remarks: [`${features.length} features (${features.map((f) => f.name).join(', ')}): center of the smallest circle through their corrected centers; radius that circle's + the largest radial, the "between" rule extended to more than two places [CHOICE] (docs/method.md §3)`],
  };
}

function placeNear(input: GeoreferenceInput, settings: Settings): Placement {
  const feature = featureAt(input, 0);
  const term = Math.max(feature.radiusMeters, settings.nearMinimumMeters);
  return {
    latitude: feature.latitude,
    longitude: feature.longitude,
    components: { extent: feature.radiusMeters, offset: term },
    remarks: [`near ${feature.name}: point at the corrected center, radius r_f + max(r_f, ${meters(settings.nearMinimumMeters)}) [CHOICE] (docs/method.md §3)`],
  };
}

function placeJunction(input: GeoreferenceInput, settings: Settings): Placement {
  const [a, b] = [featureAt(input, 0), featureAt(input, 1)];
  const lines = [a, b].map((f) =>
    f.geometry?.type === 'LineString' || f.geometry?.type === 'MultiLineString'
      ? unwrapGeometry(f.geometry, a.longitude) // so that lines crossing the antimeridian meet in the plane
      : refuse(`a junction needs the line geometry of both features; "${f.name}" has none in the gazetteer`),
  );
  const meetings = lineIntersect(lines[0]!, lines[1]!).features.map((p) => p.geometry.coordinates);
  if (meetings.length === 0) return refuse(`the lines "${a.name}" and "${b.name}" do not meet in the gazetteer`);
  const where = enclosingCircle(meetings);
  const count = meetings.length === 1 ? 'meet once' : `meet ${meetings.length} times; the circle covers every meeting point`;
  return {
    latitude: where.latitude,
    longitude: where.longitude,
    components: { extent: settings.junctionExtentMeters + where.radiusMeters, offset: 0 },
    remarks: [`junction of ${a.name} and ${b.name}: the lines ${count}; the junction's own extent ${meters(settings.junctionExtentMeters)} [CHOICE] (docs/method.md §3)`],
  };
}

// ——— shared terms, footprint and remarks ———

function finish(input: GeoreferenceInput, placement: Placement, settings: Settings): Georeference {
  const remarks = [`locality type "${input.interpretation.type}" (docs/method.md §3)`, ...placement.remarks];
  const used = [...input.features, ...(placement.alsoUsed ?? [])];
  for (const feature of input.features) remarks.push(describeFeature(feature));
  if (input.interpretation.type !== 'coordinates') {
    remarks.push('datum: WGS84 (EPSG:4326), the gazetteer\'s coordinates; no datum or coordinate-precision term (docs/method.md §5.4)');
  }
  const mapScale = settings.mapScale ? mapScaleErrorMeters(settings.mapScale, settings.mapStandard) : 0;
  if (settings.mapScale) {
    remarks.push(`map reading at 1:${settings.mapScale}: ${settings.mapStandard === 'unknown' ? 'no known accuracy standard, 1 mm on the map' : `${settings.mapStandard} standard plus 1 mm on the map`} = ${meters(mapScale)} (docs/method.md §5.5)`);
  }
  const measurement = settings.measurementErrorMeters ?? 0;
  if (measurement) remarks.push(`stated measurement error ${meters(measurement)}, added as given (docs/method.md §5.5)`);
  if (input.interpretation.approximate) remarks.push('"ca." or "about" noted: it changes neither point nor radius (docs/method.md §3)');
  for (const note of input.interpretation.notes) remarks.push(`reading: ${note}`);

  const components: UncertaintyComponents = {
    coordinatePrecision: 0,
    datum: 0,
    ...placement.components,
    mapScale,
    measurement,
    ...(input.widening ? { unusedFeature: input.widening.meters } : {}),
  };
  if (input.widening) remarks.push(input.widening.remark);
  for (const [name, value] of Object.entries(components)) {
    if (!(value >= 0) || !Number.isFinite(value)) throw new Error(`uncertainty component ${name} is ${value}: a bug, not an input problem`);
  }
  const uncertaintyMeters = Object.values(components).reduce((sum, value) => sum + value, 0);
  remarks.push(`uncertainty ${meters(uncertaintyMeters)} = ${Object.entries(components).filter(([, v]) => v > 0).map(([k, v]) => `${k} ${meters(v)}`).join(' + ') || '0'} (docs/method.md §5.6)`);

  const latitude = placement.latitude;
  const longitude = normaliseLongitude(placement.longitude);
  let footprintWKT: string;
  const unit = input.boundingUnit;
  if (unit && uncertaintyMeters > 0 && unit.geometry && ['Polygon', 'MultiPolygon'].includes(unit.geometry.type)) {
    // The circle is drawn once, for the clip: the unclipped circle's WKT would only be thrown away.
    const clipped = clipCircleToUnit({ latitude, longitude, radiusMeters: uncertaintyMeters }, unit.geometry, settings.footprintSegments);
    if (!clipped) refuse(`the georeference lies wholly outside the bounding unit "${unit.name}": the clauses contradict each other (docs/method.md §2, step 5)`);
    footprintWKT = clipped.footprintWKT;
    remarks.push(
      clipped.unclippedBecause
        ? `footprint: ${clipped.unclippedBecause}, so the whole circle is kept, not clipped to ${unit.featureType ?? 'unit'} "${unit.name}"`
        : `footprint: the circle clipped to ${unit.featureType ?? 'unit'} "${unit.name}"`,
    );
    used.push(unit);
  } else {
    footprintWKT = circleWKT(latitude, longitude, uncertaintyMeters, settings.footprintSegments);
  }
  const seen = new Set<string>();
  const features = used
    .filter((f) => !seen.has(`${f.sourceId}\u0000${f.featureId}`) && seen.add(`${f.sourceId}\u0000${f.featureId}`))
    .map((f) => ({ sourceId: f.sourceId, featureId: f.featureId, name: f.name }));
  return { latitude, longitude, uncertaintyMeters, components, footprintWKT, features, remarks };
}

function featureAt(input: GeoreferenceInput, index: number): Feature {
  const feature = input.features[index];
  if (!feature) return refuse(`the rule for "${input.interpretation.type}" needs feature ${index + 1} ("${input.interpretation.features[index] ?? '?'}"), and none was given`);
  if (!(Math.abs(feature.latitude) <= 90 && Number.isFinite(feature.longitude) && feature.radiusMeters >= 0)) {
    return refuse(`feature "${feature.name}" (${feature.sourceId}:${feature.featureId}) has an invalid center or radius`);
  }
  return feature;
}

function offsetAt(interpretation: Interpretation, index: number): Offset {
  const offset = interpretation.offsets[index] ?? refuse(`the rule for "${interpretation.type}" needs an offset, and none was read`);
  const { distance, heading } = offset;
  if (distance && !(distance.meters >= 0 && distance.uncertaintyMeters >= 0 && Number.isFinite(distance.meters + distance.uncertaintyMeters))) {
    refuse(`the distance "${distance.written}" was read as ${distance.meters} m ± ${distance.uncertaintyMeters} m, which cannot be used`);
  }
  if (heading && !(Number.isFinite(heading.azimuth) && heading.halfWidth >= 0 && heading.halfWidth <= 180)) {
    refuse(`the heading "${heading.written}" was read as ${heading.azimuth}° ± ${heading.halfWidth}°, which cannot be used`);
  }
  return offset;
}

function describeFeature(feature: Feature): string {
  const radial = feature.radiusIsDefault
    ? `default radial ${meters(feature.radiusMeters)} for a ${feature.featureType ?? 'feature'} point with no extent in the gazetteer (docs/method.md §4)`
    : `geographic radial ${meters(feature.radiusMeters)} (docs/method.md §4)`;
  const elsewhere = feature.alsoIn !== undefined && feature.alsoIn.length > 0 ? `; ${describeAlsoIn(feature.sourceId, feature.alsoIn)}` : '';
  const matchedAs = feature.matchedAs === undefined ? '' : `, found by its ${feature.matchedAs}`;
  return `feature used: "${feature.name}"${matchedAs} (${feature.sourceId}:${feature.featureId}), corrected center ${feature.latitude.toFixed(7)}, ${feature.longitude.toFixed(7)}, ${radial}${elsewhere}`;
}

function describeDistance(offset: Offset): string {
  const d = offset.distance;
  return d ? `"${d.written}" = ${meters(d.meters)} ± δ ${meters(d.uncertaintyMeters)} (docs/method.md §5.1)` : 'no distance';
}

function describeHeading(offset: Offset): string {
  const h = offset.heading;
  return h ? `"${h.written}" = ${h.azimuth}° ± Δ ${h.halfWidth}°` : 'no heading';
}

function describeOffset(offset: Offset): string {
  return `${describeDistance(offset)} ${describeHeading(offset)}`;
}

/** Meters for remarks: whole meters from 10 m, one decimal below. */
function meters(value: number): string {
  return value >= 10 ? `${Math.round(value)} m` : `${Number(value.toFixed(1))} m`;
}

function formatDegrees(precision: number): string {
  return `${Number(precision.toPrecision(6))}°`;
}
