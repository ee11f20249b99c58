/**
 * mulberry32, a small 32-bit generator (T. Ettinger, public domain; constants from memory, checked by
 * the demo data test, which regenerates the committed files byte for byte). Seeded, so generated data
 * is the same on every run; never for anything that needs real randomness.
 * @example const random = seededRandom(42); random() // a number in [0, 1), the same on every run
 */
export function seededRandom(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
