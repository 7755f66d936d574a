import type { Knex } from "knex";

// Issue 14, product side (../shared/CREW-CHECK.md, "Corrections" 3 and 6):
// - a new position `aerial`: the worker aloft in the bucket, on orders and in crew templates;
// - work_order_shifts: the worked shifts of a multi-day order (wall-clock times resolved to UTC,
//   inside the order, not overlapping). When an order lists shifts, its worked time for REST is
//   those shifts, not the whole span.

const OLD = ["climber", "observer", "operator", "ground", "lead", "driver"];
const NEW = ["climber", "aerial", "observer", "operator", "ground", "lead", "driver"];
const enumSql = (values: string[]) => values.map((v) => `'${v}'`).join(",");

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`ALTER TABLE positions MODIFY position ENUM(${enumSql(NEW)}) NOT NULL`);
  await knex.raw(`ALTER TABLE work_type_positions MODIFY position ENUM(${enumSql(NEW)}) NOT NULL`);
  await knex.schema.createTable("work_order_shifts", (t) => {
    t.engine("InnoDB");
    t.charset("utf8mb4");
    t.collate("utf8mb4_unicode_ci");
    t.increments("id");
    t.integer("work_order_id").unsigned().notNullable().references("work_orders.id").onDelete("CASCADE");
    t.datetime("start_at", { precision: 3 }).notNullable();
    t.datetime("end_at", { precision: 3 }).notNullable();
    t.index(["work_order_id", "start_at"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("work_order_shifts");
  await knex("positions").where("position", "aerial").delete();
  await knex("work_type_positions").where("position", "aerial").delete();
  await knex.raw(`ALTER TABLE positions MODIFY position ENUM(${enumSql(OLD)}) NOT NULL`);
  await knex.raw(`ALTER TABLE work_type_positions MODIFY position ENUM(${enumSql(OLD)}) NOT NULL`);
}
