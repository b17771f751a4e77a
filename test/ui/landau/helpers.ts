/** Shared helpers of the explorer tests: build and attach, find inputs, type and slide. */
import { nullTranslator } from '@jupyterlab/translation';
import { Widget } from '@lumino/widgets';
import { LandauExplorer } from '../../../src/ui/landau/explorer';
import type { ILandauExplorerInitial } from '../../../src/ui/landau/explorer';

/** An attached explorer with the null translator. */
export function explorer(initial?: ILandauExplorerInitial): LandauExplorer {
  const w = new LandauExplorer({ trans: nullTranslator.load('x'), initial });
  Widget.attach(w, document.body);
  return w;
}

/** Range input of a field. */
export function range(w: Widget, key: string): HTMLInputElement {
  return w.node.querySelector<HTMLInputElement>(`input.jp-psiscape-landau-range[data-key="${key}"]`)!;
}

/** Number input of a field. */
export function numberField(w: Widget, key: string): HTMLInputElement {
  return w.node.querySelector<HTMLInputElement>(`input.jp-psiscape-landau-number[data-key="${key}"]`)!;
}

/** Types `text` into a number field and commits it (input + change). */
export function type(w: Widget, key: string, text: string): void {
  const input = numberField(w, key);
  input.value = text;
  input.dispatchEvent(new Event('input', { bubbles: true }));
  input.dispatchEvent(new Event('change', { bubbles: true }));
}

/** Moves a slider to `value` as a pointer drag would (input event). */
export function slide(w: Widget, key: string, value: number): void {
  const input = range(w, key);
  input.value = String(value);
  input.dispatchEvent(new Event('input', { bubbles: true }));
}

/** Text of the value cell of a derived-table row. */
export function derivedCell(w: Widget, key: string): string {
  return w.node.querySelector(`table.jp-psiscape-landau-derived tr[data-key="${key}"] td`)!.textContent ?? '';
}

/** Number of stationary-point symbols drawn in the landscape. */
export function stationaryMarks(w: Widget): number {
  return w.node.querySelectorAll('.jp-psiscape-landau-landscape svg .landscape_points_marks path').length;
}

/** The message shown instead of a new picture ('' when hidden). */
export function message(w: Widget): string {
  const p = w.node.querySelector<HTMLElement>('.jp-psiscape-landau-message')!;
  return p.hidden ? '' : (p.textContent ?? '');
}

/** Markup of both charts. */
export function chartsMarkup(w: Widget): string {
  return [...w.node.querySelectorAll('.jp-psiscape-ChartView')].map(n => n.innerHTML).join('\n');
}
