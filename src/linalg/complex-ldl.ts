/**
 * Log-determinants of complex symmetric matrices from LDL' factorisations without pivoting, shared
 * by the eigen-free engine (src/engines/eigenfree.ts) and the eigen-free power route
 * (src/power/eigenfree-power.ts); docs/methods.md section 5. Each pivot has positive real part there
 * (the matrices are accretive: Hermitian part positive definite), so the sum of the principal
 * logarithms of the pivots is the continuous branch of log det (Imhof 1961, Biometrika 48,
 * 419-426, for why the continuous branch is the one the integrand needs). Two pieces:
 *
 * - {@link PivotProduct}: the product of the n pivots of a long band sweep, kept as a normalised
 *   complex number, a log-scale and a count of turns, so that one sweep takes O(1) logarithms;
 * - {@link smallLogDet}: the k x k complex LDL' that finishes an evaluation.
 */

/**
 * The running product of LDL' pivots, normalised now and then so that it neither over- nor
 * underflows: its modulus is exp(logAbs) |p| and its continuous argument arg(p) + 2 pi wind, the
 * turns counted as the product crosses the negative real axis (each pivot must have |arg| < pi/2).
 *
 * @example
 * ```ts
 * const prod = new PivotProduct();
 * prod.push(1, 1, true);   // pivot 1 + i
 * prod.push(2, -1, true);  // pivot 2 - i
 * prod.logModulus();       // log |(1 + i)(2 - i)| = log sqrt(10)
 * prod.argument();         // pi/4 - atan(1/2)
 * prod.reset();            // ready for the next sweep
 * ```
 */
export class PivotProduct {
  private pr = 1;
  private pim = 0;
  private logAbs = 0;
  private wind = 0;

  /** Back to the empty product (1, no turns). */
  reset(): void { this.pr = 1; this.pim = 0; this.logAbs = 0; this.wind = 0; }

  /** Multiply by the pivot dr + i di; count turns only when `countTurns` (else the argument is not kept). */
  push(dr: number, di: number, countTurns: boolean): void {
    const { pr, pim } = this;
    const npr = pr * dr - pim * di;
    const npi = pr * di + pim * dr;
    if (countTurns) {
      if (pim >= 0) { if (npi < 0 && di > 0) this.wind++; } else if (npi >= 0 && di < 0) this.wind--;
    }
    this.pr = npr; this.pim = npi;
    const mag = Math.abs(npr) + Math.abs(npi);
    if (mag > 1e100 || mag < 1e-100) {
      const h = Math.hypot(npr, npi);
      this.logAbs += Math.log(h);
      this.pr = npr / h; this.pim = npi / h;
    }
  }

  /** log |product|. */
  logModulus(): number { return this.logAbs + Math.log(Math.hypot(this.pr, this.pim)); }

  /** The continuous argument of the product (meaningful only if every push counted turns). */
  argument(): number { return principalArg(this.pr, this.pim) + 2 * Math.PI * this.wind; }
}

/**
 * Argument of a complex number in (-pi, pi], with the upper half-plane taken as Im >= 0 (also for
 * a negative zero), matching the turn counting of {@link PivotProduct}: a pivot with |arg| < pi/2
 * moves the running product across the negative real axis exactly when Im changes between >= 0 and
 * < 0 while the pivot turns the same way.
 *
 * @example
 * ```ts
 * principalArg(-1, 0);  // pi
 * principalArg(-1, -0); // pi (Math.atan2(-0, -1) would give -pi)
 * principalArg(0, -1);  // -pi/2
 * ```
 */
export function principalArg(re: number, im: number): number {
  return im >= 0 ? Math.atan2(Math.abs(im), re) : Math.atan2(im, re);
}

/**
 * log det of a k x k complex symmetric matrix (lower triangle of gr, gi, row-major; overwritten by
 * L strictly below the diagonal and D on it) by LDL' without pivoting, as the sum of the principal
 * logarithms of the pivots: Re into out[0], Im into out[1]. Returns a function so that callers
 * build it once per k and call it per evaluation (nothing is allocated per call).
 *
 * @example
 * ```ts
 * const ldl = smallLogDet(2);
 * const gr = Float64Array.from([2, 0, 1, 3]);  // [[2, 1], [1, 3]] (lower triangle used)
 * const gi = new Float64Array(4);
 * const out = new Float64Array(2);
 * ldl(gr, gi, out);  // out[0] = log 5, out[1] = 0
 * ```
 */
export function smallLogDet(k: number): (gr: Float64Array, gi: Float64Array, out: Float64Array) => void {
  return (gr, gi, out) => {
    let re = 0, im = 0;
    for (let j = 0; j < k; j++) {
      // pivot: D_j = G_jj - sum_{s<j} L_js^2 D_s, with L stored over G (strict lower), D on the diagonal
      let dr = gr[j * k + j], di = gi[j * k + j];
      for (let x = 0; x < j; x++) {
        const lr = gr[j * k + x], li = gi[j * k + x];
        const wr = lr * gr[x * k + x] - li * gi[x * k + x]; // L_jx D_x
        const wi = lr * gi[x * k + x] + li * gr[x * k + x];
        dr -= wr * lr - wi * li;
        di -= wr * li + wi * lr;
      }
      gr[j * k + j] = dr; gi[j * k + j] = di;
      re += 0.5 * Math.log(dr * dr + di * di);
      im += Math.atan2(di, dr);
      const dd = dr * dr + di * di;
      for (let i = j + 1; i < k; i++) {
        // L_ij = (G_ij - sum_{s<j} L_is L_js D_s) / D_j
        let vr = gr[i * k + j], vi = gi[i * k + j];
        for (let x = 0; x < j; x++) {
          const ar = gr[i * k + x], ai = gi[i * k + x];
          const br = gr[j * k + x], bi = gi[j * k + x];
          const abr = ar * br - ai * bi, abi = ar * bi + ai * br;
          const xr = gr[x * k + x], xi = gi[x * k + x];
          vr -= abr * xr - abi * xi;
          vi -= abr * xi + abi * xr;
        }
        gr[i * k + j] = (vr * dr + vi * di) / dd;
        gi[i * k + j] = (vi * dr - vr * di) / dd;
      }
    }
    out[0] = re;
    out[1] = im;
  };
}
