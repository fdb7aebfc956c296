/**
 * Pan's finite-range formula (Pan Jie-Jian 1968, Selected Transl. Math. Statist. Probab. 7,
 * 281-292; as an algorithm Farebrother 1980, Appl. Statist. 29, 224-227, AS 153), docs/methods.md
 * section 4. For d = sum nu_i z_i^2 / sum z_i^2 with distinct nu_1 < ... < nu_m:
 *
 *   P(d <= c) = (1/pi) sum_{odd r, nu_r < c} (-1)^((r-1)/2) I_r,
 *   I_r = Integral_{nu_r}^{min(nu_{r+1}, c)} (c - w)^((m-2)/2) prod_i |w - nu_i|^(-1/2) dw,
 *
 * with nu_{m+1} = +inf. The mirror form (nu -> -nu, c -> -c) gives P(d >= c) directly.
 *
 * Quadrature. (c - w)^((m-2)/2) prod |w - nu_i|^(-1/2) is written as the square root of a product
 * of ratios (c - w) / |w - nu_i|, so every factor has moderate size:
 *
 * - full interval [a, b] = [nu_r, nu_{r+1}], c > b: w = mid - half cos(theta) removes both
 *   inverse-square-root ends, I_r = Integral_0^pi sqrt(prod_{i != r, r+1} (c - w) / |w - nu_i|)
 *   dtheta, an even, 2 pi-periodic, analytic integrand: Gauss-Chebyshev nodes in w (the midpoint
 *   rule in theta) converge geometrically;
 * - interval cut at c, [a, c]: w = a + (c - a) sin^2(phi) removes the singular end at a and turns
 *   (c - w)^((m-2)/2) into a power of cos(phi): I_r = Integral_0^(pi/2) 2 sqrt(prod_{i != r}
 *   (c - w) / |w - nu_i|) dphi, analytic but not periodic: Gauss-Legendre nodes;
 * - an eigenvalue (or, for odd m, the point c) just beyond an end of an interval puts a
 *   singularity close to that end of the theta (phi) range; the range is then cut into panels
 *   graded geometrically towards that end, each with Gauss-Legendre nodes.
 *
 * Node counts double until two successive estimates agree to working precision. Products carry
 * their binary exponent separately (the integer part of the base-2 logarithm; rescaling by exact
 * powers of two), so nothing over- or underflows for m in the hundreds or thousands.
 *
 * The alternating sum cancels: in the middle of the support its terms grow roughly like
 * exp(0.27 m) for spectra of the Durbin-Watson kind (1e2 at m = 28, 4e3 at m = 40, 1e7 at m = 60),
 * while in the tails the form computed (the lower one near nu_1, the mirror near nu_m) has terms no
 * larger than a modest multiple of the probability. Hence Pan's engine is for small m anywhere and
 * for any m in the tails; {@link panApplicable} says which.
 */
import { DwError } from '../errors.js';
import type { Tail, TailProbability } from '../core/types.js';
import { exactTail } from '../core/exact-tail.js';
import { POLICY } from '../policy.js';

/** Options for {@link panTail}. */
export interface PanOptions {
  /**
   * Target absolute error (default 1e-12): the largest `errorBound` accepted. Every integral is
   * converged to working precision whatever this is; when the bound (quadrature plus rounding in
   * the alternating sum) still exceeds `tolerance`, the engine refuses with
   * `ENGINE_NOT_APPLICABLE` instead of returning a number it cannot vouch for.
   */
  tolerance?: number;
}

/** Machine epsilon, 2^-52. */
const EPS = 2.220446049250313e-16;

/** Default target absolute error. */
const DEFAULT_TOLERANCE = POLICY.tolerances.PAN_TOLERANCE;

/**
 * Two eigenvalues on the integrated side closer than this fraction of the spread nu_m - nu_1
 * count as tied. At a tie the formula itself breaks down (a non-integrable singularity, or an
 * interval of zero length between two that diverge); where three or more values crowd within a
 * gap g the terms grow like spread / g and cancel, so rounding costs a factor spread / g, up to 1e6 at
 * this threshold (and the a-posteriori bound refuses what is left). Values tied in exact
 * arithmetic leave an eigen-solver about 1e-15 of the spread apart, far below the line; untied
 * spectra of the Durbin-Watson kind have relative gaps of about 7 / n^2 (8e-5 at n = 300), far
 * above it.
 */
const TIE_GAP = POLICY.tolerances.PAN_TIE_GAP;

/**
 * Largest m for which Pan's engine is accepted without knowing c: the worst point (the middle of
 * the support) then keeps the rounding bound below about 2e-13 for Durbin-Watson spectra, 6e-14
 * for evenly spaced ones. Beyond it, ask with c: the tails remain accurate for any m.
 */
const ANY_C_MAX_M = POLICY.limits.PAN_ANY_C_MAX_M;

/** Below this the requested tail is computed by its own form rather than as 1 - other. */
const SMALL_TAIL = 0.1;

/** Node counts: Gauss-Chebyshev per interval, Gauss-Legendre per panel. */
const CHEB_START = 16;
const CHEB_MAX = 4096;
const GL_START = 16;
const GL_MAX = 256;

/** A full interval uses Gauss-Chebyshev when no singularity lies closer than this to [0, pi]. */
const CHEB_MIN_DISTANCE = 0.25;

/** Ratio of consecutive breakpoints of graded panels. */
const GRADING = 3;

const TWO_256 = 2 ** 256;
const TWO_M256 = 2 ** -256;

/** Gauss-Legendre rule on [-1, 1], nonnegative half: nodes x_j >= 0 and their weights. */
interface GaussRule {
  x: Float64Array;
  w: Float64Array;
}

/** Gauss-Legendre rule with n nodes: Newton's method on the three-term recurrence. */
function gaussLegendre(n: number): GaussRule {
  const count = Math.ceil(n / 2);
  const x = new Float64Array(count);
  const w = new Float64Array(count);
  for (let j = 0; j < count; j++) {
    let z = Math.cos((Math.PI * (j + 0.75)) / (n + 0.5)); // Tricomi's first approximation
    for (let it = 0; it < 100; it++) {
      const [p, dp] = legendre(n, z);
      const dz = p / dp;
      z -= dz;
      if (Math.abs(dz) <= 4e-16) break;
    }
    const dp = legendre(n, z)[1];
    x[j] = Math.abs(z) < 1e-15 ? 0 : z;
    w[j] = 2 / ((1 - z * z) * dp * dp);
  }
  return { x, w };
}

/**
 * P_n(z) and its derivative P_n'(z) = n (z P_n(z) - P_{n-1}(z)) / (z^2 - 1), by the three-term
 * recurrence k P_k = (2k - 1) z P_{k-1} - (k - 1) P_{k-2} (A&S 22.7.10 and 22.8.5), for |z| < 1.
 */
function legendre(n: number, z: number): [number, number] {
  let p0 = 1;
  let p1 = z;
  for (let k = 2; k <= n; k++) {
    const p2 = ((2 * k - 1) * z * p1 - (k - 1) * p0) / k;
    p0 = p1;
    p1 = p2;
  }
  return [p1, (n * (z * p1 - p0)) / (z * z - 1)];
}

/**
 * Integrand of one interval in its smooth variable, called with the distances `t` from the left
 * end and `u` from the right end of the variable's range (t + u = length of the range). The
 * smaller of the two is always passed exactly, so an end near a singularity keeps full precision.
 */
type Integrand = (t: number, u: number) => number;

/** One term of the alternating sum: its integrand and where that integrand is nearly singular. */
interface Term {
  f: Integrand;
  /** length of the range of the smooth variable: pi (full interval) or pi / 2 (cut at c) */
  range: number;
  /** distance of the nearest singularity from the left / right end of the range (complex plane) */
  dl: number;
  dr: number;
  /** midpoint rule in theta (full interval, no close singularity) */
  chebyshev: boolean;
}

/** Gauss-Legendre rules built during one call (no state outlives the call). */
type RuleCache = Map<number, GaussRule>;

function rule(cache: RuleCache, n: number): GaussRule {
  let r = cache.get(n);
  if (!r) {
    r = gaussLegendre(n);
    cache.set(n, r);
  }
  return r;
}

/** Midpoint rule in theta on [0, pi] with n nodes (= Gauss-Chebyshev in w). */
function chebyshevSum(f: Integrand, n: number): number {
  const h = Math.PI / (2 * n);
  let s = 0;
  for (let k = 0; k < n; k++) s += f((2 * k + 1) * h, (2 * (n - k) - 1) * h);
  return (Math.PI / n) * s;
}

/**
 * Breakpoints on [0, T], graded geometrically towards an end whose nearest singularity lies at
 * distance d < T / 4 from it; each breakpoint as [distance from 0, distance from T].
 */
function gradedBreaks(T: number, dl: number, dr: number): Array<[number, number]> {
  const out: Array<[number, number]> = [[0, T]];
  const floor = 1e-16 * T;
  if (dl < T / 4) for (let x = Math.max(dl, floor); x < T / 2; x *= GRADING) out.push([x, T - x]);
  const right: number[] = [];
  if (dr < T / 4) for (let x = Math.max(dr, floor); x < T / 2; x *= GRADING) right.push(x);
  for (let j = right.length - 1; j >= 0; j--) out.push([T - right[j], right[j]]);
  out.push([T, 0]);
  return out;
}

/** Composite Gauss-Legendre over the panels between consecutive breakpoints. */
function gradedSum(f: Integrand, breaks: Array<[number, number]>, g: GaussRule): number {
  let s = 0;
  for (let p = 0; p + 1 < breaks.length; p++) {
    const [t0, u0] = breaks[p];
    const [t1, u1] = breaks[p + 1];
    const T = t0 + u0;
    // measure along the panel from the nearer end of the whole range
    const fromLeft = t0 <= u1;
    const lo = fromLeft ? t0 : u1;
    const hi = fromLeft ? t1 : u0;
    const mid = 0.5 * (lo + hi);
    const hw = 0.5 * (hi - lo);
    if (!(hw > 0)) continue;
    const at = (x: number): number => (fromLeft ? f(x, T - x) : f(T - x, x));
    let ps = 0;
    for (let j = 0; j < g.x.length; j++) {
      const dx = hw * g.x[j];
      ps += dx === 0 ? g.w[j] * at(mid) : g.w[j] * (at(mid - dx) + at(mid + dx));
    }
    s += hw * ps;
  }
  return s;
}

/** Value of one term and the difference between its last two estimates (n and 2n nodes). */
interface TermValue {
  value: number;
  error: number;
}

/** Integrate a term, doubling the node count until two estimates agree to `relStop`. */
function integrateTerm(term: Term, relStop: number, cache: RuleCache): TermValue {
  const { f } = term;
  if (term.chebyshev) {
    let n = CHEB_START;
    let prev = chebyshevSum(f, n);
    let next = chebyshevSum(f, 2 * n);
    while (Math.abs(next - prev) > relStop * Math.abs(next) && 2 * n < CHEB_MAX) {
      n *= 2;
      prev = next;
      next = chebyshevSum(f, 2 * n);
    }
    return { value: next, error: Math.abs(next - prev) };
  }
  const breaks = gradedBreaks(term.range, term.dl, term.dr);
  let q = GL_START;
  let prev = gradedSum(f, breaks, rule(cache, q));
  let next = gradedSum(f, breaks, rule(cache, 2 * q));
  while (Math.abs(next - prev) > relStop * Math.abs(next) && 2 * q < GL_MAX) {
    q *= 2;
    prev = next;
    next = gradedSum(f, breaks, rule(cache, 2 * q));
  }
  return { value: next, error: Math.abs(next - prev) };
}

/** A crude 4-node estimate of a term (for predicting cancellation before computing). */
function roughTerm(term: Term): number {
  let s = 0;
  const h = term.range / 8;
  for (let k = 0; k < 4; k++) s += term.f((2 * k + 1) * h, (7 - 2 * k) * h);
  return (term.range / 4) * s;
}

/** acosh(1 + x), accurate for small x >= 0. */
function acosh1p(x: number): number {
  return Math.log1p(x + Math.sqrt(x * (2 + x)));
}

/**
 * sqrt(prod_j (cw / dist_j)) with dist_j = left[j] + dLeft, then right[j] + dRight (all terms
 * nonnegative, so each distance is accurate to a few ulp), the binary exponent carried apart.
 */
function sqrtRatioProduct(cw: number, dLeft: number, left: Float64Array, dRight: number, right: Float64Array): number {
  if (cw === 0) return 0;
  let p = 1;
  let e = 0;
  for (let j = 0; j < left.length; j++) {
    p *= cw / (left[j] + dLeft);
    if (p > TWO_256) { p *= TWO_M256; e += 256; } else if (p < TWO_M256) { p *= TWO_256; e -= 256; }
  }
  for (let j = 0; j < right.length; j++) {
    p *= cw / (right[j] + dRight);
    if (p > TWO_256) { p *= TWO_M256; e += 256; } else if (p < TWO_M256) { p *= TWO_256; e -= 256; }
  }
  const s = Math.sqrt(p);
  return e === 0 ? s : s * Math.pow(2, e / 2);
}

/**
 * The terms of P(d <= c) for the ascending spectrum x, nu_1 < c < nu_m: one per odd r with
 * x_r < c (0-based start index i0 = r - 1, even).
 */
function lowerTerms(x: Float64Array, c: number): Term[] {
  const m = x.length;
  const terms: Term[] = [];
  for (let i0 = 0; i0 < m && x[i0] < c; i0 += 2) {
    const a = x[i0];
    const sl = i0 > 0 ? a - x[i0 - 1] : Infinity;
    const left = new Float64Array(i0);
    for (let j = 0; j < i0; j++) left[j] = a - x[j];
    if (i0 + 1 < m && x[i0 + 1] < c) {
      // full interval [a, b] with c > b; theta in [0, pi]
      const b = x[i0 + 1];
      const half = 0.5 * (b - a);
      const right = new Float64Array(m - i0 - 2);
      for (let j = i0 + 2; j < m; j++) right[j - i0 - 2] = x[j] - b;
      const cb = c - b;
      const f: Integrand = (t, u) => {
        const s = Math.sin(0.5 * t);
        const r = Math.sin(0.5 * u);
        const wa = 2 * half * s * s; // w - a
        const wb = 2 * half * r * r; // b - w
        return sqrtRatioProduct(cb + wb, wa, left, wb, right);
      };
      let sr = i0 + 2 < m ? x[i0 + 2] - b : Infinity;
      if (m % 2 === 1) sr = Math.min(sr, cb); // (c - w)^((m-2)/2) branches at c when m is odd
      const dl = acosh1p(sl / half);
      const dr = acosh1p(sr / half);
      terms.push({ f, range: Math.PI, dl, dr, chebyshev: dl >= CHEB_MIN_DISTANCE && dr >= CHEB_MIN_DISTANCE });
    } else {
      // interval cut at c: [a, c], c <= x[i0 + 1] (or the last interval); phi in [0, pi/2]
      const L = c - a;
      const right = new Float64Array(m - i0 - 1);
      for (let j = i0 + 1; j < m; j++) right[j - i0 - 1] = x[j] - c;
      const f: Integrand = (t, u) => {
        const s = Math.sin(t);
        const r = Math.sin(u); // cos(phi)
        const wa = L * s * s; // w - a
        const cw = L * r * r; // c - w
        return 2 * sqrtRatioProduct(cw, wa, left, cw, right);
      };
      let sr = Infinity; // the first eigenvalue beyond c (one equal to c cancels: ratio 1)
      for (let j = i0 + 1; j < m; j++) {
        if (x[j] > c) { sr = x[j] - c; break; }
      }
      terms.push({ f, range: Math.PI / 2, dl: Math.asinh(Math.sqrt(sl / L)), dr: Math.asinh(Math.sqrt(sr / L)), chebyshev: false });
    }
  }
  return terms;
}

/** Result of one form of the sum. */
interface FormValue {
  /** (1/pi) sum (-1)^j I_j, the tail this form gives directly */
  p: number;
  /** absolute error bound: quadrature estimates plus rounding */
  errorBound: number;
}

/** Rounding allowance, in units of eps (1/pi) sum |I_j|. */
function roundingFactor(m: number, terms: number): number {
  // each eigenvalue difference is rounded once and enters I_j with exponent 1/2: (m - 1)/4 eps
  // at worst; the alternating sum: terms * eps/2; node-level rounding, which averages out, and
  // the final division by pi: 8 eps.
  return 8 + m / 4 + terms;
}

/** Evaluate P(d <= c) by Pan's sum on the ascending spectrum x (nu_1 < c < nu_m). */
function evaluateLower(x: Float64Array, c: number): FormValue {
  const m = x.length;
  const relStop = (8 + m / 4) * EPS;
  const cache: RuleCache = new Map();
  const terms = lowerTerms(x, c);
  let sum = 0;
  let sumAbs = 0;
  let quad = 0;
  for (let j = 0; j < terms.length; j++) {
    const r = integrateTerm(terms[j], relStop, cache);
    sum += j % 2 === 0 ? r.value : -r.value;
    sumAbs += Math.abs(r.value);
    quad += r.error;
  }
  const p = sum / Math.PI;
  const errorBound = quad / Math.PI + roundingFactor(m, terms.length) * EPS * (sumAbs / Math.PI);
  return { p, errorBound };
}

/** Predicted rounding bound of the form, from 4-node estimates of its terms. */
function predictLower(x: Float64Array, c: number): number {
  const terms = lowerTerms(x, c);
  let sumAbs = 0;
  for (const t of terms) sumAbs += roughTerm(t);
  return roundingFactor(x.length, terms.length) * EPS * (sumAbs / Math.PI);
}

/** nu -> -nu, reversed to stay ascending: the mirror form P(d >= c) = P(-d <= -c). */
function mirror(nu: Float64Array): Float64Array {
  const m = nu.length;
  const out = new Float64Array(m);
  for (let j = 0; j < m; j++) out[j] = -nu[m - 1 - j];
  return out;
}

/** Why the spectrum cannot be used at all, or null. */
function malformed(nu: Float64Array): string | null {
  if (!(nu instanceof Float64Array)) return 'the spectrum must be a Float64Array';
  if (nu.length < 2) return `the spectrum has ${nu.length} eigenvalue(s); Pan's formula needs m >= 2`;
  for (let j = 0; j < nu.length; j++) {
    if (!Number.isFinite(nu[j])) return `eigenvalue nu_${j + 1} is not a finite number (${nu[j]})`;
    if (j > 0 && nu[j] < nu[j - 1]) {
      return `the eigenvalues are not sorted ascending (nu_${j} = ${nu[j - 1]} > nu_${j + 1} = ${nu[j]})`;
    }
  }
  return null;
}

/**
 * First tie among x[0..count-1] as a plain-words reason, or null. Numbering and values are the
 * caller's (ascending nu) also for the mirrored spectrum.
 */
function tieReason(x: Float64Array, count: number, mirrored: boolean): string | null {
  const m = x.length;
  const spread = x[m - 1] - x[0];
  for (let j = 0; j + 1 < count; j++) {
    const gap = x[j + 1] - x[j];
    if (gap <= TIE_GAP * spread) {
      const i1 = mirrored ? m - j - 1 : j + 1;
      const v1 = mirrored ? -x[j + 1] : x[j];
      const v2 = mirrored ? -x[j] : x[j + 1];
      return `eigenvalues nu_${i1} = ${v1} and nu_${i1 + 1} = ${v2} are tied or clustered (gap ${gap.toExponential(2)}, ` +
        `below ${TIE_GAP} of the spread ${spread.toPrecision(4)}), and Pan's alternating sum needs separated eigenvalues`;
    }
  }
  return null;
}

/** One of the two forms at a given c: the tail it gives directly, its terms, and any objection. */
interface Form {
  tail: Tail;
  /** the ascending spectrum and point the lower-form sum runs on */
  x: Float64Array;
  c: number;
  terms: number;
  refusal: string | null;
}

/**
 * Both forms at c (nu_1 < c < nu_m). Eigenvalues beyond c enter only through smooth factors
 * (c - w) / (nu_i - w), so only ties on the integrated side matter. With a tolerance, a form whose
 * predicted rounding bound exceeds it is refused too.
 */
function formsAt(nu: Float64Array, c: number, tolerance: number): [Form, Form] {
  const m = nu.length;
  let below = 0;
  while (below < m && nu[below] < c) below++;
  let above = 0;
  while (above < m && nu[m - 1 - above] > c) above++;
  const mu = mirror(nu);
  const make = (tail: Tail, x: Float64Array, cc: number, count: number): Form => {
    let refusal = tieReason(x, count, tail === 'upper');
    if (!refusal) {
      // the final bound adds the quadrature estimates (at most about the rounding part again) to
      // the rounding: a margin of 4 keeps 'applicable' from turning into a refusal afterwards
      const predicted = predictLower(x, cc);
      if (4 * predicted > tolerance) {
        refusal = `at c = ${c} with m = ${m} the ${tail === 'lower' ? 'lower' : 'mirror'} form's alternating sum cancels ` +
          `too much (predicted rounding error ${predicted.toExponential(1)}, tolerance ${tolerance})`;
      }
    }
    return { tail, x, c: cc, terms: Math.ceil(count / 2), refusal };
  };
  return [make('lower', nu, c, below), make('upper', mu, -c, above)];
}

/**
 * Whether Pan's engine applies to this spectrum (and, when `c` is given, at this point, for the
 * default tolerance 1e-12).
 *
 * Refuses, with the reason in plain words, when
 * - the spectrum is malformed (fewer than 2 values, a value not finite, not ascending);
 * - two eigenvalues are tied or clustered: closer than 1e-6 of the spread nu_m - nu_1 (at a tie
 *   the formula breaks down; near one the terms of the alternating sum grow like spread / gap and
 *   cancel). With `c`, only eigenvalues on the integrated side count (below c for the lower form,
 *   above c for the mirror form) and one usable form suffices;
 * - without `c`: m > 24. In the middle of the support the terms of the alternating sum grow
 *   roughly like exp(0.27 m) and cancel; up to m = 24 the rounding stays below about 2e-13 for
 *   every c. With `c`: the rounding bound predicted from a 4-node estimate of each term exceeds
 *   1e-12 / 4 for both forms (the margin covers the quadrature part of the final bound). Tails
 *   stay accurate for m in the hundreds.
 *
 * @example
 * ```ts
 * panApplicable(Float64Array.of(0.5, 1, 2)).ok;           // true
 * panApplicable(Float64Array.of(0.5, 0.5, 1, 2)).ok;      // false: nu_1 and nu_2 are tied
 * panApplicable(Float64Array.of(0.5, 0.5, 1, 2), 1.8).ok; // true: the mirror form avoids the tie
 * ```
 */
export function panApplicable(nu: Float64Array, c?: number): { ok: boolean; reason: string } {
  const bad = malformed(nu);
  if (bad) return { ok: false, reason: bad };
  const m = nu.length;
  if (nu[0] === nu[m - 1]) return { ok: false, reason: tieReason(nu, m, false) ?? 'all eigenvalues are equal' };
  if (c === undefined) {
    const tie = tieReason(nu, m, false);
    if (tie) return { ok: false, reason: tie };
    if (m > ANY_C_MAX_M) {
      return {
        ok: false,
        reason: `m = ${m} is too large for Pan's alternating sum at every c (at most ${ANY_C_MAX_M}): in the middle of ` +
          'the support its terms grow roughly like exp(0.27 m) and cancel; ask with c, the tails stay accurate',
      };
    }
    return { ok: true, reason: `m = ${m} distinct, well separated eigenvalues` };
  }
  if (Number.isNaN(c)) return { ok: false, reason: 'c is not a number' };
  if (c <= nu[0] || c >= nu[m - 1]) return { ok: true, reason: 'c lies outside the open support: the answer is 0 or 1 exactly' };
  const [lower, upper] = formsAt(nu, c, DEFAULT_TOLERANCE);
  if (!lower.refusal) return { ok: true, reason: `the lower form (${lower.terms} terms) is usable at c = ${c}` };
  if (!upper.refusal) return { ok: true, reason: `the mirror form (${upper.terms} terms) is usable at c = ${c}` };
  return { ok: false, reason: lower.refusal };
}

function result(p: number, errorBound: number): TailProbability {
  const q = Math.min(1, Math.max(0, p));
  return { p: q, errorBound, relativeError: q > 0 ? errorBound / q : Infinity, method: 'pan' };
}

/** The tail a form gives directly. */
function direct(form: Form): TailProbability {
  const v = evaluateLower(form.x, form.c);
  return result(v.p, v.errorBound);
}

/** The other tail, 1 - p, from a form. */
function complementOf(form: Form): TailProbability {
  const v = evaluateLower(form.x, form.c);
  return result(1 - v.p, v.errorBound + EPS);
}

/**
 * P(d <= c) (`tail = 'lower'`) or P(d >= c) (`'upper'`) by Pan's finite-range formula, for
 * d = sum nu_i z_i^2 / sum z_i^2 with `nu` the ascending spectrum (m >= 2 distinct values).
 *
 * Of the two forms (the lower one on nu, the mirror one on -nu) the one with fewer terms is
 * computed; when that gives the other tail and the requested one comes out below 0.1, the
 * requested tail is also computed directly by its own form and the result with the smaller bound
 * is returned, so small tails keep their relative accuracy. c <= nu_1 and c >= nu_m give 0 and 1
 * exactly; c may equal an eigenvalue.
 *
 * `errorBound` = (quadrature) for each integral the difference between its last two estimates
 * (n and 2n nodes), which overstates the error of the 2n-node value once convergence is
 * geometric, plus (rounding) (8 + m/4 + terms) eps (1/pi) sum |I_j|, covering the rounding of the
 * eigenvalue differences and of the integrand values and the cancellation in the alternating sum.
 * Not covered: errors already present in `nu`. `relativeError` = errorBound / p.
 *
 * @throws DwError `ENGINE_NOT_APPLICABLE` when eigenvalues are tied or clustered on the side that
 *   must be integrated, when the alternating sum would cancel beyond `tolerance` (see
 *   {@link panApplicable}), or when the bound finally exceeds `tolerance`; `OPTION_VALUE` for a
 *   malformed spectrum, tail or tolerance; `D_OUT_OF_RANGE` when c is not a number.
 *
 * @example
 * ```ts
 * // m = 2, the arcsine law: P(d <= 1.5) = (2/pi) asin(sqrt(0.5)) = 0.5
 * panTail(Float64Array.of(1, 2), 1.5, 'lower').p; // 0.5 (to 1e-15)
 * // Durbin-Watson lower bound, n = 10, k' = 1: nu_i = 2 - 2 cos(pi i / 10), i = 1..8
 * const nu = Float64Array.from({ length: 8 }, (_, j) => 2 - 2 * Math.cos((Math.PI * (j + 1)) / 10));
 * panTail(nu, 0.879, 'lower').p; // 0.04997 (Savin & White 1977 tabulate d_L = 0.879 at 5%)
 * ```
 */
export function panTail(nu: Float64Array, c: number, tail: Tail, options: PanOptions = {}): TailProbability {
  const bad = malformed(nu);
  if (bad) {
    throw new DwError('OPTION_VALUE', `Pan's engine cannot use this spectrum: ${bad}.`,
      'Pass the eigenvalues as a Float64Array sorted ascending.');
  }
  if (Number.isNaN(c)) throw new DwError('D_OUT_OF_RANGE', 'The point c is not a number.', 'Pass a finite value of d.');
  if (tail !== 'lower' && tail !== 'upper') {
    throw new DwError('OPTION_VALUE', `Unknown tail '${String(tail)}'.`, "Use 'lower' or 'upper'.");
  }
  const tolerance = options.tolerance ?? DEFAULT_TOLERANCE;
  if (!(tolerance > 0)) {
    throw new DwError('OPTION_VALUE', `The tolerance must be a positive number (got ${tolerance}).`, 'Use for example 1e-12.');
  }
  const m = nu.length;
  // d is constant when every eigenvalue is the same: not a case for Pan (nor a continuous law)
  if (nu[0] === nu[m - 1]) throw notApplicable(tieReason(nu, m, false) ?? 'all eigenvalues are equal');
  if (c <= nu[0]) return exactTail(tail === 'lower' ? 0 : 1, 'pan');
  if (c >= nu[m - 1]) return exactTail(tail === 'lower' ? 1 : 0, 'pan');

  const [lower, upper] = formsAt(nu, c, tolerance);
  const wanted = tail === 'lower' ? lower : upper;
  const other = tail === 'lower' ? upper : lower;
  let r: TailProbability;
  if (!wanted.refusal && (other.refusal || wanted.terms <= other.terms)) {
    r = direct(wanted);
  } else if (!other.refusal) {
    r = complementOf(other);
    if (!wanted.refusal && r.p < SMALL_TAIL) {
      const d = direct(wanted);
      if (d.errorBound <= r.errorBound) r = d;
    }
  } else {
    throw notApplicable(wanted.refusal ?? other.refusal ?? '');
  }
  if (!(r.errorBound <= tolerance)) {
    throw notApplicable(`the error bound ${r.errorBound.toExponential(2)} exceeds the tolerance ${tolerance} ` +
      '(cancellation in the alternating sum)');
  }
  return r;
}

function notApplicable(why: string): DwError {
  return new DwError('ENGINE_NOT_APPLICABLE', `Pan's engine does not apply: ${why}.`,
    'Use the Imhof engine (method imhof, or auto), which needs neither separated eigenvalues nor small m.');
}
