/**
 * A small linear scale with "nice" ticks (steps of 1, 2 or 5 times a power of ten) and an SVG
 * path writer, enough for the density figure without a charting library.
 */

/** A linear map from a data interval onto a pixel interval. */
export interface LinearScale {
  (x: number): number;
  domain: [number, number];
  range: [number, number];
  invert(px: number): number;
}

/**
 * The linear map taking `domain` onto `range` (either may be decreasing, e.g. a y axis).
 *
 * @example
 * ```ts
 * const x = linearScale([0, 4], [60, 620]);
 * x(2); // 340
 * ```
 */
export function linearScale(domain: [number, number], range: [number, number]): LinearScale {
  const [d0, d1] = domain;
  const [r0, r1] = range;
  const k = (r1 - r0) / (d1 - d0);
  const f = ((x: number) => r0 + (x - d0) * k) as LinearScale;
  f.domain = [d0, d1];
  f.range = [r0, r1];
  f.invert = (px: number) => d0 + (px - r0) / k;
  return f;
}

/**
 * A step of 1, 2 or 5 times a power of ten giving about `count` intervals over `span`.
 *
 * @example
 * ```ts
 * niceStep(1.7, 6); // 0.5
 * niceStep(37, 5);  // 10
 * ```
 */
export function niceStep(span: number, count: number): number {
  if (!(span > 0)) return 1;
  const raw = span / count;
  const p = 10 ** Math.floor(Math.log10(raw));
  const f = raw / p;
  return (f <= 1 ? 1 : f <= 2 ? 2 : f <= 5 ? 5 : 10) * p;
}

/**
 * Decimals needed to write multiples of `step` exactly (0.25 -> 2, 0.5 -> 1, 2 -> 0).
 *
 * @example
 * ```ts
 * stepDecimals(0.25); // 2
 * stepDecimals(2);    // 0
 * ```
 */
export function stepDecimals(step: number): number {
  for (let d = 0; d < 12; d++) {
    const s = step * 10 ** d;
    if (Math.abs(s - Math.round(s)) < 1e-9 * Math.max(1, s)) return d;
  }
  return 12;
}

/**
 * The multiples of `step` in [lo, hi] (computed as i * step, so they do not drift).
 *
 * @example
 * ```ts
 * tickValues(0.3, 1.6, 0.2); // [0.4, 0.6, 0.8, 1, 1.2, 1.4, 1.6]
 * ```
 */
export function tickValues(lo: number, hi: number, step: number): number[] {
  const out: number[] = [];
  const i0 = Math.ceil(lo / step - 1e-9);
  const i1 = Math.floor(hi / step + 1e-9);
  const dec = stepDecimals(step);
  for (let i = i0; i <= i1; i++) out.push(Number((i * step).toFixed(dec)));
  return out;
}

/**
 * A number for an SVG attribute: fixed decimals, no "-0", no trailing zeros.
 *
 * @example
 * ```ts
 * svgNumber(3.14159); // "3.14"
 * svgNumber(-0.001);  // "0"
 * ```
 */
export function svgNumber(x: number, decimals = 2): string {
  const s = x.toFixed(decimals);
  const t = s.includes('.') ? s.replace(/0+$/, '').replace(/\.$/, '') : s;
  return t === '-0' ? '0' : t;
}

/**
 * "M x0 y0 L x1 y1 ..." for a polyline through `points` (pixel coordinates).
 *
 * @example
 * ```ts
 * polylinePath([0, 10.5], [20, 5.25]); // "M0 20 L10.5 5.25"
 * ```
 */
export function polylinePath(xs: ArrayLike<number>, ys: ArrayLike<number>, decimals = 2): string {
  const parts: string[] = [];
  for (let i = 0; i < xs.length; i++) parts.push(`${i === 0 ? 'M' : 'L'}${svgNumber(xs[i], decimals)} ${svgNumber(ys[i], decimals)}`);
  return parts.join(' ');
}

/**
 * Escape text for an XML text node or attribute.
 *
 * @example
 * ```ts
 * xmlEscape('a < b & "c"'); // 'a &lt; b &amp; &quot;c&quot;'
 * ```
 */
export function xmlEscape(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&apos;' })[c] as string);
}
