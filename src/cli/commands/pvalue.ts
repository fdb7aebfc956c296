/** `exact-dw pvalue`: exact p-values of a given d (or of the d of given residuals) for a design. */
import { inline } from '../../report/format.js';
import { warningText } from '../../report/wording.js';
import { DwError } from '../../errors.js';
import { durbinWatson } from '../../core/difference.js';
import { numericColumn } from '../../data/csv.js';
import { prepareProblem } from '../../problem/problem.js';
import { checkResiduals, pValuesFor } from '../../inference/dw-test.js';
import { choiceOption, numberOption, required } from '../args.js';
import { CSV_OPTIONS, MODEL_OPTIONS, applyTimeRule, designColumns, formatP, loadTable, problemOptions, DESIGN_OPTION, TEXT_JSON_FORMAT } from '../shared.js';
import type { Command } from './command.js';

export const pvalueCommand: Command = {
  name: 'pvalue',
  summary: 'exact p-values of an observed d for your design',
  usage: 'exact-dw pvalue --design X.csv (--d VALUE | --residuals E.csv) [options]',
  options: {
    ...DESIGN_OPTION,
    d: { type: 'string', value: 'VALUE', help: 'the observed Durbin-Watson statistic' },
    residuals: { type: 'string', value: 'FILE', help: 'CSV with one column of OLS residuals (instead of --d)' },
    ...MODEL_OPTIONS,
    ...CSV_OPTIONS,
    ...TEXT_JSON_FORMAT,
  },
  run({ values: given, io }) {
    const format = choiceOption(given, 'format', ['text', 'json'] as const, 'text');
    const table = loadTable(io, required(given, 'design', 'pvalue'), given);
    const values = applyTimeRule(io, table, given);
    const options = problemOptions(values, table);
    const x = designColumns(table, values);
    const n = table.rows.length;
    const hasD = values.d !== undefined;
    const hasE = values.residuals !== undefined;
    if (hasD === hasE) {
      throw new DwError(hasD ? 'OPTION_CONFLICT' : 'OPTION_MISSING', hasD ? 'Give --d or --residuals, not both.' : "'pvalue' needs --d or --residuals.",
        "See 'exact-dw pvalue --help'.");
    }
    const problem = prepareProblem(x, n, options);
    let d: number;
    if (hasD) {
      d = numberOption(values, 'd') as number;
    } else {
      const et = loadTable(io, values.residuals as string, values);
      if (et.headers.length !== 1) {
        throw new DwError('OPTION_VALUE', `The residuals file has ${et.headers.length} columns; it must have exactly one.`, 'Keep only the residual column.');
      }
      if (et.rows.length !== n) {
        throw new DwError('LENGTH_MISMATCH', `The residuals file has ${et.rows.length} rows but the design has ${n}.`, 'Use residuals from a fit on this same design.');
      }
      const checked = checkResiduals(problem, numericColumn(et, et.headers[0]));
      for (const w of checked.warnings) io.err(`exact-dw: note: ${inline(warningText(w), 'text')}\n`);
      d = durbinWatson(checked.residuals, problem.pairs);
    }
    const p = pValuesFor(problem, d);
    if (format === 'json') {
      const { d: dd, n: nn, k, pPositive, pNegative, pTwoSided, method, errorBound, errorBoundPositive, errorBoundNegative } = p;
      io.out(JSON.stringify({ d: dd, n: nn, k, pPositive, pNegative, pTwoSided, method, errorBound, errorBoundPositive, errorBoundNegative }, null, 2) + '\n');
    } else {
      io.out([
        `d = ${p.d.toFixed(4)}   (n = ${p.n}, k = ${p.k} columns including any intercept)`,
        `  P(D <= d), positive autocorrelation:  ${formatP(p.pPositive, { errorBound: p.errorBound })}`,
        `  P(D >= d), negative autocorrelation:  ${formatP(p.pNegative, { errorBound: p.errorBound })}`,
        `  two-sided:                            ${formatP(p.pTwoSided, { errorBound: p.errorBound })}`,
        `  engine ${p.method}, absolute error below ${p.errorBound.toExponential(1)}`,
        '',
      ].join('\n'));
    }
    return 0;
  },
};
