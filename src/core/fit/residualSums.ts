/**
 * Branch-light O(n) loops of the residual evaluator: residual sums of large
 * problems and the finiteness test of a Jacobian.
 */

/** True when a[0..len) are all finite (x·0 is 0 for finite x, NaN otherwise: no branch per element). */
export function allFinite(a: Float64Array, len: number): boolean {
  let s0 = 0;
  let s1 = 0;
  let i = 0;
  for (; i + 1 < len; i += 2) {
    s0 += a[i] * 0;
    s1 += a[i + 1] * 0;
  }
  if (i < len) {
    s0 += a[i] * 0;
  }
  return s0 + s1 === 0;
}

/**
 * Large problems: r = w(f − y) into `r`, Σr² into out[0] and Σ(w(|f| + |y|))²
 * into out[1], with two accumulators each (even and odd points) so that the
 * additions of successive points do not wait for each other.
 */
export function residualSums(
  f: Float64Array,
  y: Float64Array,
  weights: Float64Array | null,
  r: Float64Array,
  n: number,
  out: Float64Array
): void {
  let s0 = 0;
  let s1 = 0;
  let e0 = 0;
  let e1 = 0;
  let i = 0;
  if (weights) {
    for (; i + 1 < n; i += 2) {
      const w0 = weights[i];
      const w1 = weights[i + 1];
      const r0 = (f[i] - y[i]) * w0;
      const r1 = (f[i + 1] - y[i + 1]) * w1;
      r[i] = r0;
      r[i + 1] = r1;
      s0 += r0 * r0;
      s1 += r1 * r1;
      const a0 = (Math.abs(f[i]) + Math.abs(y[i])) * w0;
      const a1 = (Math.abs(f[i + 1]) + Math.abs(y[i + 1])) * w1;
      e0 += a0 * a0;
      e1 += a1 * a1;
    }
  } else {
    for (; i + 1 < n; i += 2) {
      const f0 = f[i];
      const f1 = f[i + 1];
      const y0 = y[i];
      const y1 = y[i + 1];
      const r0 = f0 - y0;
      const r1 = f1 - y1;
      r[i] = r0;
      r[i + 1] = r1;
      s0 += r0 * r0;
      s1 += r1 * r1;
      const a0 = Math.abs(f0) + Math.abs(y0);
      const a1 = Math.abs(f1) + Math.abs(y1);
      e0 += a0 * a0;
      e1 += a1 * a1;
    }
  }
  for (; i < n; i++) {
    const w = weights ? weights[i] : 1;
    const ri = (f[i] - y[i]) * w;
    r[i] = ri;
    s0 += ri * ri;
    const a = (Math.abs(f[i]) + Math.abs(y[i])) * w;
    e0 += a * a;
  }
  out[0] = s0 + s1;
  out[1] = e0 + e1;
}
