import { defineConfig } from 'vitest/config';

// The JSON report is what .ci/run reads to print its closing "N passed, N failed, N skipped" line.
// globalSetup compiles dist/ first, so the CLI the tests spawn runs the current sources, and gives the run
// a temporary folder of its own that is removed when the run ends.
export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    globalSetup: ['test/support/build.ts', 'test/support/temp-root.ts'],
    testTimeout: 60_000,
    hookTimeout: 120_000,
    reporters: ['default', 'json'],
    outputFile: { json: 'test/artifacts/vitest-results.json' },
  },
});
