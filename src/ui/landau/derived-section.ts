/**
 * The part of the explorer under the charts: the equilibrium at the chosen
 * (T, h) in one line, and the table of derived zero-field values.
 */
import type { TranslationBundle } from '@jupyterlab/translation';
import { Widget } from '@lumino/widgets';
import type { IExplorerDerived, ILandscapeData } from '../../core/physics/landau/index';
import { formatValue, renderDerivedTable } from './derived-table';

/** Equilibrium line + derived-values table. */
export class DerivedSection extends Widget {
  constructor(trans: TranslationBundle) {
    super();
    this._trans = trans;
    this.addClass('jp-psiscape-landau-derived-section');
    this._state = document.createElement('p');
    this._state.className = 'jp-psiscape-landau-state';
    this._table = document.createElement('table');
    this._table.className = 'jp-psiscape-landau-derived';
    this.node.append(this._state, this._table);
  }

  /** Shows the values of one good picture. */
  present(derived: IExplorerDerived, conventionName: string, T: number, h: number, land: ILandscapeData): void {
    const trans = this._trans;
    // the zero-field values depend on the coefficients alone: a T or h move leaves the table as it is
    const key = JSON.stringify([derived, conventionName]);
    if (key !== this._tableKey) {
      renderDerivedTable(this._table, derived, conventionName, trans);
      this._tableKey = key;
    }
    const g = land.global >= 0 ? land.points[land.global] : null;
    this._state.textContent = g
      ? trans._n(
          'Equilibrium at T = %2, h = %3: ψ = %4, F − F0 = %5; %1 stationary point.',
          'Equilibrium at T = %2, h = %3: ψ = %4, F − F0 = %5; %1 stationary points.',
          land.points.length,
          formatValue(T),
          formatValue(h),
          formatValue(g.psi),
          formatValue(g.F)
        )
      : '';
  }

  private _trans: TranslationBundle;
  private _state: HTMLParagraphElement;
  private _table: HTMLTableElement;
  private _tableKey = '';
}
