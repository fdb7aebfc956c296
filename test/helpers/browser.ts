/**
 * Which Chromium the browser tests drive: Debian's /usr/bin/chromium when it is installed, else the
 * binary that the dev dependency @sparticuz/chromium ships inside its npm tarball (brotli-compressed;
 * `executablePath()` unpacks it into the temporary folder once), so that a fresh `npm ci && npm test`
 * needs no system package. `EXACT_DW_BROWSER=bundled` forces the npm binary, `EXACT_DW_BROWSER=system`
 * forces Debian's, any other value is taken as the path of a Chromium to use.
 */
import { existsSync } from 'node:fs';

/** Debian's Chromium. */
export const SYSTEM_CHROMIUM = '/usr/bin/chromium';

/** The path of the Chromium to launch and where it came from, or an Error saying how to get one. */
export async function chromiumPath(): Promise<{ path: string; source: 'system' | 'bundled' | 'given' }> {
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
    return { path: await mod.default.executablePath(), source: 'bundled' };
  } catch (err) {
    throw new Error('The browser tests need a Chromium: neither Debian\'s (' + SYSTEM_CHROMIUM + ') nor the one of the dev dependency '
      + `@sparticuz/chromium could be used (${err instanceof Error ? err.message : String(err)}). Run npm ci (it installs the dev `
      + 'dependency), or install Debian\'s: apt-get update && apt-get install -y chromium.');
  }
}
