/**
 * The largest and smallest of many numbers. `Math.max(...values)` passes every value as an argument
 * and overflows the call stack past about 100 000 of them, which a detailed boundary easily has.
 * @example largest([3, 7, 5]) // 7
 */
export function largest(values: Iterable<number>): number {
  let result = -Infinity;
  for (const v of values) if (v > result) result = v;
  return result;
}

/** @example smallest([3, 7, 5]) // 3 */
export function smallest(values: Iterable<number>): number {
  let result = Infinity;
  for (const v of values) if (v < result) result = v;
  return result;
}
