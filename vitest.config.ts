import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    reporters: ['default', './test/support/plainSummary.ts'],
    // Tests that run bin/keepclear.js need the compiled program: build it first.
    globalSetup: ['./test/support/buildDist.ts'],
    // Screening tests spawn worker threads and SQLite files; keep files in separate forks.
    pool: 'forks',
    testTimeout: 120_000,
    hookTimeout: 120_000,
  },
});
