// Send crews and text confirmations, against the running app and the running fakes (real HTTP
// to the SMS fake, real SMTP to the mail fake). Counts are taken at the fakes: the app's own
// delivery loop drains the outbox too, so who sent a message does not matter, only how often.
import { afterAll, afterEach, beforeAll, describe, expect, it } from "vitest";
import { smsAuthToken } from "@/tests/support/secrets";
import twilio from "twilio";
import { as, Client } from "../support/client";
import {
  fakeMails,
  fakeTexts,
  mailControl,
  makeCrewDay,
  removeMade,
  sleep,
  smsControl,
  testDb,
  textIn,
  waitFor,
  type MadeDay,
} from "../support/notify";
import { drainOnce, enqueue } from "@/lib/notify/data-outbox";
import { closeEmailTransport } from "@/lib/notify/email";
import { smsAdapter } from "@/lib/notify/sms";

const FULL = process.env.GAFFLINE_FULL === "1";
const db = testDb();
const WEBHOOK = `${(process.env.APP_PUBLIC_URL ?? process.env.APP_URL ?? "http://127.0.0.1:3100").replace(/\/$/, "")}/api/sms/inbound`;
const TOKEN = smsAuthToken();
const run = `${process.pid}-${Date.now()}`;
let dispatcher: Client;

beforeAll(async () => {
  dispatcher = await as("dispatcher");
  await smsControl("reset");
});

afterEach(async () => {
  await removeMade(db);
});

afterAll(async () => {
  await db("notifications").where("body", "like", `%[t ${run}%`).delete();
  await db.destroy();
  closeEmailTransport();
});

const crew3 = [
  { position: "lead" as const, employeeNo: "CP-1001" }, // Marcus Whitfield
  { position: "ground" as const, employeeNo: "CP-1007" }, // Jesse Navarro
  { position: "ground" as const, employeeNo: "CP-1014" }, // Mateo Quintana
];

async function send(d: MadeDay, client = dispatcher) {
  return client.json<{ assignments: number; messages: number; new: number; changed: number; removed: number; unreachable: unknown[]; error?: string; blocks?: { rule: string; order: string }[] }>(
    "/api/send",
    "POST",
    { date: d.day, yard: d.yardCode },
  );
}

async function statusOf(id: number) {
  return (await db("assignments").where({ id }).first()) as Record<string, any>;
}

async function delivered(d: MadeDay) {
  return waitFor(`assignments of ${d.number} delivered`, async () => {
    const rows = await db("assignments").whereIn("id", d.assignments.map((a) => a.id)).pluck("status");
    return rows.every((s: string) => s === "delivered" || s === "confirmed") && rows;
  });
}

const textsAbout = async (number: string) => (await fakeTexts()).filter((m) => m.source === "api" && m.body.includes(number));
const mailsAbout = async (number: string) => (await fakeMails()).filter((m) => m.subject.includes(number));
const countBy = <T,>(xs: T[], key: (x: T) => string) => xs.reduce((m, x) => m.set(key(x), (m.get(key(x)) ?? 0) + 1), new Map<string, number>());

/** Drives drainOnce from this process until the rows are settled (the app's loop may help). */
async function drainUntil(ids: number[], timeoutMs: number, pool = db) {
  return waitFor(
    `notifications ${ids.join(",")} settled`,
    async () => {
      await drainOnce(pool, { limit: 50 });
      const rows = await db("notifications").whereIn("id", ids).select("id", "state", "attempts", "last_error");
      return rows.every((r: { state: string }) => r.state === "sent" || r.state === "failed") && rows;
    },
    timeoutMs,
    200,
  );
}

async function queueOne(channel: "sms" | "email", tag: string) {
  const key = `test:${run}:${tag}:${channel}`;
  await enqueue(db, [
    channel === "sms"
      ? { organisationId: 1, channel, kind: "test", to: "+13205559901", body: `Gaffline test ${tag} [t ${run}]`, dedupeKey: key }
      : { organisationId: 1, channel, kind: "test", to: "outbox-test@cedarprairie.example", subject: `Outbox test ${tag} [t ${run}]`, body: `Gaffline test ${tag} [t ${run}]`, dedupeKey: key },
  ]);
  return Number((await db("notifications").where({ dedupe_key: key }).first("id")).id);
}

describe("Send crews", () => {
  it("texts and e-mails each person once; a repeat of the same send writes nothing twice", async () => {
    const d = await makeCrewDay(db, { offsetDays: 120, crew: crew3 });
    const first = await send(d);
    expect(first.status).toBe(200);
    expect(first.body).toMatchObject({ assignments: 3, messages: 6, new: 3, changed: 0, removed: 0, unreachable: [] });
    const again = await send(d);
    expect(again.body).toMatchObject({ assignments: 0, messages: 0 });

    const rows = await db("notifications").whereIn("assignment_id", d.assignments.map((a) => a.id)).select("channel", "dedupe_key");
    expect(rows).toHaveLength(6);
    expect(rows.filter((r) => r.channel === "sms")).toHaveLength(3);

    await delivered(d);
    await waitFor("3 texts and 3 mails at the fakes", async () => (await textsAbout(d.number)).length >= 3 && (await mailsAbout(d.number)).length >= 3);
    // No fixed wait: a notification is only ever sent again while its row is queued or sending
    // (lib/notify/data-outbox.ts claims rows in those states only), so once every row of the order is
    // settled nothing more can arrive, and a provider call completes before its row says sent.
    await waitFor("every notification of the order settled", async () => {
      const left = await db("notifications").whereIn("assignment_id", d.assignments.map((a) => a.id)).whereIn("state", ["queued", "sending"]).count({ n: "*" }).first();
      return Number(left?.n) === 0;
    });
    const texts = countBy(await textsAbout(d.number), (m) => m.to);
    const mails = countBy(await mailsAbout(d.number), (m) => m.to[0]);
    for (const a of d.assignments) {
      expect(texts.get(a.phone!), `texts to ${a.employeeNo}`).toBe(1);
      expect(mails.get(a.email!), `mails to ${a.employeeNo}`).toBe(1);
    }

    // The text says what, where, when, position and how to answer; the e-mail carries an .ics.
    const marcus = d.assignments[0];
    const sms = (await textsAbout(d.number)).find((m) => m.to === marcus.phone)!;
    expect(sms.body).toMatch(new RegExp(`^Gaffline: \\w{3} \\w{3} \\d+ 07:00-15:30 Lead on ${d.number} .*4100 Testing Road.*Reply Y ${marcus.replyCode} to confirm, N ${marcus.replyCode} to decline\\.$`));
    const mail = (await mailsAbout(d.number)).find((m) => m.to[0] === marcus.email)!;
    expect(mail.text).toContain("/me");
    expect(mail.text).toContain("Jesse Navarro");
    const ics = mail.attachments.find((a) => a.filename.endsWith(".ics"))!;
    expect(ics.contentType).toMatch(/text\/calendar/);
    // RFC 5545 §3.3.5: a UTC date-time ends in Z.
    expect(ics.content).toMatch(/DTSTART:\d{8}T\d{6}Z/);
    expect(ics.content).toContain(`UID:assignment-${marcus.id}@gaffline`);

    const auditRow = await db("audit_log").where({ action: "send.crews", entity_id: `${d.yardCode}:${d.day}` }).orderBy("id", "desc").first();
    expect(auditRow).toBeTruthy();
    const event = await db("board_events").where({ kind: "send", yard_id: d.yardId, day: d.day }).first();
    expect(event).toBeTruthy();
  });

  it("is refused with the list while an unresolved block remains, and for roles that do not dispatch", async () => {
    // An apprentice alone, climbing energized work: QUALIFIED and CREW_MIN block (1910.269(l)).
    const d = await makeCrewDay(db, { offsetDays: 121, workType: "pole_climb", energized: true, crew: [{ position: "climber", employeeNo: "CP-1014" }] });
    const r = await send(d);
    expect(r.status).toBe(409);
    expect(r.body.blocks!.length).toBeGreaterThan(0);
    expect(r.body.blocks!.every((b) => b.order === d.number)).toBe(true);
    expect(r.body.blocks!.map((b) => b.rule)).toContain("QUALIFIED");
    expect((await statusOf(d.assignments[0].id)).status).toBe("draft");
    expect(await db("notifications").where({ assignment_id: d.assignments[0].id }).count({ n: "*" }).first()).toMatchObject({ n: 0 });

    const lineworker = await as("lineworker");
    expect((await send(d, lineworker)).status).toBe(403);
    expect((await send(d, await as("hr"))).status).toBe(403);
    expect((await dispatcher.json("/api/send", "POST", { yard: "NOR" })).status).toBe(422);
    expect((await dispatcher.json("/api/send", "POST", { date: d.day, yard: "NOPE" })).status).toBe(404);
  });

  it("a later send tells only what changed: new, moved, removed, and a changed time", async () => {
    const d = await makeCrewDay(db, {
      offsetDays: 122,
      crew: [...crew3, { position: "ground" }, { position: "observer" }],
    });
    expect((await send(d)).body).toMatchObject({ new: 3, messages: 6 });
    await delivered(d);
    const [marcus, jesse, mateo] = d.assignments;
    const openGround = d.positions[3].id;
    const observer = d.positions[4].id;

    // Mateo off, Tomas Lindqvist (CP-1003) on, Jesse moved to observer, the order an hour later.
    expect((await dispatcher.json(`/api/assignments/${mateo.id}?version=1`, "DELETE")).status).toBe(200);
    const tomas = await db("workers").where({ employee_no: "CP-1003" }).first();
    expect((await dispatcher.json("/api/assignments", "POST", { positionId: openGround, workerId: tomas.id })).status).toBe(201);
    const moved = await dispatcher.json<{ assignmentId: number }>(`/api/assignments/${jesse.id}`, "PATCH", { positionId: observer, version: 1 });
    expect(moved.status).toBe(200);
    const o = await db("work_orders").where({ id: d.orderId }).first();
    await db("work_orders")
      .where({ id: d.orderId })
      .update({ start_at: new Date(new Date(o.start_at).getTime() + 3_600_000), end_at: new Date(new Date(o.end_at).getTime() + 3_600_000) });

    const second = await send(d);
    expect(second.status).toBe(200);
    // new: Tomas and Jesse's new seat; changed: Marcus (time); removed: Mateo.
    expect(second.body).toMatchObject({ new: 2, changed: 1, removed: 1, assignments: 4, messages: 8 });
    expect((await send(d)).body).toMatchObject({ assignments: 0, messages: 0 });

    const kinds = await db("notifications")
      .whereIn("assignment_id", [marcus.id, mateo.id, moved.body.assignmentId])
      .where("channel", "sms")
      .orderBy("id")
      .select("assignment_id", "kind", "body");
    expect(kinds.filter((k) => k.assignment_id === mateo.id).map((k) => k.kind)).toEqual(["assignment", "removal"]);
    expect(kinds.find((k) => k.assignment_id === mateo.id && k.kind === "removal")!.body).toContain(`you're off ${d.number}`);
    expect(kinds.filter((k) => k.assignment_id === marcus.id).map((k) => k.kind)).toEqual(["assignment", "change"]);
    expect(kinds.find((k) => k.kind === "change" && k.assignment_id === marcus.id)!.body).toMatch(/^Gaffline CHANGE: \w{3} \w{3} \d+ 08:00-16:30 Lead/);
    // A move inside the same order is one message about the new seat, not "off" plus "on".
    expect(kinds.filter((k) => k.assignment_id === moved.body.assignmentId).map((k) => k.kind)).toEqual(["change"]);
    expect((await statusOf(marcus.id)).status).toMatch(/sent|delivered/);
    expect((await statusOf(mateo.id)).sent_version).toBe((await statusOf(mateo.id)).version);
  });

  it("Re-send queues a fresh text and e-mail for one assignment (dispatchers only)", async () => {
    const d = await makeCrewDay(db, { offsetDays: 123, crew: crew3.slice(0, 1) });
    await send(d);
    await delivered(d);
    const a = d.assignments[0];
    const r = await dispatcher.json<{ messages: number }>(`/api/assignments/${a.id}/resend`, "POST");
    expect(r.status).toBe(201);
    expect(r.body.messages).toBe(2);
    expect((await dispatcher.json(`/api/assignments/${a.id}/resend`, "POST")).status).toBe(409); // moments ago
    expect((await (await as("lineworker")).json(`/api/assignments/${a.id}/resend`, "POST")).status).toBe(403);
    await waitFor("the re-sent text", async () => (await textsAbout(d.number)).filter((m) => m.to === a.phone).length === 2);
    expect((await textsAbout(d.number)).filter((m) => m.to === a.phone)[1].body).toMatch(/^Gaffline reminder:/);
  });
});

describe("Delivery", () => {
  it("a 500 from the provider is retried with backoff and delivered once", async () => {
    await smsControl("fail", { count: 2, status: 500 });
    const id = await queueOne("sms", "fail500");
    const [row] = await drainUntil([id], 40_000);
    expect(row.state).toBe("sent");
    expect(row.attempts).toBe(3); // two 500s, then accepted
    // The row is settled (sent): no further send can come; wait for the text to be listed.
    const got = await waitFor("the text at the fake", async () => {
      const t = (await fakeTexts()).filter((m) => m.body.includes(`test fail500 [t ${run}`));
      return t.length > 0 && t;
    });
    expect(got).toHaveLength(1);
  });

  it(
    `the provider and the mail server down for ${FULL ? 30 : 5} s: retried, then delivered once`,
    async () => {
      const seconds = FULL ? 30 : 5;
      await smsControl("down", { seconds });
      await mailControl("down", { seconds });
      const started = Date.now();
      const ids = [await queueOne("sms", "down"), await queueOne("email", "down")];
      expect(new Set(ids).size).toBe(2);
      const rows = await drainUntil(ids, (seconds + 120) * 1000);
      expect(rows.every((r: { state: string }) => r.state === "sent")).toBe(true);
      expect(Date.now() - started).toBeGreaterThanOrEqual(seconds * 1000 - 500);
      expect(rows.every((r: { attempts: number }) => r.attempts >= 2)).toBe(true);
      // Both rows are settled (sent): wait for the fakes to list them, then count.
      await waitFor("the text and the mail at the fakes", async () => {
        const t = (await fakeTexts()).filter((m) => m.body.includes(`test down [t ${run}`)).length;
        const m = (await fakeMails()).filter((x) => x.subject.includes(`test down [t ${run}`)).length;
        return t > 0 && m > 0;
      });
      expect((await fakeTexts()).filter((m) => m.body.includes(`test down [t ${run}`))).toHaveLength(1);
      expect((await fakeMails()).filter((m) => m.subject.includes(`test down [t ${run}`))).toHaveLength(1);
    },
    FULL ? 240_000 : 120_000,
  );

  it("two delivery loops on two connection pools never send a row twice", async () => {
    const tag = `pair-${Date.now()}`;
    const rows = Array.from({ length: 160 }, (_, i) => ({
      organisationId: 1,
      channel: (i % 4 === 3 ? "email" : "sms") as "sms" | "email",
      kind: "test",
      to: i % 4 === 3 ? `pair${i}@cedarprairie.example` : `+1320555${String(9000 + i).padStart(4, "0")}`,
      subject: i % 4 === 3 ? `Pair ${i} ${tag} [t ${run}]` : null,
      body: `Pair ${i} ${tag} [t ${run}]`,
      dedupeKey: `test:${run}:${tag}:${i}`,
    }));
    expect(await enqueue(db, rows)).toBe(160);
    expect(await enqueue(db, rows)).toBe(0); // the same keys again: nothing written
    const ids = (await db("notifications").where("dedupe_key", "like", `test:${run}:${tag}:%`).pluck("id")).map(Number);
    const a = testDb();
    const b = testDb();
    try {
      const loop = async (pool: typeof db) => {
        for (let i = 0; i < 200; i++) {
          const r = await drainOnce(pool, { limit: 20, concurrency: 5 });
          const left = await db("notifications").whereIn("id", ids).whereIn("state", ["queued", "sending"]).count({ n: "*" }).first();
          if (r.claimed === 0 && Number(left?.n) === 0) return;
          if (r.claimed === 0) await sleep(100);
        }
      };
      await Promise.all([loop(a), loop(b)]);
    } finally {
      await a.destroy();
      await b.destroy();
    }
    const states = await db("notifications").whereIn("id", ids).pluck("state");
    expect(states.filter((s: string) => s === "sent")).toHaveLength(160);
    // All 160 rows are settled: wait until the fakes list every distinct message, then count.
    await waitFor("all 160 messages at the fakes", async () => {
      const t = new Set((await fakeTexts()).filter((m) => m.body.includes(tag)).map((m) => m.body)).size;
      const m = new Set((await fakeMails()).filter((x) => x.subject.includes(tag)).map((x) => x.subject)).size;
      return t === 120 && m === 40;
    });
    const texts = countBy((await fakeTexts()).filter((m) => m.body.includes(tag)), (m) => m.body);
    const mails = countBy((await fakeMails()).filter((m) => m.subject.includes(tag)), (m) => m.subject);
    expect(texts.size).toBe(120);
    expect(mails.size).toBe(40);
    expect([...texts.values(), ...mails.values()].every((n) => n === 1)).toBe(true);
  });

  it("a claim left by a crashed instance is checked with the provider before it is sent again", async () => {
    // Rows as a crashed instance leaves them: claimed ('sending') five minutes ago, never settled.
    const stale = async (tag: string) => {
      const [id] = await db("notifications").insert({
        organisation_id: 1,
        channel: "sms",
        kind: "test",
        to_address: "+13205559902",
        body: `Gaffline test ${tag} [t ${run}]`,
        state: "sending",
        attempts: 0,
        next_attempt_at: new Date(Date.now() - 5 * 60_000),
        claim_token: "crashed-instance",
        claimed_at: new Date(Date.now() - 5 * 60_000),
        dedupe_key: `test:${run}:${tag}`,
      });
      return Number(id);
    };
    // Crash after the provider accepted: the text went out, the row still says 'sending'.
    const accepted = await stale("crash-after");
    const sid = (await smsAdapter().send({ to: "+13205559902", body: `Gaffline test crash-after [t ${run}]` })).sid;
    // Crash before the provider saw it: nothing went out.
    const notSent = await stale("crash-before");

    const rows = await drainUntil([accepted, notSent], 30_000);
    const byId = new Map(rows.map((r: { id: number }) => [Number(r.id), r]));
    expect(byId.get(accepted)).toMatchObject({ state: "sent" });
    expect((await db("notifications").where({ id: accepted }).first()).provider_id).toBe(sid);
    expect(byId.get(notSent)).toMatchObject({ state: "sent" });
    // Both rows are settled: wait for the one text that crash-before still owed, then count.
    await waitFor("the owed text at the fake", async () => (await fakeTexts()).some((m) => m.body.includes(`test crash-before [t ${run}`)));
    expect((await fakeTexts()).filter((m) => m.body.includes(`test crash-after [t ${run}`))).toHaveLength(1);
    expect((await fakeTexts()).filter((m) => m.body.includes(`test crash-before [t ${run}`))).toHaveLength(1);
  });
});

describe("Text replies", () => {
  const post = (body: URLSearchParams, signature?: string) =>
    fetch(WEBHOOK.replace(/^https?:\/\/[^/]+/, process.env.APP_URL ?? "http://127.0.0.1:3100"), {
      method: "POST",
      headers: { "content-type": "application/x-www-form-urlencoded", ...(signature ? { "x-twilio-signature": signature } : {}) },
      body,
    });
  const form = (from: string, text: string, sid = `SM${Date.now().toString(16).padStart(32, "0")}`) => ({
    MessageSid: sid,
    AccountSid: process.env.TWILIO_ACCOUNT_SID ?? "AC00000000000000000000000000000000",
    From: from,
    To: process.env.TWILIO_FROM_NUMBER ?? "+13205550199",
    Body: text,
  });

  it("refuses a missing, forged or wrong-URL signature with 403 and changes nothing", async () => {
    const d = await makeCrewDay(db, { offsetDays: 124, crew: crew3.slice(0, 1) });
    await send(d);
    const a = d.assignments[0];
    const params = form(a.phone!, `Y ${a.replyCode}`);
    const body = new URLSearchParams(params);
    expect((await post(body)).status).toBe(403);
    // Signed with another auth token (twilio.getExpectedTwilioSignature is the provider's algorithm).
    expect((await post(body, twilio.getExpectedTwilioSignature("not-our-token", WEBHOOK, params))).status).toBe(403);
    // Signed for another URL than the public webhook.
    expect((await post(body, twilio.getExpectedTwilioSignature(TOKEN, "https://elsewhere.example/api/sms/inbound", params))).status).toBe(403);
    // Signed right, but a parameter changed on the way.
    expect((await post(new URLSearchParams({ ...params, Body: `N ${a.replyCode}` }), twilio.getExpectedTwilioSignature(TOKEN, WEBHOOK, params))).status).toBe(403);
    expect((await statusOf(a.id)).status).not.toBe("confirmed");
    expect(await db("inbound_messages").where({ provider_sid: params.MessageSid }).first()).toBeUndefined();
    // Signed right: accepted.
    const ok = await post(body, twilio.getExpectedTwilioSignature(TOKEN, WEBHOOK, params));
    expect(ok.status).toBe(200);
    expect(await ok.text()).toContain("confirmed");
    expect((await statusOf(a.id)).status).toBe("confirmed");
  });

  it("a replayed MessageSid is answered 200 with an empty response and changes nothing", async () => {
    const d = await makeCrewDay(db, { offsetDays: 125, crew: crew3.slice(1, 2) });
    await send(d);
    const a = d.assignments[0];
    const sid = `SM${"e".repeat(16)}${Date.now().toString(16).padStart(16, "0")}`;
    const first = await textIn(a.phone!, `N ${a.replyCode} truck in the shop`, { messageSid: sid, webhookUrl: WEBHOOK });
    expect(first.status).toBe(200);
    expect(first.replies[0]).toContain("declined");
    const after = await statusOf(a.id);
    const second = await textIn(a.phone!, `N ${a.replyCode} truck in the shop`, { messageSid: sid, webhookUrl: WEBHOOK });
    expect(second.status).toBe(200);
    expect(second.replies).toEqual([]);
    expect(second.twiml).toMatch(/<Response\/>|<Response><\/Response>/);
    expect(await statusOf(a.id)).toMatchObject({ status: "declined", version: after.version });
    expect(await db("inbound_messages").where({ provider_sid: sid }).count({ n: "*" }).first()).toMatchObject({ n: 1 });
    expect(await db("audit_log").where({ action: "assignment.decline", entity_id: String(a.id) }).count({ n: "*" }).first()).toMatchObject({ n: 1 });
  });

  it("a decline reopens the seat on the board, keeping who declined and why", async () => {
    const d = await makeCrewDay(db, { offsetDays: 126, crew: crew3.slice(0, 2) });
    await send(d);
    await delivered(d);
    const [marcus, jesse] = d.assignments;
    const lastEvent = Number((await db("board_events").max({ id: "id" }).first())?.id ?? 0);
    const r = await textIn(jesse.phone!, ` n  ${jesse.replyCode}  sick kid `, { webhookUrl: WEBHOOK });
    expect(r.replies[0]).toMatch(/declined/);
    expect(await statusOf(jesse.id)).toMatchObject({ status: "declined", holds_position: null, decline_reason: "sick kid", response_channel: "sms" });
    // Marcus has exactly one open request: a bare Y confirms it.
    const y = await textIn(marcus.phone!, "Yes", { webhookUrl: WEBHOOK });
    expect(y.replies[0]).toMatch(/confirmed/);
    expect((await statusOf(marcus.id)).status).toBe("confirmed");

    const board = await dispatcher.json<{ orders: { number: string; seats: { id: number; assignment: { status: string } | null; declinedBy: { name: string; reason: string } | null }[] }[] }>(
      `/api/board?date=${d.day}&yard=${d.yardCode}`,
    );
    const card = board.body.orders.find((o) => o.number === d.number)!;
    const seat = card.seats.find((s) => s.id === jesse.positionId)!;
    expect(seat.assignment).toBeNull();
    expect(seat.declinedBy).toMatchObject({ name: "Jesse Navarro", reason: "sick kid" });
    expect(card.seats.find((s) => s.id === marcus.positionId)!.assignment!.status).toBe("confirmed");
    // Each answer posts a board event for that yard and day, so open boards refresh at once.
    expect(await db("board_events").where({ kind: "reply", yard_id: d.yardId, day: d.day }).where("id", ">", lastEvent).count({ n: "*" }).first()).toMatchObject({ n: 2 });
  });

  it("a bare Y with two open requests asks for the code; a reply that matches nothing is kept for the dispatcher", async () => {
    const one = await makeCrewDay(db, { offsetDays: 127, crew: crew3.slice(2, 3) });
    const two = await makeCrewDay(db, { offsetDays: 128, crew: crew3.slice(2, 3) });
    await send(one);
    await send(two);
    const mateo = one.assignments[0];
    const r = await textIn(mateo.phone!, "Y", { webhookUrl: WEBHOOK });
    expect(r.replies[0]).toContain(one.assignments[0].replyCode);
    expect(r.replies[0]).toContain(two.assignments[0].replyCode);
    const kept = await db("inbound_messages").where({ provider_sid: r.messageSid }).first();
    expect(kept).toMatchObject({ outcome: "unmatched", handled: 0, worker_id: mateo.workerId });
    const y = await textIn(mateo.phone!, `Y${two.assignments[0].replyCode}`, { webhookUrl: WEBHOOK });
    expect(y.replies[0]).toMatch(/confirmed/);
    expect((await statusOf(two.assignments[0].id)).status).toBe("confirmed");
    expect((await statusOf(one.assignments[0].id)).status).not.toBe("confirmed");

    const stranger = await textIn("+13205550999", "who is this?", { webhookUrl: WEBHOOK });
    expect(stranger.replies[0]).toMatch(/not on file/);
    expect(await db("inbound_messages").where({ provider_sid: stranger.messageSid }).first()).toMatchObject({ outcome: "unmatched", worker_id: null });
    const wrong = await textIn(mateo.phone!, "N 0000", { webhookUrl: WEBHOOK });
    expect(wrong.replies[0]).toMatch(/no job with code 0000/);

    // The dispatcher marks it handled.
    const h = await dispatcher.json(`/api/messages/inbound/${kept.id}`, "PATCH", { handled: true });
    expect(h.status).toBe(200);
    expect(await db("inbound_messages").where({ id: kept.id }).first()).toMatchObject({ handled: 1 });
  });

  it("STOP opts the number out (no more texts, e-mail still goes), START back in, HELP gives the dispatcher's number", async () => {
    const d = await makeCrewDay(db, { offsetDays: 129, crew: crew3.slice(2, 3) });
    const mateo = d.assignments[0];
    try {
      const stop = await textIn(mateo.phone!, "stop", { webhookUrl: WEBHOOK });
      expect(stop.replies[0]).toMatch(/won't get/);
      expect((await db("workers").where({ id: mateo.workerId }).first()).sms_opt_in).toBe(0);
      const sent = await send(d);
      expect(sent.body).toMatchObject({ new: 1, messages: 1 }); // the e-mail only
      expect(await db("notifications").where({ assignment_id: mateo.id }).pluck("channel")).toEqual(["email"]);
      const start = await textIn(mateo.phone!, "START", { webhookUrl: WEBHOOK });
      expect(start.replies[0]).toMatch(/back on/);
      expect((await db("workers").where({ id: mateo.workerId }).first()).sms_opt_in).toBe(1);
      const help = await textIn(mateo.phone!, "HELP", { webhookUrl: WEBHOOK });
      expect(help.replies[0]).toContain("(320) 555-0191"); // North Yard's dispatcher (db/demo/scenario.ts)
    } finally {
      await db("workers").where({ id: mateo.workerId }).update({ sms_opt_in: true });
    }
  });

  it("My week's answer goes through the same state machine: own assignment only", async () => {
    const d = await makeCrewDay(db, { offsetDays: 130, crew: crew3.slice(0, 2) });
    await send(d);
    const [marcus, jesse] = d.assignments;
    const lineworker = await as("lineworker"); // Marcus Whitfield
    expect((await lineworker.json(`/api/assignments/${jesse.id}/respond`, "POST", { answer: "confirm" })).status).toBe(403);
    expect((await dispatcher.json(`/api/assignments/${marcus.id}/respond`, "POST", { answer: "confirm" })).status).toBe(403);
    expect((await lineworker.json(`/api/assignments/${marcus.id}/respond`, "POST", { answer: "maybe" })).status).toBe(422);
    const ok = await lineworker.json(`/api/assignments/${marcus.id}/respond`, "POST", { answer: "confirm" });
    expect(ok.status).toBe(200);
    expect(ok.body).toMatchObject({ outcome: "confirmed" });
    expect(await statusOf(marcus.id)).toMatchObject({ status: "confirmed", response_channel: "web" });
    const again = await lineworker.json(`/api/assignments/${marcus.id}/respond`, "POST", { answer: "confirm" });
    expect(again.body).toMatchObject({ outcome: "unchanged" });
    const decline = await lineworker.json(`/api/assignments/${marcus.id}/respond`, "POST", { answer: "decline", reason: "truck broke down" });
    expect(decline.body).toMatchObject({ outcome: "declined" });
    expect(await statusOf(marcus.id)).toMatchObject({ status: "declined", holds_position: null, decline_reason: "truck broke down" });
    expect((await lineworker.json(`/api/assignments/${marcus.id}/respond`, "POST", { answer: "confirm" })).status).toBe(409);
  });
});

describe("Phone simulator API", () => {
  it("reads a phone's texts for dispatchers (not lineworkers)", async () => {
    const r = await dispatcher.json<{ messages: unknown[] }>(`/api/phone?phone=${encodeURIComponent("+13205550101")}`);
    expect(r.status).toBe(200);
    expect(Array.isArray(r.body.messages)).toBe(true);
    expect((await (await as("lineworker")).json(`/api/phone?phone=${encodeURIComponent("+13205550101")}`)).status).toBe(403);
    expect((await dispatcher.json(`/api/phone?phone=12345`)).status).toBe(422);
  });
});
