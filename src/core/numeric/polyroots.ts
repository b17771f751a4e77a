/**
 * Real roots of a real polynomial by recursive isolation: the real roots of
 * p′ split the line into intervals on which p is monotone, so each interval
 * holds at most one root, found by safeguarded Newton–bisection. Double roots
 * (where p touches zero at a stationary point) are detected with a rounding
 * error bound. Deterministic; never misses a sign-changing root.
 * Method after Collins & Loos [N10 in REFERENCES.md]; roots of p′ come from
 * the same function (recursion on the degree); all roots lie within the
 * Cauchy bound 1 + max|cᵢ/cₙ|.
 *
 * Accuracy: a simple root is refined until its bracket is 2ε relative
 * (ε = 2⁻⁵²), so it is off by at most a few ulp plus the width of the band
 * where the computed p is pure rounding noise, |δx| ≲ B/|p′(x)| with B the
 * Horner error bound of `polyEval`. A double root at a stationary point is
 * accepted when |p| ≤ B there, and is then accurate only to about
 * √(B/|p″|), as for any method in binary64.
 */
import { msg } from '../messages';
import { NumericInputError } from './errors';

/** Coefficients in ascending order: p(x) = c[0] + c[1] x + … */
export type PolyCoefficients = readonly number[];

/** Value and running rounding-error bound of p(x) by Horner's rule. */
export function polyEval(c: PolyCoefficients, x: number): { value: number; errorBound: number } {
  let v = 0;
  let e = 0;
  const ax = Math.abs(x);
  for (let i = c.length - 1; i >= 0; i--) {
    v = v * x + c[i];
    e = e * ax + Math.abs(v);
  }
  return { value: v, errorBound: 4 * c.length * Number.EPSILON * e };
}

/** Derivative coefficients (ascending). */
export function polyDerivative(c: PolyCoefficients): number[] {
  const d: number[] = [];
  for (let i = 1; i < c.length; i++) {
    d.push(i * c[i]);
  }
  return d;
}

function trim(c: PolyCoefficients): number[] {
  const out = c.slice();
  const scale = out.reduce((m, v) => Math.max(m, Math.abs(v)), 0);
  while (out.length > 0 && Math.abs(out[out.length - 1]) <= 1e-300 * Math.max(1, scale)) {
    out.pop();
  }
  return out;
}

function value(c: PolyCoefficients, x: number): number {
  let v = 0;
  for (let i = c.length - 1; i >= 0; i--) {
    v = v * x + c[i];
  }
  return v;
}

/** Root of monotone p on [lo, hi] where p(lo), p(hi) have opposite signs. */
function refine(c: PolyCoefficients, d: PolyCoefficients, lo: number, hi: number, flo: number): number {
  let x = 0.5 * (lo + hi);
  for (let it = 0; it < 200; it++) {
    const fx = value(c, x);
    if (fx === 0) {
      return x;
    }
    if (fx * flo < 0) {
      hi = x;
    } else {
      lo = x;
      flo = fx;
    }
    const dx = value(d, x);
    let next = dx !== 0 ? x - fx / dx : NaN;
    if (!(next > lo && next < hi)) {
      next = 0.5 * (lo + hi);
    }
    if (Math.abs(next - x) <= 2 * Number.EPSILON * Math.abs(next) || hi - lo <= 2 * Number.EPSILON * Math.max(Math.abs(lo), Math.abs(hi))) {
      return next;
    }
    x = next;
  }
  return x;
}

/**
 * All distinct real roots of p (ascending coefficients), sorted ascending.
 * A polynomial that is identically zero, or a non-finite coefficient, throws
 * `NumericInputError`; constants give no roots.
 */
export function realPolynomialRoots(coefficients: PolyCoefficients): number[] {
  for (const v of coefficients) {
    if (!Number.isFinite(v)) {
      throw new NumericInputError(msg('numeric.polynomial-not-finite', 'A coefficient of the polynomial is %1: every coefficient must be a finite number.', v));
    }
  }
  const c = trim(coefficients);
  if (c.length === 0) {
    throw new NumericInputError(msg('numeric.polynomial-zero', 'Every coefficient of the polynomial is 0, so it has no isolated roots.'));
  }
  if (c.length === 1) {
    return [];
  }
  if (c.length === 2) {
    return [-c[0] / c[1]];
  }
  const n = c.length - 1;
  // Cauchy bound on |root|.
  let bound = 0;
  for (let i = 0; i < n; i++) {
    bound = Math.max(bound, Math.abs(c[i] / c[n]));
  }
  bound = 1 + bound;
  const d = polyDerivative(c);
  const crit = realPolynomialRoots(d).filter(x => x > -bound && x < bound);
  const pts = [-bound, ...crit, bound];
  const roots: number[] = [];
  for (let i = 0; i < pts.length; i++) {
    const x = pts[i];
    if (i > 0 && i < pts.length - 1) {
      const { value: v, errorBound } = polyEval(c, x);
      if (Math.abs(v) <= errorBound) {
        roots.push(x);
        continue;
      }
    }
    if (i === pts.length - 1) {
      break;
    }
    const a = pts[i];
    const b = pts[i + 1];
    const fa = value(c, a);
    const fb = value(c, b);
    if (fa === 0 && i === 0) {
      roots.push(a);
    }
    if (fa * fb < 0) {
      roots.push(refine(c, d, a, b, fa));
    }
  }
  roots.sort((x, y) => x - y);
  const out: number[] = [];
  for (const r of roots) {
    if (out.length === 0 || Math.abs(r - out[out.length - 1]) > 4 * Number.EPSILON * Math.max(1, Math.abs(r))) {
      out.push(r === 0 ? 0 : r);
    }
  }
  return out;
}
