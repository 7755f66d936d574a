import type { Knex } from "knex";

// Work orders, recurrence and rotations (issue 7):
// - order_counters: the next work-order number per organisation and prefix ("WO-27"), taken
//   under a row lock so several app instances never hand out the same number;
// - order_series: a version for stale-write checks, an active flag (a series can be ended) and
//   an index for ensureOccurrences' "anything to materialise?" probe;
// - work_orders.detached: an occurrence edited on its own, kept as it is when its series changes;
// - rotations: a version for stale-write checks.

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("order_counters", (t) => {
    t.engine("InnoDB");
    t.charset("utf8mb4");
    t.collate("utf8mb4_unicode_ci");
    t.integer("organisation_id").unsigned().notNullable().references("organisations.id");
    t.string("prefix", 20).notNullable();
    t.integer("last").notNullable().defaultTo(0);
    t.primary(["organisation_id", "prefix"]);
  });

  await knex.schema.alterTable("order_series", (t) => {
    t.integer("version").notNullable().defaultTo(1);
    t.boolean("active").notNullable().defaultTo(true);
    t.timestamp("updated_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(["organisation_id", "yard_id", "active", "materialised_through"], "order_series_materialise_idx");
  });

  await knex.schema.alterTable("work_orders", (t) => {
    t.boolean("detached").notNullable().defaultTo(false);
  });

  await knex.schema.alterTable("rotations", (t) => {
    t.integer("version").notNullable().defaultTo(1);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("rotations", (t) => {
    t.dropColumn("version");
  });
  await knex.schema.alterTable("work_orders", (t) => {
    t.dropColumn("detached");
  });
  await knex.schema.alterTable("order_series", (t) => {
    t.dropIndex(["organisation_id", "yard_id", "active", "materialised_through"], "order_series_materialise_idx");
    t.dropColumn("updated_at");
    t.dropColumn("active");
    t.dropColumn("version");
  });
  await knex.schema.dropTableIfExists("order_counters");
}
