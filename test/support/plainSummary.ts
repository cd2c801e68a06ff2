import type { Reporter, TestModule } from 'vitest/node';

/**
 * Prints one plain closing line, "N passed, N failed" (and ", N skipped"), after the default
 * reporter's summary, so that CI logs can be read without knowing vitest's own format.
 */
export default class PlainSummary implements Reporter {
  onTestRunEnd(testModules: ReadonlyArray<TestModule>, unhandledErrors: ReadonlyArray<unknown>): void {
    let passed = 0, failed = 0, skipped = 0;
    for (const m of testModules) {
      for (const t of m.children.allTests()) {
        const state = t.result().state;
        if (state === 'passed') passed++;
        else if (state === 'failed') failed++;
        else skipped++;
      }
      // A file that failed to load has no tests but is a failure all the same.
      if (m.state() === 'failed' && ![...m.children.allTests()].some((t) => t.result().state === 'failed')) failed++;
    }
    failed += unhandledErrors.length;
    process.stdout.write(`\n${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ''}\n`);
  }
}
