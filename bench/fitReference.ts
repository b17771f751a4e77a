/**
 * Runs ../shared/bench/reference_fits.py (SciPy / lmfit) when Debian's
 * python3 has scipy and lmfit, and parses its JSON.
 */
import { spawnSync } from 'node:child_process';
import * as path from 'node:path';

export interface IBenchArgs {
  repeats: number;
  skipReference: boolean;
  maxN: number;
  jsonPart: string | null;
  /** Keep the reference JSON and data dump in this folder (for --reuse-reference). */
  keepReference: string | null;
  /** Read a kept reference instead of running SciPy (ratios then come from two runs: for development only). */
  reuseReference: string | null;
  /** Only workloads whose name contains this text (and no NIST unless it matches 'nist'). */
  only: string | null;
}

/**
 * Best of how many timed runs, for SciPy and psiscape alike (the reference
 * script is given the same number). Ten rather than the reference script's
 * own default of five: on the shared 2-core machine the shortest fits
 * (under 1 ms) move by up to 2× between runs, and more runs steady both
 * sides' best times.
 */
export const DEFAULT_REPEATS = 10;

export function parseArgs(argv: string[]): IBenchArgs {
  const out: IBenchArgs = { repeats: DEFAULT_REPEATS, skipReference: false, maxN: 0, jsonPart: null, keepReference: null, reuseReference: null, only: null };
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (a === '--repeats') {
      out.repeats = Math.max(1, Number(argv[++i]));
    } else if (a === '--skip-reference') {
      out.skipReference = true;
    } else if (a === '--max-n') {
      out.maxN = Number(argv[++i]);
    } else if (a === '--json-part') {
      out.jsonPart = argv[++i];
    } else if (a === '--keep-reference') {
      out.keepReference = argv[++i];
    } else if (a === '--reuse-reference') {
      out.reuseReference = argv[++i];
    } else if (a === '--workload') {
      out.only = argv[++i];
    }
  }
  return out;
}

export interface IRefFit {
  method: string;
  start?: number;
  time_best_s: number | null;
  nfev?: number | null;
  converged?: boolean;
}

export interface IReferenceDoc {
  meta: unknown;
  nist: { name: string; fits: IRefFit[] }[] | null;
  synthetic:
    | {
        workload: string;
        n: number;
        data_sha256: { T: string; y: string };
        dumped_files?: string[];
        fits: IRefFit[];
      }[]
    | null;
}

const PYTHON = '/usr/bin/python3';

/**
 * Untimed runs of `fn` so that V8 has compiled its hot code before it is
 * timed (SciPy's compiled code needs no such start): at least 3 runs and
 * until 0.3 s or 200 runs have passed.
 */
export function warmUp(fn: () => void): void {
  const t0 = process.hrtime.bigint();
  for (let r = 0; r < 200; r++) {
    fn();
    if (r >= 2 && Number(process.hrtime.bigint() - t0) > 3e8) {
      return;
    }
  }
}

/** Best wall time in seconds of `repeats` runs of `fn`. */
export function bestOf(repeats: number, fn: () => void): number {
  let best = Infinity;
  for (let r = 0; r < repeats; r++) {
    const t0 = process.hrtime.bigint();
    fn();
    best = Math.min(best, Number(process.hrtime.bigint() - t0) / 1e9);
  }
  return best;
}

/** Runs the reference script, dumping synthetic data to `dumpDir`; null when unavailable. */
export function referenceJson(shared: string, dumpDir: string, args: IBenchArgs): IReferenceDoc | null {
  const script = path.join(shared, 'bench', 'reference_fits.py');
  const probe = spawnSync(PYTHON, ['-c', 'import numpy, scipy, lmfit'], { encoding: 'utf8' });
  if (probe.status !== 0) {
    console.log('python3-scipy / python3-lmfit not installed: reference run skipped, no ratios');
    return null;
  }
  const cmd = [script, '--dump-synthetic', dumpDir, '--repeats', String(args.repeats)];
  if (args.maxN) {
    cmd.push('--max-n', String(args.maxN));
  }
  console.log(`running ${PYTHON} ${cmd.join(' ')} …`);
  const run = spawnSync(PYTHON, cmd, { encoding: 'utf8', maxBuffer: 1 << 30 });
  if (run.status !== 0) {
    console.log(`reference run failed (status ${run.status}): ${run.stderr.slice(-2000)}`);
    return null;
  }
  console.log(run.stderr);
  return JSON.parse(run.stdout) as IReferenceDoc;
}
