// The browser tests' own run (npm run test:browser); `npm test` does not include them.
import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

export default defineConfig({
  root: fileURLToPath(new URL('../..', import.meta.url)),
  test: {
    include: ['tests/browser/**/*.browser.ts'],
    testTimeout: 120000,
    hookTimeout: 240000,
    fileParallelism: false,
  },
});
