import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['tests/**/*.test.ts'],
    exclude: ['tests/e2e/**', 'node_modules/**'],
    testTimeout: 30_000,
    // The protocol and CLI tests run dist/; rebuild it first when a source is newer.
    globalSetup: ['tests/support/freshBundles.ts'],
  },
});
