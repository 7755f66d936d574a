import "@/lib/server-only";
import { hostname } from "node:os";
import type { Knex } from "knex";
import { audit } from "@/lib/audit/data";
import { contentionKind, withConflictRetry } from "@/lib/db";
import { todayIn } from "@/lib/time/days";
import { fmtDate } from "@/lib/format";
import { daysBetween } from "@/lib/time/days";
import { addDaysIso } from "@/lib/credentials/model";

// Credential reminders. "Sending" = queueing rows in the notifications outbox (channel
// email, state queued); the delivery loop drains that table. Safe with many app instances:
// - the daily job is claimed once per day with an INSERT into job_claims (a duplicate key
//   means another instance has it), in the same transaction as the rows it queues, so a
//   crash mid-run rolls the claim back and another instance can take it;
// - a credential is reminded at most once per day: reminders_sent has (credential_id, day)
//   as its primary key and the outbox rows carry dedupe_key reminder:<id>:<day>, both
//   inserted with INSERT IGNORE.
//
// When the daily job reminds a worker: the first run on which a current credential is inside
// its type's warning window (days left < warn_days) and no reminder has gone out for it since
// the window opened (so a missed day catches up), and again at 7 days and at 1 day left.
// "Send reminders now" (HR) reminds every credential inside its window that has not been
// reminded today. HR users get a digest: lapsed, lapsing, renewals waiting for verification,
// and workers who could not be reminded (no e-mail on file).

export const JOB = "credential-reminders";
export const MILESTONE_DAYS = [7, 1];

export interface ReminderCounts {
  reminders: number;
  digests: number;
  alreadySent: number;
  noEmail: number;
  renewalWaiting: number;
  inWindow: number;
  lapsed: number;
}

export interface DailyRun extends ReminderCounts {
  claimed: boolean;
  day: string;
  reason?: "too-early" | "taken";
}

interface Candidate {
  id: number;
  organisationId: number;
  orgName: string;
  workerId: number;
  workerName: string;
  firstName: string;
  employeeNo: string;
  email: string | null;
  yardCode: string;
  typeName: string;
  warnDays: number;
  expiresOn: string;
  today: string;
  daysLeft: number;
  pendingRenewal: boolean;
}

async function candidates(q: Knex.Transaction, now: Date, organisationId?: number): Promise<Candidate[]> {
  // Everything within the widest window (plus a day for zones ahead of UTC), and every lapsed record.
  const maxWarn = Number((await q("qualification_types").max({ m: "warn_days" }).first())?.m ?? 0);
  const horizon = addDaysIso(now.toISOString().slice(0, 10), maxWarn + 2);
  const rows = await q("credentials as c")
    .join("workers as w", "w.id", "c.worker_id")
    .join("yards as y", "y.id", "w.yard_id")
    .join("qualification_types as t", "t.id", "c.qualification_type_id")
    .join("organisations as o", "o.id", "w.organisation_id")
    .where("c.status", "current")
    .where("w.active", true)
    .whereNotNull("c.expires_on")
    .where("c.expires_on", "<=", horizon)
    .modify((b) => {
      if (organisationId) b.where("w.organisation_id", organisationId);
    })
    .select(
      "c.id",
      "c.expires_on",
      "c.worker_id",
      "c.qualification_type_id",
      "w.organisation_id",
      "w.first_name",
      "w.last_name",
      "w.employee_no",
      "w.email",
      "y.code as yard_code",
      "y.timezone",
      "t.name as type_name",
      "t.warn_days",
      "o.name as org_name",
      q.raw(
        "EXISTS (SELECT 1 FROM credentials p WHERE p.worker_id = c.worker_id AND p.qualification_type_id = c.qualification_type_id AND p.status = 'pending') AS pending_renewal",
      ),
    )
    .orderBy("c.expires_on");
  const cache = new Map<string, string>();
  return rows.map((r: Record<string, any>) => {
    let today = cache.get(r.timezone);
    if (!today) cache.set(r.timezone, (today = todayIn(r.timezone, now)));
    return {
      id: Number(r.id),
      organisationId: Number(r.organisation_id),
      orgName: r.org_name,
      workerId: Number(r.worker_id),
      workerName: `${r.first_name} ${r.last_name}`,
      firstName: r.first_name,
      employeeNo: r.employee_no,
      email: r.email ?? null,
      yardCode: r.yard_code,
      typeName: r.type_name,
      warnDays: Number(r.warn_days),
      expiresOn: r.expires_on,
      today,
      daysLeft: daysBetween(today, r.expires_on),
      pendingRenewal: Boolean(Number(r.pending_renewal)),
    };
  });
}

const inWindow = (c: Candidate) => c.daysLeft >= 0 && c.daysLeft < c.warnDays;

function reminderText(c: Candidate) {
  const when = fmtDate(c.expiresOn, { weekday: "short", month: "short", day: "numeric", year: "numeric" });
  const left = c.daysLeft === 0 ? "today is the last valid day" : c.daysLeft === 1 ? "1 day from today" : `${c.daysLeft} days from today`;
  return {
    subject: `Your ${c.typeName} is valid through ${when}`,
    body:
      `Hello ${c.firstName},\n\n` +
      `Your ${c.typeName} on file with ${c.orgName} is valid through ${when} (${left}).\n\n` +
      "Book the renewal and bring the new card or certificate to HR, or upload it from your My week page in Gaffline. " +
      "After the last valid day the board will flag you for positions that need it.\n\n" +
      "— Gaffline, on behalf of HR\n",
  };
}

function digestText(orgName: string, day: string, groups: { lapsed: Candidate[]; lapsing: Candidate[]; waiting: Candidate[]; noEmail: Candidate[] }) {
  const line = (c: Candidate) =>
    `  - ${c.workerName} (${c.employeeNo}, ${c.yardCode}): ${c.typeName}, last valid day ${c.expiresOn}` +
    (c.daysLeft < 0 ? ` (${-c.daysLeft} d ago)` : ` (${c.daysLeft} d left)`);
  const section = (title: string, list: Candidate[]) => (list.length ? `${title} (${list.length})\n${list.map(line).join("\n")}\n\n` : "");
  return {
    subject: `Credentials for ${day}: ${groups.lapsed.length} lapsed, ${groups.lapsing.length} lapsing`,
    body:
      `Credentials digest for ${orgName}, ${day}.\n\n` +
      section("Lapsed", groups.lapsed) +
      section("Lapsing within the warning window", groups.lapsing) +
      section("Renewal uploaded, waiting for you to verify", groups.waiting) +
      section("Not reminded: no e-mail on file", groups.noEmail) +
      "Open Credentials in Gaffline to renew or verify.\n",
  };
}

/** INSERT IGNORE, returning how many rows went in. */
async function insertIgnore(q: Knex.Transaction, table: string, rows: Record<string, unknown>[]) {
  let n = 0;
  for (let i = 0; i < rows.length; i += 500) {
    const { sql, bindings } = q(table).insert(rows.slice(i, i + 500)).toSQL();
    const [res] = (await q.raw(sql.replace(/^insert /i, "insert ignore "), bindings as readonly Knex.RawBinding[])) as unknown as [{ affectedRows: number }];
    n += Number(res?.affectedRows ?? 0);
  }
  return n;
}

async function queue(q: Knex.Transaction, now: Date, mode: "daily" | "manual", jobDay: string, organisationId?: number): Promise<ReminderCounts> {
  const all = await candidates(q, now, organisationId);
  const window = all.filter(inWindow);
  const last = new Map<number, string>();
  if (window.length) {
    const sent = await q("reminders_sent").whereIn("credential_id", window.map((c) => c.id)).groupBy("credential_id").select("credential_id", q.raw("MAX(day) as day"));
    for (const s of sent) last.set(Number(s.credential_id), typeof s.day === "string" ? s.day : new Date(s.day).toISOString().slice(0, 10));
  }
  const due = window.filter((c) => {
    if (c.pendingRenewal || !c.email) return false;
    if (mode === "manual") return last.get(c.id) !== c.today;
    const windowOpened = addDaysIso(c.expiresOn, -(c.warnDays - 1));
    const prev = last.get(c.id);
    return !prev || prev < windowOpened || (MILESTONE_DAYS.includes(c.daysLeft) && prev !== c.today);
  });
  const wantReminders = mode === "manual" ? window.filter((c) => !c.pendingRenewal && c.email).length : due.length;

  await insertIgnore(q, "reminders_sent", due.map((c) => ({ credential_id: c.id, day: c.today })));
  const reminders = await insertIgnore(
    q,
    "notifications",
    due.map((c) => ({
      organisation_id: c.organisationId,
      worker_id: c.workerId,
      channel: "email",
      kind: "reminder",
      to_address: c.email,
      ...reminderText(c),
      state: "queued",
      next_attempt_at: now,
      dedupe_key: `reminder:${c.id}:${c.today}`,
    })),
  );

  // Digests: one per HR user per organisation per day, when there is something to say.
  let digests = 0;
  const orgs = [...new Set(all.map((c) => c.organisationId))];
  for (const org of orgs) {
    const mine = all.filter((c) => c.organisationId === org);
    const groups = {
      lapsed: mine.filter((c) => c.daysLeft < 0),
      lapsing: mine.filter(inWindow),
      waiting: mine.filter((c) => c.pendingRenewal),
      noEmail: mine.filter((c) => inWindow(c) && !c.email),
    };
    if (!groups.lapsed.length && !groups.lapsing.length && !groups.waiting.length) continue;
    const hr = await q("users").where({ organisation_id: org, role: "hr", active: true }).select("id", "email");
    const text = digestText(mine[0].orgName, jobDay, groups);
    digests += await insertIgnore(
      q,
      "notifications",
      hr.map((u) => ({
        organisation_id: org,
        worker_id: null,
        channel: "email",
        kind: "digest",
        to_address: u.email,
        ...text,
        state: "queued",
        next_attempt_at: now,
        dedupe_key: `digest:${org}:${u.id}:${jobDay}`,
      })),
    );
    if (mode === "daily") await audit(q, null, org, "reminders.daily", "reminders", jobDay, {
      reminders: due.filter((c) => c.organisationId === org).length,
      lapsed: groups.lapsed.length,
      lapsing: groups.lapsing.length,
    });
  }
  return {
    reminders,
    digests,
    alreadySent: Math.max(0, wantReminders - reminders),
    noEmail: window.filter((c) => !c.email).length,
    renewalWaiting: window.filter((c) => c.pendingRenewal).length,
    inWindow: window.length,
    lapsed: all.filter((c) => c.daysLeft < 0).length,
  };
}

/**
 * The daily job, for the server's background loop (instrumentation.ts calls it; it may call
 * it as often as it likes, e.g. every few minutes). The job day is the UTC date of `now`; the
 * job runs on the first call at or after `startHourUtc` (default 11:00 UTC, early morning in
 * the Americas) and at most once per day across every instance.
 */
export async function runDailyReminders(
  db: Knex,
  now: Date = new Date(),
  opts: { startHourUtc?: number; instance?: string } = {},
): Promise<DailyRun> {
  const day = now.toISOString().slice(0, 10);
  const empty = { reminders: 0, digests: 0, alreadySent: 0, noEmail: 0, renewalWaiting: 0, inWindow: 0, lapsed: 0 };
  if (now.getUTCHours() < (opts.startHourUtc ?? 11)) return { claimed: false, day, reason: "too-early", ...empty };
  try {
    return await db.transaction(async (trx) => {
      await trx("job_claims").insert({ job: JOB, day, claimed_by: (opts.instance ?? `${hostname()}:${process.pid}`).slice(0, 80) });
      const counts = await queue(trx, now, "daily", day);
      return { claimed: true, day, ...counts };
    });
  } catch (err) {
    if ((err as { code?: string })?.code === "ER_DUP_ENTRY") return { claimed: false, day, reason: "taken", ...empty };
    // On Galera, two instances claiming the day on two nodes: the loser fails certification
    // (1213) at commit instead of meeting the duplicate key. The other one has the day.
    if (contentionKind(err) === "conflict") return { claimed: false, day, reason: "taken", ...empty };
    throw err;
  }
}

/** HR's "Send reminders now": no claim, still at most one reminder per credential per day. */
export async function sendRemindersNow(db: Knex, actor: { id: number; organisationId: number }, now: Date = new Date()) {
  const day = now.toISOString().slice(0, 10);
  return withConflictRetry(
    () =>
      db.transaction(async (trx) => {
        const counts = await queue(trx, now, "manual", day, actor.organisationId);
        await audit(trx, actor, actor.organisationId, "reminders.send", "reminders", day, { ...counts });
        return { day, ...counts };
      }),
    "reminders",
  );
}
