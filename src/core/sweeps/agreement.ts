/**
 * Whether a cross-check agrees with the primary result: every compared value
 * within 2σ of the primary one, σ combined in quadrature (the two come from
 * the same data, so this is lenient rather than strict).
 */
import { formatNumberArg, msg } from '../messages';
import type { ICoreMessage } from '../messages';
import type { IAgreement } from './job-types';
import type { IValueSigma } from './types';

/** Coverage factor of the agreement test. */
export const AGREEMENT_SIGMAS = 2;

/**
 * Relative differences still called close when beyond 2σ: the σ of the
 * line-based methods (modified Arrott, Kouvel–Fisher) is statistical only and
 * leaves out their systematic error (straight high-field lines, the choice of
 * fit range), which on noise-free model data is about 1 % in the exponents.
 * 2 % on exponents and 0.1 % on Tc: common practice, no source.
 */
export const CLOSE_RELATIVE = { Tc: 1e-3, other: 2e-2 } as const;

/** One compared quantity: the cross-check's value and the primary one. */
export interface IComparison {
  name: string;
  value: IValueSigma;
  primary: IValueSigma;
}

function valueText(v: IValueSigma): string {
  return `${formatNumberArg(v.value, 5)} ± ${formatNumberArg(v.sigma, 2)}`;
}

/** 'agrees' / 'disagrees' over the comparisons; 'no-result' with `detail` when a value or σ is missing. */
export function agreementOf(comparisons: readonly IComparison[], detail?: ICoreMessage): IAgreement {
  const missing = comparisons.filter(c => !Number.isFinite(c.value.value) || !Number.isFinite(c.primary.value));
  if (comparisons.length === 0 || missing.length > 0) {
    return {
      state: 'no-result',
      message: msg('sweeps.agree.no-result', 'No value to compare with the global fit (%1 missing).', (missing.length > 0 ? missing : comparisons).map(c => c.name).join(', ')),
      detail
    };
  }
  const noSigma = comparisons.filter(c => !(Number.isFinite(c.value.sigma) && c.value.sigma >= 0) || !(Number.isFinite(c.primary.sigma) && c.primary.sigma >= 0));
  if (noSigma.length > 0) {
    return {
      state: 'no-result',
      message: msg('sweeps.agree.no-sigma', 'No uncertainty for %1, so agreement with the global fit cannot be judged.', noSigma.map(c => c.name).join(', ')),
      detail
    };
  }
  const parts: string[] = [];
  let all = true;
  let close = true;
  for (const c of comparisons) {
    const s = Math.hypot(c.value.sigma, c.primary.sigma);
    const difference = Math.abs(c.value.value - c.primary.value);
    const z = s > 0 ? difference / s : c.value.value === c.primary.value ? 0 : Infinity;
    all = all && z <= AGREEMENT_SIGMAS;
    close = close && difference <= (c.name === 'Tc' ? CLOSE_RELATIVE.Tc : CLOSE_RELATIVE.other) * Math.abs(c.primary.value);
    parts.push(`${c.name} = ${valueText(c.value)} against ${valueText(c.primary)} (${formatNumberArg(z, 2)}σ)`);
  }
  if (all) {
    return { state: 'agrees', message: msg('sweeps.agree.agrees', 'Within %1σ of the global fit: %2.', AGREEMENT_SIGMAS, parts.join('; ')), detail };
  }
  return close
    ? {
        state: 'close',
        message: msg(
          'sweeps.agree.close',
          'Beyond %1σ of the global fit but within %2 % of it (Tc within %3 %): %4. This method’s σ is statistical only and leaves out its own systematic error.',
          AGREEMENT_SIGMAS,
          100 * CLOSE_RELATIVE.other,
          100 * CLOSE_RELATIVE.Tc,
          parts.join('; ')
        ),
        detail
      }
    : { state: 'disagrees', message: msg('sweeps.agree.disagrees', 'Not within %1σ of the global fit: %2.', AGREEMENT_SIGMAS, parts.join('; ')), detail };
}
