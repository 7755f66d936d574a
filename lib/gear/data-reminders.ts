import "@/lib/server-only";
import { hostname } from "node:os";
import type { Knex } from "knex";
import { audit, type Actor } from "@/lib/audit/data";
import { todayIn } from "@/lib/time/days";
import { GEAR_KIND_LABEL, gearState, type GearKind } from "./model";

// Rubber goods test reminders, like the credential reminders (lib/credentials/data-reminders.ts): "sending" is
// queueing e-mails in the notifications outbox, which the delivery loop drains. At most one
// reminder per item and day (dedupe_key gear-reminder:<id>:<day>, INSERT IGNORE), safe with any
// number of app instances; the daily job claims its day in job_claims.
//
// The daily job reminds the worker 30, 7 and 1 days before an item's next electrical test is
// due (1910.137 Table I-5: gloves every 6 months, sleeves every 12), on the due date, and
// weekly once it is overdue. "Send test reminders now" (HR) reminds every item that is due
// within 30 days or overdue and has not been reminded today.

export const GEAR_JOB = "gear-reminders";
export const GEAR_MILESTONES = [30, 7, 1, 0];

export interface GearReminderCounts {
  reminders: number;
  alreadySent: number;
  noEmail: number;
  due: number;
  overdue: number;
}

interface Candidate {
  id: number;
  organisationId: number;
  workerId: number;
  firstName: string;
  email: string | null;
  kind: GearKind;
  class: string;
  serial: string;
  dueOn: string;
  daysLeft: number;
  today: string;
}

async function candidates(q: Knex | Knex.Transaction, now: Date, organisationId?: number): Promise<Candidate[]> {
  const rows = await q("rubber_goods as g")
    .join("workers as w", "w.id", "g.worker_id")
    .join("yards as y", "y.id", "w.yard_id")
    .where("w.active", true)
    .whereNull("g.retired_on")
    .modify((b) => {
      if (organisationId) b.where("g.organisation_id", organisationId);
    })
    .select("g.id", "g.organisation_id", "g.worker_id", "w.first_name", "w.email", "y.timezone", "g.kind", "g.class", "g.serial", "g.tested_on");
  return rows.flatMap((r: Record<string, any>): Candidate[] => {
    const today = todayIn(r.timezone, now);
    const s = gearState({ kind: r.kind, testedOn: String(r.tested_on).slice(0, 10) }, today);
    if (s.state !== "due" && s.state !== "overdue") return [];
    return [{ id: Number(r.id), organisationId: Number(r.organisation_id), workerId: Number(r.worker_id), firstName: r.first_name, email: r.email ?? null, kind: r.kind, class: r.class, serial: r.serial, dueOn: s.dueOn, daysLeft: s.daysLeft, today }];
  });
}

export function gearReminderText(c: Pick<Candidate, "firstName" | "kind" | "class" | "serial" | "dueOn" | "daysLeft">) {
  const what = `${GEAR_KIND_LABEL[c.kind].toLowerCase()} (class ${c.class}, serial ${c.serial})`;
  const when =
    c.daysLeft < 0 ? `was due on ${c.dueOn} and is overdue: do not use them on energized work until they are retested` : c.daysLeft === 0 ? `is due today (${c.dueOn})` : `is due by ${c.dueOn} (${c.daysLeft} day${c.daysLeft === 1 ? "" : "s"})`;
  return {
    subject: `Rubber goods test ${c.daysLeft < 0 ? "overdue" : "due"}: ${c.serial}`,
    body:
      `Hello ${c.firstName},\n\nThe electrical test of your ${what} ${when}.\n` +
      `Bring them to the tool room for testing (29 CFR 1910.137 Table I-5: gloves every 6 months, sleeves every 12).\n\n` +
      `Gaffline assists; your employer's safety program and the crew lead's judgement decide.\n`,
  };
}

async function insertIgnore(q: Knex.Transaction, table: string, rows: Record<string, unknown>[]) {
  let n = 0;
  for (let i = 0; i < rows.length; i += 500) {
    const { sql, bindings } = q(table).insert(rows.slice(i, i + 500)).toSQL();
    const [res] = (await q.raw(sql.replace(/^insert /i, "insert ignore "), bindings as readonly Knex.RawBinding[])) as unknown as [{ affectedRows: number }];
    n += Number(res?.affectedRows ?? 0);
  }
  return n;
}

/** Whether the daily job reminds about this item today. */
export function dailyWants(daysLeft: number): boolean {
  return GEAR_MILESTONES.includes(daysLeft) || (daysLeft < 0 && -daysLeft % 7 === 0);
}

async function queue(q: Knex.Transaction, now: Date, mode: "daily" | "manual", organisationId?: number): Promise<GearReminderCounts> {
  const all = await candidates(q, now, organisationId);
  const want = all.filter((c) => c.email && (mode === "manual" || dailyWants(c.daysLeft)));
  const reminders = await insertIgnore(
    q,
    "notifications",
    want.map((c) => ({
      organisation_id: c.organisationId,
      worker_id: c.workerId,
      channel: "email",
      kind: "reminder",
      to_address: c.email,
      ...gearReminderText(c),
      state: "queued",
      next_attempt_at: now,
      dedupe_key: `gear-reminder:${c.id}:${c.today}`,
    })),
  );
  return {
    reminders,
    alreadySent: Math.max(0, want.length - reminders),
    noEmail: all.filter((c) => !c.email).length,
    due: all.filter((c) => c.daysLeft >= 0).length,
    overdue: all.filter((c) => c.daysLeft < 0).length,
  };
}

/** The daily job (background loop): once per UTC day across every instance, from 11:00 UTC. */
export async function runDailyGearReminders(db: Knex, now: Date = new Date(), opts: { startHourUtc?: number; instance?: string } = {}) {
  const day = now.toISOString().slice(0, 10);
  if (now.getUTCHours() < (opts.startHourUtc ?? 11)) return { claimed: false, day };
  try {
    return await db.transaction(async (trx) => {
      await trx("job_claims").insert({ job: GEAR_JOB, day, claimed_by: (opts.instance ?? `${hostname()}:${process.pid}`).slice(0, 80) });
      const counts = await queue(trx, now, "daily");
      return { claimed: true, day, ...counts };
    });
  } catch (err) {
    const e = err as { code?: string; errno?: number };
    if (e?.code === "ER_DUP_ENTRY" || e?.errno === 1213) return { claimed: false, day };
    throw err;
  }
}

/** HR's "Send test reminders now" (audited). */
export async function sendGearRemindersNow(db: Knex, actor: Actor, now: Date = new Date()): Promise<GearReminderCounts> {
  return db.transaction(async (trx) => {
    const counts = await queue(trx, now, "manual", actor.organisationId);
    await audit(trx, actor, actor.organisationId, "gear.reminders", "rubber_goods", null, { ...counts });
    return counts;
  });
}
