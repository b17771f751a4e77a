/**
 * A free energy typed by the user, F(ψ; T, h, coefficients), in the
 * expression language of src/core/expr (mathjs, checked and compiled the same
 * way as fit models). The order parameter is `ψ` or `psi`; `T` and `h` are
 * the temperature and the field; every other name is a coefficient. F′ and F″
 * in ψ are symbolic; stationary points are the roots of F′, bracketed on a
 * grid and polished by Newton steps (bisection where Newton leaves the
 * bracket), and classified by F″ (or by the sign change of F′ where F″ = 0).
 */
import type { MathNode } from 'mathjs';
import { msg } from '../../messages';
import { BUILTIN_CONSTANTS, analyseExpression, errorAtName } from '../../expr/analyse';
import { SharedTerms, collectSymbols, numberLiteral, toJavaScript } from '../../expr/compile';
import { DerivativeLimitError, Differentiator } from '../../expr/derivative';
import type { Kernel } from '../../expr/kernelFactory';
import { generate, interpretMany } from '../../expr/kernelFactory';
import { ExpressionError } from '../../expr/normalize';
import { caretLines } from '../../expr/syntax';
import type { ILandscapePoint } from './explorer';

/** Names with a fixed meaning in a typed free energy. */
export const TYPED_VARIABLES = { psi: ['ψ', 'psi'], T: 'T', h: 'h' } as const;

/** A compiled free energy. */
export interface ITypedFreeEnergy {
  /** The text as typed. */
  readonly text: string;
  /** Coefficient names, in order of first appearance. */
  readonly coefficients: readonly string[];
  /** F, F′ and F″ at each ψ (3 values per point, row-major). */
  evaluate(psi: Float64Array, T: number, h: number, values: Readonly<Record<string, number>>): Float64Array;
}

/** Stationary points of a typed free energy at one (T, h). */
export interface ITypedStationary {
  points: ILandscapePoint[];
  /** Index of the global minimum in `points`, or −1 when there is none. */
  global: number;
}

let functionConstructorAllowed: boolean | null = null;
function canGenerate(): boolean {
  if (functionConstructorAllowed === null) {
    try {
      functionConstructorAllowed = new Function('return 1')() === 1;
    } catch {
      functionConstructorAllowed = false;
    }
  }
  return functionConstructorAllowed;
}

function hasOwn(o: object, key: string): boolean {
  return Object.prototype.hasOwnProperty.call(o, key);
}

/**
 * Reads and compiles `text`.
 *
 * @throws ExpressionError (with the position in `text`) when it cannot be read,
 *   has no order parameter, or has no symbolic derivative in ψ.
 */
export function compileFreeEnergy(text: string): ITypedFreeEnergy {
  const analysed = analyseExpression(text, () => true);
  const node = analysed.rhsNode;
  const symbols = collectSymbols(node);
  const psiNames = TYPED_VARIABLES.psi.filter(n => symbols.includes(n));
  if (psiNames.length === 0) {
    throw new ExpressionError(msg('landau.typed.no-psi', 'The free energy does not depend on the order parameter: write it in ψ (or psi), e.g. a/2*(T - T0)*ψ^2 + b/4*ψ^4 - h*ψ.'), null);
  }
  if (psiNames.length > 1) {
    throw errorAtName(analysed.rhsLocator, 'psi', k => msg('landau.typed.two-psi', 'Character %1: write the order parameter one way, ψ or psi, not both.', k));
  }
  const psiName = psiNames[0];
  const coefficients = symbols.filter(s => s !== psiName && s !== 'T' && s !== 'h' && !hasOwn(BUILTIN_CONSTANTS, s));
  let d1: MathNode;
  let d2: MathNode;
  try {
    const diff = new Differentiator();
    d1 = diff.derivative(node, psiName);
    d2 = diff.derivative(d1, psiName);
  } catch (err) {
    if (err instanceof DerivativeLimitError) {
      throw new ExpressionError(msg('landau.typed.derivative', 'The free energy has no symbolic derivative in ψ here (%1); write it with the supported functions.', String(err.what)), null);
    }
    throw err;
  }
  const parameters = ['T', 'h', ...coefficients];
  const resolve = (name: string): string | null => {
    if (name === psiName) {
      return 'v0';
    }
    const i = parameters.indexOf(name);
    if (i >= 0) {
      return `q${i}`;
    }
    if (hasOwn(BUILTIN_CONSTANTS, name)) {
      return numberLiteral(BUILTIN_CONSTANTS[name]);
    }
    return null;
  };
  let kernel: Kernel;
  if (canGenerate()) {
    const terms = new SharedTerms();
    const js = [node, d1, d2].map(nd => toJavaScript(nd, resolve, terms));
    kernel = generate(parameters.length, 1, false, js, [null], terms.lines);
  } else {
    // checks the whitelist the same way
    toJavaScript(node, resolve);
    kernel = interpretMany([node, d1, d2], parameters, [psiName], { ...BUILTIN_CONSTANTS }, [null]);
  }
  const p = new Float64Array(parameters.length);
  return {
    text,
    coefficients,
    evaluate(psi, T, h, values) {
      p[0] = T;
      p[1] = h;
      coefficients.forEach((c, i) => {
        p[i + 2] = values[c] ?? Number.NaN;
      });
      const out = new Float64Array(psi.length * 3);
      kernel(p, psi, out);
      return out;
    }
  };
}

/** The words of an expression error with the caret line under its place, or just the words. */
export function typedErrorText(text: string, words: string, position: number | null): string {
  return position === null ? words : `${words}\n${caretLines(text, position)}`;
}

/** Options of {@link typedStationary}. */
export interface ITypedStationaryOptions {
  /** Half-width of the ψ range searched (default 10). */
  psiMax?: number;
  /** Grid intervals of the bracketing scan (default 800). */
  n?: number;
}

/**
 * Stationary points on [−ψmax, ψmax]: sign changes of F′ on a grid (and grid
 * points where F′ is exactly 0), each refined by safeguarded Newton on F′.
 * Minima (F″ > 0, or F′ going from − to +) are 'metastable' except the lowest
 * ('stable', with every minimum of equal F); maxima are 'unstable'.
 */
export function typedStationary(f: ITypedFreeEnergy, T: number, h: number, values: Readonly<Record<string, number>>, options: ITypedStationaryOptions = {}): ITypedStationary {
  const R = options.psiMax && options.psiMax > 0 ? options.psiMax : 10;
  const n = Math.max(8, Math.floor(options.n ?? 800));
  const grid = new Float64Array(n + 1);
  for (let i = 0; i <= n; i++) {
    grid[i] = -R + (2 * R * i) / n;
  }
  const g = f.evaluate(grid, T, h, values);
  const one = new Float64Array(1);
  const at = (x: number): [number, number, number] => {
    one[0] = x;
    const o = f.evaluate(one, T, h, values);
    return [o[0], o[1], o[2]];
  };
  const roots: { psi: number; rising: boolean }[] = [];
  for (let i = 0; i < n; i++) {
    const a = grid[i];
    const b = grid[i + 1];
    const fa = g[3 * i + 1];
    const fb = g[3 * (i + 1) + 1];
    if (!Number.isFinite(fa) || !Number.isFinite(fb)) {
      continue;
    }
    if (fa === 0) {
      const prev = i > 0 ? g[3 * (i - 1) + 1] : Number.NaN;
      if (i > 0 && Number.isFinite(prev) && Math.sign(prev) !== Math.sign(fb) && prev !== 0) {
        roots.push({ psi: a, rising: fb > 0 });
      }
      continue;
    }
    if (fb === 0 || Math.sign(fa) === Math.sign(fb)) {
      continue;
    }
    let lo = a;
    let hi = b;
    let flo = fa;
    let x = a - (fa * (b - a)) / (fb - fa);
    for (let it = 0; it < 60; it++) {
      const [, d, dd] = at(x);
      if (d === 0) {
        break;
      }
      if (Math.sign(d) === Math.sign(flo)) {
        lo = x;
        flo = d;
      } else {
        hi = x;
      }
      let next = dd !== 0 && Number.isFinite(dd) ? x - d / dd : Number.NaN;
      if (!(next > Math.min(lo, hi) && next < Math.max(lo, hi))) {
        next = 0.5 * (lo + hi);
      }
      if (Math.abs(next - x) <= 4e-16 * Math.max(1, Math.abs(x))) {
        x = next;
        break;
      }
      x = next;
    }
    roots.push({ psi: x, rising: fb > 0 });
  }
  const points: ILandscapePoint[] = roots.map(r => {
    const [F, , dd] = at(r.psi);
    const minimum = dd > 0 || (dd === 0 && r.rising);
    return { psi: r.psi, F, kind: minimum ? 'metastable' : dd < 0 || !r.rising ? 'unstable' : 'inflection' };
  });
  let global = -1;
  for (let i = 0; i < points.length; i++) {
    if (points[i].kind === 'metastable' && Number.isFinite(points[i].F) && (global < 0 || points[i].F < points[global].F)) {
      global = i;
    }
  }
  if (global >= 0) {
    let scale = 1e-300;
    for (const p of points) {
      if (Number.isFinite(p.F)) {
        scale = Math.max(scale, Math.abs(p.F));
      }
    }
    const Fg = points[global].F;
    for (const p of points) {
      if (p.kind === 'metastable' && Math.abs(p.F - Fg) <= 1e-9 * scale) {
        p.kind = 'stable';
      }
    }
  }
  return { points, global };
}

/** F(ψ) on `n` points of −ψmax … ψmax. */
export function typedCurve(f: ITypedFreeEnergy, T: number, h: number, values: Readonly<Record<string, number>>, psiMax: number, n = 401): { psi: number[]; F: number[] } {
  const psi = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    psi[i] = -psiMax + (2 * psiMax * i) / (n - 1);
  }
  const out = f.evaluate(psi, T, h, values);
  const F: number[] = [];
  for (let i = 0; i < n; i++) {
    F.push(out[3 * i]);
  }
  return { psi: Array.from(psi), F };
}
