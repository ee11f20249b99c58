/**
 * A check of the coordinates a record already has against the circle computed from its locality text,
 * and against the centers of the country and state it names: as flags (the batch output's flags
 * column) and as a distance (the API's `recordPoint`). The record's values are never changed.
 */
import { inverse } from '../geodesy/geodesic.ts';
import type { GeoreferenceTerm } from './darwin-core.ts';

/** The flags whereabouts writes, each with what it means (the README lists them). */
export const COORDINATE_FLAGS = {
  'agrees-with-locality': 'the coordinates lie inside the circle of the locality text',
  'outside-locality-circle': 'the coordinates lie outside the circle of the locality text',
  'fits-if-latitude-sign-flipped': 'with the sign of latitude inverted they would lie inside the circle',
  'fits-if-longitude-sign-flipped': 'with the sign of longitude inverted they would lie inside the circle',
  'fits-if-both-signs-flipped': 'with both signs inverted they would lie inside the circle',
  'fits-if-latitude-longitude-exchanged': 'with latitude and longitude swapped they would lie inside the circle',
  'both-zero': 'latitude and longitude are both zero, most likely an empty value written as zero',
  'latitude-zero': 'latitude is zero and the circle does not reach the equator (an empty value written as zero?)',
  'longitude-zero': 'longitude is zero and the circle does not reach the prime meridian (an empty value written as zero?)',
  'one-side-empty': 'one coordinate is given and the other is empty (read as zero by some programs)',
  'not-a-decimal-number': 'a coordinate is not a decimal number',
  'beyond-valid-range': 'latitude is beyond ±90 or longitude beyond ±180',
  'at-country-center': "the coordinates sit on the center of the record's country in the gazetteer",
  'at-state-center': "the coordinates sit on the center of the record's state or province in the gazetteer",
} as const;

export type CoordinateFlag = keyof typeof COORDINATE_FLAGS;

/** The corrected center of an administrative unit the record names (method §4). */
export interface AdministrativeCenter {
  level: 'country' | 'stateProvince';
  name: string;
  latitude: number;
  longitude: number;
}

/** The proposed georeference as written in the output: point and radius in meters. */
export interface Circle {
  latitude: number;
  longitude: number;
  radiusMeters: number;
}

/** How far the record's own coordinates lie from the proposed point (the API's `recordPoint`). */
export interface RecordPoint {
  latitude: number;
  longitude: number;
  distanceMeters: number;
  withinUncertainty: boolean;
}

/**
 * The record's point against a circle; geodesic on WGS84 (geographiclib, about 15 nm).
 * @example recordPoint(-45.5, -131, { latitude: -45.5, longitude: -131, radiusMeters: 10 }) // { …, distanceMeters: 0, withinUncertainty: true }
 */
export function recordPoint(latitude: number, longitude: number, circle: Circle): RecordPoint {
  const distanceMeters = inverse(circle.latitude, circle.longitude, latitude, longitude).meters;
  return { latitude, longitude, distanceMeters, withinUncertainty: distanceMeters <= circle.radiusMeters };
}

/**
 * The proposed circle as the Darwin Core fields write it (rounded point, radius rounded up), or
 * undefined when there is no point.
 * @example circleOf({ decimalLatitude: '-45.5', decimalLongitude: '-131.0', coordinateUncertaintyInMeters: '2000', … }) // { latitude: -45.5, longitude: -131, radiusMeters: 2000 }
 */
export function circleOf(fields: Record<GeoreferenceTerm, string>): Circle | undefined {
  if (fields.decimalLatitude === '' || fields.coordinateUncertaintyInMeters === '') return undefined;
  return { latitude: Number(fields.decimalLatitude), longitude: Number(fields.decimalLongitude), radiusMeters: Number(fields.coordinateUncertaintyInMeters) };
}

export interface CoordinateCheck {
  flags: CoordinateFlag[];
  /** The same findings in plain words, for georeferenceRemarks. */
  remarks: string[];
}

/**
 * How close to a unit's center counts as "on" it [CHOICE, common practice, no source]: 1 km, or the
 * half-step of the written coordinates' last decimal when coarser (a center rounded to 0.1° is still one).
 */
export const CENTER_TOLERANCE_METERS = 1000;

const DECIMAL = /^[+-]?(\d+([.,]\d*)?|[.,]\d+)$/;

/**
 * A decimal number as a record writes it, with a decimal point or a decimal comma (the spreadsheet
 * export of Spanish, Portuguese or French settings, usually semicolon-delimited); undefined for anything
 * else (no thousands separators, exponents or signs after the digits). The text itself is never changed.
 * @example decimalNumber('-45,3010') // -45.301
 */
export function decimalNumber(text: string): number | undefined {
  const trimmed = text.trim();
  return DECIMAL.test(trimmed) ? Number(trimmed.replace(',', '.')) : undefined;
}

/**
 * Whether a record gives any coordinate at all: a record giving none has nothing to check, so its
 * check finds no flag and no remark whatever its locality.
 * @example hasCoordinates(' ', '') // false
 */
export function hasCoordinates(latitudeText: string, longitudeText: string): boolean {
  return latitudeText.trim() !== '' || longitudeText.trim() !== '';
}

/**
 * Whether a row's flags count it as flagged: any flag but agreement with the locality.
 * @example isFlagged(['agrees-with-locality']) // false
 */
export function isFlagged(flags: readonly string[]): boolean {
  return flags.some((f) => f !== 'agrees-with-locality');
}

/**
 * Check a record's decimalLatitude/decimalLongitude as written. Nothing is flagged when both are empty;
 * a unit's center is looked for only when the coordinates are not inside the circle.
 * Distances are geodesic on WGS84 (geographiclib, about 15 nm).
 * @example
 *   checkCoordinates('45.5', '-131.0', { latitude: -45.5, longitude: -131, radiusMeters: 2000 }, []).flags
 *   // ['outside-locality-circle', 'fits-if-latitude-sign-flipped']
 */
export function checkCoordinates(latitudeText: string, longitudeText: string, circle: Circle | undefined, centers: AdministrativeCenter[]): CoordinateCheck {
  const latText = latitudeText.trim();
  const lonText = longitudeText.trim();
  const found: { flag: CoordinateFlag; remark: string }[] = [];
  const add = (flag: CoordinateFlag, remark: string) => found.push({ flag, remark });
  const done = () => ({ flags: found.map((f) => f.flag), remarks: found.map((f) => f.remark) });
  if (!hasCoordinates(latText, lonText)) return done();
  const written = `the record's coordinates (${latText || 'empty'}, ${lonText || 'empty'})`;
  if (latText === '' || lonText === '') {
    add('one-side-empty', `${written}: one coordinate is empty, which some programs read as zero; not compared`);
    return done();
  }
  const latitude = decimalNumber(latText);
  const longitude = decimalNumber(lonText);
  if (latitude === undefined || longitude === undefined) {
    add('not-a-decimal-number', `${written} are not decimal numbers; not compared`);
    return done();
  }
  const inRange = Math.abs(latitude) <= 90 && Math.abs(longitude) <= 180;
  if (!inRange) add('beyond-valid-range', `${written} are out of range (latitude beyond ±90 or longitude beyond ±180)`);
  if (latitude === 0 && longitude === 0) add('both-zero', `${written} are both zero, most likely an empty value written as zero`);
  const inside = circle ? compareWithCircle(latitude, longitude, inRange, circle, written, add) : false;
  // Coordinates the locality text bears out are not suspect for lying near a center as well.
  if (inRange && !inside) compareWithCenters(latitude, longitude, precisionOf(latText, lonText), centers, written, add);
  return done();
}

function compareWithCircle(
  latitude: number,
  longitude: number,
  inRange: boolean,
  circle: Circle,
  written: string,
  add: (flag: CoordinateFlag, remark: string) => void,
): boolean {
  const distance = (lat: number, lon: number) => recordPoint(lat, lon, circle).distanceMeters;
  const within = (lat: number, lon: number) => Math.abs(lat) <= 90 && Math.abs(lon) <= 180 && recordPoint(lat, lon, circle).withinUncertainty;
  const radius = `${formatMeters(circle.radiusMeters)} circle of the proposed georeference`;
  if (inRange && within(latitude, longitude)) {
    add('agrees-with-locality', `${written} lie inside the ${radius}`);
    return true;
  }
  const away = inRange ? `, ${formatMeters(distance(latitude, longitude))} from its center` : '';
  add('outside-locality-circle', `${written} lie outside the ${radius}${away}`);
  if (latitude === 0 && longitude !== 0 && !within(0, circle.longitude)) add('latitude-zero', `${written}: latitude is zero though the circle does not reach the equator (an empty value written as zero?)`);
  if (longitude === 0 && latitude !== 0 && !within(circle.latitude, 0)) add('longitude-zero', `${written}: longitude is zero though the circle does not reach the prime meridian (an empty value written as zero?)`);
  const variants: { flag: CoordinateFlag; lat: number; lon: number; how: string }[] = [
    { flag: 'fits-if-latitude-sign-flipped', lat: -latitude, lon: longitude, how: 'with the sign of latitude inverted' },
    { flag: 'fits-if-longitude-sign-flipped', lat: latitude, lon: -longitude, how: 'with the sign of longitude inverted' },
    { flag: 'fits-if-both-signs-flipped', lat: -latitude, lon: -longitude, how: 'with both signs inverted' },
    { flag: 'fits-if-latitude-longitude-exchanged', lat: longitude, lon: latitude, how: 'with latitude and longitude swapped' },
  ];
  for (const v of variants) {
    if ((v.lat !== latitude || v.lon !== longitude) && within(v.lat, v.lon)) add(v.flag, `${v.how} they would lie inside it`);
  }
  return false;
}

function compareWithCenters(
  latitude: number,
  longitude: number,
  precisionDegrees: number,
  centers: AdministrativeCenter[],
  written: string,
  add: (flag: CoordinateFlag, remark: string) => void,
): void {
  // Half a step of the last written decimal, on the diagonal, at about 111.32 km a degree (common practice, no source).
  const tolerance = Math.max(CENTER_TOLERANCE_METERS, (precisionDegrees / 2) * Math.SQRT2 * 111_320);
  for (const center of centers) {
    const meters = inverse(center.latitude, center.longitude, latitude, longitude).meters;
    if (meters > tolerance) continue;
    const flag: CoordinateFlag = center.level === 'country' ? 'at-country-center' : 'at-state-center';
    add(flag, `${written} sit ${formatMeters(meters)} from the center of the ${center.level === 'country' ? 'country' : 'state or province'} "${center.name}" in the gazetteer: perhaps a center given for want of a locality`);
  }
}

/** The coarser step of the two written numbers, in degrees ("-45.5" → 0.1). */
function precisionOf(...texts: string[]): number {
  return Math.max(...texts.map((t) => 10 ** -(t.split(/[.,]/)[1]?.length ?? 0)));
}

function formatMeters(meters: number): string {
  return meters >= 10_000 ? `${(meters / 1000).toFixed(0)} km` : `${Math.round(meters)} m`;
}
