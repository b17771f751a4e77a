/**
 * Scalar root bracketing (Brent's method) and bounded golden-section
 * minimisation. Both report convergence and never throw on hard problems.
 *
 * Methods [N8 in REFERENCES.md]: `bracketRoot` is Brent's zero finder
 * (inverse quadratic / secant interpolation, falling back to bisection
 * whenever interpolation would not halve the bracket fast enough, so it never
 * needs more than about the square of the bisection count); `goldenMinimum`
 * is Kiefer's golden-section search (the bracket shrinks by 0.618 per
 * evaluation).
 *
 * Accuracy: a converged `bracketRoot` returns b with f(b), f(c) of opposite
 * signs and |b − c| ≤ 4ε|b| + xtol (ε = 2⁻⁵²), i.e. a sign change of f lies
 * within that distance (exact zeros at the ends are returned as is).
 * `goldenMinimum` narrows [a, b] to xtol·(1 + |a| + |b|) around a minimum of
 * a unimodal f; near a smooth minimum f is flat to O(δ²), so its location is
 * resolved to about √ε relative at best, whatever xtol.
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';

/** Outcome of a bracketed root search. */
export interface IScalarRootResult {
  root: number;
  value: number;
  iterations: number;
  converged: boolean;
  /** How the search ended (codes `numeric.root.*`). */
  reason: ICoreMessage;
}

const NOT_FINITE_AT_ENDS = (): ICoreMessage => msg('numeric.root.not-finite-at-ends', 'The function is not finite at an end of the search interval.');
const EXACT_AT_END = (): ICoreMessage => msg('numeric.root.exact-at-end', 'The root lies exactly at an end of the search interval.');

/**
 * Root of f in [a, b] given f(a) f(b) ≤ 0, by Brent's method (inverse
 * quadratic interpolation safeguarded by bisection). `xtol` is absolute.
 */
export function bracketRoot(
  f: (x: number) => number,
  a: number,
  b: number,
  xtol = 1e-14,
  maxIterations = 200
): IScalarRootResult {
  let fa = f(a);
  let fb = f(b);
  if (!Number.isFinite(fa) || !Number.isFinite(fb)) {
    return { root: NaN, value: NaN, iterations: 0, converged: false, reason: NOT_FINITE_AT_ENDS() };
  }
  if (fa === 0) {
    return { root: a, value: 0, iterations: 0, converged: true, reason: EXACT_AT_END() };
  }
  if (fb === 0) {
    return { root: b, value: 0, iterations: 0, converged: true, reason: EXACT_AT_END() };
  }
  if (fa * fb > 0) {
    return { root: NaN, value: NaN, iterations: 0, converged: false, reason: msg('numeric.root.no-sign-change', 'The function does not change sign over the search interval.') };
  }
  let c = a;
  let fc = fa;
  let d = b - a;
  let e = d;
  for (let it = 1; it <= maxIterations; it++) {
    if (fb * fc > 0) {
      c = a;
      fc = fa;
      d = b - a;
      e = d;
    }
    if (Math.abs(fc) < Math.abs(fb)) {
      a = b;
      b = c;
      c = a;
      fa = fb;
      fb = fc;
      fc = fa;
    }
    const tol = 2 * Number.EPSILON * Math.abs(b) + 0.5 * xtol;
    const m = 0.5 * (c - b);
    if (Math.abs(m) <= tol || fb === 0) {
      return { root: b, value: fb, iterations: it, converged: true, reason: msg('numeric.root.converged', 'The root was located to within the requested tolerance.') };
    }
    if (Math.abs(e) >= tol && Math.abs(fa) > Math.abs(fb)) {
      const s = fb / fa;
      let p: number;
      let q: number;
      if (a === c) {
        p = 2 * m * s;
        q = 1 - s;
      } else {
        const qq = fa / fc;
        const r = fb / fc;
        p = s * (2 * m * qq * (qq - r) - (b - a) * (r - 1));
        q = (qq - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) {
        q = -q;
      } else {
        p = -p;
      }
      if (2 * p < Math.min(3 * m * q - Math.abs(tol * q), Math.abs(e * q))) {
        e = d;
        d = p / q;
      } else {
        d = m;
        e = m;
      }
    } else {
      d = m;
      e = m;
    }
    a = b;
    fa = fb;
    b += Math.abs(d) > tol ? d : m > 0 ? tol : -tol;
    fb = f(b);
    if (!Number.isFinite(fb)) {
      return { root: a, value: fa, iterations: it, converged: false, reason: msg('numeric.root.not-finite-inside', 'The function is not finite inside the search interval.') };
    }
  }
  return {
    root: b,
    value: fb,
    iterations: maxIterations,
    converged: false,
    reason: msg('numeric.root.iteration-limit', 'The search for the root reached its limit of %1 iterations before it settled.', maxIterations)
  };
}

/** Bounded minimum of a unimodal f on [a, b] by golden-section search. */
export function goldenMinimum(
  f: (x: number) => number,
  a: number,
  b: number,
  xtol = 1e-12,
  maxIterations = 300
): { x: number; value: number; converged: boolean } {
  const g = (Math.sqrt(5) - 1) / 2;
  let x1 = b - g * (b - a);
  let x2 = a + g * (b - a);
  let f1 = f(x1);
  let f2 = f(x2);
  for (let it = 0; it < maxIterations; it++) {
    if (Math.abs(b - a) <= xtol * (1 + Math.abs(a) + Math.abs(b))) {
      break;
    }
    if (f1 < f2) {
      b = x2;
      x2 = x1;
      f2 = f1;
      x1 = b - g * (b - a);
      f1 = f(x1);
    } else {
      a = x1;
      x1 = x2;
      f1 = f2;
      x2 = a + g * (b - a);
      f2 = f(x2);
    }
  }
  const x = f1 < f2 ? x1 : x2;
  return { x, value: Math.min(f1, f2), converged: Math.abs(b - a) <= 1e-6 * (1 + Math.abs(x)) };
}
