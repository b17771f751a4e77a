/**
 * The user's own model y = f(x; parameters), typed as an expression. The x
 * column may be called `x` or by its own name (e.g. `T` for "T (K)").
 */
import { fitCurve } from '../../fit';
import { guessStarts, parseExpressionModel, variableNamesFromHeader } from '../../expr';
import { CoreMessageError, msg } from '../../messages';
import { AnalysisInputError } from '../errors';
import { curveOf, requirePoints, startValue, windowCaution } from './common';
import type { IAnalysisKind, ITextOption } from './types';

export const expressionOption: ITextOption = { type: 'text', label: msg('option.expression', 'y ='), default: '', placeholder: 'A*exp(-x/T0) + c' };
export const startsOption: ITextOption = { type: 'text', label: msg('option.starts', 'start values'), default: '', placeholder: 'A = 1, T0 = 100' };

/** Parses "A=1, T0=300" into start values. */
export function parseStarts(text: string): Record<string, number> {
  // No prototype: a parameter called "constructor" or "toString" is a name like any other.
  const out: Record<string, number> = Object.create(null) as Record<string, number>;
  for (const part of text.split(/[,;\n]/)) {
    const item = part.trim();
    if (!item) {
      continue;
    }
    const m = /^([\p{L}_][\p{L}\p{N}_]*)\s*=\s*(\S+)$/u.exec(item);
    const value = m ? Number(m[2].replace(/\u2212/g, '-')) : Number.NaN;
    if (!m || !Number.isFinite(value)) {
      throw new AnalysisInputError(msg('expression.bad-start', 'Cannot read the start value "%1": write name = number, e.g. T0 = 300.', item.slice(0, 40)));
    }
    out[m[1]] = value;
  }
  return out;
}

export const expressionKind = {
  id: 'expression',
  label: msg('kind.expression', 'Your expression'),
  description: msg('kind.expression.description', 'Any model in x (or the x column’s name) with free parameters.'),
  options: { expression: expressionOption, starts: startsOption },
  minPoints: () => 2,
  run: (job, pts, hooks) => {
    const text = String(job.options.expression ?? '').trim();
    if (!text) {
      throw new AnalysisInputError(msg('expression.empty', 'Write a model expression in x, e.g. A*exp(-x/T0) + c.'));
    }
    const starts = parseStarts(String(job.options.starts ?? ''));
    // The x column may be called by its own name (`T` for "T (K)"); such a name is never a parameter.
    const aliases = (job.xNames ?? []).flatMap(name => variableNamesFromHeader(name)).filter(name => name !== 'x');
    // The parser's errors are already in our words, with the position.
    const model = parseExpressionModel(text, { variables: ['x'], aliases });
    requirePoints(pts, model.parameters.length + 1, model.parameters.length);
    const unknown = Object.keys(starts).filter(k => !model.parameters.includes(k));
    if (unknown.length) {
      throw new AnalysisInputError(msg('expression.unknown-start', 'The start values name %1, which the expression does not use (its parameters: %2).', unknown.join(', '), model.parameters.join(', ')));
    }
    // Starts given with the job (e.g. "fit from here") take the place of those typed and of the guesses.
    for (const name of model.parameters) {
      const v = startValue(job, name);
      if (v !== undefined) {
        starts[name] = v;
      }
    }
    const guess = guessStarts(model, pts.x, pts.y, starts);
    if (guess.problems.length) {
      throw new CoreMessageError(guess.problems[0]);
    }
    const start = guess.start;
    const fit = fitCurve(model, { x: pts.x, y: pts.y, sigma: pts.sigma }, { start, ...hooks });
    const curve = curveOf(model, fit.values, pts.x);
    return {
      outcome: {
        equation: `y = ${model.expression}`,
        convention: msg('convention.expression', 'Your expression; parameters without a start value start from automatic guesses.'),
        fit,
        used: pts.x.length,
        curve,
        derived: [],
        cautions: [
          ...model.flags,
          ...model.notes,
          ...(guess.guessed.length
            ? [msg('caution.guessed-starts', 'Start values guessed from the data for %1; give your own if the curve misses the data.', guess.guessed.join(', '))]
            : []),
          windowCaution(),
          msg('caution.local-minimum', 'A fit from poor start values can stop in a local minimum: check the curve against the data.')
        ]
      },
      fitted: { ...pts, curve: curve.y }
    };
  },
  views: ['data-and-curve'],
  model: job => {
    const aliases = (job.xNames ?? []).flatMap(name => variableNamesFromHeader(name)).filter(name => name !== 'x');
    return { curve: parseExpressionModel(String(job.options.expression ?? '').trim(), { variables: ['x'], aliases }) };
  }
} as const satisfies IAnalysisKind<'expression'>;
