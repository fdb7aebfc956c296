/**
 * A whole table of Durbin-Watson bounds, computed (never stored): d_L and d_U for every n, k' and
 * alpha asked for (Durbin & Watson 1950, 1951; the layout of the printed tables, e.g. Savin & White
 * 1977, Econometrica 45, 1989-1996, rows n, columns k'). Each bound is an exact quantile
 * (quantile.ts); along each column the solve for n starts from the values at the previous rows.
 */
import { DwError } from '../errors.js';
import { bounds } from './bounds.js';
import { checkAlpha } from '../core/alternative.js';
import type { MethodChoice } from '../core/types.js';
import { boundQuantile } from './quantile.js';
import { MAX_BOUNDS_N, lowerBoundIndices, upperBoundIndices } from './spectra.js';
import { POLICY } from '../policy.js';

/** Most cells (n, k', alpha triples, skipped ones included) one table may have. */
export const MAX_TABLE_CELLS = POLICY.limits.MAX_TABLE_CELLS;

/**
 * Most work one table may take, in units of about 10 microseconds of one core of the development
 * machine (so about 30 s). A cell costs min(m, k' + 8) + 20 + m / 10 units: the closed-form integrand
 * touches k' weights (or all m when that is fewer), and each integral sets up all m weights once.
 * The 6..200 x 1..20 x 2-level grid is about 0.3 million units.
 */
export const MAX_TABLE_WORK = POLICY.limits.MAX_TABLE_WORK;

/**
 * Work units of one cell (see {@link MAX_TABLE_WORK}).
 *
 * @example
 * ```ts
 * cellWork(20, 1, true); // min(18, 9) + 20 + 1.8 = 30.8
 * ```
 */
export function cellWork(n: number, kPrime: number, intercept: boolean): number {
  const m = n - kPrime - (intercept ? 1 : 0);
  return Math.min(m, kPrime + 8) + 20 + m / 10;
}

/** What to tabulate. */
export interface BoundsTableRequest {
  /** Sample sizes (sorted and de-duplicated). */
  n: number[];
  /** Regressors other than the intercept (sorted and de-duplicated). */
  kPrime: number[];
  /** One-sided levels (de-duplicated, order kept). */
  alpha: number[];
  /** Bounds for a model with an intercept (default true, the tables' case). */
  intercept?: boolean;
  /**
   * Engine: `auto` (default) solves whole columns of n with warm starts on the closed-form
   * (Chebyshev-product) route; a named engine solves every cell through `bounds()` with that
   * engine (slower; for cross-checks).
   */
  method?: MethodChoice;
}

/** One cell of the table. */
export interface BoundsTableCell {
  n: number;
  kPrime: number;
  alpha: number;
  dL: number;
  dU: number;
}

/** A computed table; its conventions (k' excludes the intercept, one-sided alpha) are worded by the renderers (src/report/wording/bounds.ts). */
export interface BoundsTable {
  intercept: boolean;
  n: number[];
  kPrime: number[];
  alpha: number[];
  /** Cells in the order alpha, n, k' (skipped cells left out). */
  cells: BoundsTableCell[];
  /** Smallest n tabulated for k': k' + 3 with an intercept, k' + 2 without; smaller n are left out. */
  minN: (kPrime: number) => number;
  /** Number of (n, k', alpha) cells left out because n is too small for k'. */
  skipped: number;
  /** Imhof integrals evaluated, for the benchmark. */
  evaluations: number;
}

/**
 * Check a table request; throws `N_INVALID`, `K_INVALID`, `ALPHA_OUT_OF_RANGE` or `SIZE_LIMIT`
 * and returns the cleaned lists (n and k' sorted and de-duplicated, alpha de-duplicated).
 *
 * @example
 * ```ts
 * checkTableRequest({ n: [20, 10, 20], kPrime: [1], alpha: [0.05] }).n; // [10, 20]
 * ```
 */
export function checkTableRequest(req: BoundsTableRequest): { n: number[]; kPrime: number[]; alpha: number[]; intercept: boolean } {
  const intercept = req.intercept ?? true;
  if (req.n.length === 0) throw new DwError('N_INVALID', 'The table has no value of n.', 'Give sample sizes, e.g. 6-200.');
  if (req.kPrime.length === 0) throw new DwError('K_INVALID', "The table has no value of k'.", "Give numbers of regressors, e.g. 1-20.");
  if (req.alpha.length === 0) throw new DwError('ALPHA_OUT_OF_RANGE', 'The table has no significance level.', 'Give levels, e.g. 0.05,0.01.');
  for (const a of req.alpha) checkAlpha(a);
  for (const k of req.kPrime) {
    if (!(Number.isInteger(k) && k >= 0)) {
      throw new DwError('K_INVALID', `k' must be a whole number of at least 0 (got ${k}).`, "k' counts the regressors other than the intercept.", { value: String(k) });
    }
  }
  for (const n of req.n) {
    if (!(Number.isInteger(n) && n >= 1)) {
      throw new DwError('N_INVALID', `n must be a whole number of observations (got ${n}).`, 'Give sample sizes such as 6-200.', { value: String(n) });
    }
    if (n > MAX_BOUNDS_N) {
      throw new DwError('SIZE_LIMIT', `n = ${n} is above the limit of ${MAX_BOUNDS_N} for the bounds.`, `Keep every n at most ${MAX_BOUNDS_N}.`, { value: String(n) });
    }
  }
  const n = [...new Set(req.n)].sort((a, b) => a - b);
  const kPrime = [...new Set(req.kPrime)].sort((a, b) => a - b);
  const alpha = [...new Set(req.alpha)];
  const cells = n.length * kPrime.length * alpha.length;
  if (cells > MAX_TABLE_CELLS) {
    throw new DwError('SIZE_LIMIT',
      `The table would have ${cells.toLocaleString('en-US')} cells (${n.length} values of n x ${kPrime.length} of k' x ${alpha.length} of alpha); the limit is ${MAX_TABLE_CELLS.toLocaleString('en-US')}.`,
      'Ask for fewer values, e.g. n from 10 to 200 in steps of 10, or split the table into several runs.', { suggest: [{ option: 'n', value: '10-200:10' }] });
  }
  const minN = (k: number) => k + (intercept ? 3 : 2);
  let work = 0;
  for (const v of n) for (const k of kPrime) if (v >= minN(k)) work += alpha.length * cellWork(v, k, intercept);
  if (work > MAX_TABLE_WORK) {
    throw new DwError('SIZE_LIMIT',
      `The table would take roughly ${Math.round(work * 1e-5)} s of computing (${cells.toLocaleString('en-US')} cells, n up to ${n[n.length - 1]}, k' up to ${kPrime[kPrime.length - 1]}); the limit is about ${Math.round(MAX_TABLE_WORK * 1e-5)} s.`,
      'Ask for fewer values, e.g. n from 100 to 2000 in steps of 100, or split the table into several runs.', { suggest: [{ option: 'n', value: '100-2000:100' }] });
  }
  if (!n.some((v) => kPrime.some((k) => v >= minN(k)))) {
    throw new DwError('N_INVALID',
      `Every n asked for is too small for the k' asked for: the bounds need n >= k' + ${intercept ? 3 : 2}.`,
      `Use n of at least ${minN(kPrime[0])} for k' = ${kPrime[0]}.`);
  }
  return { n, kPrime, alpha, intercept };
}

/**
 * Compute a table of exact bounds. Quantiles are solved to 1e-9 (probabilities to 1e-10), far
 * below the 3 decimals printed tables show.
 *
 * @example
 * ```ts
 * const t = boundsTable({ n: [15, 20], kPrime: [1, 2], alpha: [0.05] });
 * t.cells[0]; // { n: 15, kPrime: 1, alpha: 0.05, dL: 1.0770..., dU: 1.3605... }
 * ```
 */
export function boundsTable(req: BoundsTableRequest): BoundsTable {
  const { n, kPrime, alpha, intercept } = checkTableRequest(req);
  const minN = (k: number) => k + (intercept ? 3 : 2);
  const values = new Map<string, { dL: number; dU: number }>();
  let evaluations = 0;
  let skipped = 0;
  const method = req.method ?? 'auto';
  for (const a of alpha) {
    for (const k of kPrime) {
      const columnN = n.filter((v) => v >= minN(k));
      skipped += n.length - columnN.length;
      if (method !== 'auto') {
        for (const v of columnN) {
          const b = bounds(v, k, a, { intercept, method });
          values.set(`${a}|${v}|${k}`, { dL: b.dL, dU: b.dU });
        }
        continue;
      }
      const dL = solveColumn(columnN, (v) => lowerBoundIndices(v, k, intercept), a);
      const dU = solveColumn(columnN, (v) => upperBoundIndices(v, k, intercept), a);
      evaluations += dL.evaluations + dU.evaluations;
      columnN.forEach((v, i) => values.set(`${a}|${v}|${k}`, { dL: dL.values[i], dU: dU.values[i] }));
    }
  }
  const cells: BoundsTableCell[] = [];
  for (const a of alpha) {
    for (const v of n) {
      for (const k of kPrime) {
        const c = values.get(`${a}|${v}|${k}`);
        if (c) cells.push({ n: v, kPrime: k, alpha: a, dL: c.dL, dU: c.dU });
      }
    }
  }
  return { intercept, n, kPrime, alpha, cells, minN, skipped, evaluations };
}

/**
 * One bound along ascending n: each solve starts from the extrapolation of the last values (linear
 * from two, quadratic from three), with a first step twice the last extrapolation error.
 */
function solveColumn(ns: number[], indices: (n: number) => ReturnType<typeof lowerBoundIndices>, alpha: number): { values: number[]; evaluations: number } {
  const values: number[] = [];
  let evaluations = 0;
  let lastMiss = 1e-3;
  for (let i = 0; i < ns.length; i++) {
    let guess: number | undefined;
    if (i === 1) guess = values[0];
    else if (i === 2) guess = values[1] + ((values[1] - values[0]) * (ns[2] - ns[1])) / (ns[1] - ns[0]);
    else if (i >= 3) guess = quadratic(ns[i], ns[i - 3], values[i - 3], ns[i - 2], values[i - 2], ns[i - 1], values[i - 1]);
    const step = guess === undefined ? undefined : Math.min(0.05, Math.max(1e-6, 2 * lastMiss));
    const q = boundQuantile(ns[i], indices(ns[i]), alpha, { guess, step });
    if (guess !== undefined) lastMiss = Math.abs(q.value - guess);
    values.push(q.value);
    evaluations += q.evaluations;
  }
  return { values, evaluations };
}

/** The quadratic through three points (distinct abscissae), evaluated at x. */
function quadratic(x: number, x0: number, y0: number, x1: number, y1: number, x2: number, y2: number): number {
  return (
    (y0 * (x - x1) * (x - x2)) / ((x0 - x1) * (x0 - x2)) +
    (y1 * (x - x0) * (x - x2)) / ((x1 - x0) * (x1 - x2)) +
    (y2 * (x - x0) * (x - x1)) / ((x2 - x0) * (x2 - x1))
  );
}
