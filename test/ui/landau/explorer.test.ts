/**
 * The Landau explorer as a real Lumino widget in jsdom: default first-order
 * example, redraws from the T slider, conventions, derived values and the
 * handling of bad input.
 */
import { afterEach, describe, expect, it, vi } from 'vitest';
import { landauEquilibrium } from '../../../src/core/physics/landau/index';
import { ChartView } from '../../../src/ui/chart-view';
import { PatchableChartView } from '../../../src/ui/landau/patchable-view';
import { derivedCell, explorer, message, numberField, range, slide, stationaryMarks, type } from './helpers';

describe('LandauExplorer', () => {
  afterEach(() => {
    vi.restoreAllMocks();
    document.body.innerHTML = '';
  });

  it('should start on the first-order example with T1 = 100.375 and T** = 100.5', async () => {
    const w = explorer();
    await w.rendered;
    // REFERENCE.md C5 first-order example a = 0.5, b = −2, c = 4, T0 = 100 [computed here: closed forms in mpmath and brute-force scipy numerics]
    expect(derivedCell(w, 'T1')).toBe('100.375');
    expect(derivedCell(w, 'Tsuperheat')).toBe('100.5');
    expect(derivedCell(w, 'order')).toBe('first order');
    expect(w.derived!.T1).toBeCloseTo(100.375, 12);
    expect(w.derived!.Tsuperheat).toBeCloseTo(100.5, 12);
    // C5: latent heat 9.41015625, barrier F_b = 0.005208333333 at ψ_b = 0.3535533906, jump ψ1 = 0.612372435695795
    expect(w.derived!.latentHeat).toBeCloseTo(9.41015625, 10);
    expect(w.derived!.barrierHeight).toBeCloseTo(0.005208333333, 11);
    expect(derivedCell(w, 'psiJump')).toBe('0.612372');
    expect(derivedCell(w, 'specificHeatJump')).toBe('—');
    expect(w.node.querySelector('table.jp-psiscape-landau-derived caption')!.textContent).toMatch(/convention L/);
    // the landscape opens at T1, h = 0: three coexisting minima and two maxima
    expect(w.state).toEqual({ T: 100.375, h: 0 });
    expect(stationaryMarks(w)).toBe(5);
    expect(numberField(w, 'a').value).toBe('0.5');
    expect(numberField(w, 'b').value).toBe('-2');
    expect(message(w)).toBe('');
  });

  it('should redraw when the T slider moves, with other stationary points', async () => {
    const w = explorer();
    await w.rendered;
    const before = w.redraws;
    const landscape = w.node.querySelector('.jp-psiscape-landau-landscape')!;
    expect(landscape.getAttribute('aria-label')).toMatch(/5 stationary points/);
    slide(w, 'T', 101.4); // above T** = 100.5 (C5): only ψ = 0 remains
    await w.rendered;
    expect(w.redraws).toBe(before + 1);
    expect(w.state.T).toBe(101.4);
    expect(stationaryMarks(w)).toBe(1);
    expect(landscape.getAttribute('aria-label')).toMatch(/T = 101\.4.*1 stationary point$/);
    slide(w, 'T', 99.5); // below T0: ordered minima ±ψ and the maximum at 0
    await w.rendered;
    expect(stationaryMarks(w)).toBe(3);
  });

  it('should redraw at most once per animation frame', async () => {
    const w = explorer();
    await w.rendered;
    const render = vi.spyOn(ChartView.prototype, 'render');
    const patch = vi.spyOn(PatchableChartView.prototype, 'patch');
    const patchMany = vi.spyOn(PatchableChartView.prototype, 'patchMany');
    const before = w.redraws;
    for (const T of [99.2, 99.4, 99.6, 99.8, 100.1]) {
      slide(w, 'T', T);
    }
    await w.rendered;
    expect(w.redraws).toBe(before + 1);
    // T alone moved: the landscape's rows replaced in place, and the current-T rule of the branches chart moved in place; no new spec
    expect(render).not.toHaveBeenCalled();
    expect(patch).toHaveBeenCalledTimes(1);
    expect(patch.mock.calls[0][0]).toBe('current');
    // patch goes through patchMany: the landscape's datasets once, and the branches' current-T rule alone
    expect(patchMany).toHaveBeenCalledTimes(2);
    expect(patchMany.mock.calls.filter(c => Object.keys(c[0]).join() === 'current').length).toBe(1);
    expect(w.state.T).toBe(100.1);
    const labels = [...w.node.querySelectorAll('.jp-psiscape-landau-branches svg text')].map(t => t.textContent);
    expect(labels).toContain('T = 100.1');
    expect(labels).not.toContain('T = 100.375');
  });

  it('should update both charts in place, on axes that stay put, when a coefficient changes', async () => {
    const w = explorer();
    await w.rendered;
    const axes = w.axes;
    const render = vi.spyOn(ChartView.prototype, 'render');
    const patchMany = vi.spyOn(PatchableChartView.prototype, 'patchMany');
    slide(w, 'b', -1.5);
    await w.rendered;
    expect(render).not.toHaveBeenCalled();
    expect(patchMany).toHaveBeenCalledTimes(2);
    expect(w.axes).toEqual(axes);
    // T1 = T0 + 3b²/(16ac) = 100 + 6.75/32 (REFERENCE.md B3 ii, by hand)
    expect(w.derived!.T1).toBeCloseTo(100 + 6.75 / 32, 12);
  });

  it('should show the second-order example with "—" where a quantity does not apply', async () => {
    const w = explorer({ a: 0.5, b: 2, c: 0, T0: 100 });
    await w.rendered;
    // REFERENCE.md C5 second order a = 0.5, b = 2, c = 0, T0 = 100 [computed here: closed forms of B3]: ΔC = T0 a²/(2b) = 6.25
    expect(derivedCell(w, 'order')).toBe('second order');
    expect(derivedCell(w, 'T1')).toBe('100');
    expect(derivedCell(w, 'specificHeatJump')).toBe('6.25');
    for (const key of ['Tsuperheat', 'psiJump', 'latentHeat', 'barrier', 'criticalEndPoint']) {
      expect(derivedCell(w, key)).toBe('—');
    }
  });

  it('should open fit coefficients with setCoefficients and keep T and h when given', async () => {
    const w = explorer();
    await w.rendered;
    await w.setCoefficients({ a: 0.5, b: 0, c: 4, T0: 100 }, { T: 99, h: 0.01 });
    expect(derivedCell(w, 'order')).toBe('tricritical (b = 0)');
    expect(derivedCell(w, 'specificHeatJump')).toBe('∞');
    expect(w.state).toEqual({ T: 99, h: 0.01 });
    expect(numberField(w, 'h').value).toBe('0.01');
    expect(w.coefficients).toEqual({ a: 0.5, b: 0, c: 4, T0: 100, d: 0 });
  });

  it('should find the transition numerically with a cubic term and say so', async () => {
    const w = explorer();
    await w.rendered;
    type(w, 'd', '0.3');
    await w.rendered;
    expect(w.derived!.method).toBe('numeric');
    expect(w.derived!.regime).toBe('first-order');
    expect(w.derived!.T1).toBeGreaterThan(100.375); // a cubic term favours the ordered state (F lower at one sign of ψ)
    expect(w.derived!.T1).toBeLessThan(w.derived!.Tsuperheat!);
    expect(w.node.querySelector('table.jp-psiscape-landau-derived caption')!.textContent).toMatch(/numerically/);
    expect(message(w)).toBe('');
  });

  it('should name equal minima and say which field the temperature markers belong to', async () => {
    const w = explorer();
    await w.rendered;
    const texts = (cls: string) => [...w.node.querySelectorAll(`.${cls} svg text`)].map(t => t.textContent);
    // at T1 and h = 0 the three minima have equal F (B3 ii)
    expect(texts('jp-psiscape-landau-landscape')).toContain('global minimum (one of 3 equal minima)');
    expect(texts('jp-psiscape-landau-branches')).toContain('Order parameter against temperature at h = 0');
    await w.setCoefficients({ a: 0.5, b: -2, c: 4, T0: 100 }, { T: 99.5, h: 0.05 });
    expect(texts('jp-psiscape-landau-landscape')).toContain('global minimum');
    expect(texts('jp-psiscape-landau-branches')).toContain('Order parameter against temperature at h = 0.05 (T0, T1, T** of h = 0 marked)');
    const eq = landauEquilibrium({ a: 0.5, b: -2, c: 4, T0: 100 }, 99.5, 0.05);
    const fmt = (v: number) => String(Number(v.toPrecision(6))).replace('-', '−');
    expect(w.node.querySelector('.jp-psiscape-landau-state')!.textContent).toBe(`Equilibrium at T = 99.5, h = 0.05: ψ = ${fmt(eq.psi)}, F − F0 = ${fmt(eq.F)}; 3 stationary points.`);
    expect(eq.psi).toBeGreaterThan(0);
  });

  it('should take T and h from the constructor options', async () => {
    const w = explorer({ a: 0.5, b: -2, c: 4, T0: 100, T: 101, h: -0.02 });
    await w.rendered;
    expect(w.state).toEqual({ T: 101, h: -0.02 });
    expect(numberField(w, 'T').value).toBe('101');
    expect(numberField(w, 'h').value).toBe('-0.02');
    // above T** = 100.5 (C5) with a small negative field: one minimum, at ψ < 0
    expect(stationaryMarks(w)).toBe(1);
  });

  it('should settle a pending redraw when disposed', async () => {
    const w = explorer();
    const pending = w.rendered;
    w.dispose();
    await pending;
    expect(w.isDisposed).toBe(true);
    expect(w.derived).toBeNull();
  });

  it('should label both inputs of each pair and group them', () => {
    const w = explorer();
    const r = range(w, 'T');
    const n = numberField(w, 'T');
    const labelId = r.getAttribute('aria-labelledby')!;
    expect(n.getAttribute('aria-labelledby')).toBe(labelId);
    expect(document.getElementById(labelId)!.textContent).toBe('T');
    expect(document.getElementById(r.getAttribute('aria-describedby')!)!.textContent).toMatch(/temperature/);
    expect(r.closest('[role="group"]')).not.toBeNull();
    expect(w.node.getAttribute('role')).toBe('region');
  });
});

describe('LandauExplorer theme', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    document.body.removeAttribute('style');
  });

  it('should take new theme colours on redraw()', async () => {
    const w = explorer();
    await w.rendered;
    const fills = () => [...w.node.querySelectorAll('.jp-psiscape-landau-landscape svg .landscape_points_marks path')].map(p => p.getAttribute('fill'));
    expect(fills()).not.toContain('#123456');
    w.node.style.setProperty('--jp-brand-color1', '#123456');
    await w.redraw();
    expect(fills()).toContain('#123456');
  });
});
