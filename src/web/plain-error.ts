/**
 * Any failure as the user of the page should see it: the library's DwError message and hint, with
 * the settings the error suggests (`detail.suggest`, by library option name) named as the page's
 * own controls; anything else in plain words, with no stack trace.
 */
import { isDwError, type DwSuggestion } from '../errors.js';
import type { PlainError } from './protocol.js';

/**
 * The page control that makes one suggested setting.
 *
 * @example
 * ```ts
 * pageControl({ option: 'decimal', value: 'comma' }); // '"Decimal mark: comma" under "How to read the file"'
 * ```
 */
export function pageControl(s: DwSuggestion): string {
  switch (s.option) {
    case 'method':
      return `the engine "${String(s.value ?? 'auto')}" under "Numerical engine"`;
    case 'decimal':
      return s.value === undefined ? '"Decimal mark" under "How to read the file"' : `"Decimal mark: ${String(s.value)}" under "How to read the file"`;
    case 'time':
      return 'the "Time column" choice';
    case 'intercept':
      return s.value === false ? 'unticking "Add an intercept"' : 'ticking "Add an intercept"';
    case 'n':
      return `the sample sizes n${s.value === undefined ? '' : ` (${String(s.value)})`}`;
  }
}

/**
 * A hint with its suggested settings named as the page's controls ("... On this page: ...").
 *
 * @example
 * ```ts
 * pageHint('Read the file with decimal \'comma\'.', [{ option: 'decimal', value: 'comma' }]);
 * // 'Read the file with decimal \'comma\'. On this page: "Decimal mark: comma" under "How to read the file".'
 * ```
 */
export function pageHint(hint: string, suggest: DwSuggestion[] = []): string {
  const controls = [...new Set(suggest.map(pageControl))];
  if (controls.length === 0) return hint;
  const tail = `On this page: ${controls.join(' or ')}.`;
  return hint ? `${hint} ${tail}` : tail;
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
  if (isDwError(err)) return { code: err.code, message: err.message, hint: pageHint(err.hint, err.detail?.suggest) };
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
