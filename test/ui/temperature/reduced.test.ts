/**
 * The reduced plot (real Lumino widget in jsdom): after a Weiss fit of a
 * spin-½ M(T) the points, reduced by the fitted Tc and Ms, lie on the
 * spin-½ mean-field curve; the default curves are mean field J = ½, the 2D
 * Ising curve and the 3D class nearest the fitted β; each curve has a
 * check box and a cited source; a power-law fit is reduced by Tc and A;
 * a fit without a Tc is refused in words.
 */
import { Widget } from '@lumino/widgets';
import { afterEach, describe, expect, it } from 'vitest';
import { weissMagnetisation } from '../../../src/core/physics/weiss';
import { ReducedPlotView } from '../../../src/ui/temperature';
import { reducePoints } from '../../../src/ui/temperature/reduced';
import { curieWeissCsv, fitted, POWER, powerLawCsv, sessionFor, theme, trans, WEISS, weissCsv } from './helpers';

function open(csv: string, kind: string) {
  const session = sessionFor(csv, kind);
  const view = new ReducedPlotView({ trans, session, theme });
  Widget.attach(view, document.body);
  return { session, view };
}

const boxes = (view: ReducedPlotView) => [...view.node.querySelectorAll<HTMLInputElement>('input.jp-psiscape-reduced-curve')];

describe('ReducedPlotView', () => {
  afterEach(() => {
    document.body.innerHTML = '';
  });

  it('should put spin-½ Weiss data on the J = ½ mean-field curve', async () => {
    const { session, view } = open(weissCsv(), 'weiss');
    await view.update(await fitted(session));
    const r = view.reduction!;
    // Generated with Tc = 250 K and Ms = 80 (REFERENCE.md B1); the fit recovers them within 0.5 %.
    expect(Math.abs(r.Tc - WEISS.Tc) / WEISS.Tc).toBeLessThan(0.005);
    expect(Math.abs(r.M0 - WEISS.Ms) / WEISS.Ms).toBeLessThan(0.005);
    expect(r.names).toEqual({ Tc: 'Tc', M0: 'Ms' });
    const p = session.plotted()!;
    const points = reducePoints(p.x.column.values as Float64Array, p.y.column.values as Float64Array, r);
    // Spin ½: m = tanh(m/τ) (REFERENCE.md B1). The wiggle is ±0.3 of Ms = 80, i.e. ±0.004 in m; with the
    // fitted Tc and Ms off by < 0.5 %, each reduced point is within 0.02 of the curve (0.05 where it falls steeply near Tc).
    const m = weissMagnetisation(0.5, points.tau);
    points.tau.forEach((tau, i) => {
      expect(Math.abs(points.m[i] - m[i]), `τ = ${tau}`).toBeLessThan(tau < 0.95 ? 0.02 : 0.05);
    });
    expect(view.chart.spec).not.toBeNull();
    expect(JSON.stringify(view.chart.spec)).not.toMatch(/NaN/);
    expect(view.chart.node.querySelector('svg, canvas')).not.toBeNull();
    expect(view.node.querySelector('.jp-psiscape-reduced-status')!.textContent).toMatch(/Reduced by Tc = 2\d\d(\.\d+)? and Ms = [78]\d/);
  });

  it('should show mean field J = ½, 2D Ising and the nearest 3D class at first, each with a check box and a source', async () => {
    const { session, view } = open(weissCsv(), 'weiss');
    await view.update(await fitted(session));
    // A mean-field fit assumes β = ½; of 3D Ising 0.326, XY 0.349 and Heisenberg 0.369 (REFERENCES.md C2) the nearest is Heisenberg.
    expect(view.shown.sort()).toEqual(['3d-heisenberg', 'ising-2d', 'weiss-0.5']);
    for (const box of boxes(view)) {
      expect(box.closest('label')!.textContent!.length).toBeGreaterThan(5);
      expect(box.closest('label')!.querySelector('sup')!.textContent).toMatch(/^\[\d+\]$/);
    }
    const notes = [...view.node.querySelectorAll('.jp-psiscape-reduced-citations li')].map(li => li.textContent).join('\n');
    expect(notes).toMatch(/Onsager/);
    expect(notes).toMatch(/Weiss/);
    expect(notes).toMatch(/Campostrini/);
    const before = JSON.stringify(view.chart.spec);
    const spin1 = boxes(view).find(b => b.dataset.curve === 'weiss-1')!;
    spin1.click();
    await view.rendered;
    expect(view.shown).toContain('weiss-1');
    expect(JSON.stringify(view.chart.spec)).not.toBe(before);
    await view.setCurve('ising-2d', false);
    expect(view.shown).not.toContain('ising-2d');
    // A new outcome keeps the user's choice of curves.
    await view.update(session.outcome);
    expect(view.shown.sort()).toEqual(['3d-heisenberg', 'weiss-0.5', 'weiss-1']);
  });

  it('should reduce a power-law fit by Tc and A and default to the 3D class nearest its β', async () => {
    const { session, view } = open(powerLawCsv(), 'power-law');
    await view.update(await fitted(session));
    const r = view.reduction!;
    // Generated with A = 100, Tc = 300 K, β = 0.3689 (3D Heisenberg, REFERENCES.md C2).
    expect(r.names).toEqual({ Tc: 'Tc', M0: 'A' });
    expect(Math.abs(r.Tc - POWER.Tc)).toBeLessThan(0.5);
    expect(Math.abs(r.beta - POWER.beta)).toBeLessThan(0.02);
    expect(view.shown).toContain('3d-heisenberg');
    expect(view.shown).not.toContain('3d-ising');
  });

  it('should reduce a Landau fit by its transition temperature and ψ at T = 0', async () => {
    // F = (a/2)(T − T0)ψ² + (b/4)ψ⁴ (REFERENCES.md B3) orders as ψ² = a(T0 − T)/b: with T0 = 300 K and
    // b/a = 300 K, ψ(0) = √(T0·a/b) = 1 and the transition is continuous at T0.
    const rows = ['T (K),psi'];
    for (let T = 10; T <= 330; T += 8) {
      rows.push(`${T},${T < 300 ? Math.sqrt((300 - T) / 300).toPrecision(12) : 0}`);
    }
    const { session, view } = open(rows.join('\n'), 'landau');
    await view.update(await fitted(session));
    const r = view.reduction!;
    expect(r.Tc).toBeCloseTo(300, 6);
    expect(r.M0).toBeCloseTo(1, 6);
    expect(view.shown).toContain('weiss-0.5');
  });

  it('should say in words when a fit gives no Tc and scale', async () => {
    const { session, view } = open(curieWeissCsv(), 'curie-weiss');
    await view.update(await fitted(session));
    expect(view.reduction).toBeNull();
    expect(view.node.querySelector('.jp-psiscape-reduced-status')!.textContent).toMatch(/no Tc and saturation scale/);
    expect(view.chart.isHidden).toBe(true);
    await view.update(null);
    expect(view.node.querySelector('.jp-psiscape-reduced-status')!.textContent).toMatch(/Fit the data first/);
  });
});
