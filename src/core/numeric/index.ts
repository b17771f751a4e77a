/** Small numerical building blocks shared by the physics models. */
export { NumericInputError } from './errors';
export { wholeNumber } from './messageArgs';
export { realPolynomialRoots, polyEval, polyDerivative } from './polyroots';
export type { PolyCoefficients } from './polyroots';
export { bracketRoot, goldenMinimum } from './scalar';
export type { IScalarRootResult } from './scalar';
export { mulberry32 } from './random';
export { fitLine, lineRoot, smoothedDerivative } from './linear';
export type { ILineFit } from './linear';
export { hessian, invert, nelderMead } from './simplex';
export type { ISimplexResult } from './simplex';
export { studentTQuantileTwoSided, normalQuantileTwoSided } from './studentT';
export { ulp } from './ulp';
