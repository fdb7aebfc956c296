/** `exact-dw test`: fit y on the regressors of a data file and test the residuals exactly. */
import { DwError } from '../../errors.js';
import { numericColumn } from '../../data/csv.js';
import { exactDwTest, type Alternative } from '../../inference/dw-test.js';
import { renderText } from '../../report/text.js';
import { choiceOption, numberOption, required } from '../args.js';
import { CSV_OPTIONS, MODEL_OPTIONS, chooseRegressors, loadTable, problemOptions } from '../shared.js';
import type { Command } from './command.js';

export const testCommand: Command = {
  name: 'test',
  summary: 'fit y on its regressors and run the exact Durbin-Watson test',
  usage: 'exact-dw test DATA.csv --y COL [--x A,B,...] [options]',
  positionals: 1,
  options: {
    y: { type: 'string', value: 'COL', help: 'the dependent variable' },
    x: { type: 'string', value: 'A,B,...', help: 'regressors (default: every other numeric column)' },
    alternative: { type: 'string', value: 'ALT', help: 'positive (default), negative or two-sided' },
    alpha: { type: 'string', value: 'A', help: 'significance level in (0, 1) (default 0.05)' },
    ...MODEL_OPTIONS,
    ...CSV_OPTIONS,
    format: { type: 'string', value: 'FMT', help: 'text (default) or json' },
  },
  run({ values, positionals, io }) {
    const format = choiceOption(values, 'format', ['text', 'json'] as const, 'text');
    if (positionals.length !== 1) {
      throw new DwError('OPTION_MISSING', "'test' needs the data file: exact-dw test DATA.csv --y COL.", "See 'exact-dw test --help'.");
    }
    const alternative = choiceOption<Alternative>(values, 'alternative', ['positive', 'negative', 'two-sided'], 'positive');
    const alpha = numberOption(values, 'alpha', 0.05) as number;
    const table = loadTable(io, positionals[0], values);
    const yName = required(values, 'y', 'test');
    const y = numericColumn(table, yName);
    const x = chooseRegressors(table, values, yName);
    const result = exactDwTest({ y, x, alternative, alpha, ...problemOptions(values, table) });
    io.out(format === 'json' ? JSON.stringify(result, null, 2) + '\n' : renderText(result));
    return 0;
  },
};
