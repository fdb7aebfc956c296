/**
 * Engine choice. `auto` answers with the engine best suited to the request and says why:
 *   - Imhof's integral on the spectrum by default (absolute error <= 1e-10, any spectrum, ties too);
 * Callers may force an engine with `method`.
 */
import { DwError } from '../errors.js';
import type { MethodChoice, Tail, TailProbability } from '../core/types.js';
import { imhofTail } from './imhof.js';
import type { NullSource } from '../distribution/source.js';

/** Options for a tail probability. */
export interface EngineOptions {
  method?: MethodChoice;
  /** Target absolute error (default 1e-11). */
  tolerance?: number;
}

/**
 * P(d <= c) or P(d >= c) from the engine chosen by `options.method`.
 *
 * @example
 * ```ts
 * tailProbability(spectrumSource(nu), 1.3, 'lower', { method: 'auto' }).method; // 'imhof'
 * ```
 */
export function tailProbability(source: NullSource, c: number, tail: Tail, options: EngineOptions = {}): TailProbability {
  const method = options.method ?? 'auto';
  const tolerance = options.tolerance;
  switch (method) {
    case 'imhof':
      return imhofTail(source.spectrum(), c, tail, { tolerance });
    case 'auto': {
      const r = imhofTail(source.spectrum(), c, tail, { tolerance });
      return { ...r, reason: 'Imhof integral on the spectrum (default)' };
    }
    default:
      throw new DwError('OPTION_VALUE', `The engine '${method}' is not available.`, 'Use auto or imhof.');
  }
}
