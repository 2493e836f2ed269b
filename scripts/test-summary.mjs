// Adds up the JSON reports of Vitest and Playwright into one closing line: "N passed, N failed".
import { existsSync, readFileSync } from "node:fs";

let passed = 0;
let failed = 0;
let skipped = 0;
// A stage left out with CW_TEST_STAGES wrote no report; CI runs every stage, so all are there.
for (const file of process.argv.slice(2).filter((f) => existsSync(f))) {
  const r = JSON.parse(readFileSync(file, "utf8"));
  if ("numPassedTests" in r) {
    passed += r.numPassedTests;
    failed += r.numFailedTests;
    skipped += r.numPendingTests + (r.numTodoTests ?? 0);
  } else if (r.stats) {
    passed += r.stats.expected;
    failed += r.stats.unexpected + (r.stats.flaky ?? 0);
    skipped += r.stats.skipped;
  }
}
console.log(`${passed} passed, ${failed} failed, ${skipped} skipped`);
process.exit(failed > 0 ? 1 : 0);
