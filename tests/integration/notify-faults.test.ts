// The fault combination notify.test.ts does not cover (issue 10). notify.test.ts already has:
// a 500 from the SMS provider retried and delivered once; the SMS provider and the mail server
// down together for 5 s (30 s with GAFFLINE_FULL) for rows queued directly; two delivery loops
// never sending a row twice; a crashed claim checked with the provider. Here, all at once and
// through the real path: Send crews for two crews while the mail server is down, the SMS
// provider answers 500 to every first attempt and then goes down for 30 s (5 s by default) —
// delivered by the running app's own delivery loop (lib/jobs/background.ts), nothing driven from
// the test. After recovery every text and every e-mail arrives exactly once, counted at the fakes.
import { afterAll, afterEach, beforeAll, describe, expect, it } from "vitest";
import { as, type Client } from "../support/client";
import { fakeMails, fakeTexts, mailControl, makeCrewDay, removeMade, smsControl, testDb, waitFor } from "../support/notify";

const FULL = process.env.GAFFLINE_FULL === "1";
const DOWN_S = FULL ? 30 : 5;
const db = testDb();
let dispatcher: Client;

beforeAll(async () => {
  dispatcher = await as("dispatcher");
  await smsControl("reset");
  await mailControl("reset");
});
afterEach(async () => {
  await smsControl("reset");
  await mailControl("reset");
  await removeMade(db);
});
afterAll(() => db.destroy());

describe("Send crews through a provider failure and outage", () => {
  it(
    `SMTP down, SMS 500 then down for ${DOWN_S} s: after recovery each of 6 people gets exactly one text and one e-mail`,
    async () => {
      // Two de-energized patrols on the same far day, three people each (no rule blocks a patrol).
      const first = await makeCrewDay(db, { offsetDays: 141, crew: [{ position: "lead", employeeNo: "CP-1001" }, { position: "ground", employeeNo: "CP-1007" }, { position: "ground", employeeNo: "CP-1014" }] });
      const second = await makeCrewDay(db, {
        offsetDays: 141,
        keepDay: true,
        crew: [{ position: "lead", employeeNo: "CP-1003" }, { position: "ground", employeeNo: "CP-1012" }, { position: "ground", employeeNo: "CP-1011" }],
      });
      const people = [...first.assignments, ...second.assignments];
      const numbers = [first.number, second.number];

      // The mail server down for the whole of it; the SMS provider answers 500 to the first six sends.
      await mailControl("down", { seconds: DOWN_S + 3 });
      await smsControl("fail", { count: people.length, status: 500 });
      const started = Date.now();
      const sent = await dispatcher.json<{ messages: number; new: number }>("/api/send", "POST", { date: first.day, yard: first.yardCode });
      expect(sent.status).toBe(200);
      expect(sent.body).toMatchObject({ new: 6, messages: 12 });
      const ids = (await db("notifications").whereIn("assignment_id", people.map((p) => p.id)).pluck("id")).map(Number);
      expect(ids).toHaveLength(12);

      // Every text has had its 500; then the provider goes down (connections dropped unanswered).
      await waitFor(
        "a 500 for every text",
        async () => {
          const rows = await db("notifications").whereIn("id", ids).where({ channel: "sms" }).select("attempts", "last_error", "state");
          return rows.length === 6 && rows.every((r: { attempts: number; state: string }) => r.attempts >= 1 && r.state !== "sent");
        },
        20_000,
        100,
      );
      await smsControl("down", { seconds: DOWN_S });
      const downAt = Date.now();
      const during = await db("notifications").whereIn("id", ids).select("channel", "state", "last_error");
      expect(during.filter((r: { state: string }) => r.state === "sent"), "nothing delivered while both are failing").toEqual([]);
      expect(during.filter((r: { channel: string }) => r.channel === "sms").some((r: { last_error: string | null }) => /500/.test(r.last_error ?? ""))).toBe(true);

      // Recovery: the app's delivery loop retries with backoff (2, 4, 8, 16, 32 s …).
      const rows = await waitFor(
        "all 12 messages sent",
        async () => {
          const r = await db("notifications").whereIn("id", ids).select("id", "channel", "state", "attempts", "last_error", "to_address");
          return r.every((x: { state: string }) => x.state === "sent" || x.state === "failed") && r;
        },
        (DOWN_S + 120) * 1000,
        250,
      );
      const recoveredMs = Date.now() - downAt;
      expect(rows.filter((r: { state: string }) => r.state !== "sent"), JSON.stringify(rows.filter((r: { state: string }) => r.state !== "sent"))).toEqual([]);
      expect(Date.now() - started).toBeGreaterThanOrEqual(DOWN_S * 1000);
      // Each text: a 500, at least one attempt into the outage, then accepted.
      for (const r of rows.filter((x: { channel: string }) => x.channel === "sms")) expect(r.attempts).toBeGreaterThanOrEqual(3);
      for (const r of rows.filter((x: { channel: string }) => x.channel === "email")) expect(r.attempts).toBeGreaterThanOrEqual(2);

      // No fixed wait: every row is settled (sent), and lib/notify/data-outbox.ts only sends rows that
      // are queued or sending, so no duplicate can still come; wait for the fakes to list them all.
      await waitFor("6 texts and 6 mails at the fakes", async () => {
        const t = (await fakeTexts()).filter((m) => m.source === "api" && numbers.some((n) => m.body.includes(n))).length;
        const m = (await fakeMails()).filter((x) => numbers.some((n) => x.subject.includes(n))).length;
        return t >= 6 && m >= 6;
      });
      const texts = (await fakeTexts()).filter((m) => m.source === "api" && numbers.some((n) => m.body.includes(n)));
      const mails = (await fakeMails()).filter((m) => numbers.some((n) => m.subject.includes(n)));
      for (const p of people) {
        expect(texts.filter((m) => m.to === p.phone), `texts to ${p.employeeNo}`).toHaveLength(1);
        expect(mails.filter((m) => m.to[0] === p.email), `mails to ${p.employeeNo}`).toHaveLength(1);
      }
      expect(texts).toHaveLength(6);
      expect(mails).toHaveLength(6);
      const states = await db("assignments").whereIn("id", people.map((p) => p.id)).pluck("status");
      expect(states.every((s: string) => s === "delivered" || s === "confirmed"), states.join(",")).toBe(true);
      console.log(`[notify-faults] 12 messages, SMS 500 ×6 then down ${DOWN_S} s, SMTP down ${DOWN_S + 3} s: all sent ${Math.round(recoveredMs / 100) / 10} s after the SMS outage began; texts ${texts.length}, mails ${mails.length}, max attempts ${Math.max(...rows.map((r: { attempts: number }) => r.attempts))}`);
    },
    (DOWN_S + 180) * 1000,
  );
});
