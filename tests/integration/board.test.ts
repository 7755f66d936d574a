import knex from "knex";
import { afterAll, describe, expect, it } from "vitest";
import { dbConfig } from "@/knexfile";
import { as, Client } from "../support/client";
import { makeOrder, removeMadeOrders, workerByNo } from "../support/fixtures";

const db = knex(dbConfig());
afterAll(async () => {
  await removeMadeOrders(db);
  await db.destroy();
});

describe("board API under each role", () => {
  it("dispatcher, supervisor and admin read; hr and lineworker are refused", async () => {
    for (const role of ["dispatcher", "supervisor", "admin"] as const) {
      expect((await (await as(role)).json("/api/board?yard=NOR")).status).toBe(200);
    }
    for (const role of ["hr", "lineworker"] as const) {
      expect((await (await as(role)).json("/api/board?yard=NOR")).status).toBe(403);
    }
    expect((await new Client().json("/api/board?yard=NOR")).status).toBe(401);
  });

  it("validates the query and the body, naming the field", async () => {
    const c = await as("dispatcher");
    const q = await c.json("/api/board?yard=NOR&date=tomorrow");
    expect(q.status).toBe(422);
    expect(q.body.issues[0].field).toBe("date");
    const b = await c.json("/api/assignments", "POST", { positionId: "seven", workerId: 7 });
    expect(b.status).toBe(422);
    expect(b.body.error).toMatch(/positionId/);
    const bad = await c.json("/api/assignments", "POST", "{not json");
    expect(bad.status).toBe(400);
    const unknownYard = await c.json("/api/board?yard=ZZZ");
    expect(unknownYard.status).toBe(404);
  });

  it("an admin may read the board but not place people", async () => {
    const o = await makeOrder(db, { offsetDays: 40, positions: ["lead"] });
    const w = await workerByNo(db, "CP-1003");
    const r = await (await as("admin")).json("/api/assignments", "POST", { positionId: o.positionIds.lead, workerId: w.id });
    expect(r.status).toBe(403);
  });
});

describe("assignment writes", () => {
  it("place, move and remove, each audited, with the server's re-check in the answer", async () => {
    const c = await as("dispatcher");
    const o = await makeOrder(db, { offsetDays: 41, positions: ["climber", "observer", "ground", "lead"] });
    const w = await workerByNo(db, "CP-1007");
    const placed = await c.json("/api/assignments", "POST", { positionId: o.positionIds.climber, workerId: w.id });
    expect(placed.status).toBe(201);
    expect(placed.body.recheck.orderIds).toContain(String(o.id));
    // One person on a climbing order: CREW_MIN (29 CFR 1910.269(l)(2)(i)) blocks.
    expect(placed.body.recheck.findings.some((f: { rule: string }) => f.rule === "CREW_MIN")).toBe(true);
    const id = placed.body.assignmentId;
    const moved = await c.json(`/api/assignments/${id}`, "PATCH", { positionId: o.positionIds.lead, version: 1 });
    expect(moved.status).toBe(200);
    const stale = await c.json(`/api/assignments/${id}`, "PATCH", { positionId: o.positionIds.ground, version: 1 });
    expect(stale.status).toBe(409);
    expect(stale.body.current[0].seats[0].workerId).toBe(w.id);
    const removed = await c.json(`/api/assignments/${id}?version=2`, "DELETE");
    expect(removed.status).toBe(200);
    const rows = await db("audit_log").where({ entity: "assignment", entity_id: String(id) }).pluck("action");
    expect(rows).toEqual(expect.arrayContaining(["assignment.create", "assignment.move", "assignment.remove"]));
    expect(await db("assignments").where({ id }).first()).toBeUndefined();
  });

  it("parallel writes for one seat leave one winner and 409 for the rest", async () => {
    const o = await makeOrder(db, { offsetDays: 42, positions: ["lead"] });
    const people = await db("workers").where({ yard_id: o.yardId, active: true }).limit(8).pluck("id");
    const clients = await Promise.all([as("dispatcher"), as("supervisor")]);
    const results = await Promise.all(
      people.map((workerId, i) => clients[i % 2].json("/api/assignments", "POST", { positionId: o.positionIds.lead, workerId })),
    );
    const codes = results.map((r) => r.status).sort();
    expect(codes.filter((s) => s === 201)).toHaveLength(1);
    expect(codes.filter((s) => s === 409)).toHaveLength(people.length - 1);
    const live = await db("assignments").where({ work_order_id: o.id }).whereNotNull("holds_position");
    expect(live).toHaveLength(1);
  });

  it("parallel writes placing one worker on overlapping orders never persist a double booking", async () => {
    const orders = await Promise.all([0, 1, 2, 3, 4].map(() => makeOrder(db, { offsetDays: 43, positions: ["lead"] })));
    const w = await workerByNo(db, "CP-1003");
    const clients = await Promise.all([as("dispatcher"), as("supervisor")]);
    const results = await Promise.all(
      orders.map((o, i) => clients[i % 2].json("/api/assignments", "POST", { positionId: o.positionIds.lead, workerId: w.id })),
    );
    expect(results.filter((r) => r.status === 201)).toHaveLength(1);
    const conflicts = results.filter((r) => r.status === 409);
    expect(conflicts).toHaveLength(4);
    expect(conflicts[0].body.error).toMatch(/already on/);
    const live = await db("assignments")
      .whereIn("work_order_id", orders.map((o) => o.id))
      .where({ worker_id: w.id })
      .whereNotNull("holds_position");
    expect(live).toHaveLength(1);
  });

  it("a stale order version is refused with the current crew", async () => {
    const c = await as("dispatcher");
    const o = await makeOrder(db, { offsetDays: 44, positions: ["lead", "ground"] });
    const w = await workerByNo(db, "CP-1012");
    const r = await c.json("/api/assignments", "POST", { positionId: o.positionIds.lead, workerId: w.id, orderVersion: 99 });
    expect(r.status).toBe(409);
    expect(r.body.current[0].orderId).toBe(o.id);
  });
});

describe("overrides", () => {
  let offset = 50;
  async function orderWithLapsedClimber() {
    const o = await makeOrder(db, { offsetDays: offset++, positions: ["climber"], start: "07:00", end: "12:00" });
    const w = await workerByNo(db, "CP-1006"); // climbing lapsed (demo scenario)
    const c = await as("dispatcher");
    const r = await c.json("/api/assignments", "POST", { positionId: o.positionIds.climber, workerId: w.id });
    expect(r.status).toBe(201);
    return { o, w, assignmentId: r.body.assignmentId as number };
  }

  it("a dispatcher cannot override; a supervisor needs a reason of 15+ characters", async () => {
    const { o, w } = await orderWithLapsedClimber();
    const body = { workOrderId: o.id, rule: "CLIMB_CERT", workerId: w.id, reason: "Re-test passed at 06:00, card to follow" };
    const disp = await (await as("dispatcher")).json("/api/overrides", "POST", body);
    expect(disp.status).toBe(403);
    const sup = await as("supervisor");
    const short = await sup.json("/api/overrides", "POST", { ...body, reason: "ok" });
    expect(short.status).toBe(422);
    expect(short.body.issues[0].field).toBe("reason");
    const none = await sup.json("/api/overrides", "POST", { ...body, rule: "RESCUE", workerId: w.id });
    expect(none.status).toBe(422);
    const ok = await sup.json("/api/overrides", "POST", body);
    expect(ok.status).toBe(201);
    const audit = await db("audit_log").where({ action: "override.create", entity_id: String(ok.body.id) }).first();
    const detail = typeof audit.detail === "string" ? JSON.parse(audit.detail) : audit.detail;
    expect(detail.reason).toBe(body.reason);
    // Shown on the board as valid for this crew.
    const board = await sup.json(`/api/board?yard=NOR&date=${o.day}`);
    const v = board.body.overrides.find((x: { id: number }) => x.id === ok.body.id);
    expect(v.valid).toBe(true);
  });

  it("an override lapses when the crew changes", async () => {
    const { o, w } = await orderWithLapsedClimber();
    const sup = await as("supervisor");
    const ok = await sup.json("/api/overrides", "POST", { workOrderId: o.id, rule: "CLIMB_CERT", workerId: w.id, reason: "Field evaluation done by the general foreman" });
    expect(ok.status).toBe(201);
    const [extra] = await db("positions").insert({ work_order_id: o.id, position: "ground", sort: 5 });
    const other = await workerByNo(db, "CP-1014");
    expect((await sup.json("/api/assignments", "POST", { positionId: extra, workerId: other.id })).status).toBe(201);
    const row = await db("overrides").where({ id: ok.body.id }).first();
    expect(row.lapsed_at).not.toBeNull();
  });

  it("a locked finding can never be overridden (a ground hand climbing, 1910.269(x) qualified employee)", async () => {
    const o = await makeOrder(db, { offsetDays: 46, positions: ["climber", "lead"] });
    const gh = await workerByNo(db, "CP-1021"); // ground hand
    const c = await as("dispatcher");
    expect((await c.json("/api/assignments", "POST", { positionId: o.positionIds.climber, workerId: gh.id })).status).toBe(201);
    const r = await (await as("supervisor")).json("/api/overrides", "POST", {
      workOrderId: o.id,
      rule: "QUALIFIED",
      workerId: gh.id,
      reason: "Trying to override a locked rule here",
    });
    expect(r.status).toBe(422);
    expect(r.body.error).toMatch(/locked/);
  });
});

describe("POST /api/crew-check", () => {
  // The example day of the crew-check contract: one journeyman climbing alone on energized
  // 12.47 kV work with an order minimum of 3 — CREW_MIN per 29 CFR 1910.269(l)(2)(i).
  const day = {
    timezone: "America/Chicago",
    workers: [
      {
        id: "w-104",
        name: "Rosa Delgado",
        classification: "journeyman",
        credentials: [{ type: "climbing", expiresOn: "2027-05-31" }],
      },
    ],
    workOrders: [
      { id: "wo-2201", title: "Change out 50 kVA transformer", start: "2027-04-06T07:00", end: "2027-04-06T15:30", workType: "pole_climb", voltageKv: 12.47, minCrew: 3 },
    ],
    assignments: [{ workOrderId: "wo-2201", workerId: "w-104", position: "climber" }],
  };

  it("answers the same report as the command, for dispatchers and supervisors only", async () => {
    const r = await (await as("dispatcher")).json("/api/crew-check", "POST", day);
    expect(r.status).toBe(200);
    expect(r.body.findings.some((f: { rule: string; level: string }) => f.rule === "CREW_MIN" && f.level === "block")).toBe(true);
    expect(Object.keys(r.body.findings[0]).sort()).toEqual(["level", "message", "rule", "source", "workOrderId", "workerId"]);
    expect(r.body.summary.block).toBe(r.body.findings.filter((f: { level: string }) => f.level === "block").length);
    expect((await (await as("hr")).json("/api/crew-check", "POST", day)).status).toBe(403);
  });

  it("names the bad field", async () => {
    const bad = { ...day, workOrders: [{ ...day.workOrders[0], start: "tomorrow" }] };
    const r = await (await as("supervisor")).json("/api/crew-check", "POST", bad);
    expect(r.status).toBe(422);
    expect(r.body.error).toMatch(/workOrders\[0\]\.start/);
  });
});
