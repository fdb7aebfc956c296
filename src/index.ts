/**
 * exact-dw: the exact finite-sample distribution of the Durbin-Watson statistic for your own
 * design matrix. Start with {@link exactDwTest}.
 *
 * @packageDocumentation
 */
export { DwError, isDwError, type DwErrorCode, type DwErrorDetail } from './errors.js';
export type { EngineName, MethodChoice, Tail, TailProbability, BandMatrix, ColumnBasis, CharacteristicForm } from './core/types.js';
export { differencePairs, differenceMatrix, durbinWatson, bandToDense, bandMultiply, type DifferencePairs } from './core/difference.js';
export { householderQR, columnBasis, applyQ, applyQt, type HouseholderQR } from './core/qr.js';
export { denseSpectrum, spectrumMean, spectrumVariance } from './core/spectrum.js';
export { symmetricEigenvalues, tridiagonalEigenvalues } from './core/symmetric-eigen.js';
export { imhofTail, imhofDensity, integrateImhof, spectralForm, type ImhofOptions } from './engines/imhof.js';
export { tailProbability, type EngineOptions } from './engines/choose.js';
export { DwNullDistribution, type DistributionOptions } from './distribution/null-distribution.js';
export { spectrumSource, designSource, type NullSource } from './distribution/source.js';
export { brentRoot } from './distribution/root.js';
export { buildDesign, factorDesign, INTERCEPT_NAME, type Design, type DesignOptions, type FactoredDesign, type RegressorInput } from './model/design.js';
export { fitLeastSquares, type Coefficient, type LeastSquaresFit } from './model/ols.js';
export { parseCsv, numericColumn, parseCell, type DataTable, type CsvOptions } from './data/csv.js';
export { prepareProblem, type DwProblem, type ProblemOptions } from './inference/problem.js';
export {
  exactDwTest, exactDwPValue, exactDwCritical, pValuesFor,
  type DwTestInput, type DwTestResult, type DwPValues, type Alternative, type BoundsZone, type PowerSummary, type DynamicModelCheck,
} from './inference/dw-test.js';
export { renderText } from './report/text.js';
export { VERSION } from './version.js';
