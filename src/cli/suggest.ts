/**
 * The command line's words for the settings a library error suggests: each suggestion of a
 * DwError (`detail.suggest`, library option names) becomes the flag that does the same, appended
 * to the hint when the error is printed. The library's own hints never name a flag.
 */
import type { DwError, DwSuggestion } from '../errors.js';

/**
 * The flag for one suggested setting.
 *
 * @example
 * ```ts
 * suggestionFlag({ option: 'method', value: 'eigenfree' }); // "--method eigenfree"
 * suggestionFlag({ option: 'time' });                       // "--time COLUMN"
 * ```
 */
export function suggestionFlag(s: DwSuggestion): string {
  switch (s.option) {
    case 'intercept':
      return s.value === false ? '--no-intercept' : '(leave out --no-intercept)';
    case 'time':
      return `--time ${typeof s.value === 'string' ? s.value : 'COLUMN'}`;
    default:
      return s.value === undefined ? `--${s.option}` : `--${s.option} ${String(s.value)}`;
  }
}

/**
 * The error's hint with its suggestions named as flags ("... On the command line: --method eigenfree.").
 *
 * @example
 * ```ts
 * cliHint(new DwError('SIZE_LIMIT', '...', 'Choose the eigen-free engine.', { suggest: [{ option: 'method', value: 'eigenfree' }] }));
 * // "Choose the eigen-free engine. On the command line: --method eigenfree."
 * ```
 */
export function cliHint(err: DwError): string {
  const flags = [...new Set((err.detail?.suggest ?? []).map(suggestionFlag))];
  if (flags.length === 0) return err.hint;
  const tail = `On the command line: ${flags.join(' or ')}.`;
  return err.hint ? `${err.hint} ${tail}` : tail;
}

/**
 * One line for the terminal: the message, then the hint with its flags.
 *
 * @example
 * ```ts
 * cliLine(err); // "Pan's formula is limited to ... Choose the Imhof engine (method 'imhof', or 'auto'). On the command line: --method imhof."
 * ```
 */
export function cliLine(err: DwError): string {
  const hint = cliHint(err);
  return hint ? `${err.message} ${hint}` : err.message;
}
