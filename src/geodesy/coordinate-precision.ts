/** Uncertainty from how coordinates are written (docs/method.md §5.3, BP2020 §Uncertainty Related to Coordinate Precision). */

const A = 6378137; // WGS84 semi-major axis, m
const F = 1 / 298.257223563; // WGS84 flattening
const E2 = F * (2 - F); // first eccentricity squared
const RADIANS = Math.PI / 180;

/**
 * Lengths of one degree of latitude and of longitude at a latitude on WGS84 (docs/method.md §5.3):
 * `Llat = (π/180)·a(1−e²)/(1−e²sin²φ)^1.5` (meridian radius of curvature) and
 * `Llon = (π/180)·a·cos φ/sqrt(1−e²sin²φ)`. Exact for longitude; for latitude it is the local rate,
 * which differs from the arc of a whole degree by under 0.002 % (third-order term of the meridian arc).
 * @example degreeLengthsMeters(0) // ≈ { latitude: 110574.3, longitude: 111319.5 }
 */
export function degreeLengthsMeters(latitude: number): { latitude: number; longitude: number } {
  const sin = Math.sin(latitude * RADIANS);
  const w = 1 - E2 * sin * sin;
  return {
    latitude: (RADIANS * A * (1 - E2)) / w ** 1.5,
    longitude: (RADIANS * A * Math.cos(latitude * RADIANS)) / Math.sqrt(w),
  };
}

/**
 * Uncertainty in meters of coordinates written to a precision of `precisionDegrees` (e.g. 0.01 for two
 * decimals, 1/60 for whole minutes) at a latitude: the full step on each axis, combined,
 * `U = p·sqrt(Llat² + Llon²)` (docs/method.md §5.3). Accuracy: that of degreeLengthsMeters, i.e. better than
 * 0.002 %, well inside the published table's ±1 m rounding.
 * @example coordinatePrecisionMeters(10.27, 0.01) // ≈ 1556.8
 */
export function coordinatePrecisionMeters(latitude: number, precisionDegrees: number): number {
  if (!(precisionDegrees >= 0) || !Number.isFinite(precisionDegrees)) {
    throw new Error(`coordinate precision must be a non-negative number of degrees, got ${precisionDegrees}`);
  }
  if (!(Math.abs(latitude) <= 90)) throw new Error(`latitude must be within ±90°, got ${latitude}`);
  const lengths = degreeLengthsMeters(latitude);
  return precisionDegrees * Math.hypot(lengths.latitude, lengths.longitude);
}
