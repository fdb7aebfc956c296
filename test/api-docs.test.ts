/**
 * The API reference builds without a single typedoc warning (a referenced type that is not
 * exported, a broken {@link}, a comment typedoc cannot place): the same check as
 * `npm run docs:check`, over the three entry points of package.json (exact-dw, exact-dw/report,
 * exact-dw/engines). Nothing is written (`--emit none`).
 */
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';

const root = resolve(__dirname, '..');

describe('API reference (typedoc)', () => {
  it('npm run docs:check covers the same entry points as npm run docs and package.json exports', () => {
    const pkg = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')) as { scripts: Record<string, string>; exports: Record<string, unknown> };
    const entries = (script: string) => (/--entryPoints ((?:\S+\.ts ?)+)/.exec(script)?.[1] ?? '').trim().split(/\s+/);
    expect(entries(pkg.scripts['docs:check'])).toEqual(['src/index.ts', 'src/report-entry.ts', 'src/engines-entry.ts']);
    expect(entries(pkg.scripts.docs)).toEqual(entries(pkg.scripts['docs:check']));
    expect(Object.keys(pkg.exports).filter((e) => e !== './package.json')).toEqual(['.', './report', './engines']);
    expect(pkg.scripts['docs:check']).toContain('--treatWarningsAsErrors');
  });

  it('typedoc reports no warning and no error', () => {
    const typedoc = join(root, 'node_modules', 'typedoc', 'bin', 'typedoc');
    const run = spawnSync(process.execPath, [typedoc, '--disableSources', '--tsconfig', 'src/tsconfig.build.json',
      '--entryPoints', 'src/index.ts', 'src/report-entry.ts', 'src/engines-entry.ts',
      '--emit', 'none', '--treatWarningsAsErrors', '--logLevel', 'Warn'], { cwd: root, encoding: 'utf8' });
    const output = `${run.stdout}${run.stderr}`.replace(/\x1b\[[0-9;]*m/g, '');
    expect(output.split('\n').filter((l) => /\[(warning|error)\]/.test(l))).toEqual([]);
    expect(run.status).toBe(0);
  });
});
