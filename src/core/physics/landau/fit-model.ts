/**
 * The engine model of a Landau fit (convention L, h = 0, no cubic term):
 * ψ_eq(T), 1/χ(T) = F″ at the minimum and ΔC = T0 a²/(2b) for points of
 * kinds 0, 1 and 2, with the analytic Jacobian over (a, T0, b, c).
 *
 * On the ordered branch q = ψ² solves g = a(T − T0) + b q + c q² = 0
 * [B3 in REFERENCES.md], so by implicit differentiation
 *   ∂q/∂θ = −(∂g/∂θ)/(b + 2cq),  ∂g/∂(a, T0, b, c) = (T − T0, −a, q, q²),
 *   ∂ψ/∂θ = (∂q/∂θ)/(2ψ);
 * b + 2cq = √(b² + 4ca(T0 − T)) > 0 on the stable ordered branch (it
 * vanishes only at the superheating limit T**, above T1). On the disordered
 * branch ψ = 0 and its derivatives are 0; at the jump T1 of a first-order
 * transition ψ is discontinuous and the Jacobian is that of the branch the
 * point is on.
 */
import type { IFitModel } from '../../fit/index';
import type { ILandauCoefficients } from './conventions';

/** ψ_eq(T) ≥ 0 at h = 0 in closed form (d = 0); NaN for an unbounded F. */
export function landauEquilibriumPsi(k: ILandauCoefficients, T: number): number {
  const { a, b, c, T0 } = k;
  if (!(a > 0) || c < 0 || (c === 0 && !(b > 0))) {
    return NaN;
  }
  const x = a * (T0 - T);
  if (b >= 0) {
    if (x <= 0) {
      return 0;
    }
    const disc = b * b + 4 * c * x;
    return Math.sqrt((2 * x) / (b + Math.sqrt(disc)));
  }
  const B = -b;
  const T1 = T0 + (3 * B * B) / (16 * a * c);
  if (T >= T1) {
    return 0;
  }
  const disc = B * B + 4 * c * x;
  return Math.sqrt((B + Math.sqrt(Math.max(0, disc))) / (2 * c));
}

/**
 * The model for points `x` = indices into `kinds` (0 ψ, 1 1/χ, 2 ΔC) and
 * temperatures `Ts`; parameters a, T0, b, c.
 */
export function landauFitModel(kinds: readonly number[], Ts: readonly number[]): IFitModel {
  const run = (p: Float64Array, x: Float64Array, out: Float64Array, jac: Float64Array | null): void => {
    const [a, T0, b, c] = p;
    const k: ILandauCoefficients = { a, T0, b, c };
    for (let i = 0; i < x.length; i++) {
      const j = x[i];
      const T = Ts[j];
      const kind = kinds[j];
      const row = i * 4;
      if (kind === 2) {
        out[i] = b > 0 ? (T0 * a * a) / (2 * b) : NaN;
        if (jac) {
          jac[row] = b > 0 ? (T0 * a) / b : NaN;
          jac[row + 1] = b > 0 ? (a * a) / (2 * b) : NaN;
          jac[row + 2] = b > 0 ? (-T0 * a * a) / (2 * b * b) : NaN;
          jac[row + 3] = b > 0 ? 0 : NaN;
        }
        continue;
      }
      const psi = landauEquilibriumPsi(k, T);
      const q = psi * psi;
      // ∂q/∂θ on the ordered branch (0 on the disordered one)
      let q0 = 0;
      let q1 = 0;
      let q2 = 0;
      let q3 = 0;
      if (jac && psi > 0) {
        const inv = -1 / (b + 2 * c * q);
        q0 = (T - T0) * inv;
        q1 = -a * inv;
        q2 = q * inv;
        q3 = q * q * inv;
      } else if (jac && !(psi >= 0)) {
        q0 = q1 = q2 = q3 = NaN;
      }
      if (kind === 0) {
        out[i] = psi;
        if (jac) {
          const f = psi > 0 ? 1 / (2 * psi) : 0;
          jac[row] = q0 * f;
          jac[row + 1] = q1 * f;
          jac[row + 2] = q2 * f;
          jac[row + 3] = q3 * f;
        }
      } else {
        out[i] = a * (T - T0) + 3 * b * q + 5 * c * q * q;
        if (jac) {
          const dq = 3 * b + 10 * c * q;
          jac[row] = T - T0 + dq * q0;
          jac[row + 1] = -a + dq * q1;
          jac[row + 2] = 3 * q + dq * q2;
          jac[row + 3] = 5 * q * q + dq * q3;
        }
      }
    }
  };
  return {
    parameters: ['a', 'T0', 'b', 'c'],
    evaluate(p, x, out) {
      run(p, x, out, null);
    },
    jacobian(p, x, out) {
      run(p, x, new Float64Array(x.length), out);
    },
    evaluateWithJacobian(p, x, out, jac) {
      run(p, x, out, jac);
    }
  };
}
