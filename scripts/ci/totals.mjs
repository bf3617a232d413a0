// Sums vitest JSON reports into the line CI ends with: "N passed, N failed".
// A test file that fails to load has no failed test in it, so it counts as one failure of its own;
// a missing report (the run died before writing it) counts as one failure too.
import fs from "node:fs";

let passed = 0;
let failed = 0;
let skipped = 0;
for (const file of process.argv.slice(2)) {
  if (!fs.existsSync(file)) {
    console.error(`No test report at ${file}: the run ended before it was written.`);
    failed += 1;
    continue;
  }
  const r = JSON.parse(fs.readFileSync(file, "utf8"));
  passed += r.numPassedTests ?? 0;
  failed += r.numFailedTests ?? 0;
  skipped += (r.numPendingTests ?? 0) + (r.numTodoTests ?? 0);
  for (const suite of r.testResults ?? []) {
    const failedInside = (suite.assertionResults ?? []).some((a) => a.status === "failed");
    if (suite.status === "failed" && !failedInside) {
      console.error(`Test file failed outside its tests: ${suite.name}\n${(suite.message ?? "").slice(0, 2000)}`);
      failed += 1;
    }
  }
}
console.log(`${passed} passed, ${failed} failed` + (skipped ? `, ${skipped} skipped` : ""));
process.exit(failed > 0 ? 1 : 0);
