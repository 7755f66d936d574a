#!/usr/bin/env node
// The lib/ regroup by domain (issue 13): moves files with `git mv` and rewrites every import
// of a moved file (relative and "@/" specifiers, `vi.mock` / `vi.importActual` paths, dynamic
// imports, `export … from`) in app/, components/, lib/, tests/, scripts/, bench/, db/ and the
// root .ts files. Re-runnable: a move whose source is gone and target exists is skipped, and
// specifiers that already point at the new place are left alone.
//
//   node scripts/dev/regroup.mjs            move + rewrite
//   node scripts/dev/regroup.mjs --map      print the old → new mapping only
//   node scripts/dev/regroup.mjs --rewrite  rewrite imports only (for files that arrived later)
//
// Files that were dirty (git status) when it ran get their import specifiers rewritten and
// nothing else; clean files also get mentions of old paths in comments ("lib/data/orders.ts")
// updated. The list of files it touched is printed for the commit.
import { execFileSync } from "node:child_process";
import { existsSync, readFileSync, writeFileSync, statSync } from "node:fs";
import path from "node:path";

const ROOT = process.cwd();

// old → new. Server-only (Knex) files are `data.ts` or `data-<what>.ts`; everything else in a
// domain folder is client-safe (`model.ts` first).
export const MOVES = [
  // orders
  ["lib/orders/types.ts", "lib/orders/model.ts"],
  ["lib/validation/order.ts", "lib/orders/schema.ts"],
  ["lib/data/orders.ts", "lib/orders/data.ts"],
  ["lib/orders/series.ts", "lib/orders/data-series.ts"],
  ["lib/data/work-types.ts", "lib/orders/data-work-types.ts"],
  ["lib/recurrence.ts", "lib/orders/data-occurrences.ts"],
  // board (the day's board: read, cache, events, people placed elsewhere)
  ["lib/board/types.ts", "lib/board/model.ts"],
  ["lib/validation/board.ts", "lib/board/schema.ts"],
  ["lib/data/board.ts", "lib/board/data.ts"],
  ["lib/data/board-cache.ts", "lib/board/data-cache.ts"],
  ["lib/board/extras.ts", "lib/board/data-extras.ts"],
  ["lib/data/events.ts", "lib/board/data-events.ts"],
  ["lib/data/placed-elsewhere.ts", "lib/board/data-placed-elsewhere.ts"],
  // assignments (seats held on orders, answers, overrides, booking locks)
  ["lib/data/assignments.ts", "lib/assignments/data.ts"],
  ["lib/data/responses.ts", "lib/assignments/data-responses.ts"],
  ["lib/data/overrides.ts", "lib/assignments/data-overrides.ts"],
  ["lib/data/booking.ts", "lib/assignments/data-booking.ts"],
  ["lib/data/double-booking.ts", "lib/assignments/data-double-booking.ts"],
  // briefings
  ["lib/validation/briefing.ts", "lib/briefings/model.ts"],
  ["lib/data/briefings.ts", "lib/briefings/data.ts"],
  ["lib/briefing/checks.ts", "lib/briefings/checks.ts"],
  ["lib/briefing/pdf.ts", "lib/briefings/pdf.ts"],
  // credentials and qualification types
  ["lib/validation/credential.ts", "lib/credentials/model.ts"],
  ["lib/validation/credential-csv.ts", "lib/credentials/csv.ts"],
  ["lib/validation/qualification-type.ts", "lib/credentials/qualification-types.ts"],
  ["lib/data/credentials.ts", "lib/credentials/data.ts"],
  ["lib/data/credential-import.ts", "lib/credentials/data-import.ts"],
  ["lib/data/qualification-types.ts", "lib/credentials/data-qualification-types.ts"],
  ["lib/reminders.ts", "lib/credentials/data-reminders.ts"],
  // workers
  ["lib/validation/worker.ts", "lib/workers/model.ts"],
  ["lib/data/workers.ts", "lib/workers/data.ts"],
  ["lib/calendar.ts", "lib/workers/data-calendar.ts"],
  // leave
  ["lib/validation/unavailability.ts", "lib/leave/model.ts"],
  ["lib/data/unavailability.ts", "lib/leave/data.ts"],
  // rotations
  ["lib/validation/rotation.ts", "lib/rotations/model.ts"],
  ["lib/data/rotations.ts", "lib/rotations/data.ts"],
  ["lib/rotations.ts", "lib/rotations/data-on-call.ts"],
  // time: time records, calendar days, wall clocks, recurrence
  ["lib/validation/time-record.ts", "lib/time/model.ts"],
  ["lib/data/time-records.ts", "lib/time/data.ts"],
  ["lib/validation/day.ts", "lib/time/days.ts"],
  ["lib/zoned-format.ts", "lib/time/zoned-format.ts"],
  ["lib/recurrence-core.ts", "lib/time/recurrence.ts"],
  // users
  ["lib/validation/user.ts", "lib/users/model.ts"],
  ["lib/data/users.ts", "lib/users/data.ts"],
  // audit
  ["lib/labels/audit.ts", "lib/audit/model.ts"],
  ["lib/data/audit.ts", "lib/audit/data.ts"],
  // inbox (the Messages screen: outbox and inbound texts read back)
  ["lib/data/messages.ts", "lib/inbox/data.ts"],
  ["lib/validation/notify.ts", "lib/notify/schema.ts"],
  // policies
  ["lib/validation/policy.ts", "lib/policies/model.ts"],
  ["lib/data/policies.ts", "lib/policies/data.ts"],
  ["lib/labels/rules.ts", "lib/rules/rule-labels.ts"],
  // yards
  ["lib/data/yards.ts", "lib/yards/data.ts"],
  // evidence files
  ["lib/validation/file.ts", "lib/files/model.ts"],
  ["lib/files.ts", "lib/files/data.ts"],
  // fill's request schema next to the fill engine
  ["lib/validation/fill.ts", "lib/fill/schema.ts"],
  // equipment and gear: server files named data-*
  ["lib/equipment/board.ts", "lib/equipment/data-board.ts"],
  ["lib/equipment/fill-load.ts", "lib/equipment/data-fill-load.ts"],
  ["lib/equipment/snapshot.ts", "lib/equipment/data-snapshot.ts"],
  ["lib/gear/reminders.ts", "lib/gear/data-reminders.ts"],
  ["lib/gear/snapshot.ts", "lib/gear/data-snapshot.ts"],
  // --- second pass: breaking the folder loops (scripts/check-imports.mjs, no-folder-cycle-in-lib)
  // board events are written by every domain and read by the board: a folder of their own
  ["lib/board/data-events.ts", "lib/events/data.ts"],
  // the background jobs start the domains' loops: above them, not in lib/'s root with db.ts
  ["lib/background.ts", "lib/jobs/background.ts"],
  // roles are the users' concept; auth (the engine) reads them
  ["lib/auth/roles.ts", "lib/users/roles.ts"],
  // refusing a time change over someone's other order is about orders
  ["lib/assignments/data-double-booking.ts", "lib/orders/data-double-booking.ts"],
  // sending crews and reading their replies are assignment work flows over the notify engine
  ["lib/notify/send.ts", "lib/assignments/data-send.ts"],
  ["lib/notify/inbound.ts", "lib/assignments/data-inbound.ts"],
  ["lib/equipment/data-board.ts", "lib/assignments/data-equipment-findings.ts"],
  // trucks for the fill: part of the fill's loader
  ["lib/equipment/data-fill-load.ts", "lib/fill/load-trucks.ts"],
  // time records are a domain; lib/time keeps the calendar and the clock (a leaf)
  ["lib/time/model.ts", "lib/time-records/model.ts"],
  ["lib/time/data.ts", "lib/time-records/data.ts"],
  // --- third pass (the import check's findings)
  // the sessions table is the users' data; auth (the engine) reads it
  ["lib/auth/sessions.ts", "lib/users/data-sessions.ts"],
  // a server component that reads the database is a page part, not a components/ piece
  ["components/my-credentials.tsx", "app/(app)/credentials/my-credentials.tsx"],
  // "write what you lock": the booking_seq bumps every domain that books people or orders takes
  ["lib/assignments/data-booking.ts", "lib/booking/data.ts"],
  // --- glossary (DEVELOPERS.md): "messages" are the texts and e-mails themselves (the Messages
  // screen); the wording of what is sent is "wording"
  ["lib/inbox/data.ts", "lib/messages/data.ts"],
  ["lib/notify/messages.ts", "lib/notify/wording.ts"],
  // no query outside a data.ts: My week's reads
  ["app/(app)/me/data.ts", "lib/assignments/data-my-week.ts"],
];

const args = new Set(process.argv.slice(2));
// every path that ever moved → where it is now (chains followed: a → b, b → c gives a → c)
const oldToNew = new Map();
for (const [a, b] of MOVES) {
  for (const [k, v] of oldToNew) if (v === a) oldToNew.set(k, b);
  oldToNew.set(a, b);
}

if (args.has("--map")) {
  for (const [a, b] of oldToNew) console.log(`${a} -> ${b}`);
  process.exit(0);
}

const git = (...a) => execFileSync("git", a, { cwd: ROOT, encoding: "utf8" });

// Files dirty before the run: only their import specifiers are rewritten.
const dirty = new Set(
  git("status", "--porcelain", "--untracked-files=all")
    .split("\n")
    .filter(Boolean)
    .map((l) => l.slice(3).replace(/^.* -> /, "")),
);

// 1. Moves.
const moved = [];
if (!args.has("--rewrite")) {
  for (const [from, to] of MOVES) {
    if (existsSync(from) && !existsSync(to)) {
      execFileSync("mkdir", ["-p", path.dirname(to)]);
      git("mv", from, to);
      moved.push([from, to]);
    } else if (existsSync(from) && existsSync(to)) {
      console.error(`both exist, not moved: ${from} ${to}`);
      process.exitCode = 1;
    }
  }
}
// where each file moved in this run was before it
const newToOld = new Map();
for (const [a, b] of moved) newToOld.set(b, newToOld.get(a) ?? a), newToOld.delete(a);

// 2. Files to rewrite.
const SCAN_DIRS = ["app", "components", "lib", "tests", "scripts", "bench", "db"];
const EXT = /\.(ts|tsx|mts|cts|js|mjs|cjs|jsx)$/;
const listed = git("ls-files", "--cached", "--others", "--exclude-standard")
  .split("\n")
  .filter((f) => f && EXT.test(f) && existsSync(f))
  .filter((f) => SCAN_DIRS.some((d) => f.startsWith(d + "/")) || !f.includes("/"))
  .filter((f) => f !== "scripts/dev/regroup.mjs");
const files = [...new Set(listed)];

const RESOLVE_EXT = ["", ".ts", ".tsx", ".mts", ".js", ".mjs", "/index.ts", "/index.tsx"];
const isFile = (p) => existsSync(p) && statSync(p).isFile();

/** Where a specifier pointed before the moves (a repo-relative path to a file), or null. */
function resolveOld(spec, importerOld) {
  let base;
  if (spec.startsWith("@/")) base = spec.slice(2);
  else if (spec.startsWith("./") || spec.startsWith("../")) base = path.posix.normalize(path.posix.join(path.posix.dirname(importerOld), spec));
  else return null;
  for (const e of RESOLVE_EXT) {
    const cand = base + e;
    if (oldToNew.has(cand)) return { old: cand, ext: e };
  }
  // A file that did not move: still resolvable at the same path (now).
  for (const e of RESOLVE_EXT) {
    const cand = base + e;
    if (isFile(cand)) return { old: cand, ext: e, unmoved: true };
  }
  return null;
}

const SPEC_RE =
  /((?:\bfrom|\bimport|\brequire|\bvi\.(?:mock|doMock|unmock|importActual|importMock)|\bimportActual)\s*(?:<[^>]*>)?\s*\(?\s*)(["'])([^"'\n]+)\2/g;

const esc = (x) => x.replace(/[.*+?^${}()|[\]\\/]/g, "\\$&");
const MENTION_RE = new RegExp(
  `(?<![\\w@/.-])(${[...oldToNew.keys()].map((a) => a.replace(/\.ts$/, "")).sort((a, b) => b.length - a.length).map(esc).join("|")})(\\.ts)?(?![\\w/-])`,
  "g",
);
const touched = [];
for (const fileNew of files) {
  const fileOld = newToOld.get(fileNew) ?? fileNew;
  const src = readFileSync(fileNew, "utf8");
  let out = src.replace(SPEC_RE, (m, pre, q, spec) => {
    const r = resolveOld(spec, fileOld);
    if (!r) return m;
    const targetNew = oldToNew.get(r.old) ?? r.old;
    const importerMoved = fileOld !== fileNew;
    if (targetNew === r.old && !importerMoved) return m;
    if (targetNew === r.old && importerMoved && spec.startsWith("@/")) return m;
    // folder import (".../index.ts") that did not move: leave it
    if (r.ext.startsWith("/index") && targetNew === r.old && !(importerMoved && !spec.startsWith("@/"))) return m;
    let t = targetNew;
    if (r.ext.startsWith("/index")) t = targetNew.slice(0, -r.ext.length);
    else if (r.ext) t = targetNew.slice(0, -r.ext.length);
    let next;
    if (spec.startsWith("@/")) next = "@/" + t;
    else {
      const sameDir = path.posix.dirname(t) === path.posix.dirname(fileNew);
      if (!sameDir && fileNew.startsWith("lib/") && t.startsWith("lib/")) next = "@/" + t;
      else {
        next = path.posix.relative(path.posix.dirname(fileNew), t);
        if (!next.startsWith(".")) next = "./" + next;
      }
    }
    return next === spec ? m : `${pre}${q}${next}${q}`;
  });
  if (!dirty.has(fileNew) && !dirty.has(fileOld)) {
    // mentions of old paths in comments and strings ("lib/data/orders.ts", "lib/data/orders")
    out = out.replace(MENTION_RE, (m, p, ext) => (oldToNew.get(p + ".ts") ?? m + "").replace(/\.ts$/, "") + (ext ?? ""));
  }
  if (out !== src) {
    writeFileSync(fileNew, out);
    touched.push(fileNew);
  }
}

// folders the moves emptied
for (const [from] of moved) {
  try {
    execFileSync("rmdir", ["--ignore-fail-on-non-empty", "-p", path.dirname(from)], { stdio: "ignore" });
  } catch {}
}

console.log(JSON.stringify({ moved: moved.length, touched: touched.length }));
if (args.has("--list")) for (const f of touched) console.log(f);
