import { defineConfig } from 'vitest/config';

// Browser tests: Node drives Debian's Chromium (playwright-core) against the built app in dist/.
export default defineConfig({
  test: {
    include: ['e2e/**/*.e2e.test.ts'],
    environment: 'node',
    globalSetup: ['e2e/support/server.ts'],
    // One browser at a time: the model is CPU-bound and timings in the tests assume a free core.
    fileParallelism: false,
    testTimeout: 90_000,
    hookTimeout: 60_000,
  },
});
