/** Seeded PRNG for tests: mulberry32 uniform + Box–Muller normal deviates. */
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

/** Standard normal generator from a seed. */
export function normal(seed: number): () => number {
  const u = mulberry32(seed);
  return () => {
    const u1 = Math.max(u(), 1e-300);
    const u2 = u();
    return Math.sqrt(-2 * Math.log(u1)) * Math.cos(2 * Math.PI * u2);
  };
}

/** Relative difference |a − b|/|b|. */
export function rel(a: number, b: number): number {
  return Math.abs(a - b) / Math.abs(b);
}
