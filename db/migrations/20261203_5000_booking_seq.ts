import type { Knex } from "knex";

// Booking sequences (issue 17). A check that relies on a row lock must also write the row it
// locked: on a Galera cluster SELECT … FOR UPDATE locks only on the node that runs it, and
// certification refuses a transaction at commit only when another one wrote the same row.
// - workers.booking_seq: bumped by every write that checks a worker's time (placing or moving
//   them, leave and unavailability), so two such writes for one person always collide;
// - work_orders.booking_seq: bumped by writes that check an order's crew without changing it
//   (overrides, Send crews, re-sends). Not `version`: that is the edit forms' optimistic lock,
//   and an override or a send must not make an open order form stale.
// equipment.booking_seq comes with the equipment register (20261203_2000_equipment.ts).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("workers", (t) => {
    t.bigInteger("booking_seq").notNullable().defaultTo(0);
  });
  await knex.schema.alterTable("work_orders", (t) => {
    t.bigInteger("booking_seq").notNullable().defaultTo(0);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("work_orders", (t) => t.dropColumn("booking_seq"));
  await knex.schema.alterTable("workers", (t) => t.dropColumn("booking_seq"));
}
