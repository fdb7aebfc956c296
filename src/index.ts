/**
 * exact-dw: the exact finite-sample distribution of the Durbin-Watson statistic for your own
 * design matrix. Start with {@link exactDwTest}.
 *
 * This root entry point is the stable API: the test, p-values and critical values of a given d,
 * the null distribution, the bounds d_L/d_U, exact power, batches and panels, time labels, errors
 * and the version. Reports are in `exact-dw/report`, the engines and spectrum routines for
 * advanced use in `exact-dw/engines`. Everything else is internal and may change.
 *
 * @packageDocumentation
 * @module exact-dw
 */

// the test
export {
  exactDwTest, exactDwPValue, exactDwCritical,
  type DwTestInput, type DwTestResult, type DwPValues, type Alternative, type BoundsZone, type PowerSummary,
  type DynamicModelCheck, type DwWarning, type DwWarningCode, type TimeColumnInfo, type DroppedRows,
  type TimeLabelsInput, type InputDescription, type Provenance,
} from './inference/dw-test.js';
export type { ProblemOptions } from './problem/problem.js';
export type { RegressorInput } from './model/design.js';
export type { Coefficient } from './model/ols.js';
export type { BreuschGodfrey, DurbinH, ResidualT } from './dynamic/serial-tests.js';
export type { PanelNote, BatchNote } from './inference/warnings.js';
export type { DesignNote } from './problem/problem.js';
export type { EngineName, EngineChoice, MethodChoice, Tail, TailProbability } from './core/types.js';
export type { BoundsOutcome } from './core/result-types.js';
export type { DurbinHStatus, DynamicNote } from './dynamic/serial-tests.js';

// the null distribution of d for a design
export { designDistribution } from './inference/design-distribution.js';
export { DwNullDistribution, quantileTolerance, type DistributionOptions } from './distribution/null-distribution.js';
export type { NullSource } from './core/source.js';

// bounds d_L, d_U, tables and the zone of an observed d
export { bounds, type BoundsOptions, type DwBounds } from './bounds/bounds.js';
export { boundsTable, type BoundsTable, type BoundsTableCell, type BoundsTableRequest } from './bounds/table.js';
export { boundsZone, type BoundsZoneOptions } from './bounds/zone.js';

// exact power against AR(1) errors
export { exactPower, autoPowerRoute, type ExactPower, type ExactPowerInput, type PowerOptions, type PowerPoint, type PowerRoute, type PowerNote } from './power/exact-power.js';
export type { ErrorProcess } from './power/weights.js';

// many series at once, and panels
export {
  exactDwBatch, type BatchInput, type BatchResult, type BatchGroup, type BatchGroupError, type BatchCell,
} from './batch/batch.js';
export { ADJUSTMENTS, type Adjustment } from './batch/adjust.js';
export { parseCsv, type DataTable, type CsvOptions } from './data/csv.js';
export type { PanelInput, PanelSummary } from './panel/panel.js';

// time labels and the time-index rule
export {
  parseTimeLabels, chooseTimeIndex,
  type TimeIndex, type TimeFrequency, type TimeLabelFormat, type TimeLabelOptions, type TimeRuleColumn, type TimeIndexChoice,
} from './data/time-index.js';

// errors and version
export { DwError, isDwError, type DwErrorCode, type DwErrorDetail, type DwSuggestion, type DwSuggestedOption } from './errors.js';
export { VERSION } from './version.js';
