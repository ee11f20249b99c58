import type { WrittenCoordinates } from '../parse/types.ts';

/** How a proposed point is written out: its decimals and the Darwin Core coordinatePrecision. */
export interface ReportedPrecision {
  /** Decimals of decimalLatitude and decimalLongitude. */
  decimals: number;
  /** coordinatePrecision in decimal degrees, as text. */
  coordinatePrecision: string;
  /** Why, for the remarks. */
  remark: string;
}

/**
 * Reporting decimals [CHOICE]: the fewest (at most 7) whose rounding moves the point by no more than
 * 1 % of the radius; the displacement is then added to the radius, so rounding never hides error.
 * @example reportingDecimals(10_000) // 3
 */
export function reportingDecimals(uncertaintyMeters: number): number {
  // The longest degree on WGS84 on either axis: latitude at the poles, 111 694 m (docs/method.md §5.3, Llat(90°)).
  const metersPerDegree = 111_694;
  for (let k = 0; k < 7; k++) {
    const worstShift = (10 ** -k / 2) * Math.SQRT2 * metersPerDegree;
    if (worstShift <= uncertaintyMeters / 100) return k;
  }
  return 7;
}

/**
 * Decimals and coordinatePrecision of a proposed point. A point made from written coordinates keeps
 * the precision they were written with (Chapman & Wieczorek 2020, §Uncertainty Related to Coordinate
 * Precision; docs/method.md §5.3 and §6: the precision of coordinates is how they are written): "-45.3010" is precise to 0.0001°,
 * trailing zero included, so it is reported with 4 decimals and coordinatePrecision 0.0001, never with
 * more decimals than were written (false precision). Degrees and minutes keep their step (1/60° →
 * "0.0167", as Darwin Core's own examples write it). Any other point: reportingDecimals.
 * @example reportedPrecision(14, { precisionDegrees: 0.0001, format: 'decimal' }).coordinatePrecision // '0.0001'
 */
export function reportedPrecision(uncertaintyMeters: number, written?: Pick<WrittenCoordinates, 'precisionDegrees' | 'format'>): ReportedPrecision {
  const fromRadius = reportingDecimals(uncertaintyMeters);
  if (!written || !(written.precisionDegrees > 0)) {
    return { decimals: fromRadius, coordinatePrecision: (10 ** -fromRadius).toFixed(fromRadius), remark: `reported to ${decimalsInWords(fromRadius)} (coordinatePrecision)` };
  }
  const p = written.precisionDegrees;
  const writtenDecimals = Math.round(-Math.log10(p));
  if (written.format === 'decimal' && Math.abs(10 ** -writtenDecimals - p) < p * 1e-9) {
    const decimals = Math.min(fromRadius, Math.max(0, writtenDecimals));
    // Rounding to fewer decimals than written (a coarse radius) makes the reported precision coarser.
    const precision = decimals < writtenDecimals ? (10 ** -decimals).toFixed(decimals) : (10 ** -writtenDecimals).toFixed(Math.max(0, writtenDecimals));
    return { decimals, coordinatePrecision: precision, remark: `reported to ${decimalsInWords(decimals)}; coordinatePrecision ${precision}°, the precision the coordinates were written with (${decimalsInWords(writtenDecimals)})` };
  }
  // Minutes, seconds, grid meters: the step as written, in degrees, to three significant figures.
  const precision = String(Number(p.toPrecision(3)));
  return { decimals: fromRadius, coordinatePrecision: precision, remark: `reported to ${decimalsInWords(fromRadius)}; coordinatePrecision ${precision}°, the step the coordinates were written with` };
}

function decimalsInWords(decimals: number): string {
  return `${decimals} decimal${decimals === 1 ? '' : 's'}`;
}
