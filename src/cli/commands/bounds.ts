/** `exact-dw bounds`: exact Durbin-Watson bounds d_L, d_U for one n, k' and alpha (and, with --d, the zone of d). */
import { DwError } from '../../errors.js';
import { bounds } from '../../bounds/bounds.js';
import { boundsZone } from '../../bounds/zone.js';
import type { Alternative } from '../../core/alternative.js';
import { choiceOption, integerOption, methodOption, numberOption } from '../args.js';
import type { Command } from './command.js';
import { TEXT_JSON_FORMAT } from '../shared.js';
import { boundsResolutionWords } from '../../report/wording.js';

export const boundsCommand: Command = {
  name: 'bounds',
  summary: "exact bounds d_L, d_U for any n, k' and alpha (what printed tables give, for any case)",
  usage: 'exact-dw bounds --n N --k K [--alpha 0.05] [--no-intercept] [--d D] [--format text|json]',
  details: [
    "K is k', the number of regressors OTHER THAN the intercept (the printed tables' convention):",
    "a regression of y on a constant and one variable has --k 1.",
    'alpha is the one-sided level of the test against positive autocorrelation: reject when d < d_L,',
    'do not reject when d > d_U, inconclusive in between. Against negative autocorrelation use 4 - d_U',
    'and 4 - d_L; for a two-sided test at 5% ask for --alpha 0.025 (or give --d with --alternative two-sided).',
    'd_L and d_U are exact quantiles of the bounding distributions (Durbin & Watson 1950), n <= 5000.',
    'With --d the output also says in which zone d lies; the exact p-value for your own design',
    "(exact-dw test or pvalue) resolves an inconclusive zone.",
  ].join('\n'),
  options: {
    n: { type: 'string', value: 'N', help: "number of observations (at least k' + 3)" },
    k: { type: 'string', value: 'K', help: "k': regressors other than the intercept (0, 1, 2, ...)" },
    alpha: { type: 'string', value: 'A', help: 'one-sided level in (0, 1) (default 0.05)' },
    'no-intercept': { type: 'boolean', help: 'bounds for a model without intercept (k\' then counts every column)' },
    d: { type: 'string', value: 'D', help: 'an observed Durbin-Watson statistic: also report its zone' },
    alternative: { type: 'string', value: 'ALT', help: 'with --d: positive (default), negative or two-sided' },
    digits: { type: 'string', value: 'D', help: 'decimals in text output (default 3, as printed tables; at most 9)' },
    method: { type: 'string', value: 'ENGINE', help: 'auto (default: closed-form route), imhof or pan (eigenfree needs a design, not bounds)' },
    ...TEXT_JSON_FORMAT,
  },
  run({ values, io }) {
    const format = choiceOption(values, 'format', ['text', 'json'] as const, 'text');
    const n = countOption(values.n, 'n');
    const kPrime = countOption(values.k, 'k');
    const alpha = numberOption(values, 'alpha', 0.05) as number;
    const intercept = !values['no-intercept'];
    const digits = integerOption(values, 'digits', 3) as number;
    if (digits < 1 || digits > 9) {
      throw new DwError('OPTION_VALUE', `--digits must be between 1 and 9 (got ${digits}).`, 'The bounds are exact to about 1e-10; 3 decimals match printed tables.');
    }
    if (values.alternative !== undefined && values.d === undefined) {
      throw new DwError('OPTION_CONFLICT', '--alternative only applies together with --d.', 'Give the observed d with --d, or leave out --alternative.');
    }
    const alternative = choiceOption(values, 'alternative', ['positive', 'negative', 'two-sided'] as const, 'positive') as Alternative;
    const method = methodOption(values);
    const b = bounds(n, kPrime, alpha, { intercept, method });
    const d = values.d === undefined ? undefined : (numberOption(values, 'd') as number);
    const zone = d === undefined ? null
      : alternative === 'two-sided'
        ? boundsZone(d, n, kPrime, alpha, alternative, null, { intercept })
        : boundsZone(d, n, kPrime, alpha, alternative, null, { intercept, known: b });
    if (format === 'json') {
      io.out(JSON.stringify({
        n, kPrime, k: kPrime + (intercept ? 1 : 0), alpha, intercept, m: b.m,
        dL: b.dL, dU: b.dU,
        test: 'one-sided, against positive autocorrelation: reject when d < dL, do not reject when d > dU',
        negative: { lower: 4 - b.dU, upper: 4 - b.dL },
        ...(zone ? { d, alternative, zone: { ...zone, resolution: boundsResolutionWords(zone) } } : {}),
      }, null, 2) + '\n');
      return 0;
    }
    const f = (x: number) => x.toFixed(digits);
    const lines = [
      `Durbin-Watson bounds, n = ${n}, k' = ${kPrime} regressor${kPrime === 1 ? '' : 's'} ${intercept ? 'besides the intercept' : '(model without intercept)'}, alpha = ${alpha} one-sided`,
      `  d_L = ${f(b.dL)}   d_U = ${f(b.dU)}`,
      `  against positive autocorrelation: reject when d < ${f(b.dL)}, inconclusive from ${f(b.dL)} to ${f(b.dU)}, do not reject above ${f(b.dU)}`,
      `  against negative autocorrelation: reject when d > ${f(4 - b.dL)}, inconclusive from ${f(4 - b.dU)} to ${f(4 - b.dL)}`,
      '  exact quantiles of the bounding distributions (Durbin & Watson 1950); your own design\'s exact critical value lies between them',
    ];
    if (zone) {
      lines.push('', `zone of d = ${d}: ${zone.zone}`);
      if (alternative === 'two-sided') lines.push(`  (two-sided at ${alpha}: the bounds at ${zone.level} in each tail are d_L = ${f(zone.dL)}, d_U = ${f(zone.dU)})`);
      lines.push(`  ${boundsResolutionWords(zone)}`);
    }
    io.out(lines.join('\n') + '\n');
    return 0;
  },
};

/** A whole-number option given as text, with the meaning of the option in the message. */
function countOption(v: string | boolean | undefined, name: 'n' | 'k'): number {
  if (typeof v !== 'string' || v.trim() === '') {
    throw new DwError('OPTION_MISSING', `'bounds' needs --${name}.`,
      name === 'n' ? 'Give the number of observations, e.g. --n 20.' : "Give k', the regressors other than the intercept, e.g. --k 1.");
  }
  const t = v.trim();
  if (!/^[+-]?\d+(\.\d+)?([eE][+-]?\d+)?$/.test(t)) {
    throw new DwError('OPTION_VALUE', `--${name} must be a whole number (got '${t}').`, name === 'n' ? 'Write e.g. --n 20.' : 'Write e.g. --k 2.', { value: t });
  }
  const x = Number(t);
  if (!Number.isInteger(x) || x < 0) {
    throw new DwError(name === 'n' ? 'N_INVALID' : 'K_INVALID',
      name === 'n' ? `n must be a whole number of observations (got ${t}).` : `k' must be a whole number of at least 0 (got ${t}).`,
      name === 'n' ? 'Write e.g. --n 20.' : "k' counts the regressors other than the intercept: write e.g. --k 2.", { value: t });
  }
  return x;
}
