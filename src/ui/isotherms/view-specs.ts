/**
 * Which chart each view of the isotherm analysis draws, from which part of
 * the report, and which agreement with the primary result it states.
 */
import type { ICoreMessage } from '../../core/messages';
import type { IIsothermReport } from '../../core/sweeps/job-types';
import type { ISweepChart, ISweepChartOptions, UnitOption } from '../../charts/sweeps';
import {
  buildArrottSpec,
  buildBanerjeeSpec,
  buildCollapseSpec,
  buildCriticalIsothermSpec,
  buildEntropyMapSpec,
  buildEntropySpec,
  buildExponentWindowSpec,
  buildKouvelFisherSpec,
  buildModifiedArrottSpec
} from '../../charts/sweeps';
import type { IChartTheme } from '../../charts/theme';

/** The views, in the order of their tabs. */
export const ISOTHERM_VIEWS = ['arrott', 'modified-arrott', 'kouvel-fisher', 'critical', 'collapse', 'banerjee', 'window', 'entropy', 'entropy-map'] as const;

/** One view. */
export type IsothermViewId = (typeof ISOTHERM_VIEWS)[number];

/** Units the charts show. */
export interface IViewUnits {
  field: UnitOption;
  magnetisation: UnitOption;
  fieldKind: 'internal' | 'applied';
}

/** A view's chart and, for a cross-check, its agreement with the primary result. */
export interface IViewChart {
  chart: ISweepChart;
  agreement: ICoreMessage | null;
}

/** The chart of one view. */
export function viewChart(id: IsothermViewId, r: IIsothermReport, theme: IChartTheme, units: IViewUnits): IViewChart {
  const options: ISweepChartOptions = { fieldUnit: units.field, magnetisationUnit: units.magnetisation, fieldKind: units.fieldKind };
  const isotherms = r.set.isotherms;
  const primary = r.primary.fit;
  switch (id) {
    case 'arrott':
      return { chart: buildArrottSpec({ isotherms, lines: r.arrott.lines, Tc: r.arrott.Tc }, theme, options), agreement: null };
    case 'modified-arrott':
      return {
        chart: buildModifiedArrottSpec({ isotherms, result: r.modifiedArrott.result, beta: primary.beta.value, gamma: primary.gamma.value }, theme, options),
        agreement: r.modifiedArrott.agreement.message
      };
    case 'kouvel-fisher':
      return { chart: buildKouvelFisherSpec(r.kouvelFisher.result, theme, options), agreement: r.kouvelFisher.agreement.message };
    case 'critical':
      return {
        chart: buildCriticalIsothermSpec({ isotherms, result: r.criticalIsotherm.result, Tc: primary.Tc.value }, theme, options),
        agreement: r.criticalIsotherm.agreement.message
      };
    case 'collapse':
      return {
        chart: buildCollapseSpec({ isotherms, result: r.collapse.result, Tc: primary.Tc.value, beta: primary.beta.value, gamma: primary.gamma.value }, theme, options),
        agreement: r.collapse.agreement.message
      };
    case 'banerjee':
      return { chart: buildBanerjeeSpec(r.banerjee, theme, options), agreement: null };
    case 'window':
      return { chart: buildExponentWindowSpec(r.window?.cells ?? [], 'beta', theme, options), agreement: null };
    case 'entropy':
      return { chart: buildEntropySpec(r.entropy, theme, options), agreement: null };
    case 'entropy-map':
      return { chart: buildEntropyMapSpec(r.entropy, theme, options), agreement: null };
  }
}
