/**
 * Engine agreement: on 200 seeded random designs (n from 6 to 400, k from 1 to 12, with and
 * without an intercept, c across the whole support, both tails) the Imhof, Pan and eigen-free
 * engines agree to 1e-9 wherever two of them apply. Three independent routes to one number:
 * Imhof's integral on the spectrum, Pan's finite-range sum on the spectrum, the inversion on a line
 * through the saddlepoint (on the spectrum, a different contour), and Imhof's integral
 * on a log-determinant that never sees an eigenvalue (on every fourth design, to keep the suite
 * quick). A failure prints the design's seed.
 */
import { describe, expect, it } from 'vitest';
import { differenceMatrix, differencePairs } from '../../src/core/difference.js';
import { columnBasis } from '../../src/linalg/qr.js';
import { fastSpectrum } from '../../src/core/fast-spectrum.js';
import { integrateImhof } from '../../src/engines/imhof.js';
import { imhofTail } from '../../src/engines/imhof-product.js';
import { panApplicable, panTail } from '../../src/engines/pan.js';
import { eigenfreeForm } from '../../src/engines/eigenfree.js';
import { dctTail } from '../../src/engines/dct.js';
import { contourTail } from '../../src/engines/saddle-contour.js';
import { buildDesign, factorDesign } from '../../src/model/design.js';
import { seededNormal, seededRandom } from '../helpers/reference.js';

interface Case { seed: number; n: number; k: number; intercept: boolean }

function cases(count: number): Case[] {
  const u = seededRandom(20261201);
  const out: Case[] = [];
  for (let i = 0; i < count; i++) {
    // n spread over 6..400 with more small samples (the users' regime)
    const n = Math.round(6 + 394 * u() ** 2);
    const intercept = u() < 0.7;
    const kMax = Math.min(12, n - 3);
    const k = 1 + Math.floor(u() * kMax);
    out.push({ seed: 1000 + i, n, k, intercept });
  }
  return out;
}

function setup(c: Case) {
  const g = seededNormal(c.seed);
  const p = c.intercept ? c.k - 1 : c.k;
  const cols: Record<string, Float64Array> = {};
  for (let j = 0; j < p; j++) {
    cols[`x${j + 1}`] = Float64Array.from({ length: c.n }, (_, t) => (j === 0 ? t / c.n + 0.1 * g() : g()));
  }
  const fd = factorDesign(buildDesign(cols, c.n, { intercept: c.intercept }));
  const a = differenceMatrix(differencePairs(c.n));
  const basis = columnBasis(fd.qr);
  return { a, basis, nu: fastSpectrum(a, basis) };
}

describe('engine agreement on 200 seeded random designs (Imhof, Pan, saddlepoint, DCT; eigen-free on 50)', () => {
  const all = cases(200);
  it('covers the ranges the issue asks for', () => {
    expect(Math.min(...all.map((c) => c.n))).toBeLessThanOrEqual(8);
    expect(Math.max(...all.map((c) => c.n))).toBeGreaterThanOrEqual(350);
    expect(new Set(all.map((c) => c.k)).size).toBeGreaterThanOrEqual(10);
    expect(all.some((c) => !c.intercept)).toBe(true);
  });
  it('Imhof, Pan, saddlepoint, DCT and eigen-free agree to 1e-9 wherever two apply', () => {
    const failures: string[] = [];
    let comparisons = 0;
    let panUsed = 0;
    let eigenfreeUsed = 0;
    let dctUsed = 0;
    for (const c of all) {
      const { a, basis, nu } = setup(c);
      const lo = nu[0], hi = nu[nu.length - 1];
      const u = seededRandom(c.seed);
      // points across the support, including near both ends
      const pts = [0.02, 0.5, 0.98, u()].map((f) => lo + (hi - lo) * f);
      for (const x of pts) {
        for (const tail of ['lower', 'upper'] as const) {
          const im = imhofTail(nu, x, tail);
          // the eigen-free engine (O(n k) per evaluation, slower at these n) on every fourth design
          if (c.seed % 4 === 0) {
            const ef = integrateImhof(eigenfreeForm(a, basis, x, tail === 'lower' ? 1 : -1));
            comparisons++;
            eigenfreeUsed++;
            if (!(Math.abs(im.p - ef.p) <= 1e-9)) failures.push(`seed ${c.seed} (n ${c.n}, k ${c.k}, intercept ${c.intercept}) c ${x} ${tail}: imhof ${im.p} eigenfree ${ef.p}`);
          }
          // the DCT eigenbasis route on every design (its operator is always a difference operator)
          const dc = dctTail(a, basis, x, tail);
          comparisons++;
          dctUsed++;
          if (!(Math.abs(im.p - dc.p) <= 1e-9)) failures.push(`seed ${c.seed} (n ${c.n}, k ${c.k}, intercept ${c.intercept}) c ${x} ${tail}: imhof ${im.p} dct ${dc.p}`);
          const sp = contourTail(nu, x, tail);
          comparisons++;
          if (!(Math.abs(im.p - sp.p) <= 1e-9)) failures.push(`seed ${c.seed} (n ${c.n}, k ${c.k}, intercept ${c.intercept}) c ${x} ${tail}: imhof ${im.p} saddlepoint ${sp.p}`);
          if (panApplicable(nu, x).ok) {
            const pa = panTail(nu, x, tail);
            panUsed++;
            comparisons++;
            if (!(Math.abs(im.p - pa.p) <= 1e-9)) failures.push(`seed ${c.seed} (n ${c.n}, k ${c.k}, intercept ${c.intercept}) c ${x} ${tail}: imhof ${im.p} pan ${pa.p}`);
          }
        }
      }
    }
    expect(failures, failures.slice(0, 10).join('\n')).toEqual([]);
    expect(comparisons).toBeGreaterThan(800);
    expect(eigenfreeUsed).toBeGreaterThanOrEqual(400);
    expect(dctUsed).toBeGreaterThanOrEqual(1600);
    // Pan must actually take part in a good share of the comparisons
    expect(panUsed).toBeGreaterThan(400);
  });
});
