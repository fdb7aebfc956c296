/**
 * Plain-text rendering of a test result for a terminal or a log: the report of document.ts laid
 * out in 78 columns, with labelled values on dotted leaders and upper-case section headings.
 */
import type { DwTestResult } from '../inference/dw-test.js';
import { buildReport, type ReportBlock, type ReportDocument } from './document.js';
import { inline } from './format.js';
import { formatReference } from './citations.js';

/** Width of a text report. */
export const TEXT_WIDTH = 78;

/**
 * Break `text` into lines of at most `width` characters (longer words stay whole).
 *
 * @example
 * ```ts
 * wrap('the exact null distribution of d', 12); // ['the exact', 'null', 'distribution', 'of d']
 * wrap('a b c d e f', 5, '  ');                 // ['  a b', '  c d', '  e f']
 * ```
 */
export function wrap(text: string, width: number, indent = '', hanging = indent): string[] {
  const words = text.split(/\s+/).filter((w) => w !== '');
  const lines: string[] = [];
  let line = indent;
  let empty = true;
  for (const w of words) {
    if (!empty && line.length + 1 + w.length > width) {
      lines.push(line);
      line = hanging + w;
    } else {
      line += (empty ? '' : ' ') + w;
    }
    empty = false;
  }
  if (!empty || lines.length === 0) lines.push(line);
  return lines;
}

function visible(s: string): number {
  return [...s].length;
}

function pad(s: string, width: number, align: 'l' | 'r'): string {
  const fill = ' '.repeat(Math.max(0, width - visible(s)));
  return align === 'r' ? fill + s : s + fill;
}

function renderBlock(block: ReportBlock): string[] {
  const t = (s: string) => inline(s, 'text');
  switch (block.kind) {
    case 'para':
      return wrap(t(block.text), TEXT_WIDTH, '  ');
    case 'list':
      return block.items.flatMap((item) => wrap(t(item), TEXT_WIDTH, '  - ', '    '));
    case 'references':
      return block.keys.flatMap((k) => wrap(formatReference(k, 'text'), TEXT_WIDTH, '  ', '      '));
    case 'fields': {
      const labels = block.rows.map(([l]) => t(l));
      const labelWidth = Math.min(46, Math.max(...labels.map(visible)));
      const valueCol = 2 + labelWidth + 3;
      const out: string[] = [];
      block.rows.forEach(([, v], i) => {
        const label = labels[i];
        const value = t(v);
        const hang = ' '.repeat(valueCol);
        if (visible(label) > labelWidth) {
          out.push(...wrap(label, TEXT_WIDTH, '  ', '    '));
          out.push(...wrap(value, TEXT_WIDTH, hang, hang));
        } else {
          const lead = `  ${label} ${'.'.repeat(labelWidth - visible(label) + 1)} `;
          out.push(...wrap(value, TEXT_WIDTH, lead, hang));
        }
      });
      return out;
    }
    case 'table': {
      const head = block.head.map(t);
      const rows = block.rows.map((r) => r.map(t));
      const widths = head.map((h, j) => Math.max(visible(h), ...rows.map((r) => visible(r[j]))));
      const line = (cells: string[]) => ('  ' + cells.map((c, j) => pad(c, widths[j], block.align[j])).join('   ')).trimEnd();
      return [line(head), '  ' + widths.map((w) => '-'.repeat(w)).join('   '), ...rows.map(line)];
    }
  }
}

/**
 * Render a report document as plain text.
 *
 * @example
 * ```ts
 * const text = renderTextDocument(buildReport(exactDwTest({ y, x })));
 * text.split('\n')[1]; // "  Exact Durbin-Watson test      ...      exact-dw 0.1.0"
 * ```
 */
export function renderTextDocument(doc: ReportDocument): string {
  const rule = '='.repeat(TEXT_WIDTH);
  const title = inline(doc.title, 'text');
  const producer = inline(doc.producer, 'text');
  const lines = [rule, `  ${title}${' '.repeat(Math.max(1, TEXT_WIDTH - 2 - title.length - producer.length))}${producer}`, rule];
  for (const s of doc.sections) {
    lines.push('', inline(s.heading, 'text').toUpperCase());
    s.blocks.forEach((b, i) => {
      if (i > 0) lines.push('');
      lines.push(...renderBlock(b));
    });
  }
  return lines.join('\n') + '\n';
}

/**
 * A plain-text report of an exact Durbin-Watson test, for a terminal or a log file.
 *
 * @example
 * ```ts
 * process.stdout.write(renderText(exactDwTest({ y, x })));
 * ```
 */
export function renderText(r: DwTestResult): string {
  return renderTextDocument(buildReport(r));
}
