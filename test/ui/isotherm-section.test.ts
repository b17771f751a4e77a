/**
 * Isotherm analysis from the analysis panel (real widgets in jsdom): exact
 * spin-½ Weiss isotherms (REFERENCE.md B1: h = τ·artanh m − m) give the
 * mean-field answers, and missing units or bad N_d are refused in words.
 */
import { afterEach, describe, expect, it } from 'vitest';
import { parseMime } from '../../src/core/table';
import { weissMagnetisation } from '../../src/core/physics/weiss';
import type { AnalysisPanel } from '../../src/ui/analysis-panel';
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

describe('IsothermSection', () => {
  afterEach(() => {
    document.body.innerHTML = '';
  });

  it('should find Tc near 300 K and mean-field exponents from exact Weiss isotherms, and draw the Arrott plot', async () => {
    const panel = await open(isothermCsv());
    const section = panel.isothermSection;
    expect(section.isHidden).toBe(false);
    section.node.querySelector<HTMLButtonElement>('button.jp-psiscape-iso-run')!.click();
    const a = section.analysis!;
    expect(a).not.toBeNull();
    // Mean field (REFERENCE.md B1): Tc = 300 K by construction, β = ½, γ = 1 (31 isotherms, |t| ≤ 0.05).
    // Tolerances are loose (common practice, no source): the isotherms reach m ≈ 0.2 above the spontaneous value.
    expect(Math.abs(a.arrott.Tc.value - 300)).toBeLessThan(1);
    expect(Math.abs(a.modifiedArrott.beta.value - 0.5)).toBeLessThan(0.06);
    expect(Math.abs(a.modifiedArrott.gamma.value - 1)).toBeLessThan(0.1);
    await section.rendered;
    expect(section.node.querySelectorAll('svg g.mark-symbol.role-mark path').length).toBeGreaterThan(100);
    const text = section.node.textContent!;
    expect(text).toMatch(/31 isotherms/);
    expect(text).toMatch(/applied field \(no demagnetisation correction\)/);
    expect(text).toMatch(/Banerjee criterion:/);
  });

  it('should ask for the unit of a column that has none, naming the column', async () => {
    const panel = await open(isothermCsv('T (K),H,M (emu/g)'));
    panel.isothermSection.run();
    const error = panel.isothermSection.node.querySelector<HTMLElement>('.jp-psiscape-fit-error')!;
    expect(error.hidden).toBe(false);
    expect(error.textContent).toMatch(/^The isotherm analysis could not run: .*“H”.*Accepted units: Oe, kOe, A\/m/);
    // Supplying the unit lets it run.
    panel.isothermSection.node.querySelector<HTMLInputElement>('input.jp-psiscape-iso-field-unit')!.value = 'Oe';
    panel.isothermSection.run();
    expect(panel.isothermSection.analysis).not.toBeNull();
  });

  it('should refuse a demagnetising factor outside 0..1', async () => {
    const panel = await open(isothermCsv());
    panel.isothermSection.node.querySelector<HTMLInputElement>('input.jp-psiscape-iso-demag')!.value = '4.2';
    panel.isothermSection.run();
    expect(panel.isothermSection.node.querySelector('.jp-psiscape-fit-error')!.textContent).toBe(
      'The isotherm analysis could not run: The demagnetising factor N_d (SI) must be a number from 0 to 1, got "4.2".'
    );
  });

  it('should stay hidden for a two-column table', async () => {
    const panel = await open('T (K),M (emu/g)\n1,2\n3,4\n');
    expect(panel.isothermSection.isHidden).toBe(true);
  });
});

describe('IsothermSection in a redrawn panel', () => {
  afterEach(() => {
    document.body.innerHTML = '';
  });

  it('should keep its analysis when the panel is redrawn (a theme change redraws every panel)', async () => {
    const panel = await open(isothermCsv());
    panel.isothermSection.run();
    const analysis = panel.isothermSection.analysis;
    expect(analysis).not.toBeNull();
    panel.redraw();
    await panel.rendered;
    expect(panel.isothermSection.analysis).toBe(analysis);
  });
});
