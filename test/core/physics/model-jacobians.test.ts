/**
 * Every physics model the analysis panel fits offers an analytic Jacobian,
 * and a combined value-and-Jacobian pass with the same numbers: checked
 * against central differences of its own `evaluate` (step 1e-6 relative;
 * agreement to 1e-6 of each column's size, well above the difference
 * error ≈ h² and the rounding ≈ ε/h). Parameter values and grids are chosen
 * here, away from the kinks (Tc, T1) where a derivative jumps (common
 * practice, no source).
 */
import { describe, expect, it } from 'vitest';
import type { IFitModel } from '../../../src/core/fit/index';
import { beanRodbellTransition } from '../../../src/core/physics/bean-rodbell';
import { beanRodbellFitModel, beanRodbellStartModel } from '../../../src/core/physics/bean-rodbell-fit';
import { powerLawModel } from '../../../src/core/physics/critical/index';
import { curieWeissModel } from '../../../src/core/physics/curie-weiss';
import { landauFitModel } from '../../../src/core/physics/landau/fit-model';
import { weissIsothermModel, weissMTModel } from '../../../src/core/physics/weiss-fit';

/**
 * `forward` lists columns checked with the one-sided difference (−3f(p) + 4f(p + h) − f(p + 2h))/(2h),
 * h = 1e-6·max(|p|, 1), error O(h²): for a parameter at a bound beyond which the model is flat
 * (u = 1/J at 0, the classical limit).
 */
function checkJacobian(model: IFitModel, p: number[], x: Float64Array, tol = 1e-6, forward: number[] = []): void {
  const n = x.length;
  const k = p.length;
  const pp = Float64Array.from(p);
  const jac = new Float64Array(n * k);
  model.jacobian!(pp, x, jac);
  const up = new Float64Array(n);
  const dn = new Float64Array(n);
  for (let j = 0; j < k; j++) {
    const oneSided = forward.includes(j);
    const h = 1e-6 * Math.max(Math.abs(p[j]), oneSided ? 1 : 1e-3);
    const q = Float64Array.from(p);
    q[j] = p[j] + h;
    model.evaluate(q, x, up);
    q[j] = oneSided ? p[j] + 2 * h : p[j] - h;
    model.evaluate(q, x, dn);
    const at = new Float64Array(n);
    if (oneSided) {
      model.evaluate(pp, x, at);
    }
    let scale = 0;
    for (let i = 0; i < n; i++) {
      scale = Math.max(scale, Math.abs(jac[i * k + j]));
    }
    expect(scale).toBeGreaterThan(0);
    for (let i = 0; i < n; i++) {
      const fd = oneSided ? (-3 * at[i] + 4 * up[i] - dn[i]) / (2 * h) : (up[i] - dn[i]) / (2 * h);
      expect(Math.abs(jac[i * k + j] - fd)).toBeLessThanOrEqual(tol * scale);
    }
  }
  // the combined pass gives exactly the separate results
  if (model.evaluateWithJacobian) {
    const out = new Float64Array(n);
    const out2 = new Float64Array(n);
    const jac2 = new Float64Array(n * k);
    model.evaluate(pp, x, out);
    model.evaluateWithJacobian(pp, x, out2, jac2);
    expect(Array.from(out2)).toEqual(Array.from(out));
    expect(Array.from(jac2)).toEqual(Array.from(jac));
  }
}

const grid = (a: number, b: number, n: number): Float64Array => Float64Array.from({ length: n }, (_, i) => a + ((b - a) * i) / (n - 1));

describe('analytic Jacobians of the fitted physics models', () => {
  it.each([
    ['plain', {}, [1.1, 300, 0.34]],
    ['with background', { background: true }, [1.1, 300, 0.34, 0.02]],
    ['with the Wegner term and background, ψ²', { background: true, wegnerDelta: 0.52, proxyPower: 2 }, [1.1, 300, 0.34, 0.02, -0.4]]
  ] as const)('critical power law, %s', (_name, options, p) => {
    checkJacobian(powerLawModel(options), [...p], grid(150, 297, 300));
  });

  it('Curie–Weiss χ0 + C/(T − θ)', () => {
    checkJacobian(curieWeissModel, [1.2, 15, 0.002], grid(30, 350, 200));
  });

  it.each([
    [0.5, 0, 0],
    [1, 0, 0],
    [3.5, 2, 7]
  ])('Weiss M(T), J = %f, field %f T, moment %f μB', (J, field, moment) => {
    // points below Tc = 630 and above it, not within 2 K of it
    const T = Float64Array.from([...grid(30, 620, 150), ...grid(640, 700, 30)]);
    checkJacobian(weissMTModel(J, false, field, moment), [1.5, 630], T, 1e-5);
  });

  it.each([
    [0, 0, 0],
    [0.3, 0, 0],
    [1, 0, 0],
    [2, 0, 0],
    [0.3, 2, 7]
  ])('Weiss M(T) with the spin free as u = 1/J = %f, field %f T, moment %f μB', (u, field, moment) => {
    // points below Tc = 630 and above it, not within 2 K of it; u = 0 (J = ∞) is the lower
    // bound, beyond which the model stays at J = ∞: one-sided differences in u there
    const T = Float64Array.from([...grid(30, 620, 150), ...grid(640, 700, 30)]);
    const model = weissMTModel(1, 'inverse', field, moment);
    const p = [1.5, 630, u];
    checkJacobian(model, p, T, 1e-5, u === 0 ? [2] : []);
    // the u column is analytic: zero above Tc in zero field and at Tc itself (F_m = 0 there)
    const Ts = Float64Array.from([...T, 630]);
    const jac = new Float64Array(3 * Ts.length);
    const out = new Float64Array(Ts.length);
    model.evaluateWithJacobian!(Float64Array.from(p), Ts, out, jac);
    for (let i = 0; i < Ts.length; i++) {
      const du = jac[3 * i + 2];
      expect(Number.isFinite(du)).toBe(true);
      if (field === 0 && Ts[i] >= 630) {
        expect(du).toBe(0);
      } else {
        expect(du).not.toBe(0);
      }
      // at u = 0 in zero field ∂m/∂u = m/2 exactly (B ≈ a L(a x), a = 1 + u/2, to first order in u):
      // the u column is Ms·m/2, parallel to the Ms column
      if (u === 0 && field === 0) {
        expect(Math.abs(du - out[i] / 2)).toBeLessThanOrEqual(1e-12 * Math.abs(out[i]));
      }
    }
  });

  it.each([
    [0.5, 0, 0],
    [3.5, 0, 0],
    [2, 2, 7]
  ])('Weiss M(T) with the spin J = %f itself free, field %f T, moment %f μB', (J, field, moment) => {
    // the J column is the 1/J column times −1/J² (chain rule); points not within 2 K of Tc
    const T = Float64Array.from([...grid(30, 620, 150), ...grid(640, 700, 30)]);
    checkJacobian(weissMTModel(J, true, field, moment), [1.5, 630, J], T, 1e-5);
  });

  it('Weiss M(B, T) isotherms (Ms, Tc, moment)', () => {
    const T: number[] = [];
    const B: number[] = [];
    for (const t of [200, 400, 600, 700, 800]) {
      for (const b of [0.1, 0.5, 1, 2, 5, 9]) {
        T.push(t);
        B.push(b);
      }
    }
    const model = weissIsothermModel(1, Float64Array.from(T), Float64Array.from(B));
    checkJacobian(model, [2, 650, 4], Float64Array.from(T, (_, i) => i), 1e-5);
  });

  it.each([
    ['continuous (b > 0)', [2, 400, 0.5, 0.2]],
    ['first order (b < 0)', [2, 400, -0.5, 0.2]]
  ] as const)('Landau ψ(T), 1/χ(T) and ΔC, %s', (_name, p) => {
    // ψ points below the transition and above it, 1/χ points on both sides, one ΔC
    const Ts: number[] = [];
    const kinds: number[] = [];
    for (const t of grid(300, 395, 40)) {
      Ts.push(t);
      kinds.push(0);
    }
    for (const t of [410, 430, 450]) {
      Ts.push(t);
      kinds.push(0);
    }
    for (const t of [...grid(300, 395, 20), 410, 450]) {
      Ts.push(t);
      kinds.push(1);
    }
    Ts.push(0);
    kinds.push(2);
    const model = landauFitModel(kinds, Ts);
    const x = Float64Array.from(Ts, (_, i) => i);
    if (p[2] > 0) {
      checkJacobian(model, [...p], x);
    } else {
      // ΔC is defined for b > 0 only: the first-order case without that point
      checkJacobian(landauFitModel(kinds.slice(0, -1), Ts.slice(0, -1)), [...p], x.subarray(0, x.length - 1));
    }
  });
  // Points on both sides of the transition at Tc = T0·τc(η), none within
  // 3 K of it: the steps (1e-6 of T0 and η) move Tc by far less than that.
  // η < 1: continuous at T0 (derivatives in T0 and η diverge there); η > 1:
  // first order, σ jumps at Tc > T0.
  it.each([
    [0.5, 0.4],
    [0.5, 1.8],
    [3.5, 0.7],
    [3.5, 1.4],
    [Infinity, 0.5],
    [Infinity, 2.5]
  ])('Bean–Rodbell M(T) (Ms, T0, η), J = %f, η = %f', (J, eta) => {
    const T0 = 300;
    const Tc = T0 * beanRodbellTransition(J, eta).tauC;
    const T = Float64Array.from([...grid(40, Tc - 3, 50), ...grid(Tc + 3, 1.3 * Tc, 10)]);
    const model = beanRodbellFitModel(J);
    checkJacobian(model, [2.5, T0, eta], T);
    // disordered points (σ = 0) have zero rows, ordered points none
    const jac = new Float64Array(3 * T.length);
    model.jacobian!(Float64Array.from([2.5, T0, eta]), T, jac);
    for (let i = 0; i < T.length; i++) {
      const row = Array.from(jac.subarray(3 * i, 3 * i + 3));
      if (T[i] > Tc) {
        expect(row).toEqual([0, 0, 0]);
      } else {
        expect(row.every(v => v !== 0 && Number.isFinite(v))).toBe(true);
      }
    }
  });

  it('Bean–Rodbell M(T): NaN values and Jacobian where T0 ≤ 0 or η < 0', () => {
    const model = beanRodbellFitModel(0.5);
    const T = grid(50, 400, 5);
    for (const p of [
      [2, 0, 0.5],
      [2, 300, -0.1]
    ]) {
      const out = new Float64Array(5);
      const jac = new Float64Array(15);
      model.evaluateWithJacobian!(Float64Array.from(p), T, out, jac);
      expect(Array.from(out).every(Number.isNaN)).toBe(true);
      expect(Array.from(jac).every(Number.isNaN)).toBe(true);
    }
  });

  it.each([
    [0.5, 0.6],
    [0.5, 1.8],
    [3.5, 1.2],
    [Infinity, 0.3]
  ])('Bean–Rodbell start model T(M) (Ms, T0, η), J = %f, η = %f', (J, eta) => {
    // ordered-branch magnetisations m = M/Ms from 0.04 to 0.98; x holds indices
    const M = Array.from(grid(0.08, 1.96, 40));
    const model = beanRodbellStartModel(J, M);
    checkJacobian(model, [2, 300, eta], Float64Array.from(M, (_, i) => i));
  });
});
