// Prints one closing line over every runner: "tests: N passed, N failed, N skipped".
import { existsSync, readFileSync } from "node:fs";

let passed = 0, failed = 0, skipped = 0;
const missing = [];
if (existsSync("reports/vitest.json")) {
  const v = JSON.parse(readFileSync("reports/vitest.json", "utf8"));
  passed += v.numPassedTests; failed += v.numFailedTests; skipped += v.numPendingTests + (v.numTodoTests ?? 0);
  // a file that failed to load has no failed test but fails the run
  if (v.success === false && v.numFailedTests === 0) failed += 1;
} else missing.push("vitest");
if (existsSync("reports/playwright.json")) {
  const p = JSON.parse(readFileSync("reports/playwright.json", "utf8"));
  passed += p.stats.expected; failed += p.stats.unexpected + p.stats.flaky; skipped += p.stats.skipped;
  if ((p.errors ?? []).length) failed += p.errors.length;
} else missing.push("playwright");
if (missing.length) console.log(`test-summary: no results from ${missing.join(", ")}`);
console.log(`tests: ${passed} passed, ${failed + missing.length} failed, ${skipped} skipped`);
process.exit(failed + missing.length > 0 ? 1 : 0);
