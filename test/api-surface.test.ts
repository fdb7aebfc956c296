/**
 * The public API, as a reviewer sees it: the names exported by the root entry point `exact-dw` and
 * by the subpaths `exact-dw/report` and `exact-dw/engines`, each with its kind, compared with the
 * committed list test/api-surface.json. A change to the public API therefore shows in the diff of
 * that file.
 *
 * To accept an intended change, rebuild and rewrite the list:
 *
 *   npm run build && UPDATE_API_SURFACE=1 npx vitest run --config test/vitest.config.ts test/api-surface.test.ts
 *
 * and commit test/api-surface.json with the change (README.md "From TypeScript" and DEVELOPERS.md
 * should say the same). The names are read from the built declaration files (dist/src/*.d.ts,
 * made by `npm test`'s build step) with the TypeScript compiler, so type-only exports count too.
 */
import { describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import ts from 'typescript';

const root = resolve(__dirname, '..');
const pkg = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')) as {
  name: string;
  exports: Record<string, string | { types: string; import: string }>;
};
const SNAPSHOT = join(root, 'test', 'api-surface.json');
const ENTRY_POINTS = ['.', './report', './engines'] as const;

type Surface = Record<string, string[]>;

function kindOf(symbol: ts.Symbol, checker: ts.TypeChecker): string {
  const s = symbol.flags & ts.SymbolFlags.Alias ? checker.getAliasedSymbol(symbol) : symbol;
  const f = s.flags;
  if (f & ts.SymbolFlags.Class) return 'class';
  if (f & ts.SymbolFlags.Function) return 'function';
  if (f & ts.SymbolFlags.Variable) return 'const';
  if (f & ts.SymbolFlags.Interface) return 'interface';
  if (f & ts.SymbolFlags.TypeAlias) return 'type';
  if (f & ts.SymbolFlags.Enum) return 'enum';
  return 'other';
}

/** "name: kind" for every export of each entry point's declaration file, sorted by name. */
function declaredSurface(): Surface {
  const files = ENTRY_POINTS.map((e) => {
    const target = pkg.exports[e];
    if (typeof target !== 'object') throw new Error(`package.json exports["${e}"] has no types condition`);
    return join(root, target.types);
  });
  const program = ts.createProgram(files, {
    module: ts.ModuleKind.NodeNext, moduleResolution: ts.ModuleResolutionKind.NodeNext, skipLibCheck: true, noEmit: true,
  });
  const checker = program.getTypeChecker();
  const surface: Surface = {};
  ENTRY_POINTS.forEach((e, i) => {
    const source = program.getSourceFile(files[i]);
    if (!source) throw new Error(`cannot read ${files[i]}: run npm run build first`);
    const moduleSymbol = checker.getSymbolAtLocation(source);
    if (!moduleSymbol) throw new Error(`${files[i]} is not a module`);
    surface[e] = checker.getExportsOfModule(moduleSymbol)
      .map((s) => `${s.name}: ${kindOf(s, checker)}`)
      .sort((a, b) => (a < b ? -1 : a > b ? 1 : 0));
  });
  return surface;
}

describe('public API surface (test/api-surface.json; see the top of this file to update it)', () => {
  const surface = declaredSurface();

  it('every entry point of package.json exports has its built files', () => {
    for (const e of ENTRY_POINTS) {
      const target = pkg.exports[e] as { types: string; import: string };
      expect(existsSync(join(root, target.types)), target.types).toBe(true);
      expect(existsSync(join(root, target.import)), target.import).toBe(true);
    }
  });

  it('the exported names and kinds equal the committed snapshot', () => {
    if (process.env.UPDATE_API_SURFACE) writeFileSync(SNAPSHOT, JSON.stringify(surface, null, 2) + '\n');
    const committed = JSON.parse(readFileSync(SNAPSHOT, 'utf8')) as Surface;
    expect(surface).toEqual(committed);
  });

  it('the root stays small and the subpaths do not repeat it', () => {
    // a guard against re-exporting internals wholesale (export * from a folder) into the root
    expect(surface['.'].length).toBeLessThanOrEqual(100); // 77 names (values and types) today
    const rootNames = new Set(surface['.'].map((s) => s.split(':')[0]));
    const reportValues = surface['./report'].filter((s) => !/: (type|interface)$/.test(s)).map((s) => s.split(':')[0]);
    expect(reportValues.filter((n) => rootNames.has(n))).toEqual([]);
  });

  it('the runtime exports of each entry point are exactly its value exports', async () => {
    const modules = {
      '.': await import('../src/index.js'),
      './report': await import('../src/report-entry.js'),
      './engines': await import('../src/engines-entry.js'),
    };
    for (const e of ENTRY_POINTS) {
      const values = surface[e].filter((s) => !/: (type|interface)$/.test(s)).map((s) => s.split(':')[0]);
      expect(Object.keys(modules[e]).sort(), e).toEqual(values.sort());
    }
  });

  it('exact-dw, exact-dw/report and exact-dw/engines resolve for a consumer (Node import and TypeScript types)', () => {
    // a consumer project in a temporary directory with the package linked into its node_modules
    const dir = mkdtempSync(join(tmpdir(), 'exact-dw-consumer-'));
    try {
      mkdirSync(join(dir, 'node_modules'));
      symlinkSync(root, join(dir, 'node_modules', pkg.name), 'dir');
      writeFileSync(join(dir, 'package.json'), JSON.stringify({ name: 'consumer', type: 'module', private: true }));
      writeFileSync(join(dir, 'check.mjs'), [
        "const root = await import('exact-dw');",
        "const report = await import('exact-dw/report');",
        "const engines = await import('exact-dw/engines');",
        'const r = root.exactDwTest({ y: [1, 3, 2, 5, 4, 6, 8, 7, 9, 12], x: { t: [1, 2, 3, 4, 5, 6, 7, 8, 9, 10] }, timeColumn: false });',
        'console.log(JSON.stringify({ version: root.VERSION, d: r.d, markdown: report.renderMarkdown(r).length > 0,',
        "  imhof: typeof engines.imhofTail, internal: 'prepareProblem' in root }));",
      ].join('\n'));
      const out = JSON.parse(execFileSync(process.execPath, ['check.mjs'], { cwd: dir, encoding: 'utf8' })) as Record<string, unknown>;
      expect(out.version).toBe(JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')).version);
      expect(out.d).toBeGreaterThan(0);
      expect(out.markdown).toBe(true);
      expect(out.imhof).toBe('function');
      expect(out.internal).toBe(false);

      // the types condition: a strict NodeNext consumer type-checks against the declarations
      writeFileSync(join(dir, 'check.ts'), [
        "import { exactDwTest, type DwTestResult } from 'exact-dw';",
        "import { renderText } from 'exact-dw/report';",
        "import { imhofTail, type TailProbability } from 'exact-dw/engines';",
        'const r: DwTestResult = exactDwTest({ y: [1, 2, 4, 3, 5, 7, 6, 8], x: [[1], [2], [3], [4], [5], [6], [7], [8]] });',
        'const p: TailProbability = imhofTail(new Float64Array([0.5, 1.5, 2.5, 3.5]), 1, "lower");',
        'export const text: string = renderText(r) + String(p.p);',
        '// @ts-expect-error internals are not part of the package API',
        "import { prepareProblem } from 'exact-dw';",
        'export { prepareProblem };',
      ].join('\n'));
      writeFileSync(join(dir, 'tsconfig.json'), JSON.stringify({
        compilerOptions: { strict: true, noEmit: true, skipLibCheck: true, module: 'nodenext', moduleResolution: 'nodenext',
          target: 'es2022', lib: ['es2022', 'dom'], types: [] },
        files: ['check.ts'],
      }));
      const args = [join(root, 'node_modules', 'typescript', 'bin', 'tsc'), '-p', 'tsconfig.json'];
      let diagnostics = '';
      try { execFileSync(process.execPath, args, { cwd: dir, encoding: 'utf8' }); }
      catch (err) { diagnostics = String((err as { stdout?: string }).stdout ?? err); }
      expect(diagnostics).toBe('');
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
