/**
 * The summary table of a batch for a paper or a script: CSV (every number in full, for further
 * work), Markdown, booktabs LaTeX (rounded as in the single reports, src/report/format.ts), and
 * JSON (plain data, numbers in their shortest round-trip form).
 */
import { escapeLatex, escapeMarkdown, fixed, inline, probability } from '../report/format.js';
import { ADJUSTMENT_NAMES, BATCH_ASSUMPTIONS, noteText } from '../report/wording.js';
import { VERSION } from '../version.js';
import type { BatchGroup, BatchResult } from './batch.js';

/** Formats of the batch table. */
export const BATCH_FORMATS = ['markdown', 'csv', 'latex', 'json'] as const;
export type BatchFormat = (typeof BATCH_FORMATS)[number];

/** A group's decision in the words of the tables (also shown by the page). */
export const BATCH_DECISION_WORDS: Readonly<Record<NonNullable<BatchGroup['decision']>, string>> = {
  reject: 'reject',
  'not-rejected': 'not rejected',
  'not-valid': 'd not valid',
};

/** Label of a group in a table (rows without a label get a visible stand-in). */
export function batchGroupLabel(g: BatchGroup): string {
  return g.group === '' ? '(no label)' : g.group;
}

function csvCell(s: string): string {
  return /[",\n\r]/.test(s) || /^\s|\s$/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

const num = (x: number | null): string => (x === null ? '' : String(x));

/**
 * The batch as CSV: one row per group, every number in full.
 *
 * @example
 * ```ts
 * renderBatchCsv(batch).split('\n')[0]; // "group,n,k,d,p_value,p_adjusted,decision,..."
 * ```
 */
export function renderBatchCsv(batch: BatchResult): string {
  // when rows were dropped, one more column lists each group's dropped data rows
  const dropped = batch.groups.some((g) => g.droppedRows !== null);
  const head = ['group', 'n', 'k', 'd', 'p_value', 'p_adjusted', 'decision', 'd_lower_critical', 'd_upper_critical', 'error_bound', 'bounds_zone', 'design', 'error_code', 'error_message', ...(dropped ? ['rows_dropped'] : [])];
  const lines = [head.join(',')];
  for (const g of batch.groups) {
    lines.push([
      csvCell(g.group), num(g.n), num(g.k), num(g.d), num(g.pValue), num(g.pAdjusted), g.decision ?? 'error',
      num(g.critical?.lower ?? null), num(g.critical?.upper ?? null), num(g.errorBound), g.zone ?? '', num(g.design),
      g.error?.code ?? '', csvCell(g.error ? `${g.error.message} ${g.error.hint}`.trim() : ''),
      ...(dropped ? [g.droppedRows ? g.droppedRows.rows.join(' ') : ''] : []),
    ].join(','));
  }
  return lines.join('\n') + '\n';
}

type TableFormat = 'markdown' | 'latex';

function cellP(p: number | null, g: BatchGroup, alpha: number, f: TableFormat): string {
  if (p === null) return '';
  return inline(probability(p, { alpha, errorBound: g.errorBound ?? 0 }), f);
}

function tableRows(batch: BatchResult, f: TableFormat): string[][] {
  const esc = f === 'latex' ? escapeLatex : escapeMarkdown;
  return batch.groups.map((g) => {
    const row = [esc(batchGroupLabel(g)), g.n === null ? '' : String(g.n), g.k === null ? '' : String(g.k), g.d === null ? '' : inline(fixed(g.d, 4), f), cellP(g.pValue, g, batch.alpha, f)];
    if (batch.adjust) row.push(cellP(g.pAdjusted, g, batch.alpha, f));
    row.push(g.error ? esc(`not tested (${g.error.code})`) : esc(BATCH_DECISION_WORDS[g.decision!]));
    return row;
  });
}

function headers(batch: BatchResult, f: TableFormat): string[] {
  const h = f === 'latex'
    ? ['Series', '$n$', '$k$', '$d$', '$p$']
    : ['series', '*n*', '*k*', '*d*', '*p*'];
  if (batch.adjust) h.push(f === 'latex' ? `$p_{\\mathrm{${batch.adjust === 'holm' ? 'Holm' : 'BH'}}}$` : `*p* (${batch.adjust === 'holm' ? 'Holm' : 'BH'})`);
  h.push(f === 'latex' ? 'Decision' : 'decision');
  return h;
}

function caption(batch: BatchResult): string {
  const s = batch.summary;
  const alt = batch.alternative === 'positive' ? 'positive autocorrelation' : batch.alternative === 'negative' ? 'negative autocorrelation' : 'autocorrelation of either sign';
  const parts = [
    `Exact Durbin-Watson tests of ${batch.y} on ${batch.x.length ? batch.x.join(', ') : 'a constant'}${batch.intercept && batch.x.length ? ' with an intercept' : ''}, one per value of ${batch.by}`,
    `alternative: ${alt}, alpha = ${batch.alpha}`,
    batch.adjust ? `p-values adjusted by ${ADJUSTMENT_NAMES[batch.adjust]}` : 'p-values not adjusted for multiple testing',
    `${s.groups} series, ${s.tested} tested, ${s.failed} not tested, ${s.rejected} rejected${s.notValid ? `, ${s.notValid} with d not valid` : ''}`,
  ];
  return parts.join('; ') + '.';
}

/**
 * The batch as a Markdown table with a caption and the notes.
 *
 * @example
 * ```ts
 * renderBatchMarkdown(batch); // "| series | *n* | *k* | *d* | *p* | decision |\n|---|..."
 * ```
 */
export function renderBatchMarkdown(batch: BatchResult): string {
  const h = headers(batch, 'markdown');
  const lines = [
    `| ${h.join(' | ')} |`,
    `|${h.map((_, i) => (i === 0 || i === h.length - 1 ? '---' : '---:')).join('|')}|`,
    ...tableRows(batch, 'markdown').map((r) => `| ${r.join(' | ')} |`),
    '',
    escapeMarkdown(caption(batch)),
  ];
  const failures = batch.groups.filter((g) => g.error);
  if (failures.length) {
    lines.push('', 'Not tested:', '');
    for (const g of failures) lines.push(`- ${escapeMarkdown(batchGroupLabel(g))}: ${escapeMarkdown(`${g.error!.message} ${g.error!.hint}`.trim())} (\`${g.error!.code}\`)`);
  }
  for (const n of batch.notes) if (n.code !== 'BATCH_GROUPS_FAILED') lines.push('', escapeMarkdown(noteText(n)));
  lines.push('', escapeMarkdown(BATCH_ASSUMPTIONS));
  return lines.join('\n') + '\n';
}

/**
 * The batch as a booktabs LaTeX table (needs \usepackage{booktabs}; long batches may want longtable).
 *
 * @example
 * ```ts
 * renderBatchLatex(batch).includes('\\toprule'); // true
 * ```
 */
export function renderBatchLatex(batch: BatchResult): string {
  const h = headers(batch, 'latex');
  const spec = `l${'r'.repeat(h.length - 2)}l`;
  const lines = [
    '% exact-dw batch table; needs \\usepackage{booktabs}',
    '\\begin{table}[htbp]',
    '\\centering',
    `\\caption{${escapeLatex(caption(batch))}}`,
    `\\begin{tabular}{${spec}}`,
    '\\toprule',
    `${h.join(' & ')} \\\\`,
    '\\midrule',
    ...tableRows(batch, 'latex').map((r) => `${r.join(' & ')} \\\\`),
    '\\bottomrule',
    '\\end{tabular}',
  ];
  const notes = [...batch.notes.map(noteText), BATCH_ASSUMPTIONS];
  if (notes.length) lines.push(`\\par\\smallskip\\footnotesize ${notes.map(escapeLatex).join(' ')}`);
  lines.push('\\end{table}');
  return lines.join('\n') + '\n';
}

/**
 * The batch as JSON: settings, `groups: [{ group, n, k, d, pValue, pAdjusted, decision, error, ... }]`,
 * the summary, and the notes as codes with their wording.
 *
 * @example
 * ```ts
 * JSON.parse(renderBatchJson(batch)).summary.failed; // groups that could not be tested
 * ```
 */
export function renderBatchJson(batch: BatchResult): string {
  const groups = batch.groups.map((g) => ({
    group: g.group, rows: g.rows, n: g.n, k: g.k, d: g.d, pValue: g.pValue, pAdjusted: g.pAdjusted, decision: g.decision,
    critical: g.critical, method: g.method, errorBound: g.errorBound, boundsZone: g.zone, droppedRows: g.droppedRows, design: g.design,
    warnings: g.warnings, error: g.error,
  }));
  return JSON.stringify({
    packageVersion: VERSION,
    by: batch.by, y: batch.y, x: batch.x, time: batch.time, intercept: batch.intercept, lag: batch.lag,
    alternative: batch.alternative, alpha: batch.alpha, adjust: batch.adjust,
    summary: batch.summary,
    notes: batch.notes.map((n) => ({ ...n, text: noteText(n) })),
    assumptions: BATCH_ASSUMPTIONS,
    groups,
  }, null, 2) + '\n';
}

/**
 * The batch in one format.
 *
 * @example
 * ```ts
 * renderBatch(exactDwBatch({ table, by: 'shop', y: 'sales' }), 'latex');
 * ```
 */
export function renderBatch(batch: BatchResult, format: BatchFormat): string {
  switch (format) {
    case 'csv': return renderBatchCsv(batch);
    case 'latex': return renderBatchLatex(batch);
    case 'json': return renderBatchJson(batch);
    default: return renderBatchMarkdown(batch);
  }
}
