/**
 * The eigen-free characteristic form under the alternative: the characteristic form of d's
 * distribution under AR(1) (or seasonal) errors from banded factorisations, without eigenvalues,
 * O(n k (k + p)) per evaluation (docs/methods.md sections 5 and 6; Imhof 1961, Biometrika 48, 419-426, for the integral; the Schur-complement and
 * determinant identities are standard linear algebra).
 *
 * With u ~ N(0, S), S the error correlation at the observation times (unit variances; the factor
 * 1 / (1 - rho^2) does not change the sign of a quadratic form), C = M K M, K = sign (A - cI), and
 * L L' = S, the weights are the eigenvalues w_j of L'CL, and Imhof's integrand needs
 *
 *   L(u) = sum_j log(1 - i u w_j) = log det(I - i u L'CL) = log det(P - i u C) - log det P,
 *
 * where P = S^-1 is the tridiagonal precision of src/power/alternative-structure.ts.
 * In the basis U = [Z Q] (Q orthonormal basis of col(X), Z of its complement),
 * V = P - i u C and B = P - i u K share the block Y = Z'BZ, and
 *
 *   det V = det Y det(Sigma),   Sigma = Q'PQ - Q'PZ Y^-1 Z'PQ          (Schur complement of Y in U'VU)
 *   det Y = det B det G,        G = Q'B^-1 Q                            (as in src/engines/eigenfree.ts)
 *   Z Y^-1 Z' = B^-1 - B^-1 Q G^-1 Q' B^-1                            (oblique projection identity)
 *
 * so that, with H = Q'B^-1 PQ and Q'PQ - (PQ)'B^-1(PQ) = -i u (PQ)'B^-1(KQ) (because P - B = i u K),
 *
 *   Sigma = -i u (PQ)'B^-1(KQ) + H' G^-1 H.
 *
 * Neither term cancels against the other at small or at large u. One sweep of the complex band
 * LDL' of B (no pivoting) gives det B and, through Y = L^-1 [Q, PQ, KQ], the three k x k blocks; two
 * k x k complex LDL' finish. L(u) = log det B + log det G + log det Sigma - (the same at u = 0).
 *
 * Branch: B, V and U'VU have Hermitian part P (positive definite), so they are accretive; so are B^-1,
 * its compression G, and Sigma (a Schur complement of an accretive matrix). Every pivot of the three
 * LDL' factorisations is a Schur complement of an accretive matrix, so it has positive real part and
 * its principal logarithm is continuous in u. Their sum is therefore the continuous branch of
 * L(u), and equals 0 at u = 0 (everything is real and positive there). The test file checks it
 * against the weights of the dense route across u.
 */
import { DwError } from '../errors.js';
import type { CharacteristicForm } from '../core/types.js';
import { LAMBDA_FLOOR } from '../engines/eigenfree.js';
import { PivotProduct, smallLogDet } from '../linalg/complex-ldl.js';
import { BandLdl } from '../linalg/band-ldl.js';
import { checkRho } from './weights.js';
import type { AlternativeStructure } from './alternative-structure.js';
import { realSweep } from './alternative-real.js';

/**
 * The eigen-free characteristic form under the alternative, with the facts its constants rest on
 * (see {@link alternativeForm}).
 *
 * @example
 * ```ts
 * const form = alternativeForm(st, 1.9, 0.3);
 * form.m;            // n - k
 * form.lambdaFloor;  // 1e-9 * form.maxAbsLambda
 * ```
 */
export interface AlternativeForm extends CharacteristicForm {
  /** n - k: the number of weights (the k structural zeros of L'CL are left out). */
  dimension: number;
  /**
   * tau with sumLogAbsLambda = (1/2) sum log(w_j^2 + tau^2) = m log tau + Re L(1/tau), an upper
   * bound on sum log|w_j| that keeps Imhof's truncation bound valid also when a weight is zero
   * (the argument of `EigenfreeForm.lambdaFloor` in src/engines/eigenfree.ts holds for any weights).
   */
  lambdaFloor: number;
  rho: number;
  c: number;
  /**
   * psi(beta) = sum_j log(1 + beta w_j) for real beta, or null when some 1 + beta w_j <= 0 (the
   * moment generating function E exp(-(beta/2) Q) = exp(-psi(beta)/2) does not exist there).
   * Feasibility is read off the inertia of the real factorisations (see {@link chernoffTail}).
   */
  logMgf(beta: number): number | null;
}

/**
 * The CharacteristicForm of sign * e'(A - cI)e when the errors follow the process of `st` with
 * parameter rho: weights w_j = eigenvalues of sign L'M(A - cI)ML, LL' = S_rho (unit variances, as
 * in weights.ts). `sign = 1`: P(d <= c | rho) = P(Q <= 0); `sign = -1`: P(d >= c | rho).
 *
 * Constants: m = n - k; sumLambda = trace(C S) = tr(KS) - 2 tr(Q'KSQ) + tr(Q'KQ Q'SQ) exactly,
 * with SQ from the Markov recursions (no solve); maxAbsLambda = ||K|| ||S|| bounded by Gershgorin
 * (|w| <= ||L'|| ||MKM|| ||L|| <= ||K|| ||S||, ||S||_2 <= max row sum of |S|, computed exactly in
 * O(n)); sumLogAbsLambda regularised as in src/engines/eigenfree.ts (from one more evaluation, at
 * u = 1 / tau).
 *
 * Accuracy: theta and log rho agree with the dense route's weights to about 1e-12 relative to
 * 1 + |value| (n = 60..200, lag 1 and 4, gapped times; test/power/power-eigenfree.test.ts); at rho = 0.95
 * the dense weights are the less accurate of the two (against ml-matrix's eigenvalues of L'MCML:
 * 2.5e-12 against 1.2e-13 in theta at u = 1946, seasonal process, n = 80).
 *
 * @param st the structure from {@link alternativeStructure}
 * @param c the point at which a tail probability is wanted
 * @param rho the parameter of the error process, in (-1, 1)
 * @param sign 1 for the lower tail, -1 for the upper tail
 * @throws DwError RHO_OUT_OF_RANGE; ENGINE_NOT_APPLICABLE when c is not finite
 * @example
 * ```ts
 * const form = alternativeForm(st, 1.9, 0.3);
 * integrateImhof(form).p;                          // P(d <= 1.9 | rho = 0.3)
 * integrateImhof(alternativeForm(st, 1.9, 0.3, -1)).p; // P(d >= 1.9 | rho = 0.3)
 * ```
 */
export function alternativeForm(st: AlternativeStructure, c: number, rho: number, sign: 1 | -1 = 1): AlternativeForm {
  checkRho(rho);
  if (!Number.isFinite(c)) {
    throw new DwError('ENGINE_NOT_APPLICABLE', `The point c = ${c} is not a finite number.`, 'Give the value of d at which the probability is wanted.');
  }
  if (sign !== 1 && sign !== -1) {
    throw new DwError('ENGINE_NOT_APPLICABLE', `The sign must be 1 or -1 (got ${String(sign)}).`, 'Use 1 for the lower tail, -1 for the upper tail.');
  }
  const { n, k, m, gaps, a, q, aq } = st;
  const p = a.length - 1;

  // lag-one correlations r_i and 1 - r_i^2 (from expm1, accurate when r_i is near +-1)
  const r = new Float64Array(Math.max(0, n - 1));
  const om = new Float64Array(Math.max(0, n - 1));
  const logAbs = Math.log(Math.abs(rho));
  for (let i = 0; i + 1 < n; i++) {
    const g = gaps[i];
    if (rho === 0 || g === Infinity) { r[i] = 0; om[i] = 1; continue; }
    r[i] = Math.pow(rho, g);
    om[i] = -Math.expm1(2 * g * logAbs);
  }
  // P = S^-1 (tridiagonal in the chosen order)
  const pd = new Float64Array(n);
  const po = new Float64Array(Math.max(0, n - 1));
  for (let i = 0; i < n; i++) {
    pd[i] = (i > 0 ? 1 / om[i - 1] : 1) + (i + 1 < n ? (r[i] * r[i]) / om[i] : 0);
    if (i + 1 < n) po[i] = -r[i] / om[i];
  }
  // K = sign (A - cI) by diagonals
  const kb: Float64Array[] = a.map((b, j) => {
    const out = new Float64Array(b.length);
    for (let t = 0; t < b.length; t++) out[t] = sign * (j === 0 ? b[t] - c : b[t]);
    return out;
  });
  // KQ = sign (AQ - cQ), PQ
  const kq = new Float64Array(n * k);
  for (let i = 0; i < n * k; i++) kq[i] = sign * (aq[i] - c * q[i]);
  const pq = new Float64Array(n * k);
  for (let t = 0; t < n; t++) {
    for (let col = 0; col < k; col++) {
      let v = pd[t] * q[t * k + col];
      if (t > 0) v += po[t - 1] * q[(t - 1) * k + col];
      if (t + 1 < n) v += po[t] * q[(t + 1) * k + col];
      pq[t * k + col] = v;
    }
  }

  // SQ by the Markov recursions: (SQ)_i = q_i + left_i + right_i,
  // left_i = r_{i-1} (q_{i-1} + left_{i-1}), right_i = r_i (q_{i+1} + right_{i+1})
  const sq = new Float64Array(n * k);
  {
    const run = new Float64Array(k);
    for (let t = 0; t < n; t++) {
      for (let col = 0; col < k; col++) {
        if (t > 0) run[col] = r[t - 1] * (q[(t - 1) * k + col] + run[col]);
        sq[t * k + col] = q[t * k + col] + run[col];
      }
    }
    run.fill(0);
    for (let t = n - 1; t >= 0; t--) {
      for (let col = 0; col < k; col++) {
        if (t + 1 < n) run[col] = r[t] * (q[(t + 1) * k + col] + run[col]);
        sq[t * k + col] += run[col];
      }
    }
  }
  // sum w = tr(KS) - 2 tr(Q'K SQ) + tr(Q'KQ Q'SQ); S_{i,i+j} = r_i ... r_{i+j-1} (Markov)
  let trKS = 0;
  for (let t = 0; t < n; t++) trKS += kb[0][t];
  for (let t = 0; t < n; t++) {
    let s = 1;
    for (let j = 1; j <= p && t + j < n; j++) {
      s *= r[t + j - 1];
      if (s === 0) break;
      trKS += 2 * kb[j][t] * s;
    }
  }
  let trKSQ = 0;
  for (let i = 0; i < n * k; i++) trKSQ += kq[i] * sq[i];
  let trSmall = 0;
  for (let x = 0; x < k; x++) {
    for (let y = 0; y < k; y++) {
      let qkq = 0, qsq = 0;
      for (let t = 0; t < n; t++) {
        qkq += q[t * k + x] * kq[t * k + y];
        qsq += q[t * k + y] * sq[t * k + x];
      }
      trSmall += qkq * qsq;
    }
  }
  const sumLambda = trKS - 2 * trKSQ + trSmall;

  // ||S|| <= max row sum of S (all row sums from the Markov recursions)
  let normS = 0;
  {
    const left = new Float64Array(n);
    for (let t = 1; t < n; t++) left[t] = Math.abs(r[t - 1]) * (1 + left[t - 1]);
    let right = 0;
    for (let t = n - 1; t >= 0; t--) {
      if (t + 1 < n) right = Math.abs(r[t]) * (1 + right);
      normS = Math.max(normS, 1 + left[t] + right);
    }
  }
  const normK = Math.max(Math.abs(st.gMax - c), Math.abs(c - st.gMin));
  const maxAbsLambda = normK * normS;
  if (!(maxAbsLambda > 0)) {
    throw new DwError('ENGINE_NOT_APPLICABLE', 'Every weight is zero: A is zero and c = 0, so d has no distribution to integrate.',
      'Check the difference operator; it has no pairs of observations.');
  }

  const sweep = bandSweep(pd, po, kb, q, pq, kq, n, k);
  const res = new Float64Array(2);
  sweep(0, res);
  const f0 = res[0];
  const tau = LAMBDA_FLOOR * maxAbsLambda;
  sweep(1 / tau, res);
  const sumLogAbsLambda = m * Math.log(tau) + (res[0] - f0);

  const real = realSweep(pd, po, kb, q, pq, kq, n, k);
  const real0 = real(0);
  return {
    m,
    dimension: m,
    sumLambda,
    sumLogAbsLambda,
    maxAbsLambda,
    lambdaFloor: tau,
    rho,
    c,
    evaluate(u: number, out: Float64Array): void {
      if (u === 0) { out[0] = 0; out[1] = 0; return; }
      sweep(u, res);
      out[0] = -0.5 * res[1];
      out[1] = 0.5 * (res[0] - f0);
    },
    logMgf(beta: number): number | null {
      const v = real(beta);
      return v === null || real0 === null ? null : v - real0;
    },
  };
}

/** u -> log det B + log det G + log det Sigma (Re into out[0], continuous Im into out[1]). */
type Sweep = (u: number, out: Float64Array) => void;

/**
 * The sweep for the band B = P - iuK (P tridiagonal, K of half-width p), through the shared band
 * LDL' (src/linalg/band-ldl.ts) with R = [Q, PQ, KQ]: the pivots give det B, the rows y of
 * Y = L^-1 R give G = sum y_q y_q' / D (lower), H = sum y_q y_p' / D and J = sum y_p y_k' / D.
 * O(n k^2) time; O(k) memory when B is tridiagonal, L, D and Y (n x 3k) stored otherwise.
 */
function bandSweep(pd: Float64Array, po: Float64Array, kb: Float64Array[],
  q: Float64Array, pq: Float64Array, kq: Float64Array, n: number, k: number): Sweep {
  // R = [Q, PQ, KQ] row by row (row-major n x 3k)
  const w3 = 3 * k;
  const rhs = new Float64Array(n * w3);
  for (let t = 0; t < n; t++) {
    for (let c = 0; c < k; c++) {
      rhs[t * w3 + c] = q[t * k + c]; rhs[t * w3 + k + c] = pq[t * k + c]; rhs[t * w3 + 2 * k + c] = kq[t * k + c];
    }
  }
  const ldl = new BandLdl([pd, po], kb, rhs);
  const kk = k * k;
  const gR = new Float64Array(kk), gI = new Float64Array(kk);
  const hR = new Float64Array(kk), hI = new Float64Array(kk);
  const jR = new Float64Array(kk), jI = new Float64Array(kk);
  const finish = smallFinish(k);
  const acc = new Float64Array(2);
  const prod = new PivotProduct();
  const visit = (rowR: Float64Array, rowI: Float64Array, dr: number, di: number): void => {
    const dd = dr * dr + di * di;
    const ir = dr / dd, ii = -di / dd;
    for (let x = 0; x < k; x++) {
      const ar = rowR[x] * ir - rowI[x] * ii, ai = rowR[x] * ii + rowI[x] * ir; // zq = yq / d
      const br = rowR[k + x] * ir - rowI[k + x] * ii, bi = rowR[k + x] * ii + rowI[k + x] * ir; // zp = yp / d
      const ox = x * k;
      for (let y = 0; y <= x; y++) {
        gR[ox + y] += ar * rowR[y] - ai * rowI[y];
        gI[ox + y] += ar * rowI[y] + ai * rowR[y];
      }
      for (let y = 0; y < k; y++) {
        const vr = rowR[k + y], vi = rowI[k + y];
        hR[ox + y] += ar * vr - ai * vi;
        hI[ox + y] += ar * vi + ai * vr;
        const sr = rowR[2 * k + y], si = rowI[2 * k + y];
        jR[ox + y] += br * sr - bi * si;
        jI[ox + y] += br * si + bi * sr;
      }
    }
  };
  return (u, out) => {
    gR.fill(0); gI.fill(0); hR.fill(0); hI.fill(0); jR.fill(0); jI.fill(0);
    ldl.sweep(1, 0, 0, -u, prod, true, visit); // the running product of the pivots, with a count of turns
    finish(u, gR, gI, hR, hI, jR, jI, acc);
    out[0] = prod.logModulus() + acc[0];
    out[1] = prod.argument() + acc[1];
  };
}

/**
 * The k x k end of an evaluation: log det G + log det Sigma, Sigma = -iu sym(J) + H' G^-1 H, from
 * complex LDL' factorisations without pivoting (G and Sigma are accretive), as sums of the principal
 * logarithms of the pivots. Overwrites its inputs.
 */
function smallFinish(k: number): (u: number, gR: Float64Array, gI: Float64Array, hR: Float64Array, hI: Float64Array,
  jR: Float64Array, jI: Float64Array, out: Float64Array) => void {
  const kk = k * k;
  const xR = new Float64Array(kk), xI = new Float64Array(kk);
  const sR = new Float64Array(kk), sI = new Float64Array(kk);
  const ldl = smallLogDet(k);
  const two = new Float64Array(2);
  return (u, gR, gI, hR, hI, jR, jI, out) => {
    if (k === 0) { out[0] = 0; out[1] = 0; return; }
    // G = L D L' (in place); log det G
    ldl(gR, gI, two);
    let re = two[0], im = two[1];
    // X = G^-1 H: forward (unit L), diagonal, backward (unit L')
    xR.set(hR); xI.set(hI);
    for (let col = 0; col < k; col++) {
      for (let i = 0; i < k; i++) {
        let vr = xR[i * k + col], vi = xI[i * k + col];
        for (let s = 0; s < i; s++) {
          const lr = gR[i * k + s], li = gI[i * k + s];
          const ar = xR[s * k + col], ai = xI[s * k + col];
          vr -= lr * ar - li * ai;
          vi -= lr * ai + li * ar;
        }
        xR[i * k + col] = vr; xI[i * k + col] = vi;
      }
      for (let i = 0; i < k; i++) {
        const dr = gR[i * k + i], di = gI[i * k + i];
        const dd = dr * dr + di * di;
        const vr = xR[i * k + col], vi = xI[i * k + col];
        xR[i * k + col] = (vr * dr + vi * di) / dd;
        xI[i * k + col] = (vi * dr - vr * di) / dd;
      }
      for (let i = k - 1; i >= 0; i--) {
        let vr = xR[i * k + col], vi = xI[i * k + col];
        for (let s = i + 1; s < k; s++) {
          const lr = gR[s * k + i], li = gI[s * k + i];
          const ar = xR[s * k + col], ai = xI[s * k + col];
          vr -= lr * ar - li * ai;
          vi -= lr * ai + li * ar;
        }
        xR[i * k + col] = vr; xI[i * k + col] = vi;
      }
    }
    // Sigma = -iu (J + J')/2 + H' X  (lower triangle)
    for (let a = 0; a < k; a++) {
      for (let b = 0; b <= a; b++) {
        const sjr = 0.5 * (jR[a * k + b] + jR[b * k + a]);
        const sji = 0.5 * (jI[a * k + b] + jI[b * k + a]);
        // (H'X)_{ab} = sum_s H_{sa} X_{sb} and (H'X)_{ba}, averaged (symmetric in exact arithmetic)
        let vr = 0, vi = 0, wr = 0, wi = 0;
        for (let s = 0; s < k; s++) {
          const har = hR[s * k + a], hai = hI[s * k + a];
          const xbr = xR[s * k + b], xbi = xI[s * k + b];
          vr += har * xbr - hai * xbi;
          vi += har * xbi + hai * xbr;
          const hbr = hR[s * k + b], hbi = hI[s * k + b];
          const xar = xR[s * k + a], xai = xI[s * k + a];
          wr += hbr * xar - hbi * xai;
          wi += hbr * xai + hbi * xar;
        }
        // -iu (sjr + i sji) = u sji - i u sjr
        sR[a * k + b] = u * sji + 0.5 * (vr + wr);
        sI[a * k + b] = -u * sjr + 0.5 * (vi + wi);
      }
    }
    ldl(sR, sI, two);
    re += two[0];
    im += two[1];
    out[0] = re;
    out[1] = im;
  };
}

