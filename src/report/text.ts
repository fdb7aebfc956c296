/** Plain-text rendering of a test result for a terminal. */
import type { DwTestResult } from '../inference/dw-test.js';

function p(x: number): string {
  if (x === 0) return '0';
  if (x >= 1e-4) return x.toFixed(4);
  return x.toExponential(2);
}

/**
 * A terminal report of an exact Durbin-Watson test.
 *
 * @example
 * ```ts
 * process.stdout.write(renderText(exactDwTest({ y, x })));
 * ```
 */
export function renderText(r: DwTestResult): string {
  const lines: string[] = [];
  lines.push(`Exact Durbin-Watson test${r.lag > 1 ? ` at lag ${r.lag}` : ''}`);
  lines.push(`  n = ${r.n}, k = ${r.k} (${r.columns.join(', ')})`);
  lines.push(`  d = ${r.d.toFixed(4)}   null mean ${r.nullMean.toFixed(4)}, sd ${Math.sqrt(r.nullVariance).toFixed(4)}`);
  lines.push(`  p-values: positive ${p(r.pPositive)}, negative ${p(r.pNegative)}, two-sided ${p(r.pTwoSided)}`);
  lines.push(`  critical values at ${r.alpha}: lower ${r.critical.lower.toFixed(4)}, upper ${r.critical.upper.toFixed(4)}`);
  lines.push(`  alternative ${r.alternative}: p = ${p(r.pValue)}, ${r.decision === 'reject' ? 'reject' : 'do not reject'} no autocorrelation at ${r.alpha}`);
  lines.push(`  engine ${r.method}, error below ${r.errorBound.toExponential(1)}`);
  for (const w of r.warnings) lines.push(`  note: ${w}`);
  return lines.join('\n') + '\n';
}
