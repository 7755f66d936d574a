// The per-worker calendar feed (iCalendar, through the `ics` package) behind a secret link:
// /api/calendar/<workers.calendar_token>. Lists the orders the worker holds a seat on (live
// assignments) from 14 days back to 60 days ahead. Server only.
import "@/lib/server-only";
import { randomBytes } from "node:crypto";
import type { Knex } from "knex";
import { createEvents, type EventAttributes } from "ics";
import { POSITION_LABEL } from "@/lib/format";
import { epochToZonedWallTime } from "@/lib/rules/time";

const DAY_MS = 86_400_000;
export const FEED_PAST_DAYS = 14;
export const FEED_AHEAD_DAYS = 60;

/** A new secret for a worker's calendar link (32 url-safe characters). */
export function newCalendarToken(): string {
  return randomBytes(24).toString("base64url");
}

/** The feed's address, on APP_PUBLIC_URL (falling back to NEXTAUTH_URL, then localhost:3000). */
export function calendarUrlFor(token: string): string {
  const base = (process.env.APP_PUBLIC_URL || process.env.NEXTAUTH_URL || "http://127.0.0.1:3000").replace(/\/+$/, "");
  return `${base}/api/calendar/${encodeURIComponent(token)}`;
}

/** Looks like a token we hand out (so a junk path never reaches the database). */
export const isTokenShaped = (t: string) => /^[A-Za-z0-9_-]{20,64}$/.test(t);

/** The worker's feed as iCalendar text, or null when no worker has this token. */
export async function calendarFeed(db: Knex, token: string, now = new Date()): Promise<string | null> {
  if (!isTokenShaped(token)) return null;
  const worker = await db("workers").where({ calendar_token: token, active: true }).first("id", "first_name", "last_name");
  if (!worker) return null;
  const rows = await db("assignments as a")
    .join("work_orders as o", "o.id", "a.work_order_id")
    .join("positions as p", "p.id", "a.position_id")
    .join("yards as y", "y.id", "o.yard_id")
    .where("a.worker_id", worker.id)
    .whereNotNull("a.holds_position")
    .whereNot("o.status", "cancelled")
    .where("o.end_at", ">=", new Date(now.getTime() - FEED_PAST_DAYS * DAY_MS))
    .where("o.start_at", "<", new Date(now.getTime() + FEED_AHEAD_DAYS * DAY_MS))
    .orderBy("o.start_at")
    .select(
      "a.id as assignment_id",
      "a.status as assignment_status",
      "a.version as assignment_version",
      "p.position",
      "o.id as order_id",
      "o.number",
      "o.title",
      "o.address",
      "o.structure_no",
      "o.start_at",
      "o.end_at",
      "o.status",
      "o.notes",
      "o.version",
      "o.updated_at",
      "y.name as yard_name",
      "y.timezone",
    );
  const events: EventAttributes[] = rows.map((r) => {
    const start = new Date(r.start_at).getTime();
    const end = new Date(r.end_at).getTime();
    const local = (ms: number) => epochToZonedWallTime(ms, r.timezone).replace("T", " ");
    const position = POSITION_LABEL[r.position] ?? r.position;
    const lines = [
      `${r.number} · ${position}`,
      `${local(start)} to ${local(end)} (${r.yard_name} time)`,
      r.structure_no ? `Pole / structure ${r.structure_no}` : null,
      r.assignment_status === "confirmed" ? "You confirmed this assignment." : null,
      r.notes ? `Notes: ${r.notes}` : null,
    ].filter(Boolean);
    return {
      uid: `wo-${r.order_id}-a${r.assignment_id}@gaffline`,
      title: `${r.title} (${position})`,
      description: lines.join("\n"),
      location: [r.address, r.structure_no ? `pole ${r.structure_no}` : null].filter(Boolean).join(", ") || undefined,
      start,
      startInputType: "utc",
      startOutputType: "utc",
      end,
      endInputType: "utc",
      endOutputType: "utc",
      status: r.status === "on_hold" ? "TENTATIVE" : "CONFIRMED",
      busyStatus: "BUSY",
      sequence: Number(r.version) + Number(r.assignment_version),
      lastModified: new Date(r.updated_at).getTime(),
      productId: "gaffline/calendar",
      calName: `Gaffline: ${worker.first_name} ${worker.last_name}`,
    };
  });
  if (events.length === 0) {
    // ics refuses an empty list; an empty calendar is still a valid feed.
    return [
      "BEGIN:VCALENDAR",
      "VERSION:2.0",
      "CALSCALE:GREGORIAN",
      "PRODID:gaffline/calendar",
      "METHOD:PUBLISH",
      `X-WR-CALNAME:Gaffline: ${worker.first_name} ${worker.last_name}`,
      "END:VCALENDAR",
      "",
    ].join("\r\n");
  }
  const { error, value } = createEvents(events, { productId: "gaffline/calendar", method: "PUBLISH", calName: `Gaffline: ${worker.first_name} ${worker.last_name}` });
  if (error || !value) throw error ?? new Error("calendar could not be built");
  return value;
}

/** Gives the worker a new calendar token (the old link stops working); false when no such worker. */
export async function setCalendarToken(trx: Knex | Knex.Transaction, organisationId: number, workerId: number, token: string): Promise<boolean> {
  const n = await trx("workers").where({ id: workerId, organisation_id: organisationId }).update({ calendar_token: token, updated_at: new Date() });
  return n > 0;
}

/** A worker's calendar token (null when none), by worker id. */
export async function calendarToken(q: Knex, workerId: number): Promise<string | null> {
  return (await q("workers").where({ id: workerId }).first("calendar_token"))?.calendar_token ?? null;
}

/** A worker's calendar token and home yard's name (My week), or undefined. */
export async function calendarTokenAndYard(q: Knex, workerId: number): Promise<{ calendar_token: string | null; yard_name: string } | undefined> {
  return q("workers as w").join("yards as y", "y.id", "w.yard_id").where("w.id", workerId).first("w.calendar_token", "y.name as yard_name");
}
