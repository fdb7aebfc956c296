/**
 * The report options of `exact-dw test` (--format, --paragraph, --cite, --bib, --plot, --out,
 * --force) and the `demo` command's folder of files, run in-process on invented data. The rule
 * checked throughout: a user's existing file or folder is never replaced without --force.
 */
import { describe, expect, it } from 'vitest';
import { existsSync, readFileSync, readdirSync, writeFileSync, mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { DOMParser } from '@xmldom/xmldom';
import { cli, scratch } from '../helpers/cli.js';
import { VERSION } from '../../src/version.js';

const dir = scratch();
const data = join(dir, 'data.csv');
// invented series: a trend, a price and y with some persistence
writeFileSync(data, 'year,y,trend,price\n' + Array.from({ length: 20 }, (_, i) =>
  `${2001 + i},${(3 + 0.4 * i + Math.cos(i * 0.9) + 0.5 * Math.sin(i * 0.4)).toFixed(4)},${i + 1},${(10 + Math.sin(i * 1.7) * 3).toFixed(3)}`).join('\n') + '\n');
const base = ['test', data, '--y', 'y', '--x', 'trend,price', '--time', 'year'];

function validXml(text: string): void {
  const problems: string[] = [];
  new DOMParser({ onError: (level: string, msg: string) => { problems.push(`${level}: ${msg}`); } }).parseFromString(text, 'image/svg+xml');
  expect(problems).toEqual([]);
}

describe('exact-dw test --format', () => {
  it('text (default), markdown, latex and json each print their report', async () => {
    const t = await cli(...base);
    expect(t.status).toBe(0);
    expect(t.out).toMatch(/^=+\n {2}Exact Durbin-Watson test/);
    const md = await cli(...base, '--format', 'markdown');
    expect(md.out).toMatch(/^# Exact Durbin–Watson test/);
    const tex = await cli(...base, '--format', 'latex');
    expect(tex.out).toContain('\\documentclass');
    expect(tex.out.trimEnd().endsWith('\\end{document}')).toBe(true);
    const j = JSON.parse((await cli(...base, '--format', 'json')).out);
    expect(j.packageVersion).toBe(VERSION);
    expect(j.columns).toEqual(['(intercept)', 'trend', 'price']);
  });
  it('an unknown format exits 2 naming the choices', async () => {
    const r = await cli(...base, '--format', 'html');
    expect(r.status).toBe(2);
    expect(r.err).toMatch(/--format must be one of text, markdown, latex, json/);
  });
});

describe('exact-dw test --paragraph and --cite', () => {
  it('--paragraph prints only the paragraph, in the chosen format', async () => {
    const p = await cli(...base, '--paragraph');
    expect(p.out.trim().split('\n')).toHaveLength(1);
    expect(p.out).toMatch(/^Serial correlation of the least-squares residuals/);
    const tex = await cli(...base, '--paragraph', '--format', 'latex');
    expect(tex.out).toMatch(/\\cite\{durbin-watson-1950,durbin-watson-1951\}/);
    const j = JSON.parse((await cli(...base, '--paragraph', '--format', 'json')).out);
    expect(Object.keys(j)).toEqual(['paragraph']);
  });
  it('--cite appends BibTeX whose keys are the ones cited', async () => {
    const md = await cli(...base, '--paragraph', '--format', 'markdown', '--cite');
    expect(md.out).toMatch(/```bibtex\n@article\{durbin-watson-1950,/);
    const cited = [...md.out.matchAll(/\[@([^\]]+)\]/g)].flatMap((m) => m[1].split('; @'));
    const entries = [...md.out.matchAll(/@(?:article|software)\{([^,]+),/g)].map((m) => m[1]);
    expect([...new Set(cited)].sort()).toEqual([...entries].sort());
    const j = JSON.parse((await cli(...base, '--format', 'json', '--cite')).out);
    expect(j.bibtex).toMatch(/@article\{imhof-1961,/);
  });
  it('--bib FILE writes the BibTeX to a file', async () => {
    const bib = join(dir, 'refs.bib');
    const r = await cli(...base, '--bib', bib);
    expect(r.status).toBe(0);
    expect(readFileSync(bib, 'utf8')).toMatch(/^@article\{durbin-watson-1950,/);
    expect(r.err).toContain(`wrote the BibTeX entries to ${bib}`);
  });
});

describe('exact-dw test --plot and --out never overwrite without --force', () => {
  it('--plot writes a valid SVG figure', async () => {
    const fig = join(dir, 'fig.svg');
    const r = await cli(...base, '--plot', fig);
    expect(r.status).toBe(0);
    validXml(readFileSync(fig, 'utf8'));
    expect(r.out).toMatch(/Exact Durbin-Watson test/); // the report still goes to the screen
  });
  it('--plot onto an existing file: exit 2, one line on stderr, file untouched, nothing printed', async () => {
    const fig = join(dir, 'mine.svg');
    writeFileSync(fig, 'my own figure');
    const r = await cli(...base, '--plot', fig);
    expect(r.status).toBe(2);
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.err).toMatch(/already exists and was left as it is/);
    expect(r.out).toBe('');
    expect(readFileSync(fig, 'utf8')).toBe('my own figure');
    const forced = await cli(...base, '--plot', fig, '--force');
    expect(forced.status).toBe(0);
    validXml(readFileSync(fig, 'utf8'));
  });
  it('--out writes the report to a file, and refuses an existing one likewise', async () => {
    const out = join(dir, 'report.md');
    const r = await cli(...base, '--format', 'markdown', '--out', out);
    expect(r.status).toBe(0);
    expect(r.out).toBe('');
    expect(readFileSync(out, 'utf8')).toMatch(/^# Exact Durbin–Watson test/);
    writeFileSync(out, 'my notes');
    const again = await cli(...base, '--format', 'markdown', '--out', out);
    expect(again.status).toBe(2);
    expect(again.err).toMatch(/'.*report\.md' \(--out\) already exists/);
    expect(readFileSync(out, 'utf8')).toBe('my notes');
    const forced = await cli(...base, '--out', out, '--force');
    expect(forced.status).toBe(0);
    expect(readFileSync(out, 'utf8')).toMatch(/Exact Durbin-Watson test/);
  });
  it('when one of several outputs exists, none is written', async () => {
    const out = join(dir, 'fresh-report.txt');
    const fig = join(dir, 'taken.svg');
    writeFileSync(fig, 'taken');
    const r = await cli(...base, '--out', out, '--plot', fig);
    expect(r.status).toBe(2);
    expect(existsSync(out)).toBe(false);
    expect(readFileSync(fig, 'utf8')).toBe('taken');
  });
  it('--plot must name an .svg file, and --out and --plot must differ', async () => {
    const a = await cli(...base, '--plot', join(dir, 'fig.png'));
    expect(a.status).toBe(2);
    expect(a.err).toMatch(/does not end in \.svg/);
    const same = join(dir, 'same.svg');
    const b = await cli(...base, '--plot', same, '--out', same);
    expect(b.status).toBe(2);
    expect(b.err).toMatch(/name the same file/);
    expect(existsSync(same)).toBe(false);
  });
});

describe('exact-dw demo', () => {
  it('writes the report set into a fresh folder it names, and never reuses an existing one', async () => {
    const where = join(scratch(), 'out');
    const first = await cli('demo', '--dir', where);
    expect(first.status).toBe(0);
    expect(first.out).toContain(`Files:     ${where}/`);
    expect(first.out).toMatch(/Exact Durbin-Watson test/);
    const files = readdirSync(where).sort();
    expect(files).toEqual(['density.svg', 'paragraph.md', 'paragraph.tex', 'paragraph.txt', 'references.bib', 'report.json', 'report.md', 'report.tex', 'report.txt']);
    validXml(readFileSync(join(where, 'density.svg'), 'utf8'));
    expect(JSON.parse(readFileSync(join(where, 'report.json'), 'utf8')).n).toBe(24);
    const before = readFileSync(join(where, 'report.md'), 'utf8');
    writeFileSync(join(where, 'notes.txt'), 'the user added this');
    const second = await cli('demo', '--dir', where);
    expect(second.status).toBe(0);
    expect(second.out).toContain(`Files:     ${where}-2/`);
    expect(readdirSync(`${where}-2`)).toHaveLength(9);
    expect(readFileSync(join(where, 'report.md'), 'utf8')).toBe(before);
    expect(readFileSync(join(where, 'notes.txt'), 'utf8')).toBe('the user added this');
  });
  it('a user folder of the default name is left alone', async () => {
    const parent = scratch();
    const taken = join(parent, 'exact-dw-demo');
    mkdirSync(taken);
    writeFileSync(join(taken, 'thesis.tex'), 'precious');
    const r = await cli('demo', '--dir', taken);
    expect(r.status).toBe(0);
    expect(readdirSync(taken)).toEqual(['thesis.tex']);
    expect(existsSync(join(parent, 'exact-dw-demo-2', 'report.tex'))).toBe(true);
  });
});
