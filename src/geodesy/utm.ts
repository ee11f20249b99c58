/**
 * UTM and other transverse Mercator grids to latitude/longitude on the grid's own ellipsoid (no datum shift).
 * proj4's transverse Mercator follows the JHS/Poder–Engsager series that EPSG Guidance Note 7-2 (IOGP
 * Publication 373-7-2, §3.5.3.1, method EPSG:9807) gives; test/geodesy/utm.test.ts checks it against the
 * guidance note's worked example (within 1 cm, its printed precision).
 */
import { proj4 } from './proj4.ts';
import { datumDefinition } from './datums.ts';

/** A UTM reference as written on a label: zone, hemisphere, easting and northing in meters. */
export interface UtmReference {
  zone: number;
  hemisphere: 'N' | 'S';
  easting: number;
  northing: number;
}

/** Parameters of a transverse Mercator grid (EPSG method 9807). */
export interface TransverseMercatorGrid {
  latitudeOfOrigin: number;
  centralMeridian: number;
  scaleFactor: number;
  falseEasting: number;
  falseNorthing: number;
  /** proj4 ellipsoid parameters, e.g. "+ellps=airy". */
  ellipsoid: string;
}

/**
 * Latitude/longitude on the grid's ellipsoid of a transverse Mercator easting and northing.
 * Accuracy: proj4's series, better than a millimetre within a few degrees of the central meridian.
 * @example transverseMercatorToGeographic({ latitudeOfOrigin: 49, centralMeridian: -2, scaleFactor: 0.9996012717, falseEasting: 400000, falseNorthing: -100000, ellipsoid: '+ellps=airy' }, 577274.99, 69740.5) // ≈ { latitude: 50.5, longitude: 0.5 }
 */
export function transverseMercatorToGeographic(grid: TransverseMercatorGrid, easting: number, northing: number): { latitude: number; longitude: number } {
  const definition =
    `+proj=tmerc +lat_0=${grid.latitudeOfOrigin} +lon_0=${grid.centralMeridian} +k_0=${grid.scaleFactor} ` +
    `+x_0=${grid.falseEasting} +y_0=${grid.falseNorthing} ${grid.ellipsoid} +units=m +no_defs`;
  const [longitude, latitude] = proj4()(definition, `+proj=longlat ${grid.ellipsoid} +no_defs`, [easting, northing]);
  return { latitude: latitude!, longitude: longitude! };
}

/**
 * Geographic coordinates, in the stated datum (its ellipsoid, not yet shifted to WGS84), of a UTM reference:
 * zone z has its central meridian at 6z − 183°, scale 0.9996, false easting 500 000 m and, in the southern
 * hemisphere, false northing 10 000 000 m (NIMA TM 8358.2, §2). Throws a clear error for a reference no UTM
 * grid can hold (zone outside 1–60, easting outside 0–1 000 000 m, northing outside 0–10 000 000 m).
 * @example utmToGeographic({ zone: 14, hemisphere: 'N', easting: 500000, northing: 4206000 }, 'EPSG:4267') // ≈ { latitude: 38.0035, longitude: -99 }
 */
export function utmToGeographic(utm: UtmReference, datumEpsg: string): { latitude: number; longitude: number } {
  const { zone, hemisphere, easting, northing } = utm;
  if (!Number.isInteger(zone) || zone < 1 || zone > 60) throw new Error(`UTM zone must be a whole number 1–60, got ${zone}`);
  if (hemisphere !== 'N' && hemisphere !== 'S') throw new Error(`UTM hemisphere must be N or S, got ${JSON.stringify(hemisphere)}`);
  if (!(easting > 0 && easting < 1000000)) throw new Error(`UTM easting ${easting} m is outside 0–1 000 000 m`);
  if (!(northing >= 0 && northing <= 10000000)) throw new Error(`UTM northing ${northing} m is outside 0–10 000 000 m`);
  return transverseMercatorToGeographic(
    {
      latitudeOfOrigin: 0,
      centralMeridian: 6 * zone - 183,
      scaleFactor: 0.9996,
      falseEasting: 500000,
      falseNorthing: hemisphere === 'S' ? 10000000 : 0,
      ellipsoid: datumDefinition(datumEpsg).ellipsoid,
    },
    easting,
    northing,
  );
}
