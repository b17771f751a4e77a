/**
 * Reader for NIST StRD nonlinear regression files (test helper).
 * Source of the data and certified values: NIST Statistical Reference
 * Datasets, Nonlinear Regression, Information Technology Laboratory,
 * National Institute of Standards and Technology (public domain). The files
 * live in the repository, test/reference/nist-strd (see its README.md).
 */
import { existsSync, readFileSync, readdirSync } from 'node:fs';
import * as path from 'node:path';
import { decimalToDoubleDouble } from '../../../src/core/numeric/dd/index';

/** One parsed StRD problem. */
export interface INistProblem {
  name: string;
  /** Model text as printed, e.g. `y = b1*(1-exp[-b2*x])` (error term removed). */
  modelText: string;
  /** Named constants printed with the model (e.g. `pi`). */
  constants: Record<string, number>;
  parameters: string[];
  start1: number[];
  start2: number[];
  certified: number[];
  certifiedSd: number[];
  certifiedRss: number;
  /** Column names of the data block, in file order (e.g. ['y', 'x']). */
  columns: string[];
  /** Data by column name. */
  data: Record<string, number[]>;
  /**
   * Low-order parts by column name: the printed decimal is exactly
   * data[c][i] + dataLow[c][i] to double-double precision.
   */
  dataLow: Record<string, number[]>;
}

/** Directory of the StRD files (test/reference/nist-strd); throws when absent. */
export function nistDirectory(): string {
  const dir = path.resolve(__dirname, '../../reference/nist-strd');
  if (!existsSync(dir)) {
    throw new Error(`NIST StRD files not found at ${dir}`);
  }
  return dir;
}

/** Names of the available datasets (file stems), sorted. */
export function nistNames(dir: string): string[] {
  return readdirSync(dir)
    .filter((f) => f.endsWith('.dat'))
    .map((f) => f.slice(0, -4))
    .sort();
}

const NUMBER = /^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/;

/** Parses one `.dat` file. */
export function parseNist(file: string): INistProblem {
  const lines = readFileSync(file, 'utf8').split(/\r?\n/);
  const name = path.basename(file, '.dat');
  // Model block: lines after "N Parameters (...)" up to the "Starting values" header.
  const paramLine = lines.findIndex((l) => /\d+\s+Parameters?\s*\(/.test(l));
  const startHeader = lines.findIndex((l, i) => i > paramLine && /Starting\s+values/i.test(l));
  const constants: Record<string, number> = {};
  const equation: string[] = [];
  for (const raw of lines.slice(paramLine + 1, startHeader)) {
    const l = raw.trim();
    if (l === '') {
      continue;
    }
    const cm = /^([A-Za-z_]\w*)\s*=\s*(\S+)$/.exec(l);
    if (cm && NUMBER.test(cm[2])) {
      constants[cm[1]] = Number(cm[2]);
      continue;
    }
    equation.push(l);
  }
  const modelText = equation
    .join(' ')
    .replace(/\+\s*e\s*$/, '')
    .trim();
  const parameters: string[] = [];
  const start1: number[] = [];
  const start2: number[] = [];
  const certified: number[] = [];
  const certifiedSd: number[] = [];
  let certifiedRss = Number.NaN;
  let dataStart = -1;
  let columns: string[] = [];
  lines.forEach((l, i) => {
    const pm = /^\s*(b\d+)\s*=\s*(\S+)\s+(\S+)\s+(\S+)\s+(\S+)\s*$/.exec(l);
    if (pm && i > startHeader) {
      parameters.push(pm[1]);
      start1.push(Number(pm[2]));
      start2.push(Number(pm[3]));
      certified.push(Number(pm[4]));
      certifiedSd.push(Number(pm[5]));
    }
    const rm = /^Residual Sum of Squares:\s*(\S+)/.exec(l);
    if (rm) {
      certifiedRss = Number(rm[1]);
    }
    const dm = /^Data:\s+((?:[A-Za-z]\w*\s*)+)$/.exec(l);
    if (dm && dataStart < 0) {
      const cols = dm[1].trim().split(/\s+/);
      if (cols.every((c) => /^[a-z]\w*$/.test(c))) {
        columns = cols;
        dataStart = i + 1;
      }
    }
  });
  if (dataStart < 0 || parameters.length === 0 || !Number.isFinite(certifiedRss)) {
    throw new Error(`cannot parse ${file}`);
  }
  const data: Record<string, number[]> = {};
  const dataLow: Record<string, number[]> = {};
  for (const c of columns) {
    data[c] = [];
    dataLow[c] = [];
  }
  for (const l of lines.slice(dataStart)) {
    const parts = l.trim().split(/\s+/);
    if (parts.length === columns.length && parts.every((p) => NUMBER.test(p))) {
      parts.forEach((p, j) => {
        const v = decimalToDoubleDouble(p);
        data[columns[j]].push(v.hi);
        dataLow[columns[j]].push(v.lo);
      });
    }
  }
  return {
    name,
    modelText,
    constants,
    parameters,
    start1,
    start2,
    certified,
    certifiedSd,
    certifiedRss,
    columns,
    data,
    dataLow
  };
}

/**
 * Log relative error −log10(|est − cert| / |cert|), capped at `digits`
 * (11 for the StRD certified values); 0 for non-finite estimates.
 */
export function lre(estimate: number, certified: number, digits = 11): number {
  if (!Number.isFinite(estimate)) {
    return 0;
  }
  const err = certified === 0 ? Math.abs(estimate) : Math.abs(estimate - certified) / Math.abs(certified);
  if (err === 0) {
    return digits;
  }
  return Math.max(0, Math.min(digits, -Math.log10(err)));
}
