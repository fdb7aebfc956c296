import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

// this file lives in test/; the tests run from the repository root
export default defineConfig({
  root: fileURLToPath(new URL('..', import.meta.url)),
  test: {
    include: ['test/**/*.test.ts'],
    testTimeout: 120000,
    hookTimeout: 120000,
  },
});
