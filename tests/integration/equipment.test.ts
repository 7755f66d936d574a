import knex, { type Knex } from "knex";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { dbConfig } from "@/knexfile";
import { as, Client, type DemoRole } from "@/tests/support/client";
import { makeOrder, removeMadeOrders, yard } from "@/tests/support/fixtures";
import { addDays, todayIn } from "@/lib/time/days";

// The equipment register and equipment bookings through the running app (APP_URL) and its
// database (DB_NAME). Roles as issue 16 gives them: dispatcher, supervisor and admin edit the
// register; every signed-in role reads it; dispatchers and supervisors book trucks on orders.

let db: Knex;
const clients = new Map<DemoRole, Client>();
const client = async (role: DemoRole) => {
  if (!clients.has(role)) clients.set(role, await as(role, role === "dispatcher" ? "dispatch@cedarprairie.example" : undefined));
  return clients.get(role)!;
};
const run = Date.now().toString(36).slice(-6).toUpperCase();
let n = 0;
const unit = () => `IT-${run}-${++n}`;
let north: { id: number; timezone: string };
const OFFSET = 230; // days out: this file's own days, far from the demo's tomorrow
const madeEquipment: number[] = [];

async function truck(over: Record<string, unknown> = {}) {
  const today = todayIn(north.timezone);
  const [id] = await db("equipment").insert({
    organisation_id: 1,
    yard_id: north.id,
    kind: "bucket_truck",
    unit_number: unit(),
    name: "Integration bucket",
    insulated: true,
    dielectric_tested_on: addDays(today, -30),
    annual_inspection_on: addDays(today, -30),
    licence: "cdl_b",
    ...over,
  });
  madeEquipment.push(Number(id));
  return Number(id);
}

const count = async (table: string) => Number((await db(table).count({ c: "*" }).first())?.c);

beforeAll(async () => {
  db = knex(dbConfig());
  const y = await yard(db, "NOR");
  north = { id: Number(y.id), timezone: String(y.timezone) };
});

afterAll(async () => {
  await removeMadeOrders(db);
  const ours = await db("equipment").where("unit_number", "like", `IT-${run}-%`).pluck("id");
  const all = [...new Set([...madeEquipment, ...ours.map(Number)])];
  if (all.length) {
    await db("equipment_assignments").whereIn("equipment_id", all).delete();
    await db("equipment").whereIn("id", all).delete();
  }
  await db.destroy();
});

describe("equipment register", () => {
  it("every signed-in role reads it; the demo fleet is there with its rigging", async () => {
    for (const role of ["admin", "dispatcher", "supervisor", "hr", "lineworker"] as DemoRole[]) {
      const r = await (await client(role)).json("/api/equipment?yard=NOR");
      expect(r.status, role).toBe(200);
      expect(r.body.equipment.every((e: { yardCode: string }) => e.yardCode === "NOR")).toBe(true);
    }
    const r = await (await client("hr")).json("/api/equipment?kind=digger_derrick");
    expect(r.status).toBe(200);
    expect(r.body.equipment.length).toBeGreaterThan(0);
    expect(r.body.equipment.every((e: { kind: string }) => e.kind === "digger_derrick")).toBe(true);
    const withRigging = r.body.equipment.find((e: { rigging: unknown[] }) => e.rigging.length > 0);
    expect(withRigging).toBeTruthy();
  });

  it("lineworker and hr cannot write (403), nothing stored", async () => {
    const before = await count("equipment");
    for (const role of ["lineworker", "hr"] as DemoRole[]) {
      const c = await client(role);
      const r = await c.json("/api/equipment", "POST", { yardId: north.id, kind: "pickup", unitNumber: unit(), name: "Should not exist" });
      expect(r.status, role).toBe(403);
      const id = await truck();
      const p = await c.json(`/api/equipment/${id}`, "PATCH", { name: "Renamed", version: 1 });
      expect(p.status, role).toBe(403);
      const g = await c.json(`/api/equipment/${id}/rigging`, "POST", { kind: "hand_line", label: "x", wllLb: 450 });
      expect(g.status, role).toBe(403);
      const b = await c.json("/api/equipment-assignments", "POST", { workOrderId: 1, equipmentId: id });
      expect(b.status, role).toBe(403);
    }
    expect(await count("equipment")).toBe(before + 2); // only the two trucks this test inserted itself
  });

  it("dispatcher, supervisor and admin create, edit and retire equipment, each with an audit row", async () => {
    for (const role of ["dispatcher", "supervisor", "admin"] as DemoRole[]) {
      const c = await client(role);
      const u = unit();
      const r = await c.json("/api/equipment", "POST", {
        yardId: north.id,
        kind: "bucket_truck",
        unitNumber: u,
        name: "Form bucket",
        insulated: true,
        dielectricTestedOn: addDays(todayIn(north.timezone), -10),
        annualInspectionOn: null,
        licence: "cdl_b",
      });
      expect(r.status, role).toBe(201);
      const id = r.body.equipment.id;
      expect(r.body.equipment).toMatchObject({ unitNumber: u, insulated: true, licence: "cdl_b", outOfService: false, version: 1 });
      const audit = await db("audit_log").where({ entity: "equipment", entity_id: String(id), action: "equipment.create" }).first();
      expect(audit, role).toBeTruthy();

      const oos = await c.json(`/api/equipment/${id}`, "PATCH", { outOfService: true, outOfServiceReason: "Boom cylinder seeping", version: 1 });
      expect(oos.status, role).toBe(200);
      expect(oos.body.equipment).toMatchObject({ outOfService: true, outOfServiceReason: "Boom cylinder seeping", version: 2 });
      // A stale version is a 409 and changes nothing.
      const stale = await c.json(`/api/equipment/${id}`, "PATCH", { name: "Stale", version: 1 });
      expect(stale.status).toBe(409);
      expect((await db("equipment").where({ id }).first()).name).toBe("Form bucket");
    }
  });

  it("bad input: 422 naming the field, nothing stored", async () => {
    const c = await client("dispatcher");
    const before = await count("equipment");
    const cases: [Record<string, unknown>, string][] = [
      [{ yardId: north.id, kind: "crane", unitNumber: unit(), name: "x" }, "kind"],
      [{ yardId: north.id, kind: "pickup", unitNumber: "", name: "x" }, "unitNumber"],
      [{ yardId: north.id, kind: "pickup", unitNumber: unit(), name: "" }, "name"],
      [{ yardId: north.id, kind: "pickup", unitNumber: unit(), name: "x", dielectricTestedOn: "2026-02-30" }, "dielectricTestedOn"],
      [{ yardId: north.id, kind: "pickup", unitNumber: unit(), name: "x", licence: "cdl_c" }, "licence"],
      [{ yardId: north.id, kind: "pickup", unitNumber: unit(), name: "x", outOfService: true }, "outOfServiceReason"],
      [{ yardId: north.id, kind: "pickup", unitNumber: unit(), name: "x", colour: "red" }, "(body)"],
    ];
    for (const [body, field] of cases) {
      const r = await c.json("/api/equipment", "POST", body);
      expect(r.status, JSON.stringify(body)).toBe(422);
      expect(r.body.issues.map((i: { field: string }) => i.field), JSON.stringify(body)).toContain(field);
    }
    // An unknown yard: a supervisor (every yard in scope) gets 422 naming yardId; a dispatcher is
    // stopped earlier by the yard scope (403: not one of their yards).
    const noYard = { yardId: 999999, kind: "pickup", unitNumber: unit(), name: "x" };
    const sup = await (await client("supervisor")).json("/api/equipment", "POST", noYard);
    expect(sup.status).toBe(422);
    expect(sup.body.issues[0].field).toBe("yardId");
    expect((await c.json("/api/equipment", "POST", noYard)).status).toBe(403);
    expect(await count("equipment")).toBe(before);

    const id = await truck();
    const rigBefore = await count("equipment_rigging");
    const rig: [Record<string, unknown>, string][] = [
      [{ kind: "rope_block", label: "Blocks", partsOfLine: 0, wllLb: 2000 }, "partsOfLine"], // zero parts of line (issue 16)
      [{ kind: "rope_block", label: "Blocks", partsOfLine: 3, wllLb: -5 }, "wllLb"], // a negative weight
      [{ kind: "rope_block", label: "Blocks", partsOfLine: 2.5, wllLb: 2000 }, "partsOfLine"],
      [{ kind: "hand_line", label: "", wllLb: 450 }, "label"],
      [{ kind: "chain", label: "x", wllLb: 450 }, "kind"],
      [{ kind: "sling", label: "x", wllLb: 450, inspectedOn: "yesterday" }, "inspectedOn"],
    ];
    for (const [body, field] of rig) {
      const r = await c.json(`/api/equipment/${id}/rigging`, "POST", body);
      expect(r.status, JSON.stringify(body)).toBe(422);
      expect(r.body.issues.map((i: { field: string }) => i.field), JSON.stringify(body)).toContain(field);
    }
    expect(await count("equipment_rigging")).toBe(rigBefore);

    const ok = await c.json(`/api/equipment/${id}/rigging`, "POST", { kind: "rope_block", label: "3-part blocks", partsOfLine: 3, wllLb: 2000 });
    expect(ok.status).toBe(201);
    // Sheaves default to the parts of line (CREW-CHECK.md: `sheaves` default `partsOfLine`).
    expect(ok.body.rigging).toMatchObject({ kind: "rope_block", partsOfLine: 3, sheaves: 3, wllLb: 2000 });
    const del = await c.json(`/api/equipment/${id}/rigging/${ok.body.rigging.id}`, "DELETE");
    expect(del.status).toBe(200);
    expect(await db("equipment_rigging").where({ id: ok.body.rigging.id }).first()).toBeUndefined();

    // A unit number already in the register: 409 naming the field.
    const u = (await db("equipment").where({ id }).first()).unit_number;
    const dup = await c.json("/api/equipment", "POST", { yardId: north.id, kind: "pickup", unitNumber: u, name: "Twin" });
    expect(dup.status).toBe(409);
    expect(dup.body.issues[0].field).toBe("unitNumber");
  });
});

describe("equipment bookings", () => {
  it("books a truck, refuses it on an overlapping order (409), allows a touching one, refuses an out-of-service truck (422)", async () => {
    const c = await client("dispatcher");
    const id = await truck();
    const a = await makeOrder(db, { offsetDays: OFFSET, positions: ["lead", "ground"], workType: "bucket", start: "07:00", end: "12:00" });
    const b = await makeOrder(db, { offsetDays: OFFSET, positions: ["lead"], workType: "bucket", start: "11:00", end: "15:00" });
    const t = await makeOrder(db, { offsetDays: OFFSET, positions: ["lead"], workType: "bucket", start: "12:00", end: "16:00" });
    const seqBefore = Number((await db("equipment").where({ id }).first()).booking_seq);

    const ok = await c.json("/api/equipment-assignments", "POST", { workOrderId: a.id, equipmentId: id });
    expect(ok.status).toBe(201);
    expect(ok.body.recheck.orderIds).toContain(String(a.id));
    // The booking writes the truck's row (the Galera certification key).
    expect(Number((await db("equipment").where({ id }).first()).booking_seq)).toBe(seqBefore + 1);
    expect(await db("audit_log").where({ action: "equipment.assign", entity_id: String(ok.body.assignmentId) }).first()).toBeTruthy();

    const clash = await c.json("/api/equipment-assignments", "POST", { workOrderId: b.id, equipmentId: id });
    expect(clash.status).toBe(409);
    expect(clash.body.error).toMatch(/EQUIPMENT_BOOKED/);
    expect(clash.body.error).toContain(a.number);

    // 07:00–12:00 and 12:00–16:00 touch; touching is not overlap (PRODUCT.md, DOUBLE_BOOKED).
    const touching = await c.json("/api/equipment-assignments", "POST", { workOrderId: t.id, equipmentId: id });
    expect(touching.status).toBe(201);

    const retired = await truck({ out_of_service: true, out_of_service_reason: "Failed dielectric test" });
    const refused = await c.json("/api/equipment-assignments", "POST", { workOrderId: b.id, equipmentId: retired });
    expect(refused.status).toBe(422);
    expect(refused.body.issues[0].field).toBe("equipmentId");
    expect(refused.body.error).toMatch(/out of service/);
    expect(await db("equipment_assignments").where({ equipment_id: retired }).first()).toBeUndefined();

    // Putting a booked truck out of service is refused while it is on an open order.
    const v = Number((await db("equipment").where({ id }).first()).version);
    const oos = await c.json(`/api/equipment/${id}`, "PATCH", { outOfService: true, outOfServiceReason: "Hydraulic leak", version: v });
    expect(oos.status).toBe(409);
    expect(oos.body.error).toContain(a.number);

    // Off again (stale version: 409; current: 200).
    const stale = await c.json(`/api/equipment-assignments/${ok.body.assignmentId}?version=7`, "DELETE");
    expect(stale.status).toBe(409);
    const off = await c.json(`/api/equipment-assignments/${ok.body.assignmentId}?version=1`, "DELETE");
    expect(off.status).toBe(200);
    const now = await c.json("/api/equipment-assignments", "POST", { workOrderId: b.id, equipmentId: id });
    // b (11:00–15:00) overlaps t (12:00–16:00), which still has the truck.
    expect(now.status).toBe(409);
  });

  it("moves a booked truck to another order in one step, even an overlapping one it leaves; refuses a move onto a clash", async () => {
    const c = await client("dispatcher");
    const id = await truck();
    const a = await makeOrder(db, { offsetDays: OFFSET + 3, positions: ["lead"], workType: "bucket", start: "07:00", end: "12:00" });
    const b = await makeOrder(db, { offsetDays: OFFSET + 3, positions: ["lead"], workType: "bucket", start: "11:00", end: "15:00" });
    const c2 = await makeOrder(db, { offsetDays: OFFSET + 3, positions: ["lead"], workType: "bucket", start: "14:00", end: "18:00" });
    const booked = await c.json("/api/equipment-assignments", "POST", { workOrderId: a.id, equipmentId: id });
    expect(booked.status).toBe(201);
    const moved = await c.json(`/api/equipment-assignments/${booked.body.assignmentId}`, "PATCH", { workOrderId: b.id, version: 1 });
    expect(moved.status).toBe(200);
    const rows = await db("equipment_assignments").where({ equipment_id: id }).select("work_order_id", "version");
    expect(rows).toEqual([{ work_order_id: b.id, version: 2 }]);
    expect(await db("audit_log").where({ action: "equipment.move", entity_id: String(booked.body.assignmentId) }).first()).toBeTruthy();
    // Stale version: 409, nothing moves.
    expect((await c.json(`/api/equipment-assignments/${booked.body.assignmentId}`, "PATCH", { workOrderId: a.id, version: 1 })).status).toBe(409);
    // A second truck on c2 (14:00–18:00) and on a (07:00–12:00): moving its booking from a to b (11:00–15:00) would overlap c2.
    const second = await truck();
    const s1 = await c.json("/api/equipment-assignments", "POST", { workOrderId: c2.id, equipmentId: second });
    expect(s1.status).toBe(201);
    const s2 = await c.json("/api/equipment-assignments", "POST", { workOrderId: a.id, equipmentId: second });
    expect(s2.status).toBe(201); // a (07–12) and c2 (14–18) do not overlap
    const clash = await c.json(`/api/equipment-assignments/${s2.body.assignmentId}`, "PATCH", { workOrderId: b.id, version: 1 });
    expect(clash.status).toBe(409); // b (11–15) overlaps c2, where the truck also is
    expect(clash.body.error).toContain(c2.number);
    expect((await c.json(`/api/equipment-assignments/${s2.body.assignmentId}`, "PATCH", { workOrderId: 0, version: 1 })).status).toBe(422);
  });

  it("two concurrent drops of one truck onto overlapping orders: exactly one wins, the other gets 409", async () => {
    const [d, s] = await Promise.all([client("dispatcher"), client("supervisor")]);
    for (let round = 0; round < 5; round++) {
      const id = await truck();
      const orders = await Promise.all([0, 1].map(() => makeOrder(db, { offsetDays: OFFSET + 1, positions: ["lead"], workType: "bucket", start: "08:00", end: "14:00" })));
      const res = await Promise.all([
        d.json("/api/equipment-assignments", "POST", { workOrderId: orders[0].id, equipmentId: id }),
        s.json("/api/equipment-assignments", "POST", { workOrderId: orders[1].id, equipmentId: id }),
      ]);
      expect(res.map((r) => r.status).sort(), `round ${round}`).toEqual([201, 409]);
      expect(Number((await db("equipment_assignments").where({ equipment_id: id }).count({ c: "*" }).first())?.c)).toBe(1);
    }
  });

  it("the board carries the equipment, the bookings and the snapshot's EQUIPMENT finding until a bucket truck is on the order", async () => {
    const c = await client("dispatcher");
    const o = await makeOrder(db, { offsetDays: OFFSET + 2, positions: ["lead", "ground"], workType: "bucket" });
    const board = async () => (await c.json(`/api/board?yard=NOR&date=${o.day}`)).body;
    let b = await board();
    expect(b.equipment.length).toBeGreaterThan(0);
    expect(b.snapshot.equipment.length).toBe(b.equipment.length);
    const equipmentFindings = (x: { findings: { rule: string; workOrderId: string }[] }) => x.findings.filter((f) => f.rule === "EQUIPMENT" && f.workOrderId === String(o.id));
    // CREW-CHECK.md: a `bucket` order without a bucket truck is an EQUIPMENT block.
    expect(equipmentFindings(b).length).toBeGreaterThan(0);
    const id = await truck();
    const r = await c.json("/api/equipment-assignments", "POST", { workOrderId: o.id, equipmentId: id });
    expect(r.status).toBe(201);
    expect(r.body.recheck.findings.filter((f: { rule: string; workOrderId: string }) => f.rule === "EQUIPMENT" && f.workOrderId === String(o.id))).toEqual([]);
    b = await board();
    expect(b.equipmentBookings).toContainEqual(expect.objectContaining({ workOrderId: o.id, equipmentId: id }));
    expect(b.snapshot.equipmentAssignments).toContainEqual({ workOrderId: String(o.id), equipmentId: String(id) });
    expect(equipmentFindings(b)).toEqual([]);
  });
});
