/** Spatial fit of a georeference's shape to the original shape (method §6, BP2020 §Determining Spatial Fit). */

/**
 * area(given) / area(original) when the given shape contains the original; 0 when it does not; 1 for an
 * exact match; undefined when the original is a point (area 0 or unknown). Exact (a ratio of the areas
 * given).
 * @example spatialFit(5.7256e6, 4.1e6, true) // ≈ 1.3965 (BP2020 prints 1.39)
 */
export function spatialFit(givenAreaSquareMeters: number, originalAreaSquareMeters: number | undefined, givenContainsOriginal: boolean): number | undefined {
  if (originalAreaSquareMeters === undefined || originalAreaSquareMeters <= 0) return undefined;
  if (!givenContainsOriginal) return 0;
  return givenAreaSquareMeters / originalAreaSquareMeters;
}
