/**
 * Seeded pseudo-random numbers for tests: mulberry32 uniform generator and
 * Box–Muller normal deviates (common practice, no source).
 */

import { mulberry32 } from '../../../src/core/numeric/random';
export { mulberry32 };

/** Standard normal deviates by Box–Muller from a uniform generator. */
export function normalGenerator(uniform: () => number): () => number {
  let spare: number | null = null;
  return () => {
    if (spare !== null) {
      const s = spare;
      spare = null;
      return s;
    }
    let u = 0;
    while (u === 0) {
      u = uniform();
    }
    const v = uniform();
    const r = Math.sqrt(-2 * Math.log(u));
    spare = r * Math.sin(2 * Math.PI * v);
    return r * Math.cos(2 * Math.PI * v);
  };
}
