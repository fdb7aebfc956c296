/**
 * `exact-dw demo`: the exact test on the bundled demo data (an invented scenario of our own). It
 * prints the text report and writes the whole publication set (reports in Markdown, LaTeX, JSON
 * and text, the paragraph in three formats, the BibTeX and the figure) into a new folder, named
 * on screen; an existing folder is never reused (a numbered one is created instead).
 */
import { existsSync, mkdirSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { dirname, join, resolve } from 'node:path';
import { DwError } from '../../errors.js';
import { numericColumn, parseCsv } from '../../data/csv.js';
import { exactDwTest } from '../../inference/dw-test.js';
import { prepareProblem } from '../../problem/problem.js';
import { renderText } from '../../report/text.js';
import { renderMarkdown } from '../../report/markdown.js';
import { renderLatex } from '../../report/latex.js';
import { renderJson } from '../../report/json.js';
import { paperParagraph } from '../../report/paragraph.js';
import { citations } from '../../report/citations.js';
import { renderDensitySvg } from '../../report/svg.js';
import { choiceOption } from '../args.js';
import { REPORT_FORMATS, renderReport, type ReportFormat } from './test.js';
import type { Command } from './command.js';
import { describeInput } from '../shared.js';

/**
 * Path of the bundled demo data (from the compiled module in dist/src/cli/commands, or from src/cli/commands).
 *
 * @example
 * ```ts
 * parseCsv(readFileSync(demoDataPath(), 'utf8')); // the bundled docs/demo/apiary.csv
 * ```
 */
export function demoDataPath(): string {
  const here = dirname(fileURLToPath(import.meta.url));
  const candidates = [
    join(here, '..', '..', '..', '..', 'docs', 'demo', 'apiary.csv'),
    join(here, '..', '..', '..', 'docs', 'demo', 'apiary.csv'),
  ];
  return candidates.find((p) => existsSync(p)) ?? candidates[0];
}

/** Default folder of the demo's files, under the current folder. */
export const DEMO_FOLDER = 'exact-dw-demo';

/**
 * Create a new folder `base`, or `base-2`, `base-3`, ... when it exists: never reuse one.
 * mkdir without `recursive` fails on an existing folder, so two runs at once cannot share one.
 *
 * @example
 * ```ts
 * freshFolder('exact-dw-demo'); // 'exact-dw-demo', or 'exact-dw-demo-2' when that exists
 * ```
 */
export function freshFolder(base: string): string {
  const parent = dirname(resolve(base));
  try {
    mkdirSync(parent, { recursive: true });
  } catch (err) {
    throw new DwError('FILE_UNWRITABLE', `The folder '${parent}' cannot be created (${(err as NodeJS.ErrnoException).code ?? 'error'}).`, 'Choose another place with --dir.', { file: parent });
  }
  for (let i = 1; i <= 999; i++) {
    const path = i === 1 ? base : `${base}-${i}`;
    try {
      mkdirSync(path);
      return path;
    } catch (err) {
      const code = (err as NodeJS.ErrnoException).code;
      if (code === 'EEXIST') continue;
      throw new DwError('FILE_UNWRITABLE', `The folder '${path}' cannot be created (${code ?? 'error'}).`, 'Choose another place with --dir.', { file: path });
    }
  }
  throw new DwError('FILE_EXISTS', `The folders '${base}' to '${base}-999' all exist.`, 'Remove old demo folders or choose another --dir.', { file: base });
}

/** The demo's columns. */
function loadDemo(text: string): { y: Float64Array; rain: Float64Array; temp: Float64Array; year: Float64Array } {
  const t = parseCsv(text, { source: 'the demo data' });
  return {
    y: numericColumn(t, 'yield_kg'),
    rain: numericColumn(t, 'spring_rain_mm'),
    temp: numericColumn(t, 'june_temp_c'),
    year: numericColumn(t, 'year'),
  };
}

/** The files the demo writes, in the order listed on screen. */
export const DEMO_FILES = [
  'report.md', 'report.tex', 'report.json', 'report.txt',
  'paragraph.txt', 'paragraph.md', 'paragraph.tex',
  'references.bib', 'density.svg',
] as const;

export const demoCommand: Command = {
  name: 'demo',
  summary: 'run the exact test on the bundled demo data (invented apiary yields) and write a report set',
  usage: 'exact-dw demo [--dir FOLDER] [--format text|markdown|latex|json]',
  details: [
    'Writes report.md, report.tex, report.json, report.txt, paragraph.txt, paragraph.md,',
    `paragraph.tex, references.bib and density.svg into a new folder (default ./${DEMO_FOLDER};`,
    `when it exists, ./${DEMO_FOLDER}-2 and so on: existing files are never touched), names the`,
    'folder, and prints the report.',
  ].join('\n'),
  options: {
    dir: { type: 'string', value: 'FOLDER', help: `folder to create for the files (default ${DEMO_FOLDER}; numbered when it exists)` },
    format: { type: 'string', value: 'FMT', help: 'format of the report printed on screen: text (default), markdown, latex or json' },
  },
  run({ values, io }) {
    const format = choiceOption<ReportFormat>(values, 'format', REPORT_FORMATS, 'text');
    const base = typeof values.dir === 'string' && values.dir.trim() !== '' ? values.dir : DEMO_FOLDER;
    const path = demoDataPath();
    const data = loadDemo(io.readText(path));
    const x = { spring_rain_mm: data.rain, june_temp_c: data.temp };
    const options = { times: data.year };
    const provenance = {
      input: { ...describeInput(io, path), name: 'docs/demo/apiary.csv' },
      options: { y: 'yield_kg', x: 'spring_rain_mm,june_temp_c', time: 'year' },
    };
    const result = exactDwTest({ y: data.y, x, time: { labels: data.year, name: 'year' }, provenance });
    const svg = renderDensitySvg(result, prepareProblem(x, data.y.length, options).distribution);
    const contents: Record<(typeof DEMO_FILES)[number], string> = {
      'report.md': renderMarkdown(result),
      'report.tex': renderLatex(result),
      'report.json': renderJson(result),
      'report.txt': renderText(result),
      'paragraph.txt': paperParagraph(result, 'text'),
      'paragraph.md': paperParagraph(result, 'markdown'),
      'paragraph.tex': paperParagraph(result, 'latex'),
      'references.bib': citations(result),
      'density.svg': svg,
    };
    const folder = freshFolder(base);
    for (const name of DEMO_FILES) io.writeText(join(folder, name), contents[name], false);
    io.out(`Demo data: ${path}\n(invented for illustration: yearly honey yield of a fictional apiary, 1998-2021)\n`);
    io.out(`Command:   exact-dw test ${path} --y yield_kg --x spring_rain_mm,june_temp_c --time year\n`);
    io.out(`Files:     ${resolve(folder)}/ (${DEMO_FILES.join(', ')})\n\n`);
    io.out(renderReport(result, format));
    return 0;
  },
};
