/**
 * The pooled panel route of the test: rows ordered entity by entity, times on one axis with a gap
 * of more than the lag between entities (src/panel/panel.ts), so that no difference joins two
 * entities; then the series test on that design, with the panel's typed notes (docs/methods.md
 * section 11).
 */
import { DwError } from '../errors.js';
import { preparePanel, reorder } from '../panel/panel.js';
import type { PanelNote } from './warnings.js';
import type { DwTestInput, DesignReuse, TestRun } from './test-types.js';
import { runSeries } from './series-test.js';

/**
 * The pooled panel test: rows ordered entity by entity, times on one axis with a gap of more than
 * the lag between entities (src/panel/panel.ts), then the ordinary test on that design.
 */
export function runPanelTest(input: DwTestInput, reuse?: DesignReuse): TestRun {
  const panel = input.panel!;
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
  if (input.dropMissing === true) {
    throw new DwError('OPTION_CONFLICT', 'Dropping rows with missing values is not available for a pooled panel: it needs every row of every entity.',
      'Remove the rows with missing values before the test, or test the entities one by one as a batch.');
  }
  const series = (input.y ?? input.residuals) as ArrayLike<number>;
  const n = series.length;
  const prepared = preparePanel(panel, input.x, n, input.lag ?? 1, input.intercept ?? true, input.names);
  const ordered = reorder(series, prepared.order);
  const { result, problem, times } = runSeries({
    ...input,
    panel: undefined,
    time: undefined,
    timeColumn: false,
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
  result.warnings.push(...notes);
  return { result, problem, times };
}
