/**
 * `exact-dw/report`: reports of a test result for publication (text, Markdown, LaTeX, JSON), the
 * paragraph for the paper, BibTeX for the methods used, the SVG figure of the exact null density,
 * the words of every typed note, and the tables of a batch and of bounds. Renderers compute no
 * statistic: they print a result of the root API (`exactDwTest`, `exactDwBatch`, `boundsTable`).
 *
 * @example
 * ```ts
 * import { exactDwTest } from 'exact-dw';
 * import { renderMarkdown, paperParagraph } from 'exact-dw/report';
 * const result = exactDwTest({ y, x: { price } });
 * console.log(renderMarkdown(result));
 * console.log(paperParagraph(result));
 * ```
 *
 * @packageDocumentation
 * @module exact-dw/report
 */
export { renderText } from './report/text.js';
export { renderMarkdown } from './report/markdown.js';
export { renderLatex, type LatexOptions } from './report/latex.js';
export { renderJson } from './report/json.js';
export { paperParagraph } from './report/paragraph.js';
export { citations, type CitedWork } from './report/citations.js';
export { renderDensitySvg, type DensityPlotOptions } from './report/svg.js';
export {
  warningText, noteText, timeIndexWords, nextStepsWords, boundsResolutionWords, engineChoiceWords, durbinHWords, powerNoteText, type Note, type DurbinHFacts,
} from './report/wording.js';
export {
  renderBatch, renderBatchCsv, renderBatchMarkdown, renderBatchLatex, renderBatchJson, BATCH_FORMATS, type BatchFormat,
} from './batch/render.js';
export { renderBoundsTable, type TableFormat } from './report/bounds-table.js';
export type { InlineFormat } from './report/format.js';
