/**
 * JSON rendering of a test result: every field of the DwTestResult plus the package version, in a
 * fixed key order (so that two runs on the same data give byte-identical files and diffs stay
 * small). Numbers are written in JavaScript's shortest round-trip form, so parsing the file gives
 * back exactly the numbers of the result; a non-finite number is written as null.
 *
 * A script must never read an invalid decision: the top-level `dValid` says whether d is a valid
 * test. For a model with a lagged dependent variable (`dynamic` not null) `dValid` is false,
 * `decision` is "not-valid", and the numbers of d's null distribution (p-values, critical values,
 * engine, null moments, bounds zone, power) move into `dForReferenceOnly`, so that `pValue` and `decision` at
 * the top level cannot be mistaken for a result.
 *
 * Notes and reasons are typed codes in the result and stay so here (`warnings[].code`,
 * `methodChoice.code`, `bounds.outcome.code`, `dynamic.durbinH.status`); beside the codes the file
 * keeps the sentences it has always had (`methodReason`, `bounds.resolution`,
 * `dynamic.durbinH.reason`), written by wording.ts.
 */
import type { DwTestResult } from '../inference/dw-test.js';
import { VERSION } from '../version.js';
import { inline } from './format.js';
import { boundsResolutionWords, durbinHWords, engineChoiceWords } from './wording.js';

/** Fields that describe d as a test: moved under `dForReferenceOnly` when d is not valid. */
const D_ONLY = [
  'pValue', 'pPositive', 'pNegative', 'pTwoSided', 'critical', 'method', 'methodChoice', 'methodReason', 'errorBound',
  'errorBoundPositive', 'errorBoundNegative', 'nullMean', 'nullVariance', 'bounds', 'power',
] as const;

const POWER_KEYS = [
  'alpha', 'alternative', 'process', 'critical', 'criticalUpper', 'target', 'rhoAtTarget', 'curve',
  'route', 'errorBound', 'n', 'k', 'm', 'lag', 'gaps', 'notes',
];

const OUTCOME_KEYS = ['code', 'd', 'alpha', 'alternative', 'intercept', 'exactP', 'exactPErrorBound'];

/** Key order of each object in the result, by path ('' is the top level, '[]' an array element). */
const KEY_ORDER: Record<string, string[]> = {
  '': [
    'packageVersion', 'd', 'n', 'k', 'm', 'lag', 'gaps', 'timeColumn', 'droppedRows', 'intercept', 'interceptAdded', 'columns',
    'coefficients', 'rSquared', 'dValid', 'alternative', 'alpha', 'pValue', 'pPositive', 'pNegative', 'pTwoSided',
    'critical', 'decision', 'method', 'methodChoice', 'methodReason', 'errorBound', 'errorBoundPositive', 'errorBoundNegative',
    'nullMean', 'nullVariance',
    'bounds', 'power', 'rhoHat', 'breuschGodfrey', 'dynamic', 'dForReferenceOnly', 'warnings',
    'software', 'input', 'options',
  ],
  software: ['name', 'version'],
  input: ['name', 'sha256', 'bytes'],
  timeColumn: ['name', 'how', 'format', 'frequency', 'frequencySource', 'first', 'last', 'missingPeriods'],
  droppedRows: ['count', 'rows'],
  breuschGodfrey: ['order', 'lm', 'pChiSquare', 'f', 'pF', 'df1', 'df2', 'rSquared', 'n'],
  'warnings[]': ['code'],
  'methodChoice': ['code'],
  'dForReferenceOnly.methodChoice': ['code'],
  dForReferenceOnly: [...D_ONLY],
  'coefficients[]': ['name', 'estimate', 'stdError'],
  critical: ['lower', 'upper', 'tailLevel'],
  bounds: ['kPrime', 'level', 'dL', 'dU', 'zone', 'outcome', 'resolution'],
  'bounds.outcome': OUTCOME_KEYS,
  power: POWER_KEYS,
  'power.curve[]': ['rho', 'power'],
  'dForReferenceOnly.critical': ['lower', 'upper', 'tailLevel'],
  'dForReferenceOnly.bounds': ['kPrime', 'level', 'dL', 'dU', 'zone', 'outcome', 'resolution'],
  'dForReferenceOnly.bounds.outcome': OUTCOME_KEYS,
  'dForReferenceOnly.power': POWER_KEYS,
  'dForReferenceOnly.power.curve[]': ['rho', 'power'],
  dynamic: ['laggedDependent', 'how', 'durbinH', 'breuschGodfrey', 'residualT'],
  'dynamic.durbinH': ['h', 'pValue', 'status', 'reason'],
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
 * The text that the JSON report has always carried beside the typed codes of the result (the
 * codes stay: `methodChoice`, `bounds.outcome`, `dynamic.durbinH.status`); the words come from
 * wording.ts, as in every other output.
 */
function words(r: DwTestResult): Record<string, unknown> {
  const text = (s: string) => inline(s, 'text');
  const extra: Record<string, unknown> = { methodReason: r.methodChoice ? text(engineChoiceWords(r.methodChoice)) : '' };
  if (r.bounds) extra.bounds = { ...r.bounds, resolution: text(boundsResolutionWords(r.bounds)) };
  if (r.dynamic) extra.dynamic = { ...r.dynamic, durbinH: { ...r.dynamic.durbinH, reason: text(durbinHWords(r.dynamic.durbinH)) } };
  return extra;
}

/**
 * The result as JSON with a stable key order and the package version.
 *
 * @example
 * ```ts
 * writeFileSync('dw-result.json', renderJson(exactDwTest({ y, x })));
 * JSON.parse(renderJson(result)).pValue === result.pValue; // true when d is valid
 * JSON.parse(renderJson(dynamicResult)).decision;            // "not-valid"
 * ```
 */
export function renderJson(r: DwTestResult): string {
  const dValid = r.dynamic === null || r.dynamic === undefined;
  const out: Record<string, unknown> = { packageVersion: VERSION, ...r, dValid, ...words(r) };
  if (!dValid) {
    const ref: Record<string, unknown> = {};
    for (const key of D_ONLY) { ref[key] = out[key]; delete out[key]; }
    out.decision = 'not-valid';
    out.dForReferenceOnly = ref;
  }
  return JSON.stringify(ordered(out, ''), null, 2) + '\n';
}
