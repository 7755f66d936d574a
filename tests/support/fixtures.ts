// Test data of the tests' own, on days far from the demo's "tomorrow", so tests do not
// depend on (or disturb) the demo board.
import type { Knex } from "knex";
import { zonedWallTimeToEpoch } from "@/lib/rules/time";
import { addDays, todayIn } from "@/lib/time/days";

export async function yard(db: Knex, code = "NOR") {
  return db("yards").where({ code }).first();
}

let counter = 0;
const created: number[] = [];

/** Deletes the orders this test file made (positions, assignments and overrides cascade). */
export async function removeMadeOrders(db: Knex) {
  if (!created.length) return;
  await db("notifications").whereIn("assignment_id", db("assignments").whereIn("work_order_id", created).select("id")).delete();
  await db("work_orders").whereIn("id", created.splice(0)).delete();
}

/** A work order with the given positions on a day `offsetDays` from today in the yard's zone. */
export async function makeOrder(
  db: Knex,
  opts: {
    yardCode?: string;
    offsetDays: number;
    workType?: string;
    positions: string[];
    start?: string; // HH:mm
    end?: string;
    energized?: boolean;
    minCrew?: number | null;
  },
) {
  const y = await yard(db, opts.yardCode ?? "NOR");
  const day = addDays(todayIn(y.timezone), opts.offsetDays);
  const wt = await db("work_types").where({ organisation_id: y.organisation_id, code: opts.workType ?? "pole_climb" }).first();
  const number = `T-${process.pid}-${Date.now() % 1_000_000}-${++counter}`;
  const [id] = await db("work_orders").insert({
    organisation_id: y.organisation_id,
    yard_id: y.id,
    number,
    title: `Test order ${number}`,
    work_type_id: wt.id,
    start_at: new Date(zonedWallTimeToEpoch(`${day}T${opts.start ?? "07:00"}`, y.timezone)),
    end_at: new Date(zonedWallTimeToEpoch(`${day}T${opts.end ?? "15:30"}`, y.timezone)),
    work_date: day,
    energized: opts.energized ?? true,
    voltage_kv: 12.47,
    min_crew: opts.minCrew === undefined ? null : opts.minCrew,
    status: "planned",
  });
  created.push(id);
  const positionIds: Record<string, number> = {};
  let sort = 0;
  for (const p of opts.positions) {
    const [pid] = await db("positions").insert({ work_order_id: id, position: p, sort: sort++ });
    positionIds[p] = pid;
  }
  return { id, number, day, yardCode: y.code as string, positionIds, yardId: y.id as number };
}

export async function workerByNo(db: Knex, employeeNo: string) {
  return db("workers").where({ employee_no: employeeNo }).first();
}
