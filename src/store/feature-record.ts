/**
 * Checks one imported row and turns it into what the store keeps: coordinates checked, the corrected
 * center and radial of lines and polygons computed (method §4), default radii applied. Pure.
 */
import type { Geometry, Position } from 'geojson';
import { featureExtent } from '../georef/feature-extent.ts';
import { defaultRadius } from '../georef/default-radii.ts';
import type { FeatureRecord } from './gazetteer-store.ts';
import type { AlternateName, GeometryType } from '../match/types.ts';

/** A row as read from any layout, before checking. */
export interface RawFeature {
  id?: string;
  name?: unknown;
  alternateNames?: string[];
  /** Language and flags of some alternate names (the dump layout's alternate-names file). */
  nameDetails?: AlternateName[];
  /** Codes of a state or county ("US-WA", "WA"; `--unit-code-field`): unit names only, never the feature's names. */
  unitCodes?: string[];
  latitude?: unknown;
  longitude?: unknown;
  featureType?: unknown;
  countryCode?: unknown;
  stateProvince?: unknown;
  county?: unknown;
  radiusMeters?: unknown;
  /** GeoJSON geometry; when present it gives the coordinates and, for lines and polygons, the extent. */
  geometry?: Geometry | null;
}

const GEOMETRY_TYPES = new Set<string>(['Point', 'LineString', 'MultiLineString', 'Polygon', 'MultiPolygon']);

/**
 * The checked feature, or the reason the row is refused (in plain words).
 * @example checkFeature({ name: 'Alto', latitude: '95', longitude: '10' }, 'row-2')
 * // "latitude 95 is outside −90…90"
 */
export function checkFeature(raw: RawFeature, fallbackId: string, radii?: Readonly<Record<string, number>>): FeatureRecord | string {
  const name = text(raw.name);
  if (name === null) return 'name missing';
  if (name.includes('\uFFFD')) return 'not valid UTF-8 (name)';
  const countryCode = text(raw.countryCode);
  if (countryCode !== null && !/^[A-Za-z]{2}$/.test(countryCode)) return `countryCode '${countryCode}' is not an ISO 3166-1 alpha-2 code`;
  const featureType = text(raw.featureType);
  const base = {
    featureId: text(raw.id) ?? fallbackId,
    name,
    alternateNames: (raw.alternateNames ?? []).map((n) => n.trim()).filter((n) => n !== '' && n !== name),
    featureType,
    countryCode: countryCode === null ? null : countryCode.toUpperCase(),
    stateProvince: text(raw.stateProvince),
    county: text(raw.county),
    ...(raw.nameDetails !== undefined && { nameDetails: raw.nameDetails }),
  };
  const geometry = raw.geometry ?? null;
  if (geometry !== null && geometry.type !== 'Point') {
    if (!GEOMETRY_TYPES.has(geometry.type)) return `geometry type ${geometry.type} is not supported`;
    const problem = coordinateProblem(geometry);
    if (problem !== null) return problem;
    const extent = featureExtent(geometry);
    return {
      ...base, latitude: extent.latitude, longitude: extent.longitude, radiusMeters: extent.radiusMeters,
      radiusIsDefault: false, geometryType: geometry.type as GeometryType, geometry: JSON.stringify(geometry),
    };
  }
  const latitude = number(geometry !== null ? geometry.coordinates?.[1] : raw.latitude, 'decimal comma');
  const longitude = number(geometry !== null ? geometry.coordinates?.[0] : raw.longitude, 'decimal comma');
  if (latitude === undefined || longitude === undefined) return 'coordinates missing';
  if (Number.isNaN(latitude)) return `latitude '${String(raw.latitude)}' is not a number`;
  if (Number.isNaN(longitude)) return `longitude '${String(raw.longitude)}' is not a number`;
  const range = rangeProblem(latitude, longitude);
  if (range !== null) return range;
  const radius = number(raw.radiusMeters);
  if (radius !== undefined && !(radius >= 0)) return `radiusMeters '${String(raw.radiusMeters)}' is not a distance in meters`;
  // Written out rather than spread from `base`: this runs for every row of a million-row import.
  return {
    featureId: base.featureId, name, alternateNames: base.alternateNames, featureType, countryCode: base.countryCode,
    stateProvince: base.stateProvince, county: base.county, nameDetails: raw.nameDetails, latitude, longitude,
    radiusMeters: radius ?? defaultRadius(featureType, radii).meters,
    radiusIsDefault: radius === undefined,
    geometryType: 'Point',
    geometry: null,
  };
}

function text(value: unknown): string | null {
  if (value === undefined || value === null) return null;
  const trimmed = String(value).trim();
  return trimmed === '' ? null : trimmed;
}

/**
 * undefined when absent, NaN when not a plain decimal number. A coordinate may be written with a decimal
 * comma (`-8,07556`, as a spreadsheet of Spanish, Portuguese or French settings saves it): no coordinate
 * has a thousands separator, so the comma can only be the decimal one. A radius may not (`1,500` could be
 * 1.5 m or 1500 m), so it stays refused.
 * @example number('-8,07556', 'decimal comma') // -8.07556
 */
function number(value: unknown, comma?: 'decimal comma'): number | undefined {
  if (typeof value === 'number') return Number.isFinite(value) ? value : Number.NaN;
  const written = text(value);
  if (written === null) return undefined;
  const decimal = comma !== undefined && /^[-+]?\d+,\d+$/.test(written) ? written.replace(',', '.') : written;
  return /^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/.test(decimal) ? Number(decimal) : Number.NaN;
}

function rangeProblem(latitude: number, longitude: number): string | null {
  if (latitude < -90 || latitude > 90) return `latitude ${latitude} is outside −90…90`;
  if (longitude < -180 || longitude > 180) return `longitude ${longitude} is outside −180…180`;
  return null;
}

function coordinateProblem(geometry: Geometry): string | null {
  const positions: Position[] = [];
  const collect = (value: unknown): void => {
    if (Array.isArray(value) && typeof value[0] === 'number') positions.push(value as Position);
    else if (Array.isArray(value)) value.forEach(collect);
  };
  collect((geometry as { coordinates?: unknown }).coordinates);
  if (positions.length === 0) return `${geometry.type} has no coordinates`;
  for (const [longitude, latitude] of positions) {
    if (!Number.isFinite(latitude) || !Number.isFinite(longitude)) return `${geometry.type} has a coordinate that is not a number`;
    const range = rangeProblem(latitude, longitude);
    if (range !== null) return `${geometry.type}: ${range}`;
  }
  return null;
}
