/**
 * The explorer's inputs: convention switching through the conversion
 * functions, refused conversions, bad values that keep the last picture, and
 * keyboard use of the sliders.
 */
import { afterEach, describe, expect, it } from 'vitest';
import { PHYS } from '../../../src/core/units/constants';
import { chartsMarkup, derivedCell, explorer, message, numberField, range, slide, stationaryMarks, type } from './helpers';

function pickConvention(w: ReturnType<typeof explorer>, value: string): void {
  const select = w.node.querySelector<HTMLSelectElement>('select.jp-psiscape-landau-convention')!;
  select.value = value;
  select.dispatchEvent(new Event('change', { bubbles: true }));
}

function key(input: HTMLInputElement, k: string): boolean {
  const e = new KeyboardEvent('keydown', { key: k, bubbles: true, cancelable: true });
  input.dispatchEvent(e);
  return e.defaultPrevented;
}

describe('LandauExplorer conventions', () => {
  afterEach(() => {
    document.body.innerHTML = '';
  });

  it('should show the no-fractions coefficients A = a/2, B = b/4, C = c/6 with the same T1', async () => {
    const w = explorer();
    await w.rendered;
    pickConvention(w, 'no-fractions');
    await w.rendered;
    expect(w.convention).toBe('no-fractions');
    // mapping a = 2A, b = 4B, c = 6C (REFERENCE.md B3 table)
    expect(numberField(w, 'A').value).toBe('0.25');
    expect(numberField(w, 'B').value).toBe('-0.5');
    expect(Number(numberField(w, 'C').value)).toBeCloseTo(4 / 6, 9);
    expect(numberField(w, 'T0').value).toBe('100');
    expect(numberField(w, 'a')).toBeNull();
    // T1 = T0 + B²/(4AC) in this form (B3) = 100.375 (C5)
    expect(derivedCell(w, 'T1')).toBe('100.375');
    expect(w.derived!.T1).toBeCloseTo(100.375, 12);
    expect(w.node.querySelector('.jp-psiscape-landau-formula')!.textContent).toMatch(/A\(T − T0\)ψ²/);
    expect(w.node.querySelector('table.jp-psiscape-landau-derived caption')!.textContent).toMatch(/entered as no fractions/);
  });

  it('should convert to the Devonshire form with C_CW = 1/(ε0 a) and edit through it', async () => {
    const w = explorer();
    await w.rendered;
    pickConvention(w, 'devonshire');
    await w.rendered;
    // a = 1/(ε0 C_CW), b = 4 α11, c = 6 α111 (REFERENCE.md B3 table); ε0 as in the core constants (CODATA 2018)
    expect(Number(numberField(w, 'curieConstant').value) / (1 / (PHYS.eps0 * 0.5))).toBeCloseTo(1, 9);
    expect(numberField(w, 'alpha11').value).toBe('-0.5');
    expect(derivedCell(w, 'T1')).toBe('100.375');
    // α11 = −1 means b = −4: T1 = T0 + 3b²/(16ac) = 100 + 48/32 = 101.5 (B3 ii, by hand)
    type(w, 'alpha11', '-1');
    await w.rendered;
    expect(w.coefficients!.b).toBe(-4);
    expect(derivedCell(w, 'T1')).toBe('101.5');
  });

  it('should refuse the Ginzburg–Landau form while c ≠ 0 and stay in the current convention', async () => {
    const w = explorer();
    await w.rendered;
    pickConvention(w, 'ginzburg-landau');
    expect(message(w)).toMatch(/Ginzburg–Landau form cannot hold these coefficients: .*no sextic/);
    expect(w.convention).toBe('L');
    expect(w.node.querySelector<HTMLSelectElement>('select.jp-psiscape-landau-convention')!.value).toBe('L');
    // with c = 0 and b > 0 it works: α′ = a/2, β = b/2 (B3 table)
    await w.setCoefficients({ a: 0.5, b: 2, c: 0, T0: 100 });
    pickConvention(w, 'ginzburg-landau');
    await w.rendered;
    expect(message(w)).toBe('');
    expect(numberField(w, 'alphaPrime').value).toBe('0.25');
    expect(numberField(w, 'beta').value).toBe('1');
    expect(numberField(w, 'Tc').value).toBe('100');
    // a fit result with c ≠ 0 arriving while the Ginzburg–Landau form is shown opens in convention L, and says so
    await w.setCoefficients({ a: 0.5, b: -2, c: 4, T0: 100 });
    expect(w.convention).toBe('L');
    expect(numberField(w, 'c').value).toBe('4');
    expect(message(w)).toMatch(/^Shown in convention L: the Ginzburg–Landau form cannot hold these coefficients/);
    expect(derivedCell(w, 'T1')).toBe('100.375');
  });
});

describe('LandauExplorer bad input', () => {
  afterEach(() => {
    document.body.innerHTML = '';
  });

  it('should explain c ≤ 0 with b < 0 and keep the previous charts and table', async () => {
    const w = explorer();
    await w.rendered;
    const charts = chartsMarkup(w);
    const T1 = derivedCell(w, 'T1');
    type(w, 'c', '-1');
    await w.rendered;
    expect(message(w)).toMatch(/has no lower bound/);
    expect(message(w)).toMatch(/last valid values/);
    expect(chartsMarkup(w)).toBe(charts);
    expect(derivedCell(w, 'T1')).toBe(T1);
    expect(w.derived!.T1).toBeCloseTo(100.375, 12);
    // moving T while the coefficients are bad still draws nothing new
    slide(w, 'T', 101);
    await w.rendered;
    expect(chartsMarkup(w)).toBe(charts);
    // back to a valid c: the message goes and the picture follows
    type(w, 'c', '4');
    await w.rendered;
    expect(message(w)).toBe('');
    expect(stationaryMarks(w)).toBe(1);
  });

  it('should say so when a number field holds no finite number', async () => {
    const w = explorer();
    await w.rendered;
    const charts = chartsMarkup(w);
    type(w, 'a', '');
    await w.rendered;
    expect(message(w)).toMatch(/^a: enter a finite number\. The charts and the table still show the last valid values\.$/);
    expect(chartsMarkup(w)).toBe(charts);
    type(w, 'a', '0');
    await w.rendered;
    expect(message(w)).toMatch(/a must be above 0/);
    expect(chartsMarkup(w)).toBe(charts);
  });

  it('should refuse non-finite coefficients given through setCoefficients', async () => {
    const w = explorer();
    await w.rendered;
    const charts = chartsMarkup(w);
    await w.setCoefficients({ a: Number.NaN, b: -2, c: 4, T0: 100 });
    expect(message(w)).toMatch(/a must be a finite number|finite/);
    expect(chartsMarkup(w)).toBe(charts);
  });
});

describe('LandauExplorer keyboard', () => {
  afterEach(() => {
    document.body.innerHTML = '';
  });

  it('should step the T slider with the arrow keys, Page keys, Home and End', async () => {
    const w = explorer();
    await w.rendered;
    const r = range(w, 'T');
    const step = Number(r.step);
    const start = Number(r.value);
    r.focus();
    expect(key(r, 'ArrowRight')).toBe(true);
    expect(Number(r.value)).toBeCloseTo(start + step, 12);
    expect(Number(numberField(w, 'T').value)).toBeCloseTo(start + step, 12);
    expect(w.state.T).toBeCloseTo(start + step, 12);
    key(r, 'ArrowLeft');
    key(r, 'ArrowLeft');
    expect(Number(r.value)).toBeCloseTo(start - step, 12);
    key(r, 'PageUp');
    expect(Number(r.value)).toBeCloseTo(start + 9 * step, 12);
    key(r, 'End');
    expect(r.value).toBe(r.max);
    key(r, 'ArrowRight');
    expect(r.value).toBe(r.max);
    key(r, 'Home');
    expect(r.value).toBe(r.min);
    expect(key(r, 'Tab')).toBe(false);
    await w.rendered;
    expect(w.state.T).toBe(Number(r.min));
  });

  it('should change a coefficient from the keyboard and redraw', async () => {
    const w = explorer();
    await w.rendered;
    const before = w.redraws;
    const r = range(w, 'b');
    key(r, 'ArrowRight');
    await w.rendered;
    expect(w.coefficients!.b).toBeCloseTo(-2 + Number(r.step), 12);
    expect(w.redraws).toBe(before + 1);
    expect(w.derived!.T1).toBeLessThan(100.375); // |b| smaller: T1 − T0 = 3b²/(16ac) shrinks (B3 ii)
  });
});
