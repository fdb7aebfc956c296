/**
 * The layers of src/ and their one direction of flow. The order below is the one DEVELOPERS.md
 * ("Layout") documents: a unit (a folder of src/, or a file at its root) may import only units of
 * strictly lower layers, so no two folders import each other and no file cycle runs through
 * folders. Files are also free of cycles inside a folder. Moving a file or adding a folder means
 * placing it here (an undeclared unit fails) and in the table of DEVELOPERS.md.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { findCycles, orderViolations, readImports, toGraph, unitOf, type ImportEdge } from './helpers/import-graph.js';

/** From the bottom up. */
export const LAYERS: string[][] = [
  ['errors', 'version', 'policy'],          // leaves: the error type, the version, the precision policy
  ['linalg', 'numeric', 'data'],            // dense/band linear algebra; quadrature, roots, special functions; CSV and time labels
  ['core'],                                 // operator A, spectra, shared shapes
  ['model'],                                // design and OLS
  ['limits'],                               // the size limits applied
  ['engines'],                              // Imhof, Pan, eigen-free, DCT, contour; the auto rule
  ['distribution'],                         // DwNullDistribution
  ['problem'],                              // design -> distribution
  ['panel', 'dynamic', 'bounds', 'power'],  // the pooled panel design; dynamic-model tests; d_L/d_U; power
  ['inference'],                            // the test and its result
  ['report'],                               // renderers
  ['batch'],                                // many series at once
  ['cli', 'web', 'index', 'report-entry', 'engines-entry'], // the command line, the page, the package's entry points
];

const src = fileURLToPath(new URL('../src', import.meta.url));
const edges = readImports(src);

describe('the import graph of src/', () => {
  it('is read from the sources (a sanity floor, so an empty parse cannot pass)', () => {
    expect(edges.length).toBeGreaterThan(300);
    expect(edges).toContainEqual({ from: 'engines/imhof.ts', to: 'numeric/quadrature.ts' });
    expect(edges).toContainEqual({ from: 'report/format.ts', to: 'report/citations.ts' });
  });

  it('has no cycle between folders', () => {
    expect(findCycles(toGraph(edges, unitOf))).toEqual([]);
  });

  it('has no cycle between files', () => {
    expect(findCycles(toGraph(edges))).toEqual([]);
  });

  it('imports only downwards in the declared order, and every folder is declared', () => {
    expect(orderViolations(edges, LAYERS)).toEqual([]);
  });

  it('is the order DEVELOPERS.md documents', () => {
    const doc = readFileSync(new URL('../DEVELOPERS.md', import.meta.url), 'utf8');
    const block = /<!-- layers:begin -->\n```\n([\s\S]*?)```\n<!-- layers:end -->/.exec(doc);
    expect(block, 'DEVELOPERS.md keeps the layer list between layers:begin and layers:end').not.toBeNull();
    const documented = block![1].trim().split('\n').map((line) => line.replace(/^\s*\d+\s+/, '').split(/\s*,\s*/).map((u) => u.trim()));
    expect(documented.reverse()).toEqual(LAYERS);
  });
});

describe('the checks can fail (synthetic graphs)', () => {
  const e = (from: string, to: string): ImportEdge => ({ from, to });

  it('a cycle between two folders through three files is found', () => {
    const g = [e('a/x.ts', 'b/y.ts'), e('b/y.ts', 'b/z.ts'), e('b/z.ts', 'a/w.ts'), e('c/v.ts', 'a/x.ts')];
    expect(findCycles(toGraph(g, unitOf))).toEqual([['a', 'b']]);
    // at the file level the same graph has no cycle (x -> y -> z -> w ends)
    expect(findCycles(toGraph(g))).toEqual([]);
  });

  it('a cycle of two files in one folder is found (the shape of a format <-> citations loop)', () => {
    const g = [e('report/format.ts', 'report/citations.ts'), e('report/citations.ts', 'report/format.ts'), e('report/text.ts', 'report/format.ts')];
    expect(findCycles(toGraph(g))).toEqual([['report/citations.ts', 'report/format.ts']]);
    expect(findCycles(toGraph(g, unitOf))).toEqual([]);
  });

  it('an upward import, an import inside one layer and an undeclared folder are reported', () => {
    const layers = [['errors'], ['engines'], ['distribution', 'problem']];
    const g = [
      e('distribution/d.ts', 'engines/e.ts'), // downwards: fine
      e('engines/choose.ts', 'distribution/source.ts'), // upwards
      e('problem/p.ts', 'distribution/d.ts'), // same layer
      e('engines/e.ts', 'errors.ts'), // downwards to a root file: fine
      e('stray/s.ts', 'errors.ts'), // undeclared
    ];
    const bad = orderViolations(g, layers);
    expect(bad).toHaveLength(3);
    expect(bad[0]).toMatch(/^engines\/choose\.ts imports distribution\/source\.ts/);
    expect(bad[1]).toMatch(/^problem\/p\.ts imports distribution\/d\.ts/);
    expect(bad[2]).toBe('stray is in no declared layer');
  });
});
