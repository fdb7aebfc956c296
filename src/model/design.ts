/**
 * The design matrix X: the caller's regressors, the intercept rule, and the checks that make the
 * exact distribution well defined (finite values, n >= k + 2, full column rank).
 *
 * Intercept rule: added as a column of ones by default; when the caller's regressors already hold
 * a constant column, that column is the intercept (it is not duplicated); `intercept: false`
 * leaves it out (a constant column the caller supplies still counts as an intercept).
 */
import { DwError } from '../errors.js';
import { applyQt, householderQR, type HouseholderQR } from '../linalg/qr.js';
import { POLICY } from '../policy.js';

/** Name given to the intercept column the library adds. */
export const INTERCEPT_NAME = '(intercept)';

/** A validated design. */
export interface Design {
  n: number;
  k: number;
  /** Column names, in order; the added intercept, if any, comes first. */
  names: string[];
  /** X, column-major n x k. */
  x: Float64Array;
  /** Index of the intercept (constant) column, or -1 when the model has none. */
  interceptIndex: number;
  /** True when the library added the intercept column. */
  interceptAdded: boolean;
}

/** How to build a design. */
export interface DesignOptions {
  /** Include an intercept (default true). */
  intercept?: boolean;
  /** Names of the regressors (default x1, x2, ...). */
  names?: string[];
}

/** Regressors given as rows (n arrays of p numbers) or as named columns. */
export type RegressorInput = ReadonlyArray<ArrayLike<number>> | Readonly<Record<string, ArrayLike<number>>>;

function isRows(x: RegressorInput): x is ReadonlyArray<ArrayLike<number>> {
  return Array.isArray(x);
}

/**
 * Build and validate X. `x` may be rows (`[[x11, x12], [x21, x22], ...]`) or named columns
 * (`{ price: [...], income: [...] }`). An empty regressor list with the intercept gives the
 * intercept-only model.
 *
 * @example
 * ```ts
 * const design = buildDesign({ trend: [1, 2, 3, 4, 5, 6] });
 * design.names; // ['(intercept)', 'trend']
 * ```
 */
export function buildDesign(x: RegressorInput, n: number, options: DesignOptions = {}): Design {
  const columns: Float64Array[] = [];
  let names: string[];
  if (isRows(x)) {
    if (x.length !== n && !(x.length === 0)) {
      throw new DwError('LENGTH_MISMATCH', `The regressors have ${x.length} rows but there are ${n} observations.`,
        'Give one row of regressors per observation.');
    }
    const p = x.length === 0 ? 0 : x[0].length;
    for (let i = 0; i < x.length; i++) {
      if (x[i].length !== p) {
        throw new DwError('LENGTH_MISMATCH', `Row ${i + 1} of the regressors has ${x[i].length} values, row 1 has ${p}.`,
          'Every row must have the same number of regressors.', { row: i + 1 });
      }
    }
    names = options.names ? [...options.names] : Array.from({ length: p }, (_, j) => `x${j + 1}`);
    if (names.length !== p) {
      throw new DwError('LENGTH_MISMATCH', `${names.length} names were given for ${p} regressors.`, 'Give one name per column.');
    }
    for (let j = 0; j < p; j++) {
      const col = new Float64Array(n);
      for (let i = 0; i < n; i++) col[i] = checkedValue(x[i][j], names[j], i);
      columns.push(col);
    }
  } else {
    names = Object.keys(x);
    for (const name of names) {
      const v = x[name];
      if (v !== null && v !== undefined && v.length !== n) {
        throw new DwError('LENGTH_MISMATCH', `Column '${name}' has ${v.length} values but there are ${n} observations.`,
          'Give every column one value per observation.', { column: name });
      }
      if (v === null || v === undefined || typeof v.length !== 'number') {
        throw new DwError('LENGTH_MISMATCH', `Column '${name}' is not a list of numbers.`, 'Give every column as an array of numbers.', { column: name });
      }
      const col = new Float64Array(n);
      for (let i = 0; i < n; i++) col[i] = checkedValue(v[i], name, i);
      columns.push(col);
    }
  }
  const seen = new Set<string>();
  for (const name of names) {
    if (seen.has(name)) {
      throw new DwError('COLUMN_REPEATED', `The regressor '${name}' is named twice.`, 'Use each column once.', { column: name });
    }
    seen.add(name);
  }
  columns.forEach((col, j) => {
    for (let i = 0; i < n; i++) {
      if (!Number.isFinite(col[i])) {
        throw new DwError('CELL_NOT_FINITE', `Regressor '${names[j]}' has the value ${col[i]} at observation ${i + 1}.`,
          'Every value must be a finite number; remove or fill the observation.', { row: i + 1, column: names[j], value: String(col[i]) });
      }
    }
  });

  const constant = columns.map(isConstant);
  const constantIdx = constant.flatMap((c, j) => (c ? [j] : []));
  for (const j of constantIdx) {
    if (columns[j][0] === 0) {
      throw new DwError('RANK_DEFICIENT', `Regressor '${names[j]}' is zero in every observation.`,
        'Remove the column.', { column: names[j] });
    }
  }
  if (constantIdx.length > 1) {
    throw new DwError('RANK_DEFICIENT',
      `Regressors ${constantIdx.map((j) => `'${names[j]}'`).join(', ')} are all constant, so they duplicate one another.`,
      'Keep at most one constant column (or none, and let the intercept be added).', { column: names[constantIdx[1]] });
  }
  const wantIntercept = options.intercept ?? true;
  let interceptIndex = constantIdx.length === 1 ? constantIdx[0] : -1;
  let interceptAdded = false;
  if (wantIntercept && interceptIndex < 0) {
    if (names.includes(INTERCEPT_NAME)) {
      throw new DwError('COLUMN_REPEATED', `The column name '${INTERCEPT_NAME}' is the name of the intercept exact-dw adds.`,
        'Rename that column, or, if it is your own constant, keep it: a constant column is used as the intercept.', { column: INTERCEPT_NAME });
    }
    columns.unshift(new Float64Array(n).fill(1));
    names = [INTERCEPT_NAME, ...names];
    interceptIndex = 0;
    interceptAdded = true;
  }
  const k = columns.length;
  if (k === 0) {
    throw new DwError('NO_REGRESSORS', 'The model has no regressors and no intercept.',
      'Give at least one regressor or keep the intercept.');
  }
  if (n < k + 2) {
    throw new DwError('TOO_FEW_ROWS',
      `There ${n === 1 ? 'is 1 observation' : `are ${n} observations`} for ${k} column${k === 1 ? '' : 's'} (including any intercept); at least k + 2 = ${k + 2} are needed, so that the residuals have two or more degrees of freedom.`,
      'Use more observations or fewer regressors.');
  }
  const xs = new Float64Array(n * k);
  columns.forEach((col, j) => xs.set(col, j * n));
  return { n, k, names, x: xs, interceptIndex, interceptAdded };
}

/** One regressor value as a finite number; null, strings and other types are refused, not coerced. */
function checkedValue(v: unknown, name: string, i: number): number {
  if (typeof v !== 'number' || !Number.isFinite(v)) {
    throw new DwError(typeof v === 'number' ? 'CELL_NOT_FINITE' : 'CELL_NOT_NUMERIC',
      `Regressor '${name}' has the value ${typeof v === 'string' ? `'${v}'` : String(v)} at observation ${i + 1}.`,
      typeof v === 'number' ? 'Every value must be a finite number; remove or fill the observation.' : 'Every value must be a number (not text, null or undefined).',
      { row: i + 1, column: name, value: String(v) });
  }
  return v;
}

function isConstant(col: Float64Array): boolean {
  for (let i = 1; i < col.length; i++) if (col[i] !== col[0]) return false;
  return true;
}

/** A design factorised for fitting and for the spectrum. */
export interface FactoredDesign {
  design: Design;
  /**
   * QR of the preconditioned design P = (X - 1 mu') S^-1: columns centred (when the model has an
   * intercept; the column space is unchanged) and scaled to unit length. col(P) = col(X).
   */
  qr: HouseholderQR;
  /** Column means subtracted (0 for the intercept and for every column without an intercept). */
  shift: Float64Array;
  /** Column scales divided by. */
  scale: Float64Array;
  /** Estimate of the condition number of P (Frobenius norms of R and R^-1; at most k times the 2-norm one). */
  condition: number;
  /**
   * True when the constant vector lies in col(X): a literal constant column, or columns that add up
   * to one (a full set of seasonal dummies, say). Then the model has an intercept in effect: R^2
   * is centred and the bounds test applies.
   */
  spansConstant: boolean;
}

/**
 * Relative size of |R_jj| (of the centred, unit-length columns) below which a column counts as a
 * linear combination of the columns before it.
 */
export const RANK_TOLERANCE = POLICY.tolerances.RANK_TOLERANCE;
/**
 * Condition number (of the centred and scaled design, {@link FactoredDesign.condition}) above which
 * the design is refused with ILL_CONDITIONED. Measured (test/robustness.test.ts, table in
 * docs/errors-and-limits.md): the p-value of a design moves by at most about
 * {@link CONDITION_ERROR_FACTOR} x condition x 2^-52 through rounding in the design, so at this
 * limit by less than 1e-8 (the statistic d likewise).
 */
export const CONDITION_LIMIT = POLICY.tolerances.CONDITION_LIMIT;
/** Condition number above which a warning is given (rounding in the design may then exceed 1e-10 in p). */
export const CONDITION_WARNING = POLICY.tolerances.CONDITION_WARNING;
/**
 * Largest measured ratio |error in d or p| / (condition x 2^-52) over the designs of
 * test/robustness.test.ts (polynomial trends in raw years against their centred form), rounded up.
 */
export const CONDITION_ERROR_FACTOR = POLICY.tolerances.CONDITION_ERROR_FACTOR;

/**
 * Allowance for rounding in the design: a bound (by measurement, see
 * {@link CONDITION_ERROR_FACTOR}) on how far a p-value at a given d (amplification 1) or the
 * statistic d of a fit (amplification ||y - ybar|| / ||e||, `LeastSquaresFit.amplification`) can
 * move because X and y are held in double precision. To be added to an engine's error bound; for
 * the p-value of a fitted d add the density of d times the allowance of d as well.
 *
 * @example
 * ```ts
 * designErrorAllowance(factorDesign(design).condition); // e.g. 2e-15 for a well-conditioned design
 * ```
 */
export function designErrorAllowance(condition: number, amplification = 1): number {
  return CONDITION_ERROR_FACTOR * Math.max(1, condition) * Number.EPSILON * Math.max(1, amplification);
}

/**
 * Factorise the design with rank detection. Each column is first scaled by a power of two (exact)
 * so that values near 1e300 or 1e-300 neither overflow nor underflow, then centred (when the model
 * has an intercept) and scaled to unit length; the column space, and so d and its distribution,
 * are unchanged. Throws RANK_DEFICIENT naming the columns that are (numerically) linear
 * combinations of earlier ones, and ILL_CONDITIONED beyond {@link CONDITION_LIMIT}.
 *
 * @example
 * ```ts
 * const fd = factorDesign(buildDesign({ year: [1990, 1991, 1992, 1993, 1994] }, 5));
 * fd.condition; // small: the year is centred internally
 * ```
 */
export function factorDesign(design: Design): FactoredDesign {
  const { n, k, x, interceptIndex } = design;
  const shift = new Float64Array(k);
  const scale = new Float64Array(k);
  const p = new Float64Array(n * k);
  // a column that varies only in its last digits (centring leaves less than RANK_TOLERANCE of it)
  // is, as far as double precision can tell, a copy of the intercept
  const flat: number[] = [];
  for (let j = 0; j < k; j++) {
    const off = j * n;
    let top = 0;
    for (let i = 0; i < n; i++) top = Math.max(top, Math.abs(x[off + i]));
    // a power of two: dividing by it is exact
    const pow = top > 0 ? 2 ** Math.floor(Math.log2(top)) : 1;
    for (let i = 0; i < n; i++) p[off + i] = x[off + i] / pow;
    let mu = 0;
    if (interceptIndex >= 0 && j !== interceptIndex) {
      let before = 0;
      for (let i = 0; i < n; i++) { mu += p[off + i]; before += p[off + i] * p[off + i]; }
      mu /= n;
      let after = 0;
      for (let i = 0; i < n; i++) { p[off + i] -= mu; after += p[off + i] * p[off + i]; }
      const ratio = Math.sqrt(after / before);
      if (!(ratio > RANK_TOLERANCE)) flat.push(j);
    }
    let big = 0;
    for (let i = 0; i < n; i++) big = Math.max(big, Math.abs(p[off + i]));
    let ss = 0;
    for (let i = 0; i < n; i++) { const v = big > 0 ? p[off + i] / big : 0; ss += v * v; }
    const s = big * Math.sqrt(ss);
    const unit = s > 0 ? s : 1;
    for (let i = 0; i < n; i++) p[off + i] /= unit;
    shift[j] = mu * pow;
    scale[j] = unit * pow;
  }
  if (flat.length > 0) {
    const list = flat.map((j) => `'${design.names[j]}'`).join(', ');
    throw new DwError('RANK_DEFICIENT',
      `The design is rank deficient: ${list} ${flat.length === 1 ? 'is' : 'are'} constant up to rounding (${flat.length === 1 ? 'it varies' : 'they vary'} by less than a relative ${RANK_TOLERANCE.toExponential(0)}), so ${flat.length === 1 ? 'it duplicates' : 'they duplicate'} the intercept.`,
      `Remove ${flat.length === 1 ? 'that column' : 'those columns'}, or subtract a constant from ${flat.length === 1 ? 'it' : 'them'} before export if the variation is real.`,
      { column: design.names[flat[0]] });
  }
  // Householder QR treats the columns in order: the j-th diagonal entry of R depends on columns
  // 0..j only, so while every earlier column is independent it is the trial's entry below
  const qr = householderQR(p, n, k);
  if (!qr.rdiag.every((r) => Math.abs(r) > RANK_TOLERANCE)) rankDeficient(design, p);
  const condition = conditionEstimate(qr);  if (!(condition <= CONDITION_LIMIT)) {
    throw new DwError('ILL_CONDITIONED',
      `The design is too ill-conditioned for an exact answer: its condition number (after centring and scaling the columns) is about ${condition.toExponential(1)}, above the limit ${CONDITION_LIMIT.toExponential(0)}, so rounding could move the p-value by more than 1e-8.`,
      'Centre and scale the regressors (for example (year - 2005) / 10), or use orthogonal polynomials for trends; see docs/errors-and-limits.md.',
      { value: String(condition) });
  }
  // is the constant vector in col(X)? its component outside col(X), relative to its length
  const ones = new Float64Array(n).fill(1);
  applyQt(qr, ones);
  let outside = 0;
  for (let i = k; i < n; i++) outside += ones[i] * ones[i];
  const spansConstant = interceptIndex >= 0 || Math.sqrt(outside / n) <= 1e-9;
  return { design, qr, shift, scale, condition, spansConstant };
}

/**
 * The refusal of a rank-deficient design (preconditioned columns p): every column that is
 * (numerically) in the span of the earlier independent ones, by one trial QR per column.
 */
function rankDeficient(design: Design, p: Float64Array): never {
  const { n, k, x } = design;
  const bad: number[] = [];
  const keep: number[] = [];
  for (let j = 0; j < k; j++) {
    const trial = [...keep, j];
    const sub = new Float64Array(n * trial.length);
    trial.forEach((c, t) => sub.set(p.subarray(c * n, c * n + n), t * n));
    const f = householderQR(sub, n, trial.length);
    const r = Math.abs(f.rdiag[trial.length - 1]);
    if (!(r > RANK_TOLERANCE)) bad.push(j); else keep.push(j);
  }
  // the first column whose entry fails is among them (its trial is the QR above): bad is not empty
  const list = bad.map((j) => `'${design.names[j]}'`).join(', ');
  const constantDup = bad.some((j) => isConstant(x.subarray(j * n, j * n + n)));
  throw new DwError('RANK_DEFICIENT',
    `The design is rank deficient: ${list} ${bad.length === 1 ? 'is a linear combination' : 'are linear combinations'} of the other columns (to within a relative ${RANK_TOLERANCE.toExponential(0)})${constantDup ? '; a constant column duplicates the intercept' : ''}.`,
    `Remove ${bad.length === 1 ? 'that column' : 'those columns'} (or the columns ${bad.length === 1 ? 'it duplicates' : 'they duplicate'}); if ${bad.length === 1 ? 'it is' : 'they are'} a power or product of other columns (such as year^2), centre the variable first (year - 2005) and rebuild ${bad.length === 1 ? 'it' : 'them'}.`,
    { column: design.names[bad[0]] });
}

/** ||R||_F ||R^-1||_F: within a factor k of the 2-norm condition number. */
function conditionEstimate(f: HouseholderQR): number {
  const { n, k, qr } = f;
  const r = (i: number, j: number) => qr[j * n + i];
  let normR = 0;
  for (let j = 0; j < k; j++) for (let i = 0; i <= j; i++) normR += r(i, j) ** 2;
  // R^-1 column by column (upper triangular back substitution)
  let normInv = 0;
  const col = new Float64Array(k);
  for (let c = 0; c < k; c++) {
    col.fill(0);
    for (let i = c; i >= 0; i--) {
      let s = i === c ? 1 : 0;
      for (let j = i + 1; j <= c; j++) s -= r(i, j) * col[j];
      col[i] = s / r(i, i);
    }
    for (let i = 0; i <= c; i++) normInv += col[i] ** 2;
  }
  return Math.sqrt(normR * normInv);
}

/**
 * Number of observations in regressors given as rows or columns.
 *
 * @example
 * ```ts
 * rowCount({ t: [1, 2, 3] }); // 3
 * ```
 */
export function rowCount(x: RegressorInput): number {
  if (Array.isArray(x)) return x.length;
  const cols = Object.values(x as Record<string, ArrayLike<number>>);
  if (cols.length === 0) {
    throw new DwError('OPTION_MISSING', 'With no regressor columns the number of observations must be given.', 'Pass n, or give y.');
  }
  return cols[0].length;
}
