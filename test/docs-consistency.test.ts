/**
 * The documentation agrees with the code, wherever that can be checked by a machine: README.md,
 * DEVELOPERS.md and docs/*.md name only `npm run` scripts that exist, only commands and options the
 * command line has, the engines the library has, names the entry points export, and the size
 * limits of src/limits.ts and its neighbours. When a check here fails, fix the document (or, after
 * an intended change of the code, the document and the code together).
 */
import { describe, expect, it } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { COMMANDS } from '../src/cli/commands/index.js';
import { exactDwPValue } from '../src/inference/dw-test.js';
import { DwNullDistribution } from '../src/distribution/null-distribution.js';
import {
  DENSE_SPECTRUM_MAX_N, STRUCTURED_SPECTRUM_MAX_N, PAN_MAX_M, EIGENFREE_MAX_N, DCT_MAX_N, POWER_MAX_N, MEMORY_BUDGET_BYTES,
} from '../src/limits.js';
import { FAST_SPECTRUM_MAX_N } from '../src/core/fast-spectrum.js';
import { AUTO_SPECTRUM_MAX_N } from '../src/engines/choose.js';
import { POWER_SIZE_LIMIT, POWER_DENSE_MAX_N } from '../src/power/exact-power.js';
import { MAX_BOUNDS_N } from '../src/bounds/spectra.js';
import { MAX_TABLE_CELLS, MAX_TABLE_WORK } from '../src/bounds/table.js';
import { CONDITION_LIMIT, CONDITION_WARNING, RANK_TOLERANCE } from '../src/model/design.js';
import { D_ROUNDING_LIMIT } from '../src/model/ols.js';
import { SYSTEM_CHROMIUM } from './helpers/browser.js';
import { THREAD_MIN_ROWS } from '../src/cli/batch-pool.js';
import { POLICY } from '../src/policy.js';
import { cli, scratch } from './helpers/cli.js';
import { writeFileSync } from 'node:fs';

const root = resolve(__dirname, '..');
const read = (file: string) => readFileSync(join(root, file), 'utf8');
const DOCS = ['README.md', 'DEVELOPERS.md', ...readdirSync(join(root, 'docs')).filter((f) => f.endsWith('.md')).map((f) => `docs/${f}`)];
const TEXT = Object.fromEntries(DOCS.map((f) => [f, read(f)])) as Record<string, string>;
const pkg = JSON.parse(read('package.json')) as { scripts: Record<string, string> };

/** Every constant a document may quote, by name. */
const CONSTANTS: Record<string, number> = {
  DENSE_SPECTRUM_MAX_N, STRUCTURED_SPECTRUM_MAX_N, FAST_SPECTRUM_MAX_N, PAN_MAX_M, EIGENFREE_MAX_N, DCT_MAX_N, POWER_MAX_N,
  MEMORY_BUDGET_BYTES, AUTO_SPECTRUM_MAX_N, POWER_SIZE_LIMIT, POWER_DENSE_MAX_N, MAX_BOUNDS_N, MAX_TABLE_CELLS, MAX_TABLE_WORK,
  CONDITION_LIMIT, CONDITION_WARNING, RANK_TOLERANCE, D_ROUNDING_LIMIT, THREAD_MIN_ROWS,
  // and every limit and tolerance of the precision policy, by its name there
  ...(POLICY.limits as unknown as Record<string, number>), ...(POLICY.tolerances as unknown as Record<string, number>),
};

/** A number as the documents write it: 1000000, 100_000, 10^6, 3 x 10^5, 1e7, 1e+7, 1 GiB. */
function numberOf(text: string): number {
  const t = text.trim().replace(/_/g, '');
  let m = /^(?:(\d+(?:\.\d+)?) x )?10\^(\d+)$/.exec(t);
  if (m) return (m[1] ? Number(m[1]) : 1) * 10 ** Number(m[2]);
  m = /^(\d+) GiB$/.exec(t);
  if (m) return Number(m[1]) * 2 ** 30;
  const v = Number(t);
  if (!Number.isFinite(v)) throw new Error(`not a number as the documents write one: '${text}'`);
  return v;
}
const NUMBER = String.raw`\d+(?:\.\d+)?(?: x 10\^\d+)?|10\^\d+|\d+e[+-]?\d+|\d+(?:_\d{3})+|\d+ GiB`;

/** Code blocks of a Markdown text, with their language. */
function codeBlocks(md: string): { lang: string; body: string }[] {
  return [...md.matchAll(/^```(\w*)\n([\s\S]*?)^```/gm)].map((m) => ({ lang: m[1], body: m[2] }));
}

/** The command lines of sh blocks (continuation lines joined, comments removed). */
function shellLines(md: string): string[] {
  return codeBlocks(md).filter((b) => b.lang === 'sh')
    .flatMap((b) => b.body.replace(/\\\n/g, ' ').split('\n'))
    .map((l) => l.replace(/\s#.*$/, '').trim()).filter(Boolean);
}

describe('npm scripts named in the documents', () => {
  it('every `npm run X` in README.md, DEVELOPERS.md and docs/*.md is a script of package.json', () => {
    for (const [file, text] of Object.entries(TEXT)) {
      for (const m of text.matchAll(/npm run (?:--silent )?([\w:.-]+)/g)) {
        expect(Object.keys(pkg.scripts), `${file}: npm run ${m[1]}`).toContain(m[1]);
      }
    }
  });

  it('every script of package.json (but prepare) is explained in README.md or DEVELOPERS.md', () => {
    const both = TEXT['README.md'] + TEXT['DEVELOPERS.md'];
    for (const name of Object.keys(pkg.scripts).filter((s) => s !== 'prepare')) {
      const named = name === 'test' ? /npm test\b/.test(both) : both.includes(`npm run ${name}`);
      expect(named, `npm ${name === 'test' ? 'test' : `run ${name}`} is not mentioned`).toBe(true);
    }
  });
});

describe('commands and options named in the documents', () => {
  const names = new Set([...COMMANDS.map((c) => c.name), 'help', 'version']);

  it('every `exact-dw COMMAND` in the documents is a command of the CLI registry (src/cli/commands/index.ts)', () => {
    let seen = 0;
    for (const [file, text] of Object.entries(TEXT)) {
      for (const m of text.matchAll(/(?:npx |`)exact-dw ([a-z][a-z-]*)/g)) {
        expect(names, `${file}: exact-dw ${m[1]}`).toContain(m[1]);
        seen++;
      }
    }
    expect(seen).toBeGreaterThan(10);
  });

  it('README.md shows every command of the registry', () => {
    for (const c of COMMANDS) expect(TEXT['README.md'], c.name).toMatch(new RegExp(`npx exact-dw ${c.name}\\b`));
  });

  it('every option of a README command line belongs to that command, and every --option in README exists', () => {
    const byName = new Map(COMMANDS.map((c) => [c.name, new Set([...Object.keys(c.options), 'help'])]));
    let lines = 0;
    for (const line of shellLines(TEXT['README.md'])) {
      const m = /^npx exact-dw ([a-z-]+)(.*)$/.exec(line);
      if (!m || !byName.has(m[1])) continue;
      lines++;
      for (const o of m[2].matchAll(/(?:^|\s)--([a-z][a-z0-9-]*)/g)) expect(byName.get(m[1]), `${line}: --${o[1]}`).toContain(o[1]);
    }
    expect(lines).toBeGreaterThan(10);
    const any = new Set([...byName.values()].flatMap((s) => [...s]));
    for (const o of TEXT['README.md'].matchAll(/`--([a-z][a-z0-9-]*)/g)) expect(any, `README.md: --${o[1]}`).toContain(o[1]);
  });
});

describe('engine names', () => {
  it('every engine list in README.md and DEVELOPERS.md equals the choices of --method, and each engine answers under its name', async () => {
    // the CLI's own list of choices, read from its error message for an unknown engine
    const dir = scratch();
    writeFileSync(join(dir, 'x.csv'), 't\n1\n2\n4\n3\n5\n7\n6\n8\n9\n11\n');
    const run = await cli('pvalue', '--design', join(dir, 'x.csv'), '--d', '1.5', '--method', 'no-such-engine');
    expect(run.status).toBe(2);
    const choices = /--method must be one of ([a-z, ]+) \(got/.exec(run.err)?.[1].split(', ');
    expect(choices).toBeDefined();
    let lists = 0;
    for (const file of ['README.md', 'DEVELOPERS.md']) {
      for (const m of TEXT[file].matchAll(/`(?:--method )?(auto(?:\|[a-z]+)+)`/g)) {
        expect(m[1].split('|'), file).toEqual(choices);
        lists++;
      }
    }
    expect(lists).toBeGreaterThanOrEqual(2); // the command line's and the library's
    // the library runs every engine it is offered, and says it did
    const x = { t: [1, 2, 4, 3, 5, 7, 6, 8, 9, 11] };
    for (const name of choices!.filter((c) => c !== 'auto')) {
      expect(exactDwPValue({ x, d: 1.5, method: name as never }).method, name).toBe(name);
    }
  });
});

describe('names in the import examples', () => {
  it('every name imported in a README ts block is exported by that entry point (test/api-surface.json)', () => {
    const surface = JSON.parse(read('test/api-surface.json')) as Record<string, string[]>;
    const exported = (entry: string) => new Set(surface[entry].map((s) => s.split(':')[0]));
    let imports = 0;
    for (const block of codeBlocks(TEXT['README.md']).filter((b) => b.lang === 'ts')) {
      for (const m of block.body.matchAll(/import \{([^}]*)\} from '(exact-dw(?:\/[a-z]+)?)'/g)) {
        const entry = m[2] === 'exact-dw' ? '.' : `./${m[2].slice('exact-dw/'.length)}`;
        expect(Object.keys(surface), m[2]).toContain(entry);
        for (const raw of m[1].split(',')) {
          const name = raw.trim().replace(/^type /, '');
          if (name) { expect(exported(entry), `${m[2]}: ${name}`).toContain(name); imports++; }
        }
      }
    }
    expect(imports).toBeGreaterThanOrEqual(6);
  });

  it('every name README says an entry point holds is exported by it', () => {
    const surface = JSON.parse(read('test/api-surface.json')) as Record<string, string[]>;
    const readme = TEXT['README.md'];
    const section = (label: string) => {
      const i = readme.indexOf(`* **\`${label}\`**`);
      expect(i, label).toBeGreaterThan(0);
      const j = readme.indexOf('\n* ', i + 1);
      const k = readme.indexOf('\n\n', i);
      return readme.slice(i, Math.min(j < 0 ? Infinity : j, k));
    };
    for (const [label, entry] of [['exact-dw', '.'], ['exact-dw/report', './report'], ['exact-dw/engines', './engines']] as const) {
      const names = new Set(surface[entry].map((s) => s.split(':')[0]));
      // members of an exported class count as exported (README lists what DwNullDistribution offers)
      if (entry === '.') for (const n of [...Object.getOwnPropertyNames(DwNullDistribution.prototype), ...Object.getOwnPropertyNames(DwNullDistribution)]) names.add(n);
      const quoted = [...section(label).matchAll(/`([A-Za-z][A-Za-z0-9_]*)(?:\([^`]*\))?`/g)].map((m) => m[1])
        .filter((n) => !['auto'].includes(n));
      expect(quoted.length, label).toBeGreaterThan(5);
      for (const n of quoted) expect(names, `${label}: ${n}`).toContain(n);
    }
  });
});

describe('size limits quoted in the documents equal the constants', () => {
  it('every "VALUE (`CONSTANT`)" and "`CONSTANT = VALUE`" in the documents holds', () => {
    let quoted = 0;
    for (const [file, text] of Object.entries(TEXT)) {
      const pattern = new RegExp(String.raw`(${NUMBER})(?: [a-z]+){0,2} \(\`([A-Z][A-Z0-9_]+)\`|\`([A-Z][A-Z0-9_]+) = (${NUMBER})\``, 'g');
      for (const m of text.matchAll(pattern)) {
        const name = m[2] ?? m[3];
        const value = numberOf(m[1] ?? m[4]);
        expect(Object.keys(CONSTANTS), `${file}: ${name} is not a constant this test knows`).toContain(name);
        expect(value, `${file}: ${m[0]}`).toBe(CONSTANTS[name]);
        quoted++;
      }
    }
    expect(quoted).toBeGreaterThanOrEqual(12);
  });

  // limits quoted in prose, each with the constant it must equal; a sentence that changes wording
  // must be changed here too, so that no quoted limit goes unchecked
  const PROSE: [file: string, pattern: RegExp, constant: keyof typeof CONSTANTS][] = [
    ['README.md', /Beyond n = (\S+) `auto` uses the DCT eigenbasis route/, 'AUTO_SPECTRUM_MAX_N'],
    ['README.md', /which takes designs up to n = (\S+?);/, 'DCT_MAX_N'],
    ['README.md', /condition number\s+above (\S+?)\)/, 'CONDITION_LIMIT'],
    ['docs/accuracy.md', /which `auto` uses beyond n = (\S+) for difference operators/, 'AUTO_SPECTRUM_MAX_N'],
    ['docs/performance.md', /the spectrum is not computed beyond n = (\d+)\)/, 'FAST_SPECTRUM_MAX_N'],
    ['docs/errors-and-limits.md', /Beyond n = (\S+) only the DCT eigenbasis route answers/, 'EIGENFREE_MAX_N'],
    ['docs/errors-and-limits.md', /beyond n = (\S+) no engine answers/, 'DCT_MAX_N'],
    ['docs/errors-and-limits.md', /"limited to n = (\d+)"/, 'DENSE_SPECTRUM_MAX_N'],
    ['docs/errors-and-limits.md', /"m = n - k = (\d+)"/, 'PAN_MAX_M'],
    ['docs/errors-and-limits.md', /"beyond every engine", "n = (\d+)"/, 'DCT_MAX_N'],
    ['docs/batch-performance.md', /one\s+thread per core for files of more than (\d+) lines/, 'THREAD_MIN_ROWS'],
    ['docs/errors-and-limits.md', /takes the dense route up to \| n = (\d+) \(`POWER_DENSE_MAX_N`\)/, 'POWER_DENSE_MAX_N'],
  ];
  it.each(PROSE)('%s: %s equals %s', (file, pattern, constant) => {
    const m = pattern.exec(TEXT[file]);
    expect(m, `${file} no longer has ${pattern}`).not.toBeNull();
    expect(numberOf(m![1])).toBe(CONSTANTS[constant]);
  });

  it('the size table of docs/errors-and-limits.md names every engine and power limit of src/limits.ts', () => {
    const doc = TEXT['docs/errors-and-limits.md'];
    for (const name of ['DENSE_SPECTRUM_MAX_N', 'STRUCTURED_SPECTRUM_MAX_N', 'PAN_MAX_M', 'EIGENFREE_MAX_N', 'DCT_MAX_N',
      'MEMORY_BUDGET_BYTES', 'POWER_SIZE_LIMIT', 'POWER_MAX_N', 'MAX_BOUNDS_N', 'MAX_TABLE_CELLS', 'MAX_TABLE_WORK']) {
      expect(doc, name).toContain(`\`${name}\``);
    }
  });
});

describe('accuracy claims of README.md', () => {
  it('"in N checks against 50-digit references ... the true error never exceeded it" is the table of docs/accuracy.md', () => {
    const m = /in (\d+) checks against 50-digit references, docs\/accuracy\.md, the true error never exceeded it/.exec(TEXT['README.md']);
    expect(m).not.toBeNull();
    // the "bound exceeded" column of the table: "0 / 138" per row
    const header = TEXT['docs/accuracy.md'].split('\n').find((l) => l.startsWith('| engine |'))!.split('|').map((c) => c.trim());
    const col = header.indexOf('bound exceeded');
    expect(col).toBeGreaterThan(0);
    const cells = TEXT['docs/accuracy.md'].split('\n').filter((l) => /^\| [a-z]+ \|/.test(l) && !l.startsWith('| engine |'))
      .map((l) => l.split('|').map((c) => c.trim())[col]).filter((c) => /^\d+ \/ \d+$/.test(c ?? ''));
    expect(cells.length).toBeGreaterThan(10);
    const exceeded = cells.reduce((a, c) => a + Number(c.split(' / ')[0]), 0);
    const total = cells.reduce((a, c) => a + Number(c.split(' / ')[1]), 0);
    expect(exceeded).toBe(0);
    expect(Number(m![1])).toBe(total);
  });

  it('the engine agreement README quotes is the one test/engines/agreement.test.ts runs', () => {
    const m = /agree to (\S+): Imhof's integral on the spectrum of the design and Pan's finite-range form on (\d+)\s+seeded designs, and an eigen-free route [^;]*? on (\d+) of them/.exec(TEXT['README.md']);
    expect(m).not.toBeNull();
    const test = read('test/engines/agreement.test.ts');
    expect(test).toContain(`describe('engine agreement on ${m![2]} seeded random designs`);
    expect(test).toContain(`eigen-free on ${m![3]})`);
    expect(test).toContain(`agree to ${m![1]} wherever two apply`);
  });
});

describe('timings and the browser note', () => {
  it('README.md quotes no timing (they live in docs/performance.md, from one bench run)', () => {
    const timings = TEXT['README.md'].match(/\b\d+(?:\.\d+)?\s?(?:ms|µs|us|s|seconds?|minutes?)\b(?! of)/g) ?? [];
    expect(timings).toEqual([]);
  });

  it('README.md and DEVELOPERS.md say which Chromium the page tests use, as test/helpers/browser.ts does', () => {
    expect(TEXT['README.md']).toMatch(/Debian's chromium if installed, else the one npm installs/);
    expect(TEXT['DEVELOPERS.md']).toContain(`\`${SYSTEM_CHROMIUM}\``);
    expect(TEXT['DEVELOPERS.md']).toContain('`@sparticuz/chromium`');
    expect(read('test/helpers/browser.ts')).toContain("import('@sparticuz/chromium')");
  });
});
