import knex, { type Knex } from "knex";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { dbConfig } from "@/knexfile";
import { addDays, todayIn } from "@/lib/time/days";
import { as, type Client } from "@/tests/support/client";

// The order form's issue-14 fields through POST/PATCH /api/orders and into the board's rule
// snapshot: energized parts nearby, phases with the system voltage, and a multi-day order's
// shifts (../shared/CREW-CHECK.md, Corrections 2, 6 and 8). Orders sit 8–9 weeks out and are
// removed afterwards, so the demo board is untouched. Bad input answers 422 naming the field
// (DEVELOPERS.md: zod paths joined with dots, so the first shift's end is `shifts.0.end`) and
// stores nothing.

const CHI = "America/Chicago";
const today = todayIn(CHI);
const D = addDays(today, 56); // a Thursday or not, far from the demo's tomorrow
const stamp = Date.now().toString(36);

let conn: Knex;
let dispatcher: Client;
let north: { id: number };
let bucket: { id: number; positions: string[] };
const made: number[] = [];

const order = (over: Record<string, unknown> = {}) => ({
  title: `Reconductor test ${stamp}`,
  yardId: north.id,
  workTypeId: bucket.id,
  address: "1 Test Road",
  structureNo: "N-TEST",
  start: `${D}T07:00`,
  end: `${addDays(D, 2)}T17:00`,
  energized: false,
  voltageKv: 12.47,
  nearEnergizedKv: 12.47,
  emergency: false,
  crewException: null,
  minCrew: null,
  positions: [{ position: "lead" }, { position: "aerial" }, { position: "ground" }],
  priority: 3,
  notes: null,
  status: "planned",
  driverLicence: null,
  ...over,
});
const shifts3 = [0, 1, 2].map((d) => ({ start: `${addDays(D, d)}T07:00`, end: `${addDays(D, d)}T17:00` }));

async function ordersCount() {
  return Number((await conn("work_orders").count({ n: "*" }))[0].n);
}

beforeAll(async () => {
  conn = knex(dbConfig());
  dispatcher = await as("dispatcher", "dispatch@cedarprairie.example");
  north = await conn("yards").where({ code: "NOR" }).first("id");
  const types = await dispatcher.json("/api/work-types");
  bucket = types.body.workTypes.find((t: { code: string }) => t.code === "bucket");
});

afterAll(async () => {
  if (made.length) await conn("work_orders").whereIn("id", made).delete();
  await conn.destroy();
});

describe("shifts: inside the order, not overlapping, 422 naming the row", () => {
  it.each([
    ["a shift that ends before it starts", [{ start: `${D}T17:00`, end: `${D}T07:00` }], "shifts.0.end", /end after it starts/],
    ["a shift that starts before the order", [{ start: `${addDays(D, -1)}T07:00`, end: `${addDays(D, -1)}T17:00` }], "shifts.0.start", /before the order/],
    ["a shift that ends after the order", [{ start: `${addDays(D, 2)}T07:00`, end: `${addDays(D, 2)}T19:00` }], "shifts.0.end", /after the order/],
    [
      "two overlapping shifts (the second named)",
      [
        { start: `${D}T07:00`, end: `${D}T17:00` },
        { start: `${D}T16:00`, end: `${D}T20:00` },
      ],
      "shifts.1.start",
      /overlaps shift 1/,
    ],
    ["a shift time that is not a time", [{ start: "tomorrow", end: `${D}T17:00` }], "shifts.0.start", /YYYY-MM-DD HH:mm/],
    // February has no 30th (proleptic Gregorian calendar).
    ["a shift on a day that does not exist", [{ start: `${D.slice(0, 4)}-02-30T07:00`, end: `${D}T17:00` }], "shifts.0.start", /does not exist/],
  ])("%s", async (_what, shifts, field, message) => {
    const before = await ordersCount();
    const r = await dispatcher.json("/api/orders", "POST", order({ shifts }));
    expect(r.status).toBe(422);
    expect(r.body.issues.map((i: { field: string }) => i.field)).toContain(field);
    expect(r.body.issues.find((i: { field: string }) => i.field === field).message).toMatch(message);
    expect(await ordersCount()).toBe(before); // nothing stored
  });

  it("touching shifts are not an overlap (end == next start)", async () => {
    const r = await dispatcher.json(
      "/api/orders",
      "POST",
      order({
        title: `Touching shifts ${stamp}`,
        end: `${D}T23:00`,
        shifts: [
          { start: `${D}T07:00`, end: `${D}T12:00` },
          { start: `${D}T12:00`, end: `${D}T17:00` },
        ],
      }),
    );
    expect(r.status).toBe(201);
    made.push(r.body.id);
  });
});

describe("phases, system voltage and nearby voltage", () => {
  it("a single-phase tap's system voltage must be above its voltage to ground (systemKv named)", async () => {
    const r = await dispatcher.json("/api/orders", "POST", order({ energized: true, voltageKv: 7.2, phases: 1, systemKv: 7.2 }));
    expect(r.status).toBe(422);
    expect(r.body.issues[0].field).toBe("systemKv");
  });

  it("phases is 1 or 3", async () => {
    const r = await dispatcher.json("/api/orders", "POST", order({ phases: 2 }));
    expect(r.status).toBe(422);
    expect(r.body.issues[0].field).toBe("phases");
  });

  it("nearby voltage must be a number of kV", async () => {
    const r = await dispatcher.json("/api/orders", "POST", order({ nearEnergizedKv: "lots" }));
    expect(r.status).toBe(422);
    expect(r.body.issues[0].field).toBe("nearEnergizedKv");
  });

  it("a 12.47Y/7.2 kV tap is stored and read back as entered (CREW-CHECK.md, Corrections 8)", async () => {
    const r = await dispatcher.json("/api/orders", "POST", order({ title: `Tap ${stamp}`, end: `${D}T15:00`, energized: true, voltageKv: 7.2, phases: 1, systemKv: 12.47, nearEnergizedKv: null }));
    expect(r.status).toBe(201);
    made.push(r.body.id);
    const got = await dispatcher.json(`/api/orders/${r.body.id}`);
    expect(got.status).toBe(200);
    const o = got.body.order ?? got.body;
    expect([o.phases, o.voltageKv, o.systemKv]).toEqual([1, 7.2, 12.47]);
  });
});

describe("a multi-day order's shifts reach the rules (REST counts the shifts, not the span)", () => {
  it("with shifts the crew rests between days; without them REST blocks one 58-hour stretch; the board carries the nearby voltage", async () => {
    const r = await dispatcher.json("/api/orders", "POST", order({ shifts: shifts3 }));
    expect(r.status).toBe(201);
    const id = r.body.id as number;
    made.push(id);
    const got = await dispatcher.json(`/api/orders/${id}`);
    const view = got.body.order ?? got.body;
    expect(view.shifts).toEqual(shifts3.map((s) => ({ startLocal: s.start, endLocal: s.end })));

    // Two journeymen, one aloft and one on the ground (each holds aerial rescue in the demo),
    // and a crew lead: CP-1007 Jesse Navarro, CP-1003 Tomas Lindqvist, CP-1012 Andre Beauchamp.
    const ids = Object.fromEntries(
      (await conn("workers").whereIn("employee_no", ["CP-1003", "CP-1007", "CP-1012"]).select("id", "employee_no")).map((w) => [w.employee_no, Number(w.id)]),
    );
    const seats = Object.fromEntries((await conn("positions").where({ work_order_id: id }).select("id", "position")).map((p) => [p.position, Number(p.id)]));
    for (const [position, no] of [["lead", "CP-1003"], ["aerial", "CP-1007"], ["ground", "CP-1012"]] as const) {
      const placed = await dispatcher.json("/api/assignments", "POST", { positionId: seats[position], workerId: ids[no] });
      expect(placed.status, `${position} ${no}`).toBe(201);
    }
    const rulesOn = async () => {
      const b = await dispatcher.json(`/api/board?yard=NOR&date=${D}`);
      expect(b.status).toBe(200);
      const card = b.body.orders.find((o: { id: number }) => o.id === id);
      return { card, rules: b.body.findings.filter((f: { workOrderId: string }) => f.workOrderId === String(id)).map((f: { rule: string }) => f.rule) as string[] };
    };
    const withShifts = await rulesOn();
    // 07:00–17:00 three days running: 14 h rest between shifts (policy 8 h), each stretch 10 h (max 16 h).
    expect(withShifts.rules).not.toContain("REST");
    expect(withShifts.card.nearEnergizedKv).toBe(12.47);
    expect(withShifts.card.shifts).toHaveLength(3);
    // De-energized beside 12.47 kV: the two-worker minimum still applies (1910.269(l)(2)(i)(B)),
    // and three qualified workers meet it.
    expect(withShifts.rules).not.toContain("CREW_MIN");

    const now = await dispatcher.json(`/api/orders/${id}`);
    const cleared = await dispatcher.json(`/api/orders/${id}`, "PATCH", { shifts: [], version: (now.body.order ?? now.body).version });
    expect(cleared.status).toBe(200);
    expect((cleared.body.order ?? cleared.body).shifts).toEqual([]);
    const withoutShifts = await rulesOn();
    // The whole span is then worked time: 07:00 day 1 to 17:00 day 3 is 58 h > 16 h.
    expect(withoutShifts.rules).toContain("REST");
  });

  it("a PATCH that leaves a shift outside the moved order is refused, naming the shift", async () => {
    const r = await dispatcher.json("/api/orders", "POST", order({ title: `Move ${stamp}`, shifts: shifts3 }));
    expect(r.status).toBe(201);
    made.push(r.body.id);
    const moved = await dispatcher.json(`/api/orders/${r.body.id}`, "PATCH", { end: `${addDays(D, 1)}T17:00`, version: 1 });
    expect(moved.status).toBe(422);
    expect(moved.body.issues.map((i: { field: string }) => i.field)).toContain("shifts.2.end");
  });
});
