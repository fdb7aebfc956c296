/**
 * `exact-dw/engines`: the numerical engines and spectrum routines under the root API, for advanced
 * use (docs/methods.md sections 2 to 5 and 10). A spectral engine takes the spectrum nu of the
 * design's quadratic form and a point c and returns a tail probability with its error bound:
 * {@link imhofTail} (Imhof 1961), {@link panTail} (Pan 1968), {@link contourTail} (an exact
 * inversion on a line through the saddlepoint). The eigen-free form ({@link eigenfreeForm}) and the
 * DCT eigenbasis route ({@link dctTail}) work on the difference operator A and an orthonormal basis
 * of the design's columns instead, and never compute an eigenvalue. {@link tailProbability} is the
 * `auto` rule the root API uses.
 *
 * @example
 * ```ts
 * import { differencePairs, differenceMatrix, householderQR, columnBasis, fastSpectrum, imhofTail, panTail } from 'exact-dw/engines';
 * const n = 20;
 * const X = new Float64Array(n * 2);               // column-major n x 2: intercept, then trend
 * for (let t = 0; t < n; t++) { X[t] = 1; X[n + t] = t + 1; }
 * const A = differenceMatrix(differencePairs(n, 1));
 * const nu = fastSpectrum(A, columnBasis(householderQR(X, n, 2)));
 * imhofTail(nu, 1.2, 'lower').p;                     // P(D <= 1.2) by Imhof's integral
 * panTail(nu, 1.2, 'lower').p;                       // the same by Pan's finite-range form
 * ```
 *
 * @packageDocumentation
 * @module exact-dw/engines
 */
export type { BandMatrix, ColumnBasis, CharacteristicForm, EngineName, MethodChoice, Tail, TailProbability } from './core/types.js';

// the operator A and the design's basis
export { differencePairs, differenceMatrix, durbinWatson, type DifferencePairs } from './core/difference.js';
export { householderQR, columnBasis, type HouseholderQR } from './linalg/qr.js';

// spectrum routines
export { denseSpectrum, spectrumMean, spectrumVariance } from './core/spectrum.js';
export { fastSpectrum, FAST_SPECTRUM_MAX_N, DENSE_SPECTRUM_MAX_N } from './core/fast-spectrum.js';
export { symmetricEigenvalues, tridiagonalEigenvalues } from './linalg/symmetric-eigen.js';

// spectral engines
export { imhofDensity, integrateImhof, spectralForm, type ImhofOptions, type ImhofIntegral } from './engines/imhof.js';
export { imhofTail } from './engines/imhof-product.js';
export { panTail, panApplicable, type PanOptions } from './engines/pan.js';
export { contourTail } from './engines/saddle-contour.js';

// eigen-free and DCT eigenbasis forms
export { eigenfreeForm, LAMBDA_FLOOR, type EigenfreeForm } from './engines/eigenfree.js';
export { dctTail, dctDensity, dctEigenbasis, dctForm, integrateDct, type DctEigenbasis, type DctForm, type DctOptions } from './engines/dct.js';

// the auto choice and the sources it works on
export { tailProbability, AUTO_SPECTRUM_MAX_N, type EngineOptions } from './engines/choose.js';
export { spectrumSource, designSource, type NullSource } from './core/source.js';
