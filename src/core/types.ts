/**
 * Shared shapes of the numerical core. Symbols follow docs/methods.md:
 * `nu` the m = n - k eigenvalues of M·A on the complement of col(X), sorted ascending;
 * `c` the point at which a tail probability is wanted; `lambda` the weights `nu_i - c`.
 */

/** Name of a probability engine. */
/**
 * Name of a probability engine: Imhof's integral on the spectrum, Pan's finite-range form, the
 * eigen-free log-determinant route, the inversion on a line through the saddlepoint (for small
 * tails with relative accuracy, any spectrum), and Imhof's integral in the closed-form DCT
 * eigenbasis of a difference operator (`dct`, long series).
 */
export type EngineName = 'imhof' | 'pan' | 'eigenfree' | 'saddlepoint' | 'dct';

/** Engine choice offered to callers: a named engine, or `auto` to let the library choose. */
export type MethodChoice = 'auto' | EngineName;

/** Which tail of the distribution of d: `lower` is P(d <= c), `upper` is P(d >= c). */
export type Tail = 'lower' | 'upper';

/** A tail probability with the evidence for its accuracy. */
export interface TailProbability {
  /** The probability, in [0, 1]. */
  p: number;
  /** Upper bound (or, where stated, a conservative estimate) on |p - true p|. */
  errorBound: number;
  /** errorBound / p, or the engine's own relative error estimate when it has a sharper one. */
  relativeError: number;
  /** Engine that produced the number. */
  method: EngineName;
  /** Why this engine answered (set by the `auto` chooser), as a typed code; words in src/report/wording.ts. */
  reason?: EngineChoice;
}

/**
 * Why the `auto` chooser let an engine answer, as plain data (the words are in
 * src/report/wording.ts). New codes may be added; existing ones keep their meaning.
 */
export type EngineChoice =
  /** n is large and the operator a union of chains: the DCT eigenbasis route (closed-form eigenbasis). */
  | { code: 'LARGE_N_DCT'; n: number; smallTail?: { relativeError: number } }
  /** n is large: the eigen-free engine, no spectrum needed. */
  | { code: 'LARGE_N_EIGENFREE'; n: number; smallTail?: { relativeError: number } }
  /** Imhof's integral on the spectrum, accurate enough here. */
  | { code: 'IMHOF_SPECTRUM' }
  /** A small tail probability: Pan's finite-range form, with relative accuracy. */
  | { code: 'SMALL_TAIL_PAN' }
  /**
   * A small tail probability: the inversion on a line through the saddlepoint, for relative
   * accuracy; `pan` says why Pan's form did not answer instead.
   */
  | { code: 'SMALL_TAIL_SADDLEPOINT'; pan: 'less-accurate' | 'could-not-vouch' | 'not-applicable' }
  /** A small tail probability, and Imhof's integral on the spectrum was still the most accurate. */
  | { code: 'SMALL_TAIL_IMHOF'; relativeError: number };

/**
 * A symmetric band matrix stored by diagonals: `bands[0]` is the main diagonal (length n),
 * `bands[j][t]` is the entry (t, t + j) (length n - j). Used for the difference operator A.
 */
export interface BandMatrix {
  n: number;
  /** bands.length - 1 */
  bandwidth: number;
  bands: Float64Array[];
}

// ColumnBasis is defined beside the QR factorisation that produces it (src/linalg/qr.ts).
export type { ColumnBasis } from '../linalg/qr.js';

/**
 * What Imhof's integral needs from a quadratic form Q = sum lambda_j z_j^2 (docs/methods.md sections 3
 * and 5): the phase theta(u) = (1/2) sum arctan(lambda_j u) and the log-modulus
 * log rho(u) = (1/4) sum log(1 + lambda_j^2 u^2), plus a few constants for the truncation bound.
 * A spectral engine computes these from the weights; the eigen-free engine from a log-determinant.
 */
export interface CharacteristicForm {
  /** Number of nonzero weights (sets the decay u^(-1-m/2) of the integrand). */
  m: number;
  /** sum lambda_j: the integrand tends to sumLambda / 2 as u -> 0. */
  sumLambda: number;
  /** sum log|lambda_j| over the nonzero weights (enters the truncation bound). */
  sumLogAbsLambda: number;
  /** max |lambda_j| (sets the natural scale of u). */
  maxAbsLambda: number;
  /**
   * When set, the truncation bound built from (m, sumLogAbsLambda) is only vouched for at cut
   * points U up to this value (a floored sumLogAbsLambda, as in the eigen-free engine); beyond it
   * `integrateImhof` places the cut by the convexity bound of src/numeric/convexity-cut.ts instead.
   */
  truncationValidBelow?: number;
  /**
   * Write theta(u) into out[0] and log rho(u) into out[1]. theta must be the continuous branch
   * (the sum of principal arctangents), never reduced modulo 2 pi.
   */
  evaluate(u: number, out: Float64Array): void;
}
