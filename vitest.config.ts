import { defineConfig } from 'vitest/config';

// Unit and property tests: pure Node, no browser.
export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    environment: 'node',
    testTimeout: 60_000,
    hookTimeout: 60_000,
  },
});
