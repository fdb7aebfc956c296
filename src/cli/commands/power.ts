/** `exact-dw power`: exact power of the test against AR(1) errors for a design (src/power/). */
import { DwError } from '../../errors.js';
import type { Alternative } from '../../inference/dw-test.js';
import { prepareProblem } from '../../problem/problem.js';
import { powerForProblem, type PowerRoute } from '../../power/exact-power.js';
import type { ErrorProcess } from '../../power/weights.js';
import { choiceOption, numberOption, required } from '../args.js';
import { CSV_OPTIONS, MODEL_OPTIONS, applyTimeRule, designColumns, loadTable, problemOptions, DESIGN_OPTION, TEXT_JSON_FORMAT } from '../shared.js';
import type { Command } from './command.js';
import { powerNoteText } from '../../report/wording.js';
import { inline } from '../../report/format.js';

const NUMBER = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;
const DEFAULT_RHO = '0.1:0.9:0.1';
const MAX_POINTS = 1000;

/**
 * The --rho list: comma-separated numbers and FROM:TO:STEP ranges (both ends included when the
 * steps land on TO), e.g. `0.1,0.3,0.5` or `0:0.9:0.1,0.95`. Range values are rounded to 12
 * decimals so that 0 + 3 * 0.1 is 0.3.
 *
 * @example
 * ```ts
 * parseRhoList('0:0.9:0.3,0.95'); // [0, 0.3, 0.6, 0.9, 0.95]
 * ```
 */
export function parseRhoList(text: string): number[] {
  const out: number[] = [];
  for (const raw of text.split(',')) {
    const item = raw.trim();
    if (item === '') {
      throw new DwError('OPTION_VALUE', `--rho has an empty item in '${text}'.`, 'Separate values with commas, e.g. --rho 0.1,0.3,0.5.');
    }
    const parts = item.split(':').map((s) => s.trim());
    if (parts.length === 1) {
      if (!NUMBER.test(item)) {
        throw new DwError('OPTION_VALUE', `--rho: '${item}' is not a number.`, 'Write values like 0.3 or -0.5, or a range FROM:TO:STEP.', { value: item });
      }
      out.push(Number(item));
      continue;
    }
    if (parts.length !== 3 || !parts.every((p) => NUMBER.test(p))) {
      throw new DwError('RANGE_SYNTAX', `--rho: '${item}' is not a range FROM:TO:STEP.`, 'Write a range like 0.1:0.9:0.1.', { value: item });
    }
    const [from, to, step] = parts.map(Number);
    if (!(step > 0) || to < from) {
      throw new DwError('RANGE_SYNTAX', `--rho: the range '${item}' needs FROM <= TO and a positive STEP.`, 'Write a range like 0.1:0.9:0.1.', { value: item });
    }
    const count = Math.floor((to - from) / step + 1e-9) + 1;
    if (out.length + count > MAX_POINTS) {
      throw new DwError('RANGE_SYNTAX', `--rho asks for more than ${MAX_POINTS} values.`, 'Use a coarser step.', { value: item });
    }
    // rounded to 12 decimals so that 0.1 + 2 * 0.1 prints as 0.3
    for (let i = 0; i < count; i++) out.push(Math.round((from + i * step) * 1e12) / 1e12);
  }
  return out;
}

/** rho with the fewest decimals (at least three) that give it back exactly, e.g. 0.999999 -> "0.999999". */
function rhoDigits(r: number): string {
  for (let dec = 3; dec <= 15; dec++) if (Number(r.toFixed(dec)) === r) return r.toFixed(dec);
  return String(r);
}

function powerText(p: ReturnType<typeof powerForProblem>): string {
  const test = p.alternative === 'positive' ? `reject when d <= ${p.critical.toFixed(4)}`
    : p.alternative === 'negative' ? `reject when d >= ${p.critical.toFixed(4)}`
      : `reject when d <= ${p.critical.toFixed(4)} or d >= ${(p.criticalUpper as number).toFixed(4)}`;
  // rho as given (at least three decimals), so that 0.999999 is not printed as 1.000
  const rhoText = rhoDigits;
  const width = Math.max(6, ...p.curve.map((pt) => rhoText(pt.rho).length));
  const what = p.process === 'ar1' ? 'AR(1) errors u_t = rho u_{t-1} + e_t' : `errors u_t = rho u_{t-${p.lag}} + e_t`;
  const lines = [
    `Exact power of the ${p.lag > 1 ? `lag-${p.lag} ` : ''}Durbin-Watson test (n = ${p.n}, k = ${p.k} columns including any intercept)`,
    `  test: alternative ${p.alternative}, size ${p.alpha}: ${test}`,
    `  against stationary ${what}`,
    '',
    `  ${'rho'.padStart(width)}   power`,
  ];
  for (const pt of p.curve) lines.push(`  ${rhoText(pt.rho).padStart(width)}   ${pt.power.toFixed(4)}`);
  lines.push('');
  const searched = !p.notes.some((n) => n.code === 'TARGET_NOT_SEARCHED');
  if (!searched) {
    lines.push('  the rho reaching a target power was not searched for (--target none)');
  } else if (p.rhoAtTarget === null) {
    lines.push(`  power ${p.target} is not reached for |rho| <= 0.99`);
  } else {
    lines.push(`  power ${p.target} is first reached at rho = ${p.rhoAtTarget.toFixed(4)}`);
  }
  lines.push(`  absolute error of each power below ${Math.max(p.errorBound, 1e-16).toExponential(1)}`);
  for (const note of p.notes) {
    const text = inline(powerNoteText(note), 'text');
    if (note.code === 'POWER_ROUTE') lines.push(`  route: ${text.replace(/^Route: /, '')}`);
    else if (note.code !== 'TARGET_NOT_REACHED' && note.code !== 'TARGET_NOT_SEARCHED') lines.push(`  note: ${text}`);
  }
  return lines.join('\n') + '\n';
}

export const powerCommand: Command = {
  name: 'power',
  summary: 'exact power of the test against AR(1) errors for your design',
  usage: 'exact-dw power --design X.csv [--rho 0.1,0.3,0.5] [--alpha 0.05] [--target 0.8] [options]',
  details: [
    'power(rho) = P(test rejects | errors follow a stationary AR(1) process with parameter rho),',
    'computed exactly for your X, with the exact critical value at alpha.',
    '--rho takes numbers and FROM:TO:STEP ranges, e.g. 0:0.9:0.1 (default ' + DEFAULT_RHO + ').',
    'Small designs use the weights of the quadratic form (dense route); large ones, up to n = 100000,',
    'banded factorisations without eigenvalues (eigen-free route); --route forces one.',
  ].join('\n'),
  options: {
    ...DESIGN_OPTION,
    rho: { type: 'string', value: 'LIST', help: `values of rho in (-1, 1), numbers or FROM:TO:STEP (default ${DEFAULT_RHO})` },
    alpha: { type: 'string', value: 'A', help: 'size of the test in (0, 1) (default 0.05)' },
    target: { type: 'string', value: 'P', help: 'power to reach; the smallest rho reaching it is reported (default 0.8; none skips the search)' },
    alternative: { type: 'string', value: 'ALT', help: 'positive (default), negative or two-sided' },
    process: { type: 'string', value: 'NAME', help: 'ar1 (default) or seasonal: u_t = rho u_{t-J} + e_t with J = --lag' },
    route: { type: 'string', value: 'ROUTE', help: 'auto (default), dense (n <= 600) or eigenfree (n <= 100000)' },
    ...MODEL_OPTIONS,
    ...CSV_OPTIONS,
    ...TEXT_JSON_FORMAT,
  },
  run({ values, io }) {
    const format = choiceOption(values, 'format', ['text', 'json'] as const, 'text');
    const alpha = numberOption(values, 'alpha', 0.05) as number;
    const searchTarget = values.target !== 'none';
    const target = searchTarget ? numberOption(values, 'target', 0.8) as number : 0.8;
    const alternative = choiceOption<Alternative>(values, 'alternative', ['positive', 'negative', 'two-sided'], 'positive');
    const process = choiceOption<ErrorProcess>(values, 'process', ['ar1', 'seasonal'], 'ar1');
    const route = choiceOption<PowerRoute>(values, 'route', ['auto', 'dense', 'eigenfree'], 'auto');
    const rho = parseRhoList(typeof values.rho === 'string' ? values.rho : DEFAULT_RHO);
    const table = loadTable(io, required(values, 'design', 'power'), values);
    const timed = applyTimeRule(io, table, values);
    const options = problemOptions(timed, table);
    const problem = prepareProblem(designColumns(table, timed), table.rows.length, options);
    const p = powerForProblem(problem, { alpha, rho, target, alternative, process, route, searchTarget, times: options.times });
    if (format === 'json') {
      const out: Record<string, unknown> = {
        critical: p.critical,
        ...(p.criticalUpper !== null ? { criticalUpper: p.criticalUpper } : {}),
        power: p.curve.map(({ rho: r, power }) => ({ rho: r, power })),
        rhoAtTarget: p.rhoAtTarget,
        target: searchTarget ? p.target : null,
        alpha: p.alpha,
        n: p.n,
        k: p.k,
        alternative: p.alternative,
        process: p.process,
        lag: p.lag,
        gaps: p.gaps,
        route: p.route,
        errorBound: p.errorBound,
        notes: p.notes.map((n) => ({ ...n, text: inline(powerNoteText(n), 'text') })),
      };
      io.out(JSON.stringify(out, null, 2) + '\n');
    } else {
      io.out(powerText(p));
    }
    return 0;
  },
};
