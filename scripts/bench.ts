// npm run bench — one benchmark for the whole product on a generated large day
// (lib/rules/generate.ts: 1,500 workers, 400 orders, 60 days of time records, two yards).
//
//   npm run bench [-- --workers 1500 --orders 400 --days 60 --seed 42 --duration 10
//                     --connections 16 --fill-limit 10 --dist .next --port 3300 --skip-api]
//
//   1. crew rules (pure): full check of the day, and a single-drop re-check on the live engine;
//   2. fill open positions (pure lib/fill on the generated day): time, gap, positions filled;
//   3. the API: GET /api/board and an assignment drop (POST /api/assignments then DELETE,
//      each with the server's re-check) at 16 connections, beside GET /api/health, with
//      autocannon against `next start` on database gaffline_bench (created, migrated, seeded
//      and loaded with scripts/bench/load-large.ts). Needs a build (`.next`, or --dist DIR);
//      skipped with a message when there is none;
//   4. the notification outbox: drainOnce's rate on stubbed providers, when lib/notify/data-outbox.ts
//      has it.
// Prints a table and writes it as JSON to bench/results/<timestamp>.json and latest.json.
// Aims: fill ≤ 10 s at ≤ 1 % gap; full check < 50 ms; re-check < 2 ms; board ≤ 3× and drop
// ≤ 2× health p95.

import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import { existsSync, mkdirSync, readFileSync, writeFileSync } from "node:fs";
import { cpus, loadavg } from "node:os";
import http from "node:http";
import path from "node:path";
import autocannon from "autocannon";
import knex from "knex";
import { dbConfig } from "../knexfile";
import { benchFill as runFillBench, fillAim } from "./bench/fill";
import { checkDay, createEngine } from "../lib/rules/engine";
import { generateDay } from "../lib/rules/generate";
import { randomDrops } from "../lib/rules/random-drops";
import { Client } from "../tests/support/client";
import { loadLarge } from "./bench/load-large";

const ROOT = path.resolve(__dirname, "..");
const arg = (name: string) => {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 ? process.argv[i + 1] : undefined;
};
const num = (name: string, fallback: number) => (arg(name) === undefined ? fallback : Number(arg(name)));
const flag = (name: string) => process.argv.includes(`--${name}`);

const opts = {
  workers: num("workers", 1500),
  orders: num("orders", 400),
  days: num("days", 60),
  seed: num("seed", 42),
  duration: num("duration", 10),
  connections: num("connections", 16),
  fillLimit: num("fill-limit", 10),
  fillGap: num("fill-gap", 0.01),
  port: num("port", 3300),
  dist: arg("dist") ?? process.env.BENCH_DIST ?? ".next",
  database: arg("database") ?? "gaffline_bench",
};

const round = (n: number, d = 2) => Math.round(n * 10 ** d) / 10 ** d;
function stats(samples: number[]) {
  const s = [...samples].sort((a, b) => a - b);
  const at = (q: number) => (s.length ? s[Math.min(s.length - 1, Math.max(0, Math.ceil(q * s.length) - 1))] : NaN);
  return { n: s.length, p50: round(at(0.5), 3), p95: round(at(0.95), 3), max: round(s[s.length - 1] ?? NaN, 3) };
}
const log = (...a: unknown[]) => console.error("[bench]", ...a);

// --- 1. crew rules --------------------------------------------------------------------------------
function benchRules() {
  const snapshot = generateDay({ workers: opts.workers, orders: opts.orders, days: opts.days, seed: opts.seed });
  for (let i = 0; i < 10; i++) checkDay(snapshot);
  const full: number[] = [];
  let findings = 0;
  for (let i = 0; i < 50; i++) {
    const t = performance.now();
    findings = checkDay(snapshot).length;
    full.push(performance.now() - t);
  }
  const engine = createEngine(snapshot);
  const randomDrop = randomDrops(snapshot, engine, opts.seed + 1);
  for (let i = 0; i < 50; i++) {
    const [d, u] = randomDrop();
    engine.apply(d);
    engine.apply(u);
  }
  const drops: number[] = [];
  for (let i = 0; i < 500; i++) {
    const [d, u] = randomDrop();
    const t = performance.now();
    engine.apply(d);
    drops.push(performance.now() - t);
    engine.apply(u);
  }
  return {
    assignments: snapshot.assignments.length,
    findings,
    fullCheckMs: stats(full),
    recheckMs: stats(drops),
  };
}

// --- 2. fill --------------------------------------------------------------------------------------
// scripts/bench/fill.ts (also `npm run bench:fill` on its own).
const benchFill = () => runFillBench(opts);

// --- 3. the API -----------------------------------------------------------------------------------
function sh(cmd: string, env: Record<string, string> = {}) {
  const res = spawnSync("bash", ["-c", cmd], { cwd: ROOT, env: { ...process.env, ...env }, encoding: "utf8" });
  if (res.status !== 0) throw new Error(`${cmd}: ${(res.stderr || res.stdout).slice(-1500)}`);
  return res.stdout;
}

async function prepareDatabase() {
  const env = { DB_NAME: opts.database };
  sh(`source scripts/lib/common.sh >/dev/null; mariadb_running || { echo "MariaDB is not running (scripts/start starts it)" >&2; exit 3; }; create_database ${opts.database}`);
  sh("node --import tsx scripts/db.ts migrate", env);
  sh("node --import tsx scripts/db.ts seed", env);
  return loadLarge({ workers: opts.workers, orders: opts.orders, days: opts.days, seed: opts.seed, database: opts.database });
}

async function waitFor(url: string, child: ChildProcess, ms = 90_000) {
  const until = Date.now() + ms;
  while (Date.now() < until) {
    if (child.exitCode !== null) throw new Error(`next start exited with ${child.exitCode}`);
    try {
      const r = await fetch(url);
      if (r.ok) return;
    } catch {
      /* not up yet */
    }
    await new Promise((r) => setTimeout(r, 500));
  }
  throw new Error(`no answer from ${url} within ${ms / 1000} s`);
}

/** The bytes that travel (still compressed): node:http does not decode the body. */
function wireBytes(url: string, headers: Record<string, string>): Promise<number> {
  return new Promise((resolve, reject) => {
    http
      .get(url, { headers }, (res) => {
        let n = 0;
        res.on("data", (d: Buffer) => (n += d.length));
        res.on("end", () => resolve(n));
      })
      .on("error", reject);
  });
}

interface Run {
  p50: number;
  p95: number;
  n: number;
  non2xx: number;
  rps: number;
  statusCodes: Record<string, number>;
}

function cannon(o: Parameters<typeof autocannon>[0]): Promise<Run> {
  return new Promise((resolve, reject) => {
    const times: number[] = [];
    const inst = autocannon({ timeout: 30, ...o }, (err, res) => {
      if (err) return reject(err);
      const s = stats(times);
      const statusCodes = Object.fromEntries(Object.entries(res.statusCodeStats ?? {}).map(([k, v]) => [k, Number(v.count)]));
      resolve({ p50: s.p50, p95: s.p95, n: s.n, non2xx: res.non2xx, rps: round(res.requests.average, 1), statusCodes });
    });
    inst.on("response", (_c, _status, _bytes, rt) => times.push(rt));
  });
}

async function benchApi() {
  const dist = path.resolve(ROOT, opts.dist);
  if (!existsSync(path.join(dist, "BUILD_ID"))) {
    return { skipped: `no production build in ${opts.dist} (run \`npm run build\`, or pass --dist DIR of another build): the API part was not measured` };
  }
  log(`preparing database ${opts.database} (migrate, seed, load the large day)`);
  const loaded = await prepareDatabase();
  const db = knex(dbConfig({ database: opts.database }));
  let child: ChildProcess | null = null;
  try {
    // Keep the daily reminder job out of the measurement (it claims its day in job_claims).
    const today = new Date().toISOString().slice(0, 10);
    const tomorrow = new Date(Date.now() + 86_400_000).toISOString().slice(0, 10);
    for (const day of [today, tomorrow]) await db("job_claims").insert({ job: "credential-reminders", day, claimed_by: "bench" }).onConflict(["job", "day"]).ignore();

    const base = `http://127.0.0.1:${opts.port}`;
    const secretFile = path.join(ROOT, ".data", "nextauth-secret");
    const env = {
      ...process.env,
      DB_NAME: opts.database,
      NEXT_DIST_DIR: opts.dist,
      NEXTAUTH_URL: base,
      APP_PUBLIC_URL: base,
      NEXTAUTH_SECRET: process.env.NEXTAUTH_SECRET ?? (existsSync(secretFile) ? readFileSync(secretFile, "utf8").trim() : "bench-secret"),
      DELIVERY_LOOP: "off",
      DB_POOL: process.env.DB_POOL ?? "20",
    } as NodeJS.ProcessEnv;
    log(`starting next start on :${opts.port} (${opts.dist}, ${opts.database})`);
    const server = spawn(path.join(ROOT, "node_modules", ".bin", "next"), ["start", "-H", "127.0.0.1", "-p", String(opts.port)], { cwd: ROOT, env, stdio: ["ignore", "ignore", "pipe"], detached: true });
    child = server;
    let stderr = "";
    server.stderr?.on("data", (d) => (stderr = (stderr + d).slice(-4000)));
    try {
      await waitFor(`${base}/api/health`, server);
    } catch (err) {
      throw new Error(`${(err as Error).message}\n${stderr}`);
    }
    const c = new Client(base);
    const signed = await c.signIn("dispatch@cedarprairie.example", "board-north-26");
    if (!signed.signedIn) throw new Error(`sign-in failed: ${signed.status} ${signed.body.slice(0, 200)}`);
    // The session cookie the client keeps (its map is private to the type, not at run time).
    const cookieHeader = `next-auth.session-token=${(c as unknown as { cookies: Map<string, string> }).cookies.get("next-auth.session-token")}`;
    const headers = { cookie: cookieHeader, "content-type": "application/json" };
    // Reads go as a browser sends them: the board answers compressed when the client accepts it.
    const readHeaders = { ...headers, "accept-encoding": "gzip" };
    const day = loaded.day;
    const boardPath = `/api/board?yard=NOR&date=${day}`;
    const board = await c.json(boardPath);
    if (board.status !== 200) throw new Error(`board: ${board.status}`);
    const boardBytes = JSON.stringify(board.body).length;
    // Issue 19: the board client asks for the answer compressed once per change (x-board-gzip)
    // and, once it holds a board, for a patch from the version it holds (since + cursor).
    const boardHeaders = { ...readHeaders, "x-board-gzip": "1" };
    const held = await fetch(base + boardPath, { headers: boardHeaders });
    const heldBytes = (await held.arrayBuffer()).byteLength; // fetch undoes the gzip: count the wire size below
    const boardVersion = held.headers.get("x-board-version");
    const boardGzipBytes = await wireBytes(base + boardPath, boardHeaders);
    const slimPath = `${boardPath}&since=${boardVersion}&cursor=${board.body.cursor}`;

    // Drop pairs: an open seat on a distinct North order and a worker free all day, per connection.
    const busy = new Set<number>((await db("assignments as a").join("work_orders as o", "o.id", "a.work_order_id").where("o.work_date", day).whereNotNull("a.holds_position").pluck("a.worker_id")) as number[]);
    const free = ((await db("workers").where("employee_no", "like", "GB-%").where({ active: true }).pluck("id")) as number[]).filter((id) => !busy.has(id));
    const openSeats = await db("positions as p")
      .join("work_orders as o", "o.id", "p.work_order_id")
      .join("yards as y", "y.id", "o.yard_id")
      .leftJoin("assignments as a", "a.holds_position", "p.id")
      .where({ "o.work_date": day, "y.code": "NOR" })
      .whereNull("a.id")
      .select("p.id", "p.work_order_id");
    const seen = new Set<number>();
    const seats = openSeats.filter((s) => !seen.has(s.work_order_id) && seen.add(s.work_order_id));
    const pairs = seats.slice(0, Math.min(seats.length, free.length, opts.connections)).map((s, i) => ({ positionId: s.id as number, workerId: free[i] }));
    if (pairs.length < opts.connections) throw new Error(`only ${pairs.length} free seat/worker pairs for ${opts.connections} connections`);

    const run = (p: string, extra: Partial<Parameters<typeof autocannon>[0]> = {}) =>
      cannon({ url: base + p, connections: opts.connections, duration: opts.duration, headers: readHeaders, ...extra });
    // One connection per seat: each runs place (POST, with the server's re-check) then take
    // off (DELETE) on its own seat and worker, so drops never contend for one seat.
    const dropOne = (pair: (typeof pairs)[number]) => [
      {
        method: "POST",
        path: "/api/assignments",
        body: JSON.stringify(pair),
        onResponse: (status: number, body: string, ctx: Record<string, unknown>) => {
          ctx.id = status === 201 ? JSON.parse(body).assignmentId : null;
        },
      },
      {
        method: "DELETE",
        setupRequest: (req: Record<string, unknown>, ctx: Record<string, unknown>) => (ctx.id ? { ...req, path: `/api/assignments/${ctx.id}?version=1` } : null),
      },
    ];
    const drops = async (duration: number): Promise<Run> => {
      const times: number[] = [];
      const codes: Record<string, number> = {};
      let total = 0;
      await Promise.all(
        pairs.slice(0, opts.connections).map(
          (pair) =>
            new Promise<void>((resolve, reject) => {
              const inst = autocannon({ url: base + "/api/assignments", connections: 1, duration, headers, timeout: 30, requests: dropOne(pair) as never }, (err, res) => {
                if (err) return reject(err);
                total += res.requests.total;
                for (const [k, v] of Object.entries(res.statusCodeStats ?? {})) codes[k] = (codes[k] ?? 0) + Number(v.count);
                resolve();
              });
              inst.on("response", (_c, _s, _b, rt) => times.push(rt));
            }),
        ),
      );
      const st = stats(times);
      const non2xx = Object.entries(codes).filter(([k]) => !k.startsWith("2")).reduce((n, [, v]) => n + v, 0);
      return { p50: st.p50, p95: st.p95, n: st.n, non2xx, rps: round(total / duration, 1), statusCodes: codes };
    };

    // A run ends mid-pipeline: a placement whose DELETE never went out is taken off here
    // (straight in the database), so the next run starts from open seats again.
    const sweep = async () => {
      await new Promise((r) => setTimeout(r, 3000)); // requests still in flight when a run stops finish first
      const rows = await db("assignments").whereIn("position_id", pairs.map((p) => p.positionId));
      if (rows.length) await db("assignments").whereIn("id", rows.map((r) => r.id)).delete();
      return rows.filter((r) => r.holds_position !== null).length;
    };
    log("warming up");
    await run("/api/health", { duration: 2 });
    await run(boardPath, { duration: 3 });
    await drops(3);
    await sweep();
    log(`health, board and drop, ${opts.duration} s each at ${opts.connections} connections`);
    const health = await run("/api/health");
    const boardRun = await run(boardPath, { headers: boardHeaders });
    // What an open board asks after a change: a patch against the version it holds.
    const slimRun = await run(slimPath, { headers: boardHeaders });
    const slim = await fetch(base + slimPath, { headers: boardHeaders });
    const slimBytes = (await slim.arrayBuffer()).byteLength;
    const drop = await drops(opts.duration);
    const leftBehind = await sweep();
    return {
      database: opts.database,
      dist: opts.dist,
      loaded,
      boardBytes,
      connections: opts.connections,
      durationSeconds: opts.duration,
      healthMs: health,
      boardMs: boardRun,
      boardHeldBytes: heldBytes,
      boardSlimWireBytes: await wireBytes(base + slimPath, boardHeaders),
      boardGzipBytes,
      boardSlimMs: slimRun,
      boardSlimBytes: slimBytes,
      boardSlimAnswer: slim.headers.get("x-board-answer"),
      boardSlimToHealthP95: round(slimRun.p95 / health.p95, 1),
      dropMs: drop,
      boardToHealthP95: round(boardRun.p95 / health.p95, 1),
      dropToHealthP95: round(drop.p95 / health.p95, 1),
      placementsLeftAtTheEnd: leftBehind,
    };
  } finally {
    if (child?.pid) {
      const group = -child.pid;
      try {
        process.kill(group, "SIGTERM");
        // A server still draining connections gets 5 s, then it is stopped for good.
        for (let i = 0; i < 50; i++) {
          await new Promise((r) => setTimeout(r, 100));
          process.kill(group, 0);
        }
        process.kill(group, "SIGKILL");
      } catch {
        /* gone */
      }
    }
    await db.destroy();
  }
}

// --- 4. the outbox ------------------------------------------------------------------------------
async function benchDrain() {
  let outbox: Record<string, unknown>;
  try {
    outbox = await import("../lib/notify/data-outbox");
  } catch {
    return { measured: false, note: "not measured: lib/notify/data-outbox.ts is not there" };
  }
  if (typeof outbox.drainOnce !== "function" || typeof outbox.enqueue !== "function") return { measured: false, note: "not measured: lib/notify/data-outbox.ts has no drainOnce" };
  const drainOnce = outbox.drainOnce as (db: unknown, o: Record<string, unknown>) => Promise<{ claimed: number; sent: number }>;
  const enqueue = outbox.enqueue as (db: unknown, rows: Record<string, unknown>[]) => Promise<number>;
  const db = knex(dbConfig({ database: opts.database }));
  try {
    await db.raw("select 1");
    const org = await db("organisations").where({ slug: "cedar-prairie" }).first();
    const workers = (await db("workers").where("employee_no", "like", "GB-%").limit(500).select("id", "phone_e164", "email")) as { id: number; phone_e164: string; email: string }[];
    if (!org || !workers.length) return { measured: false, note: "not measured: the bench database is not loaded (the API part loads it)" };
    const n = 1000;
    const tag = `bench:${Date.now()}`;
    const rows = Array.from({ length: n }, (_, i) => {
      const w = workers[i % workers.length];
      const sms = i % 2 === 0;
      return { organisationId: org.id, workerId: w.id, channel: sms ? "sms" : "email", kind: "bench", to: sms ? w.phone_e164 : w.email, subject: sms ? null : "Bench", body: `Benchmark message ${i}`, dedupeKey: `${tag}:${i}` };
    });
    await enqueue(db, rows);
    // Providers stubbed: the outbox's own cost (claims with SKIP LOCKED, state updates).
    let sid = 0;
    const sms = { send: async () => ({ sid: `SMbench${++sid}`, status: "queued" }), findSent: async () => [] };
    const email = { send: async () => ({ messageId: `<bench${++sid}@bench.invalid>`, response: "250 OK" }) };
    const t = performance.now();
    let sent = 0;
    for (let i = 0; i < 1000; i++) {
      const r = await drainOnce(db, { limit: 100, concurrency: 10, sms, email });
      sent += r.sent;
      if (r.claimed === 0) break;
    }
    const s = (performance.now() - t) / 1000;
    await db("notifications").where("dedupe_key", "like", `${tag}:%`).delete();
    return { measured: true, messages: n, sent, seconds: round(s, 2), perSecond: round(sent / s, 0), note: "drainOnce, limit 100, concurrency 10, providers stubbed" };
  } catch (err) {
    return { measured: false, note: `not measured: ${(err as Error).message.slice(0, 300)}` };
  } finally {
    await db.destroy();
  }
}

// --- the table --------------------------------------------------------------------------------------
function table(r: Record<string, any>) {
  const rows: Array<[string, string, string, string]> = [];
  const ok = (b: boolean) => (b ? "met" : "MISSED");
  rows.push(["full rule check (median / p95)", `${r.rules.fullCheckMs.p50} / ${r.rules.fullCheckMs.p95} ms`, "< 50 ms", ok(r.rules.fullCheckMs.p50 < 50)]);
  rows.push(["single-drop re-check (median / p95)", `${r.rules.recheckMs.p50} / ${r.rules.recheckMs.p95} ms`, "< 2 ms", ok(r.rules.recheckMs.p50 < 2)]);
  if (r.fill) {
    const f = r.fill;
    const aim = fillAim(f);
    rows.push(["fill: time (wall)", `${(f.wallMs / 1000).toFixed(1)} s (CPU ${(f.cpuMs / 1000).toFixed(1)} s; HiGHS load ${f.highsLoadMs} ms, once)`, "≤ 10 s", ok(aim.timeOk)]);
    const gapText = f.gap === null ? "none" : `${(f.gap * 100).toFixed(2)} %${f.size.pricingConverged || f.size.complete ? "" : " (bound not closed: pricing stopped at the limit)"}`;
    rows.push(["fill: status / gap", `${f.status}${f.optimal ? " (proven)" : ""} / ${gapText}`, "≤ 1 %", ok(aim.gapOk)]);
    rows.push(["fill: aim (≤ 10 s at ≤ 1 % gap)", aim.met ? "both phases within the time, gap proven" : aim.line.replace(/^.*?— /, ""), "met", aim.met ? "met" : "NOT MET"]);
    rows.push(["fill: positions filled", `${f.positionsFilled} of ${f.openSeats} open (${f.ordersStaffed} orders staffed, ${f.ordersLeftOpen} left)`, "", ""]);
  }
  if (r.api.skipped) rows.push(["API", r.api.skipped, "", "skipped"]);
  else {
    const a = r.api;
    rows.push(["GET /api/health (p50 / p95)", `${a.healthMs.p50} / ${a.healthMs.p95} ms (${a.healthMs.rps} req/s)`, "", ""]);
    rows.push(["GET /api/board (p50 / p95)", `${a.boardMs.p50} / ${a.boardMs.p95} ms (${a.boardMs.rps} req/s, ${a.boardMs.non2xx} non-2xx)`, "≤ 3× health p95", `${a.boardToHealthP95}× ${ok(a.boardToHealthP95 <= 3)}`]);
    rows.push([`GET /api/board slim: a patch for an open board (p50 / p95)`, `${a.boardSlimMs.p50} / ${a.boardSlimMs.p95} ms (${a.boardSlimMs.rps} req/s; ${a.boardSlimBytes} bytes, ${a.boardSlimAnswer})`, "≤ 3× health p95", `${a.boardSlimToHealthP95}× ${ok(a.boardSlimToHealthP95 <= 3)}`]);
    rows.push(["drop: place + take off, /api/assignments (p50 / p95)", `${a.dropMs.p50} / ${a.dropMs.p95} ms (${a.dropMs.rps} req/s, ${a.dropMs.non2xx} non-2xx)`, "≤ 2× health p95", `${a.dropToHealthP95}× ${ok(a.dropToHealthP95 <= 2)}`]);
  }
  rows.push(["notification drain", r.drain.measured ? `${r.drain.perSecond} messages/s (${r.drain.sent} in ${r.drain.seconds} s)` : r.drain.note, "", ""]);
  const w = [0, 1, 2, 3].map((i) => Math.max(...rows.map((x) => x[i].length), ["measure", "value", "aim", "result"][i].length));
  const line = (x: string[]) => `| ${x.map((c, i) => c.padEnd(w[i])).join(" | ")} |`;
  return [line(["measure", "value", "aim", "result"]), `|${w.map((n) => "-".repeat(n + 2)).join("|")}|`, ...rows.map(line)].join("\n");
}

async function main() {
  const started = new Date();
  log(`scenario: ${opts.workers} workers, ${opts.orders} orders, ${opts.days} days, seed ${opts.seed}; load average ${loadavg().map((x) => x.toFixed(1)).join(" ")} on ${cpus().length} CPUs`);
  log("crew rules");
  const rules = benchRules();
  let fillResult: Awaited<ReturnType<typeof benchFill>> | null = null;
  if (!flag("skip-fill")) {
    log(`fill open positions (time limit ${opts.fillLimit} s, gap ${opts.fillGap * 100} %)`);
    fillResult = await benchFill();
    log(fillAim(fillResult).line);
  }
  let api: Record<string, unknown>;
  if (flag("skip-api")) api = { skipped: "--skip-api: the API part was not measured" };
  else {
    try {
      api = await benchApi();
    } catch (err) {
      api = { skipped: `the API part failed: ${(err as Error).message.slice(0, 600)}` };
    }
  }
  const drain = await benchDrain();
  const result = {
    startedAt: started.toISOString(),
    machine: { cpus: cpus().length, model: cpus()[0]?.model, node: process.version, loadAverage: loadavg().map((x) => round(x, 2)) },
    scenario: { workers: opts.workers, orders: opts.orders, days: opts.days, seed: opts.seed, yards: 2 },
    rules,
    fill: fillResult,
    api,
    drain,
  };
  const out = table(result);
  console.log(out);
  const dir = path.join(ROOT, "bench", "results");
  mkdirSync(dir, { recursive: true });
  const stamp = started.toISOString().replace(/[:.]/g, "-");
  const json = JSON.stringify({ ...result, table: out.split("\n") }, null, 2);
  writeFileSync(path.join(dir, `${stamp}.json`), json);
  writeFileSync(path.join(dir, "latest.json"), json);
  log(`written bench/results/${stamp}.json and bench/results/latest.json`);
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
