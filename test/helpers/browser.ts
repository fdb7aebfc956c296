/**
 * Which Chromium the browser tests drive: Debian's /usr/bin/chromium when it is installed, else the
 * binary that the dev dependency @sparticuz/chromium ships inside its npm tarball (brotli-compressed;
 * `executablePath()` unpacks it into the temporary folder once), so that a fresh `npm ci && npm test`
 * needs no system package. `EXACT_DW_BROWSER=bundled` forces the npm binary, `EXACT_DW_BROWSER=system`
 * forces Debian's, any other value is taken as the path of a Chromium to use.
 *
 * The npm binary links only against libc, libexpat and libgcc, but loads NSS (libnss3) at run time;
 * the package ships NSS too (bin/al2023.tar.br). When the system has no libnss3 (or with
 * `EXACT_DW_BROWSER_LIBS=bundled`), those libraries are unpacked next to the binary and put on
 * LD_LIBRARY_PATH for the browser process only.
 */
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { createRequire } from 'node:module';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { brotliDecompressSync } from 'node:zlib';

/** Debian's Chromium. */
export const SYSTEM_CHROMIUM = '/usr/bin/chromium';

/** The path of the Chromium to launch and where it came from, or an Error saying how to get one. */
export async function chromiumPath(): Promise<{ path: string; source: 'system' | 'bundled' | 'given'; env?: Record<string, string> }> {
  const want = process.env.EXACT_DW_BROWSER ?? '';
  if (want !== '' && want !== 'bundled' && want !== 'system') {
    if (!existsSync(want)) throw new Error(`EXACT_DW_BROWSER names ${want}, which does not exist.`);
    return { path: want, source: 'given' };
  }
  if (want !== 'bundled' && existsSync(SYSTEM_CHROMIUM)) return { path: SYSTEM_CHROMIUM, source: 'system' };
  if (want === 'system') {
    throw new Error(`EXACT_DW_BROWSER=system, but Debian's chromium is not at ${SYSTEM_CHROMIUM}. Install it with: apt-get install -y chromium.`);
  }
  try {
    const mod = await import('@sparticuz/chromium');
    const path = await mod.default.executablePath();
    const libs = process.env.EXACT_DW_BROWSER_LIBS === 'bundled' || !systemHasNss() ? bundledLibraries() : null;
    return libs
      ? { path, source: 'bundled', env: { ...process.env as Record<string, string>, LD_LIBRARY_PATH: [libs, process.env.LD_LIBRARY_PATH].filter(Boolean).join(':') } }
      : { path, source: 'bundled' };
  } catch (err) {
    throw new Error('The browser tests need a Chromium: neither Debian\'s (' + SYSTEM_CHROMIUM + ') nor the one of the dev dependency '
      + `@sparticuz/chromium could be used (${err instanceof Error ? err.message : String(err)}). Run npm ci (it installs the dev `
      + 'dependency), or install Debian\'s: apt-get update && apt-get install -y chromium.');
  }
}

/** True when the dynamic linker knows libnss3 (ldconfig's cache). */
function systemHasNss(): boolean {
  for (const ldconfig of ['/sbin/ldconfig', '/usr/sbin/ldconfig', 'ldconfig']) {
    const r = spawnSync(ldconfig, ['-p'], { encoding: 'utf8' });
    if (r.status === 0) return /\blibnss3\.so\b/.test(r.stdout);
  }
  return false;
}

/** Unpack the NSS libraries shipped in @sparticuz/chromium (a brotli-compressed tar) once; returns their folder. */
function bundledLibraries(): string {
  const out = join(tmpdir(), 'exact-dw-chromium-libs');
  const lib = join(out, 'lib');
  if (existsSync(join(lib, 'libnss3.so'))) return lib;
  const require = createRequire(import.meta.url);
  const pkg = dirname(dirname(require.resolve('@sparticuz/chromium'))); // build/index.js -> package root
  mkdirSync(out, { recursive: true });
  const tar = join(out, 'al2023.tar');
  writeFileSync(tar, brotliDecompressSync(readFileSync(join(pkg, 'bin', 'al2023.tar.br'))));
  const r = spawnSync('tar', ['-xf', tar, '-C', out], { encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`could not unpack the browser's libraries: ${r.stderr || r.error?.message}`);
  return lib;
}
