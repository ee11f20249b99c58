/**
 * Plausibility of a proposed point, checked after the method has made it: a point outside the record's
 * country, a circle wholly at sea, and clauses of one text that cannot both be right. Each finding is a
 * flag and a remark for the reviewer; none changes the point or refuses it (a point at sea is right for
 * a marine record; the reviewer decides).
 */
import { inverse } from '../geodesy/geodesic.ts';
import { distanceToOutlines, insideOutlines, type Outline } from './outlines.ts';

/** The flags, each with what it means (the README's flag table lists them). */
export const PLAUSIBILITY_FLAGS = {
  'outside-record-country': "the proposed point lies outside the record's country, farther than that outline's accuracy",
  'at-sea': 'no land lies within the uncertainty circle (widened by the land outline\'s accuracy)',
  'clauses-conflict': 'two clauses of the text give circles that do not touch',
} as const;

export type PlausibilityFlag = keyof typeof PLAUSIBILITY_FLAGS;

export interface PlausibilityFinding {
  flag: PlausibilityFlag;
  remark: string;
}

/** Outlines from one source, with how far their edges may be from the true ones. */
export interface NamedOutlines {
  /** The source in words, for the remarks, e.g. "gazetteer demo:qv-0001" or "Natural Earth 1:50m". */
  name: string;
  outlines: Outline[];
  toleranceMeters: number;
}

export interface ProposedCircle {
  latitude: number;
  longitude: number;
  radiusMeters: number;
}

/**
 * The territorial sea: up to 12 nautical miles (22 224 m) from the baseline (UN Convention on the Law of
 * the Sea, 1982, art. 3). A point at sea that close to the record's country is still in the country.
 */
export const TERRITORIAL_SEA_METERS = 12 * 1852;

/** How far the remarks look for a distance to the country's outline before saying "more than". */
const REPORTED_DISTANCE_LIMIT_METERS = 2_000_000;

/**
 * A point outside the record's country: flagged when it lies outside the outline, farther from it than
 * the outline's tolerance, and not in the country's territorial sea (within TERRITORIAL_SEA_METERS of
 * the outline where `onLand` says the point is not on land).
 * @example outsideRecordCountry({ latitude: 10, longitude: 10, radiusMeters: 157_000 }, 'QV', verdemar, onLand)?.flag // 'outside-record-country'
 */
export function outsideRecordCountry(
  circle: ProposedCircle,
  countryCode: string,
  country: NamedOutlines,
  onLand: (latitude: number, longitude: number) => boolean,
): PlausibilityFinding | undefined {
  const { latitude, longitude } = circle;
  if (insideOutlines(latitude, longitude, country.outlines)) return undefined;
  const near = distanceToOutlines(latitude, longitude, country.outlines, TERRITORIAL_SEA_METERS + country.toleranceMeters);
  if (near <= country.toleranceMeters) return undefined;
  if (Number.isFinite(near) && !onLand(latitude, longitude)) return undefined;
  const meters = distanceToOutlines(latitude, longitude, country.outlines, REPORTED_DISTANCE_LIMIT_METERS);
  const how = Number.isFinite(meters) ? `${kilometers(meters)} from its outline` : `more than ${kilometers(REPORTED_DISTANCE_LIMIT_METERS)} from its outline`;
  return {
    flag: 'outside-record-country',
    remark: `plausibility: the proposed point lies outside the record's country ${countryCode} (${country.name}), ${how}: check the country, the coordinates or the place chosen [outside-record-country]`,
  };
}

/**
 * A circle wholly at sea: no gazetteer place used lies inside the circle (the place the text names is
 * where the gazetteer puts it, an islet too small for a world map included), and no land source has
 * land inside the circle widened by its tolerance. Sources are given as functions and read in order,
 * so a later (costlier) one is read only when the earlier ones found no land.
 * @example atSea({ latitude: 0, longitude: -30, radiusMeters: 1000 }, [], [() => naturalEarthLandOutlines])?.flag // 'at-sea'
 */
export function atSea(circle: ProposedCircle, places: { latitude: number; longitude: number }[], land: (() => NamedOutlines | undefined)[]): PlausibilityFinding | undefined {
  const { latitude, longitude, radiusMeters } = circle;
  if (places.some((p) => inverse(latitude, longitude, p.latitude, p.longitude).meters <= radiusMeters)) return undefined;
  const read: NamedOutlines[] = [];
  for (const source of land) {
    const outlines = source();
    if (!outlines) continue;
    read.push(outlines);
    if (insideOutlines(latitude, longitude, outlines.outlines)) return undefined;
    const reach = radiusMeters + outlines.toleranceMeters;
    if (Number.isFinite(distanceToOutlines(latitude, longitude, outlines.outlines, reach))) return undefined;
  }
  const widest = Math.max(0, ...read.map((r) => r.toleranceMeters));
  return {
    flag: 'at-sea',
    remark: `plausibility: the whole uncertainty circle lies at sea: no land within ${kilometers(radiusMeters + widest)} of the point (radius ${Math.ceil(radiusMeters)} m + ${kilometers(widest)} for the land outline's accuracy [CHOICE]; land from ${read.map((r) => r.name).join(' and ')}): right for a marine record, otherwise check the offset, its heading and the place [at-sea]`,
  };
}

/**
 * Two clauses of one text that cannot both be right: their circles do not touch (the distance between
 * their points is more than the two radii together).
 * @example clausesConflict({ text: '5 km N of A', ... }, { text: '3 km S of B', ... })?.flag // 'clauses-conflict'
 */
export function clausesConflict(used: ProposedCircle & { text: string }, other: ProposedCircle & { text: string }): PlausibilityFinding | undefined {
  const apart = inverse(used.latitude, used.longitude, other.latitude, other.longitude).meters;
  if (apart <= used.radiusMeters + other.radiusMeters) return undefined;
  return {
    flag: 'clauses-conflict',
    remark: `plausibility: the clauses "${used.text}" and "${other.text}" conflict: their points are ${kilometers(apart)} apart, more than their radii together (${Math.ceil(used.radiusMeters)} m + ${Math.ceil(other.radiusMeters)} m); the point follows "${used.text}": verify which clause is right [clauses-conflict]`,
  };
}

function kilometers(meters: number): string {
  return meters >= 10_000 ? `${Math.round(meters / 1000).toLocaleString('en')} km` : `${(meters / 1000).toFixed(1)} km`;
}
