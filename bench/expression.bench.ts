/**
 * Expression-model evaluation speed: the whitelisted generated JavaScript
 * function vs mathjs `compile` with a scope per point vs a hand-written
 * loop, for values and for the symbolic Jacobian. Best of N.
 *
 * Args: --repeats N (default 5), --json-part FILE.
 */
import { writeFileSync } from 'node:fs';
import { parseExpressionModel } from '../src/core/expr/index';
import { bestOf, parseArgs } from './fitReference';

const args = parseArgs(process.argv.slice(2));

const cases = [
  {
    text: 'b1 / ((1+exp(b2-b3*x))^(1/b4))',
    p: [700, 5, 0.75, 1.3],
    hand: (p: Float64Array, x: Float64Array, out: Float64Array) => {
      for (let i = 0; i < x.length; i++) {
        out[i] = p[0] / Math.pow(1 + Math.exp(p[1] - p[2] * x[i]), 1 / p[3]);
      }
    }
  },
  {
    text: 'A*(1 - x/Tc)^beta',
    p: [1, 300, 0.33],
    hand: (p: Float64Array, x: Float64Array, out: Float64Array) => {
      for (let i = 0; i < x.length; i++) {
        out[i] = p[0] * Math.pow(1 - x[i] / p[1], p[2]);
      }
    }
  }
];

const rows: Record<string, unknown>[] = [];
console.log('expression                              n       hand ms  generated ms  mathjs ms  jac gen ms  jac mathjs ms');
for (const c of cases) {
  for (const n of [1000, 100000]) {
    const x = Float64Array.from({ length: n }, (_, i) => 1 + (250 * i) / n);
    const p = Float64Array.from(c.p);
    const out = new Float64Array(n);
    const gen = parseExpressionModel(c.text);
    const mj = parseExpressionModel(c.text, { evaluation: 'mathjs' });
    const k = gen.parameters.length;
    const jac = new Float64Array(n * k);
    const reps = n > 10000 ? Math.max(1, Math.min(args.repeats, 3)) : args.repeats;
    const tHand = bestOf(args.repeats, () => c.hand(p, x, out));
    const tGen = bestOf(args.repeats, () => gen.evaluate(p, x, out));
    const tMj = bestOf(reps, () => mj.evaluate(p, x, out));
    const tJg = bestOf(args.repeats, () => gen.jacobian!(p, x, jac));
    const tJm = bestOf(reps, () => mj.jacobian!(p, x, jac));
    rows.push({ expression: c.text, n, handS: tHand, generatedS: tGen, mathjsS: tMj, jacobianGeneratedS: tJg, jacobianMathjsS: tJm });
    const f = (s: number): string => (s * 1e3).toFixed(3).padStart(10);
    console.log(`${c.text.padEnd(38)} ${String(n).padEnd(7)} ${f(tHand)} ${f(tGen)}    ${f(tMj)} ${f(tJg)}   ${f(tJm)}`);
  }
}
if (args.jsonPart) {
  writeFileSync(args.jsonPart, JSON.stringify({ repeats: args.repeats, rows }, null, 1));
}
