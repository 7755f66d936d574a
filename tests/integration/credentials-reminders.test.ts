import { afterAll, beforeAll, describe, expect, it } from "vitest";
import knex, { type Knex } from "knex";
import { dbConfig } from "@/knexfile";
import { JOB, runDailyReminders, sendRemindersNow } from "@/lib/credentials/data-reminders";
import { todayIn } from "@/lib/time/days";
import { fmtDate } from "@/lib/format";

// Reminders go into the notifications outbox; this checks the outbox and the claim tables
// directly (DB_NAME). Several instances may run the daily job: job_claims' primary key
// (job, day) lets one win; reminders_sent (credential_id, day) and the outbox dedupe_key
// keep one reminder per credential per day. (Common practice for "exactly once per day"
// jobs on a shared database.)

let db: Knex;
const now = new Date();
const jobDay = now.toISOString().slice(0, 10);
const PAST = new Date("2000-01-03T12:00:00Z"); // nothing lapses around then: claims only

async function credentialOf(no: string, code: string) {
  return db("credentials as c")
    .join("workers as w", "w.id", "c.worker_id")
    .join("qualification_types as q", "q.id", "c.qualification_type_id")
    .join("yards as y", "y.id", "w.yard_id")
    .where({ "w.employee_no": no, "q.code": code, "c.status": "current" })
    .first("c.id", "c.expires_on", "y.timezone", "w.email");
}

beforeAll(() => {
  db = knex(dbConfig());
});
afterAll(async () => {
  await db("job_claims").where({ job: JOB, day: "2000-01-03" }).delete();
  await db.destroy();
});

describe("daily credential reminders", () => {
  it("claims the day once, queues one reminder per credential in its window, and a digest for HR", async () => {
    const first = await runDailyReminders(db, now, { startHourUtc: 0, instance: "test-a" });
    const second = await runDailyReminders(db, now, { startHourUtc: 0, instance: "test-b" });
    // Another instance (the app's own loop) may have claimed today already; never both.
    expect(second).toMatchObject({ claimed: false, reason: "taken" });
    if (first.claimed) expect(first.day).toBe(jobDay);
    const claims = await db("job_claims").where({ job: JOB, day: jobDay });
    expect(claims.length).toBe(1);

    // Andre Beauchamp (CP-1012): climbing lapses inside its 30-day window.
    const andre = await credentialOf("CP-1012", "climbing");
    const day = todayIn(andre.timezone, now);
    const key = `reminder:${andre.id}:${day}`;
    const rows = await db("notifications").where({ dedupe_key: key });
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ channel: "email", kind: "reminder", to_address: andre.email });
    // Written to the outbox as 'queued'; the running app's delivery loop may have sent it since
    // (its own daily job, or an earlier "Send reminders now", can have queued today's row).
    expect(["queued", "sending", "sent"]).toContain(rows[0].state);
    expect(rows[0].subject).toContain("Climbing evaluation");
    expect(rows[0].body).toContain(fmtDate(andre.expires_on, { weekday: "short", month: "short", day: "numeric", year: "numeric" }));
    expect(await db("reminders_sent").where({ credential_id: andre.id, day }).first()).toBeTruthy();

    // Brent Haugland (CP-1006): climbing already lapsed (the demo keeps it so): not reminded, but in HR's digest.
    const brent = await credentialOf("CP-1006", "climbing");
    const digest = await db("notifications").where({ kind: "digest" }).where("dedupe_key", "like", `digest:%:${jobDay}`);
    expect(digest.length).toBeGreaterThanOrEqual(1);
    const hrUser = await db("users").where({ email: "hr@cedarprairie.example" }).first("id");
    const mine = digest.find((d) => d.dedupe_key === `digest:1:${hrUser.id}:${jobDay}`);
    expect(mine).toBeTruthy();
    expect(mine.to_address).toBe("hr@cedarprairie.example");
    expect(mine.body).toContain("Brent Haugland (CP-1006, NOR): Climbing evaluation");
    expect(mine.body).toContain("Andre Beauchamp");
    expect(await db("notifications").where({ dedupe_key: `reminder:${brent.id}:${day}` }).first()).toBeUndefined();
  });

  it("'Send reminders now' adds nothing twice for the same credential and day", async () => {
    const hrUser = await db("users").where({ email: "hr@cedarprairie.example" }).first("id", "organisation_id");
    const andre = await credentialOf("CP-1012", "climbing");
    const key = `reminder:${andre.id}:${todayIn(andre.timezone, now)}`;
    const a = await sendRemindersNow(db, { id: hrUser.id, organisationId: hrUser.organisation_id }, now);
    const b = await sendRemindersNow(db, { id: hrUser.id, organisationId: hrUser.organisation_id }, now);
    expect(b.reminders).toBe(0);
    expect(b.alreadySent).toBeGreaterThanOrEqual(a.reminders);
    expect(await db("notifications").where({ dedupe_key: key })).toHaveLength(1);
    expect(a.inWindow).toBeGreaterThan(0);
  });

  it("two instances racing for the same day: exactly one claims it", async () => {
    await db("job_claims").where({ job: JOB, day: "2000-01-03" }).delete();
    const runs = await Promise.all([
      runDailyReminders(db, PAST, { instance: "race-1" }),
      runDailyReminders(db, PAST, { instance: "race-2" }),
      runDailyReminders(db, PAST, { instance: "race-3" }),
    ]);
    expect(runs.filter((r) => r.claimed)).toHaveLength(1);
    expect(runs.filter((r) => !r.claimed).every((r) => r.reason === "taken")).toBe(true);
  });

  it("before the start hour the job does not claim", async () => {
    const early = new Date(`${jobDay}T03:00:00Z`);
    expect(await runDailyReminders(db, early, { startHourUtc: 11 })).toMatchObject({ claimed: false, reason: "too-early" });
  });
});
