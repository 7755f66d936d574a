// The equipment register and equipment bookings on Knex (server side only: lib/server-only.ts;
// like every data module, nothing in a client component imports this file).
//
// Bookings follow the assignment write path (lib/assignments/data.ts): one READ COMMITTED
// transaction locks the order, then the truck's row, checks the truck is not on an overlapping
// order, inserts, and WRITES the truck's row (booking_seq + 1). The row lock serialises two
// bookings of one truck on one server; the write makes a Galera cluster's certification refuse
// the second of two bookings made on different nodes (where FOR UPDATE locks only locally).
import "@/lib/server-only";
import type { Knex } from "knex";
import { ApiError } from "@/lib/api/http";
import { audit, type Actor } from "@/lib/audit/data";
import { boardEvent } from "@/lib/events/data";
import {
  REQUIRED_KIND,
  toRuleEquipment,
  type Equipment,
  type EquipmentAssignInput,
  type EquipmentCreate,
  type EquipmentMoveInput,
  type EquipmentPatch,
  type RiggingCreate,
  type RiggingItem,
  type RuleEquipment,
  type RuleEquipmentAssignment,
} from "./model";

type Q = Knex | Knex.Transaction;
const TX = { isolationLevel: "read committed" as const };

function toRigging(r: Record<string, any>): RiggingItem {
  return {
    id: Number(r.id),
    equipmentId: Number(r.equipment_id),
    kind: r.kind,
    label: r.label,
    partsOfLine: r.parts_of_line === null ? null : Number(r.parts_of_line),
    sheaves: r.sheaves === null ? null : Number(r.sheaves),
    wllLb: Number(r.wll_lb),
    inspectedOn: r.inspected_on ?? null,
  };
}

function toEquipment(r: Record<string, any>, rigging: RiggingItem[]): Equipment {
  return {
    id: Number(r.id),
    yardId: Number(r.yard_id),
    yardCode: String(r.yard_code),
    kind: r.kind,
    unitNumber: r.unit_number,
    name: r.name,
    insulated: Boolean(r.insulated),
    dielectricTestedOn: r.dielectric_tested_on ?? null,
    annualInspectionOn: r.annual_inspection_on ?? null,
    licence: r.licence ?? null,
    outOfService: Boolean(r.out_of_service),
    outOfServiceReason: r.out_of_service_reason ?? null,
    version: Number(r.version),
    rigging: rigging.filter((g) => g.equipmentId === Number(r.id)),
  };
}

export async function listEquipment(
  db: Q,
  organisationId: number,
  f: { yardCode?: string; kind?: string; inService?: boolean; ids?: number[]; withRigging?: boolean } = {},
): Promise<Equipment[]> {
  const q = db("equipment as e")
    .join("yards as y", "y.id", "e.yard_id")
    .where("e.organisation_id", organisationId)
    .select("e.*", "y.code as yard_code")
    .orderBy([{ column: "y.code" }, { column: "e.kind" }, { column: "e.unit_number" }]);
  if (f.yardCode) q.where("y.code", f.yardCode);
  if (f.kind) q.where("e.kind", f.kind);
  if (f.inService !== undefined) q.where("e.out_of_service", !f.inService);
  if (f.ids) q.whereIn("e.id", f.ids);
  const rows = await q;
  const rigging = rows.length && f.withRigging !== false
    ? (await db("equipment_rigging").whereIn("equipment_id", rows.map((r) => r.id)).orderBy(["equipment_id", "kind", "id"])).map(toRigging)
    : [];
  return rows.map((r) => toEquipment(r, rigging));
}

export async function getEquipment(db: Q, organisationId: number, id: number): Promise<Equipment> {
  const [e] = await listEquipment(db, organisationId, { ids: [id] });
  if (!e) throw new ApiError(404, "No such equipment.");
  return e;
}

async function assertYard(trx: Q, organisationId: number, yardId: number) {
  const y = await trx("yards").where({ id: yardId, organisation_id: organisationId }).first("id");
  if (!y) throw new ApiError(422, "Invalid yardId: no such yard.", { issues: [{ field: "yardId", message: "No such yard" }] });
}

function duplicateUnit(err: unknown, unit: string | undefined): never {
  if ((err as { code?: string })?.code === "ER_DUP_ENTRY") {
    const message = `Unit number ${unit} is already in the register`;
    throw new ApiError(409, message, { issues: [{ field: "unitNumber", message }] });
  }
  throw err;
}

/** Open orders from today on that the truck is booked on (what stops putting it out of service). */
async function upcomingBookings(trx: Q, equipmentId: number) {
  return trx("equipment_assignments as ea")
    .join("work_orders as o", "o.id", "ea.work_order_id")
    .where("ea.equipment_id", equipmentId)
    .whereNotIn("o.status", ["cancelled", "done"])
    .where("o.end_at", ">", new Date())
    .orderBy("o.start_at")
    .pluck("o.number") as Promise<string[]>;
}

export async function createEquipment(db: Knex, actor: Actor, input: EquipmentCreate): Promise<Equipment> {
  try {
    return await db.transaction(async (trx) => {
      await assertYard(trx, actor.organisationId, input.yardId);
      const [id] = await trx("equipment").insert({
        organisation_id: actor.organisationId,
        yard_id: input.yardId,
        kind: input.kind,
        unit_number: input.unitNumber,
        name: input.name,
        insulated: input.insulated,
        dielectric_tested_on: input.dielectricTestedOn,
        annual_inspection_on: input.annualInspectionOn,
        licence: input.licence,
        out_of_service: input.outOfService,
        out_of_service_reason: input.outOfService ? input.outOfServiceReason : null,
      });
      await audit(trx, actor, actor.organisationId, "equipment.create", "equipment", id, { ...input });
      await boardEvent(trx, { organisationId: actor.organisationId, yardId: null, day: null, kind: "equipment", payload: { equipmentId: id } });
      return getEquipment(trx, actor.organisationId, Number(id));
    });
  } catch (err) {
    duplicateUnit(err, input.unitNumber);
  }
}

export async function updateEquipment(db: Knex, actor: Actor, id: number, patch: EquipmentPatch): Promise<Equipment> {
  try {
    return await db.transaction(async (trx) => {
      const before = await trx("equipment").where({ id, organisation_id: actor.organisationId }).forUpdate().first();
      if (!before) throw new ApiError(404, "No such equipment.");
      if (before.version !== patch.version) {
        throw new ApiError(409, `${before.unit_number} was changed by someone else; reload and try again.`, {
          current: await getEquipment(trx, actor.organisationId, id),
        });
      }
      if (patch.yardId !== undefined) await assertYard(trx, actor.organisationId, patch.yardId);
      const cols: Record<string, unknown> = {};
      const map: [keyof EquipmentPatch, string][] = [
        ["yardId", "yard_id"],
        ["kind", "kind"],
        ["unitNumber", "unit_number"],
        ["name", "name"],
        ["insulated", "insulated"],
        ["dielectricTestedOn", "dielectric_tested_on"],
        ["annualInspectionOn", "annual_inspection_on"],
        ["licence", "licence"],
        ["outOfService", "out_of_service"],
        ["outOfServiceReason", "out_of_service_reason"],
      ];
      for (const [k, col] of map) if (patch[k] !== undefined) cols[col] = patch[k];
      const goingOut = patch.outOfService === true && !before.out_of_service;
      if (goingOut) {
        const booked = await upcomingBookings(trx, id);
        if (booked.length) {
          const message = `${before.unit_number} is on ${booked.join(", ")}; take it off ${booked.length > 1 ? "those orders" : "that order"} before putting it out of service`;
          throw new ApiError(409, message, { issues: [{ field: "outOfService", message }] });
        }
      }
      if (patch.outOfService === false) cols.out_of_service_reason = null;
      if (patch.outOfService === undefined && patch.outOfServiceReason !== undefined && !before.out_of_service) cols.out_of_service_reason = null;
      if (patch.kind !== undefined && patch.kind !== before.kind) {
        const booked = await upcomingBookings(trx, id);
        if (booked.length) {
          const message = `${before.unit_number} is on ${booked.join(", ")}; its kind cannot change while it is booked`;
          throw new ApiError(409, message, { issues: [{ field: "kind", message }] });
        }
      }
      await trx("equipment")
        .where({ id })
        .update({ ...cols, version: before.version + 1, updated_at: new Date() });
      const { version: _v, ...after } = patch;
      await audit(trx, actor, actor.organisationId, goingOut ? "equipment.out_of_service" : "equipment.update", "equipment", id, {
        unit: before.unit_number,
        after,
      });
      await boardEvent(trx, { organisationId: actor.organisationId, yardId: null, day: null, kind: "equipment", payload: { equipmentId: id } });
      return getEquipment(trx, actor.organisationId, id);
    });
  } catch (err) {
    duplicateUnit(err, patch.unitNumber);
  }
}

export async function addRigging(db: Knex, actor: Actor, equipmentId: number, input: RiggingCreate): Promise<RiggingItem> {
  return db.transaction(async (trx) => {
    const e = await trx("equipment").where({ id: equipmentId, organisation_id: actor.organisationId }).forUpdate().first();
    if (!e) throw new ApiError(404, "No such equipment.");
    const parts = input.kind === "rope_block" ? input.partsOfLine : null;
    const sheaves = input.kind === "rope_block" ? (input.sheaves ?? input.partsOfLine) : null;
    const [id] = await trx("equipment_rigging").insert({
      equipment_id: equipmentId,
      kind: input.kind,
      label: input.label,
      parts_of_line: parts,
      sheaves,
      wll_lb: input.wllLb,
      inspected_on: input.inspectedOn,
    });
    await trx("equipment").where({ id: equipmentId }).update({ version: e.version + 1, updated_at: new Date() });
    await audit(trx, actor, actor.organisationId, "equipment.rigging_add", "equipment", equipmentId, { unit: e.unit_number, riggingId: id, ...input });
    await boardEvent(trx, { organisationId: actor.organisationId, kind: "equipment", payload: { equipmentId } });
    return toRigging(await trx("equipment_rigging").where({ id }).first());
  });
}

export async function removeRigging(db: Knex, actor: Actor, equipmentId: number, riggingId: number) {
  return db.transaction(async (trx) => {
    const e = await trx("equipment").where({ id: equipmentId, organisation_id: actor.organisationId }).forUpdate().first();
    if (!e) throw new ApiError(404, "No such equipment.");
    const item = await trx("equipment_rigging").where({ id: riggingId, equipment_id: equipmentId }).first();
    if (!item) throw new ApiError(404, "No such rigging item on this equipment.");
    await trx("equipment_rigging").where({ id: riggingId }).delete();
    await trx("equipment").where({ id: equipmentId }).update({ version: e.version + 1, updated_at: new Date() });
    await audit(trx, actor, actor.organisationId, "equipment.rigging_remove", "equipment", equipmentId, { unit: e.unit_number, riggingId, label: item.label });
    await boardEvent(trx, { organisationId: actor.organisationId, kind: "equipment", payload: { equipmentId } });
  });
}

// --- bookings ---------------------------------------------------------------------------

export interface EquipmentBookingState {
  orderId: number;
  version: number;
  equipment: { assignmentId: number; equipmentId: number; version: number }[];
}

async function bookingState(q: Q, orderIds: number[]): Promise<EquipmentBookingState[]> {
  const [orders, rows] = await Promise.all([
    q("work_orders").whereIn("id", orderIds).select("id", "version"),
    q("equipment_assignments").whereIn("work_order_id", orderIds).select("id", "work_order_id", "equipment_id", "version"),
  ]);
  return orders.map((o) => ({
    orderId: o.id,
    version: o.version,
    equipment: rows
      .filter((r) => r.work_order_id === o.id)
      .map((r) => ({ assignmentId: r.id, equipmentId: r.equipment_id, version: r.version })),
  }));
}

const CLOSED = new Set(["done", "cancelled"]);

async function withRetry<T>(fn: () => Promise<T>): Promise<T> {
  for (let attempt = 0; ; attempt++) {
    try {
      return await fn();
    } catch (err) {
      const code = (err as { code?: string }).code;
      if ((code === "ER_LOCK_DEADLOCK" || code === "ER_LOCK_WAIT_TIMEOUT") && attempt < 3) continue;
      throw err;
    }
  }
}

export interface BookingResult {
  assignmentId: number;
  orderIds: number[];
  equipmentIds: number[];
  current: EquipmentBookingState[];
}

export async function bookEquipment(db: Knex, actor: Actor, input: EquipmentAssignInput): Promise<BookingResult> {
  return withRetry(() =>
    db.transaction(async (trx) => {
      // 1. the order (the same lock the people's writes take first)
      const order = await trx("work_orders")
        .where({ id: input.workOrderId })
        .forUpdate()
        .first("id", "organisation_id", "number", "status", "version", "start_at", "end_at", "yard_id", "work_date");
      if (!order || order.organisation_id !== actor.organisationId) {
        throw new ApiError(422, "Invalid workOrderId: no such work order.", { issues: [{ field: "workOrderId", message: "No such work order" }] });
      }
      if (CLOSED.has(order.status)) throw new ApiError(409, `${order.number} is ${order.status}; its equipment can no longer change.`);
      if (input.orderVersion !== undefined && input.orderVersion !== order.version) {
        throw new ApiError(409, `${order.number} was changed by someone else; the card has been refreshed.`, { current: await bookingState(trx, [order.id]) });
      }
      // 2. the truck
      const e = await trx("equipment").where({ id: input.equipmentId }).forUpdate().first();
      if (!e || e.organisation_id !== actor.organisationId) {
        throw new ApiError(422, "Invalid equipmentId: no such equipment.", { issues: [{ field: "equipmentId", message: "No such equipment" }] });
      }
      if (e.out_of_service) {
        const message = `${e.unit_number} ${e.name} is out of service${e.out_of_service_reason ? ` (${e.out_of_service_reason})` : ""}; it cannot go on an order`;
        throw new ApiError(422, `Invalid equipmentId: ${message}.`, { issues: [{ field: "equipmentId", message }] });
      }
      const already = await trx("equipment_assignments").where({ work_order_id: order.id, equipment_id: e.id }).first("id");
      if (already) throw new ApiError(409, `${e.unit_number} is already on ${order.number}.`, { current: await bookingState(trx, [order.id]) });
      // 3. never a truck on two overlapping orders (touching end and start is not overlap).
      // A plain read under the truck's lock, which every booking of this truck takes first.
      const clash = await trx("equipment_assignments as ea")
        .join("work_orders as o", "o.id", "ea.work_order_id")
        .where("ea.equipment_id", e.id)
        .whereNot("o.id", order.id)
        .whereNot("o.status", "cancelled")
        .where("o.start_at", "<", order.end_at)
        .where("o.end_at", ">", order.start_at)
        .first("o.number");
      if (clash) {
        throw new ApiError(409, `${e.unit_number} ${e.name} is already on ${clash.number} at that time (EQUIPMENT_BOOKED). Take it off that order first.`, {
          current: await bookingState(trx, [order.id]),
        });
      }
      const [id] = await trx("equipment_assignments").insert({ work_order_id: order.id, equipment_id: e.id, created_by: actor.id });
      // 4. write the truck's row: the Galera certification key for this booking.
      await trx("equipment").where({ id: e.id }).increment("booking_seq", 1);
      await trx("work_orders").where({ id: order.id }).increment("version", 1).update({ updated_at: new Date() });
      await audit(trx, actor, actor.organisationId, "equipment.assign", "equipment_assignment", id, {
        order: order.number,
        equipmentId: e.id,
        unit: e.unit_number,
      });
      await boardEvent(trx, { organisationId: actor.organisationId, yardId: order.yard_id, day: order.work_date, kind: "equipment", payload: { orderId: order.id } });
      return { assignmentId: Number(id), orderIds: [order.id], equipmentIds: [e.id], current: await bookingState(trx, [order.id]) };
    }, TX),
  );
}

export async function unbookEquipment(db: Knex, actor: Actor, assignmentId: number, input: { version: number }): Promise<BookingResult> {
  return withRetry(() =>
    db.transaction(async (trx) => {
      const row = await trx("equipment_assignments").where({ id: assignmentId }).first();
      if (!row) throw new ApiError(404, "No such equipment booking (it may have been removed).");
      const order = await trx("work_orders").where({ id: row.work_order_id }).forUpdate().first("id", "organisation_id", "number", "status", "yard_id", "work_date");
      if (!order || order.organisation_id !== actor.organisationId) throw new ApiError(404, "No such equipment booking.");
      if (CLOSED.has(order.status)) throw new ApiError(409, `${order.number} is ${order.status}; its equipment can no longer change.`);
      const e = await trx("equipment").where({ id: row.equipment_id }).forUpdate().first("id", "unit_number");
      const locked = await trx("equipment_assignments").where({ id: assignmentId }).forUpdate().first();
      if (!locked || locked.version !== input.version) {
        throw new ApiError(409, "This booking was changed by someone else; the card has been refreshed.", { current: await bookingState(trx, [order.id]) });
      }
      await trx("equipment_assignments").where({ id: assignmentId }).delete();
      await trx("equipment").where({ id: row.equipment_id }).increment("booking_seq", 1);
      await trx("work_orders").where({ id: order.id }).increment("version", 1).update({ updated_at: new Date() });
      await audit(trx, actor, actor.organisationId, "equipment.unassign", "equipment_assignment", assignmentId, {
        order: order.number,
        equipmentId: row.equipment_id,
        unit: e?.unit_number ?? null,
      });
      await boardEvent(trx, { organisationId: actor.organisationId, yardId: order.yard_id, day: order.work_date, kind: "equipment", payload: { orderId: order.id } });
      return { assignmentId, orderIds: [order.id], equipmentIds: [row.equipment_id], current: await bookingState(trx, [order.id]) };
    }, TX),
  );
}

/**
 * Moves a booked truck to another order in one transaction: both orders locked in id order,
 * then the truck; the overlap check leaves out the booking being moved.
 */
export async function moveEquipment(db: Knex, actor: Actor, assignmentId: number, input: EquipmentMoveInput): Promise<BookingResult> {
  return withRetry(() =>
    db.transaction(async (trx) => {
      const row = await trx("equipment_assignments").where({ id: assignmentId }).first();
      if (!row) throw new ApiError(404, "No such equipment booking (it may have been removed).");
      const ids = [...new Set([Number(row.work_order_id), input.workOrderId])].sort((a, b) => a - b);
      const locked = await trx("work_orders")
        .whereIn("id", ids)
        .orderBy("id")
        .forUpdate()
        .select("id", "organisation_id", "number", "status", "version", "start_at", "end_at", "yard_id", "work_date");
      const from = locked.find((o) => o.id === Number(row.work_order_id));
      const to = locked.find((o) => o.id === input.workOrderId);
      if (!from || from.organisation_id !== actor.organisationId) throw new ApiError(404, "No such equipment booking.");
      if (!to || to.organisation_id !== actor.organisationId) {
        throw new ApiError(422, "Invalid workOrderId: no such work order.", { issues: [{ field: "workOrderId", message: "No such work order" }] });
      }
      for (const o of [from, to]) if (CLOSED.has(o.status)) throw new ApiError(409, `${o.number} is ${o.status}; its equipment can no longer change.`);
      const e = await trx("equipment").where({ id: row.equipment_id }).forUpdate().first();
      const mine = await trx("equipment_assignments").where({ id: assignmentId }).forUpdate().first();
      if (!mine || mine.version !== input.version) {
        throw new ApiError(409, "This booking was changed by someone else; the card has been refreshed.", { current: await bookingState(trx, ids) });
      }
      if (from.id === to.id) return { assignmentId, orderIds: [from.id], equipmentIds: [e.id], current: await bookingState(trx, ids) };
      if (e.out_of_service) {
        const message = `${e.unit_number} ${e.name} is out of service${e.out_of_service_reason ? ` (${e.out_of_service_reason})` : ""}; it cannot go on an order`;
        throw new ApiError(422, `Invalid workOrderId: ${message}.`, { issues: [{ field: "workOrderId", message }] });
      }
      const already = await trx("equipment_assignments").where({ work_order_id: to.id, equipment_id: e.id }).first("id");
      if (already) throw new ApiError(409, `${e.unit_number} is already on ${to.number}.`, { current: await bookingState(trx, ids) });
      const clash = await trx("equipment_assignments as ea")
        .join("work_orders as o", "o.id", "ea.work_order_id")
        .where("ea.equipment_id", e.id)
        .whereNot("ea.id", assignmentId)
        .whereNot("o.id", to.id)
        .whereNot("o.status", "cancelled")
        .where("o.start_at", "<", to.end_at)
        .where("o.end_at", ">", to.start_at)
        .first("o.number");
      if (clash) {
        throw new ApiError(409, `${e.unit_number} ${e.name} is already on ${clash.number} at that time (EQUIPMENT_BOOKED). Take it off that order first.`, {
          current: await bookingState(trx, ids),
        });
      }
      await trx("equipment_assignments").where({ id: assignmentId }).update({ work_order_id: to.id, version: mine.version + 1 });
      await trx("equipment").where({ id: e.id }).increment("booking_seq", 1);
      await trx("work_orders").whereIn("id", ids).increment("version", 1).update({ updated_at: new Date() });
      await audit(trx, actor, actor.organisationId, "equipment.move", "equipment_assignment", assignmentId, {
        equipmentId: e.id,
        unit: e.unit_number,
        from: from.number,
        to: to.number,
      });
      for (const o of [from, to]) {
        await boardEvent(trx, { organisationId: actor.organisationId, yardId: o.yard_id, day: o.work_date, kind: "equipment", payload: { orderId: o.id } });
      }
      return { assignmentId, orderIds: ids, equipmentIds: [e.id], current: await bookingState(trx, ids) };
    }, TX),
  );
}

// --- what the rules and the board read ----------------------------------------------------

export interface EquipmentBooking {
  id: number;
  workOrderId: number;
  equipmentId: number;
  version: number;
}

/**
 * The equipment part of a rule snapshot: every piece of the organisation's equipment, the
 * bookings on the given orders, and the same trucks' bookings on other orders near the window
 * (with those orders' ids, so EQUIPMENT_BOOKED sees across yards and days).
 */
export async function equipmentForSnapshot(
  db: Q,
  organisationId: number,
  orderIds: number[],
  window: { from: Date; to: Date },
): Promise<{
  equipment: RuleEquipment[];
  equipmentAssignments: RuleEquipmentAssignment[];
  bookings: EquipmentBooking[];
  contextOrderIds: number[];
  rows: Equipment[];
}> {
  // The rules read no rigging: leave it out of every write's re-check.
  const rows = await listEquipment(db, organisationId, { withRigging: false });
  const on = orderIds.length
    ? await db("equipment_assignments").whereIn("work_order_id", orderIds).select("id", "work_order_id", "equipment_id", "version")
    : [];
  const trucks = [...new Set(on.map((r) => Number(r.equipment_id)))];
  const context = trucks.length
    ? await db("equipment_assignments as ea")
        .join("work_orders as o", "o.id", "ea.work_order_id")
        .whereIn("ea.equipment_id", trucks)
        .whereNotIn("ea.work_order_id", orderIds)
        .whereNot("o.status", "cancelled")
        .where("o.start_at", "<", window.to)
        .where("o.end_at", ">", window.from)
        .select("ea.id", "ea.work_order_id", "ea.equipment_id", "ea.version")
    : [];
  const all = [...on, ...context];
  const bookings = all.map((r) => ({ id: Number(r.id), workOrderId: Number(r.work_order_id), equipmentId: Number(r.equipment_id), version: Number(r.version) }));
  return {
    equipment: rows.map(toRuleEquipment),
    equipmentAssignments: bookings.map((b) => ({ workOrderId: String(b.workOrderId), equipmentId: String(b.equipmentId) })),
    bookings,
    contextOrderIds: [...new Set(context.map((r) => Number(r.work_order_id)))],
    rows,
  };
}

/** The equipment on each order (unit number and name), for Send crews' wording. */
export async function unitsForOrders(db: Q, orderIds: number[]): Promise<Map<number, { unit: string; name: string }[]>> {
  const out = new Map<number, { unit: string; name: string }[]>();
  if (!orderIds.length) return out;
  const rows = await db("equipment_assignments as ea")
    .join("equipment as e", "e.id", "ea.equipment_id")
    .whereIn("ea.work_order_id", orderIds)
    .orderBy(["ea.work_order_id", "e.kind", "e.unit_number"])
    .select("ea.work_order_id", "e.unit_number", "e.name");
  for (const r of rows) {
    const list = out.get(Number(r.work_order_id)) ?? [];
    list.push({ unit: String(r.unit_number), name: String(r.name) });
    out.set(Number(r.work_order_id), list);
  }
  return out;
}

/** Every booking of the organisation's equipment on orders not yet over (not cancelled or done), by start. */
export async function upcomingBookingsOf(db: Knex, organisationId: number): Promise<{ equipment_id: number; number: string; work_date: string }[]> {
  return db("equipment_assignments as ea")
    .join("work_orders as o", "o.id", "ea.work_order_id")
    .join("equipment as e", "e.id", "ea.equipment_id")
    .where("e.organisation_id", organisationId)
    .whereNotIn("o.status", ["cancelled", "done"])
    .where("o.end_at", ">", new Date())
    .orderBy("o.start_at")
    .select("ea.equipment_id", "o.number", "o.work_date");
}

export { REQUIRED_KIND };
