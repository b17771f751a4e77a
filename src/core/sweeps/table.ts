/**
 * Long-format M(H, T) table → isotherm family. Rows are grouped by
 * temperature setpoint with a tolerance (single linkage on sorted T), split
 * into up and down branches (from a branch column, or from the sign of the
 * field steps in row order), converted to SI, normalised by sample mass /
 * molar mass / density, and corrected for demagnetisation when N_d is given.
 */
import { msg } from '../messages';
import type { ICoreMessage } from '../messages';
import { wholeNumber } from '../numeric/messageArgs';
import { massFromMolar, readColumnUnit, toSI } from '../units/index';
import type { INeedsUnit, IUnitConversion, IUnitRefusal } from '../units/index';
import type { IDemagnetisingFactor } from './demag';
import { demagnetisingFactorSI, volumeMagnetisation } from './demag';
import type { Branch, IIsotherm, IIsothermSet } from './types';
import { DEMAG_UNSET_WARNING, SweepInputError } from './types';

/** A column as parsed from a table (see `IColumn` in the table module). */
export interface ISweepColumn {
  name: string;
  unit: string | null;
  values: ArrayLike<number> | readonly (string | boolean | null)[];
}

/** Sample data needed to normalise moments. */
export interface ISampleInfo {
  massKg?: number;
  densityKgPerM3?: number;
  molarMassKgPerMol?: number;
}

/** Input of {@link buildIsothermSet}. */
export interface IIsothermTableInput {
  temperature: ISweepColumn;
  field: ISweepColumn;
  magnetisation: ISweepColumn;
  /** Optional branch flag column: 'up'/'down' (also 'inc'/'dec', '+'/'-') or signed numbers. */
  branch?: ISweepColumn;
  sample?: ISampleInfo;
  /** Demagnetising factor; unset → applied field with a warning. */
  demag?: IDemagnetisingFactor;
  /** Grouping tolerance on temperature, K (default 0.5). */
  temperatureTolerance?: number;
  /** Units supplied by the user for columns whose unit was missing or ambiguous, by column name. */
  unitOverrides?: Record<string, string>;
}

/** A sample parameter is required for the requested normalisation. */
export interface INeedsSample {
  status: 'needs-sample';
  parameter: keyof ISampleInfo;
  /** Which sample parameter is needed and why (codes `sweeps.needs-*`). */
  message: ICoreMessage;
}

/** Outcome of building an isotherm family. */
export type IsothermSetAnswer = { status: 'ok'; set: IIsothermSet } | INeedsUnit | IUnitRefusal | INeedsSample;

function numeric(col: ISweepColumn): Float64Array {
  const v = col.values;
  const out = new Float64Array(v.length);
  for (let i = 0; i < v.length; i++) {
    const x = v[i];
    out[i] = typeof x === 'number' ? x : NaN;
  }
  return out;
}

function branchOf(x: unknown): Branch {
  if (typeof x === 'number') {
    return x > 0 ? 'up' : x < 0 ? 'down' : 'unspecified';
  }
  if (typeof x === 'string') {
    const s = x.trim().toLowerCase();
    if (/^(up|inc|increasing|ascending|\+)/.test(s)) {
      return 'up';
    }
    if (/^(down|dec|decreasing|descending|-)/.test(s)) {
      return 'down';
    }
  }
  return 'unspecified';
}

/** Groups sorted temperatures: a new group starts where the gap to the previous value exceeds tol. */
function groupTemperatures(T: Float64Array, valid: boolean[], tol: number): number[] {
  const idx: number[] = [];
  for (let i = 0; i < T.length; i++) {
    if (valid[i]) {
      idx.push(i);
    }
  }
  idx.sort((a, b) => T[a] - T[b]);
  const group = new Array<number>(T.length).fill(-1);
  let g = -1;
  let prev = -Infinity;
  for (const i of idx) {
    if (T[i] - prev > tol) {
      g++;
    }
    group[i] = g;
    prev = T[i];
  }
  return group;
}

/** Splits one group's rows (in row order) into monotonic field runs. */
function detectBranches(rows: number[], H: Float64Array): Branch[] {
  const out = new Array<Branch>(rows.length).fill('unspecified');
  let dir: Branch = 'unspecified';
  for (let k = 1; k < rows.length; k++) {
    const d = H[rows[k]] - H[rows[k - 1]];
    if (d > 0) {
      dir = 'up';
    } else if (d < 0) {
      dir = 'down';
    }
    out[k] = dir;
  }
  // rows before the first field change take the direction of the first change
  const firstDir = out.find(b => b !== 'unspecified') ?? 'unspecified';
  for (let k = 0; k < out.length && out[k] === 'unspecified'; k++) {
    out[k] = firstDir;
  }
  return out;
}

function resolve(col: ISweepColumn, role: 'temperature' | 'field' | 'magnetisation', overrides?: Record<string, string>) {
  const unit = overrides?.[col.name] ?? col.unit;
  return readColumnUnit(col.name, unit, role);
}

/** Builds the isotherm family; never guesses a unit (see `IsothermSetAnswer`). */
export function buildIsothermSet(input: IIsothermTableInput): IsothermSetAnswer {
  const n = input.temperature.values.length;
  if (input.field.values.length !== n || input.magnetisation.values.length !== n) {
    throw new SweepInputError(
      msg(
        'sweeps.column-lengths',
        'The columns differ in length (T %1, H %2, M %3 rows): give one value of each per row.',
        wholeNumber(n),
        wholeNumber(input.field.values.length),
        wholeNumber(input.magnetisation.values.length)
      )
    );
  }
  if (input.branch !== undefined && input.branch.values.length !== n) {
    throw new SweepInputError(
      msg('sweeps.branch-column-length', 'The branch column has %1 rows, but the other columns have %2.', wholeNumber(input.branch.values.length), wholeNumber(n))
    );
  }
  const tol = input.temperatureTolerance ?? 0.5;
  if (!(tol >= 0) || !Number.isFinite(tol)) {
    throw new SweepInputError(
      msg('sweeps.tolerance-invalid', 'The temperature grouping tolerance must be a finite number of kelvin, at least 0, but it is %1.', typeof tol === 'number' ? tol : String(tol))
    );
  }
  const uT = resolve(input.temperature, 'temperature', input.unitOverrides);
  const uH = resolve(input.field, 'field', input.unitOverrides);
  const uM = resolve(input.magnetisation, 'magnetisation', input.unitOverrides);
  for (const u of [uT, uH, uM]) {
    if (u.status !== 'ok') {
      return u;
    }
  }
  const cT = uT as IUnitConversion;
  const cH = uH as IUnitConversion;
  const cM = uM as IUnitConversion;
  const sample = input.sample ?? {};
  const warnings: ICoreMessage[] = [];
  const conventions: ICoreMessage[] = [
    msg('sweeps.convention.temperature-unit', 'Temperatures converted from %1 to K.', cT.userUnit),
    cH.fieldForm === 'mu0H'
      ? msg('sweeps.convention.field-unit-mu0h', 'Fields converted from %1 to A/m (μ0H divided by μ0, CODATA 2018).', cH.userUnit)
      : msg('sweeps.convention.field-unit', 'Fields converted from %1 to A/m.', cH.userUnit)
  ];
  let M = toSI(numeric(input.magnetisation), cM);
  let unit: 'A/m' | 'A m^2/kg' = 'A m^2/kg';
  if (cM.basis === 'moment') {
    if (sample.massKg === undefined) {
      return {
        status: 'needs-sample',
        parameter: 'massKg',
        message: msg('sweeps.needs-mass', 'Column “%1” holds a moment (%2): the sample mass is needed to normalise it.', cM.column, cM.userUnit)
      };
    }
    if (!(sample.massKg > 0)) {
      throw new SweepInputError(msg('sweeps.mass-invalid', 'The sample mass must be above 0 kg, but it is %1 kg.', sample.massKg));
    }
    M = M.map(v => v / (sample.massKg as number));
    conventions.push(msg('sweeps.convention.per-mass', 'Moments divided by the sample mass, %1 kg.', { value: sample.massKg, digits: 6 }));
  } else if (cM.basis === 'molar') {
    if (sample.molarMassKgPerMol === undefined) {
      return {
        status: 'needs-sample',
        parameter: 'molarMassKgPerMol',
        message: msg('sweeps.needs-molar-mass', 'Column “%1” is per mole or per formula unit (%2): the molar mass is needed to normalise it.', cM.column, cM.userUnit)
      };
    }
    M = massFromMolar(M, sample.molarMassKgPerMol);
    conventions.push(
      msg('sweeps.convention.per-formula-unit', 'Values per formula unit converted with the molar mass %1 kg/mol (N_A·μB, CODATA 2018).', { value: sample.molarMassKgPerMol, digits: 6 })
    );
  } else if (cM.basis === 'volume') {
    unit = 'A/m';
  }
  if (unit === 'A m^2/kg' && sample.densityKgPerM3 !== undefined) {
    M = volumeMagnetisation(M, sample.densityKgPerM3);
    unit = 'A/m';
    conventions.push(msg('sweeps.convention.volume', 'Volume magnetisation = mass magnetisation × density %1 kg/m³.', { value: sample.densityKgPerM3, digits: 6 }));
  }
  const Ha = toSI(numeric(input.field), cH);
  let H = Ha;
  let nSI: number | null = null;
  if (input.demag !== undefined) {
    nSI = demagnetisingFactorSI(input.demag);
    if (unit !== 'A/m') {
      return {
        status: 'needs-sample',
        parameter: 'densityKgPerM3',
        message: msg('sweeps.needs-density', 'The demagnetisation correction needs a volume magnetisation: give the sample density.')
      };
    }
    H = Ha.map((h, i) => h - (nSI as number) * M[i]);
    conventions.push(msg('sweeps.convention.internal-field', 'Internal field H_int = H_a − N_d·M with N_d (SI) = %1.', { value: nSI, digits: 6 }));
  } else {
    warnings.push(DEMAG_UNSET_WARNING);
  }
  const T = toSI(numeric(input.temperature), cT);
  const valid: boolean[] = [];
  let dropped = 0;
  for (let i = 0; i < n; i++) {
    const ok = Number.isFinite(T[i]) && Number.isFinite(H[i]) && Number.isFinite(M[i]);
    valid.push(ok);
    if (!ok) {
      dropped++;
    }
  }
  if (dropped > 0) {
    warnings.push(msg('sweeps.rows-dropped', 'Rows left out for a missing or non-finite T, H or M: %1.', wholeNumber(dropped)));
  }
  const group = groupTemperatures(T, valid, tol);
  const groups = new Map<number, number[]>();
  for (let i = 0; i < n; i++) {
    if (group[i] >= 0) {
      const list = groups.get(group[i]) ?? [];
      list.push(i);
      groups.set(group[i], list);
    }
  }
  const isotherms: IIsotherm[] = [];
  for (const rows of groups.values()) {
    const br: Branch[] = input.branch !== undefined ? rows.map(r => branchOf((input.branch as ISweepColumn).values[r])) : detectBranches(rows, Ha);
    for (const b of ['up', 'down', 'unspecified'] as Branch[]) {
      const sel = rows.filter((_r, k) => br[k] === b);
      if (sel.length === 0) {
        continue;
      }
      let tMin = Infinity;
      let tMax = -Infinity;
      let tSum = 0;
      for (const r of sel) {
        tMin = Math.min(tMin, T[r]);
        tMax = Math.max(tMax, T[r]);
        tSum += T[r];
      }
      sel.sort((a, c) => H[a] - H[c]);
      isotherms.push({
        T: tSum / sel.length,
        TSpread: tMax - tMin,
        branch: b,
        H: Float64Array.from(sel, r => H[r]),
        M: Float64Array.from(sel, r => M[r]),
        rows: sel
      });
      if (tMax - tMin > 2 * tol && tol > 0) {
        warnings.push(
          msg(
            'sweeps.isotherm-spread',
            'The isotherm near %1 K spans %2 K, more than twice the grouping tolerance: its temperatures may not be on one setpoint.',
            { value: tSum / sel.length, digits: 6 },
            tMax - tMin
          )
        );
      }
    }
  }
  isotherms.sort((a, b) => a.T - b.T || a.branch.localeCompare(b.branch));
  return {
    status: 'ok',
    set: {
      isotherms,
      fieldKind: nSI === null ? 'applied' : 'internal',
      magnetisationUnit: unit,
      demagnetisingFactorSI: nSI,
      display: { temperature: cT.userUnit, field: cH.userUnit, magnetisation: cM.userUnit },
      conventions,
      warnings
    }
  };
}
