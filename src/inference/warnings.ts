/**
 * Notes attached to a result, as plain data: a stable `code` and the plain fields the note is
 * about. The words are written in one place, src/report/wording.ts, shared by every report
 * format, the command line and the page. New codes may be added; existing ones keep their meaning.
 */
import type { TimeFrequency, TimeLabelFormat } from '../data/time-index.js';
import type { DesignNote } from '../problem/problem.js';

/** One note on a result. */
export type DwWarning =
  /** No time column was named; this column was taken as the time index by the time-index rule. */
  | { code: 'TIME_INDEX_DETECTED'; column: string; format: TimeLabelFormat; frequency: TimeFrequency }
  /** A column that looks like a time index with gaps is a regressor, so its gaps are not honoured. */
  | { code: 'TIME_GAPS_NOT_HONOURED'; column: string }
  /** Rows with a missing value in a used column were dropped (1-based data rows); they are gaps. */
  | { code: 'ROWS_DROPPED'; count: number; rows: number[]; asGaps: boolean }
  /** The design is ill-conditioned (raised where the design is prepared). */
  | DesignNote
  /** Caller's residuals had a small component in col(X) (rounding), removed before computing d. */
  | { code: 'RESIDUALS_PROJECTED'; drift: number }
  /** No intercept: the bounds tables do not apply. */
  | { code: 'BOUNDS_NO_INTERCEPT' }
  /** Lag above 1 or gaps: the bounds tables do not apply. */
  | { code: 'BOUNDS_LAG_OR_GAPS'; lag: number; gaps: boolean }
  /** A lagged dependent variable: d is not a valid test. */
  | { code: 'D_NOT_VALID_LAGGED_DEPENDENT'; column: string; how: 'declared' | 'detected'; hDefined: boolean; bgOrder: number }
  /** No two observations are j periods apart for some j up to the order: Breusch-Godfrey is not defined. */
  | { code: 'BREUSCH_GODFREY_UNDEFINED'; order: number }
  /** The declared lagged dependent column is not y lagged one period in the data. */
  | { code: 'LAGGED_DEPENDENT_MISMATCH'; column: string }
  | PanelNote;

/** A note on a pooled panel design: the classical bounds do not apply to it. */
export type PanelNote =
  | { code: 'PANEL_BOUNDS_NOT_APPLICABLE'; entities: number }
  | { code: 'ENTITY_EFFECTS_BOUNDS_NOT_APPLICABLE'; entities: number };

/** A note on a batch of series. */
export type BatchNote =
  | { code: 'BATCH_GROUPS_FAILED'; failed: number; groups: number }
  | { code: 'BATCH_NOT_VALID_EXCLUDED'; excluded: number }
  | { code: 'BATCH_ADJUSTED'; method: 'holm' | 'bh'; family: number }
  /** No time column was named; this column was taken as the time index of every group by the time-index rule. */
  | { code: 'BATCH_TIME_DETECTED'; column: string }
  /** Rows with a missing value were dropped (in `groups` groups, `rows` rows in all); each group lists its own. */
  | { code: 'BATCH_ROWS_DROPPED'; rows: number; groups: number };

/** The codes of {@link DwWarning}. */
export type DwWarningCode = DwWarning['code'];
