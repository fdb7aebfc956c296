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

interface ParsedToken { kind: string; name?: string; value?: string }

/**
 * Parse argv against the specs. Unknown options, missing values, a value given to a switch and an
 * option given twice with different values are DwErrors. A negative number may follow its option
 * directly (`--d -0.5` is read as `--d=-0.5`).
 *
 * @example
 * ```ts
 * parseOptions(['--alpha', '0.01'], { alpha: { type: 'string', help: 'level' } }, 'critical').values.alpha; // '0.01'
 * ```
 */
export function parseOptions(argv: string[], specs: OptionSpecs, command: string): { values: OptionValues; positionals: string[] } {
  const options: Record<string, { type: 'string' | 'boolean' }> = {};
  for (const [name, spec] of Object.entries(specs)) options[name] = { type: spec.type };
  options.help = { type: 'boolean' };
  const args = joinNegativeValues(argv, specs);
  let parsed: { values: Record<string, unknown>; positionals: string[]; tokens?: ParsedToken[] };
  try {
    parsed = parseArgs({ args, options, strict: true, allowPositionals: true, tokens: true }) as typeof parsed;
  } catch (err) {
    const e = err as { code?: string; message: string };
    const m = /'(-{1,2}[^' ]+)/.exec(e.message);
    const opt = m ? m[1] : '';
    const name = opt.replace(/^-+/, '');
    if (e.code === 'ERR_PARSE_ARGS_UNKNOWN_OPTION') {
      const near = closest(name, Object.keys(specs));
      throw new DwError('OPTION_UNKNOWN', `'${command}' has no option ${opt}.`,
        near ? `Did you mean --${near}? See 'exact-dw ${command} --help'.` : `See 'exact-dw ${command} --help'.`);
    }
    if (e.code === 'ERR_PARSE_ARGS_INVALID_OPTION_VALUE') {
      if (specs[name]?.type === 'boolean' || name === 'help') {
        throw new DwError('OPTION_VALUE', `The switch --${name} takes no value.`, `Write --${name} alone.`);
      }
      throw new DwError('OPTION_VALUE', opt ? `The option ${opt} needs a value.` : `An option needs a value (${e.message.split('\n')[0]}).`,
        `Write it as --${name || 'option'} VALUE; see 'exact-dw ${command} --help'.`);
    }
    throw new DwError('OPTION_VALUE', e.message.split('\n')[0], `See 'exact-dw ${command} --help'.`);
  }
  const seen = new Map<string, string | boolean | undefined>();
  for (const t of parsed.tokens ?? []) {
    if (t.kind !== 'option' || t.name === undefined) continue;
    const value = t.value ?? true;
    if (seen.has(t.name) && seen.get(t.name) !== value) {
      throw new DwError('OPTION_CONFLICT', `--${t.name} is given twice, as '${String(seen.get(t.name))}' and as '${String(value)}'.`,
        `Give --${t.name} once.`);
    }
    seen.set(t.name, value);
  }
  const values = parsed.values as OptionValues;
  const out: OptionValues = {};
  for (const [name, spec] of Object.entries(specs)) out[name] = values[name] ?? spec.default;
  out.help = values.help;
  return { values: out, positionals: parsed.positionals };
}

/** `--opt -0.5` to `--opt=-0.5` for string options, so that negative numbers can follow an option. */
function joinNegativeValues(argv: string[], specs: OptionSpecs): string[] {
  const out: string[] = [];
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    const name = a.startsWith('--') ? a.slice(2) : '';
    const next = argv[i + 1];
    if (name && !name.includes('=') && specs[name]?.type === 'string' && next !== undefined && /^-(\d|\.\d)/.test(next)) {
      out.push(`${a}=${next}`);
      i++;
    } else {
      out.push(a);
    }
  }
  return out;
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

/**
 * A string option that must be present.
 *
 * @example
 * ```ts
 * required({ y: 'sales' }, 'y', 'test'); // "sales"
 * required({}, 'y', 'test');             // throws OPTION_MISSING: 'test' needs --y.
 * ```
 */
export function required(values: OptionValues, name: string, command: string): string {
  const v = values[name];
  if (typeof v !== 'string' || v === '') {
    throw new DwError('OPTION_MISSING', `'${command}' needs --${name}.`, `See 'exact-dw ${command} --help'.`);
  }
  return v;
}

/**
 * A number option (plain decimal or scientific notation); anything else is OPTION_VALUE.
 *
 * @example
 * ```ts
 * numberOption({ alpha: '1e-3' }, 'alpha'); // 0.001
 * numberOption({}, 'alpha', 0.05);         // 0.05
 * numberOption({ alpha: '5%' }, 'alpha');  // throws OPTION_VALUE, hint: write it as 0.05
 * ```
 */
export function numberOption(values: OptionValues, name: string, fallback?: number): number | undefined {
  const v = values[name];
  if (v === undefined) return fallback;
  if (typeof v !== 'string' || !/^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/.test(v.trim())) {
    const hint = typeof v === 'string' && /%\s*$/.test(v) ? `Write a level of ${v.trim()} as a fraction, e.g. 0.05 for 5%.`
      : typeof v === 'string' && /^\s*[+-]?\d*,\d+\s*$/.test(v) ? 'Write it with a decimal point, e.g. 0.05.'
        : 'Write it like 0.05 or 1.23.';
    throw new DwError('OPTION_VALUE', `--${name} must be a number (got '${String(v)}').`, hint);
  }
  return Number(v.trim());
}

/**
 * A whole-number option.
 *
 * @example
 * ```ts
 * integerOption({ lag: '4' }, 'lag');   // 4
 * integerOption({ lag: '1.5' }, 'lag'); // throws OPTION_VALUE
 * ```
 */
export function integerOption(values: OptionValues, name: string, fallback?: number): number | undefined {
  const v = values[name];
  if (v === undefined) return fallback;
  if (typeof v !== 'string' || !/^\+?\d+$/.test(v.trim())) {
    throw new DwError('OPTION_VALUE', `--${name} must be a whole number (got '${String(v)}').`, 'Write it like 4.');
  }
  return Number(v);
}

/**
 * One of a fixed set of words.
 *
 * @example
 * ```ts
 * choiceOption({ format: 'latex' }, 'format', ['text', 'latex'] as const, 'text'); // 'latex'
 * choiceOption({}, 'format', ['text', 'latex'] as const, 'text');                  // 'text'
 * ```
 */
export function choiceOption<T extends string>(values: OptionValues, name: string, choices: readonly T[], fallback: T): T {
  const v = values[name];
  if (v === undefined) return fallback;
  if (typeof v !== 'string' || !(choices as readonly string[]).includes(v)) {
    throw new DwError('OPTION_VALUE', `--${name} must be one of ${choices.join(', ')} (got '${String(v)}').`, `Use --${name} ${choices[0]}.`);
  }
  return v as T;
}

/**
 * The engine choice.
 *
 * @example
 * ```ts
 * methodOption({ method: 'pan' }); // 'pan'
 * methodOption({});                // 'auto'
 * ```
 */
export function methodOption(values: OptionValues): MethodChoice {
  return choiceOption(values, 'method', ['auto', 'imhof', 'pan', 'eigenfree', 'saddlepoint', 'dct'] as const, 'auto');
}

/**
 * A comma-separated list of names.
 *
 * @example
 * ```ts
 * listOption({ x: 'gdp, rate' }, 'x'); // ['gdp', 'rate']
 * listOption({}, 'x');                 // undefined
 * ```
 */
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
