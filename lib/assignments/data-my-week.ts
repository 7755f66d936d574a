// My week's reads: the lineworker's upcoming assignments with their crews, briefings waiting
// for them, their leave entries. Server only.
import "@/lib/server-only";
import type { Knex } from "knex";
import { POSITION_LABEL } from "@/lib/format";

export interface MyCrewMate {
  workerId: number;
  name: string;
  position: string;
  phone: string | null;
}

export interface MyAssignment {
  id: number;
  status: string;
  position: string;
  orderId: number;
  number: string;
  title: string;
  address: string | null;
  structureNo: string | null;
  start: string;
  end: string;
  workDate: string;
  timezone: string;
  yardName: string;
  orderStatus: string;
  holdReason: string | null;
  briefingState: string;
  /** The current briefing round's own state (draft, briefed, on_hold), or null before one exists. */
  roundState: string | null;
  notes: string | null;
  declineReason: string | null;
  /** This worker holds the lead seat (writes the briefing). */
  isLead: boolean;
  crew: MyCrewMate[];
}

const DAY = 86_400_000;

export async function myAssignments(db: Knex, workerId: number, now = new Date()): Promise<MyAssignment[]> {
  const rows = await db("assignments as a")
    .join("work_orders as o", "o.id", "a.work_order_id")
    .join("positions as p", "p.id", "a.position_id")
    .join("yards as y", "y.id", "o.yard_id")
    .where("a.worker_id", workerId)
    .whereNot("a.status", "removed")
    .whereNot("o.status", "cancelled")
    .where("o.end_at", ">=", new Date(now.getTime() - 12 * 3_600_000))
    .where("o.start_at", "<", new Date(now.getTime() + 8 * DAY))
    .orderBy([{ column: "o.start_at" }, { column: "a.id" }])
    .select(
      "a.id",
      "a.status",
      "a.decline_reason",
      "a.holds_position",
      "p.position",
      "o.id as order_id",
      "o.number",
      "o.title",
      "o.address",
      "o.structure_no",
      "o.start_at",
      "o.end_at",
      "o.work_date",
      "o.status as order_status",
      "o.hold_reason",
      "o.briefing_state",
      "o.notes",
      "y.timezone",
      "y.name as yard_name",
      db.raw("(SELECT b.state FROM briefings b WHERE b.work_order_id = o.id ORDER BY b.round DESC LIMIT 1) AS round_state"),
    );
  const orderIds = [...new Set(rows.map((r) => Number(r.order_id)))];
  const mates = orderIds.length
    ? await db("assignments as a")
        .join("positions as p", "p.id", "a.position_id")
        .join("workers as w", "w.id", "a.worker_id")
        .whereIn("a.work_order_id", orderIds)
        .whereNotNull("a.holds_position")
        .orderBy([{ column: "p.sort" }, { column: "p.id" }])
        .select("a.work_order_id", "a.worker_id", "p.position", "w.first_name", "w.last_name", "w.phone_e164")
    : [];
  return rows.map((r) => {
    const crew = mates
      .filter((m) => Number(m.work_order_id) === Number(r.order_id))
      .map((m) => ({
        workerId: Number(m.worker_id),
        name: `${m.first_name} ${m.last_name}`,
        position: POSITION_LABEL[m.position] ?? String(m.position),
        phone: m.phone_e164 ?? null,
      }));
    const isLead =
      r.holds_position !== null &&
      mates.some((m) => Number(m.work_order_id) === Number(r.order_id) && Number(m.worker_id) === workerId && m.position === "lead");
    return {
      id: Number(r.id),
      status: String(r.status),
      position: String(r.position),
      orderId: Number(r.order_id),
      number: String(r.number),
      title: String(r.title),
      address: r.address ?? null,
      structureNo: r.structure_no ?? null,
      start: new Date(r.start_at).toISOString(),
      end: new Date(r.end_at).toISOString(),
      workDate: String(r.work_date),
      timezone: String(r.timezone),
      yardName: String(r.yard_name),
      orderStatus: String(r.order_status),
      holdReason: r.hold_reason ?? null,
      briefingState: String(r.briefing_state),
      roundState: r.round_state ?? null,
      notes: r.notes ?? null,
      declineReason: r.decline_reason ?? null,
      isLead,
      crew,
    };
  });
}

/** "Tue, Dec 2 · 07:00–15:30 CST": the order's times on the yard's clock, with the zone's name. */
export function whenLocal(start: string, end: string, timezone: string) {
  const day = new Intl.DateTimeFormat("en-US", { timeZone: timezone, weekday: "short", month: "short", day: "numeric" });
  const time = new Intl.DateTimeFormat("en-US", { timeZone: timezone, hour: "2-digit", minute: "2-digit", hour12: false });
  const zone = new Intl.DateTimeFormat("en-US", { timeZone: timezone, timeZoneName: "short" }).formatToParts(new Date(start)).find((p) => p.type === "timeZoneName")?.value ?? "";
  const s = new Date(start);
  const e = new Date(end);
  const sameDay = day.format(s) === day.format(e);
  return `${day.format(s)} · ${time.format(s)}–${sameDay ? "" : `${day.format(e)} `}${time.format(e)} ${zone}`.trim();
}

export const mapLink = (address: string) => `https://www.openstreetmap.org/search?query=${encodeURIComponent(address)}`;

/** +13205550101 → (320) 555-0101 for North American numbers; anything else as stored. */
export function phoneText(e164: string) {
  const m = /^\+1(\d{3})(\d{3})(\d{4})$/.exec(e164);
  return m ? `(${m[1]}) ${m[2]}-${m[3]}` : e164;
}
