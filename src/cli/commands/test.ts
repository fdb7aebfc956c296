/**
 * `exact-dw test`: fit y on the regressors of a data file, test the residuals exactly, and write
 * the report (text, Markdown, LaTeX or JSON), the paragraph for the paper, the BibTeX of the
 * methods used and the figure of the exact null density. Files are never overwritten without
 * --force, and every output is rendered before the first file is written, so that an error leaves
 * no half-written set behind.
 */
import { resolve } from 'node:path';
import { DwError } from '../../errors.js';
import { columnIndex, numericColumn, textColumn } from '../../data/csv.js';
import { chooseTimeIndex } from '../../data/time-index.js';
import { runExactDwTest, type Alternative, type DwTestResult } from '../../inference/dw-test.js';
import type { DwProblem, ProblemOptions } from '../../problem/problem.js';
import type { RegressorInput } from '../../model/design.js';
import { renderText } from '../../report/text.js';
import { renderMarkdown } from '../../report/markdown.js';
import { renderLatex } from '../../report/latex.js';
import { renderJson } from '../../report/json.js';
import { paperParagraph } from '../../report/paragraph.js';
import { citations } from '../../report/citations.js';
import { renderDensitySvg } from '../../report/svg.js';
import { choiceOption, integerOption, listOption, numberOption, required, type OptionSpecs, type OptionValues } from '../args.js';
import type { CliIo } from '../io.js';
import { CSV_OPTIONS, MODEL_OPTIONS, chooseRegressors, describeInput, frequencyOption, loadTable, problemOptions } from '../shared.js';
import type { Command } from './command.js';
import { parseRhoList } from './power.js';
import { PANEL_OPTIONS, panelFromOptions } from '../panel-options.js';

/** Report formats. */
export const REPORT_FORMATS = ['text', 'markdown', 'latex', 'json'] as const;
export type ReportFormat = (typeof REPORT_FORMATS)[number];

/** Options that say what to write and where (shared with `demo`). */
export const REPORT_OPTIONS: OptionSpecs = {
  format: { type: 'string', value: 'FMT', help: 'report format: text (default), markdown, latex or json' },
  paragraph: { type: 'boolean', help: 'print only the paragraph for the paper, in the chosen format' },
  cite: { type: 'boolean', help: 'append BibTeX entries for the methods used' },
  bib: { type: 'string', value: 'FILE', help: 'also write the BibTeX entries to FILE' },
  plot: { type: 'string', value: 'FILE.svg', help: 'also write an SVG figure of the exact null density of d' },
  out: { type: 'string', value: 'FILE', help: 'write the report to FILE instead of the screen' },
  fragment: { type: 'boolean', help: 'with --format latex: a fragment to \\input into a paper (no preamble, no document environment)' },
  force: { type: 'boolean', help: 'replace files given to --out, --plot or --bib that already exist' },
};

/**
 * The report in one format.
 *
 * @example
 * ```ts
 * renderReport(exactDwTest({ y, x }), 'markdown').split('\n')[0]; // "# Exact Durbin–Watson test"
 * ```
 */
export function renderReport(result: DwTestResult, format: ReportFormat, fragment = false): string {
  switch (format) {
    case 'markdown': return renderMarkdown(result);
    case 'latex': return renderLatex(result, { standalone: !fragment });
    case 'json': return renderJson(result);
    default: return renderText(result);
  }
}

/**
 * What goes to the screen or to --out: the report or the paragraph, with BibTeX appended on --cite.
 *
 * @example
 * ```ts
 * mainOutput(result, 'latex', true, true); // the LaTeX paragraph, then its BibTeX entries
 * ```
 */
export function mainOutput(result: DwTestResult, format: ReportFormat, paragraph: boolean, cite: boolean, fragment = false): string {
  const bib = cite ? citations(result) : '';
  if (format === 'json') {
    const obj = paragraph ? { paragraph: paperParagraph(result, 'text').trim() } : JSON.parse(renderJson(result));
    if (cite) obj.bibtex = bib;
    return JSON.stringify(obj, null, 2) + '\n';
  }
  const body = paragraph ? paperParagraph(result, format) : renderReport(result, format, fragment);
  if (!cite) return body;
  if (format === 'markdown') return `${body}\n\`\`\`bibtex\n${bib}\`\`\`\n`;
  if (format === 'latex') return `${body}\n% ---- BibTeX entries for the methods used (save them as a .bib file) ----\n${bib}`;
  return `${body}\n---- BibTeX entries for the methods used ----\n\n${bib}`;
}

/** The files a run will write, checked before any work is done. */
export interface OutputFiles { out?: string; plot?: string; bib?: string; force: boolean }

/**
 * Read --out, --plot, --bib and --force; refuse existing files (without --force), clashes, and a figure not named .svg.
 *
 * @example
 * ```ts
 * const files = outputFiles({ out: 'report.md', plot: 'density.svg' }, processIo);
 * // { out: 'report.md', plot: 'density.svg', force: false }; throws FILE_EXISTS if either exists
 * ```
 */
export function outputFiles(values: OptionValues, io: CliIo): OutputFiles {
  const pick = (name: string): string | undefined => {
    const v = values[name];
    if (v === undefined) return undefined;
    if (typeof v !== 'string' || v.trim() === '') throw new DwError('OPTION_VALUE', `--${name} needs a file name.`, `Write it like --${name} results/report.md.`);
    return v;
  };
  const files: OutputFiles = { out: pick('out'), plot: pick('plot'), bib: pick('bib'), force: values.force === true };
  if (files.plot !== undefined && !/\.svg$/i.test(files.plot)) {
    throw new DwError('OPTION_VALUE', `--plot writes an SVG figure, but '${files.plot}' does not end in .svg.`, 'Give a file name ending in .svg (convert it to PDF or PNG with your usual tools).');
  }
  const named = (['out', 'plot', 'bib'] as const).filter((k) => files[k] !== undefined);
  for (let i = 0; i < named.length; i++) {
    for (let j = i + 1; j < named.length; j++) {
      if (resolve(files[named[i]]!) === resolve(files[named[j]]!)) {
        throw new DwError('OPTION_CONFLICT', `--${named[i]} and --${named[j]} name the same file '${files[named[i]]}'.`, 'Give each output its own file.');
      }
    }
  }
  if (!files.force) {
    for (const k of named) {
      const path = files[k]!;
      if (io.exists(path)) {
        throw new DwError('FILE_EXISTS', `The file '${path}' (--${k}) already exists and was left as it is.`, 'Choose another name, or add --force to replace it.', { file: path });
      }
    }
  }
  return files;
}

/**
 * Render everything asked for, then write it: the report (or paragraph) to --out or the screen,
 * the figure to --plot, the BibTeX to --bib. A note on stderr names each file written.
 *
 * @example
 * ```ts
 * const files = outputFiles(values, io);
 * const { result, problem } = runExactDwTest({ y, x });
 * writeOutputs(io, result, values, files, () => problem);
 * ```
 */
export function writeOutputs(io: CliIo, result: DwTestResult, values: OptionValues, files: OutputFiles, problem: () => DwProblem): void {
  const format = choiceOption<ReportFormat>(values, 'format', REPORT_FORMATS, 'text');
  if (values.fragment === true && format !== 'latex') {
    throw new DwError('OPTION_CONFLICT', `--fragment gives a LaTeX fragment, but the format is ${format}.`, 'Add --format latex, or leave --fragment out.');
  }
  const main = mainOutput(result, format, values.paragraph === true, values.cite === true, values.fragment === true);
  const svg = files.plot !== undefined ? renderDensitySvg(result, problem().distribution) : undefined;
  const bib = files.bib !== undefined ? citations(result) : undefined;
  if (files.out !== undefined) {
    io.writeText(files.out, main, files.force);
    io.err(`exact-dw: wrote ${values.paragraph === true ? 'the paragraph' : 'the report'} to ${files.out}\n`);
  } else {
    io.out(main);
  }
  if (svg !== undefined) {
    io.writeText(files.plot!, svg, files.force);
    io.err(`exact-dw: wrote the figure to ${files.plot}\n`);
  }
  if (bib !== undefined) {
    io.writeText(files.bib!, bib, files.force);
    io.err(`exact-dw: wrote the BibTeX entries to ${files.bib}\n`);
  }
}

/**
 * Run `f`; a missing value it refuses gets the command-line option that drops such rows added to
 * the hint (the library's hint names no option).
 *
 * @example
 * ```ts
 * withMissingHint(() => numericColumn(table, 'y')); // CELL_EMPTY: "... Or add --drop-missing ..."
 * ```
 */
export function withMissingHint<T>(f: () => T): T {
  try {
    return f();
  } catch (err) {
    if (err instanceof DwError && err.code === 'CELL_EMPTY' && !/blank\.$/.test(err.message)) {
      throw new DwError(err.code, err.message, `${err.hint} Add --drop-missing to drop them; they are listed in the report.`, err.detail);
    }
    throw err;
  }
}

/**
 * The options of a run as given, for the reproducibility record (file names of outputs left out).
 *
 * @example
 * ```ts
 * recordedOptions({ y: 'sales', lag: '4', out: 'r.md' }); // { y: 'sales', lag: '4' }
 * ```
 */
export function recordedOptions(values: OptionValues): Record<string, string | boolean | string[]> {
  const out: Record<string, string | boolean | string[]> = {};
  for (const k of Object.keys(values).sort()) {
    if (['out', 'plot', 'bib', 'force'].includes(k)) continue;
    const v = values[k];
    if (v !== undefined) out[k] = v as string | boolean | string[];
  }
  return out;
}

export const testCommand: Command = {
  name: 'test',
  summary: 'fit y on its regressors and run the exact Durbin-Watson test',
  usage: 'exact-dw test DATA.csv --y COL [--x A,B,...] [--format FMT] [--paragraph] [--cite] [--plot FILE.svg] [--out FILE] [options]',
  details: [
    'Prints a report of the exact test: the decision, d, its exact p-values and critical values for',
    'your design, the bounds test, the fit, the method and its error bound, and cautions.',
    '--paragraph prints a paragraph for a paper instead; --cite adds BibTeX for the methods used;',
    '--plot writes a figure of the exact null density of d. Existing files are never replaced',
    'unless you add --force.',
    'Without --time, a column named like a time index (year, quarter, month, date, period, ...) or',
    'holding quarter, month or date labels is taken as the time index (the report says so);',
    '--no-time turns this off. --drop-missing drops rows with missing values and lists them.',
  ].join('\n'),
  positionals: 1,
  options: {
    y: { type: 'string', value: 'COL', help: 'the dependent variable' },
    x: { type: 'string', value: 'A,B,...', help: 'regressors (default: every other numeric column)' },
    alternative: { type: 'string', value: 'ALT', help: 'positive (default), negative or two-sided' },
    alpha: { type: 'string', value: 'A', help: 'significance level in (0, 1) (default 0.05)' },
    power: { type: 'string', value: 'RHOS', help: 'also report the exact power against AR(1) errors at these rho (e.g. 0.2,0.4,0.6 or 0.1:0.9:0.1)' },
    target: { type: 'string', value: 'P', help: 'with --power: report the smallest rho whose power reaches P (default 0.8)' },
    'lagged-dependent': { type: 'string', value: 'COL', help: "the regressor that is y lagged one period (detected when omitted); d is then not valid and Durbin's h and Breusch-Godfrey are reported" },
    'bg-order': { type: 'string', value: 'P', help: 'order p of the Breusch-Godfrey test reported next to d, or instead of it for a dynamic model (default 1; 4 for quarterly data)' },
    'drop-missing': { type: 'boolean', help: 'drop the rows with a missing value in a column of the model (listed in the report; they become gaps in time)' },
    ...MODEL_OPTIONS,
    ...PANEL_OPTIONS,
    ...CSV_OPTIONS,
    ...REPORT_OPTIONS,
  },
  run({ values, positionals, io }) {
    choiceOption<ReportFormat>(values, 'format', REPORT_FORMATS, 'text');
    if (positionals.length !== 1) {
      throw new DwError('OPTION_MISSING', "'test' needs the data file: exact-dw test DATA.csv --y COL.", "See 'exact-dw test --help'.");
    }
    const files = outputFiles(values, io);
    const alternative = choiceOption<Alternative>(values, 'alternative', ['positive', 'negative', 'two-sided'], 'positive');
    const alpha = numberOption(values, 'alpha', 0.05) as number;
    const table = loadTable(io, positionals[0], values);
    const yName = required(values, 'y', 'test');
    const noTime = values['no-time'] === true;
    if (noTime && typeof values.time === 'string') {
      throw new DwError('OPTION_CONFLICT', '--time names a time column and --no-time asks for none.', 'Give one of them.');
    }
    const frequency = frequencyOption(values);
    const named = typeof values.time === 'string' ? values.time : noTime ? false : undefined;
    if (typeof named === 'string') columnIndex(table, named);
    // the library's time-index rule, on every column of the file (src/data/time-index.ts)
    const choice = chooseTimeIndex(table.headers.map((h) => ({ name: h, cells: textColumn(table, h) })),
      { named, y: yName, listed: listOption(values, 'x') });
    const timeName = choice.column;
    const drop = values['drop-missing'] === true;
    const { y, x } = withMissingHint(() => ({
      y: numericColumn(table, yName, { missingAsNaN: drop }),
      x: chooseRegressors(table, { ...values, time: timeName ?? undefined }, yName, drop),
    }));
    // a panel's times restart in each entity: they go with the panel, not with the single-series time index
    const panel = withMissingHint(() => panelFromOptions(values, table, x, frequency, drop));
    const time = timeName !== null && panel === undefined
      ? { labels: textColumn(table, timeName), name: timeName, frequency, detected: choice.how === 'detected', source: table.source }
      : undefined;
    const options: ProblemOptions = problemOptions({ ...values, time: undefined });
    const laggedDependent = typeof values['lagged-dependent'] === 'string' ? values['lagged-dependent'] : undefined;
    const bgOrder = integerOption(values, 'bg-order', 1);
    const power = typeof values.power === 'string'
      ? { rho: parseRhoList(values.power), target: numberOption(values, 'target', 0.8) as number }
      : undefined;
    const provenance = { input: describeInput(io, positionals[0]), options: recordedOptions(values) };
    const { result, problem } = withMissingHint(() => runExactDwTest({
      y, x, alternative, alpha, ...options, time, timeColumn: false, dropMissing: drop, laggedDependent, bgOrder, power, panel, provenance,
    }));
    // the figure needs the null distribution itself: rebuild it from the same design and options
    writeOutputs(io, result, values, files, () => problem);
    return 0;
  },
};
