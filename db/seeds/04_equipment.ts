import type { Knex } from "knex";
import { DEMO_EQUIPMENT } from "../demo/equipment";
import { todayIn, addDays } from "../../lib/time/days";

// The demo's trucks and trailers and their rigging (after 01_demo.ts, which empties every table
// and writes the yards and orders). Idempotent: this seed's own rows are replaced on each run.
export async function seed(knex: Knex): Promise<void> {
  const yards = await knex("yards").select("id", "code", "organisation_id", "timezone");
  const yardBy = new Map(yards.map((y) => [y.code as string, y]));
  await knex.transaction(async (trx) => {
    const units = DEMO_EQUIPMENT.map((e) => e.unit);
    const old = await trx("equipment").whereIn("unit_number", units).pluck("id");
    if (old.length) {
      await trx("equipment_assignments").whereIn("equipment_id", old).delete();
      await trx("equipment").whereIn("id", old).delete();
    }
    for (const e of DEMO_EQUIPMENT) {
      const y = yardBy.get(e.yard);
      if (!y) throw new Error(`04_equipment: no yard ${e.yard} (run 01_demo first)`);
      const today = todayIn(y.timezone);
      const ago = (n: number | null) => (n === null ? null : addDays(today, -n));
      const [id] = await trx("equipment").insert({
        organisation_id: y.organisation_id,
        yard_id: y.id,
        kind: e.kind,
        unit_number: e.unit,
        name: e.name,
        insulated: e.insulated,
        dielectric_tested_on: ago(e.dielectricDaysAgo),
        annual_inspection_on: ago(e.inspectionDaysAgo),
        licence: e.licence,
        out_of_service: Boolean(e.outOfService),
        out_of_service_reason: e.outOfService ?? null,
      });
      await trx("equipment_rigging").insert(
        e.rigging.map((r) => ({
          equipment_id: id,
          kind: r.kind,
          label: r.label,
          parts_of_line: r.partsOfLine ?? null,
          sheaves: r.sheaves ?? null,
          wll_lb: r.wllLb,
          inspected_on: ago(r.inspectedDaysAgo),
        })),
      );
      if (e.bookedOn) {
        const order = await trx("work_orders").where({ number: e.bookedOn }).first("id");
        if (order) await trx("equipment_assignments").insert({ work_order_id: order.id, equipment_id: id });
      }
    }
  });
}
