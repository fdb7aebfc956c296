/**
 * Hand-made test results for the report tests. The numbers are invented (only their shape and
 * consistency matter: p <= alpha when the decision is 'reject', the zone agrees with d, dL, dU), and
 * each fixture fills the optional slots (bounds, power, dynamic) so that every renderer branch runs.
 */
import type { DwTestResult } from '../../src/inference/dw-test.js';

/** Lag 1, intercept added, positive alternative, rejected; bounds inconclusive; power curve of 19 points. */
export function staticResult(): DwTestResult {
  return {
    d: 1.3148042876779875,
    n: 24,
    k: 3,
    m: 21,
    lag: 1,
    gaps: false,
    intercept: true,
    interceptAdded: true,
    columns: ['(intercept)', 'spring_rain_mm', 'june_temp_c'],
    coefficients: [
      { name: '(intercept)', estimate: 6.515642732679662, stdError: 5.881436667659463 },
      { name: 'spring_rain_mm', estimate: 0.06110636775767839, stdError: 0.009112493212969771 },
      { name: 'june_temp_c', estimate: -0.07899480521411739, stdError: 0.28647603906305347 },
    ],
    rSquared: 0.681811040024698,
    alternative: 'positive',
    alpha: 0.05,
    pValue: 0.03858611912806642,
    pPositive: 0.03858611912806642,
    pNegative: 0.9614138808719336,
    pTwoSided: 0.07717223825613284,
    critical: { lower: 1.3606238117, upper: 2.6528110345, tailLevel: 0.05 },
    decision: 'reject',
    dValid: true,
    method: 'imhof',
    methodChoice: { code: 'IMHOF_SPECTRUM' },
    errorBound: 1.3862e-11,
    errorBoundPositive: 6.931e-12,
    errorBoundNegative: 6.931e-12,
    nullMean: 2.0083911,
    nullVariance: 0.15350712,
    bounds: {
      kPrime: 2,
      level: 0.05,
      dL: 1.18793,
      dU: 1.54636,
      zone: 'inconclusive-positive',
      outcome: { code: 'BOUNDS_INCONCLUSIVE', d: 1.3148042876779875, alpha: 0.05, alternative: 'positive', intercept: true, exactP: 0.03858611912806642, exactPErrorBound: 1.3862e-11 },
    },
    power: {
      alpha: 0.05,
      critical: 1.3606238117,
      curve: Array.from({ length: 19 }, (_, i) => ({ rho: (i + 1) * 0.05, power: 0.05 + 0.9 * (1 - Math.exp(-4 * ((i + 1) * 0.05) ** 1.5)) })),
      target: 0.8,
      rhoAtTarget: 0.6172,
    },
    dynamic: null,
    timeColumn: null,
    droppedRows: null,
    rhoHat: 0.3,
    breuschGodfrey: null,
    input: null,
    options: null,
    software: { name: 'exact-dw', version: '0.1.0' },
    warnings: [],
  };
}

/** No intercept, lag 4, two-sided, Pan engine, residuals supplied (no coefficients), not rejected. */
export function noInterceptLag4(): DwTestResult {
  return {
    d: 2.2113,
    n: 40,
    k: 2,
    m: 38,
    lag: 4,
    gaps: false,
    intercept: false,
    interceptAdded: false,
    columns: ['quarter_index', 'price'],
    coefficients: null,
    rSquared: null,
    alternative: 'two-sided',
    alpha: 0.1,
    pValue: 0.4412,
    pPositive: 0.7794,
    pNegative: 0.2206,
    pTwoSided: 0.4412,
    critical: { lower: 1.4521, upper: 2.6033, tailLevel: 0.05 },
    decision: 'not-rejected',
    dValid: true,
    method: 'pan',
    methodChoice: { code: 'SMALL_TAIL_PAN' },
    errorBound: 2.0e-13,
    errorBoundPositive: 1.0e-13,
    errorBoundNegative: 1.0e-13,
    nullMean: 2.0412,
    nullVariance: 0.0921,
    bounds: null,
    power: null,
    dynamic: null,
    timeColumn: null,
    droppedRows: null,
    rhoHat: 0.3,
    breuschGodfrey: null,
    input: null,
    options: null,
    software: { name: 'exact-dw', version: '0.1.0' },
    warnings: [{ code: 'BOUNDS_NO_INTERCEPT' }],
  };
}

/** Negative alternative, gaps in time, eigen-free engine, tiny p-value, huge and tiny coefficients. */
export function negativeWithGaps(): DwTestResult {
  return {
    d: 3.4121,
    n: 60,
    k: 4,
    m: 56,
    lag: 1,
    gaps: true,
    intercept: true,
    interceptAdded: false,
    columns: ['const', 'flow_m3', 'temp_c', 'area & share'],
    coefficients: [
      { name: 'const', estimate: 12345678.9, stdError: 234567.1 },
      { name: 'flow_m3', estimate: -0.00003127, stdError: 0.0000112 },
      { name: 'temp_c', estimate: 1.5, stdError: 0.25 },
      { name: 'area & share', estimate: -42.125, stdError: 10.5 },
    ],
    rSquared: 0.93121,
    alternative: 'negative',
    alpha: 0.01,
    pValue: 0.000012345,
    pPositive: 0.999987655,
    pNegative: 0.000012345,
    pTwoSided: 0.00002469,
    critical: { lower: 1.3021, upper: 2.7012, tailLevel: 0.01 },
    decision: 'reject',
    dValid: true,
    method: 'eigenfree',
    methodChoice: { code: 'LARGE_N_EIGENFREE', n: 60 },
    errorBound: 7.1e-12,
    errorBoundPositive: 3.55e-12,
    errorBoundNegative: 3.2e-12,
    nullMean: 2.0144,
    nullVariance: 0.0612,
    bounds: null,
    power: {
      alpha: 0.01,
      critical: 1.3021,
      curve: [{ rho: 0.2, power: 0.11 }, { rho: 0.5, power: 0.52 }, { rho: 0.8, power: 0.77 }],
      target: 0.9,
      rhoAtTarget: null,
    },
    dynamic: null,
    timeColumn: null,
    droppedRows: null,
    rhoHat: 0.3,
    breuschGodfrey: null,
    input: null,
    options: null,
    software: { name: 'exact-dw', version: '0.1.0' },
    warnings: [{ code: 'BOUNDS_LAG_OR_GAPS', lag: 1, gaps: true }],
  };
}

/** A dynamic model: lagged dependent variable detected, both asymptotic tests reject; bounds and power present but must be withheld. */
export function dynamicResult(): DwTestResult {
  return {
    ...staticResult(),
    d: 1.9012,
    columns: ['(intercept)', 'sales_lag1', 'price'],
    coefficients: [
      { name: '(intercept)', estimate: 1.2, stdError: 0.4 },
      { name: 'sales_lag1', estimate: 0.71, stdError: 0.09 },
      { name: 'price', estimate: -0.33, stdError: 0.12 },
    ],
    pValue: 0.3801,
    pPositive: 0.3801,
    pNegative: 0.6199,
    pTwoSided: 0.7602,
    decision: 'not-valid',
    dValid: false,
    bounds: { kPrime: 2, level: 0.05, dL: 1.18793, dU: 1.54636, zone: 'no-evidence',
      outcome: { code: 'BOUNDS_DO_NOT_REJECT', d: 1.9012, alpha: 0.05, alternative: 'positive', intercept: true, exactP: 0.3801, exactPErrorBound: 0 } },
    dynamic: {
      laggedDependent: 'sales_lag1',
      how: 'detected',
      durbinH: { h: 2.3154, pValue: 0.010296, status: 'DURBIN_H_DEFINED', nV: 0.48, variance: 0.02 },
      breuschGodfrey: { order: 1, lm: 4.2113, pChiSquare: 0.040148, f: 4.0012, pF: 0.05912, df1: 1, df2: 19 },
      residualT: { t: 2.1022, pValue: 0.035531 },
    },
  };
}

/** A dynamic model where n V >= 1, so Durbin's h is undefined; the Breusch-Godfrey test does not reject. */
export function dynamicNoH(): DwTestResult {
  const r = dynamicResult();
  return {
    ...r,
    dynamic: {
      ...r.dynamic!,
      how: 'declared',
      durbinH: {
        h: null, pValue: null, status: 'DURBIN_H_UNDEFINED', nV: 1.31, variance: 0.0546,
      },
      breuschGodfrey: { order: 2, lm: 1.1021, pChiSquare: 0.57635, f: 0.5012, pF: 0.6138, df1: 2, df2: 18 },
    },
  };
}

/** All fixtures by name. */
export const FIXTURES: Record<string, () => DwTestResult> = {
  staticResult, noInterceptLag4, negativeWithGaps, dynamicResult, dynamicNoH,
};
