/**
 * The arrays of an isotherm report that views draw, without points a chart
 * cannot place: every drawn point has a finite value and σ (a point without
 * them is left out; the result's own message says why it has none).
 */
import type { IArrottResult, ITemperaturePoint } from './arrott';
import type { IBanerjeeEvidence } from './banerjee';
import type { IEntropyResult } from './entropy';
import type { IKouvelFisherResult, IKouvelFisherSide } from './kouvel';
import type { IIsothermLine } from './lines';
import type { IModifiedArrottResult } from './map';
import type { IValueSigma } from './types';
import type { IExponentWindowScan } from './window';

const finite = (v: IValueSigma): boolean => Number.isFinite(v.value) && Number.isFinite(v.sigma);

/** Temperature points with finite T, value and σ. */
export function drawablePoints(points: readonly ITemperaturePoint[]): ITemperaturePoint[] {
  return points.filter(p => Number.isFinite(p.T) && Number.isFinite(p.value) && Number.isFinite(p.sigma));
}

/** Lines with a finite intercept and slope (and their σ). */
export function drawableLines(lines: readonly IIsothermLine[]): IIsothermLine[] {
  return lines.filter(l => Number.isFinite(l.T) && finite(l.intercept) && finite(l.slope));
}

export function drawableArrott(a: IArrottResult): IArrottResult {
  return {
    ...a,
    lines: drawableLines(a.lines),
    spontaneousSquared: drawablePoints(a.spontaneousSquared),
    inverseChi: drawablePoints(a.inverseChi),
    banerjee: drawableBanerjee(a.banerjee)
  };
}

export function drawableBanerjee(b: IBanerjeeEvidence): IBanerjeeEvidence {
  return { ...b, isotherms: b.isotherms.filter(i => Number.isFinite(i.T) && finite(i.minLocalSlope) && Number.isFinite(i.atMSquared)) };
}

export function drawableModifiedArrott(r: IModifiedArrottResult): IModifiedArrottResult {
  return {
    ...r,
    lines: drawableLines(r.lines),
    spontaneous: drawablePoints(r.spontaneous),
    inverseChi: drawablePoints(r.inverseChi),
    history: r.history.filter(h => Number.isFinite(h.beta) && Number.isFinite(h.gamma) && Number.isFinite(h.Tc))
  };
}

function side(s: IKouvelFisherSide): IKouvelFisherSide {
  return {
    ...s,
    points: s.points.filter(p => Number.isFinite(p.T) && Number.isFinite(p.value)),
    effective: s.effective.filter(p => Number.isFinite(p.T) && Number.isFinite(p.exponent))
  };
}

export function drawableKouvelFisher(k: IKouvelFisherResult): IKouvelFisherResult {
  return { ...k, below: side(k.below), above: side(k.above) };
}

export function drawableEntropy(e: IEntropyResult): IEntropyResult {
  return {
    ...e,
    curves: e.curves.map(c => ({ ...c, points: c.points.filter(p => Number.isFinite(p.T) && Number.isFinite(p.dS) && Number.isFinite(p.sigma)) }))
  };
}

/** Cells with finite exponents, Tc, δ and critical-isotherm δ (with σ); the rest are counted, not drawn. */
export function drawableWindow(w: IExponentWindowScan): { scan: IExponentWindowScan; left: number } {
  const cells = w.cells.filter(c => finite(c.beta) && finite(c.gamma) && finite(c.Tc) && finite(c.delta) && finite(c.deltaCriticalIsotherm));
  return { scan: { ...w, cells }, left: w.cells.length - cells.length };
}
