/**
 * A batch against an outside reference: test/ref/batch_reference.py computes, for each series of a
 * small invented file, d and P(D <= d) with numpy (X, A with the time gap, complete QR, eigenvalues
 * of Z'AZ) and mpmath (Imhof's integral, 30 digits), and the Holm and Benjamini-Hochberg adjusted
 * p-values by a separate numpy implementation of the textbook formulas; the tests read its JSON.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { exactDwBatch } from '../../src/batch/batch.js';
import { parseCsv } from '../../src/data/csv.js';
import { referenceJson } from '../helpers/reference.js';

const ref = referenceJson('batch-reference.json') as {
  csv: string; groups: Array<{ group: string; d: number; pPositive: number; holm: number; bh: number }>;
};
const table = parseCsv(ref.csv, { source: "'batch-reference.csv'" });

describe('batch against numpy/mpmath (test/ref/batch-reference.json)', () => {
  for (const adjust of ['holm', 'bh'] as const) {
    it(`d, the exact p-values and the ${adjust} adjusted p-values of every series`, () => {
      const b = exactDwBatch({ table, by: 'shop', y: 'sales', x: ['price'], time: 'week', adjust });
      expect(b.groups.map((g) => g.group)).toEqual(ref.groups.map((g) => g.group));
      expect(b.summary).toMatchObject({ groups: 8, tested: 8, failed: 0, designs: 6 });
      b.groups.forEach((g, i) => {
        const r = ref.groups[i];
        expect(Math.abs(g.d! - r.d)).toBeLessThan(1e-12);
        expect(Math.abs(g.pValue! - r.pPositive)).toBeLessThan(1e-10);
        expect(Math.abs(g.pAdjusted! - r[adjust])).toBeLessThan(1e-9);
        expect(g.decision).toBe(r[adjust] <= 0.05 ? 'reject' : 'not-rejected');
      });
    });
  }
});
