import type { Knex } from "knex";

// A pole-check photo keeps its row when its order is deleted (tests and series edits delete
// orders): files.work_order_id becomes NULL, and such a photo can be attached nowhere.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("files", (t) => {
    t.dropForeign(["work_order_id"]);
  });
  await knex.schema.alterTable("files", (t) => {
    t.foreign("work_order_id").references("work_orders.id").onDelete("SET NULL");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("files", (t) => {
    t.dropForeign(["work_order_id"]);
  });
  await knex.schema.alterTable("files", (t) => {
    t.foreign("work_order_id").references("work_orders.id");
  });
}
