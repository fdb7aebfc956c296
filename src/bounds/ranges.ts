/**
 * The list syntax of the table command: whole numbers as single values, ranges `A-B`, ranges with
 * a step `A-B:S`, separated by commas (`10,15,20-25`, `10-200:10`); levels as a comma list of
 * fractions (`0.05,0.01`). Every mistake is reported with what is wrong and a correct example.
 */
import { DwError, type DwErrorCode } from '../errors.js';
import { POLICY } from '../policy.js';

/** Longest list one option may expand to (a guard against typing 1-100000000 by mistake). */
export const MAX_LIST_LENGTH = POLICY.limits.MAX_LIST_LENGTH;

/**
 * Parse a list of whole numbers such as `6-200`, `10,15,20-25` or `10-200:10`.
 *
 * @param text   the option's text
 * @param option the option name, for messages (e.g. `--n`)
 * @param limit  largest value allowed, with the error code and reason to give when it is exceeded
 * @param examples three correct values of the option, quoted in messages
 *
 * @example
 * ```ts
 * parseIntegerList('10,15,20-23', '--n'); // [10, 15, 20, 21, 22, 23]
 * parseIntegerList('10-30:10', '--n');    // [10, 20, 30]
 * ```
 */
export function parseIntegerList(
  text: string,
  option: string,
  limit?: { max: number; code: DwErrorCode; reason: string },
  examples: [string, string, string] = ['6-200', '10,15,20-25', '10-200:10'],
): number[] {
  const example = `e.g. ${option} ${examples[0]}, ${option} ${examples[1]} or ${option} ${examples[2]}`;
  const trimmed = text.trim();
  if (trimmed === '') throw syntax(`${option} is empty.`, `Give whole numbers or ranges, ${example}.`, text);
  const out: number[] = [];
  for (const raw of trimmed.split(',')) {
    const item = raw.trim();
    if (item === '') throw syntax(`${option} has an empty item in '${text}' (two commas in a row, or a comma at an end).`, `Separate values by single commas, ${example}.`, text);
    if (/^-\s*\d+$/.test(item)) {
      throw syntax(`${option} has the negative value '${item}'; values must be at least 0.`, `Write whole numbers of at least 0, ${example}.`, item);
    }
    const m = /^(\d+)(?:\s*-\s*(\d+)(?:\s*:\s*(\d+))?)?$/.exec(item);
    if (!m) {
      const hint = /\d\.\d/.test(item)
        ? `Values must be whole numbers, ${example}.`
        : /\d\s+\d/.test(item)
          ? `Separate values by commas, not spaces, ${example}.`
          : `Write single values, ranges A-B or ranges with a step A-B:S, ${example}.`;
      throw syntax(`${option}: '${item}' is not a whole number or a range.`, hint, item);
    }
    const a = Number(m[1]);
    const b = m[2] === undefined ? a : Number(m[2]);
    const step = m[3] === undefined ? 1 : Number(m[3]);
    if (b < a) throw syntax(`${option}: the range '${item}' runs backwards.`, `Write the smaller end first, e.g. ${option} ${b}-${a}.`, item);
    if (step < 1) throw syntax(`${option}: the step in '${item}' must be at least 1.`, `Write e.g. ${option} ${a}-${b}:${Math.max(1, Math.round((b - a) / 10))}.`, item);
    if (limit && b > limit.max) {
      throw new DwError(limit.code, `${option}: ${b.toLocaleString('en-US')} is above the limit of ${limit.max.toLocaleString('en-US')} (${limit.reason}).`,
        `Keep every value of ${option} at most ${limit.max}.`, { value: item });
    }
    const count = Math.floor((b - a) / step) + 1;
    if (out.length + count > MAX_LIST_LENGTH) {
      throw new DwError('SIZE_LIMIT', `${option} expands to more than ${MAX_LIST_LENGTH.toLocaleString('en-US')} values.`, `Use a step, e.g. ${option} ${a}-${b}:${Math.ceil((b - a) / 1000)}.`, { value: item });
    }
    for (let v = a; v <= b; v += step) out.push(v);
  }
  return out;
}

/**
 * Parse a comma list of significance levels, each strictly between 0 and 1 (`0.05,0.01`).
 *
 * @example
 * ```ts
 * parseLevelList('0.05,0.01', '--alpha'); // [0.05, 0.01]
 * ```
 */
export function parseLevelList(text: string, option: string): number[] {
  const example = `e.g. ${option} 0.05 or ${option} 0.05,0.01`;
  const trimmed = text.trim();
  if (trimmed === '') throw syntax(`${option} is empty.`, `Give levels as fractions, ${example}.`, text);
  const out: number[] = [];
  for (const raw of trimmed.split(',')) {
    const item = raw.trim();
    if (item === '') throw syntax(`${option} has an empty item in '${text}'.`, `Separate levels by single commas, ${example}.`, text);
    if (/%$/.test(item)) {
      throw syntax(`${option}: '${item}' is a percentage; levels are written as fractions.`, `Write ${Number(item.slice(0, -1)) / 100 || 0.05} for ${item}, ${example}.`, item);
    }
    if (!/^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/.test(item)) {
      throw syntax(`${option}: '${item}' is not a number.`, `Give levels as fractions, ${example}.`, item);
    }
    const a = Number(item);
    if (!(a > 0 && a < 1)) {
      throw new DwError('ALPHA_OUT_OF_RANGE', `${option}: the level ${item} is outside (0, 1).`,
        a >= 1 && a < 100 ? `Levels are fractions: write ${a / 100} for ${a}%.` : `Give levels strictly between 0 and 1, ${example}.`, { value: item });
    }
    out.push(a);
  }
  return out;
}

function syntax(message: string, hint: string, value: string): DwError {
  return new DwError('RANGE_SYNTAX', message, hint, { value });
}
