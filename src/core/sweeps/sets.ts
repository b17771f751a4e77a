/**
 * Isotherm sets built directly from SI arrays (simulations, tests), and the
 * choice of the sweep branch an analysis works on.
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { wholeNumber } from '../numeric/messageArgs';
import type { Branch, IIsotherm, IIsothermSet } from './types';
import { DEMAG_UNSET_WARNING, SweepInputError } from './types';

/** Options of {@link isothermSetFromArrays}. */
export interface IArraySetOptions {
  /** Default 'internal' (simulated fields are internal by construction); 'applied' adds the N_d warning. */
  fieldKind?: 'internal' | 'applied';
  /** Default 'A/m'. */
  magnetisationUnit?: 'A/m' | 'A m^2/kg';
}

/** Builds a set from SI arrays (simulations, tests); points are sorted by H. */
export function isothermSetFromArrays(list: readonly { T: number; H: ArrayLike<number>; M: ArrayLike<number>; branch?: Branch }[], options: IArraySetOptions = {}): IIsothermSet {
  const fieldKind = options.fieldKind ?? 'internal';
  const isotherms: IIsotherm[] = list.map(it => {
    if (it.H.length !== it.M.length) {
      throw new SweepInputError(
        msg('sweeps.isotherm-lengths', 'The isotherm at T = %1 K has %2 fields but %3 magnetisations: give one of each per point.', { value: it.T, digits: 6 }, wholeNumber(it.H.length), wholeNumber(it.M.length))
      );
    }
    const order = Array.from({ length: it.H.length }, (_v, i) => i).sort((a, b) => it.H[a] - it.H[b]);
    return { T: it.T, TSpread: 0, branch: it.branch ?? 'unspecified', H: Float64Array.from(order, i => it.H[i]), M: Float64Array.from(order, i => it.M[i]), rows: [] };
  });
  isotherms.sort((a, b) => a.T - b.T);
  return {
    isotherms,
    fieldKind,
    magnetisationUnit: options.magnetisationUnit ?? 'A/m',
    demagnetisingFactorSI: null,
    display: { temperature: 'K', field: 'A/m', magnetisation: options.magnetisationUnit ?? 'A/m' },
    conventions: [msg('sweeps.convention.si-arrays', 'Built from arrays already in SI units.')],
    warnings: fieldKind === 'applied' ? [DEMAG_UNSET_WARNING] : []
  };
}

/**
 * Isotherms of one branch for an analysis. Without `branch`, when a set mixes
 * up and down sweeps, the 'up' branch is used and a warning says so.
 */
export function selectBranch(set: IIsothermSet, branch?: Branch): { isotherms: IIsotherm[]; warnings: ICoreMessage[] } {
  if (branch !== undefined) {
    return { isotherms: set.isotherms.filter(i => i.branch === branch), warnings: [] };
  }
  const kinds = new Set(set.isotherms.map(i => i.branch));
  if (kinds.size > 1 && kinds.has('up')) {
    return { isotherms: set.isotherms.filter(i => i.branch === 'up'), warnings: [msg('sweeps.up-branch-used', 'The table has both field-up and field-down branches: the up branch was analysed.')] };
  }
  return { isotherms: set.isotherms.slice(), warnings: [] };
}
