/**
 * One complex band LDL' sweep without pivoting, B = L D L' (L unit lower band of half-width p, D
 * diagonal; B complex symmetric, not Hermitian: no conjugation), solving Y = L^-1 R for real
 * right-hand sides R row by row (Golub & Van Loan, Matrix Computations, chapter 4 on band and
 * symmetric factorisations; section numbers not quoted, from memory). It is the kernel of the
 * eigen-free engines (docs/methods.md sections 5 and 6): src/engines/eigenfree.ts (B = alpha I +
 * beta S) and src/power/alternative-form.ts (B = P - i u K).
 *
 * The matrix is B = alpha R0 + beta R1 with R0, R1 real symmetric band matrices (by diagonals,
 * given once) and alpha, beta complex (given per sweep), so that no entry is stored per
 * evaluation: the eigen-free engine has R0 = I, R1 = S; the power form R0 = P, R1 = K, alpha = 1,
 * beta = -iu. The sweep pushes every pivot D(t) into a {@link PivotProduct} and either accumulates
 * G = R'B^-1 R = sum_t y_t y_t' / D(t) itself (y_t the rows of Y = L^-1 R; the engine's case) or
 * hands each row y_t with D(t) to a visitor that accumulates its own k x k blocks (the power form's
 * G, H and J). With p = 1 the sweep keeps only the running row (O(width) memory); with p > 1 it
 * stores L, D and Y (O(n (p + width)) memory), as a band forward substitution needs.
 * Without pivoting the factorisation exists when every leading principal minor is non-zero; the
 * callers' matrices are accretive (Hermitian part positive definite), so every pivot has positive
 * real part.
 */
import type { PivotProduct } from './complex-ldl.js';

/**
 * Called once per row t, in order, with the row y_t of Y = L^-1 R (`yR`, `yI`, length `width`)
 * and the pivot D(t) = dr + i di: the caller accumulates its k x k blocks here. The arrays are the
 * sweep's own work arrays: read them, do not keep them.
 */
export type BandRowVisitor = (yR: Float64Array, yI: Float64Array, dr: number, di: number) => void;

/**
 * A band LDL' sweep of fixed size and matrix pencil, its work arrays allocated once.
 *
 * @example
 * ```ts
 * // B = I - i u S (S tridiagonal by diagonals s0, s1), Q row-major n x k: G = Q'B^-1 Q
 * const ldl = new BandLdl('identity', [s0, s1], q);
 * const prod = new PivotProduct();
 * ldl.sweep(1, 0, 0, -u, prod, true);  // no visitor: G = Q'B^-1 Q into ldl.gR, ldl.gI
 * prod.logModulus();                    // log |det B|
 * ```
 */
export class BandLdl {
  readonly n: number;
  /** Half-width of B. */
  readonly p: number;
  /** Number of columns of R. */
  readonly width: number;
  private readonly r0: Float64Array[];
  /** R0 = I: its entries are not read from memory (the eigen-free engine's case). */
  private readonly unit: boolean;
  private readonly r1: Float64Array[];
  private readonly rhs: Float64Array;
  private readonly rowR: Float64Array;
  private readonly rowI: Float64Array;
  /**
   * G = R'B^-1 R (lower triangle, width x width, row-major), accumulated by sweeps run without a
   * visitor (the eigen-free engine's case, kept free of a call per row).
   */
  readonly gR: Float64Array;
  readonly gI: Float64Array;
  // band storage (p > 1): L (n x p, L(t, t-j) at t*p + j-1), D (n), Y (n x width), W (p)
  private readonly lR: Float64Array;
  private readonly lI: Float64Array;
  private readonly dR: Float64Array;
  private readonly dI: Float64Array;
  private readonly yR: Float64Array;
  private readonly yI: Float64Array;
  private readonly wR: Float64Array;
  private readonly wI: Float64Array;

  /**
   * @param r0 R0 by diagonals (r0[j][col] = R0(col + j, col); missing diagonals are zero), or
   *   'identity' for R0 = I
   * @param r1 R1 by diagonals, likewise; the half-width of B is the larger of the two
   * @param rhs R, row-major n x width (blocks of right-hand sides side by side in each row)
   */
  constructor(r0: Float64Array[] | 'identity', r1: Float64Array[], rhs: Float64Array) {
    const n = r1[0].length;
    this.unit = r0 === 'identity';
    if (r0 === 'identity') r0 = [new Float64Array(n).fill(1)];
    const p = Math.max(r0.length, r1.length) - 1;
    const band = p > 1;
    const pad = (r: Float64Array[]): Float64Array[] => {
      const out: Float64Array[] = [];
      for (let j = 0; j <= Math.max(1, p); j++) out.push(r[j] ?? new Float64Array(Math.max(0, n - j)));
      return out;
    };
    this.n = n;
    this.p = p;
    this.width = n === 0 ? 0 : rhs.length / n;
    this.r0 = pad(r0);
    this.r1 = pad(r1);
    this.rhs = rhs;
    const w = this.width;
    this.rowR = new Float64Array(w);
    this.rowI = new Float64Array(w);
    this.gR = new Float64Array(w * w);
    this.gI = new Float64Array(w * w);
    this.lR = new Float64Array(band ? n * p : 0);
    this.lI = new Float64Array(band ? n * p : 0);
    this.dR = new Float64Array(band ? n : 0);
    this.dI = new Float64Array(band ? n : 0);
    this.yR = new Float64Array(band ? n * w : 0);
    this.yI = new Float64Array(band ? n * w : 0);
    this.wR = new Float64Array(Math.max(1, p));
    this.wI = new Float64Array(Math.max(1, p));
  }

  /**
   * Factor B = alpha R0 + beta R1 (alpha = ar + i ai, beta = br + i bi), push its pivots into
   * `prod` (reset first) and visit every row of Y = L^-1 R with its pivot; without a visitor,
   * accumulate G = R'B^-1 R = sum_t y_t y_t' / D(t) into `gR`/`gI` (zeroed first) instead.
   *
   * @param wantArg passed to {@link PivotProduct.push}: track the argument of the product too
   */
  sweep(ar: number, ai: number, br: number, bi: number, prod: PivotProduct, wantArg: boolean, visit?: BandRowVisitor): void {
    prod.reset();
    if (!visit) { this.gR.fill(0); this.gI.fill(0); }
    if (this.p <= 1) this.tridiagonal(ar, ai, br, bi, prod, wantArg, visit);
    else this.band(ar, ai, br, bi, prod, wantArg, visit);
  }

  /** G += (y / d) y' on the lower triangle (complex, no conjugation). */
  private gram(dr: number, di: number): void {
    const { width: w, rowR: yr, rowI: yi, gR: gr, gI: gi } = this;
    const dd = dr * dr + di * di;
    const ir = dr / dd, ii = -di / dd;
    for (let a = 0; a < w; a++) {
      const ur = yr[a] * ir - yi[a] * ii;
      const ui = yr[a] * ii + yi[a] * ir;
      const o = a * w;
      for (let b = 0; b <= a; b++) {
        gr[o + b] += ur * yr[b] - ui * yi[b];
        gi[o + b] += ur * yi[b] + ui * yr[b];
      }
    }
  }

  private tridiagonal(ar: number, ai: number, br: number, bi: number, prod: PivotProduct, wantArg: boolean, visit: BandRowVisitor | undefined): void {
    const { n, width: w, rowR, rowI, rhs } = this;
    const a0 = this.r0[0], a1 = this.r0[1], b0 = this.r1[0], b1 = this.r1[1];
    const unit = this.unit;
    // the previous row of Y stays in rowR/rowI and is overwritten in place: y_t = r_t - l y_{t-1}
    let dpr = 1, dpi = 0;
    for (let t = 0; t < n; t++) {
      const x0 = unit ? 1 : a0[t], s0 = b0[t];
      let dr = ar * x0 + br * s0;
      let di = ai * x0 + bi * s0;
      if (t > 0) {
        const x1 = unit ? 0 : a1[t - 1], s1 = b1[t - 1];
        const er = ar * x1 + br * s1, ei = ai * x1 + bi * s1; // B(t, t-1)
        const den = dpr * dpr + dpi * dpi;
        const lr = (er * dpr + ei * dpi) / den; // l = e / D(t-1)
        const li = (ei * dpr - er * dpi) / den;
        dr -= lr * er - li * ei;
        di -= lr * ei + li * er;
        const o = t * w;
        for (let c = 0; c < w; c++) {
          const ur = rowR[c], ui = rowI[c];
          rowR[c] = rhs[o + c] - (lr * ur - li * ui);
          rowI[c] = -(lr * ui + li * ur);
        }
      } else {
        for (let c = 0; c < w; c++) { rowR[c] = rhs[c]; rowI[c] = 0; }
      }
      if (visit) visit(rowR, rowI, dr, di); else this.gram(dr, di);
      prod.push(dr, di, wantArg);
      dpr = dr; dpi = di;
    }
  }

  private band(ar: number, ai: number, br: number, bi: number, prod: PivotProduct, wantArg: boolean, visit: BandRowVisitor | undefined): void {
    const { n, p, width: w, r0, r1, rhs, rowR, rowI, lR, lI, dR, dI, yR, yI, wR, wI, unit } = this;
    for (let t = 0; t < n; t++) {
      const j0 = Math.max(0, t - p);
      // W(t, col) = B(t, col) - sum_{s < col} W(t, s) L(col, s);  L(t, col) = W(t, col) / D(col)
      for (let col = j0; col < t; col++) {
        const j = t - col;
        const xv = unit ? 0 : r0[j][col], sv = r1[j][col];
        let wr = ar * xv + br * sv, wi = ai * xv + bi * sv;
        for (let x = j0; x < col; x++) {
          const o = col * p + (col - x - 1);
          const xr = wR[x - j0], xi = wI[x - j0];
          wr -= xr * lR[o] - xi * lI[o];
          wi -= xr * lI[o] + xi * lR[o];
        }
        wR[col - j0] = wr; wI[col - j0] = wi;
        const den = dR[col] * dR[col] + dI[col] * dI[col];
        const o = t * p + (t - col - 1);
        lR[o] = (wr * dR[col] + wi * dI[col]) / den;
        lI[o] = (wi * dR[col] - wr * dI[col]) / den;
      }
      // D(t) = B(t,t) - sum W(t, col) L(t, col);  Y(t) = R(t) - sum L(t, col) Y(col)
      const x0 = unit ? 1 : r0[0][t], s0 = r1[0][t];
      let dr = ar * x0 + br * s0, di = ai * x0 + bi * s0;
      const o = t * w;
      for (let c = 0; c < w; c++) { rowR[c] = rhs[o + c]; rowI[c] = 0; }
      for (let col = j0; col < t; col++) {
        const o = t * p + (t - col - 1);
        const lr = lR[o], li = lI[o];
        const xr = wR[col - j0], xi = wI[col - j0];
        dr -= xr * lr - xi * li;
        di -= xr * li + xi * lr;
        if (lr === 0 && li === 0) continue; // a zero multiplier leaves the row as it is
        const yo = col * w;
        for (let c = 0; c < w; c++) {
          const ur = yR[yo + c], ui = yI[yo + c];
          rowR[c] -= lr * ur - li * ui;
          rowI[c] -= lr * ui + li * ur;
        }
      }
      dR[t] = dr; dI[t] = di;
      yR.set(rowR, t * w);
      yI.set(rowI, t * w);
      if (visit) visit(rowR, rowI, dr, di); else this.gram(dr, di);
      prod.push(dr, di, wantArg);
    }
  }
}
