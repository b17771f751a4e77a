/**
 * Phase diagram in the (T, h) plane of the 2-4-6 free energy with a field
 * term (convention L, no cubic term):
 *   F(ψ; T, h) = (a/2)(T − T0)ψ² + (b/4)ψ⁴ + (c/6)ψ⁶ − hψ
 *
 * - Limits of metastability (spinodals, F′ = F″ = 0), in closed parametric
 *   form: from F″ = 0, a(T − T0) = −3bψ² − 5cψ⁴, and then from F′ = 0,
 *   h = −2bψ³ − 4cψ⁵ (ψ ≥ 0 gives h ≥ 0 near the cusp; −ψ the mirror image).
 * - The line h = 0 below the transition, where the minima +ψ and −ψ have equal F.
 * - First order (b < 0): above T1 two wings leave (T1, 0) where a small-ψ and
 *   a large-ψ minimum of the same sign have equal F; each ends at a critical
 *   end point where both minima merge (F′ = F″ = F‴ = 0):
 *   ψ² = 3|b|/(10c), T = T0 + 9b²/(20ac), h = (6/25)(b²/c)ψ.
 * - Second order (b ≥ 0): the line h = 0 ends at the critical point Tc = T0.
 */
import { msg } from '../../messages';
import { PhysicsInputError, requireFinite } from '../errors';
import type { ILandauCoefficients } from './conventions';
import { validateLandau } from './conventions';
import { landauF } from './free-energy';

/** What a line of the phase diagram is. */
export type PhaseLineKind =
  /** Two minima with equal F: crossing it the order parameter jumps. */
  | 'first-order'
  /** h = 0 below a continuous transition: ±ψ coexist; it ends at the critical point. */
  | 'second-order'
  /** A minimum ends here (F′ = F″ = 0). */
  | 'spinodal';

/** A special point of the phase diagram. */
export type PhasePointKind = 'critical-end' | 'critical' | 'tricritical' | 'triple';

/** A polyline in (T, h). */
export interface IPhaseLine {
  kind: PhaseLineKind;
  /** Distinguishes lines of one kind (e.g. the two wings). */
  id: string;
  T: number[];
  h: number[];
}

/** A marked point in (T, h). */
export interface IPhasePoint {
  kind: PhasePointKind;
  T: number;
  h: number;
  /** Order parameter there (the merging minima, or 0). */
  psi: number;
}

/** The phase diagram over a T window. */
export interface IPhaseDiagram {
  convention: 'L';
  regime: 'first-order' | 'second-order' | 'tricritical';
  lines: IPhaseLine[];
  points: IPhasePoint[];
  /** Transition temperature at h = 0 (T1 for first order, T0 otherwise). */
  Ttransition: number;
  /** Largest |h| on the drawn lines (a natural h range for the chart). */
  hMax: number;
}

/** Options of {@link landauPhaseDiagram}. */
export interface IPhaseDiagramOptions {
  Tmin: number;
  Tmax: number;
  /** Points per line (default 120). */
  n?: number;
}

/** Stationary-point equation h(ψ) = a(T − T0)ψ + bψ³ + cψ⁵ and its ψ-derivatives. */
function hOf(k: ILandauCoefficients, T: number, psi: number): number {
  const p2 = psi * psi;
  return psi * (k.a * (T - k.T0) + p2 * (k.b + k.c * p2));
}

/** Local minimum of F near ψ at (T, h), by Newton on F′ with a bisection guard in [lo, hi]. */
function minimumNear(k: ILandauCoefficients, T: number, h: number, lo: number, hi: number): number {
  // F′ = hOf − h is increasing on a basin between two maxima: bisection with Newton steps
  let a = lo;
  let b = hi;
  let x = 0.5 * (a + b);
  for (let it = 0; it < 80; it++) {
    const f = hOf(k, T, x) - h;
    if (f > 0) {
      b = x;
    } else {
      a = x;
    }
    const p2 = x * x;
    const d = k.a * (T - k.T0) + 3 * k.b * p2 + 5 * k.c * p2 * p2;
    let next = d > 0 ? x - f / d : Number.NaN;
    if (!(next > a && next < b)) {
      next = 0.5 * (a + b);
    }
    if (Math.abs(next - x) <= 1e-15 * Math.max(1, Math.abs(x)) || b - a <= 1e-15 * Math.max(1, Math.abs(x))) {
      return next;
    }
    x = next;
  }
  return x;
}

/**
 * The wing at temperature T (T1 < T < T_cp): the field h > 0 at which the
 * small-ψ and large-ψ minima (both ≥ 0) have equal F, with both ψ; null when
 * h(ψ) has no S-shape at T.
 */
export function wingAt(k: ILandauCoefficients, T: number): { h: number; psiLow: number; psiHigh: number } | null {
  // extrema of h(ψ) for ψ > 0: a(T−T0) + 3bψ² + 5cψ⁴ = 0
  const A = k.a * (T - k.T0);
  const disc = 9 * k.b * k.b - 20 * k.c * A;
  if (!(k.c > 0) || !(disc > 0)) {
    return null;
  }
  const u1 = (-3 * k.b - Math.sqrt(disc)) / (10 * k.c);
  const u2 = (-3 * k.b + Math.sqrt(disc)) / (10 * k.c);
  if (!(u1 > 0) || !(u2 > u1)) {
    return null;
  }
  const pMax = Math.sqrt(u1); // local maximum of h(ψ): end of the small-ψ branch
  const pMin = Math.sqrt(u2); // local minimum of h(ψ): end of the large-ψ branch
  const hTop = hOf(k, T, pMax);
  const hBottom = hOf(k, T, pMin);
  if (!(hTop > hBottom)) {
    return null;
  }
  const big = Math.max(2 * pMin, 1) * 4;
  // the small-ψ branch is where h(ψ) rises between −ψmax and ψmax (h(ψ) is odd); the large one beyond ψmin
  // ΔF(h) = F(large) − F(small) decreases with h (dΔF/dh = −(ψhigh − ψlow) < 0)
  const deltaF = (h: number): { dF: number; lo: number; hi: number } => {
    const lo = minimumNear(k, T, h, -pMax, pMax);
    const hi = minimumNear(k, T, h, pMin, big);
    return { dF: landauF(k, T, h, hi) - landauF(k, T, h, lo), lo, hi };
  };
  let a = Math.max(hBottom, -Infinity);
  let b = hTop;
  let h = 0.5 * (a + b);
  let r = deltaF(h);
  for (let it = 0; it < 100; it++) {
    if (r.dF > 0) {
      a = h;
    } else {
      b = h;
    }
    // Newton: d(ΔF)/dh = −(ψhigh − ψlow)
    let next = h + r.dF / (r.hi - r.lo);
    if (!(next > a && next < b)) {
      next = 0.5 * (a + b);
    }
    if (Math.abs(next - h) <= 1e-14 * Math.max(Math.abs(h), 1e-300) || b - a <= 1e-15 * Math.max(Math.abs(h), 1e-300)) {
      h = next;
      r = deltaF(h);
      break;
    }
    h = next;
    r = deltaF(h);
  }
  return { h, psiLow: r.lo, psiHigh: r.hi };
}

/** Closed forms at h = 0 and of the critical end point (b < 0, c > 0). */
export function phaseDiagramClosedForms(k: ILandauCoefficients): { T1: number; Tsuperheat: number; Tcp: number; psiCp: number; hCp: number } {
  const T1 = k.T0 + (3 * k.b * k.b) / (16 * k.a * k.c);
  const Tsuperheat = k.T0 + (k.b * k.b) / (4 * k.a * k.c);
  const psiCp = Math.sqrt((3 * Math.abs(k.b)) / (10 * k.c));
  const Tcp = k.T0 + (9 * k.b * k.b) / (20 * k.a * k.c);
  const hCp = (6 / 25) * ((k.b * k.b) / k.c) * psiCp;
  return { T1, Tsuperheat, Tcp, psiCp, hCp };
}

function clipToWindow(line: IPhaseLine, Tmin: number, Tmax: number): IPhaseLine {
  const T: number[] = [];
  const h: number[] = [];
  for (let i = 0; i < line.T.length; i++) {
    if (line.T[i] >= Tmin && line.T[i] <= Tmax && Number.isFinite(line.h[i])) {
      T.push(line.T[i]);
      h.push(line.h[i]);
    }
  }
  return { ...line, T, h };
}

/**
 * Phase diagram between Tmin and Tmax.
 *
 * @throws PhysicsInputError for invalid coefficients, a cubic term (d ≠ 0), or a bad window.
 */
export function landauPhaseDiagram(k: ILandauCoefficients, options: IPhaseDiagramOptions): IPhaseDiagram {
  validateLandau(k);
  const { Tmin, Tmax } = options;
  requireFinite('Tmin', Tmin);
  requireFinite('Tmax', Tmax);
  if (!(Tmax > Tmin)) {
    throw new PhysicsInputError(msg('physics.phase-diagram.window', 'The phase diagram needs Tmax above Tmin, but they are %1 and %2.', Tmin, Tmax));
  }
  if ((k.d ?? 0) !== 0) {
    throw new PhysicsInputError(msg('physics.phase-diagram.cubic', 'The phase diagram in (T, h) is drawn for the 2-4-6 free energy without a cubic term; set d to 0.'));
  }
  const n = Math.max(8, Math.floor(options.n ?? 120));
  const lines: IPhaseLine[] = [];
  const points: IPhasePoint[] = [];
  const first = k.b < 0 && k.c > 0;
  const regime = first ? 'first-order' : k.b === 0 ? 'tricritical' : 'second-order';
  let Ttr = k.T0;
  let hMax = 0;

  // Spinodals, parametric in ψ ≥ 0: T(ψ) = T0 − (3bψ² + 5cψ⁴)/a, h(ψ) = −2bψ³ − 4cψ⁵.
  // ψ runs until T(ψ) leaves the window below Tmin (T decreases for large ψ when c > 0 or b > 0).
  const spinT = (p: number): number => k.T0 - (3 * k.b * p * p + 5 * k.c * p ** 4) / k.a;
  const spinH = (p: number): number => -2 * k.b * p ** 3 - 4 * k.c * p ** 5;
  let pEnd = first ? 2 * Math.sqrt((3 * Math.abs(k.b)) / (10 * k.c)) : 1;
  for (let it = 0; it < 200 && spinT(pEnd) > Tmin; it++) {
    pEnd *= 1.5;
  }
  if (first) {
    const cf = phaseDiagramClosedForms(k);
    Ttr = cf.T1;
    // two branches of the spinodal meet in a cusp at ψcp: the small-ψ end (ψ < ψcp) and the large-ψ end
    const pc = cf.psiCp;
    const small: number[] = [];
    const large: number[] = [];
    for (let i = 0; i < n; i++) {
      small.push((pc * i) / (n - 1));
    }
    for (let i = 0; i < n; i++) {
      const t = i / (n - 1);
      large.push(pc + (pEnd - pc) * t * t);
    }
    for (const [name, ps] of [
      ['small', small],
      ['large', large]
    ] as const) {
      for (const sign of [1, -1]) {
        lines.push(clipToWindow({ kind: 'spinodal', id: `spinodal-${name}-${sign > 0 ? 'up' : 'down'}`, T: ps.map(spinT), h: ps.map(p => sign * spinH(p)) }, Tmin, Tmax));
      }
    }
    // the h = 0 line below T1 (±ψ coexist)
    if (Tmin < cf.T1) {
      lines.push({ kind: 'first-order', id: 'zero-field', T: [Tmin, Math.min(cf.T1, Tmax)], h: [0, 0] });
    }
    // wings from (T1, 0) to the critical end points
    const wT: number[] = [cf.T1];
    const wH: number[] = [0];
    for (let i = 1; i < n - 1; i++) {
      const s = i / (n - 1);
      // denser near the critical end point, where h(T) bends
      const T = cf.T1 + (cf.Tcp - cf.T1) * (1 - (1 - s) * (1 - s));
      const w = wingAt(k, T);
      if (w) {
        wT.push(T);
        wH.push(w.h);
      }
    }
    wT.push(cf.Tcp);
    wH.push(cf.hCp);
    lines.push(clipToWindow({ kind: 'first-order', id: 'wing-up', T: wT, h: wH }, Tmin, Tmax));
    lines.push(clipToWindow({ kind: 'first-order', id: 'wing-down', T: wT.slice(), h: wH.map(v => -v) }, Tmin, Tmax));
    points.push({ kind: 'triple', T: cf.T1, h: 0, psi: 0 });
    points.push({ kind: 'critical-end', T: cf.Tcp, h: cf.hCp, psi: cf.psiCp });
    points.push({ kind: 'critical-end', T: cf.Tcp, h: -cf.hCp, psi: -cf.psiCp });
  } else {
    // b ≥ 0 (or c = 0 with b > 0): the spinodal of the ordered minima, ψ from 0 up
    const ps: number[] = [];
    for (let i = 0; i < n; i++) {
      const t = i / (n - 1);
      ps.push(pEnd * t * t);
    }
    for (const sign of [1, -1]) {
      lines.push(clipToWindow({ kind: 'spinodal', id: `spinodal-${sign > 0 ? 'up' : 'down'}`, T: ps.map(spinT), h: ps.map(p => sign * spinH(p)) }, Tmin, Tmax));
    }
    if (Tmin < k.T0) {
      lines.push({ kind: 'second-order', id: 'zero-field', T: [Tmin, Math.min(k.T0, Tmax)], h: [0, 0] });
    }
    points.push({ kind: k.b === 0 ? 'tricritical' : 'critical', T: k.T0, h: 0, psi: 0 });
  }
  const shown = lines.filter(l => l.T.length > 1);
  for (const l of shown) {
    for (const v of l.h) {
      hMax = Math.max(hMax, Math.abs(v));
    }
  }
  return {
    convention: 'L',
    regime,
    lines: shown,
    points: points.filter(p => p.T >= Tmin && p.T <= Tmax),
    Ttransition: Ttr,
    hMax: hMax > 0 ? hMax : 1
  };
}
