/**
 * The Arrott–Noakes equation of state [B6 in REFERENCES.md] as a fit model of
 * ln M at each (H, T):  (H/M)^(1/γ) = (T − Tc)/T1 + (M/M1)^(1/β).
 *
 * With u = ln M the residual F(u) = e^{(ln H − u)/γ} − c − e^{(u − ln M1)/β},
 * c = (T − Tc)/T1, is strictly decreasing in u, so the root is unique. It is
 * found by Newton steps kept inside a bracket that tightens with every sign
 * of F (bisection when a step leaves it); each point starts from its previous
 * root. The Jacobian follows from the implicit-function theorem,
 * ∂u/∂p = −(∂F/∂p)/(∂F/∂u), and is computed in the same pass as the values.
 */
import type { IFitModel } from '../fit/index';

/** Largest Newton step in ln M while one side of the bracket is still open. */
const MAX_STEP = 4;

/**
 * ln M solving the equation of state for ln H, c = (T − Tc)/T1, ln M1, β, γ,
 * from `guess`; NaN when no root is found (non-finite inputs).
 */
export function solveLnM(lnH: number, c: number, lnM1: number, beta: number, gamma: number, guess: number): number {
  if (!(Number.isFinite(lnH) && Number.isFinite(c) && Number.isFinite(lnM1) && beta > 0 && gamma > 0)) {
    return NaN;
  }
  const ib = 1 / beta;
  const ig = 1 / gamma;
  let lo = -Infinity;
  let hi = Infinity;
  let u = Number.isFinite(guess) ? guess : lnM1;
  for (let it = 0; it < 200; it++) {
    const a = Math.exp((lnH - u) * ig);
    const b = Math.exp((u - lnM1) * ib);
    const f = a - c - b;
    if (f > 0) {
      lo = u;
    } else if (f < 0) {
      hi = u;
    } else {
      return u;
    }
    const df = -a * ig - b * ib;
    const step = -f / df;
    const tol = 1e-13 * Math.max(1, Math.abs(u));
    if (Math.abs(step) <= tol || hi - lo <= tol) {
      return Math.abs(step) <= tol ? u + step : 0.5 * (lo + hi);
    }
    let next = u + step;
    if (!(next > lo && next < hi)) {
      // a step out of the bracket (or no step): bisect, or walk out when one side is still open
      next = Number.isFinite(lo) && Number.isFinite(hi) ? 0.5 * (lo + hi) : f > 0 ? u + MAX_STEP : u - MAX_STEP;
    } else if (!Number.isFinite(lo) || !Number.isFinite(hi)) {
      next = Math.min(Math.max(next, u - MAX_STEP), u + MAX_STEP);
    }
    u = next;
  }
  return u;
}

/**
 * Fit model of ln M with parameters (Tc, β, γ, T1, M1); x holds point indices
 * into `lnH`, `T`; `guess` (ln M of each point, e.g. the measured one) seeds
 * the first solve and is updated with every root found.
 */
export function equationOfStateModel(lnH: Float64Array, T: Float64Array, guess: Float64Array): IFitModel {
  const last = Float64Array.from(guess);
  const values = (p: Float64Array, x: Float64Array, out: Float64Array, jac: Float64Array | null): void => {
    const Tc = p[0];
    const beta = p[1];
    const gamma = p[2];
    const T1 = p[3];
    const M1 = p[4];
    const lnM1 = Math.log(M1);
    for (let k = 0; k < x.length; k++) {
      const i = x[k];
      const u = solveLnM(lnH[i], (T[i] - Tc) / T1, lnM1, beta, gamma, last[i]);
      out[k] = u;
      if (Number.isFinite(u)) {
        last[i] = u;
      }
      if (jac !== null) {
        const a = Math.exp((lnH[i] - u) / gamma);
        const b = Math.exp((u - lnM1) / beta);
        const Fu = -a / gamma - b / beta;
        const r = -1 / Fu;
        const o = 5 * k;
        jac[o] = r * (1 / T1);
        jac[o + 1] = r * ((b * (u - lnM1)) / (beta * beta));
        jac[o + 2] = r * ((-a * (lnH[i] - u)) / (gamma * gamma));
        jac[o + 3] = r * ((T[i] - Tc) / (T1 * T1));
        jac[o + 4] = r * (b / (beta * M1));
      }
    }
  };
  return {
    parameters: ['Tc', 'beta', 'gamma', 'T1', 'M1'],
    pointwise: true,
    evaluate(p, x, out) {
      values(p, x, out, null);
    },
    jacobian(p, x, out) {
      values(p, x, new Float64Array(x.length), out);
    },
    evaluateWithJacobian(p, x, out, jac) {
      values(p, x, out, jac);
    }
  };
}
