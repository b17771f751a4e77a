/**
 * Bootstrap over isotherms for the modified Arrott
 * iteration: whole isotherms are resampled with replacement (seeded), the
 * iteration is rerun, and the spread of β, γ and Tc is reported beside the
 * covariance errors of the full data.
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import type { IModifiedArrottOptions } from './map';
import { iterateModifiedArrott } from './map';
import { selectBranch } from './sets';
import type { IIsotherm, IIsothermSet } from './types';
import { SweepInputError } from './types';
import { mulberry32 } from '../numeric/random';

/** Mean and standard deviation over the bootstrap samples that converged. */
export interface IBootstrapStat {
  mean: number;
  sd: number;
}

/** Bootstrap result. */
export interface IBootstrapResult {
  beta: IBootstrapStat;
  gamma: IBootstrapStat;
  Tc: IBootstrapStat;
  samples: number;
  /** Samples whose iteration failed or did not converge (left out of the statistics). */
  failed: number;
  seed: number;
  /** How the samples were drawn and counted (code `sweeps.bootstrap.convention`). */
  convention: ICoreMessage;
}


function stat(v: number[]): IBootstrapStat {
  if (v.length === 0) {
    return { mean: NaN, sd: NaN };
  }
  const mean = v.reduce((s, x) => s + x, 0) / v.length;
  const sd = v.length > 1 ? Math.sqrt(v.reduce((s, x) => s + (x - mean) ** 2, 0) / (v.length - 1)) : NaN;
  return { mean, sd };
}

/** Resamples isotherms `samples` times (default 50, seed 1) and reruns the iteration. */
export function bootstrapModifiedArrott(
  set: IIsothermSet,
  options: IModifiedArrottOptions & {
    samples?: number;
    seed?: number;
    /** Polled before every sample; true stops the resampling (the samples drawn so far are kept). */
    shouldStop?: () => boolean;
    /** Called after every sample with the number done. */
    onSample?: (done: number) => void;
  } = {}
): IBootstrapResult {
  const samples = options.samples ?? 50;
  const seed = options.seed ?? 1;
  if (!Number.isInteger(samples) || samples < 2) {
    throw new SweepInputError(msg('sweeps.bootstrap.samples', 'The number of bootstrap samples must be a whole number of at least 2, but it is %1.', samples));
  }
  const iso = selectBranch(set, options.branch).isotherms;
  const rand = mulberry32(seed);
  const b: number[] = [];
  const g: number[] = [];
  const t: number[] = [];
  let failed = 0;
  for (let s = 0; s < samples; s++) {
    if (options.shouldStop?.() === true) {
      break;
    }
    const pick: IIsotherm[] = [];
    for (let k = 0; k < iso.length; k++) {
      pick.push(iso[Math.floor(rand() * iso.length)]);
    }
    pick.sort((x, y) => x.T - y.T);
    const r = iterateModifiedArrott(pick, options);
    if (r.converged && Number.isFinite(r.beta) && Number.isFinite(r.gamma) && Number.isFinite(r.Tc)) {
      b.push(r.beta);
      g.push(r.gamma);
      t.push(r.Tc);
    } else {
      failed++;
    }
    options.onSample?.(s + 1);
  }
  return {
    beta: stat(b),
    gamma: stat(g),
    Tc: stat(t),
    samples,
    failed,
    seed,
    convention: msg('sweeps.bootstrap.convention', 'Isotherms resampled with replacement (seed %1); statistics over the samples whose iteration converged.', seed)
  };
}
