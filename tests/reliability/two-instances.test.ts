// Two app instances on one MariaDB (PRODUCT.md "Where it runs": several stateless instances
// behind a load balancer). The test starts two `next start` of the suite's build on free ports
// (NEXT_DIST_DIR, default .next) and sends 50 conflicting placements split across both:
//   5 seat conflicts:   5 different workers for one open seat          → 1 winner, 4 × 409
//   5 worker conflicts: one worker for 5 overlapping orders' seats     → 1 winner, 4 × 409
// The database decides (row locks and versions in lib/assignments/data.ts), so there is one
// winner per conflict whichever instance each request reaches, no double booking is persisted,
// and both boards show the same crews within 5 s.
import knex from "knex";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { dbConfig } from "@/knexfile";
import { account, Client, type DemoRole } from "../support/client";
import { makeOrder, removeMadeOrders } from "../support/fixtures";
import { sleep, startApp, type AppInstance } from "../support/spawn";

const db = knex(dbConfig());
const apps: AppInstance[] = [];
const OFFSET = 240; // days out: the test's own day, far from the demo's tomorrow
let day = "";

async function signedIn(base: string, role: DemoRole) {
  const c = new Client(base);
  const a = account(role, role === "dispatcher" ? "dispatch@cedarprairie.example" : undefined);
  const r = await c.signIn(a.email, a.password);
  if (!r.signedIn) throw new Error(`sign-in as ${role} on ${base} failed: ${r.status}`);
  return c;
}

beforeAll(async () => {
  apps.push(...(await Promise.all([startApp(), startApp()])));
}, 120_000);

afterAll(async () => {
  for (const [i, a] of apps.entries()) {
    const errors = a.log().split("\n").filter((l) => /unexpected error|Error:|code: '/.test(l));
    if (errors.length) console.log(`[two-instances] instance ${"AB"[i]} logged:\n${errors.slice(0, 20).join("\n")}`);
  }
  await Promise.all(apps.map((a) => a.stop()));
  await removeMadeOrders(db);
  await db.destroy();
});

/** The board as both instances show it, without the moment it was generated. */
async function boardOn(c: Client) {
  const r = await c.json(`/api/board?yard=NOR&date=${day}`);
  expect(r.status).toBe(200);
  const { generatedAt: _g, ...rest } = r.body;
  return rest;
}

describe("two instances, one database", () => {
  it("50 conflicting placements across both: one winner per conflict, no double booking, the same board on both within 5 s", async () => {
    const [a, b] = apps;
    const clients = await Promise.all([signedIn(a.url, "dispatcher"), signedIn(a.url, "supervisor"), signedIn(b.url, "dispatcher"), signedIn(b.url, "supervisor")]);
    const workers = (await db("workers").where({ active: true }).orderBy("id").limit(30).pluck("id")).map(Number);
    expect(workers.length).toBe(30);

    // All on one day, 07:00–15:30: every order overlaps every other.
    const seatOrders = [];
    for (let i = 0; i < 5; i++) seatOrders.push(await makeOrder(db, { offsetDays: OFFSET, positions: ["lead"], workType: "patrol", energized: false }));
    const crewOrders = [];
    for (let i = 0; i < 5; i++) {
      const o = await makeOrder(db, { offsetDays: OFFSET, positions: ["lead"], workType: "patrol", energized: false });
      const seats: number[] = [];
      for (let k = 0; k < 5; k++) {
        const [id] = await db("positions").insert({ work_order_id: o.id, position: "ground", sort: k + 1 });
        seats.push(Number(id));
      }
      crewOrders.push({ ...o, seats });
    }
    day = seatOrders[0].day;

    type Req = { conflict: string; positionId: number; workerId: number };
    const reqs: Req[] = [];
    seatOrders.forEach((o, s) => {
      for (let k = 0; k < 5; k++) reqs.push({ conflict: `seat ${o.number}`, positionId: o.positionIds.lead, workerId: workers[s * 5 + k] });
    });
    for (let w = 0; w < 5; w++) {
      for (let o = 0; o < 5; o++) reqs.push({ conflict: `worker ${workers[25 + w]}`, positionId: crewOrders[o].seats[w], workerId: workers[25 + w] });
    }
    expect(reqs).toHaveLength(50);
    // Interleave the conflicts and spread them over both instances and both roles.
    const order = reqs.map((r, i) => ({ r, key: (i * 37) % 50 })).sort((x, y) => x.key - y.key).map((x) => x.r);

    const started = Date.now();
    const results = await Promise.all(
      order.map(async (r, i) => {
        const res = await clients[i % 4].json("/api/assignments", "POST", { positionId: r.positionId, workerId: r.workerId });
        return { ...r, status: res.status, body: res.body, instance: i % 4 < 2 ? "A" : "B" };
      }),
    );
    const elapsed = Date.now() - started;

    expect(results.filter((r) => r.status >= 500), JSON.stringify(results.filter((r) => r.status >= 500).map((r) => r.body))).toEqual([]);
    const byConflict = new Map<string, typeof results>();
    for (const r of results) byConflict.set(r.conflict, [...(byConflict.get(r.conflict) ?? []), r]);
    expect(byConflict.size).toBe(10);
    for (const [conflict, rs] of byConflict) {
      expect(rs.filter((r) => r.status === 201), conflict).toHaveLength(1);
      expect(rs.filter((r) => r.status === 409), `${conflict}: ${rs.map((r) => r.status).join(",")}`).toHaveLength(4);
    }
    // Both instances answered (each got 25 of the 50) and both produced winners.
    expect(new Set(results.filter((r) => r.status === 201).map((r) => r.instance)).size).toBe(2);

    // What is persisted: one live assignment per seat-conflict seat, one per contested worker,
    // and nobody on two of these (overlapping) orders.
    const orderIds = [...seatOrders, ...crewOrders].map((o) => o.id);
    const live = await db("assignments").whereIn("work_order_id", orderIds).whereNotNull("holds_position").select("work_order_id", "position_id", "worker_id");
    expect(live).toHaveLength(10);
    const perWorker = new Map<number, number>();
    for (const l of live) perWorker.set(l.worker_id, (perWorker.get(l.worker_id) ?? 0) + 1);
    expect([...perWorker.values()].every((n) => n === 1), JSON.stringify([...perWorker])).toBe(true);
    for (const o of seatOrders) expect(live.filter((l) => l.position_id === o.positionIds.lead)).toHaveLength(1);
    for (let w = 0; w < 5; w++) expect(live.filter((l) => l.worker_id === workers[25 + w])).toHaveLength(1);
    // The day as a whole: no worker on two overlapping live orders (DOUBLE_BOOKED never persisted).
    const doubles = await db("assignments as a1")
      .join("work_orders as o1", "o1.id", "a1.work_order_id")
      .join("assignments as a2", function () {
        this.on("a2.worker_id", "=", "a1.worker_id").andOn("a2.id", ">", "a1.id");
      })
      .join("work_orders as o2", "o2.id", "a2.work_order_id")
      .whereNotNull("a1.holds_position")
      .whereNotNull("a2.holds_position")
      .where("o1.work_date", day)
      .whereRaw("o1.start_at < o2.end_at and o2.start_at < o1.end_at")
      .whereNot("o1.status", "cancelled")
      .whereNot("o2.status", "cancelled")
      .count({ n: "*" })
      .first();
    expect(Number(doubles?.n)).toBe(0);

    // Both boards show the same state, with every winner, within 5 s.
    const since = Date.now();
    let last: [unknown, unknown] = [null, null];
    for (;;) {
      const [ba, bb] = await Promise.all([boardOn(clients[0]), boardOn(clients[2])]);
      last = [ba, bb];
      const placed = (ba.orders as { id: number; seats: { assignment: unknown }[] }[]).filter((o) => orderIds.includes(o.id)).flatMap((o) => o.seats.filter((s) => s.assignment)).length;
      if (JSON.stringify(ba) === JSON.stringify(bb) && placed === 10) break;
      if (Date.now() - since > 5_000) break;
      await sleep(200);
    }
    expect(last[1]).toEqual(last[0]);
    const converged = Date.now() - since;
    expect(converged).toBeLessThan(5_000);
    console.log(`[two-instances] 50 requests in ${elapsed} ms: ${results.filter((r) => r.status === 201).length} × 201, ${results.filter((r) => r.status === 409).length} × 409; boards equal after ${converged} ms`);
  });

  it("issue 16: one truck dropped on 5 overlapping orders at once, across both instances: one booking, 4 × 409, 5 times over", async () => {
    const [a, b] = apps;
    const clients = await Promise.all([signedIn(a.url, "dispatcher"), signedIn(b.url, "supervisor"), signedIn(b.url, "dispatcher"), signedIn(a.url, "supervisor")]);
    const y = await db("yards").where({ code: "NOR" }).first();
    const run = Date.now().toString(36);
    const trucks: number[] = [];
    for (let t = 0; t < 5; t++) {
      const [id] = await db("equipment").insert({
        organisation_id: y.organisation_id,
        yard_id: y.id,
        kind: "bucket_truck",
        unit_number: `TI-${run}-${t}`,
        name: "Two-instance bucket",
        insulated: true,
        licence: "cdl_b",
      });
      trucks.push(Number(id));
    }
    try {
      // Every order on the same day and hours: each overlaps every other.
      const orders: Awaited<ReturnType<typeof makeOrder>>[] = [];
      for (let i = 0; i < 5; i++) orders.push(await makeOrder(db, { offsetDays: OFFSET + 1, positions: ["lead"], workType: "bucket", start: "08:00", end: "14:00" }));
      const reqs = trucks.flatMap((t) => orders.map((o) => ({ truck: t, orderId: o.id })));
      const mixed = reqs.map((r, i) => ({ r, key: (i * 37) % reqs.length })).sort((x, y2) => x.key - y2.key).map((x) => x.r);
      const results = await Promise.all(
        mixed.map(async (r, i) => {
          const res = await clients[i % 4].json("/api/equipment-assignments", "POST", { workOrderId: r.orderId, equipmentId: r.truck });
          return { ...r, status: res.status, instance: i % 4 < 2 ? "A" : "B" };
        }),
      );
      expect(results.filter((r) => r.status >= 500)).toEqual([]);
      for (const t of trucks) {
        const rs = results.filter((r) => r.truck === t);
        expect(rs.filter((r) => r.status === 201), `truck ${t}`).toHaveLength(1);
        expect(rs.filter((r) => r.status === 409), `truck ${t}`).toHaveLength(4);
        // Persisted: the truck on exactly one of the overlapping orders.
        expect(Number((await db("equipment_assignments").where({ equipment_id: t }).count({ n: "*" }).first())?.n)).toBe(1);
      }
    } finally {
      await db("equipment_assignments").whereIn("equipment_id", trucks).delete();
      await db("equipment").whereIn("id", trucks).delete();
    }
  });
});
