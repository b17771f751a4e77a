/**
 * The explorer's two chart specs with translated texts: the landscape at the
 * chosen (T, h) and the branches ψ(T) with T0, T1, T** marked.
 */
import type { TranslationBundle } from '@jupyterlab/translation';
import type { TopLevelSpec } from 'vega-lite';
import type { IBranchesChartOptions, IKindLabels, ILandscapeChartOptions, ITemperatureMarker } from '../../charts/landau/index';
import { buildBranchesSpec, buildLandscapeSpec } from '../../charts/landau/index';
import type { IChartTheme } from '../../charts/theme';
import type { IBranchesData, IExplorerDerived, ILandscapeData } from '../../core/physics/landau/index';
import { formatValue } from './derived-table';

/**
 * A spec with its accessible label. The spec is built when first read: a
 * slider move that only swaps rows in a drawn view never builds one.
 */
export interface ILabelledSpec<O = unknown> {
  readonly spec: TopLevelSpec;
  label: string;
  /** What the spec was built from (for in-place updates of a drawn view). */
  options: O;
}

/** Fixed axes and overlays of the workbench. */
export interface ISpecView {
  xDomain?: [number, number];
  yDomain?: [number, number];
  data?: { T: number; psi: number }[];
  fitted?: { T: number; psi: number }[];
  /** Area of a measured point in px². */
  pointSize?: number;
  /** Mark T0, T1 and T** of the Landau form (default true; not for a typed free energy). */
  markers?: boolean;
}

function lazySpec<O>(options: O, label: string, build: () => TopLevelSpec): ILabelledSpec<O> {
  let spec: TopLevelSpec | null = null;
  return {
    options,
    label,
    get spec(): TopLevelSpec {
      spec ??= build();
      return spec;
    }
  };
}

function kindLabels(trans: TranslationBundle): IKindLabels {
  return {
    stable: trans.__('stable'),
    metastable: trans.__('metastable'),
    unstable: trans.__('unstable'),
    inflection: trans.__('inflection')
  };
}

/** Landscape spec at (T, h). */
export function landscapeSpec(data: ILandscapeData, T: number, h: number, theme: IChartTheme, trans: TranslationBundle, view: ISpecView = {}): ILabelledSpec<ILandscapeChartOptions> {
  // with fixed axes the title is a parameter: a drawn view takes a new one in place with its rows
  const title = trans.__('Free energy at T = %1, h = %2', formatValue(T), formatValue(h));
  // minima as low as the global one (±ψ at h = 0, three at T1) are all labelled stable
  const equal = data.points.filter(p => p.kind === 'stable').length;
  const options: ILandscapeChartOptions = {
    psi: data.psi,
    F: data.F,
    points: data.points,
    global: data.global,
    T,
    h,
    theme,
    xDomain: view.xDomain,
    yDomain: view.yDomain,
    patchable: view.xDomain !== undefined,
    labels: {
      title,
      psi: trans.__('order parameter ψ'),
      F: trans.__('F − F0'),
      kind: trans.__('stationary point'),
      kinds: kindLabels(trans),
      globalMinimum: equal > 1 ? trans.__('global minimum (one of %1 equal minima)', equal) : trans.__('global minimum')
    }
  };
  const n = data.points.length;
  return lazySpec(options, trans._n('%2: %1 stationary point', '%2: %1 stationary points', n, title), () => buildLandscapeSpec(options).spec);
}

/** Branches spec at field h with markers at the characteristic temperatures. */
export function branchesSpec(data: IBranchesData, derived: IExplorerDerived, T: number, h: number, theme: IChartTheme, trans: TranslationBundle, view: ISpecView = {}): ILabelledSpec<IBranchesChartOptions> {
  const markers: ITemperatureMarker[] = view.markers === false ? [] : [{ T: derived.T0, label: 'T0' }];
  if (view.markers !== false && derived.regime === 'first-order') {
    markers.push({ T: derived.T1, label: 'T1' });
    if (derived.Tsuperheat !== null) {
      markers.push({ T: derived.Tsuperheat, label: 'T**' });
    }
  }
  const marked = view.markers !== false;
  const title =
    h === 0
      ? trans.__('Order parameter against temperature at h = 0')
      : marked
        ? trans.__('Order parameter against temperature at h = %1 (T0, T1, T** of h = 0 marked)', formatValue(h))
        : trans.__('Order parameter against temperature at h = %1', formatValue(h));
  const options: IBranchesChartOptions = {
    ...view,
    patchable: view.xDomain !== undefined,
    branches: data.branches,
    heating: data.heating,
    cooling: data.cooling,
    markers,
    current: { T, label: trans.__('T = %1', formatValue(T)) },
    h,
    theme,
    labels: {
      title,
      T: trans.__('temperature T'),
      psi: trans.__('order parameter ψ'),
      kind: trans.__('branch'),
      kinds: kindLabels(trans),
      heating: trans.__('heating'),
      cooling: trans.__('cooling'),
      data: trans.__('data'),
      fitted: trans.__('fit')
    }
  };
  const label = marked ? trans.__('%1: stationary branches, heating and cooling paths; T0, T1 and T** marked (zero field)', title) : trans.__('%1: stationary branches', title);
  return lazySpec(options, label, () => buildBranchesSpec(options).spec);
}
