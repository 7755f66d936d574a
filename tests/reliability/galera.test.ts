// Scaled out for real (issue 17, README "Scaling out"): a three-node MariaDB Galera cluster on
// loopback (scripts/cluster, Debian's mariadb-server + galera-4) and three `next start`
// instances of the suite's build, one per node (DB_HOSTS with its own node first).
//   1. races: 50 pairs racing one worker and one truck into two overlapping orders, each pair's
//      two requests on different instances, and 50 pairs racing two workers into one seat
//      → 0 double bookings persisted, every refusal a 409, no 5xx;
//   2. Send crews from two instances at once, delivery loops on all three → every message
//      delivered exactly once, counted at the SMS and e-mail fakes;
//   3. one node killed (SIGKILL) under a request loop → its instance answers through another
//      node within 5 s; the node rejoins (IST) and the boards are equal on all three;
//   4. one node frozen (SIGSTOP, then SIGCONT) → every request answers (200, or 503 within the
//      statement time-out), none hangs;
//   5. the same race against the single-server set-up (the suite's database) stays green.
// Facts this relies on (docs.mariadb.com "Galera Cluster" / "Certification-based replication",
// and measured here, /work/shared/NOTES.md): SELECT … FOR UPDATE locks only on its own node;
// two transactions on two nodes that write the same row or unique key: the later one to
// certify fails with error 1213 at commit.
import { execFile, spawnSync } from "node:child_process";
import { existsSync, rmSync } from "node:fs";
import path from "node:path";
import { promisify } from "node:util";
import knex, { type Knex } from "knex";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { dbConfig } from "@/knexfile";
import { account, Client, type DemoRole } from "../support/client";
import { makeOrder, removeMadeOrders } from "../support/fixtures";
import { makeCrewDay } from "../support/notify";
import { startMailFake } from "../../scripts/fakes/mail";
import { startSmsFake } from "../../scripts/fakes/sms";
import { freePort, ROOT, sleep, startApp, type AppInstance } from "../support/spawn";
import { smsAuthToken } from "../support/secrets";

const run = promisify(execFile);
const PROVIDER = "/usr/lib/galera/libgalera_smm.so";
const CLUSTER = path.join(ROOT, "scripts/cluster");
const STATEMENT_TIMEOUT_MS = 3000;

// Galera must be there (scripts/cluster installs it when missing, as root); skipped, saying
// why, only when it cannot be installed on this machine.
let skipReason: string | null = null;
if (!existsSync(PROVIDER)) {
  const r = spawnSync(CLUSTER, ["install"], { encoding: "utf8", timeout: 600_000 });
  if (!existsSync(PROVIDER)) skipReason = `Galera could not be installed (${PROVIDER} missing): ${(r.stderr || r.stdout || "").trim().slice(-300)}`;
}
if (skipReason) console.log(`[galera] SKIPPED: ${skipReason}`);

// --- shared race -------------------------------------------------------------------------------

interface Race {
  pairs: number;
  seatPairs: number;
  truckPairs: number;
  statuses: Record<string, number>;
  doubles: number;
  truckDoubles: number;
  ms: number;
  days: string[];
}

async function signedIn(base: string, role: DemoRole = "dispatcher") {
  const c = new Client(base);
  const a = account(role, role === "dispatcher" ? "dispatch@cedarprairie.example" : undefined);
  const r = await c.signIn(a.email, a.password);
  if (!r.signedIn) throw new Error(`sign-in as ${role} on ${base} failed: ${r.status}`);
  return c;
}

/** Persisted double bookings among live assignments on these days (a worker on two overlapping orders). */
async function doubleBookings(q: Knex, days: string[]) {
  const r = await q("assignments as a1")
    .join("work_orders as o1", "o1.id", "a1.work_order_id")
    .join("assignments as a2", function () {
      this.on("a2.worker_id", "=", "a1.worker_id").andOn("a2.id", ">", "a1.id");
    })
    .join("work_orders as o2", "o2.id", "a2.work_order_id")
    .whereNotNull("a1.holds_position")
    .whereNotNull("a2.holds_position")
    .whereIn("o1.work_date", days)
    .whereRaw("o1.start_at < o2.end_at and o2.start_at < o1.end_at")
    .whereNot("o1.status", "cancelled")
    .whereNot("o2.status", "cancelled")
    .count({ n: "*" })
    .first();
  return Number(r?.n);
}

async function truckDoubleBookings(q: Knex, days: string[]) {
  const r = await q("equipment_assignments as e1")
    .join("work_orders as o1", "o1.id", "e1.work_order_id")
    .join("equipment_assignments as e2", function () {
      this.on("e2.equipment_id", "=", "e1.equipment_id").andOn("e2.id", ">", "e1.id");
    })
    .join("work_orders as o2", "o2.id", "e2.work_order_id")
    .whereIn("o1.work_date", days)
    .whereRaw("o1.start_at < o2.end_at and o2.start_at < o1.end_at")
    .whereNot("o1.status", "cancelled")
    .whereNot("o2.status", "cancelled")
    .count({ n: "*" })
    .first();
  return Number(r?.n);
}

/**
 * The race. Worker/truck pairs: day d of 5 has 10 pairs of overlapping orders (07:00–15:30);
 * pair i races worker w_i into both orders' seats and truck t_i onto both orders. Seat pairs:
 * 3 more days, one seat each, two different workers. Each pair's two requests go to two
 * different instances at the same moment; a day's pairs all run at once.
 */
async function race(q: Knex, clients: Client[], offset: number, tag: string, settle: () => Promise<void>): Promise<Race> {
  const workers = (await q("workers").where({ active: true }).orderBy("id").limit(40).pluck("id")).map(Number);
  expect(workers.length).toBeGreaterThanOrEqual(40);
  const y = await q("yards").where({ code: "NOR" }).first();
  // Trucks of the test's own (unique unit numbers), so the demo fleet is untouched.
  const trucks: number[] = [];
  for (let t = 0; t < 10; t++) {
    const [id] = await q("equipment").insert({
      organisation_id: y.organisation_id,
      yard_id: y.id,
      kind: "bucket_truck",
      unit_number: `R${tag}${t}`.slice(0, 20),
      name: `Race truck ${t}`,
      insulated: true,
    });
    trucks.push(Number(id));
  }
  type Pair = { kind: "worker" | "truck" | "seat"; reqs: { inst: number; path: string; body: Record<string, number> }[] };
  const waves: Pair[][] = [];
  const days: string[] = [];
  const n = clients.length;
  let k = 0;
  for (let d = 0; d < 5; d++) {
    const wave: Pair[] = [];
    for (let i = 0; i < 10; i++, k++) {
      const o1 = await makeOrder(q, { offsetDays: offset + d, positions: ["ground"], workType: "patrol", energized: false });
      const o2 = await makeOrder(q, { offsetDays: offset + d, positions: ["ground"], workType: "patrol", energized: false });
      if (!days.includes(o1.day)) days.push(o1.day);
      const w = workers[i];
      wave.push({
        kind: "worker",
        reqs: [
          { inst: k % n, path: "/api/assignments", body: { positionId: o1.positionIds.ground, workerId: w } },
          { inst: (k + 1) % n, path: "/api/assignments", body: { positionId: o2.positionIds.ground, workerId: w } },
        ],
      });
      wave.push({
        kind: "truck",
        reqs: [
          { inst: (k + 1) % n, path: "/api/equipment-assignments", body: { workOrderId: o1.id, equipmentId: trucks[i] } },
          { inst: (k + 2) % n, path: "/api/equipment-assignments", body: { workOrderId: o2.id, equipmentId: trucks[i] } },
        ],
      });
    }
    waves.push(wave);
  }
  for (let d = 0; d < 3; d++) {
    const wave: Pair[] = [];
    const count = d < 2 ? 20 : 10;
    for (let i = 0; i < count; i++, k++) {
      const o = await makeOrder(q, { offsetDays: offset + 5 + d, positions: ["ground"], workType: "patrol", energized: false });
      if (!days.includes(o.day)) days.push(o.day);
      wave.push({
        kind: "seat",
        reqs: [
          { inst: k % n, path: "/api/assignments", body: { positionId: o.positionIds.ground, workerId: workers[2 * i] } },
          { inst: (k + 1) % n, path: "/api/assignments", body: { positionId: o.positionIds.ground, workerId: workers[2 * i + 1] } },
        ],
      });
    }
    waves.push(wave);
  }
  await settle(); // every node has the orders before the race starts

  const statuses: Record<string, number> = {};
  const bad: string[] = [];
  let pairs = 0;
  let seatPairs = 0;
  let truckPairs = 0;
  const started = Date.now();
  for (const wave of waves) {
    await Promise.all(
      wave.map(async (p) => {
        const rs = await Promise.all(p.reqs.map((r) => clients[r.inst].json(r.path, "POST", r.body)));
        for (const r of rs) statuses[r.status] = (statuses[r.status] ?? 0) + 1;
        const won = rs.filter((r) => r.status === 201).length;
        const refused = rs.filter((r) => r.status === 409).length;
        if (won !== 1 || refused !== 1) bad.push(`${p.kind} ${JSON.stringify(p.reqs.map((r) => r.body))}: ${rs.map((r) => `${r.status} ${JSON.stringify(r.body).slice(0, 160)}`).join(" | ")}`);
        if (p.kind === "worker") pairs++;
        else if (p.kind === "truck") truckPairs++;
        else seatPairs++;
      }),
    );
  }
  const ms = Date.now() - started;
  const result = { pairs, seatPairs, truckPairs, statuses, doubles: await doubleBookings(q, days), truckDoubles: await truckDoubleBookings(q, days), ms, days };
  console.log(`[galera] race ${tag}: ${JSON.stringify(result)}`);
  expect(bad.slice(0, 5), `${bad.length} pairs without exactly one 201 and one 409`).toEqual([]);
  expect(Object.keys(statuses).filter((s) => Number(s) >= 500)).toEqual([]);
  expect(result.doubles).toBe(0);
  expect(result.truckDoubles).toBe(0);
  expect(pairs).toBe(50);
  expect(truckPairs).toBe(50);
  expect(seatPairs).toBe(50);
  await q("equipment_assignments").whereIn("equipment_id", trucks).delete();
  await q("equipment").whereIn("id", trucks).delete();
  return result;
}

// --- the cluster -------------------------------------------------------------------------------

const DB_NAME = "gaffline_cluster_test";
const GALERA_DIR = path.join(ROOT, ".data/galera-test");
let env: Record<string, string> = {};
let sqlPorts: number[] = [];
const apps: AppInstance[] = [];
let clients: Client[] = [];
let node1: Knex;
let nodes: Knex[] = [];
// Fakes of this file's own (free ports), so another test driving the shared fakes' faults
// cannot hold back or disturb the deliveries counted here.
let fakes: { close: () => Promise<unknown> }[] = [];
let smsBase = "";
let mailBase = "";

async function fakeTexts(to: string): Promise<{ to: string; body: string }[]> {
  return ((await (await fetch(`${smsBase}/_fake/messages?to=${encodeURIComponent(to)}`)).json()) as { messages: { to: string; body: string }[] }).messages;
}
async function fakeMails(to: string): Promise<{ messageId: string }[]> {
  return ((await (await fetch(`${mailBase}/api/messages?to=${encodeURIComponent(to)}`)).json()) as { messages: { messageId: string }[] }).messages;
}

async function cluster(...args: string[]) {
  const r = await run(CLUSTER, args, { env: { ...process.env, ...env } as NodeJS.ProcessEnv, timeout: 300_000 });
  return r.stdout.trim();
}

function nodeDb(port: number) {
  const base = dbConfig({ database: DB_NAME });
  return knex({ ...base, connection: { ...(base.connection as object), port }, pool: { min: 0, max: 4 } });
}

async function health(c: Client) {
  try {
    return (await c.json("/api/health?stats=1")).body as { db: string; port?: number; conflictRetries?: number; conflictsGivenUp?: number; failovers?: number; statementTimeouts?: number };
  } catch {
    return { db: "unreachable" };
  }
}

/**
 * Every array in canonical order. Two nodes may hand back the rows of one query without an
 * ORDER BY in different orders (each node's own optimiser statistics), and the board lists
 * findings in the order it gathered them: equal boards, compared as sets.
 */
function canonical(v: unknown): unknown {
  if (Array.isArray(v)) return v.map(canonical).sort((a, b) => (JSON.stringify(a) < JSON.stringify(b) ? -1 : JSON.stringify(a) > JSON.stringify(b) ? 1 : 0));
  if (v && typeof v === "object") return Object.fromEntries(Object.entries(v).map(([k, x]) => [k, canonical(x)]));
  return v;
}

async function boardOn(c: Client, day: string) {
  const r = await c.json(`/api/board?yard=NOR&date=${day}`);
  if (r.status !== 200) return { status: r.status };
  const { generatedAt: _g, ...rest } = r.body;
  return canonical(rest);
}

async function synced(port: number) {
  const out = (await cluster("status").catch((e) => String(e.stdout ?? ""))).split("\n");
  const line = out.find((l) => l.includes(`:${port}`)) ?? "";
  return /size 3\s+Synced/.test(line);
}

describe.skipIf(Boolean(skipReason))("three instances on a three-node Galera cluster", () => {
  beforeAll(async () => {
    const ports: number[] = [];
    while (ports.length < 15) {
      const p = await freePort();
      if (!ports.includes(p)) ports.push(p);
    }
    sqlPorts = ports.slice(0, 3);
    env = {
      GALERA_DIR,
      GALERA_SQL_PORTS: sqlPorts.join(","),
      GALERA_GROUP_PORTS: ports.slice(3, 6).join(","),
      GALERA_IST_PORTS: ports.slice(6, 9).join(","),
      GALERA_SST_PORTS: ports.slice(9, 12).join(","),
      GALERA_CLUSTER_NAME: "gaffline-test",
      DB_NAME,
    };
    // A fresh cluster each run: stop what an earlier run of ours may have left, then start.
    await cluster("stop").catch(() => undefined);
    rmSync(GALERA_DIR, { recursive: true, force: true });
    const t0 = Date.now();
    await cluster("start");
    const tUp = Date.now() - t0;
    const dbEnv: NodeJS.ProcessEnv = { ...process.env, DB_NAME, DB_PORT: String(sqlPorts[0]), DB_HOST: "127.0.0.1" };
    delete dbEnv.DB_HOSTS;
    await run(process.execPath, ["--import", "tsx", "scripts/db.ts", "migrate"], { env: dbEnv, timeout: 120_000 });
    await run(process.execPath, ["--import", "tsx", "scripts/db.ts", "seed"], { env: dbEnv, timeout: 120_000 });
    const [smsPort, smtpPort, mailPort] = ports.slice(12, 15);
    const sms = await startSmsFake({
      port: smsPort,
      accountSid: process.env.TWILIO_ACCOUNT_SID ?? "AC00000000000000000000000000000000",
      authToken: smsAuthToken(), // the installation's token (tests/support/secrets.ts); no default in the repository
      fromNumber: process.env.TWILIO_FROM_NUMBER ?? "+13205550199",
      log: () => undefined,
    });
    const mail = await startMailFake({ smtpPort, httpPort: mailPort, log: () => undefined });
    fakes = [sms, mail];
    smsBase = `http://127.0.0.1:${smsPort}`;
    mailBase = `http://127.0.0.1:${mailPort}`;
    const fakeEnv = { TWILIO_API_BASE: smsBase, SMS_FAKE_PORT: String(smsPort), SMTP_PORT: String(smtpPort), MAIL_FAKE_HTTP_PORT: String(mailPort) };
    node1 = nodeDb(sqlPorts[0]);
    nodes = sqlPorts.map(nodeDb);
    const hostsFrom = (i: number) => [0, 1, 2].map((k) => `127.0.0.1:${sqlPorts[(i + k) % 3]}`).join(",");
    apps.push(
      ...(await Promise.all(
        [0, 1, 2].map((i) => startApp({ env: { DB_NAME, DB_HOSTS: hostsFrom(i), DB_STATEMENT_TIMEOUT_MS: String(STATEMENT_TIMEOUT_MS), ...fakeEnv }, timeoutMs: 120_000 })),
      )),
    );
    clients = await Promise.all(apps.map((a) => signedIn(a.url)));
    console.log(`[galera] cluster up in ${tUp} ms (SQL ports ${sqlPorts.join(", ")}); instances ${apps.map((a) => a.port).join(", ")}`);
  }, 300_000);

  afterAll(async () => {
    for (const [i, a] of apps.entries()) {
      const lines = a.log().split("\n").filter((l) => /unexpected error|\[db\]|\[outbox\]/.test(l));
      if (lines.length) console.log(`[galera] instance ${i + 1} logged:\n${lines.slice(0, 15).join("\n")}`);
    }
    await Promise.all(apps.map((a) => a.stop()));
    // Forget the orders made on the cluster (it is thrown away), so the single-server part's
    // clean-up never deletes ids from the wrong database.
    if (node1) await removeMadeOrders(node1).catch(() => undefined);
    await Promise.all(nodes.map((n) => n.destroy()));
    await node1?.destroy();
    await Promise.allSettled(fakes.map((f) => f.close()));
    await cluster("stop").catch(() => undefined);
    rmSync(GALERA_DIR, { recursive: true, force: true });
  }, 120_000);

  it("each instance works through its own node", async () => {
    // Under the start-up load a first handshake may miss its time-out and land on the next
    // node; a connection on another node than the first is replaced after 15 s (lib/db.ts).
    const t0 = Date.now();
    let hs = await Promise.all(clients.map(health));
    while (hs.some((h, i) => h.port !== sqlPorts[i]) && Date.now() - t0 < 30_000) {
      await sleep(500);
      hs = await Promise.all(clients.map(health));
    }
    console.log(`[galera] instances on ports ${hs.map((h) => h.port).join(", ")} after ${Date.now() - t0} ms; failovers at start ${hs.map((h) => h.failovers).join("/")}`);
    expect(hs.map((h) => h.port)).toEqual(sqlPorts);
  }, 40_000);

  it("races across nodes: 0 double bookings, every refusal a 409, no 5xx", async () => {
    const before = await Promise.all(clients.map(health));
    const r = await race(node1, clients, 200, "g", async () => {
      // Galera applies on the other nodes a moment after the commit: wait until they have them.
      const want = Number((await node1("work_orders").count({ n: "*" }).first())?.n);
      for (let i = 0; i < 50; i++) {
        const counts = await Promise.all(nodes.map(async (n) => Number((await n("work_orders").count({ n: "*" }).first())?.n)));
        if (counts.every((c) => c === want)) return;
        await sleep(100);
      }
    });
    const after = await Promise.all(clients.map(health));
    const retries = after.reduce((s, h, i) => s + (h.conflictRetries ?? 0) - (before[i].conflictRetries ?? 0), 0);
    const givenUp = after.reduce((s, h, i) => s + (h.conflictsGivenUp ?? 0) - (before[i].conflictsGivenUp ?? 0), 0);
    console.log(`[galera] race figures: ${r.pairs} worker pairs, ${r.truckPairs} truck pairs, ${r.seatPairs} seat pairs in ${r.ms} ms; statuses ${JSON.stringify(r.statuses)}; ${r.doubles} double bookings, ${r.truckDoubles} truck double bookings; ${retries} conflict retries, ${givenUp} given up`);
    // The same on every node: the placements made, and no double booking.
    const placed = await Promise.all(nodes.map(async (n) => Number((await n("assignments as a").join("work_orders as o", "o.id", "a.work_order_id").whereIn("o.work_date", r.days).whereNotNull("a.holds_position").count({ n: "*" }).first())?.n)));
    expect(placed).toEqual([100, 100, 100]); // 50 worker pairs + 50 seat pairs, one winner each
    for (const n of nodes) {
      expect(await doubleBookings(n, r.days)).toBe(0);
      expect(await truckDoubleBookings(n, r.days)).toBe(0);
    }
  }, 240_000);

  it("Send crews from two instances at once, delivery loops on all three: every message delivered exactly once", async () => {
    // A yard-day of its own: 12 patrols, a lead and a ground hand each, all drafts.
    const withPhone = (await node1("workers").where({ active: true, sms_opt_in: true }).whereNotNull("phone_e164").whereNotNull("email").orderBy("id").limit(24).pluck("employee_no")) as string[];
    expect(withPhone.length).toBe(24);
    let day = "";
    const orderIds: number[] = [];
    for (let i = 0; i < 12; i++) {
      const d = await makeCrewDay(node1, {
        offsetDays: 230,
        keepDay: i > 0,
        crew: [
          { position: "lead", employeeNo: withPhone[2 * i] },
          { position: "ground", employeeNo: withPhone[2 * i + 1] },
        ],
      });
      day = d.day;
      orderIds.push(d.orderId);
    }
    await sleep(500);
    const before = await Promise.all(clients.map(health));
    const t0 = Date.now();
    const [s1, s2] = await Promise.all([clients[0].json("/api/send", "POST", { date: day, yard: "NOR" }), clients[1].json("/api/send", "POST", { date: day, yard: "NOR" })]);
    expect([s1.status, s2.status], JSON.stringify([s1.body, s2.body])).toEqual([200, 200]);
    // Together they told every assignment once.
    expect(Number(s1.body.assignments) + Number(s2.body.assignments)).toBe(24);
    const aIds = (await node1("assignments").whereIn("work_order_id", orderIds).pluck("id")).map(Number);
    let rows: { id: number; channel: string; to_address: string; body: string; message_key: string | null; state: string }[] = [];
    for (let i = 0; i < 120; i++) {
      rows = await node1("notifications").whereIn("assignment_id", aIds).select("id", "channel", "to_address", "body", "message_key", "state", "attempts", "last_error");
      if (rows.length && rows.every((r) => r.state === "sent" || r.state === "failed")) break;
      await sleep(250);
    }
    const deliveredMs = Date.now() - t0;
    expect(Number(s1.body.messages) + Number(s2.body.messages)).toBe(48); // 24 people × (a text + an e-mail)
    expect(rows.length).toBe(48);
    expect(rows.filter((r) => r.state !== "sent").map((r) => ({ ...r, body: r.body.slice(0, 40) }))).toEqual([]);
    // Counted at the fakes: each message exactly once.
    const counts: number[] = [];
    for (const r of rows) {
      if (r.channel === "sms") counts.push((await fakeTexts(r.to_address)).filter((m) => m.body === r.body).length);
      else counts.push((await fakeMails(r.to_address)).filter((m) => m.messageId === r.message_key).length);
    }
    const after = await Promise.all(clients.map(health));
    const retries = after.map((h, i) => (h.conflictRetries ?? 0) - (before[i].conflictRetries ?? 0));
    const parts = (await node1("notifications").whereIn("id", rows.map((r) => r.id)).select(node1.raw("MOD(CRC32(id), 3) as p"))) as { p: number }[];
    const partitions = [0, 1, 2].map((p) => parts.filter((r) => Number(r.p) === p).length);
    console.log(
      `[galera] send: two sends answered ${s1.status}/${s2.status} telling ${s1.body.assignments}+${s2.body.assignments} assignments; ${rows.length} messages all sent within ${deliveredMs} ms; ` +
        `deliveries per message at the fakes: ${JSON.stringify([...counts.reduce((m, c) => m.set(c, (m.get(c) ?? 0) + 1), new Map<number, number>())])}; rows per partition ${partitions.join("/")}; conflict retries per instance ${retries.join("/")}`,
    );
    expect(counts.every((c) => c === 1), JSON.stringify(counts)).toBe(true);
  }, 120_000);

  it("a node killed under load: its instance answers through another node within 5 s; it rejoins and the boards agree", async () => {
    const day = (await node1("work_orders").where("number", "like", "T-%").orderBy("id", "desc").first("work_date")).work_date as string;
    type Hit = { inst: number; at: number; ms: number; status: number | string; port?: number };
    const hits: Hit[] = [];
    let stop = false;
    const t0 = Date.now();
    const loop = async (inst: number) => {
      for (let i = 0; !stop; i++) {
        const started = Date.now();
        let status: number | string;
        let port: number | undefined;
        try {
          if (i % 2 === 0) {
            const r = await clients[inst].fetch(`/api/board?yard=NOR&date=${day}`, { signal: AbortSignal.timeout(15_000) });
            status = r.status;
            await r.arrayBuffer();
          } else {
            const r = await clients[inst].fetch("/api/health?stats=1", { signal: AbortSignal.timeout(15_000) });
            status = r.status;
            port = ((await r.json()) as { port?: number }).port;
          }
        } catch (err) {
          status = (err as Error).name;
        }
        hits.push({ inst, at: started - t0, ms: Date.now() - started, status, port });
        await sleep(100);
      }
    };
    const load = Promise.all([0, 1, 2].map(loop));
    await sleep(1_500);
    const pid = Number(await cluster("pid", "1"));
    const killedAt = Date.now() - t0;
    process.kill(pid, "SIGKILL");
    // Instance 1 (node 1's) answers 200 again, through another node.
    let backAt: number | null = null;
    while (Date.now() - t0 - killedAt < 10_000) {
      const ok = hits.find((h) => h.inst === 0 && h.at >= killedAt && h.status === 200 && h.port !== undefined && h.port !== sqlPorts[0]);
      if (ok) {
        backAt = ok.at + ok.ms;
        break;
      }
      await sleep(100);
    }
    await sleep(2_000);
    // Rejoin: IST from a running node.
    const r0 = Date.now();
    await cluster("node-start", "1");
    const rejoinMs = Date.now() - r0;
    await sleep(1_000);
    stop = true;
    await load;
    const afterKill = hits.filter((h) => h.at >= killedAt);
    const summary = (hs: Hit[]) => [...hs.reduce((m, h) => m.set(String(h.status), (m.get(String(h.status)) ?? 0) + 1), new Map<string, number>())].map(([s, c]) => `${s}×${c}`).join(" ");
    console.log(
      `[galera] node 1 killed: instance 1 answered through :${afterKill.find((h) => h.inst === 0 && h.port && h.port !== sqlPorts[0])?.port} ${backAt === null ? "never" : `${backAt - killedAt} ms`} after the kill; ` +
        `after the kill instance 1 ${summary(afterKill.filter((h) => h.inst === 0))}, instance 2 ${summary(afterKill.filter((h) => h.inst === 1))}, instance 3 ${summary(afterKill.filter((h) => h.inst === 2))}; node 1 rejoined in ${rejoinMs} ms`,
    );
    expect(backAt).not.toBeNull();
    expect(backAt! - killedAt).toBeLessThan(5_000);
    expect(hits.filter((h) => typeof h.status !== "number")).toEqual([]);
    expect(afterKill.filter((h) => h.status !== 200 && h.status !== 503)).toEqual([]);
    expect(afterKill.filter((h) => h.inst !== 0 && h.status !== 200)).toEqual([]);

    // A write through instance 1 after the rejoin, then the same board on all three within 5 s.
    const o = await makeOrder(node1, { offsetDays: 200, positions: ["ground"], workType: "patrol", energized: false });
    await sleep(300);
    const free = (await node1("workers").where({ active: true }).orderBy("id", "desc").first("id")).id as number;
    const w = await clients[0].json("/api/assignments", "POST", { positionId: o.positionIds.ground, workerId: free });
    expect([201, 409]).toContain(w.status);
    const since = Date.now();
    let boards: unknown[] = [];
    for (;;) {
      boards = await Promise.all(clients.map((c) => boardOn(c, o.day)));
      if (boards.every((b) => JSON.stringify(b) === JSON.stringify(boards[0])) && (boards[0] as { status?: number }).status === undefined) break;
      if (Date.now() - since > 5_000) break;
      await sleep(200);
    }
    console.log(`[galera] boards equal on all three instances ${Date.now() - since} ms after the rejoin's write`);
    expect(boards[1]).toEqual(boards[0]);
    expect(boards[2]).toEqual(boards[0]);
    // And the data agrees node by node.
    const perNode = await Promise.all(nodes.map(async (n) => Number((await n("assignments").count({ n: "*" }).first())?.n)));
    expect(new Set(perNode).size, perNode.join(",")).toBe(1);
  }, 180_000);

  it("a frozen node (SIGSTOP, then SIGCONT): every request answers, 503 within the time-out at worst, none hangs", async () => {
    const day = (await node1("work_orders").where("number", "like", "T-%").orderBy("id", "desc").first("work_date")).work_date as string;
    const HANG_MS = 20_000;
    const BOUND_MS = STATEMENT_TIMEOUT_MS + 2_000 /* client-side query bound */ + 2 * 2_500 /* connect attempts */ + 2_000; // slack for 2 shared cores
    type Hit = { inst: number; at: number; ms: number; status: number | string; body: string };
    const hits: Hit[] = [];
    let stop = false;
    const t0 = Date.now();
    const loop = async (inst: number) => {
      for (let i = 0; !stop; i++) {
        const started = Date.now();
        let status: number | string;
        let body = "";
        try {
          const r = await clients[inst].fetch(i % 2 === 0 ? `/api/board?yard=NOR&date=${day}` : "/api/health?stats=1", { signal: AbortSignal.timeout(HANG_MS) });
          status = r.status;
          body = (await r.text()).slice(0, 300);
        } catch (err) {
          status = (err as Error).name;
        }
        hits.push({ inst, at: started - t0, ms: Date.now() - started, status, body });
        await sleep(100);
      }
    };
    const load = Promise.all([0, 1, 2].map(loop));
    await sleep(1_000);
    const pid = Number(await cluster("pid", "2"));
    const frozenAt = Date.now() - t0;
    process.kill(pid, "SIGSTOP");
    await sleep(10_000);
    process.kill(pid, "SIGCONT");
    const thawedAt = Date.now() - t0;
    await sleep(3_000);
    stop = true;
    await load;
    let back = false;
    for (let i = 0; i < 120 && !back; i++) {
      back = (await Promise.all(sqlPorts.map(synced))).every(Boolean);
      if (!back) await sleep(500);
    }
    const during = hits.filter((h) => h.at >= frozenAt && h.at < thawedAt);
    const summary = (hs: Hit[]) => [...hs.reduce((m, h) => m.set(String(h.status), (m.get(String(h.status)) ?? 0) + 1), new Map<string, number>())].map(([s, c]) => `${s}×${c}`).join(" ");
    console.log(
      `[galera] node 2 frozen 10 s: instance 2 ${summary(during.filter((h) => h.inst === 1))} (slowest ${Math.max(...during.filter((h) => h.inst === 1).map((h) => h.ms))} ms), ` +
        `instance 1 ${summary(during.filter((h) => h.inst === 0))} (slowest ${Math.max(...during.filter((h) => h.inst === 0).map((h) => h.ms))} ms), ` +
        `instance 3 ${summary(during.filter((h) => h.inst === 2))} (slowest ${Math.max(...during.filter((h) => h.inst === 2).map((h) => h.ms))} ms); bound ${BOUND_MS} ms; cluster synced again: ${back}`,
    );
    expect(hits.filter((h) => typeof h.status !== "number"), "no request hung").toEqual([]);
    expect(hits.filter((h) => h.status !== 200 && h.status !== 503).map((h) => `${h.status} ${h.body}`)).toEqual([]);
    for (const h of hits.filter((x) => x.status === 503)) expect(JSON.parse(h.body).error, h.body).toBeTruthy();
    expect(Math.max(...hits.map((h) => h.ms))).toBeLessThan(BOUND_MS);
    expect(during.filter((h) => h.inst === 1).length).toBeGreaterThan(2);
    expect(back, "all three nodes Synced again after SIGCONT").toBe(true);
  }, 180_000);
});

// --- the same race on one server -----------------------------------------------------------------

describe("the same race on the single-server set-up", () => {
  const single = knex(dbConfig());
  const own: AppInstance[] = [];
  afterAll(async () => {
    await Promise.all(own.map((a) => a.stop()));
    await removeMadeOrders(single);
    await single.destroy();
  }, 60_000);

  it("0 double bookings, every refusal a 409, no 5xx", async () => {
    // The suite's app (APP_URL) and one more instance, both on the one MariaDB.
    const env = { DB_HOSTS: "" };
    const urls: string[] = [];
    if (process.env.APP_URL) urls.push(process.env.APP_URL);
    while (urls.length < 2) {
      const a = await startApp({ env });
      own.push(a);
      urls.push(a.url);
    }
    const cs = await Promise.all(urls.map((u) => signedIn(u)));
    const r = await race(single, cs, 260, "s", async () => undefined);
    console.log(`[galera] single server: ${r.pairs} worker pairs, ${r.truckPairs} truck pairs, ${r.seatPairs} seat pairs in ${r.ms} ms; statuses ${JSON.stringify(r.statuses)}; ${r.doubles} double bookings`);
  }, 240_000);
});
