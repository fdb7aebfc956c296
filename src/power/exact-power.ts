/**
 * Exact power of the Durbin-Watson test against stationary AR(1) errors for the caller's own X
 * (docs/methods.md section 6; the method of Imhof 1961 applied to the alternative distribution, as in
 * the power studies that followed Durbin & Watson 1971):
 *
 *   power(rho) = P(d <= d*_alpha | rho),   P(d <= c | rho) = P( sum_i w_i z_i^2 <= 0 ),
 *
 * with d*_alpha the exact critical value of the null distribution (P(d <= d*_alpha | 0) = alpha)
 * and w_i the eigenvalues of L' M (A - cI) M L, L L' = S_rho (see weights.ts). The probability is
 * Imhof's integral on the weights with c = 0. At rho = 0 the weights are nu_i - c and the power
 * is alpha exactly. The test against negative autocorrelation uses the upper critical value and
 * P(d >= c | rho) computed directly (the weights negated); the two-sided test adds both tails at
 * alpha / 2.
 *
 * Two routes (the result's `route` and `notes` say which answered):
 *   - dense (weights.ts): the weights from an eigen-decomposition, O(n^2 k + m^3) per rho, exact and
 *     fast for small n; limited to n <= POWER_SIZE_LIMIT;
 *   - eigen-free (eigenfree-power.ts): log det(I - iu L'CL) from banded factorisations, because
 *     S_rho^-1 is tridiagonal (docs/methods.md sections 5 and 6), O(n k (k + lag)) per integrand
 *     evaluation; every n up to POWER_MAX_N (src/limits.ts). A probability that Chernoff's bound
 *     puts within a tenth of the tolerance of 0 or 1 is settled by the bound.
 * `auto` takes the dense route up to n = max(POWER_DENSE_MAX_N, 25 k) (at most POWER_SIZE_LIMIT) and
 * the eigen-free one above. Measured on this project's 2-core machine (one power value, the best of
 * three runs, lag 1 unless stated), dense vs eigen-free: k = 3: n = 50 1.1 vs 2.9 ms, n = 100 10 vs
 * 2.4 ms, n = 300 89 vs 7.8 ms; k = 3, lag 4: n = 100 5.8 vs 13 ms, n = 300 93 vs 24 ms; k = 7:
 * n = 150 18 vs 21 ms, n = 300 109 vs 49 ms; k = 16: n = 300 89 vs 200 ms, n = 400 209 vs 200 ms,
 * n = 600 820 vs 330 ms. The eigen-free cost grows like n k^2, the dense one like n^3, and they
 * cross near n = 25 k; below n = 100 both take milliseconds and the dense route, which has the
 * weights themselves, is kept. The critical value comes from the null distribution, which
 * itself uses the eigen-free null engine above n = 1000 (src/engines/choose.ts).
 */
import { DwError } from '../errors.js';
import type { Tail } from '../core/types.js';
import { integrateImhof, spectralForm } from '../engines/imhof.js';
import { brentRoot } from '../numeric/root.js';
import type { RegressorInput } from '../model/design.js';
import { prepareProblem, type DwProblem, type ProblemOptions } from '../problem/problem.js';
import { rowCount } from '../model/design.js';
import type { PowerSummary } from '../core/result-types.js';
import { checkAlpha, checkAlternative, type Alternative } from '../core/alternative.js';
import { checkRho, powerContext, rhoFactor, weightsAt, type ErrorProcess, type PowerContext } from './weights.js';
import { alternativeStructure, eigenfreeAlternativeTail, type AlternativeStructure } from './eigenfree-power.js';
import { columnBasis } from '../linalg/qr.js';
import { checkPowerSize, POWER_MAX_N } from '../limits.js';
import { POLICY } from '../policy.js';

/**
 * Largest n for the dense power route (each rho costs O(n^3): about 0.9 s per rho at n = 600,
 * k = 3). Larger problems take the eigen-free route, up to POWER_MAX_N (src/limits.ts).
 */
export const POWER_SIZE_LIMIT = POLICY.limits.POWER_SIZE_LIMIT;

/**
 * `auto` takes the dense route for n <= max(POWER_DENSE_MAX_N, 25 k) (and n <= POWER_SIZE_LIMIT): there
 * it is about as fast as the eigen-free route or faster and gives the weights themselves; above it the
 * eigen-free route wins (measured, see the file comment).
 */
export const POWER_DENSE_MAX_N = POLICY.limits.POWER_DENSE_MAX_N;

/**
 * The route `auto` takes for n observations and k columns.
 *
 * @example
 * ```ts
 * autoPowerRoute(60, 3);    // 'dense'
 * autoPowerRoute(5000, 3);  // 'eigenfree'
 * ```
 */
export function autoPowerRoute(n: number, k: number): Exclude<PowerRoute, 'auto'> {
  return n <= Math.min(POWER_SIZE_LIMIT, Math.max(POWER_DENSE_MAX_N, 25 * k)) ? 'dense' : 'eigenfree';
}

/**
 * How the power is computed: `dense` (weights from an eigen-decomposition, n <= POWER_SIZE_LIMIT),
 * `eigenfree` (banded factorisations, any n up to POWER_MAX_N), or `auto` (default: see
 * {@link autoPowerRoute}).
 */
export type PowerRoute = 'auto' | 'dense' | 'eigenfree';

/** Points below the first of TARGET_GRID for the eigen-free route (large n): 0.05 / 2^j, j = 7..1. */
const FINE_GRID = [7, 6, 5, 4, 3, 2, 1].map((j) => 0.05 / 2 ** j);
/** The grid on which the target power is first bracketed (then refined by Brent's method). */
const TARGET_GRID = [0.05, 0.1, 0.15, 0.2, 0.25, 0.3, 0.35, 0.4, 0.45, 0.5, 0.55, 0.6, 0.65, 0.7, 0.75, 0.8, 0.85, 0.9, 0.95, 0.99];

/** One point of the power curve. */
export interface PowerPoint {
  rho: number;
  /** P(reject | rho). */
  power: number;
  /**
   * Bound on the numerical error of `power` from Imhof's integral (quadrature and truncation).
   * The critical value itself is found to about 1e-12 in d, which moves the power by at most
   * that times the density of d under rho: far below this bound for ordinary designs.
   */
  errorBound: number;
}

/** Options of the power computation for a prepared problem. */
export interface PowerOptions {
  /** Size of the test (default 0.05). */
  alpha?: number;
  /** Values of rho in (-1, 1) at which to evaluate the power. */
  rho: ArrayLike<number>;
  /** Power to reach (default 0.8); the smallest |rho| reaching it is reported. */
  target?: number;
  /**
   * The test whose power is wanted: `positive` (default, reject when d <= d*_alpha), `negative`
   * (reject when d >= the upper critical value) or `two-sided` (alpha / 2 in each tail).
   */
  alternative?: Alternative;
  /**
   * Error process under the alternative: `ar1` (default), u_t = rho u_{t-1} + eps_t, or `seasonal`,
   * u_t = rho u_{t-J} + eps_t with J the lag of the statistic (Wallis 1972's alternative).
   */
  process?: ErrorProcess;
  /** Target absolute error of each probability (default 1e-11). */
  tolerance?: number;
  /** Route of the computation (default `auto`; see {@link PowerRoute}). */
  route?: PowerRoute;
  /**
   * Search for the rho reaching the target power (default true). Each step of the search is one
   * more power value: at n = 10^5 the search takes about a minute, so callers that only want the
   * curve can skip it (rhoAtTarget is then null, and a note says it was not searched for).
   */
  searchTarget?: boolean;
  /**
   * Observation times, when the problem was prepared with them: the error process runs on the
   * integer time axis, so a gap of g periods between two observations gives correlation rho^g.
   */
  times?: ArrayLike<number>;
}

/** Exact power of the test for one design, with the evidence for its accuracy. */
export interface ExactPower extends PowerSummary {
  curve: PowerPoint[];
  alternative: Alternative;
  /**
   * `critical` is the critical value the test rejects beyond: the lower one (P(D <= critical) =
   * alpha) for `positive`, the upper one (P(D >= critical) = alpha) for `negative`, the lower one at
   * alpha / 2 for `two-sided`, whose upper one at alpha / 2 is `criticalUpper` (null otherwise).
   */
  criticalUpper: number | null;
  /**
   * For `positive` and `two-sided`: the smallest rho in (0, 0.99] with power >= target; for
   * `negative`: the rho in [-0.99, 0) closest to 0 with power >= target. Null when not reached.
   */
  rhoAtTarget: number | null;
  process: ErrorProcess;
  n: number;
  k: number;
  m: number;
  lag: number;
  /** True when the time column has gaps. */
  gaps: boolean;
  /** Largest error bound over the curve. */
  errorBound: number;
  /** The route that computed the power (`dense` or `eigenfree`). */
  route: Exclude<PowerRoute, 'auto'>;
  /**
   * Remarks worth showing with the curve (the route; power that falls as |rho| grows; ...), as
   * typed codes with plain fields; the words are in src/report/wording.ts.
   */
  notes: PowerNote[];
}

/** A remark on a power result, as plain data. New codes may be added; existing ones keep their meaning. */
export type PowerNote =
  /** On the side tested, the power falls as |rho| grows from `from` to `to` (both on the curve). */
  | { code: 'POWER_FALLS'; from: number; to: number }
  /** The rho at which the target power is reached was not searched for. */
  | { code: 'TARGET_NOT_SEARCHED'; target: number }
  /** The target power is not reached for |rho| <= 0.99. */
  | { code: 'TARGET_NOT_REACHED'; target: number }
  /** The route that computed the power; `bySize` when `auto` took the eigen-free route for the size of n. */
  | { code: 'POWER_ROUTE'; route: 'dense' | 'eigenfree'; n: number; bySize: boolean }
  /** `count` probabilities within `within` of 0 or 1 by Chernoff's bound were settled by it. */
  | { code: 'CHERNOFF_SETTLED'; count: number; within: number };

/**
 * P(d <= c | rho) (`lower`) or P(d >= c | rho) (`upper`) for the design behind `ctx`, by Imhof's
 * integral on the weights (the upper tail directly, from the negated weights).
 *
 * @example
 * ```ts
 * const p = prepareProblem({ trend }, 20);
 * const ctx = powerContext(p.factored.qr, p.operator, p.pairs.lag);
 * alternativeTail(ctx, 1.5, 0.6, 'lower').p; // P(d <= 1.5) when u is AR(1) with rho = 0.6
 * ```
 */
export function alternativeTail(ctx: PowerContext, c: number, rho: number, tail: Tail,
  options: { process?: ErrorProcess; tolerance?: number } = {}): { p: number; errorBound: number } {
  const w = weightsAt(rhoFactor(ctx, rho, options.process ?? 'ar1'), ctx.m, c);
  return weightsTail(w, tail, options.tolerance);
}

/** P(sum w z^2 <= 0) (`lower`) or P(sum w z^2 >= 0) (`upper`) for ascending weights w. */
function weightsTail(w: Float64Array, tail: Tail, tolerance?: number): { p: number; errorBound: number } {
  const m = w.length;
  const lower = tail === 'lower';
  if (w[0] >= 0) return { p: lower ? 0 : 1, errorBound: 0 };
  if (w[m - 1] <= 0) return { p: lower ? 1 : 0, errorBound: 0 };
  const r = integrateImhof(spectralForm(w, 0, lower ? 1 : -1), { tolerance });
  return { p: r.p, errorBound: r.errorBound };
}

/**
 * The exact power curve and the rho at which the target power is reached, for a prepared problem
 * (see {@link exactPower} for the version that takes the regressors).
 *
 * @example
 * ```ts
 * const s = powerForProblem(prepareProblem({ trend }, 20), { rho: [0.2, 0.5, 0.8] });
 * s.curve; // [{ rho: 0.2, power: ... }, ...]
 * ```
 */
export function powerForProblem(problem: DwProblem, options: PowerOptions): ExactPower {
  const alpha = options.alpha ?? 0.05;
  checkAlpha(alpha);
  const target = options.target ?? 0.8;
  const alternative = checkAlternative(options.alternative ?? 'positive');
  const process = options.process ?? 'ar1';
  if (process !== 'ar1' && process !== 'seasonal') {
    throw new DwError('OPTION_VALUE', `Unknown error process '${process}'.`, 'Use ar1 or seasonal.');
  }
  if (!(target > alpha && target < 1)) {
    throw new DwError('PROBABILITY_OUT_OF_RANGE', `The target power ${target} is not between alpha = ${alpha} and 1.`,
      'The power at rho = 0 is alpha; give a target such as 0.8 or 0.9.', { value: String(target) });
  }
  const rhos = Array.from(options.rho);
  for (const r of rhos) checkRho(r);
  const { design } = problem.factored;
  const { n, k } = design;
  const requested = options.route ?? 'auto';
  if (!['auto', 'dense', 'eigenfree'].includes(requested)) {
    throw new DwError('OPTION_VALUE', `Unknown power route '${String(requested)}'.`, 'Use auto, dense or eigenfree.');
  }
  checkPowerSize(n, k, problem.pairs.lag);
  if (requested === 'dense' && n > POWER_SIZE_LIMIT) {
    throw new DwError('SIZE_LIMIT', `The dense power route costs O(n^3) per rho and is limited to n <= ${POWER_SIZE_LIMIT} (n = ${n}).`,
      `Use the eigen-free route (route auto or eigenfree), which takes n up to ${POWER_MAX_N}.`);
  }
  const route: Exclude<PowerRoute, 'auto'> = requested === 'auto' ? autoPowerRoute(n, k) : requested;
  const dist = problem.distribution;
  const tol = options.tolerance;
  let critical: number;
  let criticalUpper: number | null = null;
  if (alternative === 'positive') critical = dist.quantile(alpha);
  else if (alternative === 'negative') critical = dist.upperQuantile(alpha);
  else { critical = dist.quantile(alpha / 2); criticalUpper = dist.upperQuantile(alpha / 2); }

  if (options.times && options.times.length !== n) {
    throw new DwError('LENGTH_MISMATCH', `The time column has ${options.times.length} values for ${n} observations.`,
      'Give one time value per row.');
  }
  // tail(rho, c, tail): P(d <= c | rho) or P(d >= c | rho) by the chosen route
  let tailAt: (rho: number, cs: { c: number; tail: Tail }[]) => { p: number; errorBound: number }[];
  let bounded = 0;
  if (route === 'dense') {
    const ctx = powerContext(problem.factored.qr, problem.operator, problem.pairs.lag, options.times);
    tailAt = (rho, cs) => {
      const f = rhoFactor(ctx, rho, process);
      return cs.map(({ c, tail }) => weightsTail(weightsAt(f, ctx.m, c), tail, tol));
    };
  } else {
    const st: AlternativeStructure = alternativeStructure(columnBasis(problem.factored.qr), problem.operator, problem.pairs.lag, options.times, process);
    tailAt = (rho, cs) => cs.map(({ c, tail }) => {
      const r = eigenfreeAlternativeTail(st, c, rho, tail, { tolerance: tol });
      if (r.via === 'chernoff') bounded++;
      return r;
    });
  }
  const at = (rho: number): PowerPoint => {
    if (alternative === 'positive') {
      const [r] = tailAt(rho, [{ c: critical, tail: 'lower' }]);
      return { rho, power: r.p, errorBound: r.errorBound };
    }
    if (alternative === 'negative') {
      const [r] = tailAt(rho, [{ c: critical, tail: 'upper' }]);
      return { rho, power: r.p, errorBound: r.errorBound };
    }
    const [lo, hi] = tailAt(rho, [{ c: critical, tail: 'lower' }, { c: criticalUpper as number, tail: 'upper' }]);
    return { rho, power: Math.min(1, lo.p + hi.p), errorBound: lo.errorBound + hi.errorBound };
  };
  const curve = rhos.map(at);
  const side = alternative === 'negative' ? -1 : 1;
  // at large n the power rises within |rho| of order 1/sqrt(n): the eigen-free route brackets the
  // target on a finer grid below the first point of the dense route's grid (from 0.25 / sqrt(n) on;
  // below that the bracket starts at rho = 0, where the power is alpha)
  const grid = route === 'dense' ? TARGET_GRID : [...FINE_GRID.filter((r) => r >= 0.25 / Math.sqrt(n)), ...TARGET_GRID];
  const searched = options.searchTarget ?? true;
  const rhoAtTarget = searched ? findTarget((r) => at(side * r).power, alpha, target, grid) : null;
  let errorBound = 0;
  for (const p of curve) errorBound = Math.max(errorBound, p.errorBound);
  const notes: PowerNote[] = [];
  // on the side the test is aimed at, power usually rises with |rho|; for some designs it does not
  const aimed = curve.filter((p) => side * p.rho > 0).sort((a, b) => side * (a.rho - b.rho));
  for (let i = 1; i < aimed.length; i++) {
    if (aimed[i].power < aimed[i - 1].power - 1e-9) {
      notes.push({ code: 'POWER_FALLS', from: aimed[i - 1].rho, to: aimed[i].rho });
      break;
    }
  }
  if (!searched) notes.push({ code: 'TARGET_NOT_SEARCHED', target });
  else if (rhoAtTarget === null) notes.push({ code: 'TARGET_NOT_REACHED', target });
  notes.push({ code: 'POWER_ROUTE', route, n, bySize: route === 'eigenfree' && requested === 'auto' });
  if (bounded > 0) notes.push({ code: 'CHERNOFF_SETTLED', count: bounded, within: 0.1 * (tol ?? 1e-11) });
  return {
    alpha,
    critical,
    criticalUpper,
    curve,
    target,
    rhoAtTarget: rhoAtTarget === null ? null : side * rhoAtTarget,
    alternative,
    process,
    n,
    k,
    m: n - k,
    lag: problem.pairs.lag,
    gaps: problem.pairs.from.length < n - problem.pairs.lag,
    errorBound,
    route,
    notes,
  };
}

/**
 * The smallest r in (0, 0.99] with power(r) >= target: the first grid point that reaches it, then
 * Brent's method between it and the grid point before (power(0) = alpha < target). Null when no
 * grid point reaches the target.
 */
function findTarget(power: (r: number) => number, alpha: number, target: number, grid: number[]): number | null {
  let prev = 0;
  let prevValue = alpha;
  for (const r of grid) {
    const v = power(r);
    if (v >= target) {
      if (v === target) return r;
      if (prevValue === target) return prev;
      return brentRoot((x) => power(x) - target, prev, r, 1e-7);
    }
    prev = r;
    prevValue = v;
  }
  return null;
}

/** Input of {@link exactPower}: the regressors, the definition of the statistic, and the power options. */
export interface ExactPowerInput extends ProblemOptions, PowerOptions {
  /** The regressors (rows or named columns), without the intercept (added by default). */
  x: RegressorInput;
  /** Number of observations (needed only when `x` has no columns: the intercept-only model). */
  n?: number;
}

/**
 * Exact power of the Durbin-Watson test against AR(1) errors for the caller's X.
 *
 * @example
 * ```ts
 * const s = exactPower({ x: { trend: [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12] }, rho: [0.3, 0.6], alpha: 0.05 });
 * s.critical;     // exact 5% critical value for this X
 * s.curve;        // [{ rho: 0.3, power: ... }, { rho: 0.6, power: ... }]
 * s.rhoAtTarget;  // smallest rho with power >= 0.8, or null
 * ```
 */
export function exactPower(input: ExactPowerInput): ExactPower {
  const n = input.n ?? rowCount(input.x);
  const problem = prepareProblem(input.x, n, input);
  return powerForProblem(problem, input);
}
