/**
 * Reports of an exact Durbin-Watson test for publication: text, Markdown, LaTeX and JSON
 * renderers, a paragraph for the paper, BibTeX for the methods used, and an SVG figure of the
 * exact null density. Renderers never compute statistics; they print a DwTestResult.
 */
export { renderText, renderTextDocument } from './text.js';
export { renderMarkdown, renderMarkdownDocument } from './markdown.js';
export { renderLatex, renderLatexDocument, type LatexOptions } from './latex.js';
export { renderJson } from './json.js';
export { paperParagraph } from './paragraph.js';
export { citations, citedKeys, citeInline, formatReference, savinWhiteCovers, WORKS, type CitedWork } from './citations.js';
export { renderDensitySvg, densityCurve, plotDomain, type DensityPlotOptions, type DensityCurve } from './svg.js';
export { buildReport, type ReportDocument, type ReportSection, type ReportBlock } from './document.js';
export type { InlineFormat } from './format.js';
export { warningText, timeIndexWords, nextStepsWords, boundsResolutionWords, engineChoiceWords, durbinHWords, powerNoteText, rowList } from './wording.js';
export { inline } from './format.js';
