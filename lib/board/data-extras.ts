import "@/lib/server-only";
import type { Knex } from "knex";
import { ensureOccurrences } from "@/lib/orders/data-occurrences";
import { onCallAt } from "@/lib/rotations/data-on-call";
import { zonedWallTimeToEpoch } from "@/lib/rules/time";
import { addDays } from "@/lib/time/days";
import type { BoardPayload } from "./model";

/** Before a day is read: recurring orders get their occurrence for that day. */
export async function prepareBoardDay(db: Knex, organisationId: number, yardId: number, day: string) {
  await ensureOccurrences(db, organisationId, yardId, day);
}

/**
 * After: the people on call the night before the board's day (22:00 local), who may be called
 * out and come in short of rest, are marked in the pool and listed on the board.
 */
export async function markOnCall(db: Knex, payload: BoardPayload) {
  const tonight = new Date(zonedWallTimeToEpoch(`${addDays(payload.day, -1)}T22:00`, payload.yard.timezone));
  const onCall = await onCallAt(db, payload.yard.id, tonight);
  const ids = new Set(onCall.map((o) => o.workerId));
  for (const p of payload.pool) p.onCallTonight = ids.has(p.id);
  payload.onCall = onCall.map((o) => ({
    rotationName: o.rotationName,
    workerId: o.workerId,
    workerName: o.workerName,
    from: o.from.toISOString(),
    to: o.to.toISOString(),
  }));
}
