// End-to-end tests against a real editor (code-server) and browser (Chromium).
// Run `bash scripts/e2e/setup.sh` first; it installs both into .cache/e2e.
import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['test/e2e/**/*.e2e.test.ts'],
    // One editor at a time: each test file starts its own code-server and browser.
    fileParallelism: false,
    maxWorkers: 1,
    pool: 'forks',
    testTimeout: 180_000,
    hookTimeout: 180_000,
    teardownTimeout: 30_000,
    retry: 0,
  },
});
