/**
 * The pooled panel route of the test: rows ordered entity by entity, times on one axis with a gap
 * of more than the lag between entities (src/panel/panel.ts), so that no difference joins two
 * entities; then the series test on that design, with the panel's typed notes (docs/methods.md
 * section 11).
 */
import { DwError } from '../errors.js';
import { preparePanel, reorder, type PanelInput } from '../panel/panel.js';
import type { RegressorInput } from '../model/design.js';
import type { DroppedRows } from './data-input.js';
import { isMissingCell } from '../data/csv.js';
import type { PanelNote } from './warnings.js';
import type { DwTestInput, DesignReuse, TestRun } from './test-types.js';
import { runSeries } from './series-test.js';

/**
 * The pooled panel test: rows ordered entity by entity, times on one axis with a gap of more than
 * the lag between entities (src/panel/panel.ts), then the ordinary test on that design.
 */
export function runPanelTest(input: DwTestInput, reuse?: DesignReuse): TestRun {
  let panel = input.panel!;
  if (input.times !== undefined || input.time !== undefined) {
    throw new DwError('OPTION_CONFLICT', 'A panel brings its own times; separate observation times cannot be given as well.', 'Give the time of each row with the panel only.');
  }
  if (input.power !== undefined) {
    throw new DwError('OPTION_CONFLICT', 'Exact power against AR(1) errors is not available for a pooled panel (it would need one error process per entity).',
      'Test the panel without power, or compute the power of one entity as a single series.');
  }
  if ((input.y === undefined) === (input.residuals === undefined)) {
    throw new DwError('OPTION_CONFLICT', 'Give exactly one of y and residuals.', 'Pass y to fit the regression here, or the residuals of your own fit.');
  }
  let series = (input.y ?? input.residuals) as ArrayLike<number>;
  let x = input.x;
  let dropped: DroppedRows | null = null;
  if (input.dropMissing === true) ({ panel, series, x, dropped } = dropMissingRows(panel, series, x));
  const n = series.length;
  const prepared = preparePanel(panel, x, n, input.lag ?? 1, input.intercept ?? true, input.names);
  const ordered = reorder(series, prepared.order);
  const { result, problem, times } = runSeries({
    ...input,
    panel: undefined,
    time: undefined,
    timeColumn: false,
    dropMissing: false,
    x: prepared.x,
    names: undefined,
    intercept: prepared.intercept,
    times: prepared.axis,
    y: input.y !== undefined ? ordered : undefined,
    residuals: input.residuals !== undefined ? ordered : undefined,
  }, reuse, true);
  const notes: PanelNote[] = [];
  if (prepared.summary.entityEffects && prepared.summary.entities > 1) notes.push({ code: 'ENTITY_EFFECTS_BOUNDS_NOT_APPLICABLE', entities: prepared.summary.entities });
  else if (result.bounds === null && prepared.summary.entities > 1) notes.push({ code: 'PANEL_BOUNDS_NOT_APPLICABLE', entities: prepared.summary.entities });
  if (prepared.summary.entityEffects && prepared.summary.entities > 1) result.bounds = null;
  result.panel = { ...prepared.summary, pairs: problem.pairs.from.length, notes };
  if (dropped) {
    result.droppedRows = dropped;
    result.warnings.push({ code: 'ROWS_DROPPED', count: dropped.count, rows: dropped.rows, asGaps: true });
  }
  result.warnings.push(...notes);
  return { result, problem, times };
}

function missingNumber(v: unknown): boolean {
  return v === null || v === undefined || (typeof v === 'number' && Number.isNaN(v));
}

/**
 * The panel without the rows that have a missing value in the series, a regressor, the entity or
 * the time (null, undefined, NaN, or a missing-value code as an entity label). Within an entity a
 * dropped row is a gap in time: no difference spans it (docs/methods.md section 11).
 */
function dropMissingRows(panel: PanelInput, series: ArrayLike<number>, x: RegressorInput): {
  panel: PanelInput; series: number[]; x: RegressorInput; dropped: DroppedRows | null;
} {
  const n = series.length;
  const bad = new Uint8Array(n);
  const mark = (arr: ArrayLike<unknown>, missing: (v: unknown) => boolean) => {
    for (let i = 0; i < Math.min(n, arr.length); i++) if (missing(arr[i])) bad[i] = 1;
  };
  mark(series, missingNumber);
  if (Array.isArray(x)) (x as ReadonlyArray<ArrayLike<number>>).forEach((row, i) => { for (let j = 0; j < row.length; j++) if (missingNumber(row[j])) bad[i] = 1; });
  else for (const col of Object.values(x as Record<string, ArrayLike<number>>)) mark(col, missingNumber);
  mark(panel.entity, (v) => missingNumber(v) || (typeof v === 'string' && isMissingCell(v)));
  mark(panel.time, missingNumber);
  const keep: number[] = [];
  const rows: number[] = [];
  for (let i = 0; i < n; i++) (bad[i] ? rows : keep).push(bad[i] ? i + 1 : i);
  if (rows.length === 0) return { panel, series: Array.from(series), x, dropped: null };
  const pick = <T>(arr: ArrayLike<T>): T[] => keep.map((i) => arr[i]);
  let kept: RegressorInput;
  if (Array.isArray(x)) kept = pick(x as ReadonlyArray<ArrayLike<number>>);
  else {
    const cols: Record<string, number[]> = {};
    for (const [name, col] of Object.entries(x as Record<string, ArrayLike<number>>)) cols[name] = pick(col);
    kept = cols;
  }
  return {
    panel: { ...panel, entity: pick(panel.entity), time: pick(panel.time) },
    series: pick(series),
    x: kept,
    dropped: { count: rows.length, rows },
  };
}
