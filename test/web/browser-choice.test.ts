/** The choice of Chromium for the browser tests (test/helpers/browser.ts). */
import { afterEach, describe, expect, it } from 'vitest';
import { existsSync } from 'node:fs';
import { chromiumPath, SYSTEM_CHROMIUM } from '../helpers/browser.js';

const saved = process.env.EXACT_DW_BROWSER;
afterEach(() => { if (saved === undefined) delete process.env.EXACT_DW_BROWSER; else process.env.EXACT_DW_BROWSER = saved; });

describe('which Chromium the browser tests use', () => {
  it("a path given in EXACT_DW_BROWSER that does not exist is refused, naming it", async () => {
    process.env.EXACT_DW_BROWSER = '/nonexistent/chromium-for-exact-dw';
    await expect(chromiumPath()).rejects.toThrow(/\/nonexistent\/chromium-for-exact-dw, which does not exist/);
  });
  it("by default Debian's when it is installed, else the binary shipped by the npm dev dependency", async () => {
    delete process.env.EXACT_DW_BROWSER;
    const r = await chromiumPath();
    expect(r.source).toBe(existsSync(SYSTEM_CHROMIUM) ? 'system' : 'bundled');
    expect(existsSync(r.path)).toBe(true);
  });
});
