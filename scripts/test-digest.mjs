// Prints, from Vitest's JSON reports, every test that failed and every test that passed only on a
// retry, with the first line of each failure. npm test calls it last, because CI keeps only the end
// of the output. Usage: node scripts/test-digest.mjs report.json [report.json ...]
import { existsSync, readFileSync } from "node:fs";

for (const file of process.argv.slice(2)) {
  if (!existsSync(file)) continue;
  let report;
  try {
    report = JSON.parse(readFileSync(file, "utf8"));
  } catch {
    console.log(`${file}: not readable as a Vitest report`);
    continue;
  }
  for (const suite of report.testResults ?? []) {
    if (suite.status === "failed" && (suite.assertionResults ?? []).length === 0)
      console.log(`FAILED ${suite.name}: ${(suite.message ?? "").split("\n")[0]}`);
    for (const test of suite.assertionResults ?? []) {
      const messages = test.failureMessages ?? [];
      if (test.status === "passed" && messages.length === 0) continue;
      if (test.status === "skipped" || test.status === "pending" || test.status === "todo") continue;
      const what = test.status === "passed" ? `PASSED ONLY ON RETRY (${messages.length} failure(s))` : "FAILED";
      console.log(`${what} ${suite.name.replace(process.cwd() + "/", "")} > ${test.fullName}`);
      for (const m of messages.slice(0, 2)) console.log(`    ${m.split("\n")[0].slice(0, 300)}`);
    }
  }
}
