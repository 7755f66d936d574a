// Loads the generated large day (lib/rules/generate.ts via lib/fill/scenario.ts: 1,500
// workers, 400 orders, 60 days of time records, two yards) into a database that already holds
// the demo seed (organisation, yards, users, qualification and work types), with batch inserts.
//
//   DB_NAME=gaffline_bench node --import tsx scripts/bench/load-large.ts [--workers 1500 --orders 400 --days 60 --seed 42]
//
// The day is tomorrow in the North yard's zone, so /board?yard=NOR shows it by default. Orders
// alternate between North and Mesa; so do the workers. Everything it writes is numbered "GB-…",
// and a second run replaces what the first wrote. Prints a JSON summary.

import knex, { type Knex } from "knex";
import { dbConfig } from "../../knexfile";
import { fillScenario } from "../../lib/fill/scenario";
import { addDays, tomorrowIn } from "../../lib/time/days";
import { epochToZonedDate } from "../../lib/rules/time";
import type { WorkType } from "../../lib/rules/types";

export interface LoadOptions {
  workers: number;
  orders: number;
  days: number;
  seed: number;
  database?: string;
}

const pad = (n: number, w = 4) => String(n).padStart(w, "0");

async function batch(db: Knex | Knex.Transaction, table: string, rows: Record<string, unknown>[], size = 1000) {
  for (let i = 0; i < rows.length; i += size) await db(table).insert(rows.slice(i, i + size));
}

/** Removes what an earlier load wrote (everything numbered GB-…). */
async function clear(db: Knex) {
  const workerIds = db("workers").where("employee_no", "like", "GB-%").select("id");
  const orderIds = db("work_orders").where("number", "like", "GB-%").select("id");
  await db("notifications").whereIn("worker_id", workerIds).delete();
  await db("notifications").whereIn("assignment_id", db("assignments").whereIn("work_order_id", orderIds).select("id")).delete();
  await db("inbound_messages").whereIn("worker_id", workerIds).delete();
  await db("work_orders").whereIn("id", orderIds).delete(); // positions, assignments, overrides cascade
  await db("assignments").whereIn("worker_id", workerIds).delete();
  for (const t of ["time_records", "unavailability", "credentials", "rotation_members"]) await db(t).whereIn("worker_id", workerIds).delete();
  await db("users").whereIn("worker_id", workerIds).delete();
  await db("workers").where("employee_no", "like", "GB-%").delete();
}

export async function loadLarge(opts: LoadOptions) {
  const db = knex(dbConfig(opts.database ? { database: opts.database } : {}));
  const t0 = performance.now();
  try {
    const org = await db("organisations").where({ slug: "cedar-prairie" }).first();
    if (!org) throw new Error("run the demo seed first (node --import tsx scripts/db.ts seed)");
    const yards = await db("yards").where({ organisation_id: org.id }).orderBy("code", "desc"); // NOR, MES
    const north = yards.find((y) => y.code === "NOR")!;
    const mesa = yards.find((y) => y.code === "MES")!;
    const day = tomorrowIn(north.timezone);
    const { problem, snapshot } = fillScenario({ workers: opts.workers, orders: opts.orders, days: opts.days, seed: opts.seed, date: day, timezone: north.timezone });

    await clear(db);
    const qual = new Map<string, number>((await db("qualification_types").where({ organisation_id: org.id }).select("id", "code")).map((q) => [q.code, q.id]));
    // Work types by rule type (the demo has no plain "other": one is added for the bench).
    const types = await db("work_types").where({ organisation_id: org.id }).select("id", "code", "rule_type");
    if (!types.some((t) => t.rule_type === "other")) {
      await db("work_types").insert({ organisation_id: org.id, code: "bench_other", name: "General line work", rule_type: "other", min_crew: 1, digs: false });
      types.push(await db("work_types").where({ organisation_id: org.id, code: "bench_other" }).first("id", "code", "rule_type"));
    }
    const typeOf = (rt: WorkType) => (types.find((t) => t.code === rt) ?? types.find((t) => t.rule_type === rt))!.id;
    const hr = await db("users").where({ organisation_id: org.id, role: "hr" }).first("id");

    // Workers, alternating North and Mesa (as the scenario's two yards do).
    const yardOf = (i: number) => (i % 2 === 0 ? north : mesa);
    await batch(
      db,
      "workers",
      snapshot.workers.map((w, i) => {
        const [first, ...rest] = w.name.split(" ");
        return {
          organisation_id: org.id,
          yard_id: yardOf(i).id,
          employee_no: `GB-${pad(i + 1)}`,
          first_name: first,
          last_name: rest.join(" ") || "Bench",
          classification: w.classification,
          phone_e164: `+1320${2000000 + i}`,
          email: `gb${pad(i + 1)}@bench.invalid`,
          sms_opt_in: true,
          active: true,
        };
      }),
    );
    const workerId = new Map<string, number>();
    for (const r of await db("workers").where("employee_no", "like", "GB-%").select("id", "employee_no")) workerId.set(`w-${r.employee_no.slice(3)}`, r.id);

    const credentials: Record<string, unknown>[] = [];
    const unavailability: Record<string, unknown>[] = [];
    const records: Record<string, unknown>[] = [];
    for (const w of snapshot.workers) {
      const id = workerId.get(w.id)!;
      for (const c of w.credentials) {
        const q = qual.get(c.type);
        if (!q) continue;
        const expires = c.expiresOn;
        const issued = expires ? addDays(expires, -365) : "2020-01-01";
        credentials.push({ worker_id: id, qualification_type_id: q, issued_on: issued, expires_on: expires, status: "current", created_by: hr?.id ?? null });
      }
      for (const u of w.unavailable) unavailability.push({ worker_id: id, start_at: new Date(u.start), end_at: new Date(u.end), kind: u.reason, status: "approved" });
      for (const r of w.timeRecords) {
        const len = r.end - r.start;
        const hour = Number(new Date(r.start).toISOString().slice(11, 13));
        records.push({ worker_id: id, start_at: new Date(r.start), end_at: new Date(r.end), kind: len <= 4 * 3_600_000 && (hour >= 2 || hour < 9) ? "call_out" : "shift" });
      }
    }
    await batch(db, "credentials", credentials);
    await batch(db, "unavailability", unavailability);
    await batch(db, "time_records", records, 2000);

    // The day's orders, their seats and the placements the scenario keeps.
    const woById = new Map(snapshot.workOrders.map((o) => [o.id, o]));
    await batch(
      db,
      "work_orders",
      problem.orders.map((fo, i) => {
        const o = woById.get(fo.id)!;
        const yard = i % 2 === 0 ? north : mesa;
        return {
          organisation_id: org.id,
          yard_id: yard.id,
          number: `GB-${pad(i + 1)}`,
          title: o.title,
          work_type_id: typeOf(o.workType),
          start_at: new Date(o.start),
          end_at: new Date(o.end),
          work_date: epochToZonedDate(o.start, yard.timezone),
          energized: o.energized,
          voltage_kv: o.voltageKv,
          emergency: o.exception === "emergency",
          crew_exception: o.exception,
          min_crew: o.minCrew,
          driver_licence: o.driverLicence ?? null,
          priority: fo.priority,
          status: "planned",
        };
      }),
    );
    const orderId = new Map<string, number>();
    for (const r of await db("work_orders").where("number", "like", "GB-%").select("id", "number")) orderId.set(`wo-${r.number.slice(3)}`, r.id);
    const positions: Record<string, unknown>[] = [];
    for (const fo of problem.orders) fo.seats.forEach((s, k) => positions.push({ work_order_id: orderId.get(fo.id)!, position: s.position, sort: k }));
    await batch(db, "positions", positions, 2000);
    const seatId = new Map<string, number>();
    for (const r of await db("positions").whereIn("work_order_id", [...orderId.values()]).select("id", "work_order_id", "sort")) seatId.set(`${r.work_order_id}:${r.sort}`, r.id);
    const dispatcher = await db("users").where({ organisation_id: org.id, role: "dispatcher" }).first("id");
    const assignments: Record<string, unknown>[] = [];
    for (const fo of problem.orders) {
      fo.seats.forEach((s, k) => {
        if (!s.workerId) return;
        const pid = seatId.get(`${orderId.get(fo.id)}:${k}`)!;
        assignments.push({
          work_order_id: orderId.get(fo.id)!,
          position_id: pid,
          worker_id: workerId.get(s.workerId)!,
          holds_position: pid,
          status: "draft",
          reply_code: `9${pad(assignments.length % 100000, 5)}`,
          created_by: dispatcher?.id ?? null,
        });
      });
    }
    await batch(db, "assignments", assignments, 2000);
    const summary = {
      database: opts.database ?? process.env.DB_NAME,
      day,
      workers: snapshot.workers.length,
      orders: problem.orders.length,
      positions: positions.length,
      assignments: assignments.length,
      openPositions: positions.length - assignments.length,
      credentials: credentials.length,
      timeRecords: records.length,
      unavailability: unavailability.length,
      ms: Math.round(performance.now() - t0),
    };
    return summary;
  } finally {
    await db.destroy();
  }
}

function option(name: string, fallback: number): number {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 ? Number(process.argv[i + 1]) : fallback;
}

if (process.argv[1] && /load-large\.ts$/.test(process.argv[1])) {
  loadLarge({ workers: option("workers", 1500), orders: option("orders", 400), days: option("days", 60), seed: option("seed", 42) })
    .then((s) => console.log(JSON.stringify(s)))
    .catch((err) => {
      console.error(String(err instanceof Error ? err.message : err).slice(0, 2000));
      process.exit(1);
    });
}
