/**
 * The exact null density of d on a grid, for figures: the density is the derivative of the exact
 * CDF by differentiating Imhof's (1961) inversion formula (DwNullDistribution.pdf), evaluated on a
 * uniform grid that is doubled until the trapezoid integral of the points settles (on a uniform
 * grid the trapezoid rule for a density that vanishes smoothly at both ends converges much faster
 * than h^2, by the Euler-Maclaurin formula). The reports only draw what this file computes.
 */
import type { DwNullDistribution } from './null-distribution.js';

/** The density on a grid, in data coordinates. */
export interface DensityCurve {
  /** Points of the curve, ascending in x; zero outside the support of d. */
  x: Float64Array;
  y: Float64Array;
  /** The range of d covered. */
  domain: [number, number];
  /** Exact probability that d falls outside the range (from the CDF). */
  outsideMass: number;
  /** Uniform intervals over the part of the support inside the range. */
  intervals: number;
  /** Trapezoid integral of the curve. */
  trapezoid: number;
  /** True when the last doubling of the grid changed the integral by less than the tolerance. */
  converged: boolean;
  /** The density at the extra points asked for (0 outside the open support), in their order. */
  atPoints: Float64Array;
}

/** Bounds of d for any lag: 0 <= d <= 4. */
const D_MIN = 0;
const D_MAX = 4;

/**
 * The range of d worth showing: the exact mean +/- 6 standard deviations, widened to hold every
 * mark (with 0.3 standard deviations to spare) and until the exact mass outside is below 1e-9,
 * within [0, 4]. A figure rounds it out to its axis steps.
 *
 * @example
 * ```ts
 * densityRange(dist, [r.d, r.critical.lower]); // e.g. [0.61, 3.39]
 * ```
 */
export function densityRange(dist: DwNullDistribution, marks: number[]): [number, number] {
  const [s0, s1] = dist.support;
  const mean = dist.mean;
  const sd = Math.sqrt(dist.variance);
  let lo = Math.max(s0, mean - 6 * sd);
  let hi = Math.min(s1, mean + 6 * sd);
  for (const v of marks) {
    if (!Number.isFinite(v)) continue;
    lo = Math.min(lo, v - 0.3 * sd);
    hi = Math.max(hi, v + 0.3 * sd);
  }
  for (let i = 0; i < 40; i++) {
    const out = (lo > s0 ? dist.cdf(lo) : 0) + (hi < s1 ? dist.sf(hi) : 0);
    if (out <= 1e-9) break;
    lo = Math.max(s0, lo - 0.5 * sd);
    hi = Math.min(s1, hi + 0.5 * sd);
  }
  return [Math.max(D_MIN, lo), Math.min(D_MAX, hi)];
}

/**
 * The exact density at c, 0 on and outside the ends of the support.
 *
 * @example
 * ```ts
 * const { distribution } = prepareProblem({ t: [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12] }, 12);
 * densityAt(distribution, 2); // 0.6829...
 * densityAt(distribution, 0); // 0: below the support
 * ```
 */
export function densityAt(dist: DwNullDistribution, c: number): number {
  const [s0, s1] = dist.support;
  return c <= s0 || c >= s1 ? 0 : dist.pdf(c);
}

/**
 * The exact density of d over `domain` on a uniform grid over the support inside it, doubled
 * until the trapezoid integral settles; `points` are extra abscissae (marks, ends of shaded
 * regions) whose density the figure needs.
 *
 * @example
 * ```ts
 * const c = densityCurve(dist, [0.5, 3.5]);
 * c.trapezoid + c.outsideMass; // 1 within about 1e-8 for m >= 6
 * ```
 */
export function densityCurve(dist: DwNullDistribution, domain: [number, number], tolerance = 2e-8, maxIntervals = 8192, points: number[] = []): DensityCurve {
  const [s0, s1] = dist.support;
  const a = Math.max(domain[0], s0);
  const b = Math.min(domain[1], s1);
  if (!(b > a)) throw new RangeError('densityCurve: the range misses the support');
  const outsideMass = (a > s0 ? dist.cdf(a) : 0) + (b < s1 ? dist.sf(b) : 0);
  let n = 256;
  let ys = new Float64Array(n + 1);
  for (let i = 0; i <= n; i++) ys[i] = dist.pdf(a + ((b - a) * i) / n);
  const trap = (v: Float64Array, h: number) => {
    let s = 0.5 * (v[0] + v[v.length - 1]);
    for (let i = 1; i < v.length - 1; i++) s += v[i];
    return s * h;
  };
  let t = trap(ys, (b - a) / n);
  let converged = false;
  while (n < maxIntervals) {
    const m = 2 * n;
    const next = new Float64Array(m + 1);
    for (let i = 0; i <= n; i++) next[2 * i] = ys[i];
    for (let i = 0; i < n; i++) next[2 * i + 1] = dist.pdf(a + ((b - a) * (2 * i + 1)) / m);
    const t2 = trap(next, (b - a) / m);
    const change = Math.abs(t2 - t);
    ys = next;
    n = m;
    t = t2;
    if (change <= tolerance && n >= 512) { converged = true; break; }
  }
  const xs: number[] = [];
  const yv: number[] = [];
  if (domain[0] < a) { xs.push(domain[0]); yv.push(0); }
  for (let i = 0; i <= n; i++) { xs.push(a + ((b - a) * i) / n); yv.push(ys[i]); }
  if (domain[1] > b) { xs.push(domain[1]); yv.push(0); }
  const atPoints = Float64Array.from(points, (c) => densityAt(dist, c));
  return { x: Float64Array.from(xs), y: Float64Array.from(yv), domain, outsideMass, intervals: n, trapezoid: t, converged, atPoints };
}
