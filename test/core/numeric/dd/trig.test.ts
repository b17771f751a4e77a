/**
 * sin, cos, tan, atan, atan2 in double-double: π from 4·atan(1), exact
 * special values, identities and inverse round trips at ~1e-30.
 */
import { describe, expect, it } from 'vitest';
import * as DD from '../../../../src/core/numeric/dd/index';
import { mulberry32 } from '../../../../src/core/numeric/random';
import { absoluteError, fromDD, fromDecimal, relativeError } from './exact';

/** π to 50 decimals: OEIS A000796 (decimal expansion of Pi). */
const PI = '3.14159265358979323846264338327950288419716939937510';

function sample(seed: number, count: number, lo: number, hi: number): DD.IDoubleDouble[] {
  const rand = mulberry32(seed);
  return Array.from({ length: count }, () => DD.dd(lo + (hi - lo) * rand(), (rand() - 0.5) * 1e-17));
}

describe('constants', () => {
  it('DD_PI and 4·atan(1) agree with OEIS A000796', () => {
    expect(relativeError(DD.DD_PI, fromDecimal(PI))).toBeLessThan(1e-32);
    expect(relativeError(DD.mulNumber(DD.atan(DD.DD_ONE), 4), fromDecimal(PI))).toBeLessThan(1e-31);
    expect(relativeError(DD.scale2(DD.DD_HALF_PI, 1), fromDecimal(PI))).toBeLessThan(1e-32);
  });

  it('sin(π/6) = 1/2, cos(π/3) = 1/2, tan(π/4) = 1 (π from A000796 via DD_PI)', () => {
    const half = fromDecimal('0.5');
    expect(relativeError(DD.sin(DD.div(DD.DD_PI, DD.dd(6))), half)).toBeLessThan(1e-31);
    expect(relativeError(DD.cos(DD.div(DD.DD_PI, DD.dd(3))), half)).toBeLessThan(1e-31);
    expect(relativeError(DD.tan(DD.div(DD.DD_PI, DD.dd(4))), fromDD(DD.DD_ONE))).toBeLessThan(1e-31);
    // sin(kπ) vanishes up to the representation error of π (|k|·1.2e-33·…).
    for (const k of [1, 2, 7, -3, 100]) {
      expect(absoluteError(DD.sin(DD.mulNumber(DD.DD_PI, k)), fromDecimal('0'))).toBeLessThan(1e-30);
    }
  });
});

describe('identities and round trips', () => {
  it('sin² + cos² = 1 to 5e-31 over [−100, 100]', () => {
    for (const x of sample(21, 80, -100, 100)) {
      const { sin, cos } = DD.sinCos(x);
      expect(absoluteError(DD.add(DD.sqr(sin), DD.sqr(cos)), fromDD(DD.DD_ONE))).toBeLessThan(5e-31);
    }
  });

  it('sin(2x) = 2 sin x cos x and cos(a + b) = cos a cos b − sin a sin b to 1e-30', () => {
    const xs = sample(22, 60, -10, 10);
    for (let i = 0; i + 1 < xs.length; i += 2) {
      const [a, b] = [xs[i], xs[i + 1]];
      const sa = DD.sinCos(a);
      const sb = DD.sinCos(b);
      const twice = DD.scale2(DD.mul(sa.sin, sa.cos), 1);
      expect(absoluteError(DD.sin(DD.scale2(a, 1)), fromDD(twice))).toBeLessThan(1e-30);
      const sum = DD.sub(DD.mul(sa.cos, sb.cos), DD.mul(sa.sin, sb.sin));
      expect(absoluteError(DD.cos(DD.add(a, b)), fromDD(sum))).toBeLessThan(1e-30);
    }
  });

  it('atan(tan x) = x on (−π/2, π/2) and tan(atan y) = y', () => {
    for (const x of sample(23, 60, -1.5, 1.5)) {
      expect(relativeError(DD.atan(DD.tan(x)), fromDD(x))).toBeLessThan(1e-30);
    }
    for (const y of sample(24, 60, -50, 50)) {
      expect(relativeError(DD.tan(DD.atan(y)), fromDD(y))).toBeLessThan(1e-29);
    }
  });

  it('atan2 covers all quadrants: atan2(y, x) = atan(y/x) (+π for x < 0)', () => {
    for (const [y, x] of [
      [1, 2],
      [-3, 0.5],
      [2, -1],
      [-2, -7]
    ]) {
      let expected = DD.atan(DD.div(DD.dd(y), DD.dd(x)));
      if (x < 0) {
        expected = y >= 0 ? DD.add(expected, DD.DD_PI) : DD.sub(expected, DD.DD_PI);
      }
      expect(relativeError(DD.atan2(DD.dd(y), DD.dd(x)), fromDD(expected))).toBeLessThan(1e-30);
    }
  });
});

describe('large arguments', () => {
  // Reference values computed for this test with mpmath 1.3.0 at 40 digits
  // (not published values); the arguments are exact binary64 numbers.
  const cases: [number, string, string][] = [
    [1000000.5, '0.141954699000744003525849424004470615', '0.989873155223237766437372755445141116'],
    [1e9, '0.545843449448699564244387270897514529', '0.837887181363902334389775643551572356'],
    [-12345.6875, '0.697303509887800768070842993043969639', '0.716775986691904834543166138432384576']
  ];
  it('sin and cos stay accurate to ~1e-31 absolute up to |x| = 1e9 (three-part π/2)', () => {
    for (const [x, sinRef, cosRef] of cases) {
      const { sin, cos } = DD.sinCos(DD.dd(x));
      expect(absoluteError(sin, fromDecimal(sinRef)), `sin ${x}`).toBeLessThan(2e-31);
      expect(absoluteError(cos, fromDecimal(cosRef)), `cos ${x}`).toBeLessThan(2e-31);
    }
  });
});

describe('edge inputs', () => {
  it('NaN, ±∞, 0 and huge arguments', () => {
    expect(DD.sin(DD.dd(Number.NaN)).hi).toBeNaN();
    expect(DD.cos(DD.dd(Infinity)).hi).toBeNaN();
    expect(DD.sin(DD.dd(1e10)).hi).toBeNaN();
    expect(DD.sin(DD.DD_ZERO)).toEqual({ hi: 0, lo: 0 });
    expect(DD.cos(DD.DD_ZERO)).toEqual({ hi: 1, lo: 0 });
    expect(DD.atan(DD.dd(Infinity))).toEqual(DD.DD_HALF_PI);
    expect(DD.atan(DD.dd(-Infinity)).hi).toBe(-DD.DD_HALF_PI.hi);
    expect(DD.atan(DD.dd(Number.NaN)).hi).toBeNaN();
    expect(DD.atan2(DD.DD_ZERO, DD.DD_ZERO).hi).toBe(0);
    expect(DD.atan2(DD.DD_ZERO, DD.dd(-1)).hi).toBe(Math.PI);
  });
});
