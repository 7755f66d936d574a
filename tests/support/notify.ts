// Helpers for the notification tests: a clean yard-day of the tests' own, and the fakes' stores.
// The day is far from the demo's "tomorrow" and is emptied of earlier test orders first, so
// Send crews sees only the order made here (a de-energized line patrol: no crew rule blocks it).
import { randomInt } from "node:crypto";
import knex, { type Knex } from "knex";
import { dbConfig } from "../../knexfile";
import { zonedWallTimeToEpoch } from "../../lib/rules/time";
import { addDays, todayIn } from "../../lib/time/days";

export const SMS_FAKE = process.env.TWILIO_API_BASE ?? `http://127.0.0.1:${process.env.SMS_FAKE_PORT ?? 4010}`;
export const MAILBOX = `http://127.0.0.1:${process.env.MAIL_FAKE_HTTP_PORT ?? 4020}`;

export function testDb(): Knex {
  return knex({ ...dbConfig(), pool: { min: 0, max: 6 } });
}

export interface CrewSpec {
  position: "lead" | "ground" | "observer" | "climber" | "operator" | "driver";
  employeeNo?: string; // leave out for an open seat
}

export interface MadeDay {
  orderId: number;
  number: string;
  day: string;
  yardCode: string;
  yardId: number;
  organisationId: number;
  positions: { id: number; position: string }[];
  assignments: { id: number; positionId: number; workerId: number; employeeNo: string; phone: string | null; email: string | null; replyCode: string }[];
}

const madeOrders: number[] = [];

/** Removes every order on that yard and day (tests' own days only) and what hangs off them. */
export async function clearDay(db: Knex, yardId: number, day: string) {
  const ids = (await db("work_orders").where({ yard_id: yardId, work_date: day }).pluck("id")) as number[];
  if (!ids.length) return;
  const aIds = db("assignments").whereIn("work_order_id", ids).select("id");
  await db("notifications").whereIn("assignment_id", aIds).delete();
  await db("inbound_messages").whereIn("assignment_id", db("assignments").whereIn("work_order_id", ids).select("id")).update({ assignment_id: null });
  await db("overrides").whereIn("work_order_id", ids).delete();
  await db("work_orders").whereIn("id", ids).delete();
}

export async function removeMade(db: Knex) {
  const ids = madeOrders.splice(0);
  if (!ids.length) return;
  await db("notifications").whereIn("assignment_id", db("assignments").whereIn("work_order_id", ids).select("id")).delete();
  await db("work_orders").whereIn("id", ids).delete();
}

let seq = 0;

/** A de-energized patrol on a day `offsetDays` out, with the crew placed as drafts. */
export async function makeCrewDay(
  db: Knex,
  opts: { offsetDays: number; yardCode?: string; crew: CrewSpec[]; title?: string; workType?: string; energized?: boolean; keepDay?: boolean },
): Promise<MadeDay> {
  const y = await db("yards").where({ code: opts.yardCode ?? "NOR" }).first();
  const day = addDays(todayIn(y.timezone), opts.offsetDays);
  if (!opts.keepDay) await clearDay(db, y.id, day);
  const wt = await db("work_types").where({ organisation_id: y.organisation_id, code: opts.workType ?? "patrol" }).first();
  const number = `N-${(process.pid % 1000).toString().padStart(3, "0")}${(Date.now() % 100000).toString().padStart(5, "0")}${++seq}`;
  const [orderId] = await db("work_orders").insert({
    organisation_id: y.organisation_id,
    yard_id: y.id,
    number,
    title: opts.title ?? `Patrol feeder 9 after ice, test ${number}`,
    work_type_id: wt.id,
    address: "4100 Testing Road, Cedar Prairie",
    structure_no: null,
    start_at: new Date(zonedWallTimeToEpoch(`${day}T07:00`, y.timezone)),
    end_at: new Date(zonedWallTimeToEpoch(`${day}T15:30`, y.timezone)),
    work_date: day,
    energized: opts.energized ?? false,
    voltage_kv: 12.47,
    min_crew: null,
    status: "planned",
  });
  madeOrders.push(orderId);
  const positions: MadeDay["positions"] = [];
  const assignments: MadeDay["assignments"] = [];
  let sort = 0;
  for (const c of opts.crew) {
    const [pid] = await db("positions").insert({ work_order_id: orderId, position: c.position, sort: sort++ });
    positions.push({ id: pid, position: c.position });
    if (!c.employeeNo) continue;
    const w = await db("workers").where({ employee_no: c.employeeNo }).first();
    const [aid] = await db("assignments").insert({
      work_order_id: orderId,
      position_id: pid,
      worker_id: w.id,
      holds_position: pid,
      status: "draft",
      reply_code: String(randomInt(1000, 10000)),
      version: 1,
    });
    const a = await db("assignments").where({ id: aid }).first();
    assignments.push({ id: aid, positionId: pid, workerId: w.id, employeeNo: c.employeeNo, phone: w.phone_e164, email: w.email, replyCode: a.reply_code });
  }
  return { orderId, number, day, yardCode: y.code, yardId: y.id, organisationId: y.organisation_id, positions, assignments };
}

export interface FakeSmsRecord {
  sid: string;
  source: "api" | "twiml" | "inbound";
  to: string;
  from: string;
  body: string;
}

export async function fakeTexts(to?: string): Promise<FakeSmsRecord[]> {
  const r = await fetch(`${SMS_FAKE}/_fake/messages${to ? `?to=${encodeURIComponent(to)}` : ""}`);
  return ((await r.json()) as { messages: FakeSmsRecord[] }).messages;
}

export async function fakeMails(to?: string): Promise<{ id: number; to: string[]; subject: string; text: string; messageId: string; attachments: { filename: string; contentType: string; content: string }[] }[]> {
  const r = await fetch(`${MAILBOX}/api/messages${to ? `?to=${encodeURIComponent(to)}` : ""}`);
  return ((await r.json()) as { messages: never[] }).messages;
}

export async function smsControl(path: "fail" | "down" | "reset", body: Record<string, unknown> = {}) {
  const r = await fetch(`${SMS_FAKE}/_fake/${path}`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
  if (!r.ok) throw new Error(`sms fake ${path}: ${r.status}`);
}

export async function mailControl(path: "down" | "reset", body: Record<string, unknown> = {}) {
  const r = await fetch(`${MAILBOX}/api/${path}`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
  if (!r.ok) throw new Error(`mail fake ${path}: ${r.status}`);
}

/** A text from `from` delivered to the app's webhook by the fake, signed as the provider signs. */
export async function textIn(from: string, body: string, extra: { messageSid?: string; webhookUrl?: string } = {}) {
  const r = await fetch(`${SMS_FAKE}/_fake/inbound`, {
    method: "POST",
    headers: { "content-type": "application/json" },
    body: JSON.stringify({ from, body, ...extra }),
  });
  return (await r.json()) as { status: number; messageSid: string; twiml: string; replies: string[] };
}

export async function waitFor<T>(what: string, fn: () => Promise<T | null | undefined | false>, timeoutMs = 20_000, everyMs = 250): Promise<T> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const v = await fn();
    if (v) return v;
    if (Date.now() > until) throw new Error(`timed out after ${timeoutMs} ms waiting for ${what}`);
    await new Promise((r) => setTimeout(r, everyMs));
  }
}

export const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
