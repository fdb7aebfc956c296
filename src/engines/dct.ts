/**
 * The DCT eigenbasis route (docs/methods.md section 10): Imhof's integral (Imhof 1961, Biometrika
 * 48, 419-426) with the characteristic function evaluated in the closed-form eigenbasis of the
 * difference operator.
 *
 * A difference operator A (any lag, gaps) is a disjoint union of chains, each the Laplacian of a
 * path of length L with eigenpairs lambda_j = 2 - 2 cos(pi j / L) and the DCT-II vectors
 * v_j(t) = s_j cos(pi j (t + 1/2) / L). With V = [v_j] (orthogonal, n x n) and W = V'Q (Q the n x k
 * orthonormal basis of col(X), transformed once by a fast DCT-II per chain, O(n k log n)), the
 * matrix B = I - i u S, S = sign (A - cI), is diagonal: B = V D V', D = diag(d_j),
 * d_j = 1 - i u mu_j, mu_j = sign (lambda_j - c). With U = [Z Q] orthogonal, the Schur complement
 * of (U'BU)^-1 = U'B^-1 U gives
 *
 *   det(Z'BZ) = det(B) det(Q'B^-1 Q) = prod_j d_j * det(W' D^-1 W),
 *
 * so L(u) = sum_j log(1 - i u (nu_j - c)) over the m = n - k weights of the complement is
 * sum_j Log d_j + Log det G, G = W'D^-1 W (k x k complex symmetric). Each d_j has real part 1 and
 * G has the positive definite Hermitian part W' diag(1/(1 + u^2 mu_j^2)) W, so every pivot of its
 * LDL' without pivoting has positive real part: summing principal logarithms gives the continuous
 * branch of L (as in the eigen-free engine, src/engines/complex-ldl.ts). One evaluation is
 * O(n k^2) of branch-free loops over a contiguous array: no factorisation, no recurrence.
 *
 * Fewer evaluations: the integrand lives on the scale sigma = (sum (nu_j - c)^2)^(-1/2), known
 * exactly from traces, and the integral is cut where the integrand is provably negligible. The cut
 * uses the convexity of log rho(u) in log u (each term (1/4) log(1 + lambda^2 e^(2s)) is convex in
 * s): with the secant slope g over [U/2, U], log rho(u) >= log rho(U) + g log(u / U) for u >= U,
 * hence
 *
 *   (1/pi) Integral_U^inf |sin theta| / (u rho(u)) du <= 1 / (pi g rho(U)),
 *
 * which needs only two evaluations, no eigenvalues, and holds for any weights (also a weight on
 * zero). [0, U] is integrated by adaptive Gauss-Kronrod on panels scaled by sigma.
 */
import { DwError } from '../errors.js';
import { pathChains } from '../core/fast-spectrum.js';
import { dctPlan, type DctPlan } from '../core/dct.js';
import { adaptiveIntegrate } from '../core/quadrature.js';
import { convexityCut, probabilityTailBound } from '../core/convexity-cut.js';
import { exactTail } from '../core/exact-tail.js';
import { PivotProduct, smallLogDet } from './complex-ldl.js';
import type { BandMatrix, CharacteristicForm, ColumnBasis, Tail, TailProbability } from '../core/types.js';

/**
 * The eigenbasis of a difference operator and the regressors' coordinates in it.
 *
 * @example
 * ```ts
 * const eb = dctEigenbasis(a, basis)!;  // a: differenceMatrix(...), basis: orthonormal Q of col(X)
 * eb.lambda.length === eb.n;            // one eigenvalue of A per observation
 * ```
 */
export interface DctEigenbasis {
  n: number;
  k: number;
  /** Eigenvalues of A (chain by chain, not sorted). */
  lambda: Float64Array;
  /** W = V'Q, n x k row-major: w[j k + c] is the coordinate of column c along eigenvector j. */
  w: Float64Array;
  /** Smallest and largest eigenvalue of A (they bound the spectrum of d by interlacing). */
  lambdaMin: number;
  lambdaMax: number;
  /** sum nu_j and sum nu_j^2 over the complement of col(X), from traces in the eigenbasis. */
  sumNu: number;
  sumNu2: number;
}

const cache = new WeakMap<BandMatrix, WeakMap<ColumnBasis, DctEigenbasis | null>>();

/**
 * The eigenbasis of A chain by chain (closed form) and W = V'Q by one fast DCT-II per chain and
 * column; null when A is not a union of path-graph Laplacians (every `differenceMatrix` operator
 * is one). Cached per (operator, basis), so the transform is done once per design.
 *
 * @example
 * ```ts
 * const eb = dctEigenbasis(differenceMatrix(differencePairs(1000)), basis);
 * eb?.lambdaMax;  // 2 - 2 cos(pi 999 / 1000)
 * ```
 */
export function dctEigenbasis(a: BandMatrix, basis: ColumnBasis): DctEigenbasis | null {
  let byBasis = cache.get(a);
  if (!byBasis) { byBasis = new WeakMap(); cache.set(a, byBasis); }
  if (byBasis.has(basis)) return byBasis.get(basis) ?? null;
  const eb = computeEigenbasis(a, basis);
  byBasis.set(basis, eb);
  return eb;
}

function computeEigenbasis(a: BandMatrix, basis: ColumnBasis): DctEigenbasis | null {
  if (a.n !== basis.n || basis.q.length !== basis.n * basis.k) return null;
  const chains = pathChains(a);
  if (chains === null) return null;
  const { n, k, q } = basis;
  const lambda = new Float64Array(n);
  const w = new Float64Array(n * k);
  const plans = new Map<number, DctPlan>();
  const nc = chains.starts.length - 1;
  let maxL = 0;
  for (let c = 0; c < nc; c++) maxL = Math.max(maxL, chains.starts[c + 1] - chains.starts[c]);
  const x = new Float64Array(maxL);
  const y = new Float64Array(maxL);
  for (let c = 0; c < nc; c++) {
    const s0 = chains.starts[c];
    const L = chains.starts[c + 1] - s0;
    let plan = plans.get(L);
    if (!plan) { plan = dctPlan(L); plans.set(L, plan); }
    for (let j = 0; j < L; j++) {
      const sn = Math.sin((Math.PI * j) / (2 * L));
      lambda[s0 + j] = 4 * sn * sn;
    }
    const xs = x.subarray(0, L), ys = y.subarray(0, L);
    for (let col = 0; col < k; col++) {
      for (let t = 0; t < L; t++) xs[t] = q[col * n + chains.order[s0 + t]];
      plan.transform(xs, ys);
      for (let j = 0; j < L; j++) w[(s0 + j) * k + col] = ys[j];
    }
  }
  let lambdaMin = Infinity, lambdaMax = -Infinity;
  let trA = 0, trA2 = 0, trQAQ = 0, trQA2Q = 0;
  const h = new Float64Array(k * k); // W' Lambda W
  for (let j = 0; j < n; j++) {
    const l = lambda[j];
    lambdaMin = Math.min(lambdaMin, l);
    lambdaMax = Math.max(lambdaMax, l);
    trA += l;
    trA2 += l * l;
    const o = j * k;
    for (let r = 0; r < k; r++) {
      const wr = w[o + r];
      trQAQ += l * wr * wr;
      trQA2Q += l * l * wr * wr;
      for (let s = 0; s <= r; s++) h[r * k + s] += l * wr * w[o + s];
    }
  }
  let frobH = 0;
  for (let r = 0; r < k; r++) for (let s = 0; s <= r; s++) frobH += (r === s ? 1 : 2) * h[r * k + s] * h[r * k + s];
  return {
    n, k, lambda, w, lambdaMin, lambdaMax,
    sumNu: trA - trQAQ,
    // trace (M A M A) = ||A||_F^2 - 2 ||A Q||_F^2 + ||Q'AQ||_F^2
    sumNu2: trA2 - 2 * trQA2Q + frobH,
  };
}

/** Relative size of the floor in {@link DctForm.sumLogAbsLambda} (as in the eigen-free engine). */
const LAMBDA_FLOOR = 1e-9;

/**
 * The characteristic form in the DCT eigenbasis, with what the cut of the integral needs.
 *
 * @example
 * ```ts
 * const form = dctForm(eb, 1.8);
 * form.scale;  // (sum (nu_j - 1.8)^2)^(-1/2)
 * ```
 */
export interface DctForm extends CharacteristicForm {
  /** sigma = (sum (nu_j - c)^2)^(-1/2): the scale of u on which the integrand lives. */
  scale: number;
  /**
   * L'(c) pieces for the density: write theta, log rho and Re, Im of dL/dc (L = sum Log(1 - iu lambda))
   * into out[0..3].
   */
  evaluateWithDerivative(u: number, out: Float64Array): void;
}

/**
 * The CharacteristicForm of Q = sign sum (nu_j - c) z_j^2 (lower tail for sign = 1, upper for -1)
 * from the DCT eigenbasis: O(n k^2) per evaluation, nothing allocated per evaluation.
 * `sumLogAbsLambda` is (1/2) sum log((nu_j - c)^2 + tau^2), tau = 1e-9 max|nu - c| (an upper bound
 * of sum log|nu_j - c|, finite also when c is an eigenvalue), `maxAbsLambda` the interlacing bound
 * max(|lambda_max - c|, |c - lambda_min|).
 *
 * @example
 * ```ts
 * const out = new Float64Array(2);
 * dctForm(eb, 1.8).evaluate(0.01, out);  // out[0] = theta(0.01), out[1] = log rho(0.01)
 * ```
 */
export function dctForm(eb: DctEigenbasis, c: number, sign: 1 | -1 = 1): DctForm {
  const { n, k, lambda, w } = eb;
  const m = n - k;
  const mu = new Float64Array(n);
  for (let j = 0; j < n; j++) mu[j] = sign * (lambda[j] - c);
  const maxAbsLambda = Math.max(Math.abs(eb.lambdaMax - c), Math.abs(c - eb.lambdaMin));
  const sumLambda = sign * (eb.sumNu - m * c);
  const sumSq = Math.max(0, eb.sumNu2 - 2 * c * eb.sumNu + m * c * c);
  const gr = new Float64Array(k * k);
  const gi = new Float64Array(k * k);
  const hr = new Float64Array(k * k);
  const hi = new Float64Array(k * k);
  const small = smallLogDet(k);
  const acc = new Float64Array(2);
  const prod = new PivotProduct();
  const kk = k;

  /** log det(Z'(alpha I + beta S)Z) with alpha = 1, beta = -iu (the integrand) into out[0] (Re), out[1] (Im). */
  const logDet = (u: number, out: Float64Array): void => {
    gr.fill(0); gi.fill(0);
    prod.reset();
    for (let j = 0; j < n; j++) {
      const x = u * mu[j];
      prod.push(1, -x, true);
      const r = 1 / (1 + x * x);
      const ri = x * r; // 1/d_j = r + i ri
      const o = j * kk;
      for (let a = 0; a < kk; a++) {
        const wa = w[o + a];
        const pr = wa * r, pi = wa * ri;
        const row = a * kk;
        for (let b = 0; b <= a; b++) {
          const wb = w[o + b];
          gr[row + b] += pr * wb;
          gi[row + b] += pi * wb;
        }
      }
    }
    small(gr, gi, acc);
    out[0] = prod.logModulus() + acc[0];
    out[1] = prod.argument() + acc[1];
  };

  // (1/2) sum log(lambda^2 + tau^2) = log |det(Z'(S + i tau I)Z)|
  const tau = LAMBDA_FLOOR * maxAbsLambda;
  let sumLogAbsLambda: number;
  {
    gr.fill(0); gi.fill(0);
    let logAbs = 0;
    for (let j = 0; j < n; j++) {
      const dr = mu[j], di = tau;
      logAbs += 0.5 * Math.log(dr * dr + di * di);
      const den = dr * dr + di * di;
      const r = dr / den, ri = -di / den;
      const o = j * kk;
      for (let a = 0; a < kk; a++) {
        const pr = w[o + a] * r, pi = w[o + a] * ri;
        for (let b = 0; b <= a; b++) { gr[a * kk + b] += pr * w[o + b]; gi[a * kk + b] += pi * w[o + b]; }
      }
    }
    small(gr, gi, acc);
    sumLogAbsLambda = logAbs + acc[0];
  }

  const res = new Float64Array(2);
  const cr = new Float64Array(k * k), ci = new Float64Array(k * k);
  return {
    m,
    sumLambda,
    sumLogAbsLambda,
    maxAbsLambda,
    scale: sumSq > 0 ? 1 / Math.sqrt(sumSq) : 1 / maxAbsLambda,
    evaluate(u: number, out: Float64Array): void {
      if (u === 0) { out[0] = 0; out[1] = 0; return; }
      logDet(u, res);
      out[0] = -0.5 * res[1];
      out[1] = 0.5 * res[0];
    },
    evaluateWithDerivative(u: number, out: Float64Array): void {
      // dL/dc = sum_j i u / d_j - i u tr(G^-1 H), G = W'D^-1 W, H = W'D^-2 W (sign = 1; for
      // sign = -1 the derivative in c flips sign with mu)
      gr.fill(0); gi.fill(0); hr.fill(0); hi.fill(0);
      prod.reset();
      let sr = 0, si = 0; // sum 1/d_j
      for (let j = 0; j < n; j++) {
        const x = u * mu[j];
        prod.push(1, -x, true);
        const r = 1 / (1 + x * x);
        const ri = x * r;
        sr += r; si += ri;
        const r2 = r * r - ri * ri, ri2 = 2 * r * ri; // 1/d_j^2
        const o = j * kk;
        for (let a = 0; a < kk; a++) {
          const wa = w[o + a];
          for (let b = 0; b <= a; b++) {
            const ww = wa * w[o + b];
            gr[a * kk + b] += ww * r; gi[a * kk + b] += ww * ri;
            hr[a * kk + b] += ww * r2; hi[a * kk + b] += ww * ri2;
          }
        }
      }
      // tr(G^-1 H) by solving G X = H (full symmetric copies), before the LDL' overwrites G
      cr.fill(0); ci.fill(0);
      const tr = traceSolve(gr, gi, hr, hi, kk, cr, ci);
      small(gr, gi, acc);
      const lr = prod.logModulus() + acc[0];
      const li = prod.argument() + acc[1];
      out[0] = -0.5 * li;
      out[1] = 0.5 * lr;
      // i u (sum 1/d - tr) = i u ((sr - tr_r) + i (si - tr_i))
      const ar = sr - tr[0], ai = si - tr[1];
      const dr = -u * ai, di = u * ar;
      out[2] = sign * dr;
      out[3] = sign * di;
    },
  };
}

/** tr(G^-1 H) for complex symmetric G, H given by their lower triangles (k x k, row-major). */
function traceSolve(gr: Float64Array, gi: Float64Array, hr: Float64Array, hi: Float64Array, k: number, ar: Float64Array, ai: Float64Array): [number, number] {
  // augmented [G | H] in full, Gaussian elimination without pivoting (G is accretive)
  const w = 2 * k;
  const mr = new Float64Array(k * w), mi = new Float64Array(k * w);
  for (let a = 0; a < k; a++) {
    for (let b = 0; b < k; b++) {
      const lo = a >= b ? a * k + b : b * k + a;
      mr[a * w + b] = gr[lo]; mi[a * w + b] = gi[lo];
      mr[a * w + k + b] = hr[lo]; mi[a * w + k + b] = hi[lo];
    }
  }
  for (let p = 0; p < k; p++) {
    const pr = mr[p * w + p], pi = mi[p * w + p];
    const dd = pr * pr + pi * pi;
    for (let r = p + 1; r < k; r++) {
      const xr = mr[r * w + p], xi = mi[r * w + p];
      const fr = (xr * pr + xi * pi) / dd, fi = (xi * pr - xr * pi) / dd;
      for (let cI = p; cI < w; cI++) {
        const vr = mr[p * w + cI], vi = mi[p * w + cI];
        mr[r * w + cI] -= fr * vr - fi * vi;
        mi[r * w + cI] -= fr * vi + fi * vr;
      }
    }
  }
  // back substitution for X = G^-1 H; only the diagonal of X is needed but all rows are required
  const xr = ar, xi = ai; // k x k
  for (let col = 0; col < k; col++) {
    for (let r = k - 1; r >= 0; r--) {
      let vr = mr[r * w + k + col], vi = mi[r * w + k + col];
      for (let s = r + 1; s < k; s++) {
        const gR = mr[r * w + s], gI = mi[r * w + s];
        vr -= gR * xr[s * k + col] - gI * xi[s * k + col];
        vi -= gR * xi[s * k + col] + gI * xr[s * k + col];
      }
      const pr = mr[r * w + r], pi = mi[r * w + r];
      const dd = pr * pr + pi * pi;
      xr[r * k + col] = (vr * pr + vi * pi) / dd;
      xi[r * k + col] = (vi * pr - vr * pi) / dd;
    }
  }
  let tr = 0, ti = 0;
  for (let a = 0; a < k; a++) { tr += xr[a * k + a]; ti += xi[a * k + a]; }
  return [tr, ti];
}

/** Options of the DCT route. */
export interface DctOptions {
  /** Target absolute error (default 1e-11 for probabilities, 1e-10 for the density). */
  tolerance?: number;
  /** Maximum number of Gauss-Kronrod panels (default 4000). */
  maxPanels?: number;
}

/** Break points 0, sigma, 2 sigma, 4 sigma, ... up to `upper`. */
function scaledBreaks(upper: number, sigma: number): number[] {
  const breaks = [0];
  let b = sigma;
  while (b < upper) { breaks.push(b); b *= 2; }
  breaks.push(upper);
  return breaks;
}

/**
 * P(Q <= 0) for a DCT form, with an absolute error bound: the cut's tail bound (see the file
 * comment) plus the Gauss-Kronrod estimate plus a rounding allowance.
 *
 * @example
 * ```ts
 * integrateDct(dctForm(eb, 1.8)).p;  // P(d <= 1.8)
 * ```
 */
export function integrateDct(form: DctForm, options: DctOptions = {}): { p: number; errorBound: number; evaluations: number; converged: boolean } {
  const tol = options.tolerance ?? 1e-11;
  if (!(form.maxAbsLambda > 0) || form.m === 0) return { p: 1, errorBound: 0, evaluations: 0, converged: true };
  const out = new Float64Array(2);
  let evaluations = 0;
  const logRho = (u: number): number => { evaluations++; form.evaluate(u, out); return out[1]; };
  const cut = convexityCut(logRho, form.scale, tol / 4, probabilityTailBound);
  const integrand = (u: number): number => {
    if (u === 0) return 0.5 * form.sumLambda;
    form.evaluate(u, out);
    return Math.sin(out[0]) / (u * Math.exp(out[1]));
  };
  const q = adaptiveIntegrate(integrand, scaledBreaks(cut.upper, form.scale), Math.PI * tol * 0.5, options.maxPanels ?? 4000);
  const p = 0.5 - q.value / Math.PI;
  const errorBound = cut.truncation + q.error / Math.PI + 4 * Number.EPSILON;
  return { p: Math.min(1, Math.max(0, p)), errorBound, evaluations: evaluations + q.evaluations, converged: q.converged && errorBound <= 2 * tol };
}

/**
 * P(d <= c) (`lower`) or P(d >= c) (`upper`) by the DCT eigenbasis route, for a design whose
 * operator is a difference operator (any lag, gaps). Each tail is computed directly.
 *
 * @throws DwError ENGINE_NOT_APPLICABLE when the operator is not a union of chains or the shapes disagree
 * @example
 * ```ts
 * dctTail(operator, basis, 1.9, 'lower'); // { p, errorBound, relativeError, method: 'dct' }
 * ```
 */
export function dctTail(a: BandMatrix, basis: ColumnBasis, c: number, tail: Tail, options: DctOptions = {}): TailProbability {
  const eb = requireEigenbasis(a, basis);
  if (!Number.isFinite(c)) {
    throw new DwError('ENGINE_NOT_APPLICABLE', `The point c = ${c} is not a finite number.`, 'Give the value of d at which the probability is wanted.');
  }
  const below = tail === 'lower';
  if (c <= eb.lambdaMin) return exactTail(below ? 0 : 1, 'dct');
  if (c >= eb.lambdaMax) return exactTail(below ? 1 : 0, 'dct');
  const r = integrateDct(dctForm(eb, c, below ? 1 : -1), options);
  return { p: r.p, errorBound: r.errorBound, relativeError: r.p > 0 ? r.errorBound / r.p : Infinity, method: 'dct' };
}

/**
 * The exact density of d at c from the same characteristic form: f(c) is the derivative of
 * P(d <= c) = 1/2 - (1/pi) Integral sin(theta)/(u rho) du in c, i.e.
 *
 *   f(c) = (1/pi) Integral_0^inf [cos(theta) Im L_c + sin(theta) Re L_c] / (2 u rho(u)) du,
 *
 * with L_c = dL/dc = sum_j i u / d_j - i u tr(G^-1 W'D^-2 W) from the same sweep. Since
 * |L_c| <= m u, the integrand is at most m / (2 rho), and the convexity cut above bounds the tail
 * by m U / (2 pi (g - 1) rho(U)) once the secant slope g exceeds 1.
 *
 * @throws DwError ENGINE_NOT_APPLICABLE when the operator is not a union of chains
 * @example
 * ```ts
 * dctDensity(operator, basis, 2).value; // f(2)
 * ```
 */
export function dctDensity(a: BandMatrix, basis: ColumnBasis, c: number, options: DctOptions = {}): { value: number; errorBound: number } {
  const eb = requireEigenbasis(a, basis);
  if (!(c > eb.lambdaMin && c < eb.lambdaMax)) return { value: 0, errorBound: 0 };
  const tol = options.tolerance ?? 1e-10;
  const form = dctForm(eb, c, 1);
  const m = form.m;
  const out = new Float64Array(4);
  const o2 = new Float64Array(2);
  const logRho = (u: number): number => { form.evaluate(u, o2); return o2[1]; };
  const cut = convexityCut(logRho, form.scale, tol / 4, (u, lr, slope) => slope > 1 ? (m * u * Math.exp(-lr)) / (2 * Math.PI * (slope - 1)) : Infinity);
  const f = (u: number): number => {
    if (u === 0) return 0.5 * m; // limit: Im L_c / u -> m, Re L_c -> 0
    form.evaluateWithDerivative(u, out);
    return (Math.cos(out[0]) * out[3] + Math.sin(out[0]) * out[2]) / (2 * u * Math.exp(out[1]));
  };
  const q = adaptiveIntegrate(f, scaledBreaks(cut.upper, form.scale), Math.PI * tol * 0.5, options.maxPanels ?? 4000);
  return { value: Math.max(0, q.value / Math.PI), errorBound: cut.truncation + q.error / Math.PI };
}

function requireEigenbasis(a: BandMatrix, basis: ColumnBasis): DctEigenbasis {
  if (a.n !== basis.n || basis.q.length !== basis.n * basis.k || !(basis.k < basis.n)) {
    throw new DwError('ENGINE_NOT_APPLICABLE', `The operator (n = ${a.n}) and the column basis (n = ${basis.n}, k = ${basis.k}) do not fit together.`,
      'Build A with differenceMatrix and Q from the QR factorisation of the same design.');
  }
  const eb = dctEigenbasis(a, basis);
  if (eb === null) {
    throw new DwError('ENGINE_NOT_APPLICABLE', 'The DCT route needs a difference operator (a union of chains with unit differences); this operator is not one.',
      'Use the eigen-free engine, which takes any band operator.');
  }
  return eb;
}
