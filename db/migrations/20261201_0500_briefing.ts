import type { Knex } from "knex";

// Job briefing and pole check (issue 8):
// - briefings.version: stale-write check for the crew lead's saves (two phones, one lead);
//   updated_at / updated_by: who saved last;
// - briefings.reason: why a re-brief was held (conditions changed), on rounds after the first;
// - briefings.hold_prev_status: the order's status before the lead held it, so lifting the
//   hold puts it back where it was (planned or sent);
// - briefing_acks.recorded_by / in_person: the crew lead recording a crew member's
//   acknowledgement given in person (no phone or no sign-in), kept apart from one given on
//   the member's own phone.

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("briefings", (t) => {
    t.integer("version").notNullable().defaultTo(1);
    t.timestamp("updated_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.integer("updated_by").unsigned().nullable().references("users.id");
    t.string("reason", 500).nullable();
    t.string("hold_prev_status", 20).nullable();
  });
  await knex.schema.alterTable("briefing_acks", (t) => {
    t.integer("recorded_by").unsigned().nullable().references("users.id");
    t.boolean("in_person").notNullable().defaultTo(false);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("briefing_acks", (t) => {
    t.dropForeign(["recorded_by"]);
    t.dropColumn("recorded_by");
    t.dropColumn("in_person");
  });
  await knex.schema.alterTable("briefings", (t) => {
    t.dropForeign(["updated_by"]);
    t.dropColumn("updated_by");
    t.dropColumn("updated_at");
    t.dropColumn("version");
    t.dropColumn("reason");
    t.dropColumn("hold_prev_status");
  });
}
