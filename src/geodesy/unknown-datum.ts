/** A datum term bounded where the coordinates lie, for coordinates whose datum is not stated (docs/method.md §5.4). */
import { DATUMS, toWgs84, withinArea, type DatumDefinition } from './datums.ts';
import { inverse } from './geodesic.ts';
import { utmToGeographic, type UtmReference } from './utm.ts';

/** The datums compared at a point with no stated datum, and how far apart they put it. */
export interface RegionalDatumBound {
  /** The datum term: the largest distance between the positions the coordinates would have in any two of the datums, meters. */
  meters: number;
  /** Largest stated accuracy of the transformations used for them, meters: for the remarks, not added to the term. */
  accuracyMeters: number;
  /** The datums compared (EPSG codes, WGS 84 included). */
  datums: string[];
}

const isWorldWide = ([north, west, south, east]: DatumDefinition['areaOfUse']) => north === 90 && south === -90 && west === -180 && east === 180;

/**
 * A datum term for written coordinates whose datum is not stated, bounded where they lie (Chapman &
 * Wieczorek 2020, §Uncertainty from Unknown Datum): the coordinates are read in every datum of the table
 * whose EPSG area of use holds the point (WGS 84 and WGS 72 hold every point), each reading is shifted to
 * WGS84, and the term is the largest distance between two of the results, as the guidance defines it. The
 * transformations' stated accuracies are returned for the remarks and not added (the published figure is
 * the distance between the datums, and the global 5359 m it replaces is computed the same way).
 * A UTM reference is read on each datum's own ellipsoid before the shift. Undefined where only the
 * world-wide datums apply: the caller then uses the global figure. Areas of use are EPSG's bounding boxes,
 * and only datums of the table are compared [CHOICE: the table of datums in use by region] (docs/method.md
 * §5.4 says what that leaves out).
 * Accuracy: that of the shifts (toWgs84) and of geographiclib's inverse (nanometers).
 * @example regionalDatumBound({ latitude: 39.2, longitude: -98.5 }) // ≈ { meters: 44.9, accuracyMeters: 10, datums: ['EPSG:4326', 'EPSG:4267', 'EPSG:4269', 'EPSG:4322'] }
 */
export function regionalDatumBound(point: { latitude: number; longitude: number }, utm?: UtmReference): RegionalDatumBound | undefined {
  const candidates = DATUMS.filter((datum) => withinArea(point.latitude, point.longitude, datum.areaOfUse));
  if (!candidates.some((datum) => !isWorldWide(datum.areaOfUse))) return undefined;
  const positions = candidates.map((datum) => {
    const inDatum = utm ? utmToGeographic(utm, datum.epsg) : point;
    return toWgs84(inDatum.latitude, inDatum.longitude, datum.epsg);
  });
  let meters = 0;
  for (let i = 0; i < positions.length; i++) {
    for (let j = i + 1; j < positions.length; j++) {
      meters = Math.max(meters, inverse(positions[i]!.latitude, positions[i]!.longitude, positions[j]!.latitude, positions[j]!.longitude).meters);
    }
  }
  const accuracyMeters = Math.max(...candidates.map((datum) => datum.accuracyMeters));
  return { meters, accuracyMeters, datums: candidates.map((datum) => datum.epsg) };
}
