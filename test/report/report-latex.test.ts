/**
 * The LaTeX output compiles: the standalone report, and the fragment and paragraph \input into a
 * minimal document, with the first TeX engine found on the machine (pdflatex, lualatex, xelatex,
 * tectonic). Without an engine the compile step says why it did not run, and the structural checks
 * below (balanced braces, matching \begin/\end, paired $) still run on every fixture.
 */
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { renderLatex } from '../../src/report/latex.js';
import { paperParagraph } from '../../src/report/paragraph.js';
import { scratch } from '../helpers/cli.js';
import { FIXTURES } from '../helpers/report-fixtures.js';

const ENGINES = ['pdflatex', 'lualatex', 'xelatex', 'tectonic'];

function findEngine(): string | undefined {
  return ENGINES.find((e) => spawnSync('sh', ['-c', `command -v ${e}`]).status === 0);
}

function compile(engine: string, dir: string, file: string): { ok: boolean; log: string } {
  const args = engine === 'tectonic'
    ? ['--outdir', dir, file]
    : ['-interaction=nonstopmode', '-halt-on-error', '-no-shell-escape', '-output-directory', dir, file];
  const run = spawnSync(engine, args, { cwd: dir, encoding: 'utf8', timeout: 120_000 });
  const logFile = join(dir, file.replace(/\.tex$/, '.log'));
  const log = existsSync(logFile) ? readFileSync(logFile, 'utf8') : `${run.stdout}\n${run.stderr}`;
  return { ok: run.status === 0 && existsSync(join(dir, file.replace(/\.tex$/, '.pdf'))), log };
}

/** Braces (not counting \{ \}), \begin/\end nesting and inline-math dollars (not counting \$) balance. */
function structure(tex: string): void {
  const body = tex.split('\n').map((l) => l.replace(/(?<!\\)%.*$/, '')).join('\n'); // comments out
  let depth = 0;
  for (let i = 0; i < body.length; i++) {
    if (body[i] === '\\') { i++; continue; }
    if (body[i] === '{') depth++;
    if (body[i] === '}') { depth--; expect(depth).toBeGreaterThanOrEqual(0); }
  }
  expect(depth).toBe(0);
  const stack: string[] = [];
  for (const m of body.matchAll(/\\(begin|end)\{([^}]+)\}/g)) {
    if (m[1] === 'begin') stack.push(m[2]);
    else expect(stack.pop()).toBe(m[2]);
  }
  expect(stack).toEqual([]);
  const dollars = body.replace(/\\\$/g, '').split('$').length - 1;
  expect(dollars % 2).toBe(0);
}

describe('LaTeX output', () => {
  it('is well formed for every fixture: braces, environments and math delimiters balance', () => {
    for (const make of Object.values(FIXTURES)) {
      const r = make();
      structure(renderLatex(r));
      structure(renderLatex(r, { standalone: false }));
      structure(paperParagraph(r, 'latex'));
    }
    // the standalone document has a preamble and a body; the fragment has neither
    expect(renderLatex(FIXTURES.staticResult())).toMatch(/\\documentclass(\[[^\]]*\])?\{article\}[\s\S]*\\begin\{document\}[\s\S]*\\end\{document\}\s*$/);
    expect(renderLatex(FIXTURES.staticResult(), { standalone: false })).not.toMatch(/\\documentclass|\\begin\{document\}/);
  });

  // no TeX engine on this machine: the compile check is reported as skipped (with the reason in its
  // name), never as passed; the structural checks above run everywhere
  const engine = findEngine();
  const compileName = engine
    ? `compiles with ${engine} (standalone report, and fragment + paragraph \\input into a paper)`
    : `compiles with a TeX engine: SKIPPED, none of ${ENGINES.join(', ')} is installed (apt-get install texlive-latex-base)`;
  it.skipIf(!engine)(compileName, () => {
    if (!engine) throw new Error('unreachable: skipped without a TeX engine');
    const dir = scratch();
    // a standalone report, compiled twice so that the second run resolves the citations of its own bibliography
    for (const name of ['staticResult']) {
      const file = `${name}.tex`;
      writeFileSync(join(dir, file), renderLatex(FIXTURES[name]()));
      const first = compile(engine, dir, file);
      expect(first.ok, `${engine} on ${file}:\n${first.log.slice(-3000)}`).toBe(true);
      const second = compile(engine, dir, file);
      expect(second.ok).toBe(true);
      expect(second.log).not.toMatch(/Citation .* undefined/);
    }
    // every fixture's fragment and paragraph inside one paper
    const parts: string[] = [];
    for (const [name, make] of Object.entries(FIXTURES)) {
      writeFileSync(join(dir, `${name}-section.tex`), renderLatex(make(), { standalone: false }));
      writeFileSync(join(dir, `${name}-paragraph.tex`), paperParagraph(make(), 'latex'));
      parts.push(`\\input{${name}-section}`, `\\input{${name}-paragraph}`);
    }
    writeFileSync(join(dir, 'paper.tex'), [
      '\\documentclass{article}', '\\usepackage[T1]{fontenc}', '\\usepackage[utf8]{inputenc}', '\\usepackage{array}',
      '\\begin{document}', ...parts, '\\end{document}', '',
    ].join('\n'));
    const paper = compile(engine, dir, 'paper.tex');
    expect(paper.ok, `${engine} on paper.tex:\n${paper.log.slice(-3000)}`).toBe(true);
  });
});
