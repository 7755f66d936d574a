// On-call rotations: members take turns in `sort` order, one per hand-over period. Hand-overs
// come from the rotation's RRULE and its first hand-over (dtstart_local, wall clock in the
// yard's zone), expanded in floating wall-clock time like order series (lib/orders/data-occurrences.ts),
// so a Monday 07:00 hand-over stays 07:00 local across daylight-saving changes and a period
// that spans one is 167 h or 169 h of elapsed time. A hand-over in the spring-forward gap
// (Sunday 02:30) happens at 03:30 (RFC 5545 "compatible").
//
// The pure functions take the rule, the members and an instant; onCallAt reads them from the
// database. Before the first hand-over nobody is on call; when a rule with COUNT or UNTIL has
// run out, the rotation is over at its last hand-over.

import "@/lib/server-only";
import type { Knex } from "knex";
import { floating } from "@/lib/time/recurrence";
import { onCallFromMembers, type OnCall } from "./schedule";

// --- database --------------------------------------------------------------------------------

export interface OnCallNow {
  rotationId: number;
  rotationName: string;
  workerId: number;
  workerName: string;
  from: Date;
  to: Date;
}

/**
 * Who is on call at `instant` in each active rotation of the yard (the board shows tonight's
 * on-call people). Rotations with no members, not started yet, or ended are left out.
 */
export async function onCallAt(db: Knex, yardId: number, instant: Date): Promise<OnCallNow[]> {
  const yard = await db("yards").where({ id: yardId }).first("timezone");
  if (!yard) return [];
  const rotations = await db("rotations").where({ yard_id: yardId, active: true }).orderBy("id").select("id", "name", "rrule", "dtstart_local");
  if (rotations.length === 0) return [];
  const members = await db("rotation_members as m")
    .join("workers as w", "w.id", "m.worker_id")
    .whereIn(
      "m.rotation_id",
      rotations.map((r) => r.id),
    )
    .orderBy([{ column: "m.rotation_id" }, { column: "m.sort" }])
    .select("m.rotation_id", "m.worker_id", "w.first_name", "w.last_name");
  const out: OnCallNow[] = [];
  for (const r of rotations) {
    const list = members.filter((m) => m.rotation_id === r.id);
    let hit: OnCall<(typeof list)[number]> | null = null;
    try {
      hit = onCallFromMembers({ rrule: r.rrule, dtstartLocal: r.dtstart_local, timezone: yard.timezone }, list, instant.getTime());
    } catch {
      hit = null; // a rule that no longer parses shows nobody rather than breaking the board
    }
    if (!hit || hit.period.to === null) continue;
    out.push({
      rotationId: Number(r.id),
      rotationName: String(r.name),
      workerId: Number(hit.member.worker_id),
      workerName: `${hit.member.first_name} ${hit.member.last_name}`,
      from: new Date(hit.period.from),
      to: new Date(hit.period.to),
    });
  }
  return out;
}

/** The floating form of a wall-clock string (re-exported for the rotations page). */
export { floating };
