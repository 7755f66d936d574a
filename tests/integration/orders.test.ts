import knex, { type Knex } from "knex";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { dbConfig } from "@/knexfile";
import { addDays, todayIn } from "@/lib/time/days";
import { onCallAt } from "@/lib/rotations/data-on-call";
import { as, Client } from "@/tests/support/client";

// Work orders, leave, rotations, time records and the calendar feed against the running app
// and its database (APP_URL, DB_NAME). Orders made here sit 3–7 weeks out and are cancelled
// or removed afterwards, so other specs' boards (tomorrow) are untouched.

const CHI = "America/Chicago";
const today = todayIn(CHI);
const tomorrow = addDays(today, 1);
const stamp = Date.now().toString(36);

let conn: Knex;
let dispatcher: Client;
let hr: Client;
let lineworker: Client;
let supervisor: Client;
let admin: Client;
let north: { id: number };
let bucket: { id: number; positions: string[] };
const workerId: Record<string, number> = {};
const cleanup: (() => Promise<unknown>)[] = [];

const order = (over: Record<string, unknown> = {}) => ({
  title: `Test crossarm change ${stamp}`,
  yardId: north.id,
  workTypeId: bucket.id,
  address: "1 Test Road",
  structureNo: "N-TEST",
  start: `${addDays(today, 40)}T07:00`,
  end: `${addDays(today, 40)}T15:00`,
  energized: true,
  voltageKv: 12.47,
  emergency: false,
  crewException: null,
  minCrew: 2,
  positions: bucket.positions.map((position) => ({ position })),
  priority: 3,
  notes: null,
  status: "planned",
  driverLicence: null,
  ...over,
});

/** A live assignment placed directly (the board's assignment API is another issue's). */
async function assign(orderId: number, worker: number, position = "ground") {
  const seat = await conn("positions").where({ work_order_id: orderId, position }).first("id");
  const [id] = await conn("assignments").insert({
    work_order_id: orderId,
    position_id: seat.id,
    worker_id: worker,
    holds_position: seat.id,
    status: "draft",
    reply_code: String(1000 + Math.floor(Math.random() * 8999)),
  });
  cleanup.push(() => conn("assignments").where({ id }).delete());
  return id;
}

beforeAll(async () => {
  conn = knex(dbConfig());
  [dispatcher, hr, lineworker, supervisor, admin] = await Promise.all([
    as("dispatcher", "dispatch@cedarprairie.example"),
    as("hr"),
    as("lineworker"),
    as("supervisor"),
    as("admin"),
  ]);
  north = await conn("yards").where({ code: "NOR" }).first("id");
  const types = await dispatcher.json("/api/work-types");
  expect(types.status).toBe(200);
  bucket = types.body.workTypes.find((t: { code: string }) => t.code === "bucket");
  for (const w of await conn("workers").whereIn("employee_no", ["CP-1001", "CP-1011", "CP-1014", "CP-1018", "CP-1023"]).select("id", "employee_no"))
    workerId[w.employee_no] = Number(w.id);
});

afterAll(async () => {
  for (const f of cleanup.reverse()) await f().catch(() => undefined);
  await conn?.destroy();
});

describe("work orders", () => {
  it("refuses an order whose end is before its start: 422 naming the field `end` (issue 7; common practice)", async () => {
    const r = await dispatcher.json("/api/orders", "POST", order({ start: `${addDays(today, 40)}T15:00`, end: `${addDays(today, 40)}T07:00` }));
    expect(r.status).toBe(422);
    expect(r.body.issues.map((i: { field: string }) => i.field)).toContain("end");
  });

  it("a lineworker cannot create orders: 403 (PRODUCT.md roles: dispatchers build crews)", async () => {
    const r = await lineworker.json("/api/orders", "POST", order());
    expect(r.status).toBe(403);
  });

  it("PATCH with a stale version answers 409 with the current order (DEVELOPERS.md: a stale write 409 with the current state)", async () => {
    const created = await dispatcher.json("/api/orders", "POST", order());
    expect(created.status).toBe(201);
    const id = created.body.id;
    cleanup.push(() => supervisor.json(`/api/orders/${id}`, "DELETE"));
    expect(created.body.order.number).toMatch(/^WO-\d{2}-\d{4}$/);
    expect(created.body.order.version).toBe(1);
    const first = await dispatcher.json(`/api/orders/${id}`, "PATCH", { version: 1, priority: 2 });
    expect(first.status).toBe(200);
    expect(first.body.version).toBe(2);
    const stale = await supervisor.json(`/api/orders/${id}`, "PATCH", { version: 1, priority: 5 });
    expect(stale.status).toBe(409);
    expect(stale.body.current.version).toBe(2);
    expect(stale.body.current.priority).toBe(2);
  });

  it("shows the locate warning on an order that digs without a ticket (issue 7)", async () => {
    const poleSet = (await dispatcher.json("/api/work-types")).body.workTypes.find((t: { code: string }) => t.code === "pole_set");
    const created = await dispatcher.json(
      "/api/orders",
      "POST",
      order({ workTypeId: poleSet.id, positions: poleSet.positions.map((position: string) => ({ position })), locateTicket: null }),
    );
    expect(created.status).toBe(201);
    cleanup.push(() => dispatcher.json(`/api/orders/${created.body.id}`, "DELETE"));
    expect(created.body.order.locateWarning).toMatch(/No locate ticket/);
    const lapsed = await dispatcher.json(`/api/orders/${created.body.id}`, "PATCH", {
      version: 1,
      locateTicket: "LT-TEST-1",
      locateValidThrough: addDays(today, 39),
    });
    expect(lapsed.body.locateWarning).toMatch(/valid only through/);
  });

  it("marking an order done with actual times gives its crew 'order' time records; cancelling removes them", async () => {
    const created = await dispatcher.json("/api/orders", "POST", order({ title: `Done test ${stamp}` }));
    const id = created.body.id;
    await assign(id, workerId["CP-1023"], "ground");
    const day = addDays(today, 40);
    const done = await dispatcher.json(`/api/orders/${id}`, "PATCH", {
      version: 1,
      status: "done",
      actualStart: `${day}T07:15`,
      actualEnd: `${day}T16:45`,
    });
    expect(done.status).toBe(200);
    expect(done.body.timeRecords).toHaveLength(1);
    expect(done.body.timeRecords[0]).toMatchObject({ workerId: workerId["CP-1023"], hours: 9.5 });
    const week = await dispatcher.json(`/api/time-records?workerId=${workerId["CP-1023"]}&week=${day}`);
    const dayRow = week.body.totals.days.find((d: { date: string }) => d.date === day);
    expect(dayRow.hours).toBe(9.5);
    expect(dayRow.overRegular).toBe(1.5); // policy regular_hours_day = 8 (demo seed)
    const missing = await dispatcher.json(`/api/orders/${id}`, "PATCH", { version: 2, status: "done", actualStart: null });
    expect(missing.status).toBe(422);
    const cancelled = await dispatcher.json(`/api/orders/${id}`, "DELETE");
    expect(cancelled.body.status).toBe("cancelled");
    expect(cancelled.body.timeRecords).toHaveLength(0);
  });
});

describe("repeating orders", () => {
  it("materialises weekly occurrences; editing the series regenerates only the unstaffed future ones", async () => {
    const first = addDays(today, 21);
    const created = await dispatcher.json(
      "/api/orders",
      "POST",
      order({
        title: `Weekly patrol test ${stamp}`,
        start: `${first}T07:00`,
        end: `${first}T15:00`,
        recurrence: { rrule: "FREQ=WEEKLY;COUNT=4", exdates: [] },
      }),
    );
    expect(created.status).toBe(201);
    expect(created.body.created).toBe(4);
    const seriesId = created.body.seriesId;
    const list = await dispatcher.json(`/api/orders?yard=NOR&from=${first}&to=${addDays(first, 30)}&q=${encodeURIComponent(`Weekly patrol test ${stamp}`)}`);
    expect(list.body.orders.map((o: { workDate: string }) => o.workDate)).toEqual([first, addDays(first, 7), addDays(first, 14), addDays(first, 21)]);
    expect(list.body.orders.every((o: { startLocal: string }) => o.startLocal.endsWith("T07:00"))).toBe(true);

    // Someone is placed on the second occurrence: it must survive the series edit.
    const staffed = list.body.orders[1];
    await assign(staffed.id, workerId["CP-1023"], "ground");
    const s = await dispatcher.json(`/api/order-series/${seriesId}`);
    const edit = await dispatcher.json(`/api/order-series/${seriesId}`, "PATCH", {
      ...order({ title: `Weekly patrol test ${stamp}`, start: `${first}T08:00`, end: `${first}T16:00` }),
      recurrence: { rrule: "FREQ=WEEKLY;COUNT=4", exdates: [addDays(first, 21)] },
      version: s.body.version,
    });
    expect(edit.status).toBe(200);
    expect(edit.body).toMatchObject({ removed: 3, created: 2 });
    expect(edit.body.kept.map((k: { id: number }) => k.id)).toEqual([staffed.id]);
    const after = await dispatcher.json(`/api/orders?yard=NOR&from=${first}&to=${addDays(first, 30)}&q=${encodeURIComponent(`Weekly patrol test ${stamp}`)}`);
    expect(after.body.orders.map((o: { workDate: string; startLocal: string }) => [o.workDate, o.startLocal.slice(11)])).toEqual([
      [first, "08:00"],
      [addDays(first, 7), "07:00"], // staffed: kept as it was
      [addDays(first, 14), "08:00"],
    ]);
    const stale = await dispatcher.json(`/api/order-series/${seriesId}`, "PATCH", {
      ...order({ start: `${first}T08:00`, end: `${first}T16:00` }),
      recurrence: { rrule: "FREQ=WEEKLY;COUNT=4", exdates: [] },
      version: s.body.version,
    });
    expect(stale.status).toBe(409);
    const ended = await dispatcher.json(`/api/order-series/${seriesId}`, "DELETE");
    expect(ended.body).toMatchObject({ removed: 2 });
    expect(ended.body.kept.map((k: { id: number }) => k.id)).toEqual([staffed.id]);
    cleanup.push(() => dispatcher.json(`/api/orders/${staffed.id}`, "DELETE"));
  });

  it("refuses a repeat rule a work order cannot follow: 422 on recurrence.rrule", async () => {
    const r = await dispatcher.json("/api/orders", "POST", order({ recurrence: { rrule: "FREQ=HOURLY", exdates: [] } }));
    expect(r.status).toBe(422);
    expect(r.body.issues[0].field).toBe("recurrence.rrule");
  });
});

describe("leave, training and sickness", () => {
  it("refuses leave overlapping approved leave for the same person with a clear message (issue 7)", async () => {
    // Demo: Noah Feldkamp (CP-1011) is on approved leave from tomorrow for three days.
    const r = await hr.json("/api/leave", "POST", {
      workerId: workerId["CP-1011"],
      kind: "training",
      start: `${tomorrow}T08:00`,
      end: `${tomorrow}T16:00`,
      note: "Overlap test",
    });
    expect(r.status).toBe(409);
    expect(r.body.error).toMatch(/Noah Feldkamp already has approved leave/);
  });

  it("a lineworker may request only for themself; the request waits for a supervisor", async () => {
    const other = await lineworker.json("/api/leave", "POST", {
      workerId: workerId["CP-1014"],
      kind: "leave",
      start: `${addDays(today, 50)}T00:00`,
      end: `${addDays(today, 51)}T00:00`,
    });
    expect(other.status).toBe(403);
    const own = await lineworker.json("/api/leave", "POST", {
      workerId: workerId["CP-1001"],
      kind: "leave",
      start: `${addDays(today, 50)}T00:00`,
      end: `${addDays(today, 51)}T00:00`,
      note: "Test request",
    });
    expect(own.status).toBe(201);
    expect(own.body.status).toBe("requested");
    cleanup.push(() => supervisor.json(`/api/leave/${own.body.id}`, "DELETE"));
    const again = await lineworker.json("/api/leave", "POST", {
      workerId: workerId["CP-1001"],
      kind: "sickness",
      start: `${addDays(today, 50)}T12:00`,
      end: `${addDays(today, 52)}T00:00`,
    });
    expect(again.status).toBe(409); // a pending request blocks an overlapping one too
    expect((await lineworker.json(`/api/leave/${own.body.id}`, "PATCH", { status: "approved" })).status).toBe(403);
    const approved = await supervisor.json(`/api/leave/${own.body.id}`, "PATCH", { status: "approved" });
    expect(approved.status).toBe(200);
    expect(approved.body.status).toBe("approved");
  });
});

describe("time records and call-outs", () => {
  it("a call-out becomes a call_out time record in the worker's week; lineworkers read only their own", async () => {
    const day = addDays(today, 44);
    const r = await dispatcher.json("/api/call-outs", "POST", {
      workerId: workerId["CP-1014"],
      start: `${day}T22:00`,
      end: `${addDays(day, 1)}T03:00`,
      rotationId: null,
      note: "Test: fuse at N-TEST",
    });
    expect(r.status).toBe(201);
    expect(r.body.hours).toBe(5);
    cleanup.push(() => dispatcher.json(`/api/time-records/${r.body.id}`, "DELETE"));
    const week = await supervisor.json(`/api/time-records?workerId=${workerId["CP-1014"]}&week=${day}`);
    const row = week.body.totals.days.find((d: { date: string }) => d.date === day);
    expect(row.records.map((x: { kind: string }) => x.kind)).toContain("call_out");
    expect(row.hours).toBe(5);
    expect((await lineworker.json(`/api/time-records?workerId=${workerId["CP-1014"]}`)).status).toBe(403);
    expect((await lineworker.json("/api/time-records")).status).toBe(200);
    const manual = await dispatcher.json("/api/time-records", "POST", { workerId: workerId["CP-1014"], start: `${day}T08:00`, end: `${day}T10:00`, reason: "" });
    expect(manual.status).toBe(422);
    expect(manual.body.issues[0].field).toBe("reason");
  });
});

describe("on-call rotations", () => {
  it("onCallAt names this week's on-call worker: the demo's last member (db/demo/scenario.ts ROTATIONS)", async () => {
    const now = await onCallAt(conn, north.id, new Date());
    expect(now).toHaveLength(1);
    expect(now[0]).toMatchObject({ rotationName: "North on-call", workerName: "Owen Tillman" });
    // Monday 07:00 to Monday 07:00: 168 h, or 167/169 across a daylight-saving change (IANA US rules).
    expect([167, 168, 169]).toContain((now[0].to.getTime() - now[0].from.getTime()) / 3_600_000);
    expect(now[0].from.getTime()).toBeLessThanOrEqual(Date.now());
    expect(now[0].to.getTime()).toBeGreaterThan(Date.now());
  });

  it("creates, edits with a version check (409 when stale) and deletes a rotation; a lineworker may not", async () => {
    const body = {
      name: `Test rotation ${stamp}`,
      yardId: north.id,
      rrule: "FREQ=WEEKLY;BYDAY=SU",
      dtstartLocal: `${addDays(today, -14)}T02:30`,
      active: false, // paused: never shows on a board
      memberIds: [workerId["CP-1014"], workerId["CP-1023"]],
    };
    expect((await lineworker.json("/api/rotations", "POST", body)).status).toBe(403);
    const bad = await dispatcher.json("/api/rotations", "POST", { ...body, memberIds: [workerId["CP-1014"], workerId["CP-1014"]] });
    expect(bad.status).toBe(422);
    const created = await dispatcher.json("/api/rotations", "POST", body);
    expect(created.status).toBe(201);
    const id = created.body.id;
    cleanup.push(() => dispatcher.json(`/api/rotations/${id}`, "DELETE"));
    expect(created.body.members.map((m: { workerId: number }) => m.workerId)).toEqual(body.memberIds);
    const ok = await supervisor.json(`/api/rotations/${id}`, "PATCH", { version: 1, memberIds: [workerId["CP-1023"], workerId["CP-1014"]] });
    expect(ok.status).toBe(200);
    expect(ok.body.version).toBe(2);
    const stale = await dispatcher.json(`/api/rotations/${id}`, "PATCH", { version: 1, name: "stale" });
    expect(stale.status).toBe(409);
    expect(stale.body.current.version).toBe(2);
    expect((await dispatcher.json(`/api/rotations/${id}`, "DELETE")).status).toBe(200);
  });
});

describe("crew templates", () => {
  it("refuses a template without exactly one lead position (1910.269(c)(1): the employee in charge)", async () => {
    const r = await admin.json(`/api/work-types/${bucket.id}`, "PUT", { name: "Bucket truck work", minCrew: 2, digs: false, positions: ["ground", "ground"] });
    expect(r.status).toBe(422);
    expect(r.body.issues[0].field).toBe("positions");
    expect((await dispatcher.json(`/api/work-types/${bucket.id}`, "PUT", { name: "x", minCrew: 2, digs: false, positions: ["lead"] })).status).toBe(403);
  });
});

describe("calendar feed", () => {
  it("serves text/calendar with a VEVENT per live assignment behind the secret link, 404 for a bad token (RFC 5545 §3.6.1)", async () => {
    // Marcus Whitfield (CP-1001, the lineworker sign-in) leads WO-26-0101 tomorrow.
    const reset = await lineworker.json("/api/calendar/reset", "POST", {});
    expect(reset.status).toBe(200);
    const path = new URL(reset.body.url).pathname;
    const anon = new Client();
    const res = await anon.fetch(path);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toMatch(/^text\/calendar/);
    const body = await res.text();
    expect(body).toContain("BEGIN:VCALENDAR");
    expect(body).toMatch(/BEGIN:VEVENT[\s\S]*WO-26-0101[\s\S]*END:VEVENT/);
    expect((await anon.fetch("/api/calendar/not-a-real-token-at-all-000")).status).toBe(404);
    expect((await lineworker.json("/api/calendar/reset", "POST", { workerId: workerId["CP-1014"] })).status).toBe(403);
    // A new link retires the old one.
    const again = await lineworker.json("/api/calendar/reset", "POST", {});
    expect((await anon.fetch(path)).status).toBe(404);
    expect((await anon.fetch(new URL(again.body.url).pathname)).status).toBe(200);
  });
});
