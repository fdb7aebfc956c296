/**
 * Words for the typed notes of an exact power result (src/power/exact-power.ts, docs/methods.md
 * section 6): the route that computed it, power that falls as |rho| grows, a target not searched
 * or not reached, probabilities settled by Chernoff's bound. Neutral markup of format.ts, shared
 * by every report format, the command line and the page.
 */
import type { PowerNote } from '../../power/exact-power.js';
import { sym } from '../format.js';

/**
 * One note of a power result in words (neutral markup).
 *
 * @example
 * ```ts
 * inline(powerNoteText({ code: 'TARGET_NOT_REACHED', target: 0.8 }), 'text'); // "Power 0.8 is not reached for |rho| <= 0.99."
 * ```
 */
export function powerNoteText(note: PowerNote): string {
  switch (note.code) {
    case 'POWER_FALLS':
      return `For this design the power falls as |${sym('rho')}| grows from ${note.from} to ${note.to}: the test can lose power against strong autocorrelation.`;
    case 'TARGET_NOT_SEARCHED':
      return `The ${sym('rho')} at which power ${note.target} is reached was not searched for.`;
    case 'TARGET_NOT_REACHED':
      return `Power ${note.target} is not reached for |${sym('rho')}| ${sym('le')} 0.99.`;
    case 'POWER_ROUTE':
      return note.route === 'dense'
        ? `Route: dense (the weights of the quadratic form from an eigen-decomposition for each ${sym('rho')}; ${sym('n')} = ${note.n}).`
        : `Route: eigen-free (banded factorisations of the inverse error covariance, no eigenvalues; ${sym('n')} = ${note.n}${note.bySize ? ', too large for the dense route to be the faster' : ''}).`;
    case 'CHERNOFF_SETTLED': {
      const one = note.count === 1;
      return `${note.count} ${one ? 'probability' : 'probabilities'} behind this result (curve and target search) ${one ? 'lies' : 'lie'} within ${note.within.toExponential(0)} of 0 or 1 by Chernoff's bound and ${one ? 'was' : 'were'} settled by it (answer 0 or 1, the bound as its error).`;
    }
    default:
      return String((note as { code: string }).code);
  }
}
