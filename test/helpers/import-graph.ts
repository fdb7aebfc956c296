/**
 * The import graph of a source tree, read statically (the TypeScript compiler's own pre-processor
 * lists every `import ... from`, `export ... from`, side-effect `import '...'` and `import(...)`,
 * ignoring comments and strings), and two checks on it: cycles (Tarjan's strongly connected
 * components, Tarjan 1972) and imports that go against a declared order of layers.
 */
import { readFileSync, readdirSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve, sep } from 'node:path';
import ts from 'typescript';

/** A directed graph: node -> the nodes it imports. */
export type Graph = Map<string, Set<string>>;

/** One import: the importing file, the imported file (both relative to the root, with '/'). */
export interface ImportEdge { from: string; to: string }

/** Every relative import between source files under `root` (.ts, .mts, .mjs; not .d.ts). */
export function readImports(root: string): ImportEdge[] {
  const files: string[] = [];
  const walk = (d: string): void => {
    for (const e of readdirSync(d)) {
      const p = join(d, e);
      if (statSync(p).isDirectory()) walk(p);
      else if (/\.(ts|mts|mjs)$/.test(e) && !e.endsWith('.d.ts') && !e.endsWith('.d.mts')) files.push(p);
    }
  };
  walk(root);
  const known = new Set(files.map((f) => resolve(f)));
  const edges: ImportEdge[] = [];
  for (const f of files) {
    const info = ts.preProcessFile(readFileSync(f, 'utf8'), true, true);
    for (const { fileName } of info.importedFiles) {
      if (!fileName.startsWith('.')) continue; // a package, not a file of ours
      const target = resolve(dirname(f), fileName.replace(/\?.*$/, ''));
      const candidates = [target, target.replace(/\.js$/, '.ts'), target.replace(/\.mjs$/, '.mts'), target + '.ts'];
      const hit = candidates.find((c) => known.has(c));
      if (!hit) continue; // outside the tree (e.g. the demo CSV the page inlines)
      edges.push({ from: rel(root, f), to: rel(root, hit) });
    }
  }
  return edges;
}

function rel(root: string, f: string): string {
  return relative(root, f).split(sep).join('/');
}

/**
 * The layer unit of a file: its top folder under the root (`engines/imhof.ts` -> `engines`,
 * `cli/commands/test.ts` -> `cli`), or the file's own name for a file at the root
 * (`errors.ts` -> `errors`).
 */
export function unitOf(file: string): string {
  const parts = file.split('/');
  return parts.length === 1 ? parts[0].replace(/\.(ts|mts|mjs)$/, '') : parts[0];
}

/** Graph of files, or of units when `unit` is given (self-loops of a unit dropped). */
export function toGraph(edges: ImportEdge[], unit?: (f: string) => string): Graph {
  const g: Graph = new Map();
  const node = (x: string): Set<string> => {
    let s = g.get(x);
    if (!s) { s = new Set(); g.set(x, s); }
    return s;
  };
  for (const { from, to } of edges) {
    const a = unit ? unit(from) : from;
    const b = unit ? unit(to) : to;
    node(b);
    if (a !== b) node(a).add(b);
  }
  return g;
}

/** The cycles of a graph: each strongly connected component with more than one node, sorted. */
export function findCycles(g: Graph): string[][] {
  let index = 0;
  const idx = new Map<string, number>();
  const low = new Map<string, number>();
  const stack: string[] = [];
  const onStack = new Set<string>();
  const out: string[][] = [];
  const visit = (v: string): void => {
    idx.set(v, index); low.set(v, index); index++;
    stack.push(v); onStack.add(v);
    for (const w of g.get(v) ?? []) {
      if (!idx.has(w)) { visit(w); low.set(v, Math.min(low.get(v)!, low.get(w)!)); }
      else if (onStack.has(w)) low.set(v, Math.min(low.get(v)!, idx.get(w)!));
    }
    if (low.get(v) === idx.get(v)) {
      const comp: string[] = [];
      let w: string;
      do { w = stack.pop()!; onStack.delete(w); comp.push(w); } while (w !== v);
      if (comp.length > 1 || g.get(v)?.has(v)) out.push(comp.sort());
    }
  };
  for (const v of [...g.keys()].sort()) if (!idx.has(v)) visit(v);
  return out.sort((a, b) => a[0].localeCompare(b[0]));
}

/**
 * Imports against a declared order. `layers` lists the layers from the bottom up, each a list of
 * units; a unit may import only units of strictly lower layers (two units of one layer are
 * independent of each other). Returns one line per offending import, plus one per unit that no
 * layer declares.
 */
export function orderViolations(edges: ImportEdge[], layers: string[][], unit: (f: string) => string = unitOf): string[] {
  const rank = new Map<string, number>();
  layers.forEach((units, r) => units.forEach((u) => rank.set(u, r)));
  const bad: string[] = [];
  const undeclared = new Set<string>();
  for (const { from, to } of edges) {
    const a = unit(from), b = unit(to);
    for (const u of [a, b]) if (!rank.has(u)) undeclared.add(u);
    if (a === b || !rank.has(a) || !rank.has(b)) continue;
    if (rank.get(b)! >= rank.get(a)!) bad.push(`${from} imports ${to}: ${a} (layer ${rank.get(a)}) may not import ${b} (layer ${rank.get(b)})`);
  }
  for (const u of [...undeclared].sort()) bad.push(`${u} is in no declared layer`);
  return bad;
}
