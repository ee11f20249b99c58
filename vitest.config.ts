import { defineConfig } from 'vitest/config';

// The JSON report is what .ci/run reads to print its closing "N passed, N failed, N skipped" line.
export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    testTimeout: 60_000,
    hookTimeout: 120_000,
    reporters: ['default', 'json'],
    outputFile: { json: 'test/artifacts/vitest-results.json' },
  },
});
