/** UTM grid coordinates to latitude/longitude in the same datum (proj4's transverse Mercator). */
import { proj4 } from './proj4.ts';
import { datumDefinition } from './datums.ts';

/** Latitude bands C–M are south of the equator, N–X north (I and O are not used). */
const SOUTHERN_BANDS = 'CDEFGHJKLM';
const NORTHERN_BANDS = 'NPQRSTUVWX';

/**
 * Geographic coordinates, in the stated datum (not yet shifted to WGS84), of a UTM position.
 * `hemisphereOrBand` is 'N'/'S' or a latitude band letter (C–X); since 'S' is also a northern band,
 * a lone 'S' is read as the hemisphere, as it usually is on labels. Accuracy: proj4's extended
 * transverse Mercator (Poder/Engsager), better than a millimetre within the zone.
 * Throws a clear error for an impossible zone, band, easting or northing.
 * @example utmToGeographic(14, 'N', 500000, 4206000, 'EPSG:4267') // ≈ { latitude: 38.0035, longitude: -99 }
 */
export function utmToGeographic(
  zone: number,
  hemisphereOrBand: string,
  easting: number,
  northing: number,
  datumEpsg: string,
): { latitude: number; longitude: number } {
  if (!Number.isInteger(zone) || zone < 1 || zone > 60) throw new Error(`UTM zone must be a whole number 1–60, got ${zone}`);
  const letter = hemisphereOrBand.trim().toUpperCase();
  const south = letter === 'S' || SOUTHERN_BANDS.includes(letter);
  if (letter.length !== 1 || !(south || letter === 'N' || NORTHERN_BANDS.includes(letter))) {
    throw new Error(`UTM hemisphere or band must be N, S or a band letter C–X, got ${JSON.stringify(hemisphereOrBand)}`);
  }
  if (!(easting > 100000 && easting < 900000)) throw new Error(`UTM easting ${easting} m is outside 100 000–900 000 m`);
  if (!(northing >= 0 && northing <= 10000000)) throw new Error(`UTM northing ${northing} m is outside 0–10 000 000 m`);
  const { ellipsoid } = datumDefinition(datumEpsg);
  const grid = `+proj=utm +zone=${zone}${south ? ' +south' : ''} ${ellipsoid} +units=m +no_defs`;
  const [longitude, latitude] = proj4()(grid, `+proj=longlat ${ellipsoid} +no_defs`, [easting, northing]);
  return { latitude: latitude!, longitude: longitude! };
}
