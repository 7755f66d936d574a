import { db } from "@/lib/db";
import { yardIdsOfRecords, type YardRefs } from "@/lib/yards/data-scope";
import { workerIdsInYards } from "@/lib/workers/data";
import { contactYards, requireYardsAccess, type SessionUser, type YardAccess } from "./session";

// Which yard a record belongs to, for requireYardAccess (lib/auth/session.ts); the lookups are in
// lib/yards/data-scope.ts. Each is scoped to the user's organisation; an id of another
// organisation or none at all yields no yard, and the route's own 404 follows.
// Call after requireRole and readJson:
//   await yardScope(user, "edit", { orderId }) / { positionId } / { assignmentId } / …

export type { YardRefs };

/** 403 unless the user may `mode` every yard the given records belong to. */
export async function yardScope(user: SessionUser, mode: YardAccess, refs: YardRefs): Promise<void> {
  if (user.role !== "dispatcher") return; // only dispatchers are limited to their yards
  await requireYardsAccess(user, await yardIdsOfRecords(db(), user.organisationId, refs), mode);
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
  return new Set(await workerIdsInYards(db(), user.organisationId, yards));
}
