/**
 * The precision policy: every size limit and every tolerance of the numerical core, defined once.
 * The modules read their values from here (their old exported names, where kept, are aliases);
 * `checkSize` in src/limits.ts applies the size limits. docs/errors-and-limits.md lists the size
 * limits, and test/catalogue.test.ts checks that list against {@link POLICY}.
 *
 * "Measured" means one run on the project's development machine (a shared 2-core container);
 * the accuracy figures come from the tests named beside them and docs/accuracy.md.
 */

/** Freeze a table of numbers (values typed as number, not as their literals). */
function frozen<T extends Record<string, number>>(table: T): { readonly [K in keyof T]: number } {
  return Object.freeze(table);
}

/** Size limits: where one answer would take more than about 20 s, or memory beyond the budget. */
const limits = frozen({
  /** Largest n for the dense spectrum, O(n^3) time and about 24 n^2 bytes; measured 2.4 s at n = 1000, 23 s at n = 2000 (src/core/spectrum.ts). */
  DENSE_SPECTRUM_MAX_N: 2000,
  /** Largest n for the structured spectrum of a difference operator, O(k n^2) time, O(n k) memory; about 10 s at the limit (src/core/fast-spectrum.ts). */
  STRUCTURED_SPECTRUM_MAX_N: 10000,
  /** Above this n `auto` computes no spectrum that is not already known (src/engines/choose.ts): the eigen-free or DCT route is faster there. */
  AUTO_SPECTRUM_MAX_N: 1000,
  /** Largest m = n - k for Pan's formula when it is forced: beyond it its alternating sum loses accuracy in the body of the distribution (measured in src/engines/pan.ts). */
  PAN_MAX_M: 400,
  /** Largest m for which Pan's engine is accepted without knowing c: at the middle of the support the rounding bound stays below about 2e-13 (src/engines/pan.ts). */
  PAN_ANY_C_MAX_M: 24,
  /** Largest n for the eigen-free engine, O(n k (k + lag)) per evaluation; one probability (k = 3) measured 0.26 s at n = 10^4, 8.4 s at n = 10^5. */
  EIGENFREE_MAX_N: 100000,
  /** Largest n for the DCT eigenbasis route (difference operators); one p-value at n = 10^6, k = 5 in a few seconds (docs/performance.md). */
  DCT_MAX_N: 1000000,
  /** Largest n for exact power (the eigen-free route of src/power/); one probability under the alternative measured about 6.5 s at n = 10^5, k = 3. */
  POWER_MAX_N: 100000,
  /** Largest n for the dense power route, O(n^3) per rho: about 0.9 s per rho at n = 600, k = 3 (src/power/exact-power.ts). */
  POWER_SIZE_LIMIT: 600,
  /** `auto` takes the dense power route for n <= max(this, 25 k): there it is as fast as the eigen-free route or faster (measured, src/power/exact-power.ts). */
  POWER_DENSE_MAX_N: 100,
  /** Largest n of the bounds d_L and d_U (a limit on time, not on the mathematics; src/bounds/spectra.ts). */
  MAX_BOUNDS_N: 5000,
  /** Most cells (n, k', alpha) one table of bounds may have (src/bounds/table.ts). */
  MAX_TABLE_CELLS: 100000,
  /** Most work one table of bounds may take, in units of about 10 microseconds of one core (so about 30 s; src/bounds/table.ts). */
  MAX_TABLE_WORK: 3000000,
  /** Longest list one range option may expand to, a guard against typing 1-100000000 by mistake (src/bounds/ranges.ts). */
  MAX_LIST_LENGTH: 100000,
  /** Largest memory any engine may plan to use for one problem: 1 GiB (estimates in src/limits.ts). */
  MEMORY_BUDGET_BYTES: 2 ** 30,
});

/** Tolerances: targets of the engines and thresholds of the checks on the input. */
const tolerances = frozen({
  /** Default target absolute error of a probability by Imhof's integral (spectrum, eigen-free, DCT and power forms); docs/accuracy.md. */
  PROBABILITY_TOLERANCE: 1e-11,
  /** Default target absolute error of the density by Imhof's integral (src/engines/imhof.ts, src/engines/dct.ts). */
  DENSITY_TOLERANCE: 1e-10,
  /** Relative error above which `auto` hands a tail probability to Pan's engine (src/engines/choose.ts). */
  AUTO_RELATIVE_TARGET: 1e-6,
  /** Relative error above which a tail of the closed-form bounds route is handed to the general engine (src/bounds/quantile.ts). */
  BOUNDS_RELATIVE_TARGET: 1e-6,
  /** Default target absolute error of Pan's engine, the largest error bound it accepts (src/engines/pan.ts). */
  PAN_TOLERANCE: 1e-12,
  /** Two eigenvalues closer than this fraction of the spread count as tied for Pan's formula (rounding then costs up to spread / gap = 1e6; src/engines/pan.ts). */
  PAN_TIE_GAP: 1e-6,
  /** Root-finding tolerance of a critical value (quantile), relative to max(1, width of the bracket) (src/distribution/null-distribution.ts). */
  QUANTILE_TOLERANCE: 1e-11,
  /** Default target absolute error of each probability behind d_L and d_U (at most 1e-7 alpha for small alpha; src/bounds/quantile.ts). */
  BOUNDS_PROBABILITY_TOLERANCE: 1e-10,
  /** Default target relative error of the saddle-point contour integral for small tails (src/engines/saddle-contour.ts). */
  CONTOUR_RELATIVE_TOLERANCE: 1e-10,
  /** Tolerance in d of the quantiles behind d_L and d_U (src/bounds/quantile.ts). */
  BOUNDS_QUANTILE_TOLERANCE: 1e-9,
  /** Relative |R_jj| of a centred, unit-length column below which it counts as a combination of the columns before it (src/model/design.ts). */
  RANK_TOLERANCE: 1e-10,
  /** Condition number above which a design is refused (ILL_CONDITIONED): p moves by at most about 1e-8 through rounding there (test/robustness.test.ts). */
  CONDITION_LIMIT: 1e7,
  /** Condition number above which a design gets a note: rounding in the design may then exceed 1e-10 in p. */
  CONDITION_WARNING: 1e5,
  /** Largest measured |error in d or p| / (condition x 2^-52) over the designs of test/robustness.test.ts, rounded up. */
  CONDITION_ERROR_FACTOR: 1,
  /** Caller's residuals with a component in col(X) larger than this (relative) are refused (src/inference/dw-test.ts). */
  RESIDUAL_DRIFT_LIMIT: 1e-3,
  /** Largest rounding allowance in d before a fit is refused as y in col(X) (RESIDUALS_ZERO; src/model/ols.ts, docs/errors-and-limits.md). */
  D_ROUNDING_LIMIT: 1e-8,
  /** Relative floor tau / max |lambda| under the log-moduli of the eigen-free and DCT forms (the truncation bound of Imhof's integral; src/engines/eigenfree.ts). */
  LAMBDA_FLOOR: 1e-9,
  /** Relative tolerance for a column to count as y lagged one period (src/dynamic/lagged-dependent.ts). */
  LAG_MATCH_TOLERANCE: 1e-12,
});

/**
 * The precision policy of the library, frozen: `POLICY.limits` (sizes) and `POLICY.tolerances`.
 *
 * @example
 * ```ts
 * import { POLICY } from './policy.js'; // src/policy.ts (not yet exported from the package root)
 * POLICY.limits.EIGENFREE_MAX_N;         // 100000
 * POLICY.tolerances.PROBABILITY_TOLERANCE; // 1e-11
 * ```
 */
export const POLICY = Object.freeze({ limits, tolerances });

/** The names of the size limits. */
export type SizeLimitName = keyof typeof limits;
/** The names of the tolerances. */
export type ToleranceName = keyof typeof tolerances;
