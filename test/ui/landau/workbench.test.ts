/**
 * The landscape workbench in real Lumino widgets: chart tabs with arrow
 * keys, axes that stay put until "Fit the view", the data overlay from a fit,
 * presets, a typed free energy with generated sliders and errors with a
 * caret, the phase diagram and the two-order-parameter landscape drawn, and
 * the scenario round trip.
 */
import { nullTranslator } from '@jupyterlab/translation';
import { Widget } from '@lumino/widgets';
import { afterEach, describe, expect, it } from 'vitest';
import { LandauExplorer } from '../../../src/ui/landau/explorer';
import { explorer, slide } from './helpers';

afterEach(() => {
  document.body.innerHTML = '';
});

function tab(w: Widget, view: string): HTMLButtonElement {
  return w.node.querySelector<HTMLButtonElement>(`.jp-psiscape-landau-tab[data-view="${view}"]`)!;
}

describe('landscape workbench', () => {
  it('should move between chart tabs with the arrow keys and draw the phase diagram and the 2-D landscape', async () => {
    const w = explorer();
    await w.rendered;
    expect(tab(w, 'landscape').getAttribute('aria-selected')).toBe('true');
    tab(w, 'landscape').dispatchEvent(new KeyboardEvent('keydown', { key: 'ArrowRight', bubbles: true }));
    expect(w.view).toBe('phase-diagram');
    await w.rendered;
    const phase = w.node.querySelector('.jp-psiscape-landau-phase-diagram')!;
    expect(phase.querySelector('svg')).not.toBeNull();
    expect(phase.getAttribute('aria-label')).toMatch(/Phase diagram/);
    tab(w, 'phase-diagram').dispatchEvent(new KeyboardEvent('keydown', { key: 'End', bubbles: true }));
    expect(w.view).toBe('loop');
    tab(w, 'loop').dispatchEvent(new KeyboardEvent('keydown', { key: 'ArrowLeft', bubbles: true }));
    expect(w.view).toBe('landscape-2d');
    await w.rendered;
    const grid = w.node.querySelector<HTMLElement>('.jp-psiscape-landau-landscape-2d')!;
    expect(grid.querySelector('svg, canvas')).not.toBeNull();
    // T1 = 100.375 of the default: ψ orders below 100, φ below 90, so neither orders here
    expect(grid.dataset.phase).toBe('disordered');
    expect(w.scenario().view).toBe('landscape-2d');
  });

  it('should keep the axes while sliders move and fit them again on request', async () => {
    const w = explorer();
    await w.rendered;
    const axes = w.axes!;
    slide(w, 'T', 99);
    slide(w, 'c', 6);
    await w.rendered;
    expect(w.axes).toEqual(axes);
    const fit = w.node.querySelector<HTMLButtonElement>('.jp-psiscape-landau-fit-view')!;
    fit.click();
    await w.rendered;
    expect(w.axes).not.toEqual(axes);
  });

  it('should draw the data and the fitted curve of a fit over the branches', async () => {
    const data = [
      { T: 96, psi: 1.0 },
      { T: 99, psi: 0.8 }
    ];
    const fitted = [
      { T: 95, psi: 1.05 },
      { T: 100, psi: 0.7 }
    ];
    const w = new LandauExplorer({ trans: nullTranslator.load('x'), overlay: { data, fitted } });
    Widget.attach(w, document.body);
    await w.rendered;
    const markup = w.node.querySelector('.jp-psiscape-landau-branches')!.innerHTML;
    expect(markup).toContain('branches_data');
    expect(markup).toContain('branches_fit');
    // the T axis reaches the data
    expect(w.axes!.T[0]).toBeLessThanOrEqual(95);
    // the overlay is part of the scenario, and a scenario brings it back
    expect(w.scenario().overlay).toEqual({ data, fitted });
    const again = explorer();
    await again.rendered;
    expect(again.overlay).toBeNull();
    await again.setScenario(w.scenario());
    await again.rendered;
    expect(again.overlay).toEqual({ data, fitted });
    expect(again.node.querySelector('.jp-psiscape-landau-branches')!.innerHTML).toContain('branches_data');
  });

  it('should set the free energy and its sliders from a preset', async () => {
    const w = explorer();
    await w.rendered;
    const select = w.node.querySelector<HTMLSelectElement>('select.jp-psiscape-landau-preset')!;
    select.value = 'de-gennes';
    select.dispatchEvent(new Event('change'));
    await w.rendered;
    // Landau–de Gennes a = 0.1, B = 1, C = 2, T* = 300 [C5]: T_NI = 301.1111111111
    expect(w.coefficients).toEqual({ a: 0.1, T0: 300, b: 2, c: 0, d: -1 });
    expect(w.derived!.T1).toBeCloseTo(301.1111111111, 6);
    // with its cubic term the phase diagram comes from the free energy on a grid
    w.selectView('phase-diagram');
    await w.rendered;
    const phase = w.node.querySelector<HTMLElement>('.jp-psiscape-landau-phase-diagram')!;
    expect(phase.hidden).toBe(false);
    expect(phase.getAttribute('aria-label')).toMatch(/special points/);
    await w.applyPreset('bean-rodbell', { eta: 2, T0: 300 });
    await w.rendered;
    expect(w.view).toBe('landscape');
    expect(w.node.querySelector('input.jp-psiscape-landau-range[data-key="eta"]')).not.toBeNull();
    // η = 2 > 1: first order
    expect(w.derived!.regime).toBe('first-order');
    await w.applyPreset('devonshire');
    await w.rendered;
    expect(w.view).toBe('loop');
    expect(w.convention).toBe('devonshire');
    expect(w.node.querySelector('.jp-psiscape-landau-loop svg')).not.toBeNull();
    expect(w.scenario().preset).toBe('devonshire');
  });

  it('should take a typed free energy with one slider per coefficient, and say what is wrong with a caret', async () => {
    const w = explorer();
    await w.rendered;
    expect(await w.setTypedFreeEnergy('a/2*(T - T0)*ψ^2 + b/4*ψ^4 + g*ψ^6 - h*ψ')).toBeNull();
    await w.rendered;
    expect(w.typed!.coefficients).toEqual(['a', 'T0', 'b', 'g']);
    expect(w.node.querySelector('input.jp-psiscape-landau-range[data-key="g"]')).not.toBeNull();
    // the Landau form's own sliders step aside while the typed one is in use; T and h stay
    expect(w.node.querySelector<HTMLElement>('.jp-psiscape-landau-coefficients')!.hidden).toBe(true);
    expect(w.node.querySelector<HTMLElement>('select.jp-psiscape-landau-convention')!.closest<HTMLElement>('label')!.hidden).toBe(true);
    expect(w.node.querySelector<HTMLElement>('.jp-psiscape-landau-state-controls')!.hidden).toBe(false);
    expect(w.node.querySelector('.jp-psiscape-landau-landscape')!.getAttribute('aria-label')).toMatch(/stationary point/);
    // the Landau form's T0, T1, T** are not marked on the typed free energy's branches
    expect(w.node.querySelector('.jp-psiscape-landau-branches')!.getAttribute('aria-label')).not.toMatch(/T\*\* marked/);
    // its phase diagram and its field loop come from the free energy itself
    w.selectView('phase-diagram');
    await w.rendered;
    const phase = w.node.querySelector<HTMLElement>('.jp-psiscape-landau-phase-diagram')!;
    expect(phase.hidden).toBe(false);
    expect(phase.getAttribute('aria-label')).toMatch(/Phase diagram in \(T, h\): [1-9]\d* lines, [1-9]\d* special points/);
    expect(phase.parentElement!.querySelector('.jp-psiscape-landau-note')!.textContent).toContain('on a grid');
    w.selectView('loop');
    await w.rendered;
    const loop = w.node.querySelector<HTMLElement>('.jp-psiscape-landau-loop')!;
    expect(loop.hidden).toBe(false);
    // at T1 = 100.375 the loop passes the ψ = 0 minimum between −ψ and +ψ: two jumps each way
    expect(loop.getAttribute('aria-label')).toMatch(/Field loop at T = 100\.375 with 4 jumps/);
    // a field that does not enter as −hψ: the phase diagram says why instead
    expect(await w.setTypedFreeEnergy('a/2*(T - T0)*ψ^2 + b/4*ψ^4 + g*ψ^6 - h^3*ψ')).toBeNull();
    w.selectView('phase-diagram');
    await w.rendered;
    expect(phase.hidden).toBe(true);
    expect(phase.parentElement!.querySelector('.jp-psiscape-landau-note')!.textContent).toMatch(/field enters as −h·ψ/);
    w.selectView('landscape');
    const error = await w.setTypedFreeEnergy('a*ψ^2 + (b*ψ^4');
    expect(error).toContain('^');
    const shown = w.node.querySelector<HTMLElement>('.jp-psiscape-landau-typed-error')!;
    await w.setTypedFreeEnergy(null);
    expect(w.node.querySelector<HTMLElement>('.jp-psiscape-landau-coefficients')!.hidden).toBe(false);
    expect(await w.setTypedFreeEnergy('a*ψ^2 + (b*ψ^4')).toContain('^');
    expect(shown.hidden).toBe(false);
    expect(shown.textContent).toContain('a*ψ^2 + (b*ψ^4');
  });

  it('should give back the scenario it was given (preset, typed free energy, coupled coefficients, view)', async () => {
    const w = explorer();
    await w.rendered;
    await w.setScenario({ a: 0.5, T0: 100, b: -2, c: 4, T: 100.2, h: 0, typed: { text: 'a/2*(T - T0)*psi^2 + b/4*psi^4 + c/6*psi^6 - h*psi', values: { a: 0.5, T0: 100, b: -2, c: 5 } }, coupled: { a1: 1, T1: 100, b1: 1, a2: 1, T2: 95, b2: 2, lambda: 0.3 }, view: 'branches' });
    await w.rendered;
    const s = w.scenario();
    expect(s.typed).toEqual({ text: 'a/2*(T - T0)*psi^2 + b/4*psi^4 + c/6*psi^6 - h*psi', values: { a: 0.5, T0: 100, b: -2, c: 5 } });
    expect(s.coupled).toEqual({ a1: 1, T1: 100, b1: 1, a2: 1, T2: 95, b2: 2, lambda: 0.3 });
    // "branches" was a tab of its own before: it now opens the tab that holds them
    expect(s.view).toBeUndefined();
    expect(w.view).toBe('landscape');
    await w.setScenario({ ...s, view: 'loop' });
    expect(w.scenario().view).toBe('loop');
  });

  it('should move the landscape, the branches and the 2-D landscape in place as sliders move, titles included', async () => {
    const w = explorer();
    await w.rendered;
    const landscape = w.node.querySelector<HTMLElement>('.jp-psiscape-landau-landscape')!;
    const branches = w.node.querySelector<HTMLElement>('.jp-psiscape-landau-branches')!;
    // both charts of the first tab are shown and drawn
    expect(landscape.querySelector('svg')).not.toBeNull();
    expect(branches.querySelector('svg')).not.toBeNull();
    const svgs = [landscape.querySelector('svg'), branches.querySelector('svg')];
    slide(w, 'T', 99.5);
    await w.rendered;
    slide(w, 'h', 0.05);
    await w.rendered;
    // the same drawn views took the new rows: no new chart was built
    expect(landscape.querySelector('svg')).toBe(svgs[0]);
    expect(branches.querySelector('svg')).toBe(svgs[1]);
    expect(landscape.textContent).toContain('T = 99.5');
    expect(landscape.textContent).toContain('h = 0.05');
    expect(branches.textContent).toContain('h = 0.05');
    tab(w, 'landscape').dispatchEvent(new KeyboardEvent('keydown', { key: 'End', bubbles: true }));
    tab(w, 'loop').dispatchEvent(new KeyboardEvent('keydown', { key: 'ArrowLeft', bubbles: true }));
    expect(w.view).toBe('landscape-2d');
    await w.rendered;
    const grid = w.node.querySelector<HTMLElement>('.jp-psiscape-landau-landscape-2d')!;
    const axes = w.axes!.grid2d;
    expect(axes).not.toBeNull();
    const note = grid.parentElement!.querySelector('.jp-psiscape-landau-note')!;
    const before = note.textContent;
    expect(before).toBe('At T = 99.5 the stable phase has ψ only; 2 minima in view.');
    slide(w, 'T', 80);
    await w.rendered;
    // the grid keeps its extent while T moves (so a drawn view takes the rows in place: checked in Chromium,
    // as jsdom has no canvas to draw this many cells on)
    expect(w.axes!.grid2d).toEqual(axes);
    expect(w.state.T).toBeLessThan(99.5);
    expect(note.textContent).not.toBe(before);
    expect(note.textContent).toContain(`At T = ${w.state.T}`);
  });
});
