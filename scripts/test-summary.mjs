// Prints the closing line of `npm test`: "N passed, N failed", counting
// vitest's and Playwright's tests together, from their JSON reports. Exits 1
// if any test failed or any step named on the command line failed.
import { existsSync, readFileSync } from "node:fs";
import path from "node:path";

const [dir, ...failedSteps] = process.argv.slice(2);
let passed = 0;
let failed = 0;
const notes = [];

const read = (file) => {
  const full = path.join(dir, file);
  if (!existsSync(full)) return null;
  try {
    return JSON.parse(readFileSync(full, "utf8"));
  } catch {
    return null;
  }
};

const vitest = read("vitest.json");
if (vitest) {
  passed += vitest.numPassedTests ?? 0;
  // A file that fails to load has no tests of its own: count it as one failure.
  const brokenFiles = (vitest.testResults ?? []).filter(
    (f) => f.status === "failed" && (f.assertionResults ?? []).length === 0,
  ).length;
  failed += (vitest.numFailedTests ?? 0) + brokenFiles;
} else {
  failed += 1;
  notes.push("vitest wrote no report (counted as one failure)");
}

const pw = read("playwright.json");
if (pw) {
  passed += (pw.stats?.expected ?? 0) + (pw.stats?.flaky ?? 0);
  failed += pw.stats?.unexpected ?? 0;
  // A project that depends on a failed one (the fault test runs after all others) is skipped.
  if ((pw.stats?.skipped ?? 0) > 0) notes.push(`${pw.stats.skipped} browser tests did not run (skipped)`);
  if ((pw.errors ?? []).length > 0) {
    failed += 1;
    notes.push("Playwright reported errors outside tests (counted as one failure)");
  }
} else {
  failed += 1;
  notes.push("Playwright wrote no report (counted as one failure)");
}

console.log("");
for (const step of failedSteps) console.log(`step failed: ${step}`);
for (const note of notes) console.log(note);
console.log(`${passed} passed, ${failed} failed`);
process.exit(failed > 0 || failedSteps.length > 0 ? 1 : 0);
