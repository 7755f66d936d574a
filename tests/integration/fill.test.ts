// Fill open positions and call-out lists against the running app (APP_URL) and its database.
// Orders of the tests' own, 171+ days out, so the demo board is untouched; on those days the
// demo workers are rested and on no other order.
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

const counts = async () => ({
  assignments: Number((await db("assignments").count({ n: "*" }).first())?.n ?? 0),
  audit: Number((await db("audit_log").count({ n: "*" }).first())?.n ?? 0),
  events: Number((await db("board_events").count({ n: "*" }).first())?.n ?? 0),
  notifications: Number((await db("notifications").count({ n: "*" }).first())?.n ?? 0),
});

describe("POST /api/fill (preview)", () => {
  it("proposes a whole crew with reasons, and writes nothing", async () => {
    const o = await makeOrder(db, { offsetDays: 171, workType: "pole_climb", positions: ["climber", "observer", "ground", "lead"] });
    const c = await as("dispatcher");
    const before = await counts();
    const r = await c.json("/api/fill", "POST", { date: o.day, yard: "NOR", timeLimitSeconds: 10, gap: 0 });
    expect(r.status).toBe(200);
    expect(await counts()).toEqual(before);
    const mine = r.body.proposals.filter((p: { orderId: number }) => p.orderId === o.id);
    // All four seats or none ("staffed whole"); here the pool can staff it.
    expect(mine).toHaveLength(4);
    expect(new Set(mine.map((p: { positionId: number }) => p.positionId))).toEqual(new Set(Object.values(o.positionIds)));
    for (const p of mine) {
      expect(p.reasons[0]).toMatch(/^priority \d order$/);
      expect(p.reasons.join(" ")).toMatch(/h overtime in 28 days/);
    }
    expect(r.body.status).toBe("Optimal");
    expect(r.body.optimal).toBe(true);
    expect(r.body.gap).toBe(0);
    expect(typeof r.body.objective.staffing).toBe("number");
    expect(typeof r.body.solveMs).toBe("number");
    const staffed = r.body.staffed.find((s: { orderId: number }) => s.orderId === o.id);
    expect(staffed.carried).toEqual([]);
  });

  it("validates the body, naming the field", async () => {
    const c = await as("dispatcher");
    const bad = await c.json("/api/fill", "POST", { date: "tomorrow", yard: "NOR" });
    expect(bad.status).toBe(422);
    expect(bad.body.issues[0].field).toBe("date");
    const gap = await c.json("/api/fill", "POST", { date: "2030-01-01", yard: "NOR", gap: 2 });
    expect(gap.status).toBe(422);
    expect(gap.body.issues[0].field).toBe("gap");
    expect((await c.json("/api/fill", "POST", { date: "2030-01-01", yard: "ZZZ" })).status).toBe(404);
    expect((await c.json("/api/fill", "POST", "{not json")).status).toBe(400);
  });

  it("refuses lineworkers and HR (403) and the signed-out (401)", async () => {
    const body = { date: "2030-01-01", yard: "NOR" };
    for (const role of ["lineworker", "hr", "admin"] as const) {
      const c = await as(role);
      expect((await c.json("/api/fill", "POST", body)).status).toBe(403);
      expect((await c.json("/api/fill/accept", "POST", { ...body, proposals: [{ positionId: 1, workerId: 1 }] })).status).toBe(403);
      expect((await c.json("/api/call-list?positionId=1")).status).toBe(403);
      expect((await c.json("/api/call-list", "POST", { positionId: 1, workerId: 1 })).status).toBe(403);
    }
    expect((await new Client().json("/api/fill", "POST", body)).status).toBe(401);
  });
});

describe("POST /api/fill/accept", () => {
  it("places through the normal assignment write: audit rows, board events, re-check; a taken seat is refused on its own", async () => {
    const o = await makeOrder(db, { offsetDays: 172, workType: "pole_climb", positions: ["climber", "observer", "ground", "lead"] });
    const c = await as("dispatcher");
    const preview = await c.json("/api/fill", "POST", { date: o.day, yard: "NOR", gap: 0 });
    const mine = preview.body.proposals.filter((p: { orderId: number }) => p.orderId === o.id);
    expect(mine).toHaveLength(4);
    const eventsBefore = (await counts()).events;
    const proposals = mine.map((p: { positionId: number; workerId: number }) => ({ positionId: p.positionId, workerId: p.workerId }));
    const r = await c.json("/api/fill/accept", "POST", { date: o.day, yard: "NOR", proposals });
    expect(r.status).toBe(200);
    expect(r.body.placed).toBe(4);
    expect(r.body.refused).toBe(0);
    const ids = r.body.results.map((x: { assignmentId: number }) => x.assignmentId);
    const rows = await db("assignments").whereIn("id", ids);
    expect(rows.every((a) => a.status === "draft" && a.holds_position === a.position_id)).toBe(true);
    const audited = await db("audit_log").where({ action: "assignment.create", entity: "assignment" }).whereIn("entity_id", ids.map(String));
    expect(audited).toHaveLength(4);
    expect(await db("audit_log").where({ action: "fill.accept", entity_id: `NOR:${o.day}` }).first()).toBeTruthy();
    expect((await counts()).events).toBeGreaterThan(eventsBefore);
    // The server's own re-check of the accepted crew (the engine): no block on the order.
    expect(r.body.recheck.orderIds).toContain(String(o.id));
    expect(r.body.blocks.filter((f: { workOrderId: string }) => f.workOrderId === String(o.id))).toEqual([]);
    // The same again: every seat is taken now, each refused on its own with a 409.
    const again = await c.json("/api/fill/accept", "POST", { date: o.day, yard: "NOR", proposals });
    expect(again.body.placed).toBe(0);
    expect(again.body.results.every((x: { ok: boolean; status: number }) => !x.ok && x.status === 409)).toBe(true);
  });

  it("one seat in conflict does not stop the others", async () => {
    const o = await makeOrder(db, { offsetDays: 173, workType: "patrol", energized: false, positions: ["lead", "ground"] });
    const other = await makeOrder(db, { offsetDays: 173, workType: "patrol", energized: false, positions: ["lead"] });
    const lead = await workerByNo(db, "CP-1003");
    const ground = await workerByNo(db, "CP-1023");
    const c = await as("supervisor");
    // Tomas is placed elsewhere at the same time first: his seat here is a double booking.
    expect((await c.json("/api/assignments", "POST", { positionId: other.positionIds.lead, workerId: lead.id })).status).toBe(201);
    const r = await c.json("/api/fill/accept", "POST", {
      date: o.day,
      yard: "NOR",
      proposals: [
        { positionId: o.positionIds.lead, workerId: lead.id },
        { positionId: o.positionIds.ground, workerId: ground.id },
      ],
    });
    expect(r.status).toBe(200);
    expect(r.body.placed).toBe(1);
    const refused = r.body.results.find((x: { ok: boolean }) => !x.ok);
    expect(refused.positionId).toBe(o.positionIds.lead);
    expect(refused.status).toBe(409);
    expect(refused.error).toMatch(/DOUBLE_BOOKED|already on/);
  });

  it("refuses seats that are not on that board", async () => {
    const o = await makeOrder(db, { offsetDays: 174, positions: ["lead"] });
    const w = await workerByNo(db, "CP-1003");
    const r = await (await as("dispatcher")).json("/api/fill/accept", "POST", { date: "2031-01-01", yard: "NOR", proposals: [{ positionId: o.positionIds.lead, workerId: w.id }] });
    expect(r.body.placed).toBe(0);
    expect(r.body.results[0].status).toBe(422);
  });
});

describe("call-out list", () => {
  it("ranks the eligible by overtime then home yard, lists near misses with the rule, and places in one click", async () => {
    const o = await makeOrder(db, { offsetDays: 175, workType: "pole_climb", positions: ["climber"] });
    const c = await as("dispatcher");
    const r = await c.json(`/api/call-list?positionId=${o.positionIds.climber}`);
    expect(r.status).toBe(200);
    expect(r.body.eligible.length).toBeGreaterThan(0);
    // Fewer blocks left on the order first; among equals fewest overtime hours, then home yard
    // (call-out equalisation, common practice).
    for (let i = 1; i < r.body.eligible.length; i++) {
      const [a, b] = [r.body.eligible[i - 1], r.body.eligible[i]];
      expect(b.crewBlocks.length).toBeGreaterThanOrEqual(a.crewBlocks.length);
      if (a.crewBlocks.length !== b.crewBlocks.length) continue;
      expect(b.overtimeHours).toBeGreaterThanOrEqual(a.overtimeHours);
      if (a.overtimeHours === b.overtimeHours) expect(Number(b.homeYard)).toBeLessThanOrEqual(Number(a.homeYard));
    }
    expect(r.body.eligible[0]).toHaveProperty("phone");
    // The lapsed climbers are near misses, kept out by CLIMB_CERT (demo scenario).
    const lyle = await workerByNo(db, "CP-1005");
    const miss = r.body.nearMisses.find((n: { workerId: number }) => n.workerId === lyle.id);
    expect(miss?.excludedBy).toBe("CLIMB_CERT");
    expect(r.body.summary).toMatch(/lapsed climbing qualification/);

    const first = r.body.eligible[0];
    const placed = await c.json("/api/call-list", "POST", { positionId: o.positionIds.climber, workerId: first.workerId, text: false });
    expect(placed.status).toBe(201);
    const row = await db("assignments").where({ id: placed.body.assignmentId }).first();
    expect(row.worker_id).toBe(first.workerId);
    expect(await db("audit_log").where({ action: "assignment.create", entity_id: String(placed.body.assignmentId) }).first()).toBeTruthy();
    expect(placed.body.text.queued).toBe(false);
  });

  it("404 for an unknown position, 422 for a bad one", async () => {
    const c = await as("dispatcher");
    expect((await c.json("/api/call-list?positionId=999999999")).status).toBe(404);
    const bad = await c.json("/api/call-list?positionId=abc");
    expect(bad.status).toBe(422);
    expect(bad.body.issues[0].field).toBe("positionId");
  });
});

// Issue 19: the streamed answer (progress lines, then the proposal) and cancel. Lines are
// newline-delimited JSON (one object per line; the format the NDJSON spec describes, common practice).
describe("POST /api/fill streamed (Accept: application/x-ndjson)", () => {
  const lines = async (res: Response, stopAfter?: (msg: { type: string }) => boolean) => {
    const out: Array<Record<string, any>> = [];
    const reader = res.body!.pipeThrough(new TextDecoderStream()).getReader();
    let buf = "";
    for (;;) {
      const { done, value } = await reader.read();
      if (done) break;
      buf += value;
      let nl: number;
      while ((nl = buf.indexOf("\n")) >= 0) {
        const msg = JSON.parse(buf.slice(0, nl));
        buf = buf.slice(nl + 1);
        out.push(msg);
        if (stopAfter?.(msg)) {
          await reader.cancel();
          return out;
        }
      }
    }
    return out;
  };

  it("streams each step in order, then the same proposal as the plain answer, and writes nothing", async () => {
    const o = await makeOrder(db, { offsetDays: 173, workType: "pole_climb", positions: ["climber", "observer", "ground", "lead"] });
    const c = await as("dispatcher");
    const before = await counts();
    const res = await c.fetch("/api/fill", {
      method: "POST",
      headers: { "content-type": "application/json", accept: "application/x-ndjson" },
      body: JSON.stringify({ date: o.day, yard: "NOR", timeLimitSeconds: 10, gap: 0 }),
    });
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toMatch(/application\/x-ndjson/);
    const msgs = await lines(res);
    const progress = msgs.filter((m) => m.type === "progress");
    const phases = progress.map((m) => m.phase);
    expect(phases[0]).toBe("eligibility");
    expect(phases).toContain("explain");
    const elapsed = progress.map((m) => m.elapsedMs);
    expect(elapsed).toEqual([...elapsed].sort((a, b) => a - b));
    const last = msgs[msgs.length - 1];
    expect(last.type).toBe("result");
    const mine = last.preview.proposals.filter((p: { orderId: number }) => p.orderId === o.id);
    expect(mine).toHaveLength(4);
    expect(last.preview.status).toBe("Optimal");
    expect(await counts()).toEqual(before);
  });

  it("refuses bad input before streaming (422 naming the field), and another role (403)", async () => {
    const c = await as("dispatcher");
    const bad = await c.fetch("/api/fill", { method: "POST", headers: { "content-type": "application/json", accept: "application/x-ndjson" }, body: JSON.stringify({ date: "tomorrow", yard: "NOR" }) });
    expect(bad.status).toBe(422);
    expect(JSON.stringify(await bad.json())).toMatch(/date/);
    const crew = await as("lineworker");
    const no = await crew.fetch("/api/fill", { method: "POST", headers: { "content-type": "application/json", accept: "application/x-ndjson" }, body: JSON.stringify({ date: "2030-01-01", yard: "NOR" }) });
    expect(no.status).toBe(403);
  });

  it("cancelled mid-run: the client stops reading, nothing is written, and the next fill answers normally", async () => {
    const o = await makeOrder(db, { offsetDays: 175, workType: "bucket", positions: ["lead", "aerial", "ground", "driver"] });
    const c = await as("dispatcher");
    const before = await counts();
    const ac = new AbortController();
    const res = await c.fetch("/api/fill", {
      method: "POST",
      headers: { "content-type": "application/json", accept: "application/x-ndjson" },
      body: JSON.stringify({ date: o.day, yard: "NOR", timeLimitSeconds: 10 }),
      signal: ac.signal,
    });
    const got = await lines(res, (m) => m.type === "progress");
    expect(got[0]).toMatchObject({ type: "progress", phase: "eligibility" });
    ac.abort();
    expect(await counts()).toEqual(before);
    const again = await c.json("/api/fill", "POST", { date: o.day, yard: "NOR", timeLimitSeconds: 10 });
    expect(again.status).toBe(200);
    expect(await counts()).toEqual(before);
  });
});
