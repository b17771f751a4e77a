/**
 * Which chart builder of `src/charts/temperature` each temperature-sweep
 * view calls, with what: the one place that turns a view's data into a
 * chart (spec, title and caption in English, translated by the view).
 */
import type { ISweepChart } from '../../charts/temperature';
import { buildInverseChiSpec, buildReducedSpec, buildWindowScanSpec } from '../../charts/temperature';
import type { IChartTheme } from '../../charts/theme';
import type { IAnalysisOutcome } from '../../core/analysis';
import type { IWindowScanResult } from '../../core/analysis/tasks-types';

/** A reduced series: τ = T/Tc and m = M/M0. */
export interface IReducedSeries {
  tau: number[];
  m: number[];
}

/** What the reduced plot draws: the points and every curve offered, with the ids of those shown. */
export interface IReducedView {
  points: IReducedSeries;
  curves: (IReducedSeries & { id: string; label: string })[];
  shown: string[];
}

/** Points of a temperature sweep, with σ of y when there is a σ column. */
export interface ISweepPoints {
  x: ArrayLike<number>;
  y: ArrayLike<number>;
  sigma?: ArrayLike<number>;
}

/** The window-scan chart: β ± σ against t_max, the classes' β and the suggested t_max. */
export function windowScanChart(r: IWindowScanResult, theme: IChartTheme): ISweepChart {
  return buildWindowScanSpec(
    {
      cells: r.cells.map(c => ({ tMax: c.tMax, beta: c.beta, verdict: c.converged ? c.verdict : 'not-converged' })),
      classes: r.classes.map(c => ({ id: c.id, label: c.label, beta: c.beta })),
      suggested: r.suggested.tMax,
      exponentLabel: 'β_eff'
    },
    theme
  );
}

/** The reduced plot. */
export function reducedChart(view: IReducedView, theme: IChartTheme): ISweepChart {
  return buildReducedSpec(
    {
      points: view.points.tau.map((x, i) => ({ x, y: view.points.m[i] })),
      curves: view.curves.map(c => ({ id: c.id, label: c.label, x: c.tau, y: c.m })),
      shown: view.shown
    },
    theme
  );
}

/** 1/χ against T with the fitted Curie–Weiss law and θ. */
export function inverseChiChart(outcome: IAnalysisOutcome, points: ISweepPoints, yUnit: string, theme: IChartTheme): ISweepChart {
  const i = outcome.fit.parameters.indexOf('theta');
  return buildInverseChiSpec(
    {
      T: points.x,
      chi: points.y,
      ...(points.sigma ? { sigma: points.sigma } : {}),
      curve: { x: outcome.curve.x, y: outcome.curve.y },
      ...(i >= 0 && Number.isFinite(outcome.fit.values[i]) ? { theta: outcome.fit.values[i] } : {}),
      yUnit
    },
    theme
  );
}
