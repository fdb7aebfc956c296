/**
 * Size limits per engine, so that a problem too large for an engine ends in a clear SIZE_LIMIT
 * error naming the alternative instead of an out-of-memory crash or an hour of computing.
 *
 * Costs (docs/methods.md sections 2-5), n observations, k columns of X, m = n - k:
 *   - dense spectrum (spectrum.ts): an n x n matrix A, its congruence Q'AQ and the m x m block,
 *     about 3 x 8 n^2 bytes, and O(n^3) time (Householder tridiagonalisation);
 *   - structured spectrum (fast-spectrum.ts, difference operators): O(n k) memory, O(k n^2) time;
 *   - Imhof's integral on a spectrum: O(m) per integrand evaluation, a few hundred evaluations per
 *     probability: never the bottleneck, so Imhof's limit is that of the spectrum it needs;
 *   - Pan's formula: needs the spectrum; in the body of the distribution its alternating sum loses
 *     accuracy as m grows (forced use is limited to m = 400), while in the tails it stays accurate
 *     at any m (src/engines/pan.ts), which is where `auto` uses it
 *     (measured in src/engines/pan.ts);
 *   - eigen-free Imhof (eigenfree.ts): O(n k) memory, O(n k (k + lag)) per evaluation;
 *   - DCT eigenbasis route (dct.ts, difference operators): one fast DCT per chain and column
 *     (O(n k log n)), then O(n k^2) per evaluation; memory about 8 n (k + 1) bytes for W and the
 *     eigenvalues plus the transform's work arrays.
 *
 * The values live in src/policy.ts (`POLICY.limits`); the names below are aliases. A limit is where
 * one answer would take more than about 20 s on this project's development machine (a shared 2-core
 * container) when it was set: the dense spectrum took 2.4 s at n = 1000 and 23 s at n = 2000; the
 * eigen-free engine, before its sweep was tightened, 66 s at n = 3 x 10^5. Current timings are
 * measured by `npm run bench` and `npm run bench:large` (docs/performance.md).
 */
import { DwError } from './errors.js';
import { POLICY } from './policy.js';

/** Largest n for the dense spectrum (O(n^3) time, about 24 n^2 bytes: 96 MB at this size). */
export const DENSE_SPECTRUM_MAX_N = POLICY.limits.DENSE_SPECTRUM_MAX_N;
/** Largest n for the structured spectrum of a difference operator (O(k n^2) time, O(n k) memory). */
export const STRUCTURED_SPECTRUM_MAX_N = POLICY.limits.STRUCTURED_SPECTRUM_MAX_N;
/** Largest m = n - k for Pan's formula (accuracy of its alternating sum, see src/engines/pan.ts). */
export const PAN_MAX_M = POLICY.limits.PAN_MAX_M;
/** Largest n for the eigen-free engine (time: about 8 s per probability at n = 10^5, k = 3). */
export const EIGENFREE_MAX_N = POLICY.limits.EIGENFREE_MAX_N;
/**
 * Largest n for the DCT eigenbasis route (measured: one p-value at n = 10^6, k = 5 in a few
 * seconds, see docs/performance.md; memory about 8 n (k + 6) bytes).
 */
export const DCT_MAX_N = POLICY.limits.DCT_MAX_N;
/**
 * Largest n for exact power against AR(1) errors: the eigen-free route of src/power/eigenfree-power.ts
 * takes every n up to the eigen-free engine's limit (its dense route stops at POWER_SIZE_LIMIT in
 * src/power/exact-power.ts). Measured: one probability under the alternative took about 6.5 s at
 * n = 10^5, k = 3, when it needs Imhof's integral, and about 1.5 s when Chernoff's bound settles it.
 */
export const POWER_MAX_N = POLICY.limits.POWER_MAX_N;
/** Largest memory any engine may plan to use for one problem (bytes): 1 GiB. */
export const MEMORY_BUDGET_BYTES = POLICY.limits.MEMORY_BUDGET_BYTES;

/** Engines the limits speak of; `auto` means "any engine that fits". */
export type SizedEngine = 'auto' | 'imhof' | 'pan' | 'eigenfree' | 'saddlepoint' | 'dct';

/** How the spectrum would be computed for the spectral engines (Imhof, Pan). */
export interface SizeOptions {
  /** `dense` (any operator; the default) or `structured` (difference operators, fast-spectrum.ts). */
  spectrum?: 'dense' | 'structured';
  /** Bandwidth of the difference operator (the lag; default 1). */
  bandwidth?: number;
}

/**
 * Memory an engine would need for a problem of n observations and k columns (bytes, estimate).
 *
 * @example
 * ```ts
 * memoryEstimate(1000, 3, 'imhof'); // about 24 MB: three n x n double arrays
 * ```
 */
export function memoryEstimate(n: number, k: number, engine: Exclude<SizedEngine, 'auto'>, options: SizeOptions = {}): number {
  const spectral = (options.spectrum ?? 'dense') === 'dense' ? 24 * n * n : 8 * n * (3 * k + 8);
  const bw = options.bandwidth ?? 1;
  switch (engine) {
    case 'imhof':
    case 'pan':
    case 'saddlepoint':
      return spectral + 8 * n * (k + 4);
    case 'eigenfree':
      // complex band factors and the n x k basis and its transforms
      return 16 * n * (2 * (bw + 1) + 2 * k) + 8 * n * (k + 4);
    case 'dct':
      // W (n x k), the eigenvalues and shifted weights, the basis itself and the FFT work arrays
      return 8 * n * (2 * k + 16);
  }
}

/**
 * Check that an engine can take a problem of n observations and k columns (intercept included).
 * With `auto`, passes when some engine can; callers then choose the eigen-free engine beyond the
 * spectral limits.
 *
 * @throws DwError N_INVALID or K_INVALID for sizes that are not whole numbers (k < n);
 *   SIZE_LIMIT naming the engine to use instead, or what to do when none fits
 * @example
 * ```ts
 * checkSize(500, 3, 'imhof');     // fine
 * checkSize(50000, 3, 'imhof');   // throws SIZE_LIMIT: choose the eigen-free engine
 * checkSize(50000, 3, 'auto');    // fine: the eigen-free engine takes it
 * ```
 */
export function checkSize(n: number, k: number, engine: SizedEngine, options: SizeOptions = {}): void {
  if (!Number.isSafeInteger(n) || n < 1) {
    throw new DwError('N_INVALID', `The number of observations must be a whole number of at least 1 (got ${n}).`, 'Give n as a positive integer.');
  }
  if (!Number.isSafeInteger(k) || k < 0 || k >= n) {
    throw new DwError('K_INVALID', `The number of columns k must be a whole number from 0 to n - 1 = ${n - 1} (got ${k}).`, 'Count every column of X, the intercept included.');
  }
  const spectrumLimit = (options.spectrum ?? 'dense') === 'dense' ? DENSE_SPECTRUM_MAX_N : STRUCTURED_SPECTRUM_MAX_N;
  const routeName = (options.spectrum ?? 'dense') === 'dense' ? 'the dense spectrum' : 'the structured spectrum';
  const tooBigForAll = () => new DwError('SIZE_LIMIT',
    `n = ${n} observations is beyond every engine: the largest is n = ${DCT_MAX_N} (DCT eigenbasis route, for difference operators; the eigen-free engine takes any band operator up to n = ${EIGENFREE_MAX_N}).`,
    'Test a shorter span of the series, or aggregate it (for example daily to weekly); the Durbin-Watson test on a series this long is in any case close to its normal approximation.');
  const memory = (e: Exclude<SizedEngine, 'auto'>) => {
    const bytes = memoryEstimate(n, k, e, options);
    if (bytes > MEMORY_BUDGET_BYTES) {
      throw new DwError('SIZE_LIMIT',
        `The ${e} engine would need about ${(bytes / 2 ** 20).toFixed(0)} MiB for n = ${n}, k = ${k} (budget ${MEMORY_BUDGET_BYTES / 2 ** 20} MiB).`,
        e === 'eigenfree' ? 'Use fewer regressors or fewer observations.' : "Choose the eigen-free engine (method 'eigenfree'), which needs O(n k) memory.",
        e === 'eigenfree' ? {} : { suggest: [{ option: 'method', value: 'eigenfree' }] });
    }
  };
  switch (engine) {
    case 'imhof':
    case 'saddlepoint':
      if (n > spectrumLimit) {
        throw new DwError('SIZE_LIMIT',
          `The Imhof engine needs the spectrum, and ${routeName} is limited to n = ${spectrumLimit} (n = ${n} here).`,
          n <= EIGENFREE_MAX_N ? "Choose the eigen-free engine (method 'eigenfree', or 'auto'), which needs no spectrum." : tooBigForAll().hint,
          n <= EIGENFREE_MAX_N ? { suggest: [{ option: 'method', value: 'eigenfree' }] } : {});
      }
      memory(engine);
      return;
    case 'pan':
      if (n - k > PAN_MAX_M) {
        throw new DwError('SIZE_LIMIT',
          `Pan's formula is limited to m = n - k = ${PAN_MAX_M} (m = ${n - k} here): beyond it its alternating sum loses accuracy.`,
          n <= spectrumLimit ? "Choose the Imhof engine (method 'imhof', or 'auto')." : "Choose the eigen-free engine (method 'eigenfree', or 'auto').",
          { suggest: [{ option: 'method', value: n <= spectrumLimit ? 'imhof' : 'eigenfree' }] });
      }
      memory('pan');
      return;
    case 'eigenfree':
      if (n > EIGENFREE_MAX_N) {
        if (n <= DCT_MAX_N) {
          throw new DwError('SIZE_LIMIT', `The eigen-free engine is limited to n = ${EIGENFREE_MAX_N} (n = ${n} here).`,
            "Choose the DCT eigenbasis route (method 'dct', or 'auto'), which takes difference operators up to n = 1000000.",
            { suggest: [{ option: 'method', value: 'dct' }] });
        }
        throw tooBigForAll();
      }
      memory('eigenfree');
      return;
    case 'dct':
      if (n > DCT_MAX_N) throw tooBigForAll();
      memory('dct');
      return;
    case 'auto':
      if (n <= spectrumLimit && memoryEstimate(n, k, 'imhof', options) <= MEMORY_BUDGET_BYTES) return;
      if (n > DCT_MAX_N) throw tooBigForAll();
      if (n > EIGENFREE_MAX_N) { memory('dct'); return; }
      memory('eigenfree');
      return;
    default:
      throw new DwError('OPTION_VALUE', `Unknown engine '${String(engine)}'.`, 'Use auto, imhof, pan, eigenfree, saddlepoint or dct.');
  }
}

/**
 * Check that exact power can be computed for n observations, k columns and a statistic of the given
 * lag: n <= {@link POWER_MAX_N}, and the eigen-free route's memory (the band factors of B and the
 * three n x k blocks it carries, complex and real: about 8 n (16 k + 4 lag + 24) bytes) within
 * {@link MEMORY_BUDGET_BYTES}.
 *
 * @throws DwError SIZE_LIMIT
 * @example
 * ```ts
 * checkPowerSize(100000, 3, 1);   // fine
 * checkPowerSize(100001, 3, 1);   // throws SIZE_LIMIT
 * ```
 */
export function checkPowerSize(n: number, k: number, lag = 1): void {
  if (n > POWER_MAX_N) {
    throw new DwError('SIZE_LIMIT', `Exact power is limited to n = ${POWER_MAX_N} observations (n = ${n} here).`,
      'Use a shorter span of the series; at this length the power against any rho of practical size is 1 to many digits.');
  }
  const bytes = 8 * n * (16 * k + 4 * lag + 24);
  if (bytes > MEMORY_BUDGET_BYTES) {
    throw new DwError('SIZE_LIMIT',
      `Exact power would need about ${(bytes / 2 ** 20).toFixed(0)} MiB for n = ${n}, k = ${k} (budget ${MEMORY_BUDGET_BYTES / 2 ** 20} MiB).`,
      'Use fewer regressors or fewer observations.');
  }
}
