/**
 * What the browser tests of the page (test/web/) share: the Chromium flags, building the page with
 * Vite into a temporary folder and serving it with src/web/serve.mjs on 127.0.0.1, one browser
 * context that records every request and every console or page error, and the check that a shown
 * number agrees with the library's value to the precision shown.
 */
import { expect } from 'vitest';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { build } from 'vite';
import { chromium, type BrowserContext } from 'playwright-core';
import { startServer, type ServedPage } from '../../src/web/serve.mjs';
import { chromiumPath } from './browser.js';

/** Flags of the headless browser: no sandbox (root), no GPU, nothing that talks to the network on its own. */
export const FLAGS = [
  '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking',
  '--disable-component-update', '--disable-sync',
];

/** The repository root. */
export const ROOT = fileURLToPath(new URL('../..', import.meta.url));

/** A built and served page with a browser on it. */
export interface PageRig {
  /** Folder of the built page (index.html). */
  out: string;
  served: ServedPage;
  context: BrowserContext;
  /** Every URL any page of the browser asked for. */
  requests: string[];
  /** Every console error, policy message or page error. */
  problems: string[];
  close: () => Promise<void>;
}

/** Build the page into a temporary folder, serve it on an ephemeral port and start the browser. */
export async function startPageRig(): Promise<PageRig> {
  const browser = await chromiumPath();
  const out = mkdtempSync(join(tmpdir(), 'exact-dw-page-'));
  const profile = mkdtempSync(join(tmpdir(), 'exact-dw-chromium-'));
  await build({ configFile: join(ROOT, 'src', 'web', 'vite.config.ts'), logLevel: 'silent', build: { outDir: out, emptyOutDir: true } });
  const served = await startServer({ root: out, port: 0 });
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: browser.path,
    ...(browser.env ? { env: browser.env } : {}),
    headless: true,
    args: FLAGS,
    viewport: { width: 1100, height: 900 },
    acceptDownloads: true,
  });
  const requests: string[] = [];
  const problems: string[] = [];
  context.on('request', (r) => { requests.push(r.url()); });
  context.on('console', (m) => { if (m.type() === 'error' || /Content.Security.Policy/i.test(m.text())) problems.push(m.text()); });
  context.on('weberror', (e) => { problems.push(e.error().message); });
  return {
    out, served, context, requests, problems,
    close: async () => {
      await context.close();
      await served.close();
      for (const dir of [out, profile]) rmSync(dir, { recursive: true, force: true });
    },
  };
}

/**
 * The displayed number agrees with the library's value to the precision shown: within half a unit
 * of its last digit (decimals or e-notation). It must also show enough digits to be a real check.
 */
export function expectShown(text: string, value: number, finest = 5e-4): void {
  const m = /^(-?\d+(?:\.(\d+))?)(?:e(-?\d+))?$/.exec(text);
  expect(m, `'${text}' is not a plain number`).not.toBeNull();
  const decimals = m![2]?.length ?? 0;
  const exponent = m![3] === undefined ? 0 : Number(m![3]);
  const halfUnit = 0.5 * 10 ** (exponent - decimals);
  expect(halfUnit).toBeLessThanOrEqual(Math.max(finest, 5e-3 * Math.abs(value)));
  expect(Math.abs(Number(text) - value)).toBeLessThanOrEqual(halfUnit * (1 + 1e-9));
}
