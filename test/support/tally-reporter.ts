import type { Reporter, TestModule } from "vitest/node";

// Prints one last line `N passed, N failed, N skipped` that CI can read.
// A test file that fails to load counts as one failed test.
export default class TallyReporter implements Reporter {
  onTestRunEnd(modules: ReadonlyArray<TestModule>, unhandledErrors: ReadonlyArray<unknown>): void {
    let passed = 0;
    let failed = 0;
    let skipped = 0;
    for (const module of modules) {
      let seen = 0;
      for (const test of module.children.allTests()) {
        seen++;
        const state = test.result().state;
        if (state === "passed") passed++;
        else if (state === "failed") failed++;
        else skipped++;
      }
      if (module.state() === "failed" && (seen === 0 || module.errors().length > 0)) failed++;
    }
    failed += unhandledErrors.length;
    process.stdout.write(`\n${passed} passed, ${failed} failed, ${skipped} skipped\n`);
  }
}
