/**
 * The SVG figure of the exact null density: valid XML (parsed by @xmldom/xmldom, a general-purpose
 * XML parser), the drawn density read back through the axis ticks (the scale a reader sees)
 * integrates to 1 within 1e-6, matches a closed form point by point, peaks where the numbers say,
 * and every mark sits at the x position the axis gives for its number.
 *
 * Closed form (published mathematics, see docs/methods.md section 13): with two distinct eigenvalues a
 * (multiplicity p) and b (multiplicity q), d = a + (b - a) B with B ~ Beta(q/2, p/2); the beta
 * density, quantiles and mode come from jstat (a general-purpose library), the mode formula
 * (alpha - 1)/(alpha + beta - 2) is the textbook one.
 */
import { describe, expect, it } from 'vitest';
import { DOMParser, type Element as XmlElement } from '@xmldom/xmldom';
import { renderDensitySvg, densityCurve, plotDomain } from '../../src/report/svg.js';
import { DwNullDistribution } from '../../src/distribution/null-distribution.js';
import { exactDwTest, type DwTestResult } from '../../src/inference/dw-test.js';
import { prepareProblem } from '../../src/problem/problem.js';
import { isDwError } from '../../src/errors.js';
import { jStat, seededNormal } from '../helpers/reference.js';
import { dynamicResult, staticResult } from '../helpers/report-fixtures.js';

/** Parse strictly: any XML error or warning fails the test. */
function parseSvg(svg: string) {
  const problems: string[] = [];
  const doc = new DOMParser({ onError: (level: string, msg: string) => { problems.push(`${level}: ${msg}`); } }).parseFromString(svg, 'image/svg+xml');
  expect(problems).toEqual([]);
  return doc;
}

function all(doc: ReturnType<typeof parseSvg>): XmlElement[] {
  return Array.from(doc.getElementsByTagName('*')) as unknown as XmlElement[];
}

function byId(doc: ReturnType<typeof parseSvg>, id: string): XmlElement {
  const el = all(doc).find((e) => e.getAttribute('id') === id);
  expect(el, `element #${id}`).toBeDefined();
  return el!;
}

/** A least-squares line through (value, pixel) pairs read from the tick labels. */
function scaleFromTicks(doc: ReturnType<typeof parseSvg>, axis: 'x' | 'y') {
  const labels = all(doc).filter((e) => e.getAttribute('class') === `tick-label-${axis}`);
  const lines = all(doc).filter((e) => e.getAttribute('class') === `tick-${axis}`);
  expect(labels.length).toBeGreaterThanOrEqual(3);
  expect(lines.length).toBe(labels.length);
  const v = labels.map((e) => Number(e.textContent));
  const p = lines.map((e) => Number(e.getAttribute(axis === 'x' ? 'x1' : 'y1')));
  const n = v.length;
  const mv = v.reduce((a, b) => a + b) / n;
  const mp = p.reduce((a, b) => a + b) / n;
  let sxy = 0, sxx = 0;
  for (let i = 0; i < n; i++) { sxy += (v[i] - mv) * (p[i] - mp); sxx += (v[i] - mv) ** 2; }
  const slope = sxy / sxx;
  const icept = mp - slope * mv;
  // the ticks are evenly spaced and on one line
  for (let i = 0; i < n; i++) expect(Math.abs(icept + slope * v[i] - p[i])).toBeLessThan(1e-3);
  return { toPx: (x: number) => icept + slope * x, toValue: (px: number) => (px - icept) / slope };
}

/** The drawn density in data coordinates, read through the axes. */
function drawnDensity(doc: ReturnType<typeof parseSvg>): { x: number[]; y: number[] } {
  const path = byId(doc, 'exact-dw-density').getAttribute('d')!;
  const xs = scaleFromTicks(doc, 'x');
  const ys = scaleFromTicks(doc, 'y');
  const pts = [...path.matchAll(/[ML]([-\d.]+) ([-\d.]+)/g)].map((m) => [Number(m[1]), Number(m[2])]);
  expect(pts.length).toBeGreaterThan(500);
  return { x: pts.map((q) => xs.toValue(q[0])), y: pts.map((q) => ys.toValue(q[1])) };
}

function trapezoid(x: number[], y: number[]): number {
  let s = 0;
  for (let i = 1; i < x.length; i++) s += 0.5 * (x[i] - x[i - 1]) * (y[i] + y[i - 1]);
  return s;
}

function markX(doc: ReturnType<typeof parseSvg>, id: string): number {
  const g = byId(doc, `exact-dw-${id}`);
  const line = Array.from(g.getElementsByTagName('line'))[0] as unknown as XmlElement;
  expect(line.getAttribute('x1')).toBe(line.getAttribute('x2'));
  return Number(line.getAttribute('x1'));
}

// ---- the closed-form case: nu = 1 (p = 8 times), 3 (q = 6 times); d = 1 + 2 B, B ~ Beta(3, 4); m = 14
const nu = Float64Array.from([1, 1, 1, 1, 1, 1, 1, 1, 3, 3, 3, 3, 3, 3]);
const betaDist = DwNullDistribution.fromSpectrum(nu);
const A = 3, B = 4; // Beta(q/2, p/2)
const betaPdf = (d: number) => (d <= 1 || d >= 3 ? 0 : jStat.beta.pdf((d - 1) / 2, A, B) / 2);

function betaResult(alternative: DwTestResult['alternative']): DwTestResult {
  const base = staticResult();
  const d = 1.45;
  const pPos = jStat.beta.cdf((d - 1) / 2, A, B);
  const tail = alternative === 'two-sided' ? 0.025 : 0.05;
  return {
    ...base,
    d, n: 16, k: 2, m: 14,
    columns: ['(intercept)', 'x1'],
    coefficients: null, rSquared: null,
    alternative,
    pPositive: pPos, pNegative: 1 - pPos, pTwoSided: 2 * Math.min(pPos, 1 - pPos),
    pValue: alternative === 'positive' ? pPos : alternative === 'negative' ? 1 - pPos : 2 * Math.min(pPos, 1 - pPos),
    critical: { lower: 1 + 2 * jStat.beta.inv(tail, A, B), upper: 1 + 2 * jStat.beta.inv(1 - tail, A, B), tailLevel: tail },
    nullMean: betaDist.mean,
    nullVariance: betaDist.variance,
    bounds: { kPrime: 1, level: tail, dL: 1.31, dU: 1.62, zone: 'inconclusive-positive', outcome: { code: 'BOUNDS_INCONCLUSIVE' as const, d: 1.5, alpha: 0.05, alternative: 'positive' as const, intercept: true, exactP: null, exactPErrorBound: 0 } },
    power: null,
    dynamic: null,
  };
}

describe('density figure, closed form (two distinct eigenvalues: a scaled beta law, jstat)', () => {
  const r = betaResult('positive');
  const svg = renderDensitySvg(r, betaDist);
  const doc = parseSvg(svg);

  it('is valid XML with an svg root in the SVG namespace, a title and a description', () => {
    const root = doc.documentElement!;
    expect(root.nodeName).toBe('svg');
    expect(root.getAttribute('xmlns')).toBe('http://www.w3.org/2000/svg');
    expect(byId(doc, 'exact-dw-title').textContent).toMatch(/Exact null density/);
    expect(byId(doc, 'exact-dw-desc').textContent).toContain('Observed d = 1.4500');
  });
  it('the drawn density equals the beta density (jstat) at every drawn point, to 1e-5', () => {
    const { x, y } = drawnDensity(doc);
    let worst = 0;
    for (let i = 0; i < x.length; i++) worst = Math.max(worst, Math.abs(y[i] - betaPdf(x[i])));
    expect(worst).toBeLessThan(1e-5);
  });
  it('the drawn points integrate to 1 within 1e-6 (trapezoid over the support)', () => {
    const { x, y } = drawnDensity(doc);
    expect(x[0]).toBeLessThanOrEqual(1 + 1e-9);
    expect(x[x.length - 1]).toBeGreaterThanOrEqual(3 - 1e-9);
    expect(Math.abs(trapezoid(x, y) - 1)).toBeLessThan(1e-6);
  });
  it('the mode is at 1 + 2 (A - 1)/(A + B - 2) = 1.8 (beta mode), within one grid step', () => {
    const { x, y } = drawnDensity(doc);
    const i = y.indexOf(Math.max(...y));
    const step = x[i + 1] - x[i];
    expect(Math.abs(x[i] - (1 + (2 * (A - 1)) / (A + B - 2)))).toBeLessThanOrEqual(step);
  });
  it('d, the exact critical value (jstat beta quantile), d_L and d_U sit where the x axis puts those numbers', () => {
    const xs = scaleFromTicks(doc, 'x');
    expect(Math.abs(markX(doc, 'mark-observed') - xs.toPx(r.d))).toBeLessThan(0.01);
    expect(Math.abs(markX(doc, 'mark-critical-lower') - xs.toPx(r.critical.lower))).toBeLessThan(0.01);
    expect(Math.abs(markX(doc, 'mark-dL') - xs.toPx(1.31))).toBeLessThan(0.01);
    expect(Math.abs(markX(doc, 'mark-dU') - xs.toPx(1.62))).toBeLessThan(0.01);
    // the library's own exact quantile agrees with the jstat one, so the mark is the true critical value
    expect(Math.abs(betaDist.quantile(0.05) - r.critical.lower)).toBeLessThan(1e-8);
  });
  it('the observed-d dot sits on the curve, at the beta density of d', () => {
    const g = byId(doc, 'exact-dw-mark-observed');
    const dot = Array.from(g.getElementsByTagName('circle'))[0] as unknown as XmlElement;
    const ys = scaleFromTicks(doc, 'y');
    expect(Math.abs(ys.toValue(Number(dot.getAttribute('cy'))) - betaPdf(r.d))).toBeLessThan(1e-3);
  });
  it('the hatched rejection region runs from the left end of the axis to the critical value, and no upper region for the positive alternative', () => {
    const xs = scaleFromTicks(doc, 'x');
    const region = byId(doc, 'exact-dw-rejection-lower').getAttribute('d')!;
    const px = [...region.matchAll(/[ML]([-\d.]+) /g)].map((m) => Number(m[1]));
    expect(Math.abs(Math.max(...px) - xs.toPx(r.critical.lower))).toBeLessThan(0.01);
    expect(byId(doc, 'exact-dw-rejection-lower').getAttribute('fill')).toBe('url(#exact-dw-hatch)');
    expect(all(doc).some((e) => e.getAttribute('id') === 'exact-dw-rejection-upper')).toBe(false);
  });
  it('reads in black and white: only black, white and greys; the mark lines differ in dash pattern', () => {
    const colours = new Set<string>();
    for (const e of all(doc)) for (const a of ['fill', 'stroke']) { const v = e.getAttribute(a); if (v) colours.add(v); }
    for (const c of colours) {
      if (c === 'none' || c.startsWith('url(#')) continue;
      const m = /^#([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$|^#([0-9a-f])([0-9a-f])([0-9a-f])$/i.exec(c);
      expect(m, `colour ${c}`).not.toBeNull();
      const ch = (m![1] ? [m![1], m![2], m![3]] : [m![4], m![5], m![6]]);
      expect(new Set(ch.map((s) => s.toLowerCase())).size, `grey ${c}`).toBe(1);
    }
    const dash = (id: string) => (Array.from(byId(doc, `exact-dw-${id}`).getElementsByTagName('line'))[0] as unknown as XmlElement).getAttribute('stroke-dasharray') ?? 'solid';
    const styles = [dash('mark-observed'), dash('mark-critical-lower'), dash('mark-dL')];
    expect(new Set(styles).size).toBe(3);
  });
  it('has axis labels, ticks and a legend naming every element', () => {
    const text = all(doc).filter((e) => e.nodeName === 'text').map((e) => e.textContent ?? '').join(' | ');
    expect(text).toMatch(/Durbin–Watson statistic d/);
    expect(text).toMatch(/Density/);
    expect(text).toMatch(/exact null density of d \(n = 16, k = 2\)/);
    expect(text).toMatch(/observed d = 1\.450/);
    expect(text).toMatch(/exact critical value d\* = 1\.\d{3} \(α = 0\.05\)/);
    expect(text).toMatch(/bounds dL = 1\.310, dU = 1\.620 \(level 0\.05\)/);
    expect(text).toMatch(/rejection region/);
  });
  it('is deterministic, and can leave out the XML declaration for inlining in HTML', () => {
    expect(renderDensitySvg(r, betaDist)).toBe(svg);
    expect(svg.startsWith('<?xml version="1.0" encoding="UTF-8"?>\n<svg ')).toBe(true);
    const inline = renderDensitySvg(r, betaDist, { xmlDeclaration: false, idPrefix: 'fig2' });
    expect(inline.startsWith('<svg ')).toBe(true);
    expect(inline).toContain('url(#fig2-hatch)');
    parseSvg(inline);
  });
});

describe('density figure for a real (invented) design, m = 27', () => {
  const z = seededNormal(77);
  const n = 30;
  const trend = Array.from({ length: n }, (_, i) => i + 1);
  const cycle = trend.map((t) => Math.sin(t / 2.5));
  const y = trend.map((t, i) => 5 + 0.2 * t + cycle[i] + z());
  const x = { trend, cycle };
  const r = exactDwTest({ y, x, alternative: 'two-sided' });
  const dist = prepareProblem(x, n).distribution;
  const doc = parseSvg(renderDensitySvg(r, dist));

  it('the drawn points integrate to 1 within 1e-6', () => {
    const { x: xs, y: ys } = drawnDensity(doc);
    expect(Math.abs(trapezoid(xs, ys) - 1)).toBeLessThan(1e-6);
  });
  it('the mode agrees with the maximum of the difference quotient of the exact CDF (an independent route)', () => {
    const { x: xs, y: ys } = drawnDensity(doc);
    const i = ys.indexOf(Math.max(...ys));
    const h = 2e-3;
    const slope = (c: number) => (dist.cdf(c + h) - dist.cdf(c - h)) / (2 * h);
    // golden-section search for the maximum of the CDF's slope around the drawn mode
    let a = xs[i] - 0.1, b = xs[i] + 0.1;
    const g = (Math.sqrt(5) - 1) / 2;
    for (let it = 0; it < 40; it++) {
      const c1 = b - g * (b - a), c2 = a + g * (b - a);
      if (slope(c1) > slope(c2)) b = c2; else a = c1;
    }
    expect(Math.abs(xs[i] - (a + b) / 2)).toBeLessThanOrEqual(xs[i + 1] - xs[i] + 2e-3);
  });
  it('two-sided: both critical values are marked where the axis puts them, with two rejection regions', () => {
    const sx = scaleFromTicks(doc, 'x');
    expect(Math.abs(markX(doc, 'mark-critical-lower') - sx.toPx(r.critical.lower))).toBeLessThan(0.01);
    expect(Math.abs(markX(doc, 'mark-critical-upper') - sx.toPx(r.critical.upper))).toBeLessThan(0.01);
    expect(Math.abs(markX(doc, 'mark-observed') - sx.toPx(r.d))).toBeLessThan(0.01);
    byId(doc, 'exact-dw-rejection-lower');
    byId(doc, 'exact-dw-rejection-upper');
  });
  it('the plotted range leaves out less than 1e-9 of the probability (exact CDF)', () => {
    const { domain } = plotDomain(dist, [r.d, r.critical.lower, r.critical.upper]);
    const c = densityCurve(dist, domain);
    expect(c.outsideMass).toBeLessThan(1e-9);
    expect(c.converged).toBe(true);
  });
});

describe('the negative alternative marks 4 - d_U and 4 - d_L', () => {
  it('at the positions the axis gives', () => {
    const r = { ...betaResult('negative'), d: 2.6, bounds: { kPrime: 1, level: 0.05, dL: 1.31, dU: 1.62, zone: 'no-evidence' as const, outcome: { code: 'BOUNDS_DO_NOT_REJECT' as const, d: 2.6, alpha: 0.05, alternative: 'negative' as const, intercept: true, exactP: null, exactPErrorBound: 0 } } };
    const doc = parseSvg(renderDensitySvg(r, betaDist));
    const sx = scaleFromTicks(doc, 'x');
    expect(Math.abs(markX(doc, 'mark-4-dU') - sx.toPx(4 - 1.62))).toBeLessThan(0.01);
    expect(Math.abs(markX(doc, 'mark-4-dL') - sx.toPx(4 - 1.31))).toBeLessThan(0.01);
    expect(Math.abs(markX(doc, 'mark-critical-upper') - sx.toPx(r.critical.upper))).toBeLessThan(0.01);
    expect(all(doc).some((e) => e.getAttribute('id') === 'exact-dw-mark-dL')).toBe(false);
  });
});

describe('refusals', () => {
  it('a model with a lagged dependent variable gets no figure (DwError OPTION_CONFLICT)', () => {
    let err: unknown;
    try { renderDensitySvg(dynamicResult(), betaDist); } catch (e) { err = e; }
    expect(isDwError(err)).toBe(true);
    expect((err as { code: string }).code).toBe('OPTION_CONFLICT');
    expect((err as Error).message).toMatch(/lagged dependent variable 'sales_lag1'/);
  });
  it('a distribution of another design is refused', () => {
    let err: unknown;
    try { renderDensitySvg(staticResult(), betaDist); } catch (e) { err = e; }
    expect(isDwError(err)).toBe(true);
    expect((err as Error).message).toMatch(/not that of the tested design/);
  });
});
