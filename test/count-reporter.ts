/**
 * A vitest reporter that ends the run with one plain line, "N passed, N failed" (", N skipped"
 * when some were skipped), so that anyone reading a CI log sees at once that tests ran.
 */
import type { Reporter, TestModule } from "vitest/node";

export default class CountReporter implements Reporter {
  onTestRunEnd(
    testModules: ReadonlyArray<TestModule>,
    unhandledErrors: ReadonlyArray<unknown>,
  ): void {
    let passed = 0;
    let failed = 0;
    let skipped = 0;
    for (const module of testModules) {
      if (module.state() === "failed" && [...module.children.allTests()].length === 0) failed++;
      for (const test of module.children.allTests()) {
        const state = test.result().state;
        if (state === "passed") passed++;
        else if (state === "failed") failed++;
        else skipped++;
      }
    }
    failed += unhandledErrors.length;
    const tail = skipped > 0 ? `, ${skipped} skipped` : "";
    process.stdout.write(`\n${passed} passed, ${failed} failed${tail}\n`);
  }
}
