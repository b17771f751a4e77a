/**
 * Starting values for parameters the user gave none for, better than 1: a
 * cheap, deterministic multistart over scale-aware candidates.
 *
 * Candidates for every parameter come from the data: the y level and span,
 * the x extremes, middle and span (and just beyond the ends, where a
 * transition temperature often lies), rates 1/span, and plain numbers (1,
 * −1, ½, 2, …). The search is bounded by `GUESS_EVALUATIONS` model
 * evaluations on at most `GUESS_POINTS` points:
 *
 * 1. the shape: a fixed pseudo-random sample of candidate combinations
 *    (seeded, so the same data always give the same guesses) and the
 *    all-ones point, ranked by the χ² left after the best scale and offset
 *    (min over α, β of Σ(y − α·f − β)²), so that a peak or a step in the
 *    right place counts even with a wrong amplitude; coordinate descent on
 *    that χ² from the best few;
 * 2. the values: coordinate descent on χ² = Σ(y − f)² itself from the best
 *    shape and from the best point seen so far: each parameter in turn
 *    takes the candidate with the lowest χ², then is scaled by 2, ½, 1.25,
 *    0.8, … while that lowers χ².
 *
 * Points are compared first by how many model values are not finite (fewer
 * is better), then by the χ² of the stage.
 */
import type { IFitModel } from '../fit/types';
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { nameList, quote } from './normalize';

/** Result of `guessStarts`. */
export interface IStartGuess {
  /** One start value per model parameter, in the model's order (given values unchanged). */
  start: number[];
  /** Parameters whose start value was guessed. */
  guessed: string[];
  /** Why the fit may not start from these values (in our words). */
  problems: ICoreMessage[];
}

/** Most model evaluations of one guess. */
export const GUESS_EVALUATIONS = 3000;
/** Most data points one evaluation uses (an even stride through the data beyond that). */
export const GUESS_POINTS = 200;
const RANDOM_COMBINATIONS = 120;
const DESCENT_STARTS = 3;
const DESCENT_ROUNDS = 4;
const SCALE_STEPS = [2, 0.5, 1.25, 0.8, 1.06, 0.94];

interface IScore {
  invalid: number;
  /** Σ(y − f)² over the finite values. */
  chi2: number;
  /** The same after the best scale and offset of f. */
  shape: number;
}

type Key = 'chi2' | 'shape';

const better = (a: IScore, b: IScore, key: Key): boolean => a.invalid < b.invalid || (a.invalid === b.invalid && a[key] < b[key]);

/** Small deterministic generator (mulberry32). */
function random(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Candidate start values from the data (finite, distinct). */
export function startCandidates(x: ArrayLike<number>, y: ArrayLike<number>): number[] {
  const n = x.length;
  let xmin = Infinity;
  let xmax = -Infinity;
  let ymin = Infinity;
  let ymax = -Infinity;
  let ysum = 0;
  let yAtXmin = 0;
  let yAtXmax = 0;
  for (let i = 0; i < n; i++) {
    if (x[i] < xmin) {
      xmin = x[i];
      yAtXmin = y[i];
    }
    if (x[i] > xmax) {
      xmax = x[i];
      yAtXmax = y[i];
    }
    ymin = Math.min(ymin, y[i]);
    ymax = Math.max(ymax, y[i]);
    ysum += y[i];
  }
  const xspan = xmax - xmin;
  const yspan = ymax - ymin;
  const raw = [
    1,
    -1,
    0.5,
    2,
    0.1,
    10,
    0,
    ysum / n,
    ymax,
    ymin,
    yspan,
    -yspan,
    yAtXmin,
    yAtXmax,
    yAtXmin - yAtXmax,
    xspan,
    xspan / 3,
    xspan / 10,
    xmax,
    xmin,
    (xmin + xmax) / 2,
    xmax + xspan / 10,
    xmin - xspan / 10,
    1 / xspan,
    3 / xspan,
    10 / xspan,
    -1 / xspan,
    -3 / xspan,
    -10 / xspan
  ];
  const out: number[] = [];
  for (const v of raw) {
    if (Number.isFinite(v) && !out.some((u) => Math.abs(u - v) <= 1e-12 * Math.max(Math.abs(u), Math.abs(v)))) {
      out.push(v);
    }
  }
  return out;
}

/**
 * Start values for the parameters of `model` without one in `given`
 * (own, finite numbers only: names such as `constructor` are ordinary
 * parameters), from the data (x, y). Deterministic; bounded cost.
 */
export function guessStarts(
  model: IFitModel,
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  given: Readonly<Record<string, number>> = {}
): IStartGuess {
  const names = model.parameters;
  const k = names.length;
  const problems: ICoreMessage[] = [];
  const start = new Array<number>(k).fill(1);
  const free: number[] = [];
  names.forEach((name, j) => {
    const has = Object.prototype.hasOwnProperty.call(given, name);
    const v: unknown = has ? given[name] : undefined;
    if (typeof v === 'number' && Number.isFinite(v)) {
      start[j] = v;
    } else {
      if (has) {
        problems.push(msg('expression.guess.given', 'The start value of %1 is not a finite number; a start value was guessed instead.', quote(name, 24)));
      }
      free.push(j);
    }
  });
  const guessed = free.map((j) => names[j]);
  // Finite points, an even stride through them when there are many.
  const idx: number[] = [];
  const n0 = Math.min(x.length, y.length);
  for (let i = 0; i < n0; i++) {
    if (Number.isFinite(x[i]) && Number.isFinite(y[i])) {
      idx.push(i);
    }
  }
  if (idx.length === 0) {
    problems.push(msg('expression.guess.no-data', 'There are no data points to guess start values from; parameters without a start value start at 1.'));
    return { start, guessed, problems };
  }
  const stride = model.pointwise === true && idx.length > GUESS_POINTS ? idx.length / GUESS_POINTS : 1;
  const pick: number[] = [];
  for (let t = 0; Math.floor(t) < idx.length; t += stride) {
    pick.push(idx[Math.floor(t)]);
  }
  const xs = Float64Array.from(pick, (i) => x[i]);
  const ys = Float64Array.from(pick, (i) => y[i]);
  const m = xs.length;
  const out = new Float64Array(m);
  let evaluations = 0;
  const score = (p: Float64Array): IScore => {
    evaluations++;
    try {
      model.evaluate(p, xs, out);
    } catch {
      return { invalid: m, chi2: Infinity, shape: Infinity };
    }
    let invalid = 0;
    let chi2 = 0;
    let sf = 0;
    let sff = 0;
    let sfy = 0;
    let sy = 0;
    let syy = 0;
    let used = 0;
    for (let i = 0; i < m; i++) {
      const f = out[i];
      if (Number.isFinite(f)) {
        const yi = ys[i];
        const r = yi - f;
        chi2 += r * r;
        sf += f;
        sff += f * f;
        sfy += f * yi;
        sy += yi;
        syy += yi * yi;
        used++;
      } else {
        invalid++;
      }
    }
    let shape = Infinity;
    if (used > 0) {
      // What is left of y after a least-squares fit of α·f + β (centred sums).
      const cyy = syy - (sy * sy) / used;
      const cff = sff - (sf * sf) / used;
      const cfy = sfy - (sf * sy) / used;
      shape = cff > 1e-12 * Math.max(sff, 1e-300) && Number.isFinite(cff) && Number.isFinite(cfy) ? Math.max(0, cyy - (cfy * cfy) / cff) : cyy;
    }
    return {
      invalid,
      chi2: Number.isFinite(chi2) ? chi2 : Number.MAX_VALUE,
      shape: Number.isFinite(shape) ? shape : Number.MAX_VALUE
    };
  };
  const base = Float64Array.from(start);
  if (free.length === 0) {
    const s = score(base);
    if (s.invalid > 0) {
      problems.push(noValues(s.invalid, m, []));
    }
    return { start, guessed, problems };
  }
  const candidates = startCandidates(xs, ys);
  const budgetLeft = (): boolean => evaluations < GUESS_EVALUATIONS;
  /** Best point by χ² among all evaluated. */
  let bestSeen: { p: Float64Array; s: IScore } = { p: base, s: score(base) };
  const note = (p: Float64Array, s: IScore): void => {
    if (better(s, bestSeen.s, 'chi2')) {
      bestSeen = { p: Float64Array.from(p), s };
    }
  };

  /** Coordinate descent on `key` from `from`. */
  const descend = (from: { p: Float64Array; s: IScore }, key: Key): { p: Float64Array; s: IScore } => {
    const p = Float64Array.from(from.p);
    let s = from.s;
    for (let round = 0; round < DESCENT_ROUNDS && budgetLeft(); round++) {
      let improved = false;
      for (const j of free) {
        const keep = p[j];
        let bestValue = keep;
        for (const c of candidates) {
          if (!budgetLeft()) {
            break;
          }
          if (c === keep) {
            continue;
          }
          p[j] = c;
          const t = score(p);
          note(p, t);
          if (better(t, s, key)) {
            s = t;
            bestValue = c;
            improved = true;
          }
        }
        p[j] = bestValue;
        for (const f of SCALE_STEPS) {
          // Keep scaling in one direction while it helps.
          for (let step = 0; step < 12 && budgetLeft() && p[j] !== 0; step++) {
            const previous = p[j];
            p[j] = previous * f;
            const t = score(p);
            note(p, t);
            if (better(t, s, key)) {
              s = t;
              improved = true;
            } else {
              p[j] = previous;
              break;
            }
          }
        }
      }
      if (!improved) {
        break;
      }
    }
    return { p, s };
  };

  // 1. Shape: the all-ones point and a seeded sample of combinations, then descent from the best few.
  const seeds: { p: Float64Array; s: IScore }[] = [bestSeen];
  const rand = random(0x5eed + k * 7919 + m);
  const combos = Math.min(RANDOM_COMBINATIONS, Math.floor(GUESS_EVALUATIONS / 4));
  for (let c = 0; c < combos; c++) {
    const p = Float64Array.from(base);
    for (const j of free) {
      p[j] = candidates[Math.floor(rand() * candidates.length)];
    }
    const s = score(p);
    note(p, s);
    seeds.push({ p, s });
  }
  seeds.sort((a, b) => (better(a.s, b.s, 'shape') ? -1 : better(b.s, a.s, 'shape') ? 1 : 0));
  let bestShape = seeds[0];
  for (const seed of seeds.slice(0, DESCENT_STARTS)) {
    if (!budgetLeft()) {
      break;
    }
    const d = descend(seed, 'shape');
    if (better(d.s, bestShape.s, 'shape')) {
      bestShape = d;
    }
  }
  // 2. Values: descent on χ² itself from the best shape, then from the best point seen.
  const seen = { p: Float64Array.from(bestSeen.p), s: bestSeen.s };
  let best = descend(bestShape, 'chi2');
  if (budgetLeft()) {
    const other = descend(seen, 'chi2');
    if (better(other.s, best.s, 'chi2')) {
      best = other;
    }
  }
  if (better(bestSeen.s, best.s, 'chi2')) {
    best = bestSeen;
  }
  for (const j of free) {
    start[j] = best.p[j];
  }
  if (best.s.invalid === m) {
    // No tried combination gives a number anywhere: from outside, no parameter can be singled out.
    problems.push(
      guessed.length === 1
        ? msg(
            'expression.guess.cannot-start',
            'The fit cannot start: the model gives no number at any tried value of %1. Give a start value for %1.',
            quote(guessed[0], 24)
          )
        : msg(
            'expression.guess.cannot-start-all',
            'The fit cannot start: the model gives no number at any tried combination of start values. Give start values for %1.',
            nameList(guessed)
          )
    );
  } else if (best.s.invalid > 0) {
    problems.push(noValues(best.s.invalid, m, guessed));
  }
  return { start, guessed, problems };
}

function noValues(invalid: number, m: number, guessed: string[]): ICoreMessage {
  return guessed.length > 0
    ? msg(
        'expression.guess.partial',
        'With the guessed start values the model gives no number at %1 of %2 points; if the fit does not start, give start values for %3.',
        invalid,
        m,
        nameList(guessed)
      )
    : msg('expression.guess.given-partial', 'With the given start values the model gives no number at %1 of %2 points.', invalid, m);
}
