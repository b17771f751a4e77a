/**
 * Sessions over generated temperature sweeps for the temperature-view tests:
 * a spin-½ Weiss M(T), a critical power law near Tc and a Curie–Weiss χ(T),
 * each with a deterministic wiggle standing in for noise; jobs run on the
 * main thread (jsdom has no Web Worker).
 */
import { nullTranslator } from '@jupyterlab/translation';
import type { IChartTheme } from '../../../src/charts/theme';
import { AnalysisSession } from '../../../src/core/analysis/session';
import { weissMagnetisation } from '../../../src/core/physics/weiss';
import { parseMime } from '../../../src/core/table';
import { AnalysisRunner } from '../../../src/ui/analysis-runner';
import { runSessionFit } from '../../../src/ui/fit-run';

export const trans = nullTranslator.load('jupyterlab_psiscape');

/** A fixed chart theme (jsdom has no CSS variables to read). */
export const theme = (): IChartTheme => ({ background: 'white', text: 'black', grid: 'gray', accent: 'steelblue', accent2: 'orange', font: 'sans-serif' });

/** Spin-½ Weiss M(T): Tc = 250 K, Ms = 80, σ = 0.3 given, wiggle ±0.3 (REFERENCE.md B1). */
export const WEISS = { Tc: 250, Ms: 80, sigma: 0.3 };

export function weissCsv(): string {
  const rows = ['T (K),M (emu/g),sigma_M (emu/g)'];
  const T = Array.from({ length: 60 }, (_, i) => 20 + 4 * i);
  const m = weissMagnetisation(0.5, T.map(t => t / WEISS.Tc));
  T.forEach((t, i) => rows.push(`${t},${(WEISS.Ms * m[i] + WEISS.sigma * Math.sin(7 * i)).toFixed(5)},${WEISS.sigma}`));
  return rows.join('\n');
}

/** M = A(1 − T/Tc)^β below Tc: A = 100, Tc = 300 K, β = 0.3689 (3D Heisenberg), relative wiggle 0.2 %. */
export const POWER = { A: 100, Tc: 300, beta: 0.3689 };

export function powerLawCsv(): string {
  const rows = ['T (K),M (emu/g)'];
  for (let i = 0; i < 80; i++) {
    const T = 200 + 1.25 * i;
    const M = POWER.A * Math.pow(1 - T / POWER.Tc, POWER.beta) * (1 + 0.002 * Math.sin(5 * i));
    rows.push(`${T},${M.toPrecision(10)}`);
  }
  return rows.join('\n');
}

/** χ = C/(T − θ): C = 1.5 emu K/mol, θ = 40 K, 100–300 K, relative wiggle 0.1 % (REFERENCE.md B2). */
export const CURIE = { C: 1.5, theta: 40 };

export function curieWeissCsv(): string {
  const rows = ['T (K),chi (emu/mol)'];
  for (let i = 0; i < 41; i++) {
    const T = 100 + 5 * i;
    const chi = (CURIE.C / (T - CURIE.theta)) * (1 + 0.001 * Math.sin(3 * i));
    rows.push(`${T},${chi.toPrecision(10)}`);
  }
  return rows.join('\n');
}

/** A session over `csv` with `kind` chosen. */
export function sessionFor(csv: string, kind: string): AnalysisSession {
  const session = new AnalysisSession({ id: 't1', source: { notebookPath: 'sample.ipynb', cellId: 'c', outputIndex: 0, contentHash: 'h' } });
  session.setParse(parseMime('text/csv', csv));
  session.setKind(kind);
  return session;
}

/** A runner of its own, on the main thread. */
export function mainThreadRunner(): AnalysisRunner {
  return new AnalysisRunner({ workerFactory: () => null });
}

/** Fit the session (as the Fit button does) and return its outcome. */
export async function fitted(session: AnalysisSession) {
  const runner = mainThreadRunner();
  await runSessionFit(session, runner);
  runner.dispose();
  if (!session.outcome) {
    throw new Error(`the ${session.kind} fit did not finish: ${JSON.stringify(session.run)}`);
  }
  return session.outcome;
}

/** The text of a view's alert, or null while it is hidden. */
export function alertText(node: HTMLElement): string | null {
  const e = node.querySelector<HTMLElement>('[role="alert"]');
  return e && !e.hidden ? e.textContent : null;
}

/** The polite status line of a view's task row. */
export function statusText(node: HTMLElement): string {
  return node.querySelector<HTMLElement>('.jp-psiscape-temp-status')?.textContent ?? '';
}
