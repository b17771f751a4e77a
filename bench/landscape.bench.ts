/**
 * Landscape workbench grids: the 200 × 200 two-order-parameter landscape
 * F(ψ, φ) with its minima, the (T, h) phase diagram (closed form, and from
 * a typed free energy on its default 65 × 801 grid), the stationary points
 * of a typed free energy and its field loop (161 fields each way). Each figure is the median of many runs
 * after a warm-up; the budget is one animation frame (16 ms).
 *
 *   npx tsx bench/landscape.bench.ts [--json-part FILE]
 */
import { writeFileSync } from 'node:fs';
import { performance } from 'node:perf_hooks';
import { compileFreeEnergy } from '../src/core/expr/index';
import { coupledLandscape, landauPhaseDiagram, typedFieldLoop, typedPhaseDiagram, typedStationary } from '../src/core/physics/landau/index';

function arg(name: string): string | null {
  const i = process.argv.indexOf(name);
  return i >= 0 ? (process.argv[i + 1] ?? null) : null;
}

function median(run: (i: number) => void, repeats: number): number {
  for (let i = 0; i < 20; i++) {
    run(i);
  }
  const times: number[] = [];
  for (let i = 0; i < repeats; i++) {
    const t0 = performance.now();
    run(i);
    times.push(performance.now() - t0);
  }
  times.sort((a, b) => a - b);
  return times[Math.floor(times.length / 2)];
}

const coupled = { a1: 1, T1: 100, b1: 1, a2: 1, T2: 90, b2: 1, lambda: 0.5 };
const grid = median(i => coupledLandscape(coupled, 70 + (i % 40)), 200);
const K = { a: 0.5, b: -2, c: 4, T0: 100, d: 0 };
const diagram = median(i => landauPhaseDiagram({ ...K, b: -2 - 1e-3 * (i % 10) }, { Tmin: 98, Tmax: 102 }), 100);
const typed = compileFreeEnergy('a/2*(T - T0)*ψ^2 + b/4*ψ^4 + c/6*ψ^6 - h*ψ');
const stationary = median(i => typedStationary(typed, 100 + 0.01 * (i % 50), 0.01, { a: 0.5, T0: 100, b: -2, c: 4 }, { psiMax: 3 }), 200);
const typedDiagram = median(i => typedPhaseDiagram(typed, { a: 0.5, T0: 100, b: -2 - 1e-3 * (i % 10), c: 4 }, { Tmin: 98, Tmax: 102, psiMax: 1.5 }), 40);
const typedLoop = median(i => typedFieldLoop(typed, { a: 0.5, T0: 100, b: -2, c: 4 }, 99 + 0.01 * (i % 20), 0.3, 161, 1.5), 40);

const rows: [string, number][] = [
  ['coupled landscape 200 × 200 with minima', grid],
  ['phase diagram (T, h), 120 points per line', diagram],
  ['typed free energy: stationary points (800-interval scan)', stationary],
  ['typed free energy: phase diagram (T, h), 65 × 801 grid', typedDiagram],
  ['typed free energy: field loop, 2 × 161 fields', typedLoop]
];
console.log('landscape workbench (median ms; budget 16 ms per frame)');
for (const [name, ms] of rows) {
  console.log(`  ${name.padEnd(58)} ${ms.toFixed(3)} ms ${ms <= 16 ? '' : '(over one frame)'}`);
}
const part = arg('--json-part');
if (part) {
  writeFileSync(part, JSON.stringify(Object.fromEntries(rows.map(([n, ms]) => [n, { medianMs: ms }])), null, 2) + '\n');
}
