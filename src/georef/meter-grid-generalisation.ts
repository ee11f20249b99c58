/**
 * A georeference generalised to a grid in meters, for sensitive taxa: the grid is the UTM grid of the zone
 * that holds the point (WGS 84, EPSG:326zz north of the equator and EPSG:327zz south of it; zone
 * ⌊(longitude + 180°) / 6°⌋ + 1, the standard 6° zones without the Norway and Svalbard exceptions, used at
 * every latitude), its cells squares of the stated side whose lines are whole multiples of the side in
 * easting and northing (NIMA TM 8358.2, §2, for the grid). A cell is thus a square on the grid and very
 * nearly one on the ground: UTM's scale factor stays between 0.9996 and 1.001 within a zone. The point goes
 * to the cell's centre, written to a hundredth of the side or finer; the radius is the geodesic distance
 * from that written centre to the cell's farthest corner plus the original radius, rounded up, so the circle
 * holds the whole cell and every place the original circle held; the footprint is the cell, its sides
 * followed by 8 segments each, cut at ±180° where it crosses it [CHOICE: the local grid, common practice, no source].
 *
 * Accuracy: the grid through proj4's transverse Mercator (better than a millimetre within a zone; checked
 * against EPSG Guidance Note 7-2 in test/geodesy/utm.test.ts) and geographiclib's geodesics (about 15 nm).
 * For cells up to 100 km the farthest point of a cell from its centre is a corner: on the grid the distance
 * from the centre grows along each side towards its ends, and the scale factor changes by less than 0.01 %
 * across such a cell.
 */
import { inverse } from '../geodesy/geodesic.ts';
import { proj4 } from '../geodesy/proj4.ts';
import { polygonsToWKT } from '../geodesy/wkt.ts';
import type { GridGeneralisation, PointRadius } from './grid-generalisation.ts';

/** The sides accepted, meters: finer says nothing a grid should hide, coarser says nothing useful. */
export const METER_GRID_LIMITS = { smallest: 10, largest: 100_000 } as const;

const WGS84 = '+proj=longlat +datum=WGS84 +no_defs';
/** Segments a side of the cell is drawn with in the footprint. */
const SIDE_SEGMENTS = 8;
/** Meters in a degree of latitude, rounded down: used only to choose how many decimals the centre gets. */
const METERS_A_DEGREE = 110_574;

/**
 * Move a point-radius georeference to the centre of its cell in the UTM grid of its zone, cells `sideMeters`
 * square.
 * @example generaliseToMeterGrid({ latitude: -45.4321, longitude: -131.0789, radiusMeters: 2000 }, 10000)
 *   // { cell: '10000 m cell of the UTM zone 9S grid (WGS 84)', decimalLatitude: '-45.4490', decimalLongitude: '-131.1101', radiusMeters: 9077, … }
 */
export function generaliseToMeterGrid(point: PointRadius, sideMeters: number): GridGeneralisation {
  checkSide(sideMeters);
  const zone = Math.min(60, Math.floor((point.longitude + 180) / 6) + 1);
  const south = point.latitude < 0;
  const grid = `+proj=utm +zone=${zone}${south ? ' +south' : ''} +datum=WGS84 +units=m +no_defs`;
  const [easting, northing] = proj4()(WGS84, grid, [point.longitude, point.latitude]) as [number, number];
  const west = Math.floor(easting / sideMeters) * sideMeters;
  const bottom = Math.floor(northing / sideMeters) * sideMeters;
  const toGeographic = (e: number, n: number) => proj4()(grid, WGS84, [e, n]) as [number, number];
  const decimals = Math.min(7, Math.max(0, Math.ceil(Math.log10((100 * METERS_A_DEGREE) / sideMeters))));
  const [centreLongitude, centreLatitude] = toGeographic(west + sideMeters / 2, bottom + sideMeters / 2);
  const decimalLatitude = centreLatitude.toFixed(decimals);
  const decimalLongitude = centreLongitude.toFixed(decimals);
  const latitude = Number(decimalLatitude);
  const longitude = Number(decimalLongitude);
  // The ring counter-clockwise on the grid from the south-west corner; each side in SIDE_SEGMENTS steps.
  const corners: [number, number][] = [[west, bottom], [west + sideMeters, bottom], [west + sideMeters, bottom + sideMeters], [west, bottom + sideMeters]];
  const ring = corners.flatMap(([e, n], i) => {
    const [nextE, nextN] = corners[(i + 1) % 4]!;
    return Array.from({ length: SIDE_SEGMENTS }, (_, k) => toGeographic(e + ((nextE - e) * k) / SIDE_SEGMENTS, n + ((nextN - n) * k) / SIDE_SEGMENTS));
  });
  const halfDiagonalMeters = Math.max(...corners.map(([e, n]) => toGeographic(e, n)).map(([lon, lat]) => inverse(latitude, longitude, lat, lon).meters));
  // Longitudes next to the centre's, so that a cell across ±180° is cut there into two parts.
  const unwrapped = [...ring, ring[0]!].map(([lon, lat]) => [lon + 360 * Math.round((longitude - lon) / 360), lat]);
  return {
    latitude,
    longitude,
    decimalLatitude,
    decimalLongitude,
    coordinatePrecision: (10 ** -decimals).toFixed(decimals),
    cell: `${sideMeters} m cell of the UTM zone ${zone}${south ? 'S' : 'N'} grid (WGS 84)`,
    halfDiagonalMeters,
    radiusMeters: Math.ceil(halfDiagonalMeters + point.radiusMeters),
    footprintWKT: polygonsToWKT([[unwrapped]]),
  };
}

function checkSide(value: number): void {
  if (!Number.isFinite(value) || value < METER_GRID_LIMITS.smallest || value > METER_GRID_LIMITS.largest) {
    throw new Error(`a generalisation grid in meters must be a side of ${METER_GRID_LIMITS.smallest} to ${METER_GRID_LIMITS.largest} m, not ${JSON.stringify(String(value))}`);
  }
}
