import type { Knex } from "knex";
import { DEMO_GEAR, DEMO_LIFTS, YARD_ELEVATION_M, serialOf } from "../demo/gear";
import { addDays, todayIn } from "../../lib/time/days";

// The demo's rubber goods, yard elevations and lift plans (after 01_demo.ts, which empties every
// table and writes the yards, workers and orders). Idempotent: this seed's rows are replaced.
export async function seed(knex: Knex): Promise<void> {
  await knex.transaction(async (trx) => {
    for (const [code, m] of Object.entries(YARD_ELEVATION_M)) await trx("yards").where({ code }).update({ elevation_m: m });

    const workers = await trx("workers as w")
      .join("yards as y", "y.id", "w.yard_id")
      .whereIn("w.employee_no", [...new Set(DEMO_GEAR.map((g) => g.no))])
      .select("w.id", "w.organisation_id", "w.employee_no", "y.timezone");
    const by = new Map(workers.map((w) => [String(w.employee_no), w]));
    const count = new Map<string, number>();
    const rows = DEMO_GEAR.map((g) => {
      const w = by.get(g.no);
      if (!w) throw new Error(`05_gear: no worker ${g.no} (run 01_demo first)`);
      const today = todayIn(w.timezone);
      const n = (count.get(g.no) ?? 0) + 1;
      count.set(g.no, n);
      return {
        organisation_id: w.organisation_id,
        worker_id: w.id,
        kind: g.kind,
        class: g.class,
        size: g.size,
        serial: serialOf(g, n),
        tested_on: addDays(today, -g.testedDaysAgo),
        issued_on: g.issuedDaysAgo === undefined ? null : addDays(today, -g.issuedDaysAgo),
        retired_on: g.retiredDaysAgo === undefined ? null : addDays(today, -g.retiredDaysAgo),
      };
    });
    await trx("rubber_goods").whereIn("serial", rows.map((r) => r.serial)).delete();
    await trx("rubber_goods").insert(rows);

    for (const l of DEMO_LIFTS) {
      const order = await trx("work_orders").where({ number: l.order }).first("id");
      if (!order) continue;
      await trx("lift_plans").where({ work_order_id: order.id }).delete();
      await trx("lift_plans").insert({
        work_order_id: order.id,
        load_label: l.loadLabel,
        load_lb: l.loadLb,
        parts_of_line: l.partsOfLine,
        sheaves: l.partsOfLine,
        friction_per_sheave: 0.1,
        block_wll_lb: l.blockWllLb,
        line_wll_lb: l.lineWllLb,
        sling_wll_lb: l.slingWllLb,
        sling_legs: l.slingLegs,
        sling_angle_deg: l.slingAngleDeg,
      });
    }
  });
}
