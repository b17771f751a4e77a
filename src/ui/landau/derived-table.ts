/**
 * The derived-values table of the explorer: order of the transition, the
 * characteristic temperatures, jump, latent heat, barrier, specific-heat jump
 * and critical end point, '—' where a quantity does not apply, with the
 * convention the values are computed in.
 */
import type { TranslationBundle } from '@jupyterlab/translation';
import type { IExplorerDerived } from '../../core/physics/landau/index';
import { translateMessage } from '../translate';

/** Number as shown in the explorer (6 significant digits). */
export function formatValue(v: number | null): string {
  if (v === null || Number.isNaN(v)) {
    return '—';
  }
  if (!Number.isFinite(v)) {
    return v > 0 ? '∞' : '−∞';
  }
  return String(Number(v.toPrecision(6))).replace(/-/g, '−');
}

/** Fills `table` (caption, header and one row per quantity; rows carry `data-key`). */
export function renderDerivedTable(table: HTMLTableElement, d: IExplorerDerived, conventionName: string, trans: TranslationBundle): void {
  table.replaceChildren();
  const caption = document.createElement('caption');
  caption.textContent =
    d.method === 'closed-form'
      ? trans.__('Zero-field values in convention L, F = (a/2)(T − T0)ψ² + (b/4)ψ⁴ + (c/6)ψ⁶ − hψ, from the closed forms; coefficients entered as %1.', conventionName)
      : trans.__('Zero-field values in convention L, F = (a/2)(T − T0)ψ² + (d/3)ψ³ + (b/4)ψ⁴ + (c/6)ψ⁶ − hψ, found numerically; coefficients entered as %1. %2', conventionName, translateMessage(trans, d.reason));
  table.appendChild(caption);
  const head = table.createTHead().insertRow();
  for (const text of [trans.__('quantity'), trans.__('value')]) {
    const th = document.createElement('th');
    th.scope = 'col';
    th.textContent = text;
    head.appendChild(th);
  }
  const regime =
    d.regime === 'first-order' ? trans.__('first order') : d.regime === 'tricritical' ? trans.__('tricritical (b = 0)') : trans.__('second order');
  const cep = d.criticalEndPoint;
  const rows: [string, string, string][] = [
    ['order', trans.__('order of the transition'), regime],
    ['T0', trans.__('T0, stability limit of ψ = 0 (supercooling limit)'), formatValue(d.T0)],
    ['T1', trans.__('T1, transition temperature'), formatValue(d.T1)],
    ['Tsuperheat', trans.__('T**, superheating limit'), formatValue(d.Tsuperheat)],
    ['psiJump', trans.__('jump of ψ at T1'), formatValue(d.psiJump)],
    ['latentHeat', trans.__('latent heat (units of F)'), formatValue(d.latentHeat)],
    ['barrier', trans.__('barrier at T1: height (at ψ)'), d.barrierHeight === null ? '—' : `${formatValue(d.barrierHeight)} (${formatValue(d.barrierPsi)})`],
    ['specificHeatJump', trans.__('specific-heat jump at T0 (units of F per K)'), formatValue(d.specificHeatJump)],
    ['criticalEndPoint', trans.__('critical end point T, ψ, h'), cep === null ? '—' : `${formatValue(cep.T)}, ${formatValue(cep.psi)}, ${formatValue(cep.h)}`]
  ];
  const body = table.createTBody();
  for (const [key, name, value] of rows) {
    const row = body.insertRow();
    row.dataset.key = key;
    const th = document.createElement('th');
    th.scope = 'row';
    th.textContent = name;
    row.appendChild(th);
    row.insertCell().textContent = value;
  }
}
