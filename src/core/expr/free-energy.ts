/**
 * A free energy typed by the user, F(ψ; T, h, coefficients), read and
 * checked like fit models: the order parameter is `ψ` or `psi`, `T` and `h`
 * are the temperature and the field, every other name is a coefficient.
 * F′ and F″ in ψ are symbolic; one kernel computes all three per point.
 */
import type { MathNode } from 'mathjs';
import { msg } from '../messages';
import { BUILTIN_CONSTANTS, analyseExpression, errorAtName } from './analyse';
import { SharedTerms, collectSymbols, numberLiteral, toJavaScript } from './compile';
import { DerivativeLimitError, Differentiator } from './derivative';
import type { Kernel } from './kernelFactory';
import { generate, interpretMany } from './kernelFactory';
import { ExpressionError } from './normalize';
import { caretLines } from './syntax';

/** Names of the order parameter. */
export const ORDER_PARAMETER_NAMES: readonly string[] = ['ψ', 'psi'];

/** A compiled free energy (the shape src/core/physics/landau/typed.ts works on). */
export interface ICompiledFreeEnergy {
  readonly text: string;
  readonly coefficients: readonly string[];
  evaluate(psi: Float64Array, T: number, h: number, values: Readonly<Record<string, number>>): Float64Array;
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
export function compileFreeEnergy(text: string): ICompiledFreeEnergy {
  const analysed = analyseExpression(text, () => true);
  const node = analysed.rhsNode;
  const symbols = collectSymbols(node);
  const psiNames = ORDER_PARAMETER_NAMES.filter(n => symbols.includes(n));
  if (psiNames.length === 0) {
    throw new ExpressionError(msg('expression.free-energy.no-psi', 'The free energy does not depend on the order parameter: write it in ψ (or psi), e.g. a/2*(T - T0)*ψ^2 + b/4*ψ^4 - h*ψ.'), null);
  }
  if (psiNames.length > 1) {
    throw errorAtName(analysed.rhsLocator, 'psi', k => msg('expression.free-energy.two-psi', 'Character %1: write the order parameter one way, ψ or psi, not both.', k));
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
      throw new ExpressionError(msg('expression.free-energy.derivative', 'The free energy has no symbolic derivative in ψ here (%1); write it with the supported functions.', String(err.what)), null);
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

