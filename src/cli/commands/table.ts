/** `exact-dw table`: a whole table of exact Durbin-Watson bounds, computed on the spot. */
import { DwError } from '../../errors.js';
import { boundsTable } from '../../bounds/table.js';
import { renderBoundsTable, type TableFormat } from '../../report/bounds-table.js';
import { parseIntegerList, parseLevelList } from '../../bounds/ranges.js';
import { MAX_BOUNDS_N } from '../../bounds/spectra.js';
import { choiceOption, integerOption, methodOption, required } from '../args.js';
import type { Command } from './command.js';

export const tableCommand: Command = {
  name: 'table',
  summary: "a table of exact bounds d_L, d_U over ranges of n, k' and alpha (csv, markdown, json, text)",
  usage: 'exact-dw table --n 6-200 --k 1-20 [--alpha 0.05,0.01] [--format text|csv|markdown|json] [--out FILE]',
  details: [
    "K is k', the number of regressors OTHER THAN the intercept (the printed tables' convention).",
    'alpha is the one-sided level of the test against positive autocorrelation (reject when d < d_L,',
    'do not reject when d > d_U); for negative autocorrelation use 4 - d_U and 4 - d_L.',
    'Lists: single values, ranges A-B, ranges with a step A-B:S, joined by commas,',
    'e.g. --n 10,15,20-25 or --n 10-200:10; levels as fractions, e.g. --alpha 0.05,0.01.',
    `Cells with n < k' + 3 (k' + 2 without intercept) are left out. Limits: n <= ${MAX_BOUNDS_N}, about 30 s of computing.`,
    'CSV and JSON have one row per (n, k\', alpha); text and Markdown are laid out like printed tables.',
    'Every value is computed on the spot (exact quantiles, Durbin & Watson 1950); nothing is copied from a printed table.',
  ].join('\n'),
  options: {
    n: { type: 'string', value: 'LIST', help: 'sample sizes, e.g. 6-200 or 10,15,20-25' },
    k: { type: 'string', value: 'LIST', help: "k': regressors other than the intercept, e.g. 1-20" },
    alpha: { type: 'string', value: 'LIST', help: 'one-sided levels, e.g. 0.05,0.01 (default 0.05)' },
    'no-intercept': { type: 'boolean', help: 'bounds for models without intercept' },
    method: { type: 'string', value: 'ENGINE', help: 'auto (default: closed-form route), imhof or pan (eigenfree needs a design, not bounds)' },
    format: { type: 'string', value: 'FMT', help: 'text (default), csv, markdown or json' },
    digits: { type: 'string', value: 'D', help: 'decimals of d_L and d_U (default 3, as printed tables; at most 9)' },
    out: { type: 'string', value: 'FILE', help: 'write the table to FILE instead of the screen' },
    force: { type: 'boolean', help: 'with --out: replace FILE if it exists' },
  },
  run({ values, io }) {
    const format = choiceOption(values, 'format', ['text', 'csv', 'markdown', 'json'] as const, 'text') as TableFormat;
    const n = parseIntegerList(required(values, 'n', 'table'), '--n', { max: MAX_BOUNDS_N, code: 'SIZE_LIMIT', reason: 'the largest n for the bounds' });
    const kPrime = parseIntegerList(required(values, 'k', 'table'), '--k', undefined, ['1-20', '1,2,5', '0-20:5']);
    const alpha = parseLevelList(typeof values.alpha === 'string' ? values.alpha : '0.05', '--alpha');
    const digits = integerOption(values, 'digits', 3) as number;
    if (digits < 1 || digits > 9) {
      throw new DwError('OPTION_VALUE', `--digits must be between 1 and 9 (got ${digits}).`, 'The bounds are exact to about 1e-9; 3 decimals match printed tables.');
    }
    if (values.out === '') throw new DwError('OPTION_VALUE', '--out needs a file name.', 'Write e.g. --out bounds.csv.');
    if (values.force && values.out === undefined) {
      throw new DwError('OPTION_CONFLICT', '--force only applies together with --out.', 'Give the file to write with --out FILE.');
    }
    const table = boundsTable({ n, kPrime, alpha, intercept: !values['no-intercept'], method: methodOption(values) });
    const text = renderBoundsTable(table, format, digits);
    if (typeof values.out === 'string') {
      io.writeText(values.out, text, values.force === true);
      io.out(`Wrote ${table.cells.length} cell${table.cells.length === 1 ? '' : 's'} (${format}) to ${values.out}${table.skipped ? `; ${table.skipped} left out with n too small for k'` : ''}.\n`);
    } else {
      io.out(text);
    }
    return 0;
  },
};
