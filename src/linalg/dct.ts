/**
 * The orthonormal DCT-II of any length L, in O(L log L):
 *
 *   X_j = s_j sum_{t=0}^{L-1} x_t cos(pi j (t + 1/2) / L),   s_0 = sqrt(1/L), s_j = sqrt(2/L),
 *
 * i.e. X = V'x with V the eigenvectors of the path-graph Laplacian of length L (the chain of a
 * difference operator; docs/methods.md section 10). Makhoul's reordering (J. Makhoul 1980, "A fast
 * cosine transform in one and two dimensions", IEEE Trans. ASSP 28, 27-34) reduces it to one
 * complex FFT of length L: v_t = x_{2t}, v_{L-1-t} = x_{2t+1}, X_j = s_j Re(exp(-i pi j / (2L)) V_j).
 * The FFT is iterative radix-2 for powers of two and Bluestein's chirp-z algorithm (L. I. Bluestein
 * 1970, IEEE Trans. Audio Electroacoust. 18, 451-455) through a power-of-two FFT of length
 * M >= 2L - 1 for any other length; short lengths (L <= 32) use the direct sum with a cosine table.
 * Twiddle factors come from Math.cos/Math.sin of the exact angle (no recurrences), so the error is
 * a small multiple of eps log L relative to ||x||.
 */

/** A DCT-II of one length, with its tables computed once. */
export interface DctPlan {
  /** The length L. */
  length: number;
  /** Write the orthonormal DCT-II of x (length L) into out (length L). x is not changed. */
  transform(x: Float64Array, out: Float64Array): void;
  /** Two transforms for the price of about one (one complex FFT of x1 + i x2). */
  transform2(x1: Float64Array, x2: Float64Array, out1: Float64Array, out2: Float64Array): void;
}

const DIRECT_MAX = 32;

/**
 * A DCT-II plan for length L (any positive integer).
 *
 * @example
 * ```ts
 * const plan = dctPlan(5);
 * const out = new Float64Array(5);
 * plan.transform(Float64Array.of(1, 1, 1, 1, 1), out); // out = [sqrt(5), 0, 0, 0, 0]
 * ```
 */
export function dctPlan(L: number): DctPlan {
  if (!Number.isSafeInteger(L) || L < 1) throw new RangeError(`dctPlan: the length must be a positive integer (got ${L})`);
  if (L <= DIRECT_MAX) return directPlan(L);
  const fft = fftPlan(L);
  const re = new Float64Array(L);
  const im = new Float64Array(L);
  const cr = new Float64Array(L);
  const ci = new Float64Array(L);
  for (let j = 0; j < L; j++) {
    const s = j === 0 ? Math.sqrt(1 / L) : Math.sqrt(2 / L);
    const ang = (-Math.PI * j) / (2 * L);
    cr[j] = s * Math.cos(ang);
    ci[j] = s * Math.sin(ang);
  }
  const half = Math.ceil(L / 2);
  return {
    length: L,
    transform(x, out) {
      for (let t = 0; t < half; t++) re[t] = x[2 * t];
      for (let t = 0; 2 * t + 1 < L; t++) re[L - 1 - t] = x[2 * t + 1];
      im.fill(0);
      fft(re, im);
      for (let j = 0; j < L; j++) out[j] = cr[j] * re[j] - ci[j] * im[j];
    },
    transform2(x1, x2, out1, out2) {
      // z = v1 + i v2; V1_j = (Z_j + conj Z_{L-j}) / 2, V2_j = (Z_j - conj Z_{L-j}) / (2i)
      for (let t = 0; t < half; t++) { re[t] = x1[2 * t]; im[t] = x2[2 * t]; }
      for (let t = 0; 2 * t + 1 < L; t++) { re[L - 1 - t] = x1[2 * t + 1]; im[L - 1 - t] = x2[2 * t + 1]; }
      fft(re, im);
      for (let j = 0; j < L; j++) {
        const r = j === 0 ? 0 : L - j;
        const zr = re[j], zi = im[j], wr = re[r], wi = -im[r]; // Z_j and conj Z_{L-j}
        const ar = 0.5 * (zr + wr), ai = 0.5 * (zi + wi);
        const br = 0.5 * (zi - wi), bi = -0.5 * (zr - wr);
        out1[j] = cr[j] * ar - ci[j] * ai;
        out2[j] = cr[j] * br - ci[j] * bi;
      }
    },
  };
}

function directPlan(L: number): DctPlan {
  const period = 4 * L;
  const table = new Float64Array(period);
  for (let r = 0; r < period; r++) table[r] = Math.cos((Math.PI * r) / (2 * L));
  const plan: DctPlan = {
    length: L,
    transform2(x1, x2, out1, out2) { plan.transform(x1, out1); plan.transform(x2, out2); },
    transform(x, out) {
      for (let j = 0; j < L; j++) {
        // angle index j (2t + 1) mod 4L
        const step = (2 * j) % period;
        let r = j % period;
        let acc = 0;
        for (let t = 0; t < L; t++) {
          acc += table[r] * x[t];
          r += step;
          if (r >= period) r -= period;
        }
        out[j] = (j === 0 ? Math.sqrt(1 / L) : Math.sqrt(2 / L)) * acc;
      }
    },
  };
  return plan;
}

/** In-place forward complex FFT (sum x_t exp(-2 pi i j t / N)) of one length. */
type Fft = (re: Float64Array, im: Float64Array) => void;

function fftPlan(N: number): Fft {
  if ((N & (N - 1)) === 0) return radix2(N);
  const f = smallFactors(N);
  return f === null ? bluestein(N) : mixedRadix(N, f);
}

/**
 * The factors of N (fours first, then primes ascending) when every prime factor is at most
 * MAX_RADIX (a generic radix-p pass costs O(N p)), else null (Bluestein then).
 */
function smallFactors(N: number): number[] | null {
  const out: number[] = [];
  let r = N;
  while (r % 4 === 0) { out.push(4); r /= 4; }
  for (let p = 2; p <= MAX_RADIX && r > 1; p++) {
    while (r % p === 0) { out.push(p); r /= p; }
  }
  return r === 1 ? out : null;
}

/** Largest prime handled by a generic radix pass. */
const MAX_RADIX = 211;

/**
 * Mixed-radix decimation in time (Cooley & Tukey 1965; any product of small factors), out of place
 * into work arrays by recursion over the factors, twiddles from one table of length N.
 */
function mixedRadix(N: number, factors: number[]): Fft {
  const twr = new Float64Array(N);
  const twi = new Float64Array(N);
  for (let e = 0; e < N; e++) { twr[e] = Math.cos((2 * Math.PI * e) / N); twi[e] = -Math.sin((2 * Math.PI * e) / N); }
  const outR = new Float64Array(N);
  const outI = new Float64Array(N);
  const maxP = Math.max(...factors);
  const tr = new Float64Array(maxP), ti = new Float64Array(maxP);
  const rec = (inR: Float64Array, inI: Float64Array, off: number, stride: number, len: number, o: number, level: number): void => {
    if (len === 1) { outR[o] = inR[off]; outI[o] = inI[off]; return; }
    const p = factors[level];
    const m = len / p;
    for (let r = 0; r < p; r++) rec(inR, inI, off + r * stride, stride * p, m, o + r * m, level + 1);
    const step = N / len; // W_len^e = tw[e step]
    if (p === 2) {
      for (let q = 0; q < m; q++) {
        const a = o + q, b = a + m;
        const w = q * step;
        const xr = outR[b] * twr[w] - outI[b] * twi[w];
        const xi = outR[b] * twi[w] + outI[b] * twr[w];
        outR[b] = outR[a] - xr; outI[b] = outI[a] - xi;
        outR[a] += xr; outI[a] += xi;
      }
      return;
    }
    if (p === 4) {
      for (let q = 0; q < m; q++) {
        const i0 = o + q, i1 = i0 + m, i2 = i1 + m, i3 = i2 + m;
        const w1 = q * step, w2 = 2 * w1, w3 = 3 * w1;
        const a0r = outR[i0], a0i = outI[i0];
        const a1r = outR[i1] * twr[w1] - outI[i1] * twi[w1], a1i = outR[i1] * twi[w1] + outI[i1] * twr[w1];
        const a2r = outR[i2] * twr[w2] - outI[i2] * twi[w2], a2i = outR[i2] * twi[w2] + outI[i2] * twr[w2];
        const a3r = outR[i3] * twr[w3] - outI[i3] * twi[w3], a3i = outR[i3] * twi[w3] + outI[i3] * twr[w3];
        const s02r = a0r + a2r, s02i = a0i + a2i, d02r = a0r - a2r, d02i = a0i - a2i;
        const s13r = a1r + a3r, s13i = a1i + a3i, d13r = a1r - a3r, d13i = a1i - a3i;
        outR[i0] = s02r + s13r; outI[i0] = s02i + s13i;
        outR[i2] = s02r - s13r; outI[i2] = s02i - s13i;
        // X1 = d02 - i d13, X3 = d02 + i d13
        outR[i1] = d02r + d13i; outI[i1] = d02i - d13r;
        outR[i3] = d02r - d13i; outI[i3] = d02i + d13r;
      }
      return;
    }
    // generic radix p: X[q + s m] = sum_r W_len^(r (q + s m)) Y_r[q]
    const pStep = N / p; // W_p^e = tw[e pStep]
    for (let q = 0; q < m; q++) {
      for (let r = 0; r < p; r++) {
        const idx = o + q + r * m;
        const w = (r * q * step) % N;
        tr[r] = outR[idx] * twr[w] - outI[idx] * twi[w];
        ti[r] = outR[idx] * twi[w] + outI[idx] * twr[w];
      }
      for (let s = 0; s < p; s++) {
        let xr = 0, xi = 0;
        for (let r = 0; r < p; r++) {
          const w = ((r * s) % p) * pStep;
          xr += tr[r] * twr[w] - ti[r] * twi[w];
          xi += tr[r] * twi[w] + ti[r] * twr[w];
        }
        outR[o + q + s * m] = xr; outI[o + q + s * m] = xi;
      }
    }
  };
  return (re, im) => {
    rec(re, im, 0, 1, N, 0, 0);
    re.set(outR); im.set(outI);
  };
}

function radix2(N: number): Fft {
  const bits = Math.round(Math.log2(N));
  const rev = new Uint32Array(N);
  for (let i = 0; i < N; i++) {
    let r = 0;
    for (let b = 0; b < bits; b++) if (i & (1 << b)) r |= 1 << (bits - 1 - b);
    rev[i] = r;
  }
  const half = N >> 1;
  const wr = new Float64Array(Math.max(1, half));
  const wi = new Float64Array(Math.max(1, half));
  for (let j = 0; j < half; j++) {
    wr[j] = Math.cos((2 * Math.PI * j) / N);
    wi[j] = -Math.sin((2 * Math.PI * j) / N);
  }
  return (re, im) => {
    for (let i = 0; i < N; i++) {
      const r = rev[i];
      if (r > i) {
        let t = re[i]; re[i] = re[r]; re[r] = t;
        t = im[i]; im[i] = im[r]; im[r] = t;
      }
    }
    for (let size = 2; size <= N; size <<= 1) {
      const h = size >> 1;
      const stride = N / size;
      for (let start = 0; start < N; start += size) {
        for (let j = 0, w = 0; j < h; j++, w += stride) {
          const a = start + j, b = a + h;
          const xr = re[b] * wr[w] - im[b] * wi[w];
          const xi = re[b] * wi[w] + im[b] * wr[w];
          re[b] = re[a] - xr; im[b] = im[a] - xi;
          re[a] += xr; im[a] += xi;
        }
      }
    }
  };
}

/** Bluestein: X_j = conj(b_j) sum_t (x_t conj(b_t)) b_{j-t}, b_t = exp(i pi t^2 / N), a cyclic convolution of length M. */
function bluestein(N: number): Fft {
  let M = 1;
  while (M < 2 * N - 1) M <<= 1;
  const inner = radix2(M);
  const br = new Float64Array(N);
  const bi = new Float64Array(N);
  for (let t = 0; t < N; t++) {
    // t^2 mod 2N keeps the angle exact for large t
    const r = (t * t) % (2 * N);
    br[t] = Math.cos((Math.PI * r) / N);
    bi[t] = Math.sin((Math.PI * r) / N);
  }
  // FFT of the chirp, wrapped cyclically
  const fr = new Float64Array(M);
  const fi = new Float64Array(M);
  fr[0] = br[0]; fi[0] = bi[0];
  for (let t = 1; t < N; t++) {
    fr[t] = br[t]; fi[t] = bi[t];
    fr[M - t] = br[t]; fi[M - t] = bi[t];
  }
  inner(fr, fi);
  const ar = new Float64Array(M);
  const ai = new Float64Array(M);
  return (re, im) => {
    ar.fill(0); ai.fill(0);
    for (let t = 0; t < N; t++) {
      // x_t conj(b_t)
      ar[t] = re[t] * br[t] + im[t] * bi[t];
      ai[t] = im[t] * br[t] - re[t] * bi[t];
    }
    inner(ar, ai);
    for (let j = 0; j < M; j++) {
      const xr = ar[j] * fr[j] - ai[j] * fi[j];
      const xi = ar[j] * fi[j] + ai[j] * fr[j];
      // conjugate, so that a forward FFT computes the inverse: ifft(z) = conj(fft(conj z)) / M
      ar[j] = xr; ai[j] = -xi;
    }
    inner(ar, ai);
    for (let j = 0; j < N; j++) {
      const cr = ar[j] / M, ci = -ai[j] / M;
      // times conj(b_j)
      re[j] = cr * br[j] + ci * bi[j];
      im[j] = ci * br[j] - cr * bi[j];
    }
  };
}
