/**
 * Seeded pseudo-random numbers (for bootstrap resampling, and for tests and
 * benchmarks that must see the same numbers on every run).
 */

/** Uniform generator on [0, 1) from a 32-bit seed: mulberry32 (common practice, no source). */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
