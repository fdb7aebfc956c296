/**
 * Why the `auto` chooser let an engine answer (src/engines/choose.ts), in words: the typed
 * `EngineChoice` of a tail probability and of a test result (`methodChoice`). Plain text with the
 * trade's notation, for `prose()` of format.ts; shared by every report format, the command line
 * and the page. The engines themselves are described in docs/methods.md sections 3 to 5 and 10.
 */
import type { EngineChoice } from '../../core/types.js';

const PAN_NOT_USED = {
  'less-accurate': "more accurate here than Pan's form",
  'could-not-vouch': "Pan's form could not vouch for its number",
  'not-applicable': "Pan's form does not apply to this spectrum",
} as const;

/**
 * The reason for the engine choice in words (plain text).
 *
 * @example
 * ```ts
 * engineChoiceWords({ code: 'LARGE_N_EIGENFREE', n: 5000 });
 * // "eigen-free engine: n = 5000 is large, so no spectrum is needed (O(n k) per evaluation)"
 * ```
 */
export function engineChoiceWords(c: EngineChoice): string {
  switch (c.code) {
    case 'LARGE_N_DCT':
    case 'LARGE_N_EIGENFREE': {
      const what = c.code === 'LARGE_N_DCT'
        ? `DCT eigenbasis route: n = ${c.n} is large and the operator is a union of chains, whose eigenbasis is known in closed form (O(n k^2) per evaluation after one fast transform)`
        : `eigen-free engine: n = ${c.n} is large, so no spectrum is needed (O(n k) per evaluation)`;
      return c.smallTail
        ? `${what} (small tail: relative error ${c.smallTail.relativeError.toExponential(1)}; n = ${c.n} is beyond the spectrum the tail engines need)`
        : what;
    }
    case 'IMHOF_SPECTRUM':
      return 'Imhof integral on the spectrum';
    case 'SMALL_TAIL_PAN':
      return "Pan's finite-range form: the tail probability is small, and Pan computes it with relative accuracy";
    case 'SMALL_TAIL_SADDLEPOINT':
      return `inversion integral on a line through the saddlepoint: the tail probability is small and this keeps relative accuracy (${PAN_NOT_USED[c.pan]})`;
    case 'SMALL_TAIL_IMHOF':
      return `Imhof integral on the spectrum (small tail; its relative error is ${c.relativeError.toExponential(1)})`;
    default:
      return String((c as { code: string }).code);
  }
}
