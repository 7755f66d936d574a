import type { Knex } from "knex";

// Issue 18, point 13: an override lapses when its order's crew changes, and the supervisor who
// gave it is told.
// - overrides.lapsed_by_user_id / lapse_change: who changed the crew and what changed, in words
//   ("Dana Ruiz placed Luis Carrasco as ground hand"), for the supervisors' queue;
// - notices: in-app notices to one user (read_at once seen), written in the same transaction
//   as the change they tell about; the e-mail goes through the notification outbox.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("overrides", (t) => {
    t.integer("lapsed_by_user_id").unsigned().nullable().references("users.id").onDelete("SET NULL");
    t.string("lapse_change", 500).nullable();
  });
  await knex.schema.createTable("notices", (t) => {
    t.increments("id");
    t.integer("organisation_id").unsigned().notNullable().references("organisations.id");
    t.integer("user_id").unsigned().notNullable().references("users.id").onDelete("CASCADE");
    t.string("kind", 30).notNullable();
    t.integer("work_order_id").unsigned().nullable().references("work_orders.id").onDelete("CASCADE");
    t.integer("override_id").unsigned().nullable().references("overrides.id").onDelete("CASCADE");
    t.string("title", 200).notNullable();
    t.string("body", 2000).notNullable();
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.timestamp("read_at", { precision: 3 }).nullable();
    t.index(["user_id", "read_at"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists("notices");
  await knex.schema.alterTable("overrides", (t) => {
    t.dropForeign(["lapsed_by_user_id"]);
    t.dropColumn("lapsed_by_user_id");
    t.dropColumn("lapse_change");
  });
}
