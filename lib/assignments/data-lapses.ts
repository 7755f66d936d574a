// Issue 18, point 13: an override is given for one crew (its crew hash). When the crew changes,
// the override lapses, and the supervisor who gave it is told: an in-app notice and an e-mail
// through the notification outbox, both written in the transaction that changed the crew.
import "@/lib/server-only";
import type { Knex } from "knex";
import { fmtDate, fmtDateTimeZone } from "@/lib/format";
import { appPublicUrl } from "@/lib/notify/config";
import { enqueue, type OutboxInput } from "@/lib/notify/data-outbox";
import { addNotice } from "@/lib/notices/data";
import { changeWords, lapseWords, type CrewChange } from "@/lib/notices/model";

export interface CrewChangeBy {
  change: CrewChange;
  /** Who made the change (a user), or null for a worker's own reply. */
  byUserId: number | null;
  byName: string | null;
}

/**
 * Lapses the order's live overrides given for another crew than `hash`, records who changed
 * what, and tells each override's author. Returns how many lapsed. The caller holds the
 * order's lock (its crew write, or the reply's booking_seq bump), which an override's write
 * takes too; no FOR UPDATE here, as one over this join would also lock the users, workers and
 * yards rows it reads, out of the order the crew writes lock workers in.
 */
export async function lapseOverrides(trx: Knex.Transaction, orderId: number, hash: string, by: CrewChangeBy): Promise<number> {
  const rows = await trx("overrides as v")
    .join("work_orders as o", "o.id", "v.work_order_id")
    .join("yards as y", "y.id", "o.yard_id")
    .join("users as u", "u.id", "v.actor_user_id")
    .leftJoin("workers as w", "w.id", "v.worker_id")
    .where("v.work_order_id", orderId)
    .whereNull("v.lapsed_at")
    .whereNot("v.crew_hash", hash)
    .select(
      "v.id",
      "v.rule",
      "v.reason",
      "v.created_at",
      "v.actor_user_id",
      "u.email as actor_email",
      "u.active as actor_active",
      "o.organisation_id",
      "o.number",
      "o.title",
      "o.work_date",
      "y.name as yard_name",
      "y.timezone",
      "w.first_name",
      "w.last_name",
    );
  if (!rows.length) return 0;
  const change = changeWords(by.change, by.byName);
  const now = new Date();
  await trx("overrides")
    .whereIn("id", rows.map((r) => r.id))
    .update({ lapsed_at: now, lapsed_by_user_id: by.byUserId, lapse_change: change.slice(0, 500) });
  const mail: OutboxInput[] = [];
  for (const r of rows) {
    const words = lapseWords({
      orderNumber: r.number,
      orderTitle: r.title,
      dayWords: fmtDate(typeof r.work_date === "string" ? r.work_date : new Date(r.work_date).toISOString().slice(0, 10)),
      yardName: r.yard_name,
      rule: r.rule,
      workerName: r.first_name ? `${r.first_name} ${r.last_name}` : null,
      reason: r.reason,
      givenWords: fmtDateTimeZone(r.created_at, r.timezone),
      change,
      link: `${appPublicUrl()}/queue`,
    });
    await addNotice(trx, {
      organisationId: r.organisation_id,
      userId: r.actor_user_id,
      kind: "override_lapsed",
      workOrderId: orderId,
      overrideId: r.id,
      title: words.title,
      body: words.body,
    });
    if (r.actor_active && r.actor_email) {
      mail.push({
        organisationId: r.organisation_id,
        channel: "email",
        kind: "override_lapsed",
        to: r.actor_email,
        subject: words.subject,
        body: words.email,
        dedupeKey: `override-lapsed:${r.id}`,
      });
    }
  }
  await enqueue(trx, mail);
  return rows.length;
}
