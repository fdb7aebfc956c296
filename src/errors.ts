/**
 * Errors a caller can act on.
 *
 * Every failure that comes from the caller's input is raised as a {@link DwError} with a stable
 * machine-readable `code`, a message saying what was wrong and where, and a `hint` saying what to
 * do about it. The CLI prints `message` and `hint` on one line and exits with status 2; library
 * callers switch on `code`.
 */

/**
 * Stable error codes. New codes may be added; existing ones never change meaning.
 *
 * Grouped by where the input enters: files and CSV text, columns and the design, numbers and
 * options, and the numerical limits of an engine.
 */
export type DwErrorCode =
  // files and CSV text
  | 'FILE_NOT_FOUND'
  | 'FILE_UNREADABLE'
  | 'FILE_EXISTS'
  | 'FILE_UNWRITABLE'
  | 'CSV_EMPTY'
  | 'CSV_NO_DATA_ROWS'
  | 'CSV_RAGGED'
  | 'CSV_HEADER_EMPTY'
  | 'CSV_HEADER_DUPLICATE'
  | 'CSV_MALFORMED'
  | 'CSV_AMBIGUOUS_DECIMAL'
  | 'CELL_EMPTY'
  | 'CELL_NOT_NUMERIC'
  | 'CELL_NOT_FINITE'
  // columns and the design
  | 'COLUMN_UNKNOWN'
  | 'COLUMN_REPEATED'
  | 'TOO_FEW_ROWS'
  | 'RANK_DEFICIENT'
  | 'ILL_CONDITIONED'
  | 'RESIDUALS_ZERO'
  | 'RESIDUALS_NOT_FROM_DESIGN'
  | 'D_DEGENERATE'
  | 'LENGTH_MISMATCH'
  | 'NO_REGRESSORS'
  | 'TIME_INVALID'
  | 'TIME_LABEL_INVALID'
  | 'TIME_LABEL_AMBIGUOUS'
  | 'TIME_FORMATS_MIXED'
  | 'TIME_IRREGULAR'
  | 'TIME_FREQUENCY_CONFLICT'
  // numbers and options
  | 'D_OUT_OF_RANGE'
  | 'ALPHA_OUT_OF_RANGE'
  | 'PROBABILITY_OUT_OF_RANGE'
  | 'RHO_OUT_OF_RANGE'
  | 'LAG_INVALID'
  | 'K_INVALID'
  | 'N_INVALID'
  | 'RANGE_SYNTAX'
  | 'OPTION_UNKNOWN'
  | 'OPTION_MISSING'
  | 'OPTION_VALUE'
  | 'OPTION_CONFLICT'
  | 'COMMAND_UNKNOWN'
  | 'ARGUMENT_EXTRA'
  // numerical limits
  | 'SIZE_LIMIT'
  | 'ENGINE_NOT_APPLICABLE'
  | 'NOT_CONVERGED'
  | 'QUANTILE_UNREACHABLE';

/** Details that locate the problem in the caller's input (all optional). */
export interface DwErrorDetail {
  /** File the problem was found in. */
  file?: string;
  /** 1-based data row (the header is row 0) or observation number. */
  row?: number;
  /** Column name. */
  column?: string;
  /** The offending value as text. */
  value?: string;
  /**
   * Settings that would fix or get around the problem, named by the library's own option names
   * (the hint says the same in words). The command line prints each as its flag, the page as its
   * control; see {@link DwSuggestion}.
   */
  suggest?: DwSuggestion[];
}

/** The library options a hint may suggest, by their names in the library's option objects. */
export type DwSuggestedOption = 'method' | 'decimal' | 'time' | 'intercept' | 'n';

/**
 * One setting a hint suggests, as plain data: the library option and, where the hint names one,
 * its value (`'eigenfree'` for `method`, `'comma'` for `decimal`, `false` for `intercept`, a range
 * such as `'10-200:10'` for the `n` of a bounds table; none for `time`, meaning "name the time
 * column").
 *
 * @example
 * ```ts
 * const s: DwSuggestion = { option: 'method', value: 'eigenfree' };
 * ```
 */
export interface DwSuggestion {
  /** The option of the library's option objects. */
  option: DwSuggestedOption;
  /** The value to give it, when the hint names one. */
  value?: string | boolean;
}

/**
 * The one error class the library throws for bad input or an unmet limit.
 *
 * @example
 * ```ts
 * try { exactDwTest({ y, x }); }
 * catch (err) { if (err instanceof DwError && err.code === 'RANK_DEFICIENT') { ... } }
 * ```
 */
export class DwError extends Error {
  /** Stable code, see {@link DwErrorCode}. */
  readonly code: DwErrorCode;
  /** What the caller can do about it. */
  readonly hint: string;
  /** Where the problem is. */
  readonly detail: DwErrorDetail;

  constructor(code: DwErrorCode, message: string, hint = '', detail: DwErrorDetail = {}) {
    super(message);
    this.name = 'DwError';
    this.code = code;
    this.hint = hint;
    this.detail = detail;
  }

  /** The settings the hint suggests (empty when none). */
  get suggestions(): DwSuggestion[] {
    return this.detail.suggest ?? [];
  }

  /** One line for a terminal: message, then the hint. */
  toLine(): string {
    return this.hint ? `${this.message} ${this.hint}` : this.message;
  }
}

/**
 * True when `err` is a {@link DwError} (also across bundle boundaries, by name and code).
 *
 * @example
 * ```ts
 * isDwError(new DwError('OPTION_VALUE', '--lag must be a whole number.', 'Write it like 4.')); // true
 * isDwError(new Error('disk full')); // false
 * ```
 */
export function isDwError(err: unknown): err is DwError {
  return (
    err instanceof DwError ||
    (typeof err === 'object' && err !== null && (err as { name?: unknown }).name === 'DwError' &&
      typeof (err as { code?: unknown }).code === 'string')
  );
}
