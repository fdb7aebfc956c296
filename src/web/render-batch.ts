/**
 * The results of a batch (one exact test per group of rows) as the page shows them: what was
 * tested and how many groups reject, the batch's notes in the tables' words, a table of every
 * group (a group that could not be tested shows its error and what to do in its row), the
 * cautions every batch table carries, and the downloads of the table, which are the bytes the
 * command line writes (src/batch/render.ts, rendered in the worker). Every number is a field of
 * the library's BatchResult, written with the page's formats. Nothing here computes a statistic.
 */
import type { BatchGroup, BatchResult } from '../batch/batch.js';
import { adjustmentWords, batchCautions, batchDecisionWords, batchGroupLabel, batchNoteWords, type BatchDownloads } from './adapter.js';
import { h, symbolText } from './dom.js';
import { formatLevel, formatProbability, formatStatistic } from './format.js';
import { pageHint } from './plain-error.js';
import { ALTERNATIVE_WORDS, card, copyButton, dl, pair, saveButton, statusLine } from './render.js';

const SHORT_ADJUSTMENT = { holm: 'Holm', bh: 'Benjamini-Hochberg' } as const;

/** Shown in a cell that has no value for this group (d not valid there: no p-value). */
const NO_VALUE = '\u2014';

function headline(b: BatchResult): HTMLElement {
  const s = b.summary;
  const alt = ALTERNATIVE_WORDS[b.alternative];
  const on = b.adjust ? ` on the ${SHORT_ADJUSTMENT[b.adjust]}-adjusted p-values` : '';
  const verb = s.rejected === 1 ? 'rejects' : 'reject';
  const text = s.tested === 0
    ? 'No group could be tested.'
    : `${s.rejected} of the ${s.tested} group${s.tested === 1 ? '' : 's'} tested ${verb} "no autocorrelation" in favour of ${alt} at level ${formatLevel(b.alpha)}${on}.`;
  const failed = s.failed > 0 && s.tested > 0 ? ` ${s.failed} could not be tested: the table says why.` : s.tested === 0 ? ' The table says why for each.' : '';
  return h('p', { class: `verdict ${s.rejected > 0 ? 'reject' : 'not-rejected'}`, id: 'batch-verdict' },
    h('strong', {}, `${s.groups} group${s.groups === 1 ? '' : 's'} by ${b.by}. `), text + failed);
}

function summaryCard(b: BatchResult): HTMLElement {
  const s = b.summary;
  return card('The groups', dl([
    pair('groups in the data', String(s.groups), 'summary-groups'),
    pair('tested', String(s.tested), 'summary-tested'),
    pair('could not be tested', String(s.failed), 'summary-failed'),
    pair('rejected', String(s.rejected), 'summary-rejected', b.adjust ? `(on the ${SHORT_ADJUSTMENT[b.adjust]}-adjusted p-values)` : undefined),
    pair('d not valid', String(s.notValid), 'summary-not-valid', '(a lagged dependent variable)'),
    pair('distinct designs', String(s.designs), 'summary-designs', '(groups with the same design share one exact null distribution)'),
  ]));
}

function settingsCard(b: BatchResult): HTMLElement {
  const regressors = b.x.length ? b.x.join(', ') : 'no regressor';
  return card('The test in each group', dl([
    pair('regression', `${b.y} on ${regressors}`, 'batch-model', b.intercept ? '(with an intercept)' : '(no intercept)'),
    pair('alternative', ALTERNATIVE_WORDS[b.alternative], 'batch-alternative'),
    pair('level \u03b1', formatLevel(b.alpha), 'batch-alpha'),
    pair('adjustment', b.adjust ? SHORT_ADJUSTMENT[b.adjust] : 'none', 'batch-adjust', b.adjust ? `(${adjustmentWords(b.adjust)})` : '(each p-value on its own)'),
    pair('time column', b.time ?? 'none', 'batch-time', b.time ? undefined : "(each group's rows are consecutive)"),
    pair('lag', String(b.lag), 'batch-lag'),
  ]));
}

function pCell(p: number | null, g: BatchGroup, b: BatchResult, field: string): HTMLTableCellElement {
  return h('td', { class: 'num', 'data-field': field }, p === null ? NO_VALUE : formatProbability(p, { alpha: b.alpha, errorBound: g.errorBound ?? 0 }));
}

function groupRow(g: BatchGroup, b: BatchResult): HTMLTableRowElement {
  const label = batchGroupLabel(g);
  const row = h('tr', { 'data-group': g.group, class: g.error ? 'failed' : g.decision ?? undefined },
    h('th', { scope: 'row' }, label),
    h('td', { class: 'num', 'data-field': 'n' }, g.n === null ? NO_VALUE : String(g.n)),
    h('td', { class: 'num', 'data-field': 'k' }, g.k === null ? NO_VALUE : String(g.k)));
  if (g.error) {
    row.setAttribute('data-code', g.error.code);
    row.append(
      h('td', { colspan: b.adjust ? 3 : 2, class: 'row-error', 'data-field': 'error' },
        h('span', { class: 'error-message' }, g.error.message), ' ',
        h('span', { class: 'error-hint' }, pageHint(g.error.hint, g.error.suggest))),
      h('td', { 'data-field': 'decision' }, `not tested (${g.error.code})`));
    if (anyDropped(b)) row.append(droppedCell(g));
    return row;
  }
  row.append(h('td', { class: 'num', 'data-field': 'd' }, g.d === null ? NO_VALUE : formatStatistic(g.d)), pCell(g.pValue, g, b, 'p-value'));
  if (b.adjust) row.append(pCell(g.pAdjusted, g, b, 'p-adjusted'));
  row.append(h('td', { 'data-field': 'decision' }, g.decision ? batchDecisionWords(g.decision) : NO_VALUE));
  if (anyDropped(b)) row.append(droppedCell(g));
  return row;
}

function anyDropped(b: BatchResult): boolean {
  return b.groups.some((g) => g.droppedRows !== null);
}

/** The data rows a group lost to missing values (the first 10, then how many more). */
function droppedCell(g: BatchGroup): HTMLTableCellElement {
  const d = g.droppedRows;
  const text = d === null ? NO_VALUE : `${d.rows.slice(0, 10).join(', ')}${d.count > 10 ? `, and ${d.count - 10} more` : ''}`;
  return h('td', { 'data-field': 'rows-dropped' }, text);
}

function groupTable(b: BatchResult): HTMLElement {
  const heads = ['group', 'n', 'k', 'd', 'p-value', ...(b.adjust ? [`adjusted p-value (${SHORT_ADJUSTMENT[b.adjust]})`] : []), 'decision', ...(anyDropped(b) ? ['data rows dropped'] : [])];
  const caption = `Exact Durbin-Watson test of ${b.y} in each of the ${b.summary.groups} groups of ${b.by}`
    + (b.adjust ? `; decisions on the ${SHORT_ADJUSTMENT[b.adjust]}-adjusted p-values` : '; p-values not adjusted for multiple testing');
  return h('section', { class: 'panel', id: 'batch-table-panel' }, h('h3', {}, 'Every group'),
    h('div', { class: 'table-scroll', tabindex: 0, role: 'region', 'aria-labelledby': 'batch-caption' },
      h('table', { class: 'small-table batch-table', id: 'batch-table' },
        h('caption', { id: 'batch-caption' }, caption),
        h('thead', {}, h('tr', {}, ...heads.map((t) => h('th', { scope: 'col' }, t)))),
        h('tbody', {}, ...b.groups.map((g) => groupRow(g, b))))));
}

function downloadsPanel(downloads: BatchDownloads): HTMLElement {
  const status = statusLine();
  return h('section', { class: 'panel', id: 'batch-report-panel' }, h('h3', {}, 'Tables to keep'),
    h('p', { class: 'note' }, 'The same tables as the command line writes for this batch: CSV with every number in full, Markdown, and LaTeX (booktabs).'),
    h('div', { class: 'actions' },
      saveButton('Save the table (CSV)', 'exact-dw-batch.csv', 'text/csv', downloads.csv, 'save-batch-csv'),
      saveButton('Save the table (Markdown)', 'exact-dw-batch.md', 'text/markdown', downloads.markdown, 'save-batch-markdown'),
      saveButton('Save the table (LaTeX)', 'exact-dw-batch.tex', 'application/x-tex', downloads.latex, 'save-batch-latex'),
      saveButton('Save the result (JSON)', 'exact-dw-batch.json', 'application/json', downloads.json, 'save-batch-json'),
      copyButton('Copy the Markdown table', () => downloads.markdown, status, 'copy-batch-markdown'),
      status));
}

/**
 * The whole results view of a batch.
 *
 * @example
 * ```ts
 * body.replaceChildren(renderBatchResult(batch, downloads));
 * ```
 */
export function renderBatchResult(b: BatchResult, downloads: BatchDownloads): DocumentFragment {
  const frag = document.createDocumentFragment();
  frag.append(headline(b));
  if (b.notes.length > 0) {
    frag.append(h('ul', { class: 'warnings', id: 'batch-notes', 'aria-label': 'Notes on these results' },
      ...b.notes.map((n) => h('li', { 'data-code': n.code }, ...symbolText(batchNoteWords(n))))));
  }
  frag.append(h('div', { class: 'cards' }, summaryCard(b), settingsCard(b)));
  frag.append(groupTable(b));
  frag.append(h('p', { class: 'cautions', id: 'batch-cautions' }, batchCautions));
  frag.append(downloadsPanel(downloads));
  return frag;
}
