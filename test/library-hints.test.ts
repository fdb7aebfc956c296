/**
 * Library errors speak of the library's own option names, never of command-line flags: every
 * string and template literal in the library sources (src/ outside src/cli/ and src/web/, comments
 * left out) is scanned for text like "--method" or "--no-intercept". A settings suggestion travels
 * as plain data (`DwError.detail.suggest`), and the command line and the page name it in their own
 * terms; this file checks both ends of that on real errors.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync, readdirSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { DwError } from '../src/errors.js';
import { checkSize } from '../src/limits.js';
import { parseCsv, numericColumn } from '../src/data/csv.js';
import { cliHint, cliLine } from '../src/cli/suggest.js';
import { pageHint } from '../src/web/plain-error.js';

/** The string and template literal texts of a TypeScript source, comments skipped (a small lexer). */
export function stringLiterals(src: string): { text: string; line: number }[] {
  const out: { text: string; line: number }[] = [];
  let i = 0;
  let line = 1;
  let prev = ''; // last significant character outside strings and comments
  const lineAt = (k: number) => line + (src.slice(i, k).match(/\n/g)?.length ?? 0);
  const regexMayStart = () => prev === '' || '(,=:[!&|?{};+-*%<>~^'.includes(prev) || /\breturn\s*$/.test(src.slice(Math.max(0, i - 8), i));
  while (i < src.length) {
    const c = src[i];
    if (c === '/' && src[i + 1] === '/') { const j = src.indexOf('\n', i); i = j < 0 ? src.length : j; continue; }
    if (c === '/' && src[i + 1] === '*') { const j = src.indexOf('*/', i + 2); line = lineAt(j + 2); i = j + 2; continue; }
    if (c === '/' && regexMayStart()) { // a regular expression literal
      let j = i + 1; let inClass = false;
      while (j < src.length && src[j] !== '\n' && (inClass || src[j] !== '/')) { if (src[j] === '\\') j++; else if (src[j] === '[') inClass = true; else if (src[j] === ']') inClass = false; j++; }
      i = j + 1; prev = '/'; continue;
    }
    if (c === "'" || c === '"' || c === '`') {
      let j = i + 1; let text = ''; let depth = 0;
      while (j < src.length) {
        const d = src[j];
        if (d === '\\') { text += src.slice(j, j + 2); j += 2; continue; }
        if (c === '`' && d === '$' && src[j + 1] === '{') { depth++; j += 2; text += '${'; continue; }
        if (depth > 0 && d === '}') { depth--; j++; text += '}'; continue; }
        if (depth === 0 && d === c) break;
        text += d; j++;
      }
      out.push({ text, line });
      line = lineAt(j + 1); i = j + 1; prev = 'a'; continue;
    }
    if (c === '\n') line++;
    if (!/\s/.test(c)) prev = c;
    i++;
  }
  return out;
}

/** Command-line flag text in a literal. */
const FLAG = /(^|[\s('"`])--[a-z][a-z-]*/;

/** Literals that name a flag on purpose: report outputs that state how they were made. */
const ALLOWED: { file: string; text: RegExp; why: string }[] = [
  { file: 'src/report/latex.ts', text: /exact-dw test --cite/, why: 'the LaTeX output says which command prints its BibTeX' },
];

function libraryFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((f) => {
    const p = join(dir, f);
    if (statSync(p).isDirectory()) return p.endsWith(join('src', 'cli')) || p.endsWith(join('src', 'web')) ? [] : libraryFiles(p);
    return p.endsWith('.ts') && !p.endsWith('.d.ts') ? [p] : [];
  });
}

describe('library texts name no command-line flag', () => {
  it('the scanner finds a flag in an error hint and skips comments and regular expressions', () => {
    const planted = "// see --method\nconst r = /--x/;\nthrow new DwError('SIZE_LIMIT', 'Too big.', `Use --method ${'eigenfree'}.`);\n/* --lag */";
    const hits = stringLiterals(planted).filter((l) => FLAG.test(l.text));
    expect(hits).toEqual([{ text: "Use --method ${'eigenfree'}.", line: 3 }]);
    expect(stringLiterals("const a = 'x' / 2; const b = \"--no-intercept\";").filter((l) => FLAG.test(l.text)).map((l) => l.text)).toEqual(['--no-intercept']);
  });

  it('no string in src/ outside cli/ and web/ names a flag (beyond the listed report outputs)', () => {
    const root = process.cwd();
    const files = libraryFiles(join(root, 'src'));
    expect(files.length).toBeGreaterThan(40);
    const found: string[] = [];
    for (const p of files) {
      const rel = relative(root, p).split('\\').join('/');
      for (const l of stringLiterals(readFileSync(p, 'utf8'))) {
        if (!FLAG.test(l.text)) continue;
        if (ALLOWED.some((a) => a.file === rel && a.text.test(l.text))) continue;
        found.push(`${rel}:${l.line}: ${l.text}`);
      }
    }
    expect(found).toEqual([]);
  });
});

describe('a suggestion is plain data, named as a flag by the CLI and as a control by the page', () => {
  it('the size limit suggests the eigen-free engine by its library name', () => {
    let err: DwError | undefined;
    try { checkSize(50000, 3, 'imhof'); } catch (e) { err = e as DwError; }
    expect(err?.code).toBe('SIZE_LIMIT');
    expect(err!.hint).toContain("method 'eigenfree'");
    expect(err!.hint).not.toMatch(FLAG);
    expect(err!.detail.suggest).toEqual([{ option: 'method', value: 'eigenfree' }]);
    expect(err!.suggestions).toEqual([{ option: 'method', value: 'eigenfree' }]);
    expect(cliHint(err!)).toMatch(/ On the command line: --method eigenfree\.$/);
    expect(cliLine(err!)).toBe(`${err!.message} ${cliHint(err!)}`);
    expect(pageHint(err!.hint, err!.detail.suggest)).toMatch(/On this page: the engine "eigenfree" under "Numerical engine"\.$/);
  });

  it('a decimal comma read as a point suggests the decimal mark; a hint without suggestion is left alone', () => {
    let err: DwError | undefined;
    try { numericColumn(parseCsv('y,x\n"1,5",2\n"2,5",3\n'), 'y'); } catch (e) { err = e as DwError; }
    expect(err?.code).toBe('CELL_NOT_NUMERIC');
    expect(err!.detail).toMatchObject({ row: 1, column: 'y', suggest: [{ option: 'decimal', value: 'comma' }] });
    expect(cliHint(err!)).toContain('On the command line: --decimal comma.');
    const plain = new DwError('CSV_EMPTY', 'The file is empty.', 'Give a CSV file.');
    expect(cliHint(plain)).toBe('Give a CSV file.');
    expect(cliHint(new DwError('N_INVALID', 'x', '', { suggest: [{ option: 'intercept', value: false }, { option: 'time' }] })))
      .toBe('On the command line: --no-intercept or --time COLUMN.');
  });
});
