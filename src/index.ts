/**
 * exact-dw: the exact finite-sample distribution of the Durbin-Watson statistic for your own
 * design matrix. Start with {@link exactDwTest}.
 *
 * @packageDocumentation
 */
export { DwError, isDwError, type DwErrorCode, type DwErrorDetail } from './errors.js';
export type { EngineName, MethodChoice, Tail, TailProbability, BandMatrix, ColumnBasis, CharacteristicForm } from './core/types.js';
export { differencePairs, differenceMatrix, durbinWatson, bandToDense, bandMultiply, type DifferencePairs } from './core/difference.js';
export { householderQR, columnBasis, applyQ, applyQt, type HouseholderQR } from './linalg/qr.js';
export { denseSpectrum, spectrumMean, spectrumVariance } from './core/spectrum.js';
export { symmetricEigenvalues, tridiagonalEigenvalues } from './linalg/symmetric-eigen.js';
export { imhofTail, imhofDensity, integrateImhof, spectralForm, type ImhofOptions } from './engines/imhof.js';
export { tailProbability, type EngineOptions } from './engines/choose.js';
export { DwNullDistribution, quantileTolerance, type DistributionOptions } from './distribution/null-distribution.js';
export { spectrumSource, designSource, type NullSource } from './core/source.js';
export { brentRoot } from './numeric/root.js';
export { buildDesign, factorDesign, INTERCEPT_NAME, type Design, type DesignOptions, type FactoredDesign, type RegressorInput } from './model/design.js';
export { fitLeastSquares, type Coefficient, type LeastSquaresFit } from './model/ols.js';
export { parseCsv, numericColumn, parseCell, isMissingCell, textColumn, type DataTable, type CsvOptions } from './data/csv.js';
export {
  parseTimeLabels, chooseTimeIndex, isTimeLabel, readsAsTimeIndex, looksLikeGappedIndex, TIME_FREQUENCIES, TIME_NAMES,
  type TimeIndex, type TimeFrequency, type TimeLabelFormat, type TimeLabelOptions, type TimeRuleColumn, type TimeIndexChoice,
} from './data/time-index.js';
export { resolveDataInput, type ResolvedData, type DataInputFields } from './inference/data-input.js';
export { prepareProblem, type DwProblem, type ProblemOptions } from './problem/problem.js';
export {
  exactDwTest, runExactDwTest, exactDwPValue, exactDwCritical, pValuesFor, firstOrderAutocorrelation,
  type DwWarning, type DwWarningCode, type TimeColumnInfo, type DroppedRows, type TimeLabelsInput, type InputDescription, type Provenance,
  type DwTestInput, type DwTestResult, type DwPValues, type Alternative, type BoundsZone, type PowerSummary, type DynamicModelCheck,
} from './inference/dw-test.js';
export * from './report/index.js';
export { VERSION } from './version.js';
export {
  exactPower, powerForProblem, alternativeTail, autoPowerRoute, POWER_SIZE_LIMIT, POWER_DENSE_MAX_N,
  type ExactPower, type ExactPowerInput, type PowerOptions, type PowerPoint, type PowerRoute,
} from './power/exact-power.js';
export {
  alternativeStructure, alternativeForm, eigenfreeAlternativeTail, chernoffTail, type AlternativeForm, type AlternativeStructure,
} from './power/eigenfree-power.js';
export { powerWeights, errorCovariance, type ErrorProcess } from './power/weights.js';
export { detectLaggedDependent } from './dynamic/lagged-dependent.js';
export {
  dynamicModelCheck, serialCorrelationTests, durbinH, breuschGodfrey, residualT,
  type DynamicDiagnosis, type DurbinH, type BreuschGodfrey, type ResidualT,
} from './dynamic/serial-tests.js';
export { normalCdf, normalSf, chiSquareSf, fSf, studentTSf } from './numeric/tails.js';
export { contourTail } from './engines/saddle-contour.js';
export { panTail, panApplicable, type PanOptions } from './engines/pan.js';
export { eigenfreeForm, type EigenfreeForm } from './engines/eigenfree.js';
export { dctTail, dctDensity, dctEigenbasis, dctForm, integrateDct, type DctEigenbasis, type DctForm, type DctOptions } from './engines/dct.js';
export { dctPlan, type DctPlan } from './linalg/dct.js';
export { fastSpectrum } from './core/fast-spectrum.js';
export { checkSize, memoryEstimate, checkPowerSize, POWER_MAX_N, DCT_MAX_N } from './limits.js';
export * from './bounds/index.js';
export {
  exactDwBatch, batchTable, batchColumns, groupRows, testGroups, finishBatch, checkBatchOptions, MISSING_GROUP_LABEL,
  type BatchInput, type BatchResult, type BatchGroup, type BatchGroupError, type BatchGrouping, type BatchColumns, type BatchCell,
} from './batch/batch.js';
export { adjustPValues, ADJUSTMENTS, type Adjustment } from './batch/adjust.js';
export { DesignCache, SHARED_CEILING_USES } from './batch/shared-design.js';
export { seriesAnswer, densityCeiling, CEILING_MIN_M, type SeriesAnswer } from './batch/group-test.js';
export { renderBatch, renderBatchCsv, renderBatchMarkdown, renderBatchLatex, renderBatchJson, BATCH_FORMATS, type BatchFormat } from './batch/render.js';
export { preparePanel, reorder, ENTITY_COLUMN_PREFIX, type PanelInput, type PanelSummary, type PreparedPanel } from './panel/panel.js';
export { noteText, ADJUSTMENT_NAMES, type Note } from './report/wording.js';
export type { PanelNote, BatchNote } from './inference/warnings.js';
export type { DesignReuse } from './inference/dw-test.js';
