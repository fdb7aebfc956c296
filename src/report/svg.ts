/**
 * An SVG figure of the exact null density of d for the caller's design. The numbers (the density
 * on a grid refined until its trapezoid integral converges, the plotted range, the density at the
 * marks) come from src/distribution/density-grid.ts; this file only draws them. It is not a
 * histogram. The observed d, the exact
 * critical value(s) and the bounds d_L, d_U are marked, and the rejection region is hatched over
 * grey, so that the figure reads in black and white (every line differs in style, not in colour).
 */
import { DwError } from '../errors.js';
import type { DwTestResult } from '../inference/dw-test.js';
import type { DwNullDistribution } from '../distribution/null-distribution.js';
import { VERSION } from '../version.js';
import { densityCurve, densityRange, type DensityCurve } from '../distribution/density-grid.js';
import { dIsValid } from './citations.js';
import { linearScale, niceStep, polylinePath, stepDecimals, svgNumber, tickValues, xmlEscape } from './scale.js';

/** Re-exported for callers of the report module; computed in src/distribution/density-grid.ts. */
export { densityCurve, type DensityCurve };

/** Options of {@link renderDensitySvg}. */
export interface DensityPlotOptions {
  /** Width of the figure in px (default 640). */
  width?: number;
  /** Height of the plotting panel in px (default 300); the figure adds room for labels and legend. */
  panelHeight?: number;
  /** A heading drawn inside the figure (default none: papers caption figures themselves). */
  title?: string;
  /** Font family (default Helvetica, Arial, sans-serif). */
  fontFamily?: string;
  /** Font size in px (default 12). */
  fontSize?: number;
  /** Prefix of the ids inside the SVG, to keep several figures on one HTML page apart (default 'exact-dw'). */
  idPrefix?: string;
  /** Stop refining the grid when the trapezoid integral changes by less than this (default 2e-8). */
  tolerance?: number;
  /** Most grid intervals (default 8192). */
  maxIntervals?: number;
  /** Start with the XML declaration (default true, for a standalone .svg file; false to inline the figure in HTML). */
  xmlDeclaration?: boolean;
}

/**
 * The plotted range: densityRange of src/distribution/density-grid.ts (the statistics) rounded
 * out to whole axis steps (the drawing).
 *
 * @example
 * ```ts
 * const { distribution } = prepareProblem({ t: [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12] }, 12);
 * plotDomain(distribution, [2.92]); // { domain: [0, 4], step: 1 }
 * ```
 */
export function plotDomain(dist: DwNullDistribution, marks: number[]): { domain: [number, number]; step: number } {
  const [lo, hi] = densityRange(dist, marks);
  const step = niceStep(hi - lo, 6);
  const dec = stepDecimals(step);
  const d0 = Math.max(0, Number((Math.floor(lo / step + 1e-9) * step).toFixed(dec)));
  const d1 = Math.min(4, Number((Math.ceil(hi / step - 1e-9) * step).toFixed(dec)));
  return { domain: [d0, d1], step };
}

/** A piece of a label: plain, italic (a symbol), or a subscript. */
interface Piece { t: string; italic?: boolean; sub?: boolean }

interface Mark {
  id: string;
  value: number;
  label: Piece[];
  kind: 'observed' | 'critical' | 'bound';
}

const STYLE = {
  density: 'fill="none" stroke="#000" stroke-width="1.8" stroke-linejoin="round"',
  observed: 'stroke="#000" stroke-width="1.6"',
  critical: 'stroke="#000" stroke-width="1.3" stroke-dasharray="6 3"',
  bound: 'stroke="#444" stroke-width="1.4" stroke-dasharray="1.2 2.8"',
} as const;

function pieces(label: Piece[], fontSize: number): string {
  let out = '';
  let shifted = false;
  for (const p of label) {
    const attrs: string[] = [];
    if (p.italic) attrs.push('font-style="italic"');
    if (p.sub && !shifted) { attrs.push(`dy="${svgNumber(fontSize * 0.3)}"`, `font-size="${svgNumber(fontSize * 0.75)}"`); shifted = true; }
    else if (p.sub) attrs.push(`font-size="${svgNumber(fontSize * 0.75)}"`);
    else if (shifted) { attrs.push(`dy="${svgNumber(-fontSize * 0.3)}"`); shifted = false; }
    // spaces at the ends of a tspan survive because the figure's text is xml:space="preserve"
    const t = xmlEscape(p.t);
    out += attrs.length ? `<tspan ${attrs.join(' ')}>${t}</tspan>` : t;
  }
  return out;
}

function textWidth(label: Piece[], fontSize: number): number {
  return label.reduce((w, p) => w + [...p.t].length * fontSize * (p.sub ? 0.75 : 1) * 0.58, 0);
}

const D: Piece = { t: 'd', italic: true };

function marksOf(r: DwTestResult): Mark[] {
  const marks: Mark[] = [{ id: 'mark-observed', value: r.d, label: [D], kind: 'observed' }];
  const low = r.alternative !== 'negative';
  const high = r.alternative !== 'positive';
  if (low) marks.push({ id: 'mark-critical-lower', value: r.critical.lower, label: [D, { t: '*' }], kind: 'critical' });
  if (high) marks.push({ id: 'mark-critical-upper', value: r.critical.upper, label: [D, { t: '*' }], kind: 'critical' });
  if (r.bounds) {
    const { dL, dU } = r.bounds;
    if (low) {
      marks.push({ id: 'mark-dL', value: dL, label: [D, { t: 'L', sub: true }], kind: 'bound' });
      marks.push({ id: 'mark-dU', value: dU, label: [D, { t: 'U', sub: true }], kind: 'bound' });
    }
    if (high) {
      marks.push({ id: 'mark-4-dU', value: 4 - dU, label: [{ t: '4 − ' }, D, { t: 'U', sub: true }], kind: 'bound' });
      marks.push({ id: 'mark-4-dL', value: 4 - dL, label: [{ t: '4 − ' }, D, { t: 'L', sub: true }], kind: 'bound' });
    }
  }
  return marks;
}

/**
 * Rows for the mark labels above the panel. Each label starts just right of its line; working from
 * the rightmost mark leftwards, a label goes one row above every label it would overlap, so that
 * no label overlaps another and no mark's line (which stops at its own label) crosses a label.
 * Row 0 is the row next to the panel.
 *
 * @example
 * ```ts
 * labelRows([100, 110, 300], [40, 40, 40]); // [1, 0, 0]: the label at 100 would overlap the one at 110
 * ```
 */
export function labelRows(xs: number[], widths: number[], gap = 6): number[] {
  const order = xs.map((_, i) => i).sort((a, b) => xs[b] - xs[a] || b - a);
  const row = new Array<number>(xs.length).fill(0);
  const done: number[] = [];
  for (const i of order) {
    let r = 0;
    for (const j of done) if (xs[j] < xs[i] + 3 + widths[i] + gap) r = Math.max(r, row[j] + 1);
    row[i] = r;
    done.push(i);
  }
  return row;
}

/**
 * A publication-quality SVG of the exact null density of d for the design of `result`, with the
 * observed d, the exact critical value(s), the bounds d_L and d_U (when the result has them)
 * and the rejection region of the chosen alternative. `distribution` must be the null
 * distribution of the same design: `designDistribution(x, n, options)` (root API) with the
 * regressors, lag and times the test used. Refuses (DwError OPTION_CONFLICT) when the model has a lagged dependent variable, because d is
 * then not a valid test and a figure of its null distribution would mislead.
 *
 * @example
 * ```ts
 * const result = exactDwTest({ y, x });
 * writeFileSync('dw-density.svg', renderDensitySvg(result, designDistribution(x, result.n)));
 * ```
 */
export function renderDensitySvg(result: DwTestResult, distribution: DwNullDistribution, options: DensityPlotOptions = {}): string {
  if (!dIsValid(result)) {
    throw new DwError('OPTION_CONFLICT',
      `The figure of the null distribution of d is not drawn: the regressors include the lagged dependent variable '${result.dynamic!.laggedDependent}', so d is not a valid test here.`,
      "Report Durbin's h or the Breusch-Godfrey test from the report instead, and leave out the figure.");
  }
  const dist = distribution;
  if (dist.m !== result.m || Math.abs(dist.mean - result.nullMean) > 1e-9 * Math.max(1, Math.abs(result.nullMean))) {
    throw new DwError('OPTION_CONFLICT',
      `The distribution given (m = ${dist.m}, mean ${dist.mean.toFixed(6)}) is not that of the tested design (m = ${result.m}, mean ${result.nullMean.toFixed(6)}).`,
      'Pass the null distribution of the same design, e.g. prepareProblem(x, n, options).distribution.');
  }
  const W = options.width ?? 640;
  const PH = options.panelHeight ?? 300;
  const fs = options.fontSize ?? 12;
  const font = options.fontFamily ?? 'Helvetica, Arial, sans-serif';
  const id = options.idPrefix ?? 'exact-dw';
  const marks = marksOf(result);
  const { domain, step } = plotDomain(dist, marks.map((m) => m.value));
  // the density at the ends of the shaded regions and at the observed d, computed with the curve
  const lowerEnd = Math.min(result.critical.lower, domain[1]);
  const upperStart = Math.max(result.critical.upper, domain[0]);
  const extra = [domain[0], lowerEnd, upperStart, domain[1], result.d];
  const curve = densityCurve(dist, domain, options.tolerance, options.maxIntervals, extra);
  const densityOf = (v: number): number => {
    const i = extra.indexOf(v);
    if (i < 0) throw new RangeError('renderDensitySvg: density asked at a point not computed');
    return curve.atPoints[i];
  };

  // y range: the largest density drawn (for m <= 2 the density is unbounded at the ends of the
  // support; then the axis stops at a high quantile of the drawn values and the curve is clipped)
  let ymax = 0;
  for (let i = 0; i < curve.y.length; i++) ymax = Math.max(ymax, curve.y[i]);
  if (dist.m <= 2) {
    const sorted = Array.from(curve.y).sort((p, q) => p - q);
    ymax = Math.min(ymax, 1.5 * sorted[Math.floor(0.95 * (sorted.length - 1))]);
  }
  if (!(ymax > 0)) ymax = 1;
  const ystep = niceStep(ymax, 5);
  const ytop = Math.ceil((ymax * 1.04) / ystep - 1e-9) * ystep;

  // layout: title, label rows above the panel, the panel, the x axis, the legend
  const left = 64;
  const right = 24;
  const panelW = W - left - right;
  const xs = linearScale(domain, [left, left + panelW]);

  // short mark labels in rows above the panel (the numbers are in the legend)
  const widths = marks.map((m) => textWidth(m.label, fs));
  const rows = labelRows(marks.map((m) => xs(m.value)), widths);
  const nRows = marks.length ? Math.max(...rows) + 1 : 0;
  const titleH = options.title ? fs + 14 : 0;
  const rowH = fs + 5;
  const labelBand = nRows * rowH + 6;
  const top = 10 + titleH + labelBand;
  const bottom = top + PH;
  const ys = linearScale([0, ytop], [bottom, top]);

  // legend entries
  const tail = result.alternative === 'two-sided'
    ? `α/2 = ${trim(result.critical.tailLevel)} in each tail`
    : `α = ${trim(result.alpha)}`;
  const three = (x: number) => x.toFixed(3);
  const critText = result.alternative === 'positive' ? three(result.critical.lower)
    : result.alternative === 'negative' ? three(result.critical.upper)
      : `${three(result.critical.lower)} and ${three(result.critical.upper)}`;
  const legend: { sample: string; text: Piece[] }[] = [
    { sample: 'density', text: [{ t: 'exact null density of ' }, D, { t: ` (n = ${result.n}, k = ${result.k})` }] },
    { sample: 'observed', text: [{ t: 'observed ' }, D, { t: ` = ${three(result.d)}` }] },
    { sample: 'critical', text: [{ t: `exact critical value${result.alternative === 'two-sided' ? 's' : ''} ` }, D, { t: `* = ${critText} (${tail})` }] },
  ];
  if (result.bounds) {
    legend.push({
      sample: 'bound', text: [{ t: 'bounds ' }, D, { t: 'L', sub: true }, { t: ` = ${three(result.bounds.dL)}, ` }, D, { t: 'U', sub: true },
        { t: ` = ${three(result.bounds.dU)} (level ${trim(result.bounds.level)})` }],
    });
  }
  legend.push({ sample: 'region', text: [{ t: 'rejection region' }] });
  const sampleW = 28;
  const legendRows: { x: number; entry: (typeof legend)[number] }[][] = [[]];
  let cursor = left;
  for (const e of legend) {
    const w = sampleW + 6 + textWidth(e.text, fs) + 18;
    if (cursor + w > left + panelW && legendRows[legendRows.length - 1].length) { legendRows.push([]); cursor = left; }
    legendRows[legendRows.length - 1].push({ x: cursor, entry: e });
    cursor += w;
  }
  const axisTitleY = bottom + 6 + fs + 4 + fs + 10;
  const legendTop = axisTitleY + 14;
  const legendRowH = fs + 8;
  const H = Math.ceil(legendTop + legendRows.length * legendRowH + 6);

  const out: string[] = [];
  const n4 = (v: number) => svgNumber(v, 4);
  const n2 = (v: number) => svgNumber(v, 2);
  const alt = result.alternative === 'positive' ? 'positive autocorrelation' : result.alternative === 'negative' ? 'negative autocorrelation' : 'two-sided';
  const desc = `Exact null density of the Durbin-Watson statistic d for a design with n = ${result.n}, k = ${result.k} (m = ${result.m}), ` +
    `computed by exact-dw ${VERSION}. Observed d = ${result.d.toFixed(4)}; alternative: ${alt}; ` +
    (result.alternative !== 'negative' ? `exact lower critical value ${result.critical.lower.toFixed(4)}; ` : '') +
    (result.alternative !== 'positive' ? `exact upper critical value ${result.critical.upper.toFixed(4)}; ` : '') +
    (result.bounds ? `bounds d_L = ${result.bounds.dL.toFixed(4)}, d_U = ${result.bounds.dU.toFixed(4)}; ` : '') +
    `the rejection region at ${tail.replace('α', 'alpha')} is hatched.`;
  if (options.xmlDeclaration !== false) out.push('<?xml version="1.0" encoding="UTF-8"?>');
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}" role="img" aria-labelledby="${id}-title ${id}-desc">`);
  out.push(`<title id="${id}-title">${xmlEscape(options.title ?? 'Exact null density of the Durbin-Watson statistic')}</title>`);
  out.push(`<desc id="${id}-desc">${xmlEscape(desc)}</desc>`);
  out.push('<defs>');
  out.push(`<pattern id="${id}-hatch" patternUnits="userSpaceOnUse" width="6" height="6" patternTransform="rotate(45)">` +
    `<rect width="6" height="6" fill="#d9d9d9"/><line x1="0" y1="0" x2="0" y2="6" stroke="#000" stroke-width="1.1"/></pattern>`);
  out.push(`<clipPath id="${id}-panel"><rect x="${left}" y="${n2(top - 1)}" width="${panelW}" height="${n2(PH + 1)}"/></clipPath>`);
  out.push('</defs>');
  out.push(`<rect width="${W}" height="${H}" fill="#fff"/>`);
  out.push(`<g font-family="${xmlEscape(font)}" font-size="${fs}" fill="#000" xml:space="preserve">`);
  if (options.title) out.push(`<text x="${left}" y="${10 + fs}" font-weight="bold">${xmlEscape(options.title)}</text>`);

  // rejection regions (under the curve)
  const region = (rid: string, from: number, to: number) => {
    const px: number[] = [];
    const py: number[] = [];
    px.push(xs(from)); py.push(ys(0));
    const yAt = densityOf;
    px.push(xs(from)); py.push(ys(yAt(from)));
    for (let i = 0; i < curve.x.length; i++) {
      if (curve.x[i] > from && curve.x[i] < to) { px.push(xs(curve.x[i])); py.push(ys(curve.y[i])); }
    }
    px.push(xs(to)); py.push(ys(yAt(to)));
    px.push(xs(to)); py.push(ys(0));
    out.push(`<path id="${id}-${rid}" d="${polylinePath(px, py, 2)} Z" fill="url(#${id}-hatch)" stroke="none" clip-path="url(#${id}-panel)"/>`);
  };
  if (result.alternative !== 'negative' && result.critical.lower > domain[0]) region('rejection-lower', domain[0], lowerEnd);
  if (result.alternative !== 'positive' && result.critical.upper < domain[1]) region('rejection-upper', upperStart, domain[1]);

  // the density
  const cx = Array.from(curve.x, xs);
  const cy = Array.from(curve.y, ys);
  out.push(`<path id="${id}-density" class="density" d="${polylinePath(cx, cy, 4)}" ${STYLE.density} clip-path="url(#${id}-panel)"/>`);

  // axes
  out.push(`<g id="${id}-axes" stroke="#000" stroke-width="1" fill="none">`);
  out.push(`<line x1="${left}" y1="${n2(bottom)}" x2="${left + panelW}" y2="${n2(bottom)}"/>`);
  out.push(`<line x1="${left}" y1="${n2(top)}" x2="${left}" y2="${n2(bottom)}"/>`);
  out.push('</g>');
  const xticks = tickValues(domain[0], domain[1], step);
  const xdec = stepDecimals(step);
  out.push(`<g id="${id}-x-ticks" text-anchor="middle">`);
  for (const v of xticks) {
    const px = n4(xs(v));
    out.push(`<line class="tick-x" x1="${px}" y1="${n2(bottom)}" x2="${px}" y2="${n2(bottom + 5)}" stroke="#000"/>` +
      `<text class="tick-label-x" x="${px}" y="${n2(bottom + 6 + fs)}">${v.toFixed(xdec)}</text>`);
  }
  out.push('</g>');
  const yticks = tickValues(0, ytop, ystep);
  const ydec = stepDecimals(ystep);
  out.push(`<g id="${id}-y-ticks" text-anchor="end">`);
  for (const v of yticks) {
    const py = n4(ys(v));
    out.push(`<line class="tick-y" x1="${left - 5}" y1="${py}" x2="${left}" y2="${py}" stroke="#000"/>` +
      `<text class="tick-label-y" x="${left - 8}" y="${n2(ys(v) + fs * 0.35)}">${v.toFixed(ydec)}</text>`);
  }
  out.push('</g>');
  out.push(`<text x="${n2(left + panelW / 2)}" y="${n2(axisTitleY)}" text-anchor="middle">Durbin–Watson statistic ${pieces([D], fs)}</text>`);
  out.push(`<text x="${n2(16)}" y="${n2((top + bottom) / 2)}" text-anchor="middle" transform="rotate(-90 16 ${n2((top + bottom) / 2)})">Density</text>`);

  // marks: a vertical line from the axis to the mark's label row
  marks.forEach((m, i) => {
    const x = xs(m.value);
    const px = n4(x);
    const labelY = top - 6 - rows[i] * rowH;
    out.push(`<g id="${id}-${m.id}" class="mark mark-${m.kind}">`);
    out.push(`<line x1="${px}" y1="${n2(bottom)}" x2="${px}" y2="${n2(labelY - fs * 0.75)}" ${STYLE[m.kind]}/>`);
    if (m.kind === 'observed') {
      const yd = densityOf(m.value);
      out.push(`<circle cx="${px}" cy="${n2(ys(Math.min(yd, ytop)))}" r="3.2" fill="#000"/>`);
    }
    out.push(`<text x="${n2(x + 3)}" y="${n2(labelY)}">${pieces(m.label, fs)}</text>`);
    out.push('</g>');
  });

  // legend
  out.push(`<g id="${id}-legend">`);
  legendRows.forEach((row, r) => {
    const y = legendTop + r * legendRowH + legendRowH / 2;
    for (const { x, entry } of row) {
      const sx = x;
      const ex = x + sampleW;
      switch (entry.sample) {
        case 'density': out.push(`<line x1="${n2(sx)}" y1="${n2(y)}" x2="${n2(ex)}" y2="${n2(y)}" ${STYLE.density}/>`); break;
        case 'observed':
          out.push(`<line x1="${n2(sx + sampleW / 2)}" y1="${n2(y - 7)}" x2="${n2(sx + sampleW / 2)}" y2="${n2(y + 7)}" ${STYLE.observed}/>`);
          out.push(`<circle cx="${n2(sx + sampleW / 2)}" cy="${n2(y)}" r="3.2" fill="#000"/>`);
          break;
        case 'critical': out.push(`<line x1="${n2(sx)}" y1="${n2(y)}" x2="${n2(ex)}" y2="${n2(y)}" ${STYLE.critical}/>`); break;
        case 'bound': out.push(`<line x1="${n2(sx)}" y1="${n2(y)}" x2="${n2(ex)}" y2="${n2(y)}" ${STYLE.bound}/>`); break;
        default: out.push(`<rect x="${n2(sx + 4)}" y="${n2(y - 6)}" width="${sampleW - 8}" height="12" fill="url(#${id}-hatch)" stroke="#000" stroke-width="0.6"/>`);
      }
      out.push(`<text x="${n2(ex + 6)}" y="${n2(y + fs * 0.35)}">${pieces(entry.text, fs)}</text>`);
    }
  });
  out.push('</g>');
  out.push('</g>');
  out.push('</svg>');
  return out.join('\n') + '\n';
}

function trim(x: number): string {
  return String(Number(x.toPrecision(10)));
}
