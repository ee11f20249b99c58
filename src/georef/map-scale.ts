/** Uncertainty of coordinates read from a paper map (docs/method.md §5.5, BP2020 §Uncertainty in Paper Map Measurements). */
import type { MethodOptions } from './types.ts';

/** Map accuracy standards we know: US NMAS (1947), the Australian 0.5 mm rule, or none known. */
export type MapAccuracyStandard = NonNullable<MethodOptions['mapStandard']>;

const INCH_METERS = 0.0254;
/** 1 mm on the map for the reading itself (docs/method.md §5.5). */
const READING_MAP_METERS = 0.001;

/**
 * Horizontal accuracy a map standard allows at a scale, meters on the ground (docs/method.md §5.5):
 * US NMAS 1947 — 1/50 inch on the map for 1:20 000 and smaller scales (1:24 000 → 40 ft = 12.19 m),
 * 1/30 inch for larger scales; Australian — 0.5 mm on the map (1:25 000 → 12.5 m); unknown — 0. Exact.
 * @example mapAccuracyMeters(24000, 'us-nmas') // 12.192
 */
export function mapAccuracyMeters(scaleDenominator: number, standard: MapAccuracyStandard): number {
  checkScale(scaleDenominator);
  switch (standard) {
    case 'us-nmas':
      return (scaleDenominator >= 20000 ? INCH_METERS / 50 : INCH_METERS / 30) * scaleDenominator;
    case 'australian':
      return 0.0005 * scaleDenominator;
    case 'unknown':
      return 0;
  }
}

/**
 * The map-reading term: the standard's accuracy plus 1 mm on the map for the reading itself; with no
 * known standard, 1 mm on the map only (docs/method.md §5.5). Exact.
 * @example mapScaleErrorMeters(24000, 'us-nmas') // 36.192 (12.192 + 24)
 */
export function mapScaleErrorMeters(scaleDenominator: number, standard: MapAccuracyStandard = 'unknown'): number {
  return mapAccuracyMeters(scaleDenominator, standard) + READING_MAP_METERS * scaleDenominator;
}

function checkScale(scaleDenominator: number): void {
  if (!(scaleDenominator >= 1) || !Number.isFinite(scaleDenominator)) {
    throw new Error(`map scale must be given as its denominator (24000 for 1:24 000), got ${scaleDenominator}`);
  }
}
