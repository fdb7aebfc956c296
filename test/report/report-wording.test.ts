/**
 * Wording and rounding rules of the reports (review fixes): p-values near alpha never contradict
 * the decision, clamped zeros print as "< bound", the saddlepoint engine is described and cited,
 * Savin & White are cited only inside their printed tables, the JSON of a dynamic model carries no
 * readable decision, the power section follows the power object (alternative, process, both
 * critical values), and the CLI's critical-value texts use the same inequalities as the decision.
 * Most checks are on hand-made results (test/helpers/report-fixtures.ts): they pin words, not numbers.
 * The density grid is checked against the closed-form total mass (trapezoid + mass outside = 1).
 */
import { describe, expect, it } from 'vitest';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { PAGE_STYLE, PAPER_STYLE, REPORT_STYLE, SENTENCE_STYLE, TERMINAL_STYLE, formatProbability } from '../../src/core/format-number.js';
import { renderText } from '../../src/report/text.js';
import { renderLatex } from '../../src/report/latex.js';
import { renderMarkdown } from '../../src/report/markdown.js';
import { renderJson } from '../../src/report/json.js';
import { paperParagraph } from '../../src/report/paragraph.js';
import { citations, citedKeys, savinWhiteCovers } from '../../src/report/citations.js';
import { formatPValue } from '../../src/bounds/zone.js';
import { formatProbability as pageProbability } from '../../src/web/format.js';
import { formatP } from '../../src/cli/shared.js';
import { densityCurve, densityRange } from '../../src/distribution/density-grid.js';
import { prepareProblem } from '../../src/problem/problem.js';
import type { DwTestResult } from '../../src/inference/dw-test.js';
import { cli, scratch } from '../helpers/cli.js';
import { dynamicResult, staticResult } from '../helpers/report-fixtures.js';

const flat = (s: string) => s.replace(/\s+/g, ' ');

describe('one p-value formatter: the printed number stays on its side of alpha', () => {
  const styles = { REPORT_STYLE, PAPER_STYLE, SENTENCE_STYLE, PAGE_STYLE, TERMINAL_STYLE };
  for (const [name, style] of Object.entries(styles)) {
    it(`${name}: p just above / below alpha prints above / below it`, () => {
      for (const alpha of [0.05, 0.01, 0.1, 0.001]) {
        for (const rel of [1e-9, 1e-6, 1e-4, 1e-3, 1e-2]) {
          for (const p of [alpha * (1 + rel), alpha * (1 - rel)]) {
            const f = formatProbability(p, style, { alpha });
            if (f.relation === '<') {
              // the paper's "< 0.001": only below its floor, and then at or below alpha too
              expect(p).toBeLessThan(Number(f.value));
              expect(Number(f.value)).toBeLessThanOrEqual(alpha);
            } else {
              expect(f.relation).toBe('=');
              expect(Math.sign(Number(f.value) - alpha)).toBe(Math.sign(p - alpha));
            }
          }
        }
      }
    });
  }
  it('the review case: 0.05004 prints as 0.05004 (not 0.0500 or 0.050)', () => {
    expect(formatProbability(0.05004, REPORT_STYLE, { alpha: 0.05 }).value).toBe('0.05004');
    expect(formatProbability(0.05004, PAPER_STYLE, { alpha: 0.05 }).value).toBe('0.05004');
    expect(formatProbability(0.05004, REPORT_STYLE).value).toBe('0.0500'); // no alpha: the style alone
  });
  it('a p-value clamped to 0 with an error bound > 0 prints as "< bound", in every front end', () => {
    expect(formatProbability(0, REPORT_STYLE, { errorBound: 3.2e-12 }).text).toBe('< 4e-12');
    expect(pageProbability(0, { errorBound: 1e-11 })).toBe('< 1e-11');
    expect(formatP(0, { errorBound: 1e-11 })).toBe('< 1e-11');
    expect(formatPValue(0, 0.05, 1e-11)).toBe('< 1e-11');
    expect(formatProbability(0, REPORT_STYLE).text).toBe('0'); // exact zero without a bound
  });
  it('|p - alpha| <= error bound is flagged as the numerical limit', () => {
    expect(formatProbability(0.0500001, REPORT_STYLE, { alpha: 0.05, errorBound: 1e-6 }).atLimit).toBe(true);
    expect(formatProbability(0.0500001, REPORT_STYLE, { alpha: 0.05, errorBound: 1e-9 }).atLimit).toBe(false);
  });
  it('the styles keep their former look away from alpha', () => {
    expect(formatProbability(0.031234, REPORT_STYLE).value).toBe('0.0312');
    expect(formatProbability(2.5e-7, PAGE_STYLE).value).toBe('2.50e-7');
    expect(formatProbability(0.021, PAPER_STYLE).value).toBe('0.021');
    expect(formatProbability(0.0004, PAPER_STYLE).text).toBe('< 0.001');
    expect(formatProbability(0.996, PAPER_STYLE).text).toBe('> 0.99');
    expect(formatP(0.0312)).toBe('0.0312');
    expect(formatPValue(0.0501, 0.05)).toBe('0.0501');
  });
});

function nearAlpha(pValue: number, errorBound: number): DwTestResult {
  const r = staticResult();
  return { ...r, pValue, pPositive: pValue, pNegative: 1 - pValue, pTwoSided: Math.min(1, 2 * pValue), errorBound, decision: pValue <= r.alpha ? 'reject' : 'not-rejected' };
}

describe('reports near alpha', () => {
  it('p = 0.05004: the conclusion and the paragraph print a number above 0.05', () => {
    const r = nearAlpha(0.05004, 1e-11);
    const t = flat(renderText(r));
    expect(t).toMatch(/p = 0\.05004 > 0\.05/);
    expect(t).not.toMatch(/numerical limit/);
    expect(flat(paperParagraph(r))).toMatch(/exact p-value of 0\.05004 /);
  });
  it('p = 0.04996 (rejected): printed below 0.05', () => {
    const r = nearAlpha(0.04996, 1e-11);
    expect(flat(renderText(r))).toMatch(/p = 0\.04996 <= 0\.05/);
    expect(flat(paperParagraph(r))).toMatch(/exact p-value of 0\.04996 /);
  });
  it('|p - alpha| within the error bound: the decision is said to be at the numerical limit', () => {
    const r = nearAlpha(0.0500004, 1e-6);
    expect(flat(renderText(r))).toMatch(/at the numerical limit of the computation/);
    expect(flat(paperParagraph(r))).toMatch(/at the numerical limit of the computation/);
  });
  it('a clamped zero is printed as "< bound" in the p-value table', () => {
    const r = { ...staticResult(), pValue: 0, pPositive: 0, pNegative: 1, pTwoSided: 0, errorBound: 2e-12, decision: 'reject' as const };
    const t = flat(renderText(r));
    expect(t).toMatch(/P\(D <= d\) < 2e-12/);
    expect(t).toMatch(/p < 2e-12 <= 0\.05/);
  });
});

describe('the saddlepoint engine', () => {
  const r = { ...staticResult(), method: 'saddlepoint' as const };
  it('is described in every format and the paragraph, and why Daniels (1954) is cited is said: the line, not an approximation', () => {
    expect(flat(renderText(r))).toMatch(/exact numerical inversion of the distribution function on the eigenvalues of the design, along the vertical line through the saddlepoint; the saddlepoint is that of Daniels \(Daniels 1954\), used only to place the line/);
    expect(flat(renderText(r))).toMatch(/not Daniels's saddlepoint approximation/);
    expect(flat(paperParagraph(r))).toMatch(/exact numerical inversion of its distribution function along the line through the saddlepoint \(the point of Daniels's saddlepoint method \(Daniels 1954\), used only to place the line; no saddlepoint approximation is made\)/);
    expect(paperParagraph(r, 'latex')).toContain('\\cite{daniels-1954}');
    expect(paperParagraph(r, 'markdown')).toContain('[@daniels-1954]');
    expect(citedKeys(r)).toContain('daniels-1954');
    expect(citations(r)).toMatch(/@article\{daniels-1954,[\s\S]*pages += \{631--650\}/);
    expect(citedKeys(r)).not.toContain('imhof-1961');
  });
});

describe('Savin & White (1977) only inside their printed tables (n = 6..200, k\' <= 20, 5% and 1%; from memory)', () => {
  it('the range rule', () => {
    expect(savinWhiteCovers(24, 2, 0.05)).toBe(true);
    expect(savinWhiteCovers(200, 20, 0.01)).toBe(true);
    expect(savinWhiteCovers(201, 2, 0.05)).toBe(false);
    expect(savinWhiteCovers(40, 21, 0.05)).toBe(false);
    expect(savinWhiteCovers(24, 2, 0.025)).toBe(false);
    expect(savinWhiteCovers(5, 1, 0.05)).toBe(false);
  });
  it('inside: cited in report, paragraph and BibTeX', () => {
    const r = staticResult(); // n = 24, k' = 2, 5%
    expect(citedKeys(r)).toContain('savin-white-1977');
    expect(flat(renderText(r))).toMatch(/printed tables \(Savin and White 1977\)/);
  });
  it('outside (n = 300; or a 2.5% tail): not cited, and the bounds are said to lie beyond the printed tables', () => {
    for (const r of [{ ...staticResult(), n: 300, m: 297 }, { ...staticResult(), bounds: { ...staticResult().bounds!, level: 0.025 } }]) {
      expect(citedKeys(r)).not.toContain('savin-white-1977');
      const t = flat(renderText(r));
      expect(t).not.toMatch(/Savin/);
      expect(t).toMatch(/lies beyond the printed tables/);
      expect(flat(paperParagraph(r))).toMatch(/computed exactly because this case lies beyond the printed tables/);
    }
  });
});

describe('JSON of a dynamic model: no readable decision', () => {
  it('dValid false, decision "not-valid", the d numbers only under dForReferenceOnly', () => {
    const r = dynamicResult();
    const j = JSON.parse(renderJson(r));
    expect(j.dValid).toBe(false);
    expect(j.decision).toBe('not-valid');
    for (const k of ['pValue', 'pPositive', 'pNegative', 'pTwoSided', 'critical', 'bounds', 'power']) expect(k in j).toBe(false);
    expect(j.dForReferenceOnly.pValue).toBe(r.pValue);
    expect(j.dForReferenceOnly.critical.lower).toBe(r.critical.lower);
    expect(j.dynamic.laggedDependent).toBe(r.dynamic!.laggedDependent);
  });
  it('a static model: dValid true and the decision as computed', () => {
    const j = JSON.parse(renderJson(staticResult()));
    expect(j.dValid).toBe(true);
    expect(j.decision).toBe(staticResult().decision);
    expect(j.dForReferenceOnly).toBeUndefined();
  });
});

describe('the power section follows the power object', () => {
  it('two-sided: both critical values and the region d <= lower or d >= upper', () => {
    const base = staticResult();
    const r: DwTestResult = {
      ...base, alternative: 'two-sided',
      power: { ...base.power!, critical: 1.2345, ...{ alternative: 'two-sided', criticalUpper: 2.7655, process: 'ar1', notes: [], route: 'dense' } } as DwTestResult['power'],
    };
    const t = flat(renderText(r));
    expect(t).toMatch(/Level \.* 0\.05 \(0\.025 in each tail\)/);
    expect(t).toMatch(/Exact lower critical value \.* 1\.2345/);
    expect(t).toMatch(/Exact upper critical value \.* 2\.7655/);
    expect(t).toMatch(/d <= 1\.2345 or d >= 2\.7655/);
    expect(t).toMatch(/Power of the two-sided test/);
    expect(t).not.toMatch(/one-sided test for positive/);
  });
  it('seasonal process at lag 4: heading, table and formula say u(t-4), innovations eps apart from the residuals e', () => {
    const base = staticResult();
    const r: DwTestResult = { ...base, lag: 4, bounds: null, power: { ...base.power!, ...{ alternative: 'positive', criticalUpper: null, process: 'seasonal', notes: [], route: 'dense' } } as DwTestResult['power'] };
    const t = flat(renderText(r));
    expect(t).toMatch(/EXACT POWER AGAINST SEASONAL AUTOREGRESSIVE ERRORS AT LAG 4/i);
    expect(t).toMatch(/u\(t\) = rho u\(t-4\) \+ eps\(t\)/);
    expect(flat(paperParagraph(r))).toMatch(/Against stationary seasonal errors u\(t\) = rho u\(t-4\) \+ eps\(t\)/);
    expect(renderLatex(r)).toContain('$u_t = \\rho\\, u_{t-4} + \\varepsilon_t$');
    expect(renderMarkdown(r)).toContain('*u*<sub>t</sub> = ρ *u*<sub>t-4</sub> + ε<sub>t</sub>');
  });
  it('negative alternative: the rejection region is d >= c', () => {
    const base = staticResult();
    const r: DwTestResult = { ...base, alternative: 'negative', power: { ...base.power!, critical: 2.6, ...{ alternative: 'negative', criticalUpper: null, process: 'ar1', notes: [], route: 'dense' } } as DwTestResult['power'] };
    const t = flat(renderText(r));
    expect(t).toMatch(/Rejection region \.* d >= 2\.6000/);
    expect(t).toMatch(/one-sided test for negative autocorrelation/);
  });
});

describe('CLI critical and power: d <= c and d >= c, rho printed in full', () => {
  const dir = scratch();
  const design = join(dir, 'x.csv');
  // invented design: a trend and a cosine
  writeFileSync(design, 'trend,c\n' + Array.from({ length: 16 }, (_, i) => `${i + 1},${Math.cos(i).toFixed(4)}`).join('\n') + '\n');
  it('critical', async () => {
    const r = await cli('critical', '--design', design);
    expect(r.status).toBe(0);
    expect(r.out).toMatch(/when d <= \d\.\d{4}/);
    expect(r.out).toMatch(/when d >= \d\.\d{4}/);
    expect(r.out).not.toMatch(/d [<>] \d/);
  });
  it('power --rho 0.999999 prints 0.999999, and the test uses <= / >=', async () => {
    const r = await cli('power', '--design', design, '--rho', '0.5,0.999999', '--target', 'none', '--alternative', 'two-sided');
    expect(r.status).toBe(0);
    expect(r.out).toMatch(/^\s+0\.999999\s+\d\.\d{4}$/m);
    expect(r.out).toMatch(/^\s+0\.500\s+\d\.\d{4}$/m);
    expect(r.out).toMatch(/reject when d <= \d\.\d{4} or d >= \d\.\d{4}/);
    expect(r.out).not.toMatch(/1\.000\s/);
  });
});

describe('density grid (src/distribution/density-grid.ts)', () => {
  it('trapezoid integral + exact mass outside = 1 (closed form: a density integrates to 1), and the density at extra points is the pdf', () => {
    const x = { trend: Float64Array.from({ length: 15 }, (_, i) => i + 1) };
    const dist = prepareProblem(x, 15).distribution;
    const range = densityRange(dist, [1.2]);
    const c = densityCurve(dist, range, 2e-8, 8192, [1.2, -1]);
    expect(c.converged).toBe(true);
    expect(Math.abs(c.trapezoid + c.outsideMass - 1)).toBeLessThan(1e-6);
    expect(c.atPoints[0]).toBe(dist.pdf(1.2));
    expect(c.atPoints[1]).toBe(0);
  });
});
