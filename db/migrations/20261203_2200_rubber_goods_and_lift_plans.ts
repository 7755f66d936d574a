import type { Knex } from "knex";

// Rubber goods and lift plans (issue 16):
// - rubber_goods: a worker's insulating gloves and sleeves, each with its class (ASTM D120 /
//   D1051 classes 00–4, whose maximum use voltages are 1910.137 Table I-4), size, the serial
//   or label stamped on it, and the date of its last electrical test (the retest intervals are
//   Table I-5). issued_on / retired_on: in service between them; a retired item stays on
//   record but no longer counts for the crew rules.
// - lift_plans: one planned lift per work order (a transformer set or change-out, or any
//   order the dispatcher marks): the nameplate weight, the rope block and hand line and slings
//   (chosen from the truck's rigging, whose WLL is copied so a later register edit does not
//   silently change a confirmed plan, or entered by hand), and the crew lead's confirmation
//   with the weight read on site. The *_rigging_id columns name the register row the WLL came
//   from; they carry no foreign key so a rigging item can be retired from the register.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("rubber_goods", (t) => {
    t.engine("InnoDB");
    t.charset("utf8mb4");
    t.collate("utf8mb4_unicode_ci");
    t.increments("id");
    t.integer("organisation_id").unsigned().notNullable().references("organisations.id");
    t.integer("worker_id").unsigned().notNullable().references("workers.id");
    t.enum("kind", ["rubber_gloves", "rubber_sleeves"]).notNullable();
    t.enum("class", ["00", "0", "1", "2", "3", "4"]).notNullable();
    t.string("size", 10).nullable();
    t.string("serial", 40).notNullable();
    t.date("tested_on").notNullable();
    t.date("issued_on").nullable();
    t.date("retired_on").nullable();
    t.string("note", 500).nullable();
    t.integer("version").notNullable().defaultTo(1);
    t.integer("updated_by").unsigned().nullable().references("users.id");
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.timestamp("updated_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.unique(["organisation_id", "serial"]);
    t.index(["worker_id"]);
    t.index(["organisation_id", "tested_on"]);
  });

  await knex.schema.createTable("lift_plans", (t) => {
    t.engine("InnoDB");
    t.charset("utf8mb4");
    t.collate("utf8mb4_unicode_ci");
    t.increments("id");
    t.integer("work_order_id").unsigned().notNullable().unique().references("work_orders.id").onDelete("CASCADE");
    t.string("load_label", 120).nullable();
    t.decimal("load_lb", 9, 1).notNullable();
    t.integer("parts_of_line").notNullable();
    t.integer("sheaves").notNullable();
    t.decimal("friction_per_sheave", 4, 3).notNullable().defaultTo(0.1);
    t.integer("block_rigging_id").unsigned().nullable();
    t.integer("block_wll_lb").nullable();
    t.integer("line_rigging_id").unsigned().nullable();
    t.integer("line_wll_lb").nullable();
    t.integer("sling_rigging_id").unsigned().nullable();
    t.integer("sling_wll_lb").nullable();
    t.integer("sling_legs").notNullable().defaultTo(1);
    t.decimal("sling_angle_deg", 4, 1).notNullable().defaultTo(90);
    t.string("note", 500).nullable();
    t.integer("version").notNullable().defaultTo(1);
    t.integer("updated_by").unsigned().nullable().references("users.id");
    t.timestamp("updated_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    // The crew lead's confirmation in the briefing, with the weight read off the nameplate on site.
    t.decimal("site_weight_lb", 9, 1).nullable();
    t.integer("confirmed_by").unsigned().nullable().references("users.id");
    t.timestamp("confirmed_at", { precision: 3 }).nullable();
    t.integer("confirmed_version").nullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists("lift_plans");
  await knex.schema.dropTableIfExists("rubber_goods");
}
