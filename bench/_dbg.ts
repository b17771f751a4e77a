import { fitCurve } from '../src/core/fit/index';
import { powerLaw, linspace } from '../test/core/fit/models';
import { mulberry32, normalGenerator } from '../test/core/fit/prng';
const T = linspace(200, 295, 25);
let inside = 0;
for (let s = 0; s < 400; s++) { const g = normalGenerator(mulberry32(1000 + s)); const y = T.map((t) => Math.pow(1 - t / 300, 0.33) + 0.01 * g());
 const r = fitCurve(powerLaw, { x: T, y }, { start: [0.8, 310, 0.5] }); const [lo, hi] = r.confidenceIntervals[2]; if (lo <= 0.33 && 0.33 <= hi) inside++; }
console.log(inside / 400);
