/**
 * The array kernel of the critical power law against the formula written
 * with Math.pow (REFERENCE.md B5 form y = A(−t)^(pβ)[1 + aW(−t)^Δ] + y0),
 * across several blocks, with inactive points and the odd continuation.
 */
import { describe, expect, it } from 'vitest';
import { powerLawModel } from '../../../src/core/physics/critical/index';

function direct(p: number[], T: number, signed: boolean, pw: number, wd: number | undefined, bg: boolean): number {
  // (Tc − T)/Tc: Tc − T is exact, so u has full relative precision next to Tc
  const u = (p[1] - T) / p[1];
  const y0 = bg ? p[3] : 0;
  if (!(u > 0 || (signed && u < 0))) {
    return y0;
  }
  const aW = wd !== undefined ? p[p.length - 1] : 0;
  const corr = wd !== undefined ? 1 + aW * Math.pow(Math.abs(u), wd) : 1;
  return p[0] * Math.sign(u) * Math.pow(Math.abs(u), pw * p[2]) * corr + y0;
}

describe('critical power-law kernel', () => {
  const T = Float64Array.from({ length: 5000 }, (_, i) => 100 + (250 * i) / 4999); // spans Tc = 300, several blocks
  for (const signed of [false, true]) {
    for (const [pw, wd, bg] of [
      [1, undefined, false],
      [2, 0.52, true]
    ] as const) {
      it(`values within 1e-13 of Math.pow (signed ${signed}, proxy ${pw}, Wegner ${wd ?? 'none'}, background ${bg})`, () => {
        const m = powerLawModel({ aboveTc: signed ? 'signed' : 'zero', proxyPower: pw, wegnerDelta: wd, background: bg });
        const p = [1.3, 300, 0.34];
        if (bg) {
          p.push(0.05);
        }
        if (wd !== undefined) {
          p.push(-0.3);
        }
        const out = new Float64Array(T.length);
        m.evaluate(Float64Array.from(p), T, out);
        const jac = new Float64Array(T.length * p.length);
        const out2 = new Float64Array(T.length);
        m.evaluateWithJacobian!(Float64Array.from(p), T, out2, jac);
        let worst = 0;
        T.forEach((t, i) => {
          const want = direct(p, t, signed, pw, wd, bg);
          // relative to the size of the terms (A·s|u|^(pβ)·corr and y0 can cancel above Tc)
          const y0 = bg ? p[3] : 0;
          worst = Math.max(worst, Math.abs(out[i] - want) / Math.max(1e-300, Math.abs(want - y0) + Math.abs(y0)));
          expect(out2[i]).toBe(out[i]);
        });
        expect(worst).toBeLessThan(1e-13);
        // points at or above Tc without the continuation: only ∂/∂y0 is non-zero
        const k = p.length;
        const iAbove = T.findIndex((t) => t >= 300);
        for (const i of [iAbove, T.length - 1]) {
          for (let j = 0; j < k; j++) {
            const want = signed && T[i] > 300 ? jac[i * k + j] : bg && j === 3 ? 1 : 0;
            expect(jac[i * k + j]).toBe(want);
          }
        }
        // Jacobian by central differences at a few points in different blocks
        for (const i of [10, 2100, 4300, iAbove - 3, T.length - 2]) {
          for (let j = 0; j < k; j++) {
            const h = 1e-6 * Math.max(1, Math.abs(p[j]));
            const pp = p.slice();
            pp[j] += h;
            const fp = direct(pp, T[i], signed, pw, wd, bg);
            pp[j] -= 2 * h;
            const fm = direct(pp, T[i], signed, pw, wd, bg);
            const fd = (fp - fm) / (2 * h);
            expect(Math.abs(jac[i * k + j] - fd)).toBeLessThan(1e-6 * (1 + Math.abs(fd)));
          }
        }
      });
    }
  }
});
