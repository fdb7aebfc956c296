/**
 * Markdown rendering of a test result (CommonMark with pipe tables; citations in pandoc's
 * `[@key]` form, resolved against the BibTeX of citations.ts).
 */
import type { DwTestResult } from '../inference/dw-test.js';
import { buildReport, type ReportBlock, type ReportDocument } from './document.js';
import { inline } from './format.js';
import { formatReference } from './citations.js';

function cells(row: string[]): string {
  return `| ${row.join(' | ')} |`;
}

function renderBlock(block: ReportBlock): string {
  const md = (s: string) => inline(s, 'markdown');
  switch (block.kind) {
    case 'para':
      return md(block.text);
    case 'list':
      return block.items.map((i) => `- ${md(i)}`).join('\n');
    case 'references':
      // pandoc users cite the keys of the BibTeX; this list is for readers of the plain file
      return block.keys.map((k) => `- ${formatReference(k, 'markdown')} [${k}]`).join('\n');
    case 'fields':
      return [cells(['Quantity', 'Value']), cells([':--', ':--']), ...block.rows.map(([l, v]) => cells([md(l), md(v)]))].join('\n');
    case 'table':
      return [
        cells(block.head.map((h) => (h === '' ? ' ' : md(h)))),
        cells(block.align.map((a) => (a === 'r' ? '--:' : ':--'))),
        ...block.rows.map((r) => cells(r.map((c) => (c === '' ? ' ' : md(c))))),
      ].join('\n');
  }
}

/**
 * Render a report document as Markdown.
 *
 * @example
 * ```ts
 * const md = renderMarkdownDocument(buildReport(exactDwTest({ y, x })));
 * md.split('\n')[0]; // "# Exact Durbin–Watson test"
 * ```
 */
export function renderMarkdownDocument(doc: ReportDocument): string {
  const parts = [`# ${inline(doc.title, 'markdown')}`, `*${inline(doc.producer, 'markdown')}*`];
  for (const s of doc.sections) {
    parts.push(`## ${inline(s.heading, 'markdown')}`);
    for (const b of s.blocks) parts.push(renderBlock(b));
  }
  return parts.join('\n\n') + '\n';
}

/**
 * A Markdown report of an exact Durbin-Watson test (for a README, an appendix, or pandoc).
 *
 * @example
 * ```ts
 * writeFileSync('dw-report.md', renderMarkdown(exactDwTest({ y, x })));
 * ```
 */
export function renderMarkdown(r: DwTestResult): string {
  return renderMarkdownDocument(buildReport(r));
}
