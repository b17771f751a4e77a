/**
 * Array exponential, logarithm and |x|^a against the platform's Math.exp /
 * Math.log / Math.pow (V8's ports of the fdlibm algorithms, < 1 ulp) and
 * against published constants.
 */
import { describe, expect, it } from 'vitest';
import { expArray, fastExp, fastLog, logArray, powAbsArray } from '../../../src/core/numeric/arraymath/index';
import { mulberry32 } from '../../../src/core/numeric/random';

const EPS = Number.EPSILON;

/** Largest error in units of the reference value's relative ε. */
function maxUlps(got: Float64Array, want: ArrayLike<number>): number {
  let worst = 0;
  for (let i = 0; i < got.length; i++) {
    const w = want[i];
    const err = w === 0 ? Math.abs(got[i]) / Number.MIN_VALUE : Math.abs(got[i] - w) / (Math.abs(w) * EPS);
    worst = Math.max(worst, err);
  }
  return worst;
}

describe('expArray', () => {
  it('agrees with Math.exp within 2 ulp over [−708, 708], random and near 0', () => {
    const rnd = mulberry32(11);
    const x = Float64Array.from({ length: 200000 }, (_, i) => (i % 4 === 0 ? (rnd() - 0.5) * 1e-3 : (rnd() - 0.5) * 1416));
    const out = new Float64Array(x.length);
    expArray(x, out);
    expect(maxUlps(out, Array.from(x, Math.exp))).toBeLessThan(2);
  });

  it('matches published constants: e = 2.718281828459045… (OEIS A001113), e^−1 (A068985)', () => {
    expect(Math.abs(fastExp(1) - 2.718281828459045) / 2.718281828459045).toBeLessThan(2 * EPS);
    expect(Math.abs(fastExp(-1) - 0.36787944117144233) / 0.36787944117144233).toBeLessThan(2 * EPS);
    expect(fastExp(0)).toBe(1);
  });

  it('special and extreme arguments behave like Math.exp, in place too', () => {
    const x = Float64Array.from([NaN, Infinity, -Infinity, 709.7, 710, -745, -746, 708, -708, 1e-300, -0]);
    const want = Array.from(x, Math.exp);
    expArray(x, x);
    x.forEach((v, i) => {
      if (Number.isNaN(want[i])) {
        expect(v).toBeNaN();
      } else if (!Number.isFinite(want[i]) || want[i] === 0) {
        expect(v).toBe(want[i]);
      } else {
        expect(Math.abs(v - want[i])).toBeLessThanOrEqual(2 * EPS * Math.abs(want[i]));
      }
    });
  });

  it('handles n shorter than the array and empty input', () => {
    const x = Float64Array.from([1, 2, 3]);
    const out = new Float64Array(3).fill(-1);
    expArray(x, out, 2);
    expect(out[2]).toBe(-1);
    expArray(new Float64Array(0), new Float64Array(0));
  });
});

describe('logArray', () => {
  it('agrees with Math.log within 2 ulp over the whole normal range and next to 1', () => {
    const rnd = mulberry32(12);
    const x = Float64Array.from({ length: 200000 }, (_, i) =>
      i % 3 === 0 ? 1 + (rnd() - 0.5) * 0.02 : i % 3 === 1 ? Math.exp((rnd() - 0.5) * 1400) : rnd()
    );
    const out = new Float64Array(x.length);
    logArray(x, out);
    expect(maxUlps(out, Array.from(x, Math.log))).toBeLessThan(2);
  });

  it('is exact at powers of two and 1, and matches ln 2 (OEIS A002162) and ln 10 (A002392)', () => {
    expect(fastLog(1)).toBe(0);
    expect(Math.abs(fastLog(2) - 0.6931471805599453)).toBeLessThanOrEqual(EPS * 0.7);
    expect(Math.abs(fastLog(10) - 2.302585092994046)).toBeLessThanOrEqual(2 * EPS * 2.3);
    for (const e of [-1000, -20, -1, 1, 20, 1000]) {
      expect(Math.abs(fastLog(2 ** e) - e * Math.LN2)).toBeLessThanOrEqual(2 * EPS * Math.abs(e * Math.LN2));
    }
  });

  it('special arguments (0, negative, subnormal, NaN, ∞) behave like Math.log', () => {
    const x = Float64Array.from([0, -0, -1, 5e-324, 1e-310, NaN, Infinity, -Infinity, Number.MAX_VALUE, 2.2250738585072014e-308]);
    const want = Array.from(x, Math.log);
    const out = new Float64Array(x.length);
    logArray(x, out);
    out.forEach((v, i) => {
      if (Number.isNaN(want[i])) {
        expect(v).toBeNaN();
      } else if (!Number.isFinite(want[i])) {
        expect(v).toBe(want[i]);
      } else {
        expect(Math.abs(v - want[i])).toBeLessThanOrEqual(2 * EPS * Math.abs(want[i]));
      }
    });
  });

  it('works on a view into a larger buffer and in place', () => {
    const big = Float64Array.from([7, 0.5, 3, 1e-5, 42]);
    const view = big.subarray(1, 4);
    logArray(view, view);
    expect(big[0]).toBe(7);
    expect(big[4]).toBe(42);
    expect(Math.abs(big[1] - Math.log(0.5))).toBeLessThan(1e-16);
    expect(Math.abs(big[3] - Math.log(1e-5)) / Math.abs(Math.log(1e-5))).toBeLessThan(2 * EPS);
  });
});

describe('powAbsArray', () => {
  it('|x|^a within the documented (2 + 2|a log|x||) ulp of Math.pow, with log|x| on request', () => {
    const rnd = mulberry32(13);
    const x = Float64Array.from({ length: 50000 }, () => (rnd() - 0.5) * Math.exp((rnd() - 0.5) * 30));
    for (const a of [0.125, 0.3265, 0.5, 2, 4.789, -1.2]) {
      const out = new Float64Array(x.length);
      const lg = new Float64Array(x.length);
      powAbsArray(x, a, out, x.length, lg);
      let worstPow = 0;
      let worstLog = 0;
      for (let i = 0; i < x.length; i++) {
        const want = Math.pow(Math.abs(x[i]), a);
        const bound = (2 + 2 * Math.abs(a * Math.log(Math.abs(x[i])))) * EPS * want;
        worstPow = Math.max(worstPow, Math.abs(out[i] - want) / bound);
        const l = Math.log(Math.abs(x[i]));
        worstLog = Math.max(worstLog, Math.abs(lg[i] - l) / (2 * EPS * Math.abs(l)));
      }
      expect(worstPow).toBeLessThanOrEqual(1);
      expect(worstLog).toBeLessThanOrEqual(1);
    }
  });

  it('0^a is 0 for a > 0, 1 for a = 0, ∞ for a < 0', () => {
    const out = new Float64Array(3);
    powAbsArray(Float64Array.from([0, -0, 0]), 0.5, out);
    expect(Array.from(out)).toEqual([0, 0, 0]);
    powAbsArray(Float64Array.from([0, 3, -2]), 0, out);
    expect(Array.from(out)).toEqual([1, 1, 1]);
    powAbsArray(Float64Array.from([0]), -1, out, 1);
    expect(out[0]).toBe(Infinity);
  });
});
