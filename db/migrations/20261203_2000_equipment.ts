import type { Knex } from "knex";

// The equipment register (issue 16): trucks and trailers per yard, the rigging each truck
// carries, and which equipment goes out on which work order.
// - equipment.booking_seq: bumped by every booking of the truck, inside the booking's
//   transaction, so two bookings of one truck always write the same row: on one server the row
//   lock serialises them, on a Galera cluster (where FOR UPDATE locks only on its own node)
//   write-set certification refuses the second at commit.
// - equipment_assignments: one row per (order, equipment); the overlap check (a truck on two
//   overlapping orders) runs under the truck's row lock in lib/equipment/data.ts.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("equipment", (t) => {
    t.engine("InnoDB");
    t.charset("utf8mb4");
    t.collate("utf8mb4_unicode_ci");
    t.increments("id");
    t.integer("organisation_id").unsigned().notNullable().references("organisations.id");
    t.integer("yard_id").unsigned().notNullable().references("yards.id");
    t.enum("kind", ["bucket_truck", "digger_derrick", "pickup", "trailer", "other"]).notNullable();
    t.string("unit_number", 20).notNullable();
    t.string("name", 120).notNullable();
    t.boolean("insulated").notNullable().defaultTo(false);
    t.date("dielectric_tested_on").nullable();
    t.date("annual_inspection_on").nullable();
    t.enum("licence", ["cdl_a", "cdl_b"]).nullable();
    t.boolean("out_of_service").notNullable().defaultTo(false);
    t.string("out_of_service_reason", 500).nullable();
    t.integer("version").notNullable().defaultTo(1);
    t.bigInteger("booking_seq").notNullable().defaultTo(0);
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.timestamp("updated_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.unique(["organisation_id", "unit_number"]);
    t.index(["organisation_id", "yard_id", "kind"]);
  });

  await knex.schema.createTable("equipment_rigging", (t) => {
    t.engine("InnoDB");
    t.charset("utf8mb4");
    t.collate("utf8mb4_unicode_ci");
    t.increments("id");
    t.integer("equipment_id").unsigned().notNullable().references("equipment.id").onDelete("CASCADE");
    t.enum("kind", ["rope_block", "hand_line", "sling"]).notNullable();
    t.string("label", 120).notNullable();
    t.integer("parts_of_line").nullable(); // rope blocks only
    t.integer("sheaves").nullable(); // rope blocks only
    t.integer("wll_lb").notNullable();
    t.date("inspected_on").nullable();
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(["equipment_id"]);
  });

  await knex.schema.createTable("equipment_assignments", (t) => {
    t.engine("InnoDB");
    t.charset("utf8mb4");
    t.collate("utf8mb4_unicode_ci");
    t.increments("id");
    t.integer("work_order_id").unsigned().notNullable().references("work_orders.id").onDelete("CASCADE");
    t.integer("equipment_id").unsigned().notNullable().references("equipment.id");
    t.integer("version").notNullable().defaultTo(1);
    t.integer("created_by").unsigned().nullable().references("users.id");
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.unique(["work_order_id", "equipment_id"]);
    t.index(["equipment_id"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists("equipment_assignments");
  await knex.schema.dropTableIfExists("equipment_rigging");
  await knex.schema.dropTableIfExists("equipment");
}
