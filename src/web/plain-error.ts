/**
 * Any failure as the user of the page should see it: the library's DwError message and hint, with
 * the command-line options they may mention (--time, --decimal comma, ...) named as the page's own
 * controls; anything else in plain words, with no stack trace.
 */
import { isDwError } from '../errors.js';
import type { PlainError } from './protocol.js';

/** Command-line options in library hints, and the page control that does the same. */
const CONTROLS: [RegExp, (value: string) => string][] = [
  [/--time(?: ([A-Za-z_][\w]*))?\b/g, () => 'the "Time column" choice'],
  [/--decimal (comma|point)\b/g, (v) => `"Decimal mark: ${v}" under "How to read the file"`],
  [/--decimal\b/g, () => '"Decimal mark" under "How to read the file"'],
  [/--delimiter (?:'([^']*)'|(\S+))/g, (v) => `"Field delimiter: ${v}" under "How to read the file"`],
  [/--method (imhof|pan|eigenfree|saddlepoint|dct|auto)\b/g, (v) => `the engine "${v}" under "Numerical engine"`],
  [/--no-intercept\b/g, () => 'unticking "Add an intercept"'],
  [/--lag\b/g, () => 'the lag'],
  [/--alpha\b/g, () => 'the significance level'],
];

/**
 * A library text with command-line options named as the page's controls.
 *
 * @example
 * ```ts
 * forThePage('This looks like a decimal comma: add --decimal comma.');
 * // 'This looks like a decimal comma: add "Decimal mark: comma" under "How to read the file".'
 * ```
 */
export function forThePage(text: string): string {
  let out = text;
  for (const [pattern, name] of CONTROLS) out = out.replace(pattern, (_m, a?: string, b?: string) => name(a ?? b ?? ''));
  return out;
}

/**
 * Turn a thrown value into a {@link PlainError}.
 *
 * @example
 * ```ts
 * plainError(new DwError('CSV_EMPTY', 'The file is empty.', 'Give a CSV file.')); // { code: 'CSV_EMPTY', ... }
 * ```
 */
export function plainError(err: unknown): PlainError {
  if (isDwError(err)) return { code: err.code, message: forThePage(err.message), hint: forThePage(err.hint) };
  const what = err instanceof Error ? err.message : String(err);
  return {
    code: 'INTERNAL',
    message: `The computation stopped on an unexpected problem${what ? `: ${firstLine(what)}` : ''}.`,
    hint: 'This is a fault in exact-dw rather than in your data; please report it together with the data that caused it.',
  };
}

function firstLine(s: string): string {
  return s.split('\n')[0].replace(/[.\s]+$/, '');
}
