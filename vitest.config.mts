import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['tests/**/*.test.ts'],
    exclude: ['tests/e2e/**', 'node_modules/**'],
    testTimeout: 30_000,
    // Temporary folders go under one folder per run, which must be empty at the end;
    // the protocol and CLI tests run dist/, rebuilt first when a source is newer.
    globalSetup: ['tests/support/tempCheck.ts', 'tests/support/freshBundles.ts'],
  },
});
