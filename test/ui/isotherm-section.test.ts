/**
 * Isotherm analysis from the analysis panel (real Lumino widgets in jsdom,
 * the job run through the worker protocol on the main thread): exact spin-½
 * Weiss isotherms (REFERENCE.md B1: h = τ·artanh m − m) give the mean-field
 * answers as the primary result; every view draws; the controls and view
 * are saved and restored; bad controls and missing units are refused in
 * words; Cancel keeps what was shown.
 */
import { afterEach, describe, expect, it } from 'vitest';
import { parseMime } from '../../src/core/table';
import { weissMagnetisation } from '../../src/core/physics/weiss';
import type { AnalysisPanel } from '../../src/ui/analysis-panel';
import { ISOTHERM_VIEWS } from '../../src/ui/isotherms/view-specs';
import { panelFor } from './helpers';

/** Long-format isotherms: Tc = 300 K, h = g μB J B/(kB Tc) scaled to Oe by 1e4, M = 100 m emu/g. */
function isothermCsv(header = 'T (K),H (Oe),M (emu/g)'): string {
  const rows = [header];
  for (let i = 0; i <= 30; i++) {
    const T = 285 + i;
    const tau = T / 300;
    const ms = tau < 1 ? weissMagnetisation(0.5, [tau])[0] : 0;
    for (let k = 1; k <= 40; k++) {
      const m = ms + 0.005 + 0.2 * (k / 40);
      const h = tau * Math.atanh(m) - m;
      if (h > 0) {
        rows.push(`${T},${(h * 1e4).toPrecision(12)},${(100 * m).toPrecision(12)}`);
      }
    }
  }
  return rows.join('\n');
}

async function open(csv: string): Promise<AnalysisPanel> {
  const { panel } = panelFor(parseMime('text/csv', csv));
  await panel.rendered;
  return panel;
}

const input = (panel: AnalysisPanel, cls: string): HTMLInputElement => panel.isothermSection.node.querySelector<HTMLInputElement>(`input.${cls}`)!;
const errorText = (panel: AnalysisPanel): string | null => {
  const e = panel.isothermSection.node.querySelector<HTMLElement>('.jp-psiscape-fit-error')!;
  return e.hidden ? null : e.textContent;
};

describe('IsothermSection', () => {
  afterEach(() => {
    document.body.innerHTML = '';
  });

  it('should give Tc = 300 K and mean-field exponents as the primary result of exact Weiss isotherms', async () => {
    const panel = await open(isothermCsv());
    const section = panel.isothermSection;
    expect(section.isHidden).toBe(false);
    section.node.querySelector<HTMLButtonElement>('button.jp-psiscape-iso-run')!.click();
    await section.rendered;
    const r = section.report!;
    expect(r).not.toBeNull();
    // Mean field (REFERENCE.md B1): Tc = 300 K by construction, β = ½, γ = 1, δ = 3.
    // Tolerances 0.02 on the exponents and 1e-3 relative on Tc (common practice, no source).
    expect(Math.abs(r.primary.fit.Tc.value - 300) / 300).toBeLessThan(1e-3);
    expect(Math.abs(r.primary.fit.beta.value - 0.5)).toBeLessThan(0.02);
    expect(Math.abs(r.primary.fit.gamma.value - 1)).toBeLessThan(0.02);
    // δ = 1 + γ/β carries both errors: |dδ| ≤ |dγ|/β + γ|dβ|/β² = 0.12 at the tolerances above.
    expect(Math.abs(r.primary.fit.delta.value - 3)).toBeLessThan(0.12);
    const text = section.node.textContent!;
    expect(text).toMatch(/31 isotherms/);
    expect(text).toMatch(/applied field \(no demagnetisation correction\)/);
    expect(text).not.toMatch(/NaN/);
    expect(section.node.querySelectorAll('.jp-psiscape-isotherm-cross .jp-psiscape-agreement').length).toBeGreaterThanOrEqual(4);
    expect(section.views.chart.node.querySelectorAll('svg g.role-mark path').length).toBeGreaterThan(50);
  });

  it('should draw every view, chosen by click or with the arrow keys', async () => {
    const panel = await open(isothermCsv());
    const section = panel.isothermSection;
    await section.run();
    for (const id of ISOTHERM_VIEWS) {
      section.node.querySelector<HTMLButtonElement>(`.jp-psiscape-IsothermViews-tab[data-view="${id}"]`)!.click();
      await section.views.rendered;
      expect(section.views.selected).toBe(id);
      expect(section.views.chart.spec, id).not.toBeNull();
      expect(JSON.stringify(section.views.chart.spec), id).not.toMatch(/NaN/);
      expect(section.views.chart.node.querySelector('svg, canvas'), id).not.toBeNull();
    }
    const tab = section.node.querySelector<HTMLButtonElement>('.jp-psiscape-IsothermViews-tab[aria-selected="true"]')!;
    tab.dispatchEvent(new KeyboardEvent('keydown', { key: 'Home', bubbles: true }));
    expect(section.views.selected).toBe('arrott');
    document.activeElement!.dispatchEvent(new KeyboardEvent('keydown', { key: 'ArrowRight', bubbles: true }));
    expect(section.views.selected).toBe('modified-arrott');
    expect(document.activeElement?.getAttribute('data-view')).toBe('modified-arrott');
  });

  it('should save the controls and the view, and restore both into a new panel', async () => {
    const panel = await open(isothermCsv());
    const section = panel.isothermSection;
    input(panel, 'jp-psiscape-iso-field-min').value = '20';
    input(panel, 'jp-psiscape-iso-tmax').value = '0.05';
    input(panel, 'jp-psiscape-iso-tolerance').value = '0.4';
    await section.run();
    section.node.querySelector<HTMLButtonElement>('.jp-psiscape-IsothermViews-tab[data-view="critical"]')!.click();
    const saved = section.settings()!;
    expect(saved).toMatchObject({ fieldMin: '20', fieldMax: null, tMax: '0.05', temperatureToleranceK: '0.4', view: 'critical', demagnetisingConvention: 'SI' });
    const other = await open(isothermCsv());
    await other.isothermSection.restore(saved);
    await other.isothermSection.rendered;
    expect(input(other, 'jp-psiscape-iso-field-min').value).toBe('20');
    expect(input(other, 'jp-psiscape-iso-tmax').value).toBe('0.05');
    expect(other.isothermSection.views.selected).toBe('critical');
    expect(other.isothermSection.report!.tMax).toBe(0.05);
    expect(other.isothermSection.report!.primary.fit.Tc.value).toBeCloseTo(section.report!.primary.fit.Tc.value, 6);
  });

  it('should fill N_d from a sample shape in the chosen convention', async () => {
    const panel = await open(isothermCsv());
    const shape = panel.isothermSection.node.querySelector<HTMLSelectElement>('select.jp-psiscape-iso-shape')!;
    const convention = panel.isothermSection.node.querySelector<HTMLSelectElement>('select.jp-psiscape-iso-demag-convention')!;
    shape.value = 'sphere';
    shape.dispatchEvent(new Event('change'));
    expect(input(panel, 'jp-psiscape-iso-demag').value).toBe('0.333333');
    convention.value = 'cgs';
    convention.dispatchEvent(new Event('change'));
    // cgs N = 4π × SI N: 4π/3 = 4.18879 (Osborn, Phys. Rev. 67, 351 (1945), sphere).
    expect(input(panel, 'jp-psiscape-iso-demag').value).toBe('4.18879');
    expect(panel.isothermSection.settings()).toMatchObject({ demagnetisingConvention: 'cgs', demagnetisingFactorCgs: '4.18879', demagnetisingFactorSI: null, sampleShape: 'sphere' });
  });

  it('should ask for the unit of a column that has none, naming the column', async () => {
    const panel = await open(isothermCsv('T (K),H,M (emu/g)'));
    await panel.isothermSection.run();
    expect(errorText(panel)).toMatch(/^The isotherm analysis could not run: .*“H”.*Accepted units: Oe, kOe, A\/m/);
    input(panel, 'jp-psiscape-iso-field-unit').value = 'Oe';
    await panel.isothermSection.run();
    expect(errorText(panel)).toBeNull();
    expect(panel.isothermSection.report).not.toBeNull();
  });

  it('should refuse bad controls in words before running', async () => {
    const panel = await open(isothermCsv());
    const cases: [string, string, RegExp][] = [
      ['jp-psiscape-iso-demag', '4.2', /N_d \(SI\) must be a number from 0 to 1, got "4.2"/],
      ['jp-psiscape-iso-tmax', '1.5', /below 1/],
      ['jp-psiscape-iso-tolerance', '-1', /grouping tolerance.*positive/],
      ['jp-psiscape-iso-bootstrap', '3', /bootstrap count/],
      ['jp-psiscape-iso-field-min', 'lots', /field limit/]
    ];
    for (const [cls, value, expected] of cases) {
      const field = input(panel, cls);
      const before = field.value;
      field.value = value;
      await panel.isothermSection.run();
      expect(errorText(panel), cls).toMatch(expected);
      expect(field.value).toBe(value);
      field.value = before;
    }
    input(panel, 'jp-psiscape-iso-field-min').value = '50';
    input(panel, 'jp-psiscape-iso-field-max').value = '10';
    await panel.isothermSection.run();
    expect(errorText(panel)).toMatch(/lowest field .* must be below the highest/);
  });

  it('should stay hidden for a two-column table unless the panel shows isotherms', async () => {
    const panel = await open('T (K),M (emu/g)\n1,2\n3,4\n');
    expect(panel.isothermSection.isHidden).toBe(true);
    panel.setMode('isotherms');
    await panel.rendered;
    expect(panel.isothermSection.isHidden).toBe(false);
    expect(panel.fitSection.isHidden).toBe(true);
    expect(panel.node.dataset.mode).toBe('isotherms');
    expect(panel.title.label).toMatch(/^Isotherms/);
  });

  it('should keep the results shown when a run is cancelled', async () => {
    const panel = await open(isothermCsv());
    const section = panel.isothermSection;
    await section.run();
    const shown = section.report;
    const again = section.run();
    section.cancel();
    await again;
    expect(section.report).toBe(shown);
    expect(section.node.querySelector('.jp-psiscape-iso-status')!.textContent).toMatch(/Stopped by you/);
    expect(section.node.querySelector<HTMLButtonElement>('button.jp-psiscape-iso-run')!.disabled).toBe(false);
  });
});

describe('IsothermSection in a redrawn panel', () => {
  afterEach(() => {
    document.body.innerHTML = '';
  });

  it('should keep its analysis when the panel is redrawn (a theme change redraws every panel)', async () => {
    const panel = await open(isothermCsv());
    await panel.isothermSection.run();
    const report = panel.isothermSection.report;
    expect(report).not.toBeNull();
    panel.redraw();
    await panel.rendered;
    expect(panel.isothermSection.report).toBe(report);
  });
});
