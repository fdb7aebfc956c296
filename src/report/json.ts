/**
 * JSON rendering of a test result: every field of the DwTestResult plus the package version, in a
 * fixed key order (so that two runs on the same data give byte-identical files and diffs stay
 * small). Numbers are written in JavaScript's shortest round-trip form, so parsing the file gives
 * back exactly the numbers of the result; a non-finite number is written as null.
 */
import type { DwTestResult } from '../inference/dw-test.js';
import { VERSION } from '../version.js';

/** Key order of each object in the result, by path ('' is the top level, '[]' an array element). */
const KEY_ORDER: Record<string, string[]> = {
  '': [
    'packageVersion', 'd', 'n', 'k', 'm', 'lag', 'gaps', 'intercept', 'interceptAdded', 'columns',
    'coefficients', 'rSquared', 'alternative', 'alpha', 'pValue', 'pPositive', 'pNegative', 'pTwoSided',
    'critical', 'decision', 'method', 'methodReason', 'errorBound', 'nullMean', 'nullVariance',
    'bounds', 'power', 'dynamic', 'warnings',
  ],
  'coefficients[]': ['name', 'estimate', 'stdError'],
  critical: ['lower', 'upper', 'tailLevel'],
  bounds: ['kPrime', 'level', 'dL', 'dU', 'zone', 'resolution'],
  power: ['alpha', 'critical', 'target', 'rhoAtTarget', 'curve'],
  'power.curve[]': ['rho', 'power'],
  dynamic: ['laggedDependent', 'how', 'durbinH', 'breuschGodfrey', 'residualT'],
  'dynamic.durbinH': ['h', 'pValue', 'reason'],
  'dynamic.breuschGodfrey': ['order', 'lm', 'pChiSquare', 'f', 'pF', 'df1', 'df2'],
  'dynamic.residualT': ['t', 'pValue'],
};

/** Copy `value` with object keys in the fixed order (unknown keys after, alphabetically). */
function ordered(value: unknown, path: string): unknown {
  if (value === null || value === undefined) return null;
  if (typeof value === 'number') return Number.isFinite(value) ? value : null;
  if (ArrayBuffer.isView(value)) return Array.from(value as unknown as ArrayLike<number>).map((v) => ordered(v, `${path}[]`));
  if (Array.isArray(value)) return value.map((v) => ordered(v, `${path}[]`));
  if (typeof value !== 'object') return value;
  const obj = value as Record<string, unknown>;
  const known = KEY_ORDER[path] ?? [];
  const keys = [...known.filter((k) => k in obj), ...Object.keys(obj).filter((k) => !known.includes(k)).sort()];
  const out: Record<string, unknown> = {};
  for (const k of keys) {
    if (obj[k] === undefined) continue;
    out[k] = ordered(obj[k], path === '' ? k : `${path}.${k}`);
  }
  return out;
}

/**
 * The result as JSON with a stable key order and the package version.
 *
 * @example
 * ```ts
 * writeFileSync('dw-result.json', renderJson(exactDwTest({ y, x })));
 * JSON.parse(renderJson(result)).pValue === result.pValue; // true
 * ```
 */
export function renderJson(r: DwTestResult): string {
  return JSON.stringify(ordered({ packageVersion: VERSION, ...r }, ''), null, 2) + '\n';
}
