/** `exact-dw critical`: exact critical values of d at level alpha for a design. */
import { prepareProblem } from '../../problem/problem.js';
import { checkAlpha } from '../../core/alternative.js';
import { choiceOption, numberOption, required } from '../args.js';
import { CSV_OPTIONS, MODEL_OPTIONS, applyTimeRule, designColumns, loadTable, problemOptions, DESIGN_OPTION, TEXT_JSON_FORMAT } from '../shared.js';
import type { Command } from './command.js';

export const criticalCommand: Command = {
  name: 'critical',
  summary: 'exact critical values of d at level alpha for your design',
  usage: 'exact-dw critical --design X.csv [--alpha 0.05] [options]',
  details: 'lower: P(D <= lower) = alpha (test for positive autocorrelation);\nupper: P(D >= upper) = alpha (test for negative autocorrelation).',
  options: {
    ...DESIGN_OPTION,
    alpha: { type: 'string', value: 'A', help: 'significance level in (0, 1) (default 0.05)' },
    ...MODEL_OPTIONS,
    ...CSV_OPTIONS,
    ...TEXT_JSON_FORMAT,
  },
  run({ values, io }) {
    const format = choiceOption(values, 'format', ['text', 'json'] as const, 'text');
    const alpha = numberOption(values, 'alpha', 0.05) as number;
    checkAlpha(alpha);
    const table = loadTable(io, required(values, 'design', 'critical'), values);
    const timed = applyTimeRule(io, table, values);
    const problem = prepareProblem(designColumns(table, timed), table.rows.length, problemOptions(timed, table));
    const dist = problem.distribution;
    const lower = dist.quantile(alpha);
    const upper = dist.upperQuantile(alpha);
    const { n, k } = problem.factored.design;
    if (format === 'json') {
      io.out(JSON.stringify({ lower, upper, alpha, n, k }, null, 2) + '\n');
    } else {
      io.out([
        `Exact critical values of d at alpha = ${alpha} (n = ${n}, k = ${k} columns including any intercept)`,
        `  lower ${lower.toFixed(4)}: reject for positive autocorrelation when d <= ${lower.toFixed(4)}`,
        `  upper ${upper.toFixed(4)}: reject for negative autocorrelation when d >= ${upper.toFixed(4)}`,
        '',
      ].join('\n'));
    }
    return 0;
  },
};
