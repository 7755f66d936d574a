// The day sheet's data (issue 18): the boards of one day, per yard, read through the board's
// own loader so crews, trucks and findings are exactly the board's. Server only.
import "@/lib/server-only";
import type { Knex } from "knex";
import { loadBoard } from "@/lib/board/data";
import { findingKey } from "@/lib/board/model";
import { EQUIPMENT_KIND_LABEL } from "@/lib/equipment/model";
import { energyLabel } from "@/lib/orders/voltage";
import { STATUS_LABEL, type OrderStatus } from "@/lib/orders/status";
import { ruleName } from "@/lib/rules/rule-labels";
import { listYards, type Yard } from "@/lib/yards/data";
import { tomorrowIn } from "@/lib/time/days";
import { zoneAbbreviation } from "@/lib/time/zoned-format";
import { ASSIGNMENT_STATUS_WORDS, positionLabel, type DaySheet, type SheetOrder, type SheetYard } from "./model";

const zoneAbbr = zoneAbbreviation;

const hm = (iso: string, timezone: string) =>
  new Intl.DateTimeFormat("en-US", { timeZone: timezone, hour: "2-digit", minute: "2-digit", hourCycle: "h23" }).format(new Date(iso));

const localDay = (iso: string, timezone: string) =>
  new Intl.DateTimeFormat("en-CA", { timeZone: timezone, year: "numeric", month: "2-digit", day: "2-digit" }).format(new Date(iso));

const shortDay = (iso: string, timezone: string) =>
  new Intl.DateTimeFormat("en-US", { timeZone: timezone, weekday: "short", month: "short", day: "numeric" }).format(new Date(iso));

/** "07:00–15:30 CST", or "07:00 CST – Sat, Dec 5, 15:30 CST" past the day. */
export function whenWords(start: string, end: string, timezone: string, day: string) {
  const startDay = localDay(start, timezone);
  const endDay = localDay(new Date(new Date(end).getTime() - 1).toISOString(), timezone);
  const a = startDay === day ? hm(start, timezone) : `${shortDay(start, timezone)}, ${hm(start, timezone)}`;
  const za = zoneAbbr(start, timezone);
  const zb = zoneAbbr(end, timezone);
  if (endDay === startDay && za === zb) return `${a}–${hm(end, timezone)} ${za}`;
  return `${a} ${za} – ${endDay === startDay ? "" : `${shortDay(end, timezone)}, `}${hm(end, timezone)} ${zb}`;
}

export async function loadDaySheet(db: Knex, opts: { organisationId: number; yardCode?: string | null; day?: string | null }): Promise<DaySheet> {
  const all = await listYards(db, opts.organisationId);
  const chosen: Yard[] = opts.yardCode ? all.filter((y) => y.code.toLowerCase() === opts.yardCode!.toLowerCase()) : all;
  const day = opts.day ?? tomorrowIn((chosen[0] ?? all[0])?.timezone ?? "UTC");
  const yards: SheetYard[] = [];
  for (const yard of chosen) {
    const board = await loadBoard(db, { organisationId: opts.organisationId, yard, yards: all, day });
    const names = new Map<number, { name: string; employeeNo: string }>(board.pool.map((w) => [w.id, { name: w.name, employeeNo: w.employeeNo }]));
    // Workers no longer active still show by name when they hold a seat.
    const missing = board.orders.flatMap((o) => o.seats.map((s) => s.assignment?.workerId)).filter((id): id is number => id !== undefined && !names.has(id));
    if (missing.length) {
      for (const w of await db("workers").whereIn("id", missing).select("id", "first_name", "last_name", "employee_no")) {
        names.set(Number(w.id), { name: `${w.first_name} ${w.last_name}`, employeeNo: w.employee_no });
      }
    }
    const units = new Map((board.equipment ?? []).map((e) => [e.id, e]));
    const valid = new Map(board.overrides.filter((v) => v.valid).map((v) => [findingKey(v), v]));
    const orders: SheetOrder[] = board.orders.map((o) => {
      const findings = board.findings
        .filter((f) => f.workOrderId === String(o.id))
        .map((f) => {
          const v = f.level === "block" ? valid.get(findingKey(f)) : undefined;
          return {
            level: f.level as "block" | "warn",
            rule: f.rule,
            ruleName: ruleName(f.rule),
            message: f.message,
            override: v ? `overridden by ${v.actorName}: ${v.reason}` : null,
          };
        })
        .sort((a, b) => (a.level === b.level ? 0 : a.level === "block" ? -1 : 1));
      return {
        id: o.id,
        number: o.number,
        title: o.title,
        where: [o.address, o.structureNo ? `pole ${o.structureNo}` : null].filter(Boolean).join(", ") || "-",
        work: `${o.workTypeName}; ${energyLabel({ energized: o.energized, voltageKv: o.voltageKv, phases: o.phases, systemKv: o.systemKv, nearEnergizedKv: o.nearEnergizedKv })}${o.emergency ? "; emergency" : ""}`,
        when: whenWords(o.start, o.end, yard.timezone, day),
        status: STATUS_LABEL[o.status as OrderStatus] ?? o.status,
        holdReason: o.status === "on_hold" ? o.holdReason : null,
        crew: o.seats.map((s) => {
          const who = s.assignment ? names.get(s.assignment.workerId) : undefined;
          return {
            position: s.position,
            positionLabel: positionLabel(s.position),
            name: s.assignment ? (who?.name ?? "a worker") : null,
            employeeNo: who?.employeeNo ?? null,
            status: s.assignment ? (s.assignment.noReply ? "no reply, call them" : (ASSIGNMENT_STATUS_WORDS[s.assignment.status] ?? s.assignment.status)) : null,
          };
        }),
        trucks: (board.equipmentBookings ?? [])
          .filter((b) => b.workOrderId === o.id)
          .map((b) => units.get(b.equipmentId))
          .filter((e): e is NonNullable<typeof e> => Boolean(e))
          .map((e) => `${e.unitNumber} ${EQUIPMENT_KIND_LABEL[e.kind] ?? e.kind}${e.name ? ` (${e.name})` : ""}`),
        findings,
        locateWarning: o.locateWarning,
      };
    });
    yards.push({ code: yard.code, name: yard.name, timezone: yard.timezone, zone: zoneAbbr(`${day}T12:00:00Z`, yard.timezone), orders });
  }
  const [y, m, d] = day.split("-").map(Number);
  return {
    day,
    dayWords: new Intl.DateTimeFormat("en-US", { timeZone: "UTC", weekday: "long", month: "long", day: "numeric", year: "numeric" }).format(new Date(Date.UTC(y, m - 1, d))),
    yards,
    generatedAt: new Date().toISOString(),
  };
}
