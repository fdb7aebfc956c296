/**
 * The power section of a report: the exact power of the test against AR(1) (or seasonal AR)
 * errors for the caller's design, read from the result's power object (src/power/exact-power.ts;
 * docs/methods.md section 6). Neutral markup; no number is computed here.
 */
import type { DwTestResult } from '../inference/dw-test.js';
import { powerNoteText } from './wording.js';
import type { PowerNote } from '../power/exact-power.js';
import { arFormula, fixed, level, sym } from './format.js';
import { D_DECIMALS, para, type ReportBlock, type ReportSection } from './document-model.js';

/**
 * What the report says about the power: read from the result's power object, which exactDwTest
 * fills with the ExactPower of src/power/exact-power.ts (alternative, process, criticalUpper,
 * route, notes); a bare PowerSummary (older results) reads as the test's own alternative and AR(1).
 */
export interface PowerDescription {
  alternative: DwTestResult['alternative'];
  process: 'ar1' | 'seasonal';
  /** The critical value(s) of the test whose power is shown. */
  lower: number | null;
  upper: number | null;
  route: string | null;
  notes: PowerNote[];
  /** False when the rho reaching the target power was not searched for. */
  searched: boolean;
}

/**
 * The power object of a result in the terms the reports use.
 *
 * @example
 * ```ts
 * const result = exactDwTest({ y, x, power: { rho: [0.2, 0.4, 0.6] } });
 * describePower(result).lower; // the critical value whose power is shown (one-sided, positive)
 * ```
 */
export function describePower(r: DwTestResult): PowerDescription {
  const pw = r.power!;
  const extra = pw as Partial<{ alternative: DwTestResult['alternative']; process: 'ar1' | 'seasonal'; criticalUpper: number | null; route: string; notes: PowerNote[] }>;
  const alternative = extra.alternative ?? r.alternative;
  const process = extra.process ?? 'ar1';
  const notes = Array.isArray(extra.notes) ? extra.notes : [];
  let lower: number | null = null;
  let upper: number | null = null;
  if (alternative === 'positive') lower = pw.critical;
  else if (alternative === 'negative') upper = pw.critical;
  else { lower = pw.critical; upper = extra.criticalUpper ?? null; }
  return {
    alternative, process, lower, upper, route: extra.route ?? null,
    notes, searched: !notes.some((n) => n.code === 'TARGET_NOT_SEARCHED'),
  };
}

/**
 * "u(t) = rho u(t-1) + eps(t)" or, for the seasonal process, "u(t) = rho u(t-4) + eps(t)": u the
 * errors, eps the innovations, kept apart from the residuals e of the fit.
 *
 * @example
 * ```ts
 * inline(processFormula('ar1', 1), 'text');      // "u(t) = rho u(t-1) + eps(t)"
 * inline(processFormula('seasonal', 4), 'latex'); // "$u_t = \rho\, u_{t-4} + \varepsilon_t$"
 * ```
 */
export function processFormula(process: 'ar1' | 'seasonal', lag: number): string {
  return arFormula(process === 'seasonal' ? lag : 1);
}

/** The rejection region of the test whose power is shown, e.g. "d <= 1.2046 or d >= 2.7954". */
function powerRegion(p: PowerDescription): string {
  const lo = p.lower !== null ? `${sym('d')} ${sym('le')} ${fixed(p.lower, D_DECIMALS)}` : null;
  const hi = p.upper !== null ? `${sym('d')} ${sym('ge')} ${fixed(p.upper, D_DECIMALS)}` : null;
  return [lo, hi].filter((x): x is string => x !== null).join(' or ');
}

/** The report section on the exact power. */
export function powerSection(r: DwTestResult): ReportSection {
  const pw = r.power!;
  const p = describePower(r);
  const target = `${fixed(pw.target * 100, 0)}${sym('percent')}`;
  const seasonal = p.process === 'seasonal';
  const errors = seasonal ? `seasonal autoregressive errors at lag ${r.lag}` : 'AR(1) errors';
  const rows: [string, string][] = [['Level', p.alternative === 'two-sided' ? `${level(pw.alpha)} (${level(pw.alpha / 2)} in each tail)` : level(pw.alpha)]];
  if (p.alternative === 'two-sided') {
    rows.push(['Exact lower critical value', p.lower !== null ? fixed(p.lower, D_DECIMALS) : 'not given']);
    rows.push(['Exact upper critical value', p.upper !== null ? fixed(p.upper, D_DECIMALS) : 'not given']);
  } else {
    rows.push(['Exact critical value used', fixed(pw.critical, D_DECIMALS)]);
  }
  rows.push(['Rejection region', powerRegion(p)]);
  let reach: string;
  const range = p.alternative === 'negative' ? `between ${sym('minus')}0.99 and 0` : 'between 0 and 0.99';
  if (!p.searched) reach = `The ${sym('rho')} at which the power reaches ${target} was not searched for.`;
  else if (pw.rhoAtTarget !== null && pw.rhoAtTarget !== undefined) reach = `The power reaches ${target} at ${sym('rho')} = ${fixed(pw.rhoAtTarget, 3)}.`;
  else reach = `The power does not reach ${target} for any ${sym('rho')} ${range} with this design.`;
  const testWords = p.alternative === 'positive' ? 'the one-sided test for positive autocorrelation'
    : p.alternative === 'negative' ? 'the one-sided test for negative autocorrelation'
      : `the two-sided test (${level(pw.alpha / 2)} in each tail)`;
  const blocks: ReportBlock[] = [
    { kind: 'fields', rows },
    {
      kind: 'table', head: [`${seasonal ? `Seasonal (lag ${r.lag})` : 'AR(1)'} coefficient ${sym('rho')}`, 'Exact power'], align: ['r', 'r'],
      rows: powerRows(pw.curve).map((c) => [level(c.rho), fixed(c.power, 4)]),
    },
    para(reach),
    para(`Power of ${testWords}, with stationary errors ${processFormula(p.process, r.lag)}, computed exactly for this design matrix.`),
  ];
  const notes = p.notes.filter((n) => n.code !== 'TARGET_NOT_SEARCHED' && n.code !== 'TARGET_NOT_REACHED').map(powerNoteText);
  if (notes.length) blocks.push({ kind: 'list', items: notes });
  return { id: 'power', heading: `Exact power against ${errors}`, blocks };
}

/**
 * Rows of a power curve worth printing: all when short, else about eleven evenly spread.
 *
 * @example
 * ```ts
 * const curve = Array.from({ length: 21 }, (_, i) => ({ rho: i / 20, power: 0 }));
 * powerRows(curve).map((c) => c.rho); // [0, 0.1, 0.2, ..., 1]: the tenths
 * ```
 */
export function powerRows(curve: { rho: number; power: number }[]): { rho: number; power: number }[] {
  if (curve.length <= 12) return curve;
  // prefer the rows at rho = 0.1, 0.2, ... when the curve has them
  const tenths = curve.filter((c) => Math.abs(c.rho * 10 - Math.round(c.rho * 10)) < 1e-9);
  if (tenths.length >= 4 && tenths.length <= 12) return tenths;
  const picked = new Set<number>();
  for (let i = 0; i <= 10; i++) picked.add(Math.round((i * (curve.length - 1)) / 10));
  return [...picked].sort((a, b) => a - b).map((i) => curve[i]);
}

