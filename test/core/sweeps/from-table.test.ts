/**
 * From a CSV cell output (parsed by the table module) to an Arrott Tc:
 * exact J = ½ Weiss isotherms (REFERENCE.md B1) written in lab units — T in K
 * with ±0.02 K jitter, field in Oe, moment in emu of a 20 mg sample — with
 * both sweep directions in long format.
 */
import { describe, expect, it } from 'vitest';
import { PHYS, solveWeiss } from '../../../src/core/physics/index';
import { parseMime } from '../../../src/core/table/index';
import type { IColumn } from '../../../src/core/table/index';
import { arrottAnalysis, buildIsothermSet } from '../../../src/core/sweeps/index';
import { linspace, mulberry32 } from './generators';

describe('long-format CSV to isotherm analysis', () => {
  it('recovers Tc = 300 K (Weiss) within 0.3 K from a CSV in Oe and emu, analysing the up branch', () => {
    const Tc = 300;
    const massKg = 2e-5;
    const sigmaS = 100; // A m^2/kg at saturation (arbitrary)
    const u = mulberry32(3);
    const lines = ['T (K),H (Oe),m (emu)'];
    const hs = linspace(1e-5, 2e-3, 60);
    for (const tau of linspace(0.985, 1.015, 13)) {
      const T = tau * Tc;
      const m = solveWeiss(0.5, new Float64Array(hs.length).fill(tau), Float64Array.from(hs)).m;
      const rows: string[] = [];
      hs.forEach((h, i) => {
        const HOe = ((h * PHYS.kB * Tc) / (PHYS.muB * PHYS.mu0)) * (4 * Math.PI) / 1000;
        // moment in emu: sigma (A m^2/kg) x mass (kg) / 1e-3 (C7)
        rows.push(`${(T + (u() - 0.5) * 0.04).toFixed(3)},${HOe.toPrecision(12)},${((m[i] * sigmaS * massKg) / 1e-3).toPrecision(12)}`);
      });
      lines.push(...rows, ...rows.slice(0, -1).reverse());
    }
    const parsed = parseMime('text/csv', lines.join('\n'));
    expect(parsed.ok).toBe(true);
    if (!parsed.ok) {
      return;
    }
    const byName = (n: string): IColumn => parsed.table.columns.find(c => c.name === n) as IColumn;
    const built = buildIsothermSet({ temperature: byName('T'), field: byName('H'), magnetisation: byName('m'), sample: { massKg }, temperatureTolerance: 0.2 });
    expect(built.status).toBe('ok');
    if (built.status !== 'ok') {
      return;
    }
    expect(built.set.isotherms.filter(i => i.branch === 'up').length).toBe(13);
    expect(built.set.isotherms.filter(i => i.branch === 'down').length).toBe(13);
    const a = arrottAnalysis(built.set);
    expect(a.warnings.some(w => w.code === 'sweeps.up-branch-used')).toBe(true);
    expect(a.warnings.some(w => w.code === 'sweeps.demag-unset')).toBe(true);
    // each warning once, though every analysis of the set carries the N_d one
    expect(a.warnings.filter(w => w.code === 'sweeps.demag-unset')).toHaveLength(1);
    expect(Math.abs(a.Tc.value - Tc)).toBeLessThan(0.3);
    expect(a.conventions.units).toEqual({ T: 'K', H: 'A/m', M: 'A m^2/kg' });
  });
});
