/**
 * A computed table of bounds as text, Markdown, CSV or JSON. Every rendering states the
 * conventions (tableConvention in wording/bounds.ts): k' excludes the intercept, alpha is the one-sided level
 * of the test against positive autocorrelation. Text and Markdown follow the printed tables' shape
 * (rows n, a d_L and a d_U column for each k'); CSV and JSON are long (one row per n, k', alpha).
 */
import { pct } from '../bounds/zone.js';
import type { BoundsTable, BoundsTableCell } from '../bounds/table.js';
import { tableConvention } from './wording/bounds.js';

/** Output formats of a table. */
export type TableFormat = 'text' | 'markdown' | 'csv' | 'json';

/** The CSV header: the names carry the conventions, since CSV has no place for a note. */
export const CSV_HEADER = ['n', 'k_prime_excl_intercept', 'alpha_one_sided_positive', 'd_L', 'd_U', 'intercept'] as const;

/** How many k' columns the text layout puts side by side (it fits 80 columns). */
const TEXT_GROUP = 5;

/**
 * Render a table; `digits` decimals for d_L and d_U (default 3, as printed tables).
 *
 * @example
 * ```ts
 * renderBoundsTable(boundsTable({ n: [20], kPrime: [1], alpha: [0.05] }), 'csv');
 * // "n,k_prime_excl_intercept,alpha_one_sided_positive,d_L,d_U,intercept\n20,1,0.05,1.201,1.411,true\n"
 * ```
 */
export function renderBoundsTable(table: BoundsTable, format: TableFormat, digits = 3): string {
  switch (format) {
    case 'csv': return csv(table, digits);
    case 'json': return json(table, digits);
    case 'markdown': return markdown(table, digits);
    default: return text(table, digits);
  }
}

function title(table: BoundsTable, alpha: number): string {
  return `Durbin-Watson bounds at alpha = ${alpha} (${pct(alpha)} one-sided, test against positive autocorrelation), model ${table.intercept ? 'with' : 'without'} intercept`;
}

function lookup(table: BoundsTable): Map<string, BoundsTableCell> {
  const map = new Map<string, BoundsTableCell>();
  for (const c of table.cells) map.set(`${c.alpha}|${c.n}|${c.kPrime}`, c);
  return map;
}

function csv(table: BoundsTable, digits: number): string {
  const lines = [CSV_HEADER.join(',')];
  for (const c of table.cells) {
    lines.push([c.n, c.kPrime, c.alpha, c.dL.toFixed(digits), c.dU.toFixed(digits), table.intercept].join(','));
  }
  return lines.join('\n') + '\n';
}

function json(table: BoundsTable, digits: number): string {
  const round = (x: number) => Number(x.toFixed(digits));
  return JSON.stringify({
    title: 'Durbin-Watson bounds d_L, d_U (exact quantiles of the bounding distributions)',
    convention: tableConvention(table.intercept),
    definitions: {
      kPrime: 'regressors other than the intercept',
      alpha: 'one-sided level of the test against positive autocorrelation',
      dL: 'reject no autocorrelation when d < dL, whatever the regressors',
      dU: 'the bounds test does not reject (against positive autocorrelation) when d > dU, whatever the regressors',
    },
    alternative: 'positive',
    intercept: table.intercept,
    digits,
    n: table.n,
    kPrime: table.kPrime,
    alpha: table.alpha,
    skipped: table.skipped,
    cells: table.cells.map((c) => ({ n: c.n, kPrime: c.kPrime, alpha: c.alpha, dL: round(c.dL), dU: round(c.dU) })),
  }, null, 2) + '\n';
}

function markdown(table: BoundsTable, digits: number): string {
  const map = lookup(table);
  const out: string[] = [];
  for (const a of table.alpha) {
    out.push(`## ${title(table, a)}`, '');
    out.push(`Note: ${tableConvention(table.intercept).join(' ')}`, '');
    out.push(`| n | ${table.kPrime.map((k) => `k'=${k} d_L | k'=${k} d_U`).join(' | ')} |`);
    out.push(`|---:|${table.kPrime.map(() => '---:|---:').join('|')}|`);
    for (const n of table.n) {
      const row = table.kPrime.map((k) => {
        const c = map.get(`${a}|${n}|${k}`);
        return c ? `${c.dL.toFixed(digits)} | ${c.dU.toFixed(digits)}` : '- | -';
      });
      out.push(`| ${n} | ${row.join(' | ')} |`);
    }
    out.push('');
  }
  return out.join('\n');
}

function text(table: BoundsTable, digits: number): string {
  const map = lookup(table);
  const w = digits + 3;
  const out: string[] = [];
  for (const a of table.alpha) {
    out.push(title(table, a));
    for (const line of tableConvention(table.intercept)) out.push(`  ${line}`);
    out.push('');
    for (let g = 0; g < table.kPrime.length; g += TEXT_GROUP) {
      const ks = table.kPrime.slice(g, g + TEXT_GROUP);
      out.push(`${''.padStart(6)}${ks.map((k) => `k'=${k}`.padStart(w) + ''.padStart(w + 1)).join('  ')}`.trimEnd());
      out.push(`${'n'.padStart(5)} ${ks.map(() => `${'d_L'.padStart(w)} ${'d_U'.padStart(w)}`).join('  ')}`);
      for (const n of table.n) {
        if (!ks.some((k) => map.has(`${a}|${n}|${k}`))) continue;
        const cells = ks.map((k) => {
          const c = map.get(`${a}|${n}|${k}`);
          return c ? `${c.dL.toFixed(digits).padStart(w)} ${c.dU.toFixed(digits).padStart(w)}` : `${'-'.padStart(w)} ${'-'.padStart(w)}`;
        });
        out.push(`${String(n).padStart(5)} ${cells.join('  ')}`);
      }
      out.push('');
    }
  }
  return out.join('\n');
}
