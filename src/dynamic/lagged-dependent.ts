/**
 * Detecting a lagged dependent variable among the regressors (docs/methods.md section 8): a column x
 * with x_t = y_{t-1} for every observation after the first. With such a regressor d is biased
 * towards 2 and its exact null distribution does not hold (Durbin 1970, Econometrica 38, 410-421).
 */
import { POLICY } from '../policy.js';

/** Relative tolerance of the match, against the largest |y|. */
export const LAG_MATCH_TOLERANCE = POLICY.tolerances.LAG_MATCH_TOLERANCE;

/**
 * The name of the first regressor equal to y lagged one period, or null.
 *
 * A column matches when |x_t - y_{t-1}| <= 1e-12 max|y| for t = 2..n; its first value (the
 * pre-sample y_0) may be anything. With observation `times`, "one period" means one time unit:
 * x_t is compared with the y observed at time t - 1, and rows whose previous period is not
 * observed (the first row, and the row after each gap) are not compared. Constant columns never
 * match, and at least two comparisons are needed.
 *
 * @example
 * ```ts
 * detectLaggedDependent([3, 5, 4, 6, 7], { price: [1, 2, 2, 3, 1], ylag: [2.5, 3, 5, 4, 6] }); // 'ylag'
 * ```
 */
export function detectLaggedDependent(
  y: ArrayLike<number>,
  columns: Readonly<Record<string, ArrayLike<number>>>,
  times?: ArrayLike<number>,
): string | null {
  const n = y.length;
  let scale = 0;
  for (let t = 0; t < n; t++) {
    if (!Number.isFinite(y[t])) return null;
    scale = Math.max(scale, Math.abs(y[t]));
  }
  if (!(scale > 0)) return null;
  const tol = LAG_MATCH_TOLERANCE * scale;
  // previous[t]: row holding y one period before row t, or -1
  const previous = new Int32Array(n).fill(-1);
  for (let t = 1; t < n; t++) {
    if (!times) { previous[t] = t - 1; continue; }
    if (times[t] - times[t - 1] === 1) previous[t] = t - 1;
  }
  let comparisons = 0;
  for (let t = 1; t < n; t++) if (previous[t] >= 0) comparisons++;
  if (comparisons < 2) return null;
  for (const [name, x] of Object.entries(columns)) {
    if (x.length !== n) continue;
    let constant = true;
    for (let t = 1; t < n; t++) if (x[t] !== x[0]) { constant = false; break; }
    if (constant) continue;
    let match = true;
    for (let t = 1; t < n && match; t++) {
      const s = previous[t];
      if (s < 0) continue;
      if (!(Math.abs(x[t] - y[s]) <= tol)) match = false;
    }
    if (match) return name;
  }
  return null;
}
