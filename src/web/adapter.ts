/**
 * The one place where the page reaches the report and power modules of the library. The page and
 * its worker call only these functions, so that a renderer that changes its signature is adapted
 * here and nowhere else. `capabilities` says which parts this build can show; for a part that is
 * off, its function returns null and the page says "not part of this build". Nothing here computes
 * a statistic: every number comes from the library.
 *
 * The batch (one test per group, src/batch/) is reached here too: its run, the words of its notes
 * and its tables, which are the bytes the command line writes.
 *
 * The lines marked "REPORTS" depend on src/report, those marked "POWER" on src/power. To build the
 * page without one of them: remove its marked import, set its capabilities to false, and replace
 * each of its other marked lines by `return null;`.
 */
import { runExactDwTest, type DwTestInput, type DwTestResult } from '../inference/dw-test.js';
import { prepareProblem, type DwProblem } from '../problem/problem.js';
import { renderText } from '../report/text.js';
import { renderDensitySvg, paperParagraph, renderMarkdown } from '../report/index.js'; // REPORTS
import { powerForProblem } from '../power/exact-power.js'; // POWER
import { inline } from '../report/format.js';
import { ADJUSTMENT_NAMES, BATCH_ASSUMPTIONS, boundsResolutionWords, durbinHWords, engineChoiceWords, noteText, timeIndexWords, warningText } from '../report/wording.js';
import { exactDwBatch, type BatchInput, type BatchResult } from '../batch/batch.js';
import { BATCH_DECISION_WORDS, renderBatch } from '../batch/render.js';
import type { Adjustment } from '../batch/adjust.js';
import type { BoundsZone } from '../inference/dw-test.js';
import type { BatchNote, DwWarning } from '../inference/warnings.js';

/**
 * A note of a result in plain words, as every report words it (src/report/wording.ts).
 *
 * @example
 * ```ts
 * warningWords({ code: 'BOUNDS_NO_INTERCEPT' }); // "The model has no intercept: ..."
 * ```
 */
export function warningWords(w: DwWarning): string {
  return inline(warningText(w), 'text');
}

/**
 * The bounds-test sentence in the reports' wording.
 *
 * @example
 * ```ts
 * resolutionWords(result.bounds!);
 * ```
 */
export function resolutionWords(zone: BoundsZone): string {
  return inline(boundsResolutionWords(zone), 'text');
}

/**
 * Why the engine answered, in the reports' wording ('' when the engine was named).
 *
 * @example
 * ```ts
 * engineChoiceText(result); // "Imhof integral on the spectrum"
 * ```
 */
export function engineChoiceText(r: DwTestResult): string {
  return r.methodChoice ? inline(engineChoiceWords(r.methodChoice), 'text') : '';
}

/**
 * Whether Durbin's h is defined, in the reports' wording.
 *
 * @example
 * ```ts
 * durbinHText(result.dynamic!.durbinH); // "Durbin's h is undefined here: n V = 1.31 >= 1 ..."
 * ```
 */
export function durbinHText(h: NonNullable<DwTestResult['dynamic']>['durbinH']): string {
  return inline(durbinHWords(h), 'text');
}

/**
 * The time index of a result in words, as the reports say it.
 *
 * @example
 * ```ts
 * timeIndexText(result); // "year (whole numbers, integer; detected by the time-index rule), 1998 to 2021, no gaps"
 * ```
 */
export function timeIndexText(r: DwTestResult): string {
  return inline(timeIndexWords(r.timeColumn ?? null), 'text');
}

/** Which optional parts this build of the page can show. */
export const capabilities: Readonly<Record<'figure' | 'paragraph' | 'markdown' | 'power', boolean>> = {
  figure: true, // REPORTS (false without)
  paragraph: true, // REPORTS (false without)
  markdown: true, // REPORTS (false without)
  power: true, // POWER (false without)
};

/** The paragraph for a paper in the formats the report module offers. */
export interface Paragraph {
  plain: string;
  markdown: string | null;
  latex: string | null;
}

/** Exact power of the test at one rho (docs/methods.md section 6), as computed by the library. */
export interface PowerAtRho {
  rho: number;
  power: number;
  /** Bound on the numerical error of `power`. */
  errorBound: number;
  /** The exact critical value the test rejects beyond (the lower one for a two-sided test). */
  critical: number;
  /** The target power and the rho closest to 0 that reaches it (null when none below 1 does). */
  target: number;
  rhoAtTarget: number | null;
}

/** Everything the page shows beyond the test result itself. */
export interface ReportExtras {
  /** Plain-text report (src/report/text.ts). */
  text: string;
  /** SVG of the exact null density with d and the critical values marked. */
  figure: string | null;
  paragraph: Paragraph | null;
  /** Full Markdown report. */
  markdown: string | null;
  power: PowerAtRho | null;
}

/**
 * The prepared problem of the tested design (the null distribution behind the figure and the
 * factorization behind the power), built once per input.
 */
const problems = new WeakMap<DwTestInput, DwProblem>();
/** The period numbers of the time index the test used (labels parsed, rows dropped). */
const usedTimes = new WeakMap<DwTestInput, ArrayLike<number>>();
function problemOf(input: DwTestInput, result: DwTestResult): DwProblem {
  let p = problems.get(input);
  if (!p) {
    p = prepareProblem(input.x, result.n, input);
    problems.set(input, p);
  }
  return p;
}

/**
 * Run the exact test and keep its prepared problem for the figure and the power of this input,
 * so that neither prepares it (and its spectrum) a second time.
 *
 * @example
 * ```ts
 * const result = runTest(input); // then figureSvg(input, result) reuses the problem
 * ```
 */
export function runTest(input: DwTestInput): DwTestResult {
  const { result, problem, times } = runExactDwTest(input);
  problems.set(input, problem);
  if (times !== undefined) usedTimes.set(input, times);
  return result;
}

/**
 * The plain-text report of a result.
 *
 * @example
 * ```ts
 * textReport(exactDwTest({ y, x })); // the terminal report
 * ```
 */
export function textReport(result: DwTestResult): string {
  return renderText(result);
}

/**
 * The SVG figure of the exact null density, or null when the report module is not built in or
 * when d is not a valid test (a lagged dependent variable: the report module draws no figure then).
 *
 * @example
 * ```ts
 * figureSvg(input, exactDwTest(input)); // '<svg ...>'
 * ```
 */
export function figureSvg(input: DwTestInput, result: DwTestResult): string | null {
  if (!capabilities.figure || result.dynamic) return null;
  return renderDensitySvg(result, problemOf(input, result).distribution, { idPrefix: 'page-figure' }); // REPORTS
}

/**
 * The paragraph for a paper in plain text, Markdown and LaTeX, or null without the report module.
 *
 * @example
 * ```ts
 * paragraphFor(exactDwTest(input))?.plain;
 * ```
 */
export function paragraphFor(result: DwTestResult): Paragraph | null {
  if (!capabilities.paragraph) return null;
  return { plain: paperParagraph(result, 'text'), markdown: paperParagraph(result, 'markdown'), latex: paperParagraph(result, 'latex') }; // REPORTS
}

/**
 * The full Markdown report, or null without the report module.
 *
 * @example
 * ```ts
 * markdownReport(exactDwTest(input)); // '# Exact Durbin-Watson test ...'
 * ```
 */
export function markdownReport(result: DwTestResult): string | null {
  if (!capabilities.markdown) return null;
  return renderMarkdown(result); // REPORTS
}

/**
 * Exact power at `rho` for the design of `input`, for the test at the result's alpha and
 * alternative; null without the power module or when no rho is asked for. A bad rho raises the
 * library's DwError.
 *
 * @example
 * ```ts
 * powerAt(input, exactDwTest(input), 0.5)?.power;
 * ```
 */
export function powerAt(input: DwTestInput, result: DwTestResult, rho: number | null): PowerAtRho | null {
  if (!capabilities.power || rho === null) return null;
  const s = powerForProblem(problemOf(input, result), { rho: [rho], alpha: result.alpha, alternative: result.alternative, times: usedTimes.get(input) ?? input.times }); // POWER
  return { rho, power: s.curve[0].power, errorBound: s.curve[0].errorBound, critical: s.critical, target: s.target, rhoAtTarget: s.rhoAtTarget }; // POWER
}

/**
 * One exact test per group of rows, as the library runs it (exactDwBatch).
 *
 * @example
 * ```ts
 * runBatch({ table, by: 'station', y: 'rain', x: ['temp'], adjust: 'holm' }).summary;
 * ```
 */
export function runBatch(input: BatchInput): BatchResult {
  return exactDwBatch(input);
}

/** The batch table in the formats of src/batch/render.ts: the same text the command line writes. */
export interface BatchDownloads {
  csv: string;
  markdown: string;
  latex: string;
  json: string;
}

/**
 * The batch table as CSV, Markdown, booktabs LaTeX and JSON, by the renderers the command line uses.
 *
 * @example
 * ```ts
 * batchDownloads(batch).csv; // what `exact-dw batch ... --format csv` prints
 * ```
 */
export function batchDownloads(batch: BatchResult): BatchDownloads {
  return { csv: renderBatch(batch, 'csv'), markdown: renderBatch(batch, 'markdown'), latex: renderBatch(batch, 'latex'), json: renderBatch(batch, 'json') };
}

/**
 * A note of a batch in plain words, as the batch tables word it.
 *
 * @example
 * ```ts
 * batchNoteWords({ code: 'BATCH_GROUPS_FAILED', failed: 1, groups: 5 }); // "1 of 5 groups could not be tested; ..."
 * ```
 */
export function batchNoteWords(note: BatchNote): string {
  return inline(noteText(note), 'text');
}

/** What every batch table states under it: the assumptions, and that it supports the analyst's judgement. */
export const batchCautions: string = inline(BATCH_ASSUMPTIONS, 'text');

/** The full name of an adjustment, as in the batch tables. */
export function adjustmentWords(a: Adjustment): string {
  return ADJUSTMENT_NAMES[a];
}

/** A group's decision in the words of the batch tables. */
export function batchDecisionWords(d: NonNullable<BatchResult['groups'][number]['decision']>): string {
  return BATCH_DECISION_WORDS[d];
}

/** The label of a group as the batch tables show it (a visible stand-in for rows without one). */
export { batchGroupLabel } from '../batch/render.js';
