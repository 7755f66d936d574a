// The import rules of the layout in DEVELOPERS.md ("How the code is laid out"), checked by
// `npm run check:imports` (scripts/check-imports.mjs) and in scripts/test.
//
//   lib/<domain>/model.ts (and the other files of a domain folder not named data*) client-safe
//   lib/<domain>/data.ts, data-*.ts                                      server-only (Knex)
//   lib/rules, fill, notify, auth, api                                   shared engines
//
// "Client code" is everything under components/, every file that starts with "use client",
// and every client-safe file of lib/ (model.ts and friends): none of it may reach Knex or the
// MariaDB driver, or import a data module (not even for a type: view types live in model.ts).
const fs = require("node:fs");
const path = require("node:path");

const ROOT = __dirname;
const SOURCE_DIRS = ["app", "components", "lib"];

/** Files whose first statement is the "use client" directive. */
function useClientFiles() {
  const out = [];
  const walk = (dir) => {
    for (const e of fs.readdirSync(path.join(ROOT, dir), { withFileTypes: true })) {
      const rel = path.posix.join(dir, e.name);
      if (e.isDirectory()) walk(rel);
      else if (/\.(ts|tsx)$/.test(e.name)) {
        const head = fs.readFileSync(path.join(ROOT, rel), "utf8").slice(0, 300);
        if (/^(?:\s|\/\/[^\n]*\n|\/\*[\s\S]*?\*\/)*["']use client["']/.test(head)) out.push(rel);
      }
    }
  };
  for (const d of SOURCE_DIRS) if (fs.existsSync(path.join(ROOT, d))) walk(d);
  return out;
}

const esc = (s) => s.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");
const USE_CLIENT = useClientFiles().map((f) => `^${esc(f)}$`);

// Server-only modules: Knex modules of the domains, the pool, and the database drivers.
const DATA_MODULE = "^lib/[^/]+/data(-|[.]ts$)";
const SERVER_ONLY = [DATA_MODULE, "^lib/db\\.ts$"];
const DRIVERS = ["(^|/)node_modules/(knex|mysql2)/"];
// Client-safe lib files: every file of a domain folder not named data*, the rules engine (pure
// by contract, CREW-CHECK.md) and the shared display helpers.
const DOMAINS = [
  "assignments", "audit", "board", "briefings", "credentials", "equipment", "files", "gear", "messages",
  "leave", "orders", "policies", "rotations", "time", "time-records", "users", "workers", "yards",
  "booking", "events", "daysheet", "notices", "queue", "offline",
];
const CLIENT_SAFE_LIB = [`^lib/(${DOMAINS.join("|")})/`, "^lib/rules/", "^lib/(format|csv|tone)\\.ts$"];
const NOT_DATA = "/data(-|[.]ts$)";

// The synthetic benchmark day and what is built on it: for scripts/, bench/ and tests/ only.
const BENCH_GENERATOR = [
  "^lib/rules/generate\\.ts$",
  "^lib/rules/generate-equipment\\.ts$",
  "^lib/rules/random-drops\\.ts$",
  "^lib/fill/scenario\\.ts$",
];

// scripts/check-imports.mjs runs dependency-cruiser twice: every import (types too) for the
// rules about who may import what, then runtime imports only (DEPCRUISE_RUNTIME_ONLY=1, see
// .dependency-cruiser.babel.cjs) for the rule about what a browser bundle can reach.
const RUNTIME_ONLY = process.env.DEPCRUISE_RUNTIME_ONLY === "1";
const REACHABILITY_RULES = new Set(["no-knex-reachable-from-client-code"]);

/** @type {import('dependency-cruiser').IConfiguration} */
const config = {
  forbidden: [
    {
      name: "no-folder-cycle-in-lib",
      comment:
        "Folders of lib/ depend on each other in one direction: domains below, engines (rules, fill, notify, auth, api) above. " +
        "A loop between two folders means a concept has two homes; move the shared part down into the domain's model.ts.",
      severity: "error",
      scope: "folder",
      from: { path: "^lib/" },
      to: { path: "^lib/", circular: true },
    },
    {
      name: "no-lib-to-components",
      comment: "The domain does not depend on the UI: lib/ never imports components/ or app/ (labels and tones are data in model.ts).",
      severity: "error",
      from: { path: "^lib/" },
      to: { path: "^(components|app)/" },
    },
    {
      name: "no-data-module-in-client-code",
      comment:
        "components/, 'use client' files and client-safe lib files import model.ts, never a data.ts / data-*.ts or lib/db.ts " +
        "(not even for a type: put view types in the domain's model.ts).",
      severity: "error",
      from: { path: ["^components/", ...CLIENT_SAFE_LIB, ...USE_CLIENT], pathNot: NOT_DATA },
      to: { path: SERVER_ONLY },
    },
    {
      name: "no-knex-reachable-from-client-code",
      comment: "Nothing a browser bundle can load reaches Knex or mysql2, through any chain of imports.",
      severity: "error",
      from: { path: ["^components/", ...CLIENT_SAFE_LIB, ...USE_CLIENT], pathNot: NOT_DATA },
      to: { path: DRIVERS, reachable: true },
    },
    {
      name: "no-bench-generator-in-production",
      comment: "The synthetic benchmark day (lib/rules/generate*.ts, random-drops, lib/fill/scenario.ts) is for scripts/, bench/ and tests/ only.",
      severity: "error",
      from: { path: "^(app|components|lib)/", pathNot: BENCH_GENERATOR },
      to: { path: BENCH_GENERATOR },
    },
    {
      name: "no-unresolvable-import",
      comment: "An import that does not resolve (a file moved and the import was not rewritten).",
      severity: "error",
      from: { path: "^(app|components|lib|tests|scripts|db)/" },
      to: { couldNotResolve: true, pathNot: ["^server-only$", "^(bun|cloudflare):"] },
    },
  ],
  options: {
    doNotFollow: { path: "node_modules" },
    exclude: { path: "(^|/)(\\.next[^/]*|\\.data|bench/results|public)/" },
    babelConfig: { fileName: ".dependency-cruiser.babel.cjs" },
    webpackConfig: { fileName: ".dependency-cruiser.resolve.cjs" },
    enhancedResolveOptions: {
      exportsFields: ["exports"],
      conditionNames: ["import", "require", "node", "default", "types"],
      extensions: [".ts", ".tsx", ".mts", ".js", ".mjs", ".cjs", ".json", ".d.ts"],
    },
    skipAnalysisNotInRules: false,
  },
};

config.forbidden = config.forbidden.filter((r) => REACHABILITY_RULES.has(r.name) === RUNTIME_ONLY);
module.exports = config;
