/**
 * Every typed code that a result carries for people to read has its words in src/report/wording.ts
 * (and wording/): the engine choice, the bounds outcome, Durbin's h, the dynamic notes and the
 * power notes. Each code gives a sentence of its own (not the code itself), in every format, and
 * the bounds test "does not reject" (it never "finds no evidence").
 */
import { describe, expect, it } from 'vitest';
import type { EngineChoice } from '../../src/core/types.js';
import type { PowerNote } from '../../src/power/exact-power.js';
import type { DynamicNote } from '../../src/dynamic/serial-tests.js';
import { boundsZone } from '../../src/bounds/zone.js';
import { boundsResolutionWords, durbinHWords, engineChoiceWords, powerNoteText, warningText } from '../../src/report/wording.js';
import { inline, type InlineFormat } from '../../src/report/format.js';

const FORMATS: InlineFormat[] = ['text', 'markdown', 'latex'];

const ENGINE: Record<EngineChoice['code'], EngineChoice[]> = {
  LARGE_N_DCT: [{ code: 'LARGE_N_DCT', n: 5000 }, { code: 'LARGE_N_DCT', n: 60000, smallTail: { relativeError: 0.02 } }],
  LARGE_N_EIGENFREE: [{ code: 'LARGE_N_EIGENFREE', n: 5000 }],
  IMHOF_SPECTRUM: [{ code: 'IMHOF_SPECTRUM' }],
  SMALL_TAIL_PAN: [{ code: 'SMALL_TAIL_PAN' }],
  SMALL_TAIL_SADDLEPOINT: (['less-accurate', 'could-not-vouch', 'not-applicable'] as const).map((pan) => ({ code: 'SMALL_TAIL_SADDLEPOINT', pan })),
  SMALL_TAIL_IMHOF: [{ code: 'SMALL_TAIL_IMHOF', relativeError: 3e-4 }],
};
const POWER: Record<PowerNote['code'], PowerNote> = {
  POWER_FALLS: { code: 'POWER_FALLS', from: 0.9, to: 0.99 },
  TARGET_NOT_SEARCHED: { code: 'TARGET_NOT_SEARCHED', target: 0.8 },
  TARGET_NOT_REACHED: { code: 'TARGET_NOT_REACHED', target: 0.8 },
  POWER_ROUTE: { code: 'POWER_ROUTE', route: 'eigenfree', n: 5000, bySize: true },
  CHERNOFF_SETTLED: { code: 'CHERNOFF_SETTLED', count: 2, within: 1e-12 },
};
const DYNAMIC: Record<DynamicNote['code'], DynamicNote> = {
  D_NOT_VALID_LAGGED_DEPENDENT: { code: 'D_NOT_VALID_LAGGED_DEPENDENT', column: 'ylag', how: 'detected', hDefined: false, bgOrder: 4 },
  LAGGED_DEPENDENT_MISMATCH: { code: 'LAGGED_DEPENDENT_MISMATCH', column: 'ylag' },
};

function sentence(text: string, code: string): void {
  for (const f of FORMATS) {
    const s = inline(text, f);
    expect(s.length).toBeGreaterThan(20);
    expect(s).not.toContain(code);
    expect(s).not.toMatch(/\bundefined\b(?! for these data| here)|\[object|NaN|⟨|⟩/);
  }
}

describe('the words of every typed code', () => {
  it('engine choice', () => {
    for (const [code, cases] of Object.entries(ENGINE)) for (const c of cases) sentence(engineChoiceWords(c), code);
    expect(engineChoiceWords({ code: 'SMALL_TAIL_SADDLEPOINT', pan: 'not-applicable' })).toMatch(/Pan's form does not apply/);
    expect(engineChoiceWords({ code: 'LARGE_N_DCT', n: 60000, smallTail: { relativeError: 0.02 } })).toMatch(/relative error 2\.0e-2/);
  });
  it('power notes', () => {
    for (const [code, note] of Object.entries(POWER)) sentence(powerNoteText(note), code);
    expect(inline(powerNoteText(POWER.POWER_ROUTE), 'text')).toBe('Route: eigen-free (banded factorisations of the inverse error covariance, no eigenvalues; n = 5000, too large for the dense route to be the faster).');
    expect(inline(powerNoteText(POWER.TARGET_NOT_REACHED), 'latex')).toBe('Power 0.8 is not reached for \\textbar{}$\\rho$\\textbar{} $\\le 0.99$.');
  });
  it('dynamic notes and Durbin\'s h (Durbin 1970: h undefined when n V >= 1)', () => {
    for (const [code, note] of Object.entries(DYNAMIC)) sentence(warningText(note), code);
    const undef = durbinHWords({ status: 'DURBIN_H_UNDEFINED', nV: 1.3125, variance: 0.05469 });
    sentence(undef, 'DURBIN_H_UNDEFINED');
    expect(inline(undef, 'text')).toMatch(/^Durbin's h is undefined here: n V = 1\.313 >= 1 \(V = 0\.05469 .*Durbin's alternative test/);
    expect(inline(undef, 'text')).not.toMatch(/residual t-test/);
    expect(inline(undef, 'latex')).toContain('$nV = 1.313 \\ge 1$');
    const def = durbinHWords({ status: 'DURBIN_H_DEFINED', nV: 0.4, variance: 0.01, r1: 0.21 });
    sentence(def, 'DURBIN_H_DEFINED');
    expect(inline(def, 'text')).toMatch(/n V = 0\.4 < 1.*r1 = 0\.21/);
  });
  it('bounds outcome: the zone gives the code, the words say "does not reject" (zones as in Durbin & Watson 1951)', () => {
    const known = { dL: 1.201, dU: 1.411 }; // n = 20, k' = 1, 5% (Savin & White 1977)
    const cases: [number, 'positive' | 'negative' | 'two-sided', string][] = [
      [0.9, 'positive', 'BOUNDS_REJECT'], [1.3, 'positive', 'BOUNDS_INCONCLUSIVE'], [2.0, 'positive', 'BOUNDS_DO_NOT_REJECT'],
      [2.0, 'negative', 'BOUNDS_DO_NOT_REJECT'], [3.5, 'negative', 'BOUNDS_REJECT'], [2.0, 'two-sided', 'BOUNDS_DO_NOT_REJECT'],
    ];
    for (const [d, alt, code] of cases) {
      const z = boundsZone(d, 20, 1, 0.05, alt, null, { known });
      expect(z.outcome.code).toBe(code);
      const w = boundsResolutionWords(z);
      sentence(w, code);
      expect(w).not.toMatch(/finds no evidence/);
      if (code === 'BOUNDS_DO_NOT_REJECT') expect(w).toMatch(/does not reject no autocorrelation against/);
    }
  });
});
