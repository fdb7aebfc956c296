/**
 * The words for the typed notes of a result (src/inference/warnings.ts) and for the other
 * sentences that every report format, the command line and the page share: how the time index
 * was chosen, which rows were dropped, and the usual next steps after a rejection. Written once, in
 * the neutral markup of format.ts (render with `inline(text, format)`), so that no two outputs
 * can word the same note differently. The words for the other typed parts of results live beside
 * it in src/report/wording/ and are re-exported here: the bounds-test resolution (bounds.ts), the
 * engine choice (engine.ts), Durbin's h and the dynamic checks (dynamic.ts), power notes (power.ts).
 */
import type { BatchNote, DwWarning, PanelNote } from '../inference/warnings.js';
import type { TimeColumnInfo } from '../inference/data-input.js';
import { andList, code, sym } from './format.js';

export { boundsResolutionWords, tableConvention } from './wording/bounds.js';
export { engineChoiceWords } from './wording/engine.js';
export { durbinHWords, nVRelation, fourDigits, type DurbinHFacts } from './wording/dynamic.js';
export { powerNoteText } from './wording/power.js';

const FORMAT_WORDS = { integer: 'whole numbers', quarter: 'quarter labels', month: 'month labels', date: 'ISO dates' } as const;

/**
 * A list of 1-based row numbers, shortened after `max` entries ("3, 7, 12 and 40 more").
 *
 * @example
 * ```ts
 * rowList([3, 7, 12]); // "3, 7 and 12"
 * ```
 */
export function rowList(rows: number[], max = 20): string {
  if (rows.length <= max) return andList(rows.map(String));
  return `${rows.slice(0, max).join(', ')} and ${rows.length - max} more`;
}

/**
 * A note of a result in words (neutral markup).
 *
 * @example
 * ```ts
 * inline(warningText({ code: 'TIME_GAPS_NOT_HONOURED', column: 'year' }), 'text');
 * // "The regressor 'year' looks like a time index with gaps ..."
 * ```
 */
export function warningText(w: DwWarning): string {
  switch (w.code) {
    case 'TIME_INDEX_DETECTED':
      return `No time column was named, so ${code(w.column)} (${FORMAT_WORDS[w.format]}, ${w.frequency}) was taken as the time index by the time-index rule; it is not a regressor. ` +
        `${sym('d')} is taken only between observations exactly the lag apart in it. Name the time column, or turn the rule off, to choose otherwise.`;
    case 'TIME_GAPS_NOT_HONOURED':
      return `The regressor ${code(w.column)} looks like a time index with gaps (increasing whole numbers that skip some values), but it is not the time index, so its gaps are not honoured: ` +
        `${sym('d')} is taken between consecutive rows. If it is the time index, name it as the time column.`;
    case 'ROWS_DROPPED':
      return `${w.count} row${w.count === 1 ? '' : 's'} with a missing value in a column of the model ${w.count === 1 ? 'was' : 'were'} dropped (data rows ${rowList(w.rows)}, counted from 1 after the header)` +
        (w.asGaps ? '; each is a gap in the time index, so no difference is taken across it.' : '.');
    case 'DESIGN_ILL_CONDITIONED':
      return `The design is ill-conditioned (condition number about ${w.condition.toExponential(1)}); centring or rescaling the regressors would make the answer more robust.`;
    case 'RESIDUALS_PROJECTED':
      return `The residuals were not quite orthogonal to the design (relative component ${w.drift.toExponential(1)} in the space of the regressors, as from rounding when they were saved); that component was removed before computing ${sym('d')}.`;
    case 'BOUNDS_NO_INTERCEPT':
      return `The model has no intercept: the classical bounds tables (${sym('dL')}, ${sym('dU')}) do not apply; the exact ${sym('p')}-value does.`;
    case 'BOUNDS_LAG_OR_GAPS':
      return `The classical bounds tables (${sym('dL')}, ${sym('dU')}) are for lag 1 and consecutive observations; ${w.lag > 1 ? `at lag ${w.lag}` : 'with gaps in time'} they do not apply; the exact ${sym('p')}-value does.`;
    case 'D_NOT_VALID_LAGGED_DEPENDENT':
      return `The regressor ${code(w.column)} is the dependent variable lagged one period (${w.how === 'declared' ? 'as declared' : 'detected in the data'}): ` +
        `${sym('d')} is then biased towards 2 and its exact null distribution does not hold, so the Durbin${sym('ndash')}Watson ${sym('p')}-value is not a valid test here. ` +
        `Use Durbin's ${sym('h')}${w.hDefined ? '' : ' (undefined for these data)'} or the Breusch${sym('ndash')}Godfrey test of order ${w.bgOrder} (both asymptotic).`;
    case 'LAGGED_DEPENDENT_MISMATCH':
      return `The declared column ${code(w.column)} is not equal to y lagged one period in these data; the checks treat it as the lagged dependent variable all the same.`;
    case 'BREUSCH_GODFREY_UNDEFINED':
      return `The Breusch${sym('ndash')}Godfrey test of order ${w.order} is not defined here: for some lag up to ${w.order} no two observations are that many periods apart in the time index, so the auxiliary regression would have a lagged residual that is zero throughout. ${sym('d')} and its exact ${sym('p')}-value are not affected.`;
    case 'PANEL_BOUNDS_NOT_APPLICABLE':
    case 'ENTITY_EFFECTS_BOUNDS_NOT_APPLICABLE':
      return noteText(w);
    default:
      return String((w as { code: string }).code);
  }
}

/**
 * The time index of a result in words (neutral markup), for the reports' data section.
 *
 * @example
 * ```ts
 * inline(timeIndexWords(result.timeColumn), 'text'); // "quarter (quarter labels, quarterly; named), 2015Q1 to 2019Q4, 2 periods missing"
 * ```
 */
export function timeIndexWords(t: TimeColumnInfo | null): string {
  if (t === null) return 'none: the rows are consecutive periods';
  const name = t.name !== null ? code(t.name) : 'the given observation times';
  const how = t.how === 'named' ? 'named' : t.how === 'detected' ? 'detected by the time-index rule' : 'data-row numbers, after dropping rows';
  const freq = `${t.frequency}${t.frequencySource === 'inferred' ? ', inferred from the dates' : t.frequencySource === 'given' ? ', as given' : ''}`;
  const gaps = t.missingPeriods === 0 ? 'no gaps' : `${t.missingPeriods} period${t.missingPeriods === 1 ? '' : 's'} missing`;
  if (t.how === 'rows') return `data-row numbers (no time column; the dropped rows are gaps), ${gaps}`;
  return `${name} (${FORMAT_WORDS[t.format]}, ${freq}; ${how}), ${t.first} to ${t.last}, ${gaps}`;
}

/**
 * The usual next steps after the test rejects, in general words (neutral markup).
 *
 * @example
 * ```ts
 * inline(nextStepsWords(), 'text'); // "A rejection can also signal a misspecified model ..."
 * ```
 */
export function nextStepsWords(): string {
  return 'A rejection can also signal a misspecified model (an omitted variable, a wrong functional form, a structural break) rather than autocorrelated errors. ' +
    'Usual next steps: check the specification; respecify the dynamics (for example add lags of the variables); or keep the model and use ' +
    'standard errors that are robust to autocorrelation, or estimate it by feasible generalised least squares under an autocorrelated error model.';
}

/** Every typed note of a batch or a panel. */
export type Note = PanelNote | BatchNote;

/** What every batch table states under it. */
export const BATCH_ASSUMPTIONS = 'Each p-value is exact for its own design under the null of independent, normally distributed errors with constant variance, with exogenous regressors (no lagged dependent variable); the table supports, and does not replace, the judgement of the analyst.';

/** Full names of the adjustments, for tables and reports. */
export const ADJUSTMENT_NAMES: Record<'holm' | 'bh', string> = {
  holm: 'Holm (1979) step-down, family-wise error rate',
  bh: 'Benjamini-Hochberg (1995) step-up, false discovery rate',
};

/**
 * One sentence for a typed note.
 *
 * @example
 * ```ts
 * noteText({ code: 'ENTITY_EFFECTS_BOUNDS_NOT_APPLICABLE', entities: 12 });
 * // "With one indicator per entity (12 entities) instead of the intercept, ..."
 * ```
 */
export function noteText(note: Note): string {
  switch (note.code) {
    case 'PANEL_BOUNDS_NOT_APPLICABLE':
      return `The pooled panel has ${note.entities} entities, so d is made of ${note.entities} separate chains of differences: the classical bounds d_L and d_U (one chain, one intercept) do not apply; the exact p-value for this design does.`;
    case 'ENTITY_EFFECTS_BOUNDS_NOT_APPLICABLE':
      return `With one indicator per entity (${note.entities} entities) instead of the intercept, the classical bounds d_L and d_U (which assume a single intercept and one chain of differences) do not apply; the exact p-value for this design does.`;
    case 'BATCH_GROUPS_FAILED':
      return `${note.failed} of ${note.groups} groups could not be tested; each has its error code and message, and the others are unaffected.`;
    case 'BATCH_NOT_VALID_EXCLUDED':
      return `${note.excluded} group${note.excluded === 1 ? ' has' : 's have'} a lagged dependent variable among the regressors, so d is not a valid test there; ${note.excluded === 1 ? 'it is' : 'they are'} left out of the adjusted family.`;
    case 'BATCH_TIME_DETECTED':
      return `No time column was named, so '${note.column}' was taken as the time index of every group by the time-index rule (it is not a regressor); d is taken only between observations of a group exactly the lag apart in it. Name the time column, or turn the rule off, to choose otherwise.`;
    case 'BATCH_ROWS_DROPPED':
      return `${note.rows} row${note.rows === 1 ? '' : 's'} with a missing value in y, a regressor or the time ${note.rows === 1 ? 'was' : 'were'} dropped, in ${note.groups} group${note.groups === 1 ? '' : 's'}; each group lists its own (droppedRows), and within a group a dropped row is a gap in time: no difference spans it.`;
    case 'BATCH_ADJUSTED':
      return `p-values adjusted over the ${note.family} groups tested by ${ADJUSTMENT_NAMES[note.method]}; decisions use the adjusted p-values.`;
  }
}
