/**
 * Option parsing for the CLI on top of node's util.parseArgs, with its errors turned into
 * DwErrors that say which option was wrong and what to write instead.
 */
import { parseArgs } from 'node:util';
import { DwError } from '../errors.js';
import type { MethodChoice } from '../core/types.js';

/** One option of a command. */
export interface OptionSpec {
  type: 'string' | 'boolean';
  /** Value placeholder shown in help, e.g. 'FILE'. */
  value?: string;
  help: string;
  default?: string | boolean;
}

export type OptionSpecs = Record<string, OptionSpec>;
export type OptionValues = Record<string, string | boolean | undefined>;

/** Parse argv against the specs; unknown options and missing values are DwErrors. */
export function parseOptions(argv: string[], specs: OptionSpecs, command: string): { values: OptionValues; positionals: string[] } {
  const options: Record<string, { type: 'string' | 'boolean' }> = {};
  for (const [name, spec] of Object.entries(specs)) options[name] = { type: spec.type };
  options.help = { type: 'boolean' };
  try {
    const { values, positionals } = parseArgs({ args: argv, options, strict: true, allowPositionals: true });
    const out: OptionValues = {};
    for (const [name, spec] of Object.entries(specs)) out[name] = (values as OptionValues)[name] ?? spec.default;
    out.help = (values as OptionValues).help;
    return { values: out, positionals };
  } catch (err) {
    const e = err as { code?: string; message: string };
    const m = /'(-{1,2}[^' ]+)/.exec(e.message);
    const opt = m ? m[1] : '';
    if (e.code === 'ERR_PARSE_ARGS_UNKNOWN_OPTION') {
      const near = closest(opt.replace(/^-+/, ''), Object.keys(specs));
      throw new DwError('OPTION_UNKNOWN', `'${command}' has no option ${opt}.`,
        near ? `Did you mean --${near}? See 'exact-dw ${command} --help'.` : `See 'exact-dw ${command} --help'.`);
    }
    if (e.code === 'ERR_PARSE_ARGS_INVALID_OPTION_VALUE') {
      throw new DwError('OPTION_VALUE', `The option ${opt || ''} needs a value${opt ? '' : ` (${e.message})`}.`.replace('  ', ' '),
        `See 'exact-dw ${command} --help'.`);
    }
    throw new DwError('OPTION_VALUE', e.message, `See 'exact-dw ${command} --help'.`);
  }
}

function closest(word: string, names: string[]): string | undefined {
  let best: string | undefined;
  let bestD = 3;
  for (const n of names) {
    const d = editDistance(word, n);
    if (d < bestD) { bestD = d; best = n; }
  }
  return best;
}

function editDistance(a: string, b: string): number {
  const dp = Array.from({ length: a.length + 1 }, (_, i) => [i, ...new Array<number>(b.length).fill(0)]);
  for (let j = 1; j <= b.length; j++) dp[0][j] = j;
  for (let i = 1; i <= a.length; i++) for (let j = 1; j <= b.length; j++) {
    dp[i][j] = Math.min(dp[i - 1][j] + 1, dp[i][j - 1] + 1, dp[i - 1][j - 1] + (a[i - 1] === b[j - 1] ? 0 : 1));
  }
  return dp[a.length][b.length];
}

/** A string option that must be present. */
export function required(values: OptionValues, name: string, command: string): string {
  const v = values[name];
  if (typeof v !== 'string' || v === '') {
    throw new DwError('OPTION_MISSING', `'${command}' needs --${name}.`, `See 'exact-dw ${command} --help'.`);
  }
  return v;
}

/** A number option, checked against an optional predicate. */
export function numberOption(values: OptionValues, name: string, fallback?: number): number | undefined {
  const v = values[name];
  if (v === undefined) return fallback;
  if (typeof v !== 'string' || !/^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/.test(v.trim())) {
    throw new DwError('OPTION_VALUE', `--${name} must be a number (got '${String(v)}').`, `Write it like 0.05 or 1.23.`);
  }
  return Number(v);
}

/** A whole-number option. */
export function integerOption(values: OptionValues, name: string, fallback?: number): number | undefined {
  const v = values[name];
  if (v === undefined) return fallback;
  if (typeof v !== 'string' || !/^\+?\d+$/.test(v.trim())) {
    throw new DwError('OPTION_VALUE', `--${name} must be a whole number (got '${String(v)}').`, 'Write it like 4.');
  }
  return Number(v);
}

/** One of a fixed set of words. */
export function choiceOption<T extends string>(values: OptionValues, name: string, choices: readonly T[], fallback: T): T {
  const v = values[name];
  if (v === undefined) return fallback;
  if (typeof v !== 'string' || !(choices as readonly string[]).includes(v)) {
    throw new DwError('OPTION_VALUE', `--${name} must be one of ${choices.join(', ')} (got '${String(v)}').`, `Use --${name} ${choices[0]}.`);
  }
  return v as T;
}

/** The engine choice. */
export function methodOption(values: OptionValues): MethodChoice {
  return choiceOption(values, 'method', ['auto', 'imhof', 'pan', 'eigenfree'] as const, 'auto');
}

/** A comma-separated list of names. */
export function listOption(values: OptionValues, name: string): string[] | undefined {
  const v = values[name];
  if (v === undefined) return undefined;
  if (typeof v !== 'string') return undefined;
  const items = v.split(',').map((s) => s.trim());
  if (items.some((s) => s === '')) {
    throw new DwError('OPTION_VALUE', `--${name} has an empty item in '${v}'.`, `Separate names with commas, e.g. --${name} a,b.`);
  }
  return items;
}
