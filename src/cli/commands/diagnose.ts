/**
 * `exact-dw diagnose`: the asymptotic serial-correlation checks that stay valid in dynamic models
 * (Durbin's h, Breusch-Godfrey, Durbin's alternative test), from src/dynamic/. Thin: all numbers come
 * from the library.
 */
import { DwError } from '../../errors.js';
import { numericColumn } from '../../data/csv.js';
import type { Alternative } from '../../core/alternative.js';
import { dynamicModelCheck, serialCorrelationTests, type DynamicDiagnosis, type SerialTests } from '../../dynamic/serial-tests.js';
import { choiceOption, integerOption, required } from '../args.js';
import { CSV_OPTIONS, applyTimeRule, chooseRegressors, formatP, frequencyOption, loadTable, timeColumn, TEXT_JSON_FORMAT } from '../shared.js';
import type { Command } from './command.js';
import { durbinHWords, warningText } from '../../report/wording.js';
import { inline } from '../../report/format.js';

function num(v: number): string {
  return Number.isFinite(v) ? v.toFixed(4) : String(v);
}

function diagnoseText(s: SerialTests, dyn: DynamicDiagnosis | null): string {
  const lines = [`Serial-correlation checks for dynamic models (asymptotic), n = ${s.n}, k = ${s.k} columns including any intercept`];
  if (dyn) {
    const [head, ...rest] = dyn.notes.map((n) => inline(warningText(n), 'text'));
    lines.push(`  ${head}`);
    for (const note of rest) lines.push(`  note: ${note}`);
  } else {
    lines.push('  No regressor is the dependent variable lagged one period: the exact Durbin-Watson test (exact-dw test) applies;');
    lines.push('  the checks below are asymptotic alternatives.');
  }
  lines.push('');
  if (s.durbinH) {
    const h = s.durbinH;
    if (h.h === null) lines.push(`  Durbin's h: undefined. ${inline(durbinHWords(h), 'text')}`);
    else lines.push(`  Durbin's h = ${num(h.h)}   (r1 = ${num(h.r1)}, n V = ${num(h.nV)}), p = ${formatP(h.pValue as number)} (${s.alternative}, normal)`);
  }
  const bg = s.breuschGodfrey;
  lines.push(`  Breusch-Godfrey, order ${bg.order}: LM = n R^2 = ${num(bg.lm)}, p = ${formatP(bg.pChiSquare)} (chi-square, ${bg.df1} df)`);
  lines.push(`                          F = ${num(bg.f)}, p = ${formatP(bg.pF)} (F(${bg.df1}, ${bg.df2}))`);
  const t = s.residualT;
  lines.push(`  residual on lagged residual: t = ${num(t.t)}, p = ${formatP(t.pValue)} (${s.alternative}, normal); Student t(${t.df}): ${formatP(t.pStudent)}`);
  return lines.join('\n') + '\n';
}

export const diagnoseCommand: Command = {
  name: 'diagnose',
  summary: "Durbin's h and the Breusch-Godfrey test, for models with a lagged dependent variable",
  usage: 'exact-dw diagnose DATA.csv --y COL [--x A,B,...] [--lagged-dependent COL] [--bg-order P] [options]',
  positionals: 1,
  details: [
    'With y lagged one period among the regressors, d is biased towards 2 and its exact test is not valid.',
    'The lagged dependent regressor is detected (x_t = y_{t-1}) unless named with --lagged-dependent.',
    'Every statistic here is asymptotic.',
  ].join('\n'),
  options: {
    y: { type: 'string', value: 'COL', help: 'the dependent variable' },
    x: { type: 'string', value: 'A,B,...', help: 'regressors (default: every other numeric column)' },
    'lagged-dependent': { type: 'string', value: 'COL', help: 'the regressor that is y lagged one period (detected when omitted)' },
    'bg-order': { type: 'string', value: 'P', help: 'order of the Breusch-Godfrey test (default 1; 4 for quarterly data)' },
    alternative: { type: 'string', value: 'ALT', help: "positive (default), negative or two-sided, for h and the t-test" },
    'no-intercept': { type: 'boolean', help: 'do not add an intercept (a constant column you supply still counts as one)' },
    time: { type: 'string', value: 'COL', help: 'time column: integers, quarters (2015Q1), months (2015-01) or ISO dates; not a regressor; lags are taken in periods' },
    'no-time': { type: 'boolean', help: 'no time index: do not take a time-like column as the time index' },
    frequency: { type: 'string', value: 'F', help: 'frequency of the --time dates (inferred when omitted)' },
    ...CSV_OPTIONS,
    ...TEXT_JSON_FORMAT,
  },
  run({ values, positionals, io }) {
    const format = choiceOption(values, 'format', ['text', 'json'] as const, 'text');
    if (positionals.length !== 1) {
      throw new DwError('OPTION_MISSING', "'diagnose' needs the data file: exact-dw diagnose DATA.csv --y COL.", "See 'exact-dw diagnose --help'.");
    }
    const alternative = choiceOption<Alternative>(values, 'alternative', ['positive', 'negative', 'two-sided'], 'positive');
    const order = integerOption(values, 'bg-order', 1) as number;
    const table = loadTable(io, positionals[0], values);
    const yName = required(values, 'y', 'diagnose');
    const y = numericColumn(table, yName);
    const timed = applyTimeRule(io, table, values, yName);
    const x = chooseRegressors(table, timed, yName);
    const times = typeof timed.time === 'string' ? timeColumn(table, timed.time, frequencyOption(values)) : undefined;
    const declared = typeof values['lagged-dependent'] === 'string' ? values['lagged-dependent'] : undefined;
    const common = { y, x, intercept: !values['no-intercept'], order, alternative, times };
    const dyn = dynamicModelCheck({ ...common, laggedDependent: declared });
    const s = serialCorrelationTests({ ...common, laggedDependent: dyn?.laggedDependent });
    if (format === 'json') {
      io.out(JSON.stringify({
        n: s.n,
        k: s.k,
        alternative,
        laggedDependent: dyn ? { name: dyn.laggedDependent, how: dyn.how } : null,
        dValid: dyn === null,
        message: dyn ? inline(warningText(dyn.notes[0]), 'text') : null,
        asymptotic: true,
        durbinH: s.durbinH ? { ...s.durbinH, reason: inline(durbinHWords(s.durbinH), 'text') } : null,
        breuschGodfrey: s.breuschGodfrey,
        residualT: s.residualT,
        notes: dyn ? dyn.notes.slice(1).map((n) => ({ ...n, text: inline(warningText(n), 'text') })) : [],
      }, null, 2) + '\n');
    } else {
      io.out(diagnoseText(s, dyn));
    }
    return 0;
  },
};
