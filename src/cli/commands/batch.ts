/**
 * `exact-dw batch`: one exact Durbin-Watson test per group of rows of a data file (src/batch/),
 * the groups split among worker threads (src/cli/batch-pool.ts), Holm or Benjamini-Hochberg
 * adjusted p-values on request, and a summary table (Markdown, CSV, booktabs LaTeX or JSON). A
 * group that cannot be tested is reported with its error code and the others go on; a problem
 * with the file itself is one line on stderr and exit status 2. A progress line goes to stderr
 * only (redrawn in place on a terminal; otherwise every tenth of the way once a run takes long).
 */
import { DwError } from '../../errors.js';
import type { Alternative } from '../../core/alternative.js';
import { ADJUSTMENTS, type Adjustment } from '../../batch/adjust.js';
import { BATCH_FORMATS, renderBatch, type BatchFormat } from '../../batch/render.js';
import { choiceOption, integerOption, listOption, methodOption, numberOption, required } from '../args.js';
import { CSV_OPTIONS, MODEL_OPTIONS, csvOptionsOf, frequencyOption } from '../shared.js';
import { THREAD_MIN_ROWS, runBatch } from '../batch-pool.js';
import type { CliIo } from '../io.js';
import type { Command } from './command.js';

/** Seconds after which a run whose stderr is not a terminal starts to report progress. */
const QUIET_SECONDS = 2;

function progressLine(io: CliIo): { update: (done: number, total: number) => void; end: () => void } {
  const start = Date.now();
  let last = 0;
  let shownTenth = 0;
  let drawn = false;
  return {
    update(done, total) {
      const now = Date.now();
      const text = `exact-dw: ${done} of ${total} series tested (${Math.floor((100 * done) / total)}%)`;
      if (io.errIsTerminal) {
        if (now - last < 100 && done < total) return;
        last = now;
        io.err(`\r${text}`);
        drawn = true;
      } else if (now - start > QUIET_SECONDS * 1000) {
        const tenth = Math.floor((10 * done) / total);
        if (tenth > shownTenth) { shownTenth = tenth; io.err(`${text}\n`); }
      }
    },
    end() { if (drawn) io.err('\n'); },
  };
}

export const batchCommand: Command = {
  name: 'batch',
  summary: 'one exact Durbin-Watson test per group (shop, station, product), with adjusted p-values',
  usage: 'exact-dw batch DATA.csv --by COL --y COL [--x A,B,...] [--time COL] [--adjust holm|bh] [--format FMT] [--out FILE] [options]',
  details: [
    'Fits y on the regressors within each group of rows that share a value of --by and runs the exact',
    'test there. Groups with the same design share one exact null distribution (this changes no',
    'number). --adjust holm controls the family-wise error rate (Holm 1979), --adjust bh the false',
    'discovery rate (Benjamini-Hochberg 1995); decisions then use the adjusted p-values. A group that',
    'cannot be tested gets its error code in the table and the others go on. --time takes whole',
    'numbers, quarters (2015Q1), months (2015-07) or ISO dates, increasing within each group; gaps are honoured. Without --time',
    'the time-index rule of the test command applies group by group (--no-time turns it off).',
  ].join('\n'),
  positionals: 1,
  options: {
    by: { type: 'string', value: 'COL', help: 'the column naming the group (series) of each row' },
    y: { type: 'string', value: 'COL', help: 'the dependent variable' },
    x: { type: 'string', value: 'A,B,...', help: 'regressors (default: every other numeric column)' },
    adjust: { type: 'string', value: 'METHOD', help: 'adjust the p-values over the groups: holm or bh (default: none)' },
    alternative: { type: 'string', value: 'ALT', help: 'positive (default), negative or two-sided' },
    alpha: { type: 'string', value: 'A', help: 'significance level in (0, 1) (default 0.05)' },
    critical: { type: 'boolean', help: 'also compute the exact critical values and the bounds zone of every group (slower when designs differ)' },
    'drop-missing': { type: 'boolean', help: "drop, in each group, the rows with a missing value in a column of the model (listed per group; they become gaps in the group's time)" },
    workers: { type: 'string', value: 'N', help: `worker threads (default: one per core for files of more than ${THREAD_MIN_ROWS} lines, else 1)` },
    format: { type: 'string', value: 'FMT', help: 'markdown (default), csv, latex (booktabs) or json' },
    out: { type: 'string', value: 'FILE', help: 'write the table to FILE instead of the screen' },
    force: { type: 'boolean', help: 'replace the file given to --out if it exists' },
    ...MODEL_OPTIONS,
    ...CSV_OPTIONS,
  },
  async run({ values, positionals, io }) {
    const format = choiceOption<BatchFormat>(values, 'format', BATCH_FORMATS, 'markdown');
    if (positionals.length !== 1) {
      throw new DwError('OPTION_MISSING', "'batch' needs the data file: exact-dw batch DATA.csv --by COL --y COL.", "See 'exact-dw batch --help'.");
    }
    const out = values.out;
    if (out !== undefined && (typeof out !== 'string' || out.trim() === '')) {
      throw new DwError('OPTION_VALUE', '--out needs a file name.', 'Write it like --out results/batch.tex.');
    }
    if (typeof out === 'string' && values.force !== true && io.exists(out)) {
      throw new DwError('FILE_EXISTS', `The file '${out}' (--out) already exists and was left as it is.`, 'Choose another name, or add --force to replace it.', { file: out });
    }
    const by = required(values, 'by', 'batch');
    const y = required(values, 'y', 'batch');
    const adjust = values.adjust === undefined ? undefined : choiceOption<Adjustment>(values, 'adjust', ADJUSTMENTS, 'holm');
    const alternative = choiceOption<Alternative>(values, 'alternative', ['positive', 'negative', 'two-sided'], 'positive');
    const alpha = numberOption(values, 'alpha', 0.05) as number;
    const lag = integerOption(values, 'lag', 1) as number;
    const workers = values.workers === undefined ? 'auto' : integerOption(values, 'workers') as number;
    if (workers !== 'auto' && !(workers >= 1)) throw new DwError('OPTION_VALUE', `--workers must be at least 1 (got ${workers}).`, 'Give the number of threads, e.g. --workers 2.');
    const time = typeof values.time === 'string' ? values.time : undefined;
    if (values['no-time'] === true && time !== undefined) {
      throw new DwError('OPTION_CONFLICT', '--time names a time column and --no-time asks for none.', 'Give one of them.');
    }
    const path = positionals[0];
    const text = io.readText(path);
    const progress = progressLine(io);
    const batch = await runBatch(text, csvOptionsOf(values, path), {
      by, y, x: listOption(values, 'x'), time, timeColumn: values['no-time'] === true ? false : undefined, frequency: frequencyOption(values), adjust, alternative, alpha,
      intercept: !values['no-intercept'], lag, method: methodOption(values), critical: values.critical === true, dropMissing: values['drop-missing'] === true,
    }, workers, progress.update);
    progress.end();
    const body = renderBatch(batch, format);
    if (typeof out === 'string') {
      io.writeText(out, body, values.force === true);
      io.err(`exact-dw: wrote the table of ${batch.summary.groups} series to ${out}\n`);
    } else {
      io.out(body);
    }
    return 0;
  },
};
