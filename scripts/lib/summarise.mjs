// Reads the runners' JSON reports and prints one closing line: "N passed, N failed".
import { existsSync, readFileSync } from "node:fs";
import { join } from "node:path";

const dir = process.argv[2];
let passed = 0;
let failed = 0;
let skipped = 0;
const lines = [];

// The import check (scripts/check-imports.mjs): one check per dependency-cruiser rule.
const importsFile = join(dir, "imports.json");
if (existsSync(importsFile)) {
  const r = JSON.parse(readFileSync(importsFile, "utf8"));
  const rules = r.rules ?? [];
  const ok = rules.filter((x) => x.passed).length;
  const bad = rules.length - ok + (rules.length === 0 ? 1 : 0);
  passed += ok;
  failed += bad;
  lines.push(`import check: ${ok} passed, ${bad} failed${bad ? ` (${rules.filter((x) => !x.passed).map((x) => x.name).join(", ") || r.error || "no rules ran"})` : ""}`);
} else {
  failed += 1;
  lines.push("import check: no report (the check did not run)");
}

const vitestFile = join(dir, "vitest.json");
if (existsSync(vitestFile)) {
  const v = JSON.parse(readFileSync(vitestFile, "utf8"));
  passed += v.numPassedTests;
  failed += v.numFailedTests;
  skipped += (v.numPendingTests ?? 0) + (v.numTodoTests ?? 0);
  // A file that failed to load has no tests but must count as a failure.
  const broken = (v.testResults ?? []).filter((r) => r.status === "failed" && r.assertionResults.length === 0).length;
  failed += broken;
  lines.push(`vitest: ${v.numPassedTests} passed, ${v.numFailedTests + broken} failed`);
} else {
  failed += 1;
  lines.push("vitest: no report (the runner did not finish)");
}

const pwFile = join(dir, "playwright.json");
if (existsSync(pwFile)) {
  const p = JSON.parse(readFileSync(pwFile, "utf8"));
  const s = p.stats;
  passed += s.expected + s.flaky;
  failed += s.unexpected;
  skipped += s.skipped;
  const errors = (p.errors ?? []).length;
  failed += errors;
  lines.push(`playwright: ${s.expected + s.flaky} passed, ${s.unexpected + errors} failed${s.flaky ? ` (${s.flaky} flaky)` : ""}`);
} else {
  failed += 1;
  lines.push("playwright: no report (the runner did not finish)");
}

for (const l of lines) console.log(l);
console.log(`${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ""}`);
process.exit(failed > 0 ? 1 : 0);
