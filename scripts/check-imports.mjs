#!/usr/bin/env node
// The import check (issue 13): dependency-cruiser with the rules in .dependency-cruiser.cjs over
// every TypeScript file of the project. Prints the violations and exits 1 when there are any.
//
//   node scripts/check-imports.mjs                      (npm run check:imports)
//   node scripts/check-imports.mjs --json FILE          also writes a report for scripts/test:
//                                                       one check per rule, passed or failed
//
// The files are listed here rather than by folder because dependency-cruiser only scans folders
// for the extensions of the transpilers it can load, and TypeScript 7 is not one of them
// (see .dependency-cruiser.babel.cjs); files named on the command line are read all the same.
import { execFileSync, spawnSync } from "node:child_process";
import { existsSync, writeFileSync } from "node:fs";
import { createRequire } from "node:module";
import path from "node:path";

const ROOT = path.resolve(path.dirname(new URL(import.meta.url).pathname), "..");
const require = createRequire(import.meta.url);
const args = process.argv.slice(2);
const jsonAt = args.indexOf("--json");
const jsonOut = jsonAt >= 0 ? args[jsonAt + 1] : null;

const listed = execFileSync(
  "git",
  ["ls-files", "--cached", "--others", "--exclude-standard", "--", "app", "components", "lib", "tests", "scripts", "db", "*.ts"],
  { cwd: ROOT, encoding: "utf8", maxBuffer: 64 << 20 },
)
  .split("\n")
  .filter((f) => /\.(ts|tsx|mts)$/.test(f) && !f.endsWith(".d.ts") && existsSync(path.join(ROOT, f)));
const files = [...new Set(listed)].sort();

const bin = path.join(ROOT, "node_modules", "dependency-cruiser", "bin", "dependency-cruise.mjs");
const CONFIG = path.join(ROOT, ".dependency-cruiser.cjs");

/** One dependency-cruiser run; runtimeOnly drops type-only imports (the reachability pass). */
function cruise(runtimeOnly) {
  const env = { ...process.env, DEPCRUISE_RUNTIME_ONLY: runtimeOnly ? "1" : "0" };
  delete require.cache[CONFIG];
  process.env.DEPCRUISE_RUNTIME_ONLY = env.DEPCRUISE_RUNTIME_ONLY;
  const rules = require(CONFIG).forbidden;
  const run = spawnSync(process.execPath, [bin, "--config", ".dependency-cruiser.cjs", "--output-type", "json", ...files], {
    cwd: ROOT,
    env,
    encoding: "utf8",
    maxBuffer: 256 << 20,
  });
  try {
    return { rules, report: JSON.parse(run.stdout) };
  } catch {
    return { rules, error: (run.stderr || run.stdout || "dependency-cruiser gave no report").slice(0, 4000) };
  }
}

const passes = [cruise(false), cruise(true)];
const failedRun = passes.find((p) => p.error);
if (failedRun) {
  console.error(failedRun.error);
  if (jsonOut) writeFileSync(jsonOut, JSON.stringify({ rules: [], error: failedRun.error.slice(0, 2000) }));
  process.exit(1);
}

const rules = passes.flatMap((p) => p.rules);
const byRule = new Map(rules.map((r) => [r.name, []]));
for (const { report } of passes) {
  for (const v of report.summary.violations.filter((x) => x.rule.severity === "error")) {
    if (!byRule.has(v.rule.name)) byRule.set(v.rule.name, []);
    byRule.get(v.rule.name).push(v);
  }
}
const report = passes[0].report;

const describe = (v) => {
  if (v.cycle?.length) return `${v.from} → ${v.cycle.map((c) => c.name ?? c).join(" → ")}`;
  if (v.via?.length) return `${v.from} → ${v.via.map((c) => c.name ?? c).join(" → ")}`;
  return `${v.from} → ${v.to}`;
};

for (const [rule, list] of byRule) {
  if (!list.length) continue;
  const r = rules.find((x) => x.name === rule);
  console.log(`✗ ${rule} (${list.length})${r?.comment ? `\n    ${r.comment}` : ""}`);
  for (const v of list.slice(0, 40)) console.log(`    ${describe(v)}`);
  if (list.length > 40) console.log(`    … and ${list.length - 40} more`);
}
const failedRules = [...byRule.values()].filter((l) => l.length).length;
console.log(
  `import check: ${byRule.size - failedRules} rules passed, ${failedRules} failed ` +
    `(${report.summary.totalCruised} modules, ${report.summary.totalDependenciesCruised} imports)`,
);

if (jsonOut) {
  writeFileSync(
    jsonOut,
    JSON.stringify(
      { rules: [...byRule].map(([name, list]) => ({ name, passed: list.length === 0, violations: list.map(describe) })) },
      null,
      1,
    ),
  );
}
process.exit(failedRules ? 1 : 0);
