/**
 * From the caller's regressors to the exact null distribution of d: validate and factor the
 * design, build the difference operator (lag, gaps), and tie the spectrum to the engines.
 */
import { differenceMatrix, differencePairs, type DifferencePairs } from '../core/difference.js';
import { columnBasis } from '../linalg/qr.js';
import { fastSpectrum } from '../core/fast-spectrum.js';
import { checkSize } from '../limits.js';
import type { BandMatrix, MethodChoice } from '../core/types.js';
import { DwNullDistribution } from '../distribution/null-distribution.js';
import { designSource, type NullSource } from '../core/source.js';
import { AUTO_SPECTRUM_MAX_N } from '../engines/choose.js';
import { DwError } from '../errors.js';
import { buildDesign, factorDesign, CONDITION_WARNING, type Design, type FactoredDesign, type RegressorInput } from '../model/design.js';

/** What defines the statistic and its design. */
export interface ProblemOptions {
  /** Include an intercept (default true; a constant column of the caller's counts as one). */
  intercept?: boolean;
  /** Names of the regressors when `x` is given as rows. */
  names?: string[];
  /** Lag of the differences (default 1; 4 gives Wallis's statistic for quarterly data). */
  lag?: number;
  /** Observation times (strictly increasing integers); differences only between times `lag` apart. */
  times?: ArrayLike<number>;
  /** Engine (default `auto`). */
  method?: MethodChoice;
  /** Target absolute error of each probability (default 1e-11). */
  tolerance?: number;
}

/**
 * The note preparing a design can raise (one member of `DwWarning`, src/inference/warnings.ts,
 * declared here so that this layer does not import the one above it).
 */
export type DesignNote = { code: 'DESIGN_ILL_CONDITIONED'; condition: number };

/** A design ready for exact inference on d. */
export interface DwProblem {
  factored: FactoredDesign;
  pairs: DifferencePairs;
  operator: BandMatrix;
  distribution: DwNullDistribution;
  /** Notes on the design worth showing the user. */
  warnings: DesignNote[];
}

/**
 * Refuse a design for which d is (numerically) constant: every difference is absorbed by the
 * regressors (e.g. indicator columns for the only observations that are differenced), so d carries
 * no information and its "distribution" is a point.
 */
function checkNotDegenerate(source: NullSource, n: number): void {
  let constant: number | null = null;
  if (n <= AUTO_SPECTRUM_MAX_N) {
    const nu = source.spectrum();
    if (nu[nu.length - 1] - nu[0] <= 1e-9) constant = nu[0];
  } else {
    const v = source.variance();
    const mean = source.mean();
    // the trace formula cancels to about eps * (mean^2 + variance): below that it is zero
    if (v <= 1e3 * Number.EPSILON * (mean * mean + 1)) constant = mean;
  }
  if (constant !== null) {
    throw new DwError('D_DEGENERATE',
      `For this design d is the same for every sample (d = ${Math.abs(constant) < 1e-12 ? 0 : constant.toPrecision(6)}): the regressors absorb every difference that d is made of.`,
      'Use fewer indicator (dummy) columns for single observations, a smaller lag, or more observations.');
  }
}

/**
 * Build the exact null distribution of d for regressors `x` with `n` observations.
 *
 * @example
 * ```ts
 * const { distribution } = prepareProblem({ trend: [1, 2, 3, 4, 5, 6, 7, 8] }, 8);
 * distribution.quantile(0.05); // exact 5% critical value for this design
 * ```
 */
export function prepareProblem(x: RegressorInput, n: number, options: ProblemOptions = {}): DwProblem {
  return prepareDesign(buildDesign(x, n, { intercept: options.intercept, names: options.names }), options);
}

/** The differences d is made of and the operator A they define (docs/methods.md section 1). */
export interface DifferenceOperator {
  pairs: DifferencePairs;
  operator: BandMatrix;
}

/**
 * The differences for n observations at lag `lag` (default 1) and the given times (consecutive
 * when omitted), with their operator A: what {@link prepareDesign} uses, for callers that prepare
 * many designs on the same times.
 *
 * @example
 * ```ts
 * differenceOperator(52).operator.n; // 52
 * ```
 */
export function differenceOperator(n: number, lag = 1, times?: ArrayLike<number>): DifferenceOperator {
  const pairs = differencePairs(n, lag, times);
  return { pairs, operator: differenceMatrix(pairs) };
}

/**
 * {@link prepareProblem} for a design already built by `buildDesign` (with the same intercept rule
 * and names as `options` give), and optionally its differences already formed by
 * {@link differenceOperator} (n, `options.lag` and `options.times`): the same problem, bit for bit.
 *
 * @example
 * ```ts
 * const design = buildDesign({ trend: [1, 2, 3, 4, 5, 6, 7, 8] }, 8);
 * prepareDesign(design).distribution.quantile(0.05); // as prepareProblem({ trend: [...] }, 8)
 * ```
 */
export function prepareDesign(design: Design, options: ProblemOptions = {}, difference?: DifferenceOperator): DwProblem {
  const { n } = design;
  checkSize(n, design.k, options.method ?? 'auto', { spectrum: 'structured', bandwidth: options.lag ?? 1 });
  const factored = factorDesign(design);
  const { pairs, operator } = difference ?? differenceOperator(n, options.lag ?? 1, options.times);
  const basis = columnBasis(factored.qr);
  // each computed nu_i may differ from the true one through rounding in the design's basis
  // (about condition x eps in angle, times ||A|| <= its Gershgorin bound) and in the spectrum
  const spectrumError = 32 * Number.EPSILON * 4 * Math.max(1, factored.condition);
  const source = designSource(n - design.k, operator, basis, () => fastSpectrum(operator, basis), spectrumError);
  const distribution = new DwNullDistribution(source, { method: options.method, tolerance: options.tolerance });
  checkNotDegenerate(source, n);
  const warnings: DesignNote[] = [];
  if (factored.condition > CONDITION_WARNING) warnings.push({ code: 'DESIGN_ILL_CONDITIONED', condition: factored.condition });
  return { factored, pairs, operator, distribution, warnings };
}
