import { db } from "@/lib/db";
import { contactYards, requireYardsAccess, type SessionUser, type YardAccess } from "./session";

// Which yard a record belongs to, for requireYardAccess (lib/auth/session.ts). Each lookup is
// scoped to the user's organisation; an id of another organisation or none at all yields no
// yard, and the route's own 404 follows. Call after requireRole and readJson:
//   await yardScope(user, "edit", { orderId }) / { positionId } / { assignmentId } / …

export interface YardRefs {
  yardId?: number | null;
  yardCode?: string | null;
  orderId?: number | null;
  positionId?: number | null;
  assignmentId?: number | null;
  workerId?: number | null;
  rotationId?: number | null;
  seriesId?: number | null;
  timeRecordId?: number | null;
  inboundMessageId?: number | null;
  /** A truck or other unit of the equipment register (its home yard). */
  equipmentId?: number | null;
  /** A booking of equipment on an order (the order's yard). */
  equipmentAssignmentId?: number | null;
}

async function yardsOf(org: number, r: YardRefs): Promise<number[]> {
  const q = db();
  const out: (number | null | undefined)[] = [r.yardId];
  const one = async (p: Promise<{ yard_id?: number | null } | undefined>) => out.push((await p)?.yard_id ?? null);
  if (r.yardCode) await one(q("yards").where({ organisation_id: org }).whereRaw("LOWER(code) = ?", [r.yardCode.toLowerCase()]).first("id as yard_id"));
  if (r.orderId) await one(q("work_orders").where({ id: r.orderId, organisation_id: org }).first("yard_id"));
  if (r.positionId)
    await one(q("positions as p").join("work_orders as o", "o.id", "p.work_order_id").where({ "p.id": r.positionId, "o.organisation_id": org }).first("o.yard_id"));
  if (r.assignmentId)
    await one(q("assignments as a").join("work_orders as o", "o.id", "a.work_order_id").where({ "a.id": r.assignmentId, "o.organisation_id": org }).first("o.yard_id"));
  if (r.workerId) await one(q("workers").where({ id: r.workerId, organisation_id: org }).first("yard_id"));
  if (r.rotationId) await one(q("rotations").where({ id: r.rotationId, organisation_id: org }).first("yard_id"));
  if (r.seriesId) await one(q("order_series").where({ id: r.seriesId, organisation_id: org }).first("yard_id"));
  if (r.timeRecordId)
    await one(q("time_records as t").join("workers as w", "w.id", "t.worker_id").where({ "t.id": r.timeRecordId, "w.organisation_id": org }).first("w.yard_id"));
  if (r.inboundMessageId)
    await one(q("inbound_messages as m").join("workers as w", "w.id", "m.worker_id").where({ "m.id": r.inboundMessageId, "w.organisation_id": org }).first("w.yard_id"));
  if (r.equipmentId) await one(q("equipment").where({ id: r.equipmentId, organisation_id: org }).first("yard_id"));
  if (r.equipmentAssignmentId)
    await one(q("equipment_assignments as e").join("work_orders as o", "o.id", "e.work_order_id").where({ "e.id": r.equipmentAssignmentId, "o.organisation_id": org }).first("o.yard_id"));
  return out.filter((v): v is number => v !== null && v !== undefined).map(Number);
}

/** 403 unless the user may `mode` every yard the given records belong to. */
export async function yardScope(user: SessionUser, mode: YardAccess, refs: YardRefs): Promise<void> {
  if (user.role !== "dispatcher") return; // only dispatchers are limited to their yards
  await requireYardsAccess(user, await yardsOf(user.organisationId, refs), mode);
}

/**
 * Phone and e-mail only of workers of yards whose contacts the user may see (contactYards):
 * others come back with both null and `contactHidden: true`. For every worker list or record.
 */
export async function hideForeignContacts<T extends { yardId: number; phone?: string | null; email?: string | null }>(
  user: SessionUser,
  rows: T[],
): Promise<(T & { contactHidden?: boolean })[]> {
  const yards = await contactYards(user);
  if (yards === "all") return rows;
  return rows.map((r) =>
    yards.includes(Number(r.yardId)) ? r : { ...r, ...("phone" in r ? { phone: null } : {}), ...("email" in r ? { email: null } : {}), contactHidden: true },
  );
}

/**
 * The workers whose messages and contact details the user may see, or null for all of them
 * (supervisors, admins, hr). For lists of message threads: `rows.filter(r => r.workerId ===
 * null || ids === null || ids.has(r.workerId))`.
 */
export async function contactWorkerIds(user: SessionUser): Promise<Set<number> | null> {
  const yards = await contactYards(user);
  if (yards === "all") return null;
  if (!yards.length) return new Set();
  const ids = await db()("workers").where({ organisation_id: user.organisationId }).whereIn("yard_id", yards).pluck("id");
  return new Set(ids.map(Number));
}
