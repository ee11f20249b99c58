/**
 * A georeference generalised to a degree grid, for sensitive taxa: the point moved to the centre of the
 * grid cell holding it, the radius grown so that the circle still holds every place the original circle
 * held (the cell's farthest corner from its centre, plus the original radius), and the footprint replaced
 * by the cell. Generalising to the centre of a 0.1° or 0.01° grid cell is the published practice for
 * sensitive occurrences (Chapman 2020, Current Best Practices for Generalizing Sensitive Species Occurrence
 * Data, Copenhagen, doi:10.15468/doc-5jp4-5g10, on generalising to a grid; title and DOI checked,
 * the grid sizes from memory). Which taxa, and which grid,
 * are the holder's policy and local law, which whereabouts does not decide.
 *
 * Accuracy: the cell's corners are geodesic distances on WGS84 (src/geodesy, about 15 nm, Karney 2013);
 * the radius is rounded up to whole meters, so it never falls short. For cells of up to a few degrees the
 * farthest point of the cell from its centre is a corner (the cell's sides bulge less than a meter
 * per degree from the geodesics to the corners at these sizes) [CHOICE: common practice, no source].
 */
import { inverse } from '../geodesy/geodesic.ts';
import { polygonsToWKT } from '../geodesy/wkt.ts';

/** A point-radius georeference: decimal degrees on WGS84 and meters. */
export interface PointRadius {
  latitude: number;
  longitude: number;
  radiusMeters: number;
}

/** A georeference moved to the centre of a grid cell (of a degree grid here, or a grid in meters). */
export interface GridGeneralisation extends PointRadius {
  /** The cell in words, for the remarks and dataGeneralizations: "0.1° cell of the latitude-longitude grid". */
  cell: string;
  /** The cell as a WKT polygon (longitude latitude, EPSG:4326). */
  footprintWKT: string;
  /** The centre's coordinates as written (for a degree grid, one decimal more than the grid). */
  decimalLatitude: string;
  decimalLongitude: string;
  /** coordinatePrecision of the written centre, degrees. */
  coordinatePrecision: string;
  /** The cell's farthest corner from its written centre, meters (before the original radius is added). */
  halfDiagonalMeters: number;
}

/** The largest grid accepted: a coarser one would say nothing useful about where the record is. */
const MAX_GRID_DEGREES = 10;

/**
 * Move a point-radius georeference to the centre of its cell in a grid of `gridDegrees`, the grid's lines
 * at whole multiples of the size from 0° (latitude) and 0° (longitude).
 * @example generaliseToGrid({ latitude: -45.4321, longitude: -131.0789, radiusMeters: 2000 }, 0.1)
 *   // { decimalLatitude: '-45.45', decimalLongitude: '-131.05', radiusMeters: 8797, … } (half-diagonal 6796.5 m + 2000 m)
 */
export function generaliseToGrid(point: PointRadius, gridDegrees: number): GridGeneralisation {
  checkGridDegrees(gridDegrees);
  const decimals = decimalsOf(gridDegrees);
  const snap = (value: number) => Number(value.toFixed(decimals));
  const south = Math.max(-90, snap(Math.floor(point.latitude / gridDegrees + 1e-9) * gridDegrees));
  const north = Math.min(90, snap(south + gridDegrees));
  const west = snap(Math.floor(point.longitude / gridDegrees + 1e-9) * gridDegrees);
  const east = snap(west + gridDegrees);
  const latitude = (south + north) / 2;
  // A cell past 180° has its centre written within ±180° too.
  const middle = (west + east) / 2;
  const longitude = middle > 180 ? Number((middle - 360).toFixed(decimals + 1)) : middle;
  const halfDiagonalMeters = Math.max(...[south, north].flatMap((lat) => [west, east].map((lon) => inverse(latitude, longitude, lat, lon).meters)));
  const ring = [[west, south], [east, south], [east, north], [west, north], [west, south]];
  return {
    cell: `${gridDegrees}° cell of the latitude-longitude grid`,
    coordinatePrecision: String(gridDegrees),
    latitude,
    longitude,
    decimalLatitude: latitude.toFixed(decimals + 1),
    decimalLongitude: longitude.toFixed(decimals + 1),
    halfDiagonalMeters,
    radiusMeters: Math.ceil(halfDiagonalMeters + point.radiusMeters),
    // A cell past 180° (a size that does not divide 180) is cut there into two parts.
    footprintWKT: polygonsToWKT([[ring]]),
  };
}

/**
 * A grid size read from text ("0.1", "0.01"): a clear error for anything else.
 * @example parseGridDegrees('0.1') // 0.1
 */
export function parseGridDegrees(text: string): number {
  const value = Number(text.trim());
  checkGridDegrees(value, text);
  return value;
}

function checkGridDegrees(value: number, text = String(value)): void {
  if (!Number.isFinite(value) || value < 1e-6 || value > MAX_GRID_DEGREES || decimalsOf(value) > 6) {
    throw new Error(`a generalisation grid must be a number of degrees above 0 and at most ${MAX_GRID_DEGREES}, with at most 6 decimals (such as 0.1 or 0.01), not "${text}"`);
  }
}

function decimalsOf(value: number): number {
  const text = String(value);
  return text.includes('.') ? text.length - text.indexOf('.') - 1 : 0;
}
