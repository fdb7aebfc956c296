/**
 * The pooled panel regression behind the Durbin-Watson statistic for panel data (Bhargava,
 * Franzini & Narendranathan 1982, "Serial correlation and the fixed effects model", Review of
 * Economic Studies 49, 533-549, from memory): one regression on all rows of all entities, and
 *
 *   d = sum over entities i, sum over t with both (i, t) and (i, t - lag) observed of
 *       (e_it - e_i,t-lag)^2 / sum e_it^2 = e'Ae / e'e,
 *
 * so that A is block diagonal, one chain per entity, and no difference ever joins two entities.
 * With `entityEffects` the intercept is replaced by one indicator column per entity (the fixed
 * effects, or within, model). The exact null distribution is then that of any design: the
 * spectrum of M A M, M = I - X(X'X)^{-1}X' (docs/methods.md section 11).
 *
 * No second difference operator is written here: the rows are ordered entity by entity (by time
 * within each), and each entity's times are shifted onto one integer axis with a gap of more than
 * the lag between entities, so that the ordinary time-gap rule (src/core/difference.ts: pairs only
 * between times exactly `lag` apart) builds exactly the within-entity pairs.
 */
import { DwError } from '../errors.js';
import type { RegressorInput } from '../model/design.js';

/** The panel structure of a data set: which entity each row belongs to, and its time. */
export interface PanelInput {
  /** Entity (shop, station, country) of each row: labels or numbers. */
  entity: ArrayLike<string | number>;
  /** Integer time of each row (years, quarter numbers); within an entity each time at most once. Rows need not be sorted. */
  time: ArrayLike<number>;
  /** Replace the intercept by one indicator column per entity (fixed effects). Default false. */
  entityEffects?: boolean;
}

/** What the pooled panel design was, for the result. */
export interface PanelSummary {
  /** Number of entities. */
  entities: number;
  /** Entity labels, in the order of their first row. */
  labels: string[];
  /** Observations of the smallest and the largest entity. */
  smallest: number;
  largest: number;
  /** Differences in d: pairs within an entity exactly `lag` apart in time. */
  pairs: number;
  /** Whether the intercept was replaced by one indicator per entity. */
  entityEffects: boolean;
  /** Names of the entity indicator columns (empty without entity effects). */
  effectColumns: string[];
}

/** The input rearranged as an ordinary (single-chain-with-gaps) problem, and how. */
export interface PreparedPanel {
  /** Row order used: `order[r]` is the caller's row (0-based) placed at position r. */
  order: Int32Array;
  /** Times on one axis: within an entity the caller's times shifted, entities separated by more than the lag. */
  axis: Float64Array;
  /** The regressors in that order, as named columns (with the entity indicators when asked). */
  x: Record<string, Float64Array>;
  /** Whether the library should add its intercept. */
  intercept: boolean;
  summary: Omit<PanelSummary, 'pairs'>;
}

/** Prefix of the entity indicator columns. */
export const ENTITY_COLUMN_PREFIX = 'entity:';

/**
 * Order the rows entity by entity (entities in the order of their first row, times increasing
 * within each), put the times on one axis, and build the regressors of the pooled model.
 *
 * @example
 * ```ts
 * const p = preparePanel({ entity: ['a', 'b', 'a', 'b'], time: [1, 1, 2, 2] }, { z: [1, 2, 3, 5] }, 4, 1, true);
 * p.order;        // Int32Array [0, 2, 1, 3]: a at 1, a at 2, b at 1, b at 2
 * p.axis;         // Float64Array [0, 1, 3, 4]: no pair joins a's last and b's first row
 * Object.keys(p.x); // ['z', 'entity:a', 'entity:b'], and p.intercept is false
 * ```
 */
export function preparePanel(panel: PanelInput, x: RegressorInput, n: number, lag: number, intercept = true, names?: string[]): PreparedPanel {
  if (panel.entity.length !== n) {
    throw new DwError('LENGTH_MISMATCH', `The entity column has ${panel.entity.length} values for ${n} observations.`, 'Give one entity label per row.');
  }
  if (panel.time.length !== n) {
    throw new DwError('LENGTH_MISMATCH', `The time column has ${panel.time.length} values for ${n} observations.`, 'Give one time value per row.');
  }
  if (!Number.isInteger(lag) || lag < 1) {
    throw new DwError('LAG_INVALID', `The lag must be a whole number of at least 1 (got ${lag}).`, 'Use 1 for consecutive periods.');
  }
  const index = new Map<string, number>();
  const labels: string[] = [];
  const members: number[][] = [];
  for (let r = 0; r < n; r++) {
    const raw = panel.entity[r];
    const label = typeof raw === 'number' ? String(raw) : typeof raw === 'string' ? raw.trim() : '';
    if (label === '' || (typeof raw === 'number' && !Number.isFinite(raw))) {
      throw new DwError('CELL_EMPTY', `The entity of observation ${r + 1} is missing.`, 'Every row needs the label of its entity.', { row: r + 1 });
    }
    const t = panel.time[r];
    if (!Number.isSafeInteger(t)) {
      throw new DwError('TIME_INVALID', `Time value ${t} at observation ${r + 1} is not a whole number.`,
        'The time column must hold integers such as years or quarter numbers.', { row: r + 1, value: String(t) });
    }
    let e = index.get(label);
    if (e === undefined) { e = labels.length; index.set(label, e); labels.push(label); members.push([]); }
    members[e].push(r);
  }
  const order = new Int32Array(n);
  const axis = new Float64Array(n);
  let pos = 0;
  let next = 0;
  let smallest = Infinity, largest = 0;
  for (let e = 0; e < labels.length; e++) {
    const rows = members[e].sort((a, b) => panel.time[a] - panel.time[b] || a - b);
    smallest = Math.min(smallest, rows.length);
    largest = Math.max(largest, rows.length);
    const first = panel.time[rows[0]];
    for (let i = 0; i < rows.length; i++) {
      const t = panel.time[rows[i]];
      if (i > 0 && t === panel.time[rows[i - 1]]) {
        throw new DwError('TIME_INVALID', `Entity '${labels[e]}' has the time ${t} twice (observations ${rows[i - 1] + 1} and ${rows[i] + 1}).`,
          'Each entity may have each period once: remove or merge the duplicated row.', { row: rows[i] + 1, value: String(t) });
      }
      order[pos] = rows[i];
      axis[pos] = next + (t - first);
      if (!Number.isSafeInteger(axis[pos])) {
        throw new DwError('TIME_INVALID', `The times of the panel span too many periods to be placed on one integer axis (at observation ${rows[i] + 1}).`,
          'Number the periods from a nearby origin (e.g. years since 2000).', { row: rows[i] + 1, value: String(t) });
      }
      pos++;
    }
    next = axis[pos - 1] + lag + 1;
  }
  const columns: Record<string, Float64Array> = {};
  if (Array.isArray(x)) {
    const rowsIn = x as ReadonlyArray<ArrayLike<number>>;
    if (rowsIn.length !== n && rowsIn.length !== 0) {
      throw new DwError('LENGTH_MISMATCH', `The regressors have ${rowsIn.length} rows but there are ${n} observations.`, 'Give one row of regressors per observation.');
    }
    const p = rowsIn.length === 0 ? 0 : rowsIn[0].length;
    const colNames = names ?? Array.from({ length: p }, (_, j) => `x${j + 1}`);
    if (colNames.length !== p) {
      throw new DwError('LENGTH_MISMATCH', `${colNames.length} names were given for ${p} regressors.`, 'Give one name per column.');
    }
    for (let j = 0; j < p; j++) {
      const col = new Float64Array(n);
      for (let r = 0; r < n; r++) {
        if (rowsIn[order[r]].length !== p) {
          throw new DwError('LENGTH_MISMATCH', `Row ${order[r] + 1} of the regressors has ${rowsIn[order[r]].length} values, row 1 has ${p}.`, 'Every row must have the same number of regressors.', { row: order[r] + 1 });
        }
        col[r] = rowsIn[order[r]][j];
      }
      columns[colNames[j]] = col;
    }
  } else {
    for (const [name, values] of Object.entries(x as Record<string, ArrayLike<number>>)) {
      if (values.length !== n) {
        throw new DwError('LENGTH_MISMATCH', `The regressor '${name}' has ${values.length} values for ${n} observations.`, 'Give one value per observation.', { column: name });
      }
      const col = new Float64Array(n);
      for (let r = 0; r < n; r++) col[r] = values[order[r]];
      columns[name] = col;
    }
  }
  const entityEffects = panel.entityEffects === true;
  const effectColumns: string[] = [];
  if (entityEffects) {
    pos = 0;
    for (let e = 0; e < labels.length; e++) {
      const name = `${ENTITY_COLUMN_PREFIX}${labels[e]}`;
      if (name in columns) {
        throw new DwError('COLUMN_REPEATED', `A regressor is already named '${name}', the name of an entity indicator.`, 'Rename that regressor.', { column: name });
      }
      const col = new Float64Array(n);
      for (let i = 0; i < members[e].length; i++) col[pos++] = 1;
      columns[name] = col;
      effectColumns.push(name);
    }
  }
  return {
    order,
    axis,
    x: columns,
    intercept: entityEffects ? false : intercept,
    summary: { entities: labels.length, labels, smallest, largest, entityEffects, effectColumns },
  };
}

/**
 * The caller's series (y or residuals) in the panel's row order.
 *
 * @example
 * ```ts
 * reorder([10, 20, 30], Int32Array.from([2, 0, 1])); // Float64Array [30, 10, 20]
 * ```
 */
export function reorder(values: ArrayLike<number>, order: Int32Array): Float64Array {
  const out = new Float64Array(order.length);
  for (let r = 0; r < order.length; r++) out[r] = values[order[r]];
  return out;
}
