/**
 * NIST StRD nonlinear regression: all 27 datasets from both starting
 * values, through hand-written models (finite-difference Jacobians) and
 * through the model text printed in each file (parsed expression,
 * symbolic Jacobian). Certified values: NIST Statistical Reference
 * Datasets, Nonlinear Regression, Information Technology Laboratory,
 * National Institute of Standards and Technology (printed in each file).
 */
import { describe, expect, it } from 'vitest';
import { fitCurve } from '../../../src/core/fit/index';
import type { IFitModel, IFitResult } from '../../../src/core/fit/index';
import { parseExpressionModel } from '../../../src/core/expr/index';
import { lre, nistDirectory, nistNames, parseNist } from './nistData';
import type { INistProblem } from './nistData';
import { handModel } from './nistModels';

const dir = nistDirectory();
if (!dir) {
  console.warn('NIST StRD files not found at ../shared/reference/nist-strd: NIST tests skipped');
}
const problems: INistProblem[] = dir ? nistNames(dir).map((n) => parseNist(`${dir}/${n}.dat`)) : [];

/**
 * Lanczos1 has a certified residual sum of squares of 1.43e-25 (residuals
 * ≈ 8e-14 on values ≈ 1). Rounding the printed data to binary64 alone moves
 * the least-squares minimum to RSS 1.429856e-25 (LRE 3.19 against the
 * certified value) — computed here: Gauss–Newton in 50-digit arithmetic
 * with mpmath 1.2.1 on the exact decimal data and on the binary64-rounded
 * data. Evaluating the model in binary64 adds noise of the same size. So no
 * binary64 program can reach RSS LRE ≥ 6 or σ LRE ≥ 4 there; the test
 * requires the parameters (LRE ≥ 6) and RSS/σ LRE ≥ 2.5 for this set only.
 */
const BINARY64_LIMITED = new Set(['Lanczos1']);

interface IScore {
  param: number;
  sd: number;
  rss: number;
}

function score(p: INistProblem, r: IFitResult): IScore {
  return {
    param: Math.min(...r.values.map((v, i) => lre(v, p.certified[i]))),
    sd: Math.min(...r.standardErrors.map((v, i) => lre(v, p.certifiedSd[i]))),
    rss: lre(r.chi2, p.certifiedRss)
  };
}

function expressionModel(p: INistProblem): { model: IFitModel; x: number[]; y: number[] } {
  const vars = p.columns.filter((c) => c !== 'y');
  const multi = vars.length > 1;
  const model = parseExpressionModel(p.modelText, {
    variables: vars,
    constants: p.constants,
    parameters: p.parameters,
    columns: multi ? Object.fromEntries(vars.map((v) => [v, p.data[v]])) : undefined
  });
  const x = multi ? p.data.y.map((_, i) => i) : p.data[vars[0]];
  return { model, x, y: model.transformResponse(p.data.y) };
}

function check(p: INistProblem, r: IFitResult): void {
  const s = score(p, r);
  const label = `${p.name}: LRE param ${s.param.toFixed(2)}, sd ${s.sd.toFixed(2)}, rss ${s.rss.toFixed(2)} (${r.reason})`;
  expect(r.converged, label).toBe(true);
  expect(s.param, label).toBeGreaterThanOrEqual(6);
  if (BINARY64_LIMITED.has(p.name)) {
    expect(s.sd, label).toBeGreaterThanOrEqual(2.5);
    expect(s.rss, label).toBeGreaterThanOrEqual(2.5);
  } else {
    expect(s.sd, label).toBeGreaterThanOrEqual(4);
    expect(s.rss, label).toBeGreaterThanOrEqual(6);
  }
}

const suite = dir ? describe : describe.skip;

suite('NIST StRD nonlinear regression', () => {
  it('finds all 27 datasets', () => {
    expect(problems.length).toBe(27);
  });

  for (const via of ['hand-written model', 'parsed model text'] as const) {
    describe(via, () => {
      for (const p of problems) {
        for (const start of [1, 2] as const) {
          it(`${p.name} from start ${start}`, () => {
            const { model, x, y } = via === 'hand-written model' ? handModel(p) : expressionModel(p);
            const r = fitCurve(model, { x, y }, { start: start === 1 ? p.start1 : p.start2 });
            check(p, r);
          });
        }
      }
    });
  }

  it('parses every printed model and identifies b1…bk as its parameters', () => {
    for (const p of problems) {
      const vars = p.columns.filter((c) => c !== 'y');
      const m = parseExpressionModel(p.modelText, {
        variables: vars,
        constants: p.constants,
        columns: vars.length > 1 ? Object.fromEntries(vars.map((v) => [v, p.data[v]])) : undefined
      });
      expect([...m.parameters].sort(), p.name).toEqual([...p.parameters].sort());
      expect(m.derivatives, p.name).not.toBeNull();
    }
  });

  it('never reports convergence while wrong when the iteration budget is too small', () => {
    for (const p of problems) {
      const { model, x, y } = handModel(p);
      const r = fitCurve(model, { x, y }, { start: p.start1, maxEvaluations: 12 });
      const s = score(p, r);
      if (r.converged) {
        expect(s.param, p.name).toBeGreaterThanOrEqual(6);
      } else {
        expect(r.reason, p.name).toMatch(/maximum number of evaluations/);
      }
    }
  });
});
