import type { Knex } from "knex";
import bcrypt from "bcryptjs";
import { DEMO_ACCOUNTS } from "../demo/accounts";
import {
  CREDENTIAL_CASES,
  ORDERS,
  ORGANISATION,
  QUALIFICATION_TYPES,
  ROTATIONS,
  STANDARD_CREDENTIALS,
  WORKERS,
  WORK_TYPES,
  YARDS,
  type QualCode,
  type YardCode,
} from "../demo/scenario";
import { addDays, addMonths, localDateOf, localToUtc, weekday } from "../demo/time";

// The demo scenario: Cedar Prairie Electric Cooperative (invented), two yards in two zones,
// ~40 workers and a dozen work orders for tomorrow in each yard's own zone. Idempotent: every
// table (except knex's own) is emptied first, then everything is inserted with fixed ids.
// All dates are computed at seed time, so "tomorrow" always has work.

const ORG_ID = 1;

/** Which yard each demo account belongs to, and the worker a lineworker account signs in as. */
const ACCOUNT_LINKS: Record<string, { yard?: YardCode; workerNo?: string }> = {
  "dispatch@cedarprairie.example": { yard: "NOR" },
  "dispatch.mesa@cedarprairie.example": { yard: "MES" },
  "marcus.whitfield@cedarprairie.example": { yard: "NOR", workerNo: "CP-1001" },
};

async function emptyAllTables(knex: Knex): Promise<void> {
  const [rows] = (await knex.raw(
    "SELECT table_name AS name FROM information_schema.tables " +
      "WHERE table_schema = DATABASE() AND table_type = 'BASE TABLE' AND table_name NOT LIKE 'knex\\_%'",
  )) as [{ name: string }[], unknown];
  // One pinned connection, so the session flag applies to every TRUNCATE (each of which
  // commits implicitly; the transaction is only there to hold the connection).
  await knex.transaction(async (trx) => {
    await trx.raw("SET FOREIGN_KEY_CHECKS = 0");
    try {
      for (const { name } of rows) await trx.raw("TRUNCATE TABLE ??", [name]);
    } finally {
      await trx.raw("SET FOREIGN_KEY_CHECKS = 1");
    }
  });
}

/** Small deterministic spread so credentials don't all expire on the same day. */
function spread(a: number, b: number, span: number): number {
  return (a * 37 + b * 101 + 11) % span;
}

/** A unique 4-digit reply code per live assignment (7919 is coprime to 9000). */
const replyCode = (i: number) => String(1000 + ((i * 7919 + 2741) % 9000));

export async function seed(knex: Knex): Promise<void> {
  await emptyAllTables(knex);

  const now = new Date();
  const hashes = await Promise.all(DEMO_ACCOUNTS.map((a) => bcrypt.hash(a.password, 10)));

  const yardId = new Map<YardCode, number>(YARDS.map((y, i) => [y.code, i + 1]));
  const yardOf = new Map(YARDS.map((y) => [y.code, y]));
  const today = new Map<YardCode, string>(YARDS.map((y) => [y.code, localDateOf(now, y.timezone)]));
  const tomorrow = new Map<YardCode, string>(YARDS.map((y) => [y.code, addDays(today.get(y.code)!, 1)]));
  const tz = (code: YardCode) => yardOf.get(code)!.timezone;

  const workerId = new Map(WORKERS.map((w, i) => [w.no, i + 1]));
  const workerByNo = new Map(WORKERS.map((w) => [w.no, w]));
  const qualId = new Map<QualCode, number>(QUALIFICATION_TYPES.map((q, i) => [q.code, i + 1]));
  const workTypeId = new Map(WORK_TYPES.map((t, i) => [t.code, i + 1]));
  const userId = new Map(DEMO_ACCOUNTS.map((a, i) => [a.email, i + 1]));
  const byRole = (role: string, yard?: YardCode) =>
    DEMO_ACCOUNTS.findIndex((a) => a.role === role && (!yard || ACCOUNT_LINKS[a.email]?.yard === yard)) + 1;
  const hrUser = byRole("hr");
  const supervisorUser = byRole("supervisor");
  const dispatcherUser = (yard: YardCode) => byRole("dispatcher", yard);

  await knex.transaction(async (trx) => {
    // --- organisation, yards, policy -------------------------------------------------------
    await trx("organisations").insert({
      id: ORG_ID,
      name: ORGANISATION.name,
      slug: ORGANISATION.slug,
      dispatcher_phone: ORGANISATION.dispatcherPhone,
    });
    await trx("yards").insert(
      YARDS.map((y) => ({
        id: yardId.get(y.code),
        organisation_id: ORG_ID,
        code: y.code,
        name: y.name,
        timezone: y.timezone,
        address: y.address,
        dispatcher_phone: y.dispatcherPhone,
      })),
    );
    await trx("policies").insert({
      organisation_id: ORG_ID,
      min_rest_hours: 8,
      max_shift_hours: 16,
      credential_warn_days: 30,
      regular_hours_week: 40,
      regular_hours_day: 8,
      reply_deadline_hours: 10,
      rule_levels: null,
    });

    // --- catalogue: qualification types, work types and their crew templates ---------------
    await trx("qualification_types").insert(
      QUALIFICATION_TYPES.map((q) => ({
        id: qualId.get(q.code),
        organisation_id: ORG_ID,
        code: q.code,
        name: q.name,
        renewal_months: q.renewalMonths,
        warn_days: q.warnDays,
        needs_evidence: q.needsEvidence,
      })),
    );
    await trx("work_types").insert(
      WORK_TYPES.map((t) => ({
        id: workTypeId.get(t.code),
        organisation_id: ORG_ID,
        code: t.code,
        name: t.name,
        rule_type: t.ruleType,
        min_crew: t.minCrew,
        digs: t.digs,
      })),
    );
    await trx("work_type_positions").insert(
      WORK_TYPES.flatMap((t) =>
        t.positions.map((position, sort) => ({ work_type_id: workTypeId.get(t.code), position, sort })),
      ),
    );

    // --- workers and users ------------------------------------------------------------------
    await trx("workers").insert(
      WORKERS.map((w) => ({
        id: workerId.get(w.no),
        organisation_id: ORG_ID,
        yard_id: yardId.get(w.yard),
        employee_no: w.no,
        first_name: w.first,
        last_name: w.last,
        classification: w.cls,
        // Fictional 555-01xx lines in real area codes, so they pass E.164 validation.
        phone_e164: w.noPhone ? null : demoPhone(w.no),
        email: w.noEmail ? null : `${w.first}.${w.last}@cedarprairie.example`.toLowerCase(),
        sms_opt_in: !w.smsOptOut,
        active: true,
      })),
    );
    await trx("users").insert(
      DEMO_ACCOUNTS.map((a, i) => {
        const link = ACCOUNT_LINKS[a.email] ?? {};
        return {
          id: userId.get(a.email),
          organisation_id: ORG_ID,
          email: a.email,
          name: a.name,
          role: a.role,
          password_hash: hashes[i],
          worker_id: link.workerNo ? workerId.get(link.workerNo) : null,
          home_yard_id: link.yard ? yardId.get(link.yard) : null,
          active: true,
        };
      }),
    );

    // --- credentials --------------------------------------------------------------------------
    const credentials: Record<string, unknown>[] = [];
    const verifiedAt = (issued: string, zone: string) => {
      const at = localToUtc(issued, "10:00", zone);
      return at > now ? now : at;
    };
    const addCredential = (
      wNo: string,
      code: QualCode,
      issued: string,
      expires: string | null,
      status: "current" | "superseded",
      supersedes: number | null,
    ) => {
      const w = workerByNo.get(wNo)!;
      const id = credentials.length + 1;
      credentials.push({
        id,
        worker_id: workerId.get(wNo),
        qualification_type_id: qualId.get(code),
        issued_on: issued,
        expires_on: expires,
        status,
        verified_by: hrUser,
        verified_at: verifiedAt(issued, tz(w.yard)),
        supersedes_id: supersedes,
        created_by: hrUser,
      });
      return id;
    };
    WORKERS.forEach((w, wi) => {
      const codes = [...STANDARD_CREDENTIALS[w.cls], ...(w.extra ?? [])];
      const tmw = tomorrow.get(w.yard)!;
      const tdy = today.get(w.yard)!;
      for (const code of codes) {
        const q = QUALIFICATION_TYPES.find((t) => t.code === code)!;
        const months = q.renewalMonths;
        const special = CREDENTIAL_CASES.find((c) => c.no === w.no && c.code === code);
        if (months === null) {
          addCredential(w.no, code, addDays(tdy, -200 - spread(wi, qualId.get(code)!, 400)), null, "current", null);
        } else if (special?.renewedDaysAgo !== undefined) {
          const issued = addDays(tdy, -special.renewedDaysAgo);
          // The old card ran out two weeks after the renewal was taken.
          const oldIssued = addDays(addMonths(issued, -months), 14);
          const oldId = addCredential(w.no, code, oldIssued, addDays(addMonths(oldIssued, months), -1), "superseded", null);
          addCredential(w.no, code, issued, addDays(addMonths(issued, months), -1), "current", oldId);
        } else {
          const expiresIn =
            special?.expiresIn ?? 75 + spread(wi, qualId.get(code)!, Math.max(30, months * 30 - 110));
          const expires = addDays(tmw, expiresIn);
          addCredential(w.no, code, addDays(addMonths(expires, -months), 1), expires, "current", null);
        }
      }
    });
    await trx("credentials").insert(credentials);

    // --- tomorrow's work orders, their positions and the pre-placed crews -------------------
    const orders: Record<string, unknown>[] = [];
    const shifts: Record<string, unknown>[] = [];
    const positions: Record<string, unknown>[] = [];
    const assignments: Record<string, unknown>[] = [];
    ORDERS.forEach((o, oi) => {
      const zone = tz(o.yard);
      // Most orders are tomorrow's; tonight's trouble call starts today (dayOffset -1).
      const day = addDays(tomorrow.get(o.yard)!, o.dayOffset ?? 0);
      const type = WORK_TYPES.find((t) => t.code === o.workType);
      if (!type) throw new Error(`unknown work type ${o.workType}`);
      const start = localToUtc(day, o.start, zone);
      const endDay = addDays(day, o.endDayOffset ?? 0);
      let end = localToUtc(endDay, o.end, zone);
      if (end <= start) end = localToUtc(addDays(endDay, 1), o.end, zone);
      const orderId = oi + 1;
      for (const s of o.shifts ?? []) {
        const sDay = addDays(day, s.day);
        const sStart = localToUtc(sDay, s.start, zone);
        let sEnd = localToUtc(sDay, s.end, zone);
        if (sEnd <= sStart) sEnd = localToUtc(addDays(sDay, 1), s.end, zone);
        shifts.push({ work_order_id: orderId, start_at: sStart, end_at: sEnd });
      }
      orders.push({
        id: orderId,
        organisation_id: ORG_ID,
        yard_id: yardId.get(o.yard),
        number: o.number,
        title: o.title,
        work_type_id: workTypeId.get(type.code),
        address: o.address,
        structure_no: o.structureNo,
        start_at: start,
        end_at: end,
        work_date: day,
        energized: o.energized ?? true,
        voltage_kv: o.voltageKv,
        phases: o.phases ?? 3,
        system_kv: o.phases === 1 ? (o.systemKv ?? null) : null,
        near_energized_kv: o.nearEnergizedKv ?? null,
        emergency: o.emergency ?? false,
        crew_exception: o.crewException ?? null,
        min_crew: type.minCrew,
        driver_licence: null,
        priority: o.priority,
        notes: o.notes ?? null,
        status: "planned",
        locate_ticket: o.locate?.ticket ?? null,
        locate_valid_through: o.locate ? addDays(day, o.locate.validThroughIn) : null,
        created_by: dispatcherUser(o.yard),
      });
      (o.positions ?? type.positions).forEach((position, sort) => {
        const positionId = positions.length + 1;
        positions.push({ id: positionId, work_order_id: orderId, position, sort });
        const wNo = o.crew?.[position];
        if (!wNo) return;
        if (!workerId.has(wNo)) throw new Error(`unknown worker ${wNo} on ${o.number}`);
        assignments.push({
          id: assignments.length + 1,
          work_order_id: orderId,
          position_id: positionId,
          worker_id: workerId.get(wNo),
          holds_position: positionId,
          status: "draft",
          reply_code: replyCode(assignments.length),
          version: 1,
          created_by: dispatcherUser(o.yard),
        });
      });
    });
    await trx("work_orders").insert(orders);
    if (shifts.length) await trx("work_order_shifts").insert(shifts);
    await trx("positions").insert(positions);
    await trx("assignments").insert(assignments);

    // --- on-call rotations: hand-over Mondays 07:00; the last member is on call this week ---
    const rotationId = new Map<YardCode, number>();
    const members: Record<string, unknown>[] = [];
    const rotations = ROTATIONS.map((r, ri) => {
      const id = ri + 1;
      rotationId.set(r.yard, id);
      const tdy = today.get(r.yard)!;
      const monday = addDays(tdy, -((weekday(tdy) + 6) % 7));
      const start = addDays(monday, -7 * (r.members.length - 1));
      r.members.forEach((no, sort) => members.push({ rotation_id: id, worker_id: workerId.get(no), sort }));
      return {
        id,
        organisation_id: ORG_ID,
        yard_id: yardId.get(r.yard),
        name: r.name,
        rrule: "FREQ=WEEKLY;BYDAY=MO",
        dtstart_local: `${start}T07:00:00`,
        active: true,
      };
    });
    await trx("rotations").insert(rotations);
    await trx("rotation_members").insert(members);

    // --- time records: this week's shifts, then last night's call-outs -----------------------
    const timeRecords: Record<string, unknown>[] = [];
    const record = (wNo: string, day: string, from: string, toDay: string, to: string, kind: string, extra = {}) => {
      const zone = tz(workerByNo.get(wNo)!.yard);
      timeRecords.push({
        worker_id: workerId.get(wNo),
        start_at: localToUtc(day, from, zone),
        end_at: localToUtc(toDay, to, zone),
        kind,
        work_order_id: null,
        rotation_id: null,
        reason: null,
        created_by: null,
        ...extra,
      });
    };
    // Owen Tillman and Curtis Fairbanks worked today whatever the weekday.
    const ALWAYS_WORKED_TODAY = new Set(["CP-1009", "CP-1010"]);
    WORKERS.forEach((w, wi) => {
      const tdy = today.get(w.yard)!;
      const days: string[] = [];
      for (let back = 0; days.length < 5 && back < 10; back++) {
        const d = addDays(tdy, -back);
        const wd = weekday(d);
        if ((wd !== 0 && wd !== 6) || (back === 0 && ALWAYS_WORKED_TODAY.has(w.no))) days.push(d);
      }
      for (const [di, d] of days.entries()) {
        const isToday = d === tdy;
        let end = "15:30";
        // Overtime on a few earlier days; never today, so tonight's rest stays as designed.
        if (!isToday && (wi + di * 3) % 7 === 0) end = (wi + di) % 2 ? "17:30" : "18:00";
        if (isToday && w.no === "CP-1009") end = "17:00";
        record(w.no, d, "07:00", d, end, "shift");
      }
    });
    {
      const n = today.get("NOR")!;
      const nt = tomorrow.get("NOR")!;
      // Owen: 07:00–17:00 shift + 20:00–02:30 on-call call-out: under 8 h apart on both sides
      // of tomorrow's 07:00 start, so the stretch runs far past 16 h → REST blocks.
      record("CP-1009", n, "20:00", nt, "02:30", "call_out", {
        rotation_id: rotationId.get("NOR"),
        reason: "On-call: transformer fuse out at N-2871, 14 members off",
      });
      // Curtis: 07:00–15:30 shift + 23:00–05:30 call-out (7.5 h gap) → REST blocks tomorrow.
      record("CP-1010", n, "23:00", nt, "05:30", "call_out", {
        reason: "Called in to help on-call: tree on primary at N-2410",
      });
      const m = tomorrow.get("MES")!;
      // Colby: 1-hour call-out at 01:00; with a 07:00–15:00 order that is a 14 h stretch: fine.
      record("CP-2008", m, "01:00", m, "02:00", "call_out", {
        rotation_id: rotationId.get("MES"),
        reason: "On-call: blown tap fuse at M-0917",
      });
    }
    await trx("time_records").insert(timeRecords);

    // --- leave and training --------------------------------------------------------------------
    const nt = tomorrow.get("NOR")!;
    const nToday = today.get("NOR")!;
    let nextMonday = addDays(nToday, ((8 - weekday(nToday)) % 7) || 7);
    if (nextMonday <= nt) nextMonday = addDays(nextMonday, 7);
    const mt = tomorrow.get("MES")!;
    await trx("unavailability").insert([
      {
        worker_id: workerId.get("CP-1011"),
        start_at: localToUtc(nt, "00:00", tz("NOR")),
        end_at: localToUtc(addDays(nt, 3), "00:00", tz("NOR")),
        kind: "leave",
        status: "approved",
        note: "Family wedding out of state",
        requested_by: hrUser,
        decided_by: supervisorUser,
      },
      {
        worker_id: workerId.get("CP-1018"),
        start_at: localToUtc(addDays(nextMonday, 1), "00:00", tz("NOR")),
        end_at: localToUtc(addDays(nextMonday, 3), "00:00", tz("NOR")),
        kind: "leave",
        status: "requested",
        note: "Daughter's graduation",
        requested_by: hrUser,
        decided_by: null,
      },
      {
        worker_id: workerId.get("CP-2005"),
        start_at: localToUtc(addDays(mt, 1), "08:00", tz("MES")),
        end_at: localToUtc(addDays(mt, 1), "16:00", tz("MES")),
        kind: "training",
        status: "approved",
        note: "Pole-top rescue instructor course",
        requested_by: hrUser,
        decided_by: supervisorUser,
      },
    ]);
  });
}

/** CP-1007 -> +13205550107 (North, area code 320); CP-2003 -> +15055550153 (Mesa, 505). */
function demoPhone(employeeNo: string): string {
  const n = Number(employeeNo.slice(3));
  return n < 2000 ? `+1320555${String(100 + (n - 1000)).padStart(4, "0")}` : `+1505555${String(150 + (n - 2000)).padStart(4, "0")}`;
}
