/**
 * LaTeX rendering of a test result: a complete article that compiles with pdflatex, lualatex or
 * xelatex using only the base LaTeX distribution, or (standalone: false) the body alone, to
 * \input into a paper. Citations are \cite keys of the BibTeX from citations.ts.
 */
import type { DwTestResult } from '../inference/dw-test.js';
import { buildReport, type ReportBlock, type ReportDocument } from './document.js';
import { inline } from './format.js';
import { formatReference } from './citations.js';

/** Options of {@link renderLatex}. */
export interface LatexOptions {
  /**
   * A complete document with preamble (default true); false gives the sections alone, for
   * \input{...} inside a paper.
   */
  standalone?: boolean;
}

function renderBlock(block: ReportBlock, standalone: boolean): string {
  const tex = (s: string) => inline(s, 'latex');
  switch (block.kind) {
    case 'para':
      return tex(block.text);
    case 'references':
      // a standalone report carries its own bibliography; a fragment relies on the paper's .bib
      if (!standalone) return `% cited keys: ${block.keys.join(', ')} (BibTeX from exact-dw test --cite)`;
      return [
        `\\begin{thebibliography}{${block.keys.length}}`,
        ...block.keys.map((k) => `  \\bibitem{${k}} ${formatReference(k, 'latex')}`),
        '\\end{thebibliography}',
      ].join('\n');
    case 'list':
      return ['\\begin{itemize}', ...block.items.map((i) => `  \\item ${tex(i)}`), '\\end{itemize}'].join('\n');
    case 'fields':
      return [
        '\\begin{tabular}{@{}>{\\raggedright\\arraybackslash}p{0.56\\linewidth}>{\\raggedright\\arraybackslash}p{0.4\\linewidth}@{}}',
        ...block.rows.map(([l, v]) => `  ${tex(l)} & ${tex(v)} \\\\`),
        '\\end{tabular}',
      ].join('\n');
    case 'table':
      return [
        `\\begin{tabular}{${block.align.join('')}}`,
        '  \\hline',
        `  ${block.head.map(tex).join(' & ')} \\\\`,
        '  \\hline',
        ...block.rows.map((r) => `  ${r.map(tex).join(' & ')} \\\\`),
        '  \\hline',
        '\\end{tabular}',
      ].join('\n');
  }
}

/**
 * Render a report document as LaTeX.
 *
 * @example
 * ```ts
 * const tex = renderLatexDocument(buildReport(exactDwTest({ y, x })));
 * writeFileSync('dw-report.tex', tex);
 * ```
 */
export function renderLatexDocument(doc: ReportDocument, options: LatexOptions = {}): string {
  const body: string[] = [
    `\\section*{${inline(doc.title, 'latex')}}`,
    `\\noindent\\textit{${inline(doc.producer, 'latex')}}`,
  ];
  const standalone = options.standalone !== false;
  for (const s of doc.sections) {
    // thebibliography sets its own heading
    const refs = s.blocks.length === 1 && s.blocks[0].kind === 'references';
    if (!refs) body.push(`\\subsection*{${inline(s.heading, 'latex')}}`);
    s.blocks.forEach((b, i) => {
      const tex = renderBlock(b, standalone);
      // tabulars and lists start flush left; paragraphs after the first are separated by a blank line
      body.push(b.kind === 'para' || i === 0 ? tex : `\\par\\medskip\\noindent\n${tex}`);
    });
  }
  const text = body.join('\n\n');
  if (!standalone) return `% Report written by exact-dw, to \\input into a document that loads the array package.\n${text}\n`;
  return [
    '% Report written by exact-dw; compiles with pdflatex, lualatex or xelatex.',
    '% Citation keys refer to the BibTeX entries printed by exact-dw test --cite (or --bib FILE).',
    '\\documentclass[11pt]{article}',
    '\\usepackage[T1]{fontenc}',
    '\\usepackage[utf8]{inputenc}',
    '\\usepackage{array}',
    '\\setlength{\\parindent}{0pt}',
    '\\setlength{\\parskip}{0.6ex}',
    '\\begin{document}',
    '',
    text,
    '',
    '\\end{document}',
    '',
  ].join('\n');
}

/**
 * A LaTeX report of an exact Durbin-Watson test.
 *
 * @example
 * ```ts
 * writeFileSync('dw-report.tex', renderLatex(exactDwTest({ y, x })));
 * writeFileSync('dw-section.tex', renderLatex(result, { standalone: false })); // to \input
 * ```
 */
export function renderLatex(r: DwTestResult, options: LatexOptions = {}): string {
  return renderLatexDocument(buildReport(r), options);
}
