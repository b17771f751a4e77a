/**
 * Array kernel of the critical power law
 *   y = A·s·|u|^(pβ)·[1 + aW·|u|^Δ] + y0,  u = 1 − T/Tc = −t,  s = sign(u),
 * giving the values and, when asked, the Jacobian row-major (n × k) in one
 * pass over the data, block by block: one array logarithm and one array exponential per
 * power (instead of `Math.pow`, about four times slower in V8). Points with
 * u = 0, and with u < 0 unless the odd continuation is chosen, are 0 (plus
 * y0) with zero derivatives except ∂/∂y0 = 1.
 *
 * u is computed as (Tc − T)/Tc: Tc − T is exact for T within a factor 2
 * of Tc, so u keeps full relative precision next to Tc, where 1 − T/Tc
 * would lose digits to cancellation.
 *
 * Accuracy: |u|^a = exp(a·log|u|) has a relative error ≤ (2 + 2|a·log|u||)
 * ulp (≈ 30 ulp at |u| = 1e−6), far below any measurement's.
 */
import { expArray, logArray } from '../../numeric/arraymath/index';
import { LN2_HI, LN2_LO, POW2, POW2_OFFSET, ROUND_SHIFT } from '../../numeric/arraymath/tables';

/**
 * |u|^e = exp(e·log|u|) with the exponential inlined in the final loops (no
 * array of exponents written and read back): the method of `expArray`
 * (table of 2^(j/64), degree-5 polynomial, ≤ 2 ulp) with the same
 * constants, so the values are those `expArray` gives.
 */
const EXP_STEPS = 64;
const EXP_INV_STEP = EXP_STEPS / Math.LN2;
const EXP_STEP_HI = LN2_HI / EXP_STEPS;
const EXP_STEP_LO = LN2_LO / EXP_STEPS;
const EXP_LIMIT = 708;
// Module-local copies: imported bindings are property reads through getters in bundled code.
const SHIFT = ROUND_SHIFT;
const OFFSET = POW2_OFFSET;
const TWO_J = Float64Array.from({ length: EXP_STEPS }, (_, j) => Math.pow(2, j / EXP_STEPS));

/** exp(y) by the method of `expArray` (inlined by the compiler into the loops below). */
function expInline(y: number, pow2: Float64Array, twoJ: Float64Array): number {
  if (y > -EXP_LIMIT && y < EXP_LIMIT) {
    const kf = y * EXP_INV_STEP + SHIFT - SHIFT;
    const r = y - kf * EXP_STEP_HI - kf * EXP_STEP_LO;
    const k = kf | 0;
    const q = r + r * r * (0.5 + r * (0.16666666666666666 + r * (0.041666666666666664 + r * (0.008333333333333333 + r * 0.001388888888888889))));
    const t = pow2[(k >> 6) + OFFSET] * twoJ[k & 63];
    return t + t * q;
  }
  return Math.exp(y);
}

/** Layout of the parameter vector: indices of y0 and aW (−1 when absent). */
export interface IPowerLawLayout {
  /** Power p of ψ that the data follow. */
  proxyPower: number;
  /** Odd continuation above Tc. */
  signed: boolean;
  /** Wegner exponent Δ, or undefined without the correction. */
  wegnerDelta: number | undefined;
  iBg: number;
  iW: number;
  /** Number of parameters (row length of the Jacobian). */
  k: number;
}

/** Points per block: the scratch arrays of a block stay in the processor cache. */
const BLOCK = 2048;

/** Scratch arrays of one block, one set per model. */
export class PowerLawScratch {
  readonly logU = new Float64Array(BLOCK);
  readonly powD = new Float64Array(BLOCK);
}

/**
 * Writes the model values into `out` and, when `jac` is given, the
 * Jacobian (n × layout.k, row-major) into `jac`.
 */
export function powerLawKernel(
  L: IPowerLawLayout,
  scratch: PowerLawScratch,
  p: Float64Array,
  x: Float64Array,
  out: Float64Array,
  jac: Float64Array | null
): void {
  const n = x.length;
  for (let b = 0; b < n; b += BLOCK) {
    block(L, scratch, p, x, out, jac, b, Math.min(n, b + BLOCK));
  }
}

/** Points b … end − 1. */
function block(
  L: IPowerLawLayout,
  scratch: PowerLawScratch,
  p: Float64Array,
  x: Float64Array,
  out: Float64Array,
  jac: Float64Array | null,
  b: number,
  end: number
): void {
  const m = end - b;
  const wd = L.wegnerDelta;
  const wegner = wd !== undefined;
  const { logU, powD } = scratch;
  const A = p[0];
  const Tc = p[1];
  const invTc = 1 / Tc;
  const e = L.proxyPower * p[2];
  const signed = L.signed;
  // log|u| for the active points (1 → log 0 for the others, masked below)
  for (let i = 0; i < m; i++) {
    const u = (Tc - x[b + i]) * invTc;
    logU[i] = u > 0 || (signed && u < 0) ? Math.abs(u) : 1;
  }
  logArray(logU, logU, m);
  const pow2 = POW2;
  const twoJ = TWO_J;
  if (wegner) {
    for (let i = 0; i < m; i++) {
      powD[i] = wd * logU[i];
    }
    expArray(powD, powD, m);
  }
  const y0 = L.iBg >= 0 ? p[L.iBg] : 0;
  const aW = L.iW >= 0 ? p[L.iW] : 0;
  // The plain law A·s|u|^e (no correction term, no background, three
  // parameters), the common case: its own loops, with nothing to mask or add.
  const plain = !wegner && L.iBg < 0 && L.k === 3;
  if (jac === null && plain) {
    for (let i = 0; i < m; i++) {
      const u = (Tc - x[b + i]) * invTc;
      const pe = expInline(e * logU[i], pow2, twoJ);
      out[b + i] = u > 0 ? A * pe : signed && u < 0 ? A * -pe : 0;
    }
    return;
  }
  if (jac === null) {
    for (let i = 0; i < m; i++) {
      const u = (Tc - x[b + i]) * invTc;
      const active = u > 0 || (signed && u < 0);
      const pe = expInline(e * logU[i], pow2, twoJ);
      // the same operations, in the same order, as the Jacobian branch
      const base = (u > 0 ? pe : -pe) * (1 + aW * (wegner ? powD[i] : 0));
      out[b + i] = active ? A * base + y0 : y0;
    }
    return;
  }
  const k = L.k;
  const pw = L.proxyPower;
  const iBg = L.iBg;
  const iW = L.iW;
  const c1 = A * invTc * invTc;
  const aWwd = wegner ? aW * (wd as number) : 0;
  if (plain) {
    // the values of the general loop below with y0 = aW = 0 (the same operations), its Jacobian to rounding
    const Apw = A * pw;
    const c1e = c1 * e;
    for (let i = 0; i < m; i++) {
      const xi = x[b + i];
      const u = (Tc - xi) * invTc;
      const row = (b + i) * 3;
      if (!(u > 0 || (signed && u < 0))) {
        jac[row] = 0;
        jac[row + 1] = 0;
        jac[row + 2] = 0;
        out[b + i] = 0;
        continue;
      }
      const lu = logU[i];
      const pe = expInline(e * lu, pow2, twoJ);
      const sp = u > 0 ? pe : -pe;
      out[b + i] = A * sp;
      jac[row] = sp;
      jac[row + 1] = (c1e * xi * pe) / (u > 0 ? u : -u);
      jac[row + 2] = Apw * sp * lu;
    }
    return;
  }
  for (let i = 0; i < m; i++) {
    const xi = x[b + i];
    const u = (Tc - xi) * invTc;
    const row = (b + i) * k;
    if (!(u > 0 || (signed && u < 0))) {
      for (let j = 0; j < k; j++) {
        jac[row + j] = 0;
      }
      if (iBg >= 0) {
        jac[row + iBg] = 1;
      }
      out[b + i] = y0;
      continue;
    }
    const au = u > 0 ? u : -u;
    const pe = expInline(e * logU[i], pow2, twoJ);
    const sp = u > 0 ? pe : -pe; // s·|u|^e
    const pd = wegner ? powD[i] : 0;
    const corr = 1 + aW * pd;
    const base = sp * corr;
    out[b + i] = A * base + y0;
    jac[row] = base;
    // ∂/∂Tc: d|u|/dTc = s·T/Tc², d/d|u| of A s |u|^e corr = A s (e|u|^(e−1) corr + |u|^e aW Δ |u|^(Δ−1))
    jac[row + 1] = (c1 * xi * pe * (e * corr + aWwd * pd)) / au;
    jac[row + 2] = A * base * logU[i] * pw;
    if (iBg >= 0) {
      jac[row + iBg] = 1;
    }
    if (iW >= 0) {
      jac[row + iW] = A * sp * pd;
    }
  }
}
