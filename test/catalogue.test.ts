/**
 * The catalogue of bad (and awkward but acceptable) inputs: each entry is one test with the
 * expected error code and the key words of the message, run through the CLI in-process (exit 2,
 * exactly one line on stderr ending with the code, nothing on stdout, no file written) and, where
 * a library function takes the same input, through the library (a DwError with the code).
 * Accepted inputs must give the same answer as the plain file.
 *
 * The table of docs/errors-and-limits.md is rendered from this catalogue and compared with the
 * file, so the documentation cannot drift. After changing the catalogue, regenerate the table with
 *   UPDATE_DOCS=1 npx vitest run --config test/vitest.config.ts test/catalogue.test.ts
 */
import { describe, expect, it } from 'vitest';
import { mkdirSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { cli, scratch } from './helpers/cli.js';
import { DwError, isDwError } from '../src/errors.js';
import { parseCsv, numericColumn } from '../src/data/csv.js';
import { parseTimeLabels } from '../src/data/time-index.js';
import { buildDesign, factorDesign } from '../src/model/design.js';
import { exactDwTest, exactDwCritical, exactDwPValue } from '../src/inference/dw-test.js';
import { DwNullDistribution } from '../src/distribution/null-distribution.js';
import { writeText, readText } from '../src/cli/io.js';
import { checkSize } from '../src/limits.js';

const dir = scratch();
let fileNo = 0;
/** Write a scratch file (text or bytes) and return its path. */
function file(content: string | Uint8Array, name?: string): string {
  const p = join(dir, name ?? `in${++fileNo}.csv`);
  writeFileSync(p, content);
  return p;
}

// invented series (sines and a trend), only to have numbers that are not special
const N = 12;
const Y = Array.from({ length: N }, (_, i) => +(5 + Math.sin(1.3 * i) + 0.2 * i).toFixed(4));
const X = Array.from({ length: N }, (_, i) => +(3 + Math.cos(0.7 * i)).toFixed(4));
const YEARS = Array.from({ length: N }, (_, i) => 2001 + i);
const lines = (f: (i: number) => string, n = N) => Array.from({ length: n }, (_, i) => f(i)).join('\n') + '\n';
const plain = 'year,y,x\n' + lines((i) => `${YEARS[i]},${Y[i]},${X[i]}`);
const good = file(plain, 'good.csv');
const design = file('a,b\n' + lines((i) => `${i + 1},${X[i]}`), 'design.csv');

/** One catalogue entry. */
interface Entry {
  /** What the input is (one line for the table). */
  input: string;
  /** The error code, or 'accepted'. */
  code: string;
  /** Key words the message must contain (for accepted inputs: what is checked). */
  words: string[];
  /** CLI arguments (files written when called). */
  argv?: () => string[];
  /** The same input through the library. */
  lib?: () => unknown;
  /** Key words of the library's message, when they differ from the CLI's. */
  libWords?: string[];
  /** Why an entry is checked only through the library. */
  note?: string;
}

const C: Entry[] = [
  // ---- files and CSV text
  { input: 'a data row with more fields than the header', code: 'CSV_RAGGED', words: ['Data row 2', '3 fields', 'the header has 2'],
    argv: () => ['test', file('y,x\n1,2\n2,3,4\n3,4\n4,5\n5,1\n'), '--y', 'y'],
    lib: () => parseCsv('y,x\n1,2\n2,3,4\n3,4\n4,5\n5,1\n') },
  { input: 'a data row with fewer fields than the header', code: 'CSV_RAGGED', words: ['Data row 3', '1 field;'],
    argv: () => ['test', file('y,x\n1,2\n2,3\n3\n4,5\n5,1\n'), '--y', 'y'] },
  { input: 'a repeated column name', code: 'CSV_HEADER_DUPLICATE', words: ["'x'", 'more than once'],
    argv: () => ['test', file('y,x,x\n' + lines((i) => `${Y[i]},${X[i]},${i}`)), '--y', 'y'],
    lib: () => parseCsv('y,x,x\n1,2,3\n') },
  { input: 'an empty column name', code: 'CSV_HEADER_EMPTY', words: ['Column 2', 'empty name'],
    argv: () => ['test', file('y,,x\n' + lines((i) => `${Y[i]},${i},${X[i]}`)), '--y', 'y'] },
  { input: 'no header row (the first row holds numbers)', code: 'CSV_HEADER_EMPTY', words: ['holds numbers', 'not column names'],
    argv: () => ['test', file(lines((i) => `${Y[i]},${X[i]}`)), '--y', 'y'] },
  { input: 'an empty file', code: 'CSV_EMPTY', words: ['is empty'], argv: () => ['test', file(''), '--y', 'y'], lib: () => parseCsv('') },
  { input: 'a file of blank lines and spaces', code: 'CSV_EMPTY', words: ['is empty'], argv: () => ['test', file('  \n\n \r\n'), '--y', 'y'] },
  { input: 'a header and no data rows', code: 'CSV_NO_DATA_ROWS', words: ['header but no data rows'],
    argv: () => ['test', file('y,x\n'), '--y', 'y'], lib: () => parseCsv('y,x\n\n') },
  { input: 'an unclosed quotation mark', code: 'CSV_MALFORMED', words: ['unclosed quotation mark', 'data row 2'],
    argv: () => ['test', file('y,x\n1,2\n2,"3\n3,4\n'), '--y', 'y'] },
  { input: 'a UTF-16 file (a spreadsheet\'s "Unicode text")', code: 'CSV_MALFORMED', words: ['UTF-16', 'UTF-8'],
    argv: () => ['test', file(Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(plain, 'utf16le')])), '--y', 'y'] },
  { input: 'a binary file (a workbook given as CSV)', code: 'CSV_MALFORMED', words: ['not CSV text', 'NUL bytes'],
    argv: () => ['test', file(Buffer.from([0x50, 0x4b, 0x03, 0x04, 0x00, 0x00, 0x08, 0x00])), '--y', 'y'] },
  { input: 'a blank line between two observations', code: 'CELL_EMPTY', words: ['Data row 4', 'blank', '--time'],
    argv: () => ['test', file('year,y,x\n' + lines((i) => `${YEARS[i]},${Y[i]},${X[i]}`, 3) + '\n' + lines((i) => `${YEARS[i + 3]},${Y[i + 3]},${X[i + 3]}`, 9)), '--y', 'y'] },
  { input: 'an empty cell', code: 'CELL_EMPTY', words: ['empty cell', "data row 4, column 'y'"],
    argv: () => ['test', file('y,x\n' + lines((i) => `${i === 3 ? '' : Y[i]},${X[i]}`)), '--y', 'y'] },
  { input: 'a cell of spaces only', code: 'CELL_EMPTY', words: ['blank cell', "data row 5, column 'x'"],
    argv: () => ['test', file('y,x\n' + lines((i) => `${Y[i]},${i === 4 ? '   ' : X[i]}`)), '--y', 'y', '--x', 'x'] },
  { input: 'a missing-value code (NA)', code: 'CELL_EMPTY', words: ["Missing value 'NA'", 'data row 2'],
    argv: () => ['test', file('y,x\n' + lines((i) => `${i === 1 ? 'NA' : Y[i]},${X[i]}`)), '--y', 'y'] },
  { input: 'NaN in a cell', code: 'CELL_EMPTY', words: ["Missing value 'NaN'", "column 'x'"],
    argv: () => ['test', file('y,x\n' + lines((i) => `${Y[i]},${i === 6 ? 'NaN' : X[i]}`)), '--y', 'y', '--x', 'x'] },
  { input: 'NaN in y given to the library', code: 'CELL_NOT_FINITE', words: ['y has the value NaN', 'observation 7'],
    lib: () => exactDwTest({ y: Y.map((v, i) => (i === 6 ? NaN : v)), x: { x: X } }), note: 'library only: a NaN in an array is not a missing-value code' },
  { input: 'Inf or -Infinity in a cell', code: 'CELL_NOT_FINITE', words: ['-Infinity', 'must be a finite number'],
    argv: () => ['test', file('y,x\n' + lines((i) => `${i === 2 ? '-Infinity' : Y[i]},${X[i]}`)), '--y', 'y'],
    lib: () => buildDesign({ x: X.map((v, i) => (i === 2 ? -Infinity : v)) }, N) },
  { input: 'a number too large for a double (1e999)', code: 'CELL_NOT_FINITE', words: ['too large', 'Rescale'],
    argv: () => ['test', file('y,x\n' + lines((i) => `${i === 2 ? '1e999' : Y[i]},${X[i]}`)), '--y', 'y'] },
  { input: 'a number too small for a double without loss (1e-320)', code: 'CELL_NOT_FINITE', words: ['too small', 'Rescale'],
    argv: () => ['test', file('y,x\n' + lines((i) => `${Y[i]},${i === 2 ? '1e-320' : X[i]}`)), '--y', 'y'] },
  { input: 'text in a numeric column named in --x', code: 'CELL_NOT_NUMERIC', words: ["'abc'", "data row 5, column 'x'"],
    argv: () => ['test', file('y,x\n' + lines((i) => `${Y[i]},${i === 4 ? 'abc' : X[i]}`)), '--y', 'y', '--x', 'x'] },
  { input: 'text in a numeric column, --x not given (never dropped silently)', code: 'CELL_NOT_NUMERIC', words: ["'abc'", "column 'x'", 'list the regressors with --x'],
    argv: () => ['test', file('y,x\n' + lines((i) => `${Y[i]},${i === 4 ? 'abc' : X[i]}`)), '--y', 'y'] },
  { input: 'text as y', code: 'CELL_NOT_NUMERIC', words: ["'c0'", "column 'name'"],
    argv: () => ['test', file('name,y\n' + lines((i) => `c${i},${Y[i]}`)), '--y', 'name'] },
  { input: 'unquoted decimal commas in a comma-delimited file', code: 'CSV_RAGGED', words: ['Data row 2', "';' as the delimiter"],
    argv: () => ['test', file('y,x\n' + lines((i) => `${String(Y[i]).replace('.', ',')},${i}`)), '--y', 'y'] },
  { input: 'quoted decimal commas in a comma-delimited file, without --decimal comma', code: 'CELL_NOT_NUMERIC', words: ['is not a number', '--decimal comma'],
    argv: () => ['test', file('y,x\n' + lines((i) => `"${Y[i].toFixed(3).replace('.', ',')}",${i}`)), '--y', 'y'] },
  { input: "';' file mixing decimal commas and decimal points", code: 'CSV_AMBIGUOUS_DECIMAL', words: ['mixes decimal commas', '--decimal comma', '--decimal point'],
    libWords: ['mixes decimal commas', "decimal 'comma' or 'point'"],
    argv: () => ['test', file('y;x\n' + lines((i) => `${Y[i].toFixed(2).replace('.', ',')};${X[i].toFixed(2)}`)), '--y', 'y'],
    lib: () => parseCsv('y;x\n1,5;2.5\n2,5;3.5\n') },
  { input: 'thousands separators ("1,234.5")', code: 'CELL_NOT_NUMERIC', words: ["'1,234.5'", 'remove the commas'],
    argv: () => ['test', file('y,x\n' + lines((i) => `${i === 0 ? '"1,234.5"' : Y[i]},${X[i]}`)), '--y', 'y'] },
  { input: 'a percentage ("5%")', code: 'CELL_NOT_NUMERIC', words: ["'5%'", '% sign'],
    argv: () => ['test', file('y,x\n' + lines((i) => `${Y[i]},${i === 0 ? '5%' : X[i]}`)), '--y', 'y', '--x', 'x'] },
  { input: 'a file that does not exist', code: 'FILE_NOT_FOUND', words: ['does not exist'],
    argv: () => ['test', join(dir, 'no-such-file.csv'), '--y', 'y'], lib: () => readText(join(dir, 'no-such-file.csv')) },
  { input: 'a path inside a folder that does not exist', code: 'FILE_NOT_FOUND', words: ['does not exist', 'there is no folder'],
    argv: () => ['critical', '--design', join(dir, 'no-such-folder', 'X.csv')] },
  { input: 'a folder given as the data file (unreadable as a file; chmod 000 would not do, as root reads anything)', code: 'FILE_UNREADABLE', words: ['is a folder, not a file'],
    argv: () => { const d = join(dir, `folder${++fileNo}.csv`); mkdirSync(d); return ['test', d, '--y', 'y']; } },
  { input: 'an output file that already exists (written through io.writeText, which every writing command uses)', code: 'FILE_EXISTS', words: ['already exists', 'left as it is', '--force'],
    note: 'library only: the CLI options that write files are being added separately',
    lib: () => writeText(file('precious\n', 'existing.txt'), 'new text\n', false) },
  { input: 'an output path that is a folder', code: 'FILE_UNWRITABLE', words: ['is a folder'],
    note: 'library only, as above', lib: () => { const d = join(dir, `outdir${++fileNo}`); mkdirSync(d); writeText(d, 'x', true); } },
  // ---- columns and the design
  { input: 'a column name that is not in the file', code: 'COLUMN_UNKNOWN', words: ["no column 'sales'", "'year', 'y', 'x'"],
    argv: () => ['test', good, '--y', 'sales'], lib: () => numericColumn(parseCsv(plain), 'sales') },
  { input: 'a column name in the wrong case', code: 'COLUMN_UNKNOWN', words: ["no column 'Y'", "Did you mean 'y'"], argv: () => ['test', good, '--y', 'Y'] },
  { input: 'y also listed in --x', code: 'OPTION_CONFLICT', words: ["'y' is both --y and a regressor"], argv: () => ['test', good, '--y', 'y', '--x', 'x,y'] },
  { input: 'the time column also listed in --x', code: 'OPTION_CONFLICT', words: ["'year' is the time column"], argv: () => ['test', good, '--y', 'y', '--x', 'year', '--time', 'year'] },
  { input: 'y also given as --time', code: 'OPTION_CONFLICT', words: ["'y' is given both as --y and as --time"], argv: () => ['test', good, '--y', 'y', '--time', 'y'] },
  { input: 'a regressor listed twice in --x', code: 'COLUMN_REPEATED', words: ["'x' is listed twice"], argv: () => ['test', good, '--y', 'y', '--x', 'x,x'] },
  { input: 'an empty name in --x', code: 'OPTION_VALUE', words: ['empty item'], argv: () => ['test', good, '--y', 'y', '--x', 'x,,year'] },
  { input: 'a single data row', code: 'TOO_FEW_ROWS', words: ['1 observation', 'k + 2'],
    argv: () => ['test', file('y,x\n1,2\n'), '--y', 'y'], lib: () => buildDesign({ x: [2] }, 1) },
  { input: 'n <= k + 1 (3 observations, intercept and one regressor)', code: 'TOO_FEW_ROWS', words: ['3 observations for 2 columns', 'k + 2 = 4'],
    argv: () => ['test', file('y,x\n1,2\n2,1\n3,5\n'), '--y', 'y'], lib: () => exactDwTest({ y: [1, 2, 3], x: { x: [2, 1, 5] } }) },
  { input: 'exactly collinear regressors (b = 2a + 3)', code: 'RANK_DEFICIENT', words: ['rank deficient', "'b'", 'linear combination'],
    argv: () => ['test', file('y,a,b\n' + lines((i) => `${Y[i]},${i},${2 * i + 3}`)), '--y', 'y'],
    lib: () => factorDesign(buildDesign({ a: YEARS, b: YEARS.map((t) => 2 * t + 3) }, N)) },
  { input: 'numerically collinear regressors (b = 2a + 3 + 1e-12 z)', code: 'RANK_DEFICIENT', words: ["'b'", 'to within a relative 1e-10'],
    argv: () => ['test', file('y,a,b\n' + lines((i) => `${Y[i]},${i},${2 * i + 3 + 1e-12 * Math.cos(i)}`)), '--y', 'y'] },
  { input: 'nearly collinear regressors (b = a + 1e-8 z): condition number above the limit', code: 'ILL_CONDITIONED', words: ['ill-conditioned', 'condition number', 'limit 1e+7'],
    argv: () => ['test', file('y,a,b\n' + lines((i) => `${Y[i]},${X[i]},${X[i] + 1e-8 * Math.sin(3 * i)}`)), '--y', 'y'],
    lib: () => factorDesign(buildDesign({ a: X, b: X.map((v, i) => v + 1e-8 * Math.sin(3 * i)) }, N)) },
  { input: 'a quartic trend in raw calendar years (1990..2019, powers 1..4)', code: 'ILL_CONDITIONED', words: ['condition number', 'Centre and scale'],
    lib: () => factorDesign(buildDesign(Object.fromEntries([1, 2, 3, 4].map((p) => [`t${p}`, Array.from({ length: 30 }, (_, i) => (1990 + i) ** p)])), 30)) },
  { input: 'two constant columns', code: 'RANK_DEFICIENT', words: ["'a', 'b'", 'all constant'],
    argv: () => ['critical', '--design', file('a,b,c\n' + lines((i) => `2,5,${X[i]}`))], lib: () => buildDesign({ a: Y.map(() => 2), b: Y.map(() => 5) }, N) },
  { input: 'a column of zeros', code: 'RANK_DEFICIENT', words: ["'z' is zero in every observation"],
    argv: () => ['critical', '--design', file('z,c\n' + lines((i) => `0,${X[i]}`))] },
  { input: 'a constant y', code: 'RESIDUALS_ZERO', words: ['y is constant', 'every residual is zero'],
    argv: () => ['test', file('y,x\n' + lines((i) => `7.5,${X[i]}`)), '--y', 'y'], lib: () => exactDwTest({ y: X.map(() => 7.5), x: { x: X } }) },
  { input: 'y an exact linear combination of the regressors (all residuals zero)', code: 'RESIDUALS_ZERO', words: ['linear combination of the regressors', 'Check that y'],
    argv: () => ['test', file('y,x\n' + lines((i) => `${2 * i + 1},${i}`)), '--y', 'y'] },
  { input: 'residuals at rounding level (y = 2x + 1e-13 z)', code: 'RESIDUALS_ZERO', words: ['numerically a linear combination', 'rounding noise'],
    argv: () => ['test', file('y,x\n' + lines((i) => `${2 * X[i] + 1e-13 * Math.sin(5 * i)},${X[i]}`)), '--y', 'y'],
    lib: () => exactDwTest({ y: X.map((v, i) => 2 * v + 1e-13 * Math.sin(5 * i)), x: { x: X } }) },
  { input: 'a residual file of zeros', code: 'RESIDUALS_ZERO', words: ['Every residual is zero'],
    argv: () => ['pvalue', '--design', design, '--residuals', file('e\n' + lines(() => '0'))] },
  { input: 'a residual file of the wrong length', code: 'LENGTH_MISMATCH', words: ['5 rows', 'design has 12'],
    argv: () => ['pvalue', '--design', design, '--residuals', file('e\n' + lines((i) => `${Y[i]}`, 5))] },
  { input: 'a repeated period in the time column', code: 'TIME_INVALID', words: ['2004 appears twice', "column 'year'"],
    argv: () => ['test', file('year,y,x\n' + lines((i) => `${i === 4 ? YEARS[3] : YEARS[i]},${Y[i]},${X[i]}`)), '--y', 'y', '--time', 'year'],
    lib: () => exactDwTest({ y: Y, x: { x: X }, times: YEARS.map((t, i) => (i === 4 ? YEARS[3] : t)) }), libWords: ['2004 appears twice', 'observations 4 and 5'] },
  { input: 'decreasing times', code: 'TIME_INVALID', words: ['times decrease', 'data row 2', 'Sort the rows'],
    argv: () => ['test', file('year,y,x\n' + lines((i) => `${YEARS[N - 1 - i]},${Y[i]},${X[i]}`)), '--y', 'y', '--time', 'year'] },
  { input: 'a time that is not a whole number', code: 'TIME_INVALID', words: ['2001.5', 'not a whole number'],
    argv: () => ['test', file('year,y,x\n' + lines((i) => `${YEARS[i] + 0.5},${Y[i]},${X[i]}`)), '--y', 'y', '--time', 'year'],
    lib: () => exactDwTest({ y: Y, x: { x: X }, times: YEARS.map((t) => t + 0.5) }) },
  { input: 'a quarter label that is no quarter (2015Q5)', code: 'TIME_LABEL_INVALID', words: ["'2015Q5'", 'data row 5', "column 'quarter'", 'not a valid period'],
    argv: () => ['test', file('quarter,y,x\n' + lines((i) => `${i === 4 ? '2015Q5' : `${2014 + Math.floor(i / 4)}Q${(i % 4) + 1}`},${Y[i]},${X[i]}`)), '--y', 'y', '--time', 'quarter'],
    lib: () => exactDwTest({ y: Y, x: { x: X }, time: { labels: Y.map((_, i) => (i === 4 ? '2015Q5' : `${2014 + Math.floor(i / 4)}Q${(i % 4) + 1}`)), name: 'quarter' } }),
    libWords: ["'2015Q5'", 'data row 5', "column 'quarter'"] },
  { input: 'a date written day/month/year', code: 'TIME_LABEL_AMBIGUOUS', words: ["'01/02/2015'", 'which the month', 'ISO form'],
    argv: () => ['test', file('date,y,x\n' + lines((i) => `${String(i + 1).padStart(2, '0')}/02/2015,${Y[i]},${X[i]}`)), '--y', 'y', '--time', 'date'],
    lib: () => parseTimeLabels(['01/02/2015', '02/02/2015']), libWords: ["'01/02/2015'", 'ISO form'] },
  { input: 'time labels in two formats (quarters and months)', code: 'TIME_FORMATS_MIXED', words: ['mix quarters', 'months', 'data row 7'],
    argv: () => ['test', file('period,y,x\n' + lines((i) => `${i < 6 ? `2015Q${(i % 4) + 1}`.replace(/Q(\d)/, (_m, q) => `Q${q}`) : `2016-${String(i - 5).padStart(2, '0')}`},${Y[i]},${X[i]}`)), '--y', 'y', '--time', 'period'],
    lib: () => parseTimeLabels(['2015Q1', '2015-04']), libWords: ['mix quarters', 'months'] },
  { input: 'dates of no regular frequency', code: 'TIME_IRREGULAR', words: ['follow no regular frequency', 'Name the frequency'],
    argv: () => ['test', file('date,y,x\n' + lines((i) => `2015-${String(i + 1).padStart(2, '0')}-${String(1 + ((i * 7) % 27)).padStart(2, '0')},${Y[i]},${X[i]}`)), '--y', 'y', '--time', 'date'],
    lib: () => parseTimeLabels(['2015-01-05', '2015-02-17', '2015-04-02']) },
  { input: 'a frequency that contradicts the labels (quarters read as monthly)', code: 'TIME_FREQUENCY_CONFLICT', words: ['quarters', 'quarterly', 'monthly'],
    argv: () => ['test', file('quarter,y,x\n' + lines((i) => `${2014 + Math.floor(i / 4)}Q${(i % 4) + 1},${Y[i]},${X[i]}`)), '--y', 'y', '--time', 'quarter', '--frequency', 'monthly'],
    lib: () => parseTimeLabels(['2015Q1', '2015Q2'], { frequency: 'monthly' }) },
  { input: 'a missing value, with the option that drops such rows named on the command line', code: 'CELL_EMPTY', words: ["Missing value 'NA'", 'data row 3', '--drop-missing'],
    argv: () => ['test', file('year,y,x\n' + lines((i) => `${YEARS[i]},${i === 2 ? 'NA' : Y[i]},${X[i]}`)), '--y', 'y'],
    lib: () => parseTimeLabels(['2001', 'NA']), libWords: ["Missing time label 'NA'", 'data row 2'] },
  { input: 'lag 0', code: 'LAG_INVALID', words: ['--lag must be at least 1'], argv: () => ['test', good, '--y', 'y', '--lag', '0'] },
  { input: 'a lag longer than the series', code: 'LAG_INVALID', words: ['lag 40', 'no pair'],
    argv: () => ['critical', '--design', design, '--lag', '40'], lib: () => exactDwCritical({ x: { a: X }, alpha: 0.05, lag: 40 }) },
  // ---- numbers and options
  { input: 'd above 4', code: 'D_OUT_OF_RANGE', words: ['d = 4.5', '[0, 4]'],
    argv: () => ['pvalue', '--design', design, '--d', '4.5'], lib: () => exactDwPValue({ x: { a: X }, d: 4.5 }) },
  { input: 'a negative d (written --d -0.5)', code: 'D_OUT_OF_RANGE', words: ['d = -0.5', '[0, 4]'], argv: () => ['pvalue', '--design', design, '--d', '-0.5'] },
  { input: 'alpha of 0', code: 'ALPHA_OUT_OF_RANGE', words: ['level 0 is outside (0, 1)'],
    argv: () => ['critical', '--design', design, '--alpha', '0'], lib: () => exactDwCritical({ x: { a: X }, alpha: 0 }) },
  { input: 'alpha above 1', code: 'ALPHA_OUT_OF_RANGE', words: ['level 1.5 is outside (0, 1)'],
    argv: () => ['test', good, '--y', 'y', '--alpha', '1.5'], lib: () => exactDwTest({ y: Y, x: { x: X }, alpha: 1.5 }) },
  { input: 'alpha written as a percentage', code: 'OPTION_VALUE', words: ["--alpha must be a number (got '5%')", '0.05 for 5%'],
    argv: () => ['critical', '--design', design, '--alpha', '5%'] },
  { input: 'a probability outside [0, 1] for a quantile', code: 'PROBABILITY_OUT_OF_RANGE', words: ['1.5 is outside [0, 1]'],
    lib: () => DwNullDistribution.fromSpectrum(Float64Array.of(0.5, 1, 2, 3)).quantile(1.5), note: 'library only: the CLI checks alpha first' },
  { input: 'a misspelt option', code: 'OPTION_UNKNOWN', words: ["no option --alpah", 'Did you mean --alpha'], argv: () => ['test', good, '--y', 'y', '--alpah', '0.1'] },
  { input: 'an unknown command', code: 'COMMAND_UNKNOWN', words: ["no command 'tset'"], argv: () => ['tset', good] },
  { input: 'help for an unknown command', code: 'COMMAND_UNKNOWN', words: ["no command 'nosuch'"], argv: () => ['help', 'nosuch'] },
  { input: 'both --d and --residuals', code: 'OPTION_CONFLICT', words: ['Give --d or --residuals, not both'],
    argv: () => ['pvalue', '--design', design, '--d', '1.2', '--residuals', file('e\n' + lines((i) => `${Y[i]}`))] },
  { input: 'y and residuals both given to the library', code: 'OPTION_CONFLICT', words: ['exactly one of y and residuals'],
    lib: () => exactDwTest({ y: Y, residuals: Y, x: { x: X } }), note: 'library only' },
  { input: 'an option given twice with different values', code: 'OPTION_CONFLICT', words: ["--alpha is given twice", "'0.05'", "'0.1'"],
    argv: () => ['critical', '--design', design, '--alpha', '0.05', '--alpha', '0.1'] },
  { input: 'a value given to a switch', code: 'OPTION_VALUE', words: ['--no-intercept takes no value'], argv: () => ['critical', '--design', design, '--no-intercept=yes'] },
  { input: 'an option without its value', code: 'OPTION_VALUE', words: ['--alpha needs a value'], argv: () => ['critical', '--design', design, '--alpha'] },
  { input: 'a required option left out', code: 'OPTION_MISSING', words: ["'test' needs --y"], argv: () => ['test', good] },
  { input: 'the data file left out', code: 'OPTION_MISSING', words: ["'test' needs the data file"], argv: () => ['test', '--y', 'y'] },
  { input: 'an extra argument', code: 'ARGUMENT_EXTRA', words: ["does not take the argument 'extra'"], argv: () => ['critical', '--design', design, 'extra'] },
  { input: 'an unknown output format', code: 'OPTION_VALUE', words: ['--format must be one of', "got 'xml'"], argv: () => ['critical', '--design', design, '--format', 'xml'] },
  { input: 'an unknown engine', code: 'OPTION_VALUE', words: ['--method must be one of', "got 'fast'"], argv: () => ['critical', '--design', design, '--method', 'fast'] },
  { input: 'an unknown delimiter', code: 'OPTION_VALUE', words: ["--delimiter must be ',', ';' or 'tab'"], argv: () => ['critical', '--design', design, '--delimiter', '|'] },
  { input: 'a regressor value that is null or text (library input)', code: 'CELL_NOT_NUMERIC', words: ["'x' has the value null", 'observation 3'],
    lib: () => buildDesign({ x: X.map((v, i) => (i === 2 ? null : v)) as unknown as number[] }, N), note: 'library only: null is never read as 0' },
  // ---- limits
  { input: 'n beyond the spectral engines (Imhof asked for n = 50000)', code: 'SIZE_LIMIT', words: ['limited to n = 2000', "method 'eigenfree'"],
    lib: () => checkSize(50000, 3, 'imhof'), note: 'library only: checkSize, see src/limits.ts' },
  { input: 'n beyond every engine (n = 2000000)', code: 'SIZE_LIMIT', words: ['beyond every engine', 'n = 1000000'],
    lib: () => checkSize(2000000, 3, 'auto'), note: 'library only: checkSize' },
  { input: 'a level that no double-precision d reaches (m = 2, level 1e-12 next to the end of the support)', code: 'QUANTILE_UNREACHABLE', words: ['No double-precision value of d', 'Use a larger level'],
    lib: () => DwNullDistribution.fromSpectrum(Float64Array.of(1, 3)).quantile(1e-12), note: 'library only: DwNullDistribution.quantile' },
  { input: "m beyond Pan's formula (m = 500)", code: 'SIZE_LIMIT', words: ['m = n - k = 400', "method 'imhof'"], lib: () => checkSize(503, 3, 'pan'), note: 'library only: checkSize' },
];

/** Inputs that look odd but are unambiguous: each must give the answer of the plain file. */
interface Accepted { input: string; words: string[]; argv: () => string[]; tolerance?: number }
const A: Accepted[] = [
  { input: 'quoted numbers ("1.5")', words: ['same d and p'], argv: () => ['test', file('year,y,x\n' + lines((i) => `"${YEARS[i]}","${Y[i]}","${X[i]}"`)), '--y', 'y'] },
  { input: 'a UTF-8 byte-order mark', words: ['same d and p'], argv: () => ['test', file('\ufeff' + plain), '--y', 'y'] },
  { input: 'CRLF line ends', words: ['same d and p'], argv: () => ['test', file(plain.replace(/\n/g, '\r\n')), '--y', 'y'] },
  { input: 'CR line ends, and mixed line ends', words: ['same d and p'], argv: () => ['test', file(plain.replace(/\n/g, (_m, off: number) => (off % 3 ? '\r' : '\r\n'))), '--y', 'y'] },
  { input: "';' delimiters with decimal commas (detected)", words: ['same d and p'],
    argv: () => ['test', file('year;y;x\n' + lines((i) => `${YEARS[i]};${String(Y[i]).replace('.', ',')};${String(X[i]).replace('.', ',')}`)), '--y', 'y'] },
  { input: 'tab delimiters', words: ['same d and p'], argv: () => ['test', file(plain.replace(/,/g, '\t')), '--y', 'y'] },
  { input: 'quoted decimal commas in a comma-delimited file with --decimal comma', words: ['same d and p'],
    argv: () => ['test', file('year,y,x\n' + lines((i) => `${YEARS[i]},"${String(Y[i]).replace('.', ',')}","${String(X[i]).replace('.', ',')}"`)), '--y', 'y', '--decimal', 'comma'] },
  { input: 'a trailing delimiter on every row (an empty extra column)', words: ['same d and p'], argv: () => ['test', file(plain.replace(/\n/g, ',\n')), '--y', 'y'] },
  { input: 'a trailing delimiter on every data row only', words: ['same d and p'], argv: () => ['test', file(plain.replace(/\n(?=.)/g, '\n').replace(/(\d)\n/g, '$1,\n')), '--y', 'y'] },
  { input: 'blank lines at the end and spaces around cells', words: ['same d and p'], argv: () => ['test', file(plain.replace(/,/g, ' , ') + '\n\n  \n'), '--y', 'y'] },
  { input: 'a text (label) column, left out of the default regressors', words: ['same d and p'],
    argv: () => ['test', file('year,y,x,label\n' + lines((i) => `${YEARS[i]},${Y[i]},${X[i]},site ${i}`)), '--y', 'y'] },
  { input: 'a column name in Windows-1252 (not UTF-8) bytes', words: ['same d and p'],
    argv: () => ['test', file(Buffer.concat([Buffer.from('year,y,caf'), Buffer.from([0xe9]), Buffer.from('\n' + lines((i) => `${YEARS[i]},${Y[i]},${X[i]}`))])), '--y', 'y'] },
  { input: 'values near 1e300 (y and x times 1e300)', words: ['same d and p to 1e-12 relative'], tolerance: 1e-12,
    argv: () => ['test', file('year,y,x\n' + lines((i) => `${YEARS[i]},${Y[i] * 1e300},${X[i] * 1e300}`)), '--y', 'y'] },
  { input: 'values near 1e-300 (y and x times 1e-300)', words: ['same d and p to 1e-12 relative'], tolerance: 1e-12,
    argv: () => ['test', file('year,y,x\n' + lines((i) => `${YEARS[i]},${Y[i] * 1e-300},${X[i] * 1e-300}`)), '--y', 'y'] },
];

function libError(f: () => unknown): DwError | string {
  try { f(); } catch (e) { return isDwError(e) ? (e as DwError) : `not a DwError: ${String(e)}`; }
  return 'no error';
}

describe('the catalogue of bad inputs', () => {
  it('has at least 40 entries, with distinct descriptions', () => {
    expect(C.length).toBeGreaterThanOrEqual(40);
    expect(new Set(C.map((e) => e.input)).size).toBe(C.length);
  });
  for (const e of C) {
    if (e.argv) {
      it(`CLI: ${e.input} -> ${e.code}`, async () => {
        const argv = e.argv!();
        const before = readdirSync(dir).sort();
        const r = await cli(...argv);
        expect(r.status).toBe(2);
        expect(r.out).toBe('');
        expect(r.err.endsWith('\n')).toBe(true);
        expect(r.err.slice(0, -1)).not.toMatch(/[\r\n]/); // exactly one line
        expect(r.err).toMatch(/^exact-dw: /);
        expect(r.err).not.toMatch(/\n\s+at /); // no stack trace
        expect(r.err.trim().endsWith(`[${e.code}]`)).toBe(true);
        for (const w of e.words) expect(r.err).toContain(w);
        expect(readdirSync(dir).sort()).toEqual(before); // nothing written
      });
    }
    if (e.lib) {
      it(`library: ${e.input} -> ${e.code}`, () => {
        const err = libError(e.lib!);
        expect(typeof err === 'string' ? err : err.code).toBe(e.code);
        const text = typeof err === 'string' ? err : err.toLine();
        for (const w of e.libWords ?? e.words) expect(text).toContain(w);
        if (typeof err !== 'string') expect(err.hint.length).toBeGreaterThan(0);
      });
    }
  }
  it('an existing output file is left byte for byte as it was; with force it is replaced whole', () => {
    const p = file('precious\n', 'keep.txt');
    expect(libError(() => writeText(p, 'other', false))).toHaveProperty('code', 'FILE_EXISTS');
    expect(readFileSync(p, 'utf8')).toBe('precious\n');
    writeText(p, 'replaced\n', true);
    expect(readFileSync(p, 'utf8')).toBe('replaced\n');
    expect(readdirSync(dir).filter((f) => f.includes('.partial'))).toEqual([]);
  });
});

describe('awkward but unambiguous inputs are accepted', () => {
  const ref = async () => JSON.parse((await cli('test', good, '--y', 'y', '--format', 'json')).out);
  for (const a of A) {
    it(`${a.input}: ${a.words.join(', ')}`, async () => {
      const base = await ref();
      const r = await cli(...a.argv(), '--format', 'json');
      expect(r.err).toBe('');
      expect(r.status).toBe(0);
      const j = JSON.parse(r.out);
      expect(j.n).toBe(base.n);
      expect(j.k).toBe(base.k);
      if (a.tolerance === undefined) {
        expect(j.d).toBe(base.d);
        expect(j.pValue).toBe(base.pValue);
      } else {
        expect(Math.abs(j.d - base.d)).toBeLessThan(a.tolerance * base.d);
        expect(Math.abs(j.pValue - base.pValue)).toBeLessThan(a.tolerance * base.pValue);
      }
    });
  }
});

/** The markdown table of docs/errors-and-limits.md, rendered from the catalogue. */
function renderTable(): string {
  const esc = (s: string) => s.replace(/\|/g, '\\|');
  const rows = ['| input | answer | key words of the message | checked through |', '|---|---|---|---|'];
  for (const e of C) {
    const via = [e.argv ? 'CLI' : '', e.lib ? 'library' : ''].filter(Boolean).join(' + ');
    const words = e.words.map((w) => `"${esc(w)}"`).join(', ') + (e.libWords ? `; library: ${e.libWords.map((w) => `"${esc(w)}"`).join(', ')}` : '');
    rows.push(`| ${esc(e.input)} | \`${e.code}\` | ${words} | ${via}${e.note ? ` (${esc(e.note)})` : ''} |`);
  }
  for (const a of A) rows.push(`| ${esc(a.input)} | accepted | ${esc(a.words.join(', '))} as the plain file | CLI |`);
  return rows.join('\n');
}

describe('docs/errors-and-limits.md', () => {
  it('holds the catalogue table exactly as rendered from this file (regenerate with UPDATE_DOCS=1)', () => {
    const path = join(process.cwd(), 'docs', 'errors-and-limits.md');
    let doc = readFileSync(path, 'utf8');
    const start = '<!-- catalogue:start (generated by test/catalogue.test.ts) -->';
    const end = '<!-- catalogue:end -->';
    let i = doc.indexOf(start);
    let j = doc.indexOf(end);
    expect(i).toBeGreaterThanOrEqual(0);
    expect(j).toBeGreaterThan(i);
    const table = renderTable();
    if (process.env.UPDATE_DOCS === '1' && !process.env.CI) {
      // update mode: rewrite the section, then check the file as written (never a silent pass)
      writeFileSync(path, doc.slice(0, i + start.length) + '\n' + table + '\n' + doc.slice(j));
      doc = readFileSync(path, 'utf8');
      [i, j] = [doc.indexOf(start), doc.indexOf(end)];
    }
    expect(doc.slice(i + start.length, j).trim()).toBe(table);
  });
  it('lists every error code the catalogue uses', () => {
    const doc = readFileSync(join(process.cwd(), 'docs', 'errors-and-limits.md'), 'utf8');
    for (const code of new Set(C.map((e) => e.code))) expect(doc).toContain(`\`${code}\``);
  });
});
