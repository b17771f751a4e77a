/**
 * The isotherm job with the panel's default controls (only N_d changed) on
 * tables generated with a fixed seed:
 *   - Arrott–Noakes isotherms (REFERENCES.md B6) with 3D Ising exponents
 *     β = 0.3265, γ = 1.2372 (Pelissetto & Vicari, Phys. Rep. 368, 549 (2002);
 *     REFERENCES.md C2) and 3D Heisenberg exponents β = 0.3689, γ = 1.3960
 *     (Campostrini et al., Phys. Rev. B 65, 144520 (2002); C2); δ = 1 + γ/β
 *     (Widom, B4). Invented material: Tc = 245 K, T1 = 2 K, M1 = 4e5 A/m
 *     (400 emu/cm³); 21 isotherms 235–255 K; internal fields 2e4–1.6e6 A/m;
 *     0.15 % Gaussian noise on M; 0.01 K thermometer jitter per row; the table
 *     holds the applied field of a sample with N_d = 0.2 (SI), H_a = H_int + N_d·M
 *     (REFERENCE.md A5.1), in Oe (C7).
 *   - Exact J = ½ Weiss isotherms (B1): mean-field Tc, β = ½, γ = 1, δ = 3.
 * The 2σ checks hold for about 95 % of seeds each (the σ are statistical);
 * the seed is fixed.
 */
import { describe, expect, it } from 'vitest';
import { messageText } from '../../../src/core/messages';
import type { ICoreMessage } from '../../../src/core/messages';
import { DEFAULT_ISOTHERM_CONTROLS, runIsothermJob } from '../../../src/core/sweeps/index';
import type { IIsothermControls, IIsothermJob, IIsothermReport, IsothermJobAnswer, IsothermStage, IValueSigma } from '../../../src/core/sweeps/index';
import { weissSet } from './generators';
import { jobOf, jobTable, linspace } from './job-data';

const ISING = { beta: 0.3265, gamma: 1.2372 };
const HEISENBERG = { beta: 0.3689, gamma: 1.396 };
const MATERIAL = { Tc: 245, T1: 2, M1: 4e5 };
const N_D = 0.2;

function table(ex: { beta: number; gamma: number }, seed = 1) {
  return jobTable({
    params: { ...MATERIAL, ...ex },
    temperatures: linspace(235, 255, 21),
    fields: linspace(2e4, 1.6e6, 100),
    demagSI: N_D,
    relNoise: 1.5e-3,
    jitterK: 0.01,
    seed
  });
}

function reportOf(a: IsothermJobAnswer): IIsothermReport {
  if (a.status !== 'ok') {
    throw new Error(`expected a report, got ${a.status}${'message' in a ? `: ${messageText(a.message)}` : ''}`);
  }
  return a.report;
}

function codeOf(a: IsothermJobAnswer): string {
  return a.status === 'refused' || a.status === 'needs-unit' ? a.message.code : a.status;
}

/** Every number a view draws (set, Arrott, Banerjee, modified Arrott, Kouvel–Fisher, window, ΔS_M). */
function chartNumbers(r: IIsothermReport): number[] {
  const out: number[] = [];
  const vs = (v: IValueSigma): void => {
    out.push(v.value, v.sigma);
  };
  for (const i of r.set.isotherms) {
    out.push(i.T, ...i.H, ...i.M);
  }
  for (const l of r.arrott.lines) {
    out.push(l.T);
    vs(l.intercept);
    vs(l.slope);
  }
  for (const p of [...r.arrott.spontaneousSquared, ...r.arrott.inverseChi]) {
    out.push(p.T, p.value, p.sigma);
  }
  for (const b of r.banerjee.isotherms) {
    out.push(b.T, b.atMSquared);
    vs(b.minLocalSlope);
  }
  const map = r.modifiedArrott.result;
  if (map) {
    for (const l of map.lines) {
      out.push(l.T);
      vs(l.intercept);
      vs(l.slope);
    }
    for (const p of [...map.spontaneous, ...map.inverseChi]) {
      out.push(p.T, p.value, p.sigma);
    }
  }
  const kf = r.kouvelFisher.result;
  if (kf) {
    for (const s of [kf.below, kf.above]) {
      for (const p of s.points) {
        out.push(p.T, p.value);
      }
      for (const p of s.effective) {
        out.push(p.T, p.exponent);
      }
    }
  }
  for (const c of r.window?.cells ?? []) {
    out.push(c.tMax, c.hMin);
    [c.beta, c.gamma, c.Tc, c.delta, c.deltaCriticalIsotherm].forEach(vs);
  }
  for (const c of r.entropy?.curves ?? []) {
    for (const p of c.points) {
      out.push(p.T, p.dS, p.sigma);
    }
  }
  return out;
}

/** Job on the N_d = 0.2 table, N_d given or not; records the progress stages. */
function run(ex: { beta: number; gamma: number }, demag: IIsothermControls['demag']) {
  const stages: [IsothermStage, number][] = [];
  const answer = runIsothermJob(jobOf(table(ex), demag), { onProgress: (s, f) => stages.push([s, f]) });
  return { report: reportOf(answer), stages };
}

function bias(name: string, r: IIsothermReport, ex: { beta: number; gamma: number }): Record<string, number> {
  const truth = { Tc: MATERIAL.Tc, beta: ex.beta, gamma: ex.gamma, delta: 1 + ex.gamma / ex.beta };
  const out = {
    Tc: r.summary.Tc.value - truth.Tc,
    beta: r.summary.beta.value - truth.beta,
    gamma: r.summary.gamma.value - truth.gamma,
    delta: r.summary.delta.value - truth.delta
  };
  console.log(`${name}: bias without N_d (fit − truth): Tc ${out.Tc.toFixed(4)} K, β ${out.beta.toFixed(5)}, γ ${out.gamma.toFixed(5)}, δ ${out.delta.toFixed(4)}`);
  return out;
}

for (const [name, ex] of [
  ['3D Ising', ISING],
  ['3D Heisenberg', HEISENBERG]
] as const) {
  describe(`isotherm job on Arrott–Noakes data, ${name} exponents`, () => {
    it('with N_d = 0.2 (SI): Tc within 0.1 K; β, γ, δ within 2σ and 3 % of the truth', () => {
      const { report: r, stages } = run(ex, { value: N_D, convention: 'SI' });
      const s = r.summary;
      // Tc of the equation of state (B6) against the generator's Tc
      expect(Math.abs(s.Tc.value - MATERIAL.Tc)).toBeLessThan(0.1);
      // exponents of C2 and δ = 1 + γ/β (Widom, B4)
      const truth: [IValueSigma, number][] = [
        [s.beta, ex.beta],
        [s.gamma, ex.gamma],
        [s.delta, 1 + ex.gamma / ex.beta]
      ];
      for (const [v, t] of truth) {
        expect(v.sigma).toBeGreaterThan(0);
        expect(Math.abs(v.value - t)).toBeLessThanOrEqual(2 * v.sigma);
        expect(Math.abs(v.value - t)).toBeLessThanOrEqual(0.03 * t);
      }
      expect(r.primary.verdict.state).toBe('fits');
      expect(r.primary.start.code).toMatch(/^sweeps\.start\./);
      // covariance of (Tc, β, γ, T1, M1): symmetric, its diagonal the σ²
      const c = r.primary.covariance!;
      expect(c).toHaveLength(5);
      expect(c[0][1]).toBeCloseTo(c[1][0], 12);
      expect(Math.sqrt(c[1][1])).toBeCloseTo(s.beta.sigma, 12);
      expect(r.set.fieldKind).toBe('internal');
      expect(r.warnings.some(w => w.code === 'sweeps.demag-unset')).toBe(false);
      expect(r.fieldUse).toMatchObject({ used: 2100, total: 2100 });
      // every cross-check gives a result and an agreement with its sentence
      for (const x of [r.modifiedArrott, r.kouvelFisher, r.criticalIsotherm, r.collapse]) {
        expect(x.result).not.toBeNull();
        expect(x.agreement.message.code).toMatch(/^sweeps\.agree\./);
      }
      // the collapse minimised from the primary result (B9) lowers its cost
      expect(r.collapse.result!.cost).toBeLessThanOrEqual(r.collapse.result!.startCost);
      expect(r.window!.cells.length).toBeGreaterThan(3);
      expect(r.entropy!.curves).toHaveLength(3);
      expect(r.bootstrap).toBeNull();
      expect(chartNumbers(r).every(Number.isFinite)).toBe(true);
      // postMessage-able: a structured clone holds the same report
      expect(structuredClone(r)).toEqual(r);
      // progress: stages in their order, fractions rising to 1
      const order: IsothermStage[] = ['grouping', 'global', 'cross-checks', 'collapse', 'window', 'entropy'];
      const seen = stages.map(([st]) => st).filter((st, i, a) => i === 0 || a[i - 1] !== st);
      expect(seen).toEqual(order);
      for (let i = 1; i < stages.length; i++) {
        expect(stages[i][1]).toBeGreaterThanOrEqual(stages[i - 1][1]);
      }
      expect(stages.at(-1)![1]).toBe(1);
    });

    it('without N_d: the report warns that the field is the applied one, and the biases are finite', () => {
      const { report: r } = run(ex, null);
      expect(r.warnings.filter(w => w.code === 'sweeps.demag-unset')).toHaveLength(1);
      expect(r.set.fieldKind).toBe('applied');
      const b = bias(name, r, ex);
      expect(Object.values(b).every(Number.isFinite)).toBe(true);
      expect(chartNumbers(r).every(Number.isFinite)).toBe(true);
    });
  });
}

describe('isotherm job on exact Weiss J = 1/2 isotherms', () => {
  // B1: h = τ artanh(m) − m; T = 1000τ K so that 1 K separates the isotherms (default grouping
  // tolerance 0.5 K); H = 1e7·h A/m and M = 1e6·m A/m (scales do not change exponents or Tc)
  const taus = linspace(0.985, 1.015, 31);
  const hs = linspace(1e-5, 2e-3, 200);
  const set = weissSet(taus, hs);
  const T: number[] = [];
  const H: number[] = [];
  const M: number[] = [];
  for (const iso of set.isotherms) {
    for (let i = 0; i < iso.H.length; i++) {
      T.push(1000 * iso.T);
      H.push(1e7 * iso.H[i]);
      M.push(1e6 * iso.M[i]);
    }
  }
  const job: IIsothermJob = {
    temperature: { name: 'T', unit: 'K', values: T },
    field: { name: 'H', unit: 'A/m', values: H },
    magnetisation: { name: 'M', unit: 'A/m', values: M },
    controls: { ...DEFAULT_ISOTHERM_CONTROLS, demag: { value: 0, convention: 'SI' } }
  };
  const r = reportOf(runIsothermJob(job));

  it('Arrott Tc within 1e-3 relative; primary β, γ, δ within 0.02 of 1/2, 1, 3', () => {
    // mean field (B1, C2): β = 1/2, γ = 1, δ = 3, Tc = 1000 K here
    expect(Math.abs(r.arrott.Tc.value - 1000) / 1000).toBeLessThan(1e-3);
    expect(Math.abs(r.summary.beta.value - 0.5)).toBeLessThan(0.02);
    expect(Math.abs(r.summary.gamma.value - 1)).toBeLessThan(0.02);
    expect(Math.abs(r.summary.delta.value - 3)).toBeLessThan(0.02);
    expect(Math.abs(r.summary.Tc.value - 1000) / 1000).toBeLessThan(1e-3);
  });

  it('cross-checks give β, γ, δ within 0.02 of the mean-field values', () => {
    const map = r.modifiedArrott.result!;
    const kf = r.kouvelFisher.result!;
    const col = r.collapse.result!;
    const crit = r.criticalIsotherm.result!;
    for (const [b, g] of [
      [map.beta.value, map.gamma.value],
      [kf.below.exponent.value, kf.above.exponent.value],
      [col.beta.value, col.gamma.value]
    ]) {
      expect(Math.abs(b - 0.5)).toBeLessThan(0.02);
      expect(Math.abs(g - 1)).toBeLessThan(0.02);
    }
    // critical isotherm at the primary Tc: h ∝ m³ (B1)
    expect(Math.abs(crit.delta.value - 3)).toBeLessThan(0.02);
    expect(crit.delta.sigma).toBeGreaterThan(0);
  });
});

describe('isotherm job: demagnetisation that makes the internal field negative', () => {
  it('N_d = 0.3 on a sample of N_d = 0.2: one warning naming the isotherms and points, nothing NaN drawn', () => {
    const t = table(ISING);
    const r = reportOf(runIsothermJob(jobOf(t, { value: 0.3, convention: 'SI' })));
    const w = r.warnings.filter(m => m.code === 'sweeps.job.demag-negative');
    expect(w).toHaveLength(1);
    const [nd, points, temps] = w[0].args;
    expect(nd).toMatchObject({ value: 0.3 });
    expect(Number(points)).toBeGreaterThan(0);
    expect(String(temps)).toContain('235');
    // the points left out are those with H_a − 0.3·M ≤ 0 (A5.1)
    let expected = 0;
    for (let i = 0; i < t.H.length; i++) {
      const Ha = t.H[i] / ((4 * Math.PI) / 1000);
      if (Ha - 0.3 * t.M[i] * 1e3 <= 0) {
        expected++;
      }
    }
    expect(Number(points)).toBe(expected);
    expect(r.fieldUse.used).toBe(2100 - expected);
    expect(r.warnings.map(m => m.code)).toEqual([...new Set(r.warnings.map(m => m.code))]);
    expect(chartNumbers(r).every(Number.isFinite)).toBe(true);
    expect(Math.min(...r.set.isotherms.map(i => i.H[0]))).toBeGreaterThan(0);
  });

  it('N_d so large that nothing is left: refused with one message', () => {
    // low fields only (up to 400 Oe): H_a − M ≤ 0 at every point below and near Tc
    const t = jobTable({ params: { ...MATERIAL, ...ISING }, temperatures: linspace(235, 244, 10), fields: linspace(2e3, 3e4, 30), demagSI: 0.2, relNoise: 0, jitterK: 0, seed: 1 });
    const a = runIsothermJob(jobOf(t, { value: 4 * Math.PI, convention: 'cgs' }));
    expect(a.status).toBe('refused');
    expect(codeOf(a)).toBe('sweeps.job.demag-nothing-left');
    expect(messageText((a as { message: ICoreMessage }).message)).toContain('N_d = 1');
  });
});

describe('isotherm job: edge inputs and controls', () => {
  const t = table(ISING);

  it('refuses empty columns, one isotherm, and tables with no finite rows', () => {
    expect(codeOf(runIsothermJob(jobOf({ T: [], H: [], M: [] })))).toBe('sweeps.job.empty');
    const one = { T: t.T.slice(0, 100), H: t.H.slice(0, 100), M: t.M.slice(0, 100) };
    expect(codeOf(runIsothermJob(jobOf(one)))).toBe('sweeps.job.few-isotherms');
    const nan = { T: [NaN, 1, Infinity], H: [1, NaN, 2], M: [1, 2, -Infinity] };
    expect(codeOf(runIsothermJob(jobOf(nan)))).toBe('sweeps.job.no-points');
    const lengths = { T: [1, 2], H: [1], M: [1, 2] };
    expect(codeOf(runIsothermJob(jobOf(lengths)))).toBe('sweeps.column-lengths');
  });

  it('leaves out NaN and ±∞ cells with one warning; analyses the rest', () => {
    const T = t.T.slice();
    const H = t.H.slice();
    const M = t.M.slice();
    T[5] = NaN;
    H[300] = Infinity;
    M[900] = -Infinity;
    M[901] = NaN;
    const r = reportOf(runIsothermJob(jobOf({ T, H, M }, { value: N_D, convention: 'SI' })));
    expect(r.warnings.filter(w => w.code === 'sweeps.rows-dropped')).toHaveLength(1);
    expect(r.fieldUse).toMatchObject({ used: 2096, total: 2100 });
    expect(Math.abs(r.summary.Tc.value - MATERIAL.Tc)).toBeLessThan(0.1);
    expect(chartNumbers(r).every(Number.isFinite)).toBe(true);
  });

  it('takes repeated rows once: the result as without them (the isotherms’ mean T still counts each row)', () => {
    const base = reportOf(runIsothermJob(jobOf(t, { value: N_D, convention: 'SI' })));
    const idx = [...Array(t.T.length).keys()].flatMap(i => (i % 7 === 0 ? [i, i] : [i]));
    const dup = { T: idx.map(i => t.T[i]), H: idx.map(i => t.H[i]), M: idx.map(i => t.M[i]) };
    const r = reportOf(runIsothermJob(jobOf(dup, { value: N_D, convention: 'SI' })));
    expect(r.warnings.filter(w => w.code === 'sweeps.job.repeated-points')).toHaveLength(1);
    expect(r.fieldUse.used).toBe(base.fieldUse.used);
    for (const k of ['Tc', 'beta', 'gamma'] as const) {
      expect(Math.abs(r.summary[k].value - base.summary[k].value)).toBeLessThan(0.5 * base.summary[k].sigma);
    }
  });

  it('refuses bad controls with a precise message each', () => {
    const bad: [Partial<IIsothermControls>, string][] = [
      [{ temperatureToleranceK: -0.1 }, 'sweeps.job.tolerance'],
      [{ temperatureToleranceK: NaN }, 'sweeps.job.tolerance'],
      [{ fieldMin: 5000, fieldMax: 100 }, 'sweeps.job.field-range'],
      [{ fieldMin: Infinity }, 'sweeps.job.field-min'],
      [{ tMax: 0 }, 'sweeps.job.t-max'],
      [{ tMax: -0.05 }, 'sweeps.job.t-max'],
      [{ sampleMassMg: 0 }, 'sweeps.job.mass'],
      [{ densityGPerCm3: -7 }, 'sweeps.job.density'],
      [{ bootstrapSamples: 1 }, 'sweeps.job.bootstrap'],
      [{ bootstrapSamples: 2.5 }, 'sweeps.job.bootstrap'],
      [{ demag: { value: 1.2, convention: 'SI' } }, 'sweeps.demag-out-of-range-si'],
      [{ demag: { value: 13, convention: 'cgs' } }, 'sweeps.demag-out-of-range-cgs'],
      [{ demag: { value: -0.1, convention: 'SI' } }, 'sweeps.demag-out-of-range-si'],
      [{ demag: { value: NaN, convention: 'SI' } }, 'sweeps.demag-not-finite']
    ];
    for (const [controls, code] of bad) {
      const job = jobOf(t);
      const a = runIsothermJob({ ...job, controls: { ...job.controls, ...controls } });
      expect([JSON.stringify(controls), a.status, codeOf(a)]).toEqual([JSON.stringify(controls), 'refused', code]);
      expect(messageText((a as { message: ICoreMessage }).message)).not.toMatch(/%\d/);
    }
  });

  it('asks for a missing unit with the accepted ones; a unit typed over the header answers it', () => {
    const job = jobOf(t);
    const noUnit: IIsothermJob = { ...job, field: { ...job.field, name: 'H', unit: null } };
    const a = runIsothermJob(noUnit);
    expect(a.status).toBe('needs-unit');
    expect(a.status === 'needs-unit' && a.options).toContain('Oe');
    const typed = runIsothermJob({ ...noUnit, controls: { ...noUnit.controls, units: { ...noUnit.controls.units, field: 'Oe' }, demag: { value: N_D, convention: 'SI' } } });
    expect(Math.abs(reportOf(typed).summary.Tc.value - MATERIAL.Tc)).toBeLessThan(0.1);
  });

  it('uses the field range in the field column’s own unit', () => {
    // Oe range 300–15000 (C7: 1 Oe = 1000/(4π) A/m)
    const job = jobOf(t, { value: N_D, convention: 'SI' });
    const r = reportOf(runIsothermJob({ ...job, controls: { ...job.controls, fieldMin: 300, fieldMax: 15000 } }));
    const inRange = t.H.filter(h => h >= 300 && h <= 15000).length;
    expect(r.fieldUse.used).toBe(inRange);
    const applied = r.set.isotherms.flatMap(i => Array.from(i.H, (h, k) => h + N_D * i.M[k]));
    expect(Math.min(...applied)).toBeGreaterThanOrEqual((300 * 1000) / (4 * Math.PI) - 1e-6);
    expect(Math.max(...applied)).toBeLessThanOrEqual((15000 * 1000) / (4 * Math.PI) + 1e-6);
  });

  it('runs the bootstrap over isotherms when asked', () => {
    const job = jobOf(t, { value: N_D, convention: 'SI' });
    const r = reportOf(runIsothermJob({ ...job, controls: { ...job.controls, bootstrapSamples: 8 } }));
    expect(r.bootstrap).not.toBeNull();
    expect(r.bootstrap!.samples).toBe(8);
    expect(Number.isFinite(r.bootstrap!.beta.sd)).toBe(true);
  });
});

describe('isotherm job: cancel', () => {
  const job = jobOf(table(ISING), { value: N_D, convention: 'SI' });

  it('stops when shouldStop says so, before the first stage or inside one', () => {
    expect(runIsothermJob(job, { shouldStop: () => true })).toEqual({ status: 'cancelled' });
    for (const at of ['global', 'cross-checks', 'window'] as IsothermStage[]) {
      let stop = false;
      const stages: IsothermStage[] = [];
      const a = runIsothermJob(job, {
        onProgress: s => {
          stages.push(s);
          stop = stop || s === at;
        },
        shouldStop: () => stop
      });
      expect(a).toEqual({ status: 'cancelled' });
      expect(stages.at(-1)).toBe(at);
    }
  });
});
