import type { Knex } from "knex";

// Fields of a work order's site that the crew rules' second pass and the field figures share
// (../shared/CREW-CHECK.md, "Corrections" and "Equipment, gear and field figures"):
// - near_energized_kv: highest voltage of exposed energized parts within reach when the work
//   itself is de-energized (1910.269(l)(2)(i)(B), (D));
// - phases / system_kv: 1 for a single-phase tap (voltage_kv is then the voltage to ground,
//   system_kv the phase-to-phase voltage of the system it is tapped from);
// - altitude_m: the site's elevation when it differs from its yard's (Table R-5);
// - yards.elevation_m: the yard's elevation above sea level, the default for its orders.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("work_orders", (t) => {
    t.decimal("near_energized_kv", 7, 3).nullable();
    t.tinyint("phases").notNullable().defaultTo(3);
    t.decimal("system_kv", 7, 3).nullable();
    t.integer("altitude_m").nullable();
  });
  await knex.schema.alterTable("yards", (t) => {
    t.integer("elevation_m").notNullable().defaultTo(0);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("yards", (t) => t.dropColumn("elevation_m"));
  await knex.schema.alterTable("work_orders", (t) => {
    t.dropColumn("near_energized_kv");
    t.dropColumn("phases");
    t.dropColumn("system_kv");
    t.dropColumn("altitude_m");
  });
}
