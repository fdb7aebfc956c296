/**
 * Vite build of the offline page: src/web -> docs/site/index.html, one self-contained file (see
 * src/web/single-file.ts for why and how). `npm run web` builds and serves it; the browser tests
 * build it into a temporary folder with `build({ configFile: 'src/web/vite.config.ts', build: { outDir } })`.
 */
import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vite';
import { singleFilePage } from './single-file.ts';

// paths relative to the repository root (this file is in src/web/)
const here = (path: string): string => fileURLToPath(new URL(`../../${path}`, import.meta.url));

export default defineConfig({
  root: here('./src/web'),
  base: './',
  publicDir: false,
  clearScreen: false,
  build: {
    outDir: here('./docs/site'),
    emptyOutDir: true,
    target: 'es2022',
    modulePreload: { polyfill: false },
    assetsInlineLimit: 0,
    cssCodeSplit: false,
    sourcemap: false,
    reportCompressedSize: false,
    chunkSizeWarningLimit: 2048,
  },
  worker: { format: 'iife' },
  plugins: [singleFilePage()],
});
