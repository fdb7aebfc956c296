/**
 * The real counterpart of the eigen-free power sweep (docs/methods.md section 6): for a real beta,
 * log det(P + beta C) - the same at beta = 0 is psi(beta) = sum_j log(1 + beta w_j), the log of the
 * moment generating function behind Chernoff's bound (src/power/chernoff.ts), or null when
 * P + beta C is not positive definite. Positive definiteness is read off the inertia of a real band
 * LDL' without pivoting (Sylvester's law of inertia) and Haynsworth's inertia additivity, as
 * explained below.
 */

/**
 * The real counterpart of the sweeps, for V = P + beta C (beta real): log det V + log det S, or null
 * when V is not positive definite. With B = P + beta K (real, possibly indefinite), Y = Z'BZ = Z'VZ,
 * G = Q'B^-1 Q and Sigma = beta (PQ)'B^-1(KQ) + H'G^-1 H (the Schur complement of Y in U'VU), V is
 * positive definite exactly when Y and Sigma are; by Haynsworth's inertia additivity
 * In(B) = In(Y) + In(G) (the Schur complement of Y in U'BU is G^-1), so Y is positive definite
 * exactly when B and G have the same number of negative pivots. The pivots of a band LDL' without
 * pivoting give the inertia by Sylvester's law (for the tridiagonal case this is the Sturm count,
 * which is backward stable). A zero pivot counts as "not positive definite".
 */
export function realSweep(pd: Float64Array, po: Float64Array, kb: Float64Array[],
  q: Float64Array, pq: Float64Array, kq: Float64Array, n: number, k: number): (beta: number) => number | null {
  const p = kb.length - 1;
  const kk = k * k;
  const w3 = 3 * k;
  const l = new Float64Array(n * p);
  const d = new Float64Array(n);
  const y = new Float64Array(n * w3);
  const w = new Float64Array(p);
  const row = new Float64Array(w3);
  const g = new Float64Array(kk), h = new Float64Array(kk), j3 = new Float64Array(kk);
  const x = new Float64Array(kk), sg = new Float64Array(kk);
  return (beta) => {
    g.fill(0); h.fill(0); j3.fill(0);
    let logAbs = 0;
    let negB = 0;
    for (let t = 0; t < n; t++) {
      const j0 = Math.max(0, t - p);
      for (let col = j0; col < t; col++) {
        const jj = t - col;
        let v = (jj === 1 ? po[col] : 0) + beta * kb[jj][col];
        for (let s = j0; s < col; s++) v -= w[s - j0] * l[col * p + (col - s - 1)];
        w[col - j0] = v;
        l[t * p + (t - col - 1)] = v / d[col];
      }
      let dt = pd[t] + beta * kb[0][t];
      const o3 = t * k;
      for (let c = 0; c < k; c++) { row[c] = q[o3 + c]; row[k + c] = pq[o3 + c]; row[2 * k + c] = kq[o3 + c]; }
      for (let col = j0; col < t; col++) {
        const lv = l[t * p + (t - col - 1)];
        dt -= w[col - j0] * lv;
        if (lv === 0) continue;
        const yo = col * w3;
        for (let c = 0; c < w3; c++) row[c] -= lv * y[yo + c];
      }
      if (!(dt !== 0 && Number.isFinite(dt))) return null;
      if (dt < 0) negB++;
      d[t] = dt;
      y.set(row, t * w3);
      logAbs += Math.log(Math.abs(dt));
      const inv = 1 / dt;
      for (let a = 0; a < k; a++) {
        const za = row[a] * inv, zp = row[k + a] * inv;
        const oa = a * k;
        for (let b = 0; b <= a; b++) g[oa + b] += za * row[b];
        for (let b = 0; b < k; b++) { h[oa + b] += za * row[k + b]; j3[oa + b] += zp * row[2 * k + b]; }
      }
    }
    // G = L D L' (real, in place), its negative pivots
    let negG = 0;
    for (let jj = 0; jj < k; jj++) {
      let dj = g[jj * k + jj];
      for (let s = 0; s < jj; s++) dj -= g[jj * k + s] * g[jj * k + s] * g[s * k + s];
      if (!(dj !== 0 && Number.isFinite(dj))) return null;
      g[jj * k + jj] = dj;
      if (dj < 0) negG++;
      logAbs += Math.log(Math.abs(dj));
      for (let i = jj + 1; i < k; i++) {
        let v = g[i * k + jj];
        for (let s = 0; s < jj; s++) v -= g[i * k + s] * g[jj * k + s] * g[s * k + s];
        g[i * k + jj] = v / dj;
      }
    }
    if (negB !== negG) return null;
    // X = G^-1 H
    x.set(h);
    for (let col = 0; col < k; col++) {
      for (let i = 0; i < k; i++) for (let s = 0; s < i; s++) x[i * k + col] -= g[i * k + s] * x[s * k + col];
      for (let i = 0; i < k; i++) x[i * k + col] /= g[i * k + i];
      for (let i = k - 1; i >= 0; i--) for (let s = i + 1; s < k; s++) x[i * k + col] -= g[s * k + i] * x[s * k + col];
    }
    // Sigma = beta sym(J) + sym(H'X), must be positive definite (Cholesky-type pivots)
    for (let a = 0; a < k; a++) {
      for (let b = 0; b <= a; b++) {
        let v = 0, u = 0;
        for (let s = 0; s < k; s++) { v += h[s * k + a] * x[s * k + b]; u += h[s * k + b] * x[s * k + a]; }
        sg[a * k + b] = 0.5 * beta * (j3[a * k + b] + j3[b * k + a]) + 0.5 * (v + u);
      }
    }
    for (let jj = 0; jj < k; jj++) {
      let dj = sg[jj * k + jj];
      for (let s = 0; s < jj; s++) dj -= sg[jj * k + s] * sg[jj * k + s] * sg[s * k + s];
      if (!(dj > 0 && Number.isFinite(dj))) return null;
      sg[jj * k + jj] = dj;
      logAbs += Math.log(dj);
      for (let i = jj + 1; i < k; i++) {
        let v = sg[i * k + jj];
        for (let s = 0; s < jj; s++) v -= sg[i * k + s] * sg[jj * k + s] * sg[s * k + s];
        sg[i * k + jj] = v / dj;
      }
    }
    return logAbs;
  };
}

