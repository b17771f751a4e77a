/** Seeded normal deviates for tests (Box–Muller on the shared mulberry32 generator). */
import { mulberry32 } from '../../../src/core/numeric/random';
export { mulberry32 };

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
