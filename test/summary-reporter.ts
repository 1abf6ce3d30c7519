// Prints one plain closing line, "vitest: N passed, N failed[, N skipped]", after the default report.
import type { Reporter, TestModule } from "vitest/node";

export default class SummaryReporter implements Reporter {
  onTestRunEnd(testModules: ReadonlyArray<TestModule>) {
    let passed = 0;
    let failed = 0;
    let skipped = 0;
    for (const m of testModules) {
      for (const t of m.children.allTests()) {
        const s = t.result().state;
        if (s === "passed") passed++;
        else if (s === "failed") failed++;
        else skipped++;
      }
      if (m.state() === "failed" && [...m.children.allTests()].length === 0) failed++;
    }
    process.stdout.write(`\nvitest: ${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ""}\n`);
  }
}
