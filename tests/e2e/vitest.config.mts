import { defineConfig } from 'vitest/config';
import { fileURLToPath } from 'node:url';

// Browser tests: playwright-core driving Debian's Chromium against the production build that
// scripts/test.mjs serves at TAUFORGE_BASE_URL.
export default defineConfig({
  resolve: { alias: { '@': fileURLToPath(new URL('../../', import.meta.url)) } },
  test: {
    include: ['tests/e2e/**/*.e2e.ts'],
    environment: 'node',
    testTimeout: 120_000,
    hookTimeout: 120_000,
    fileParallelism: false,
  },
});
