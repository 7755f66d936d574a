import type { Knex } from "knex";

// Issue 14 (../shared/CREW-CHECK.md, Corrections 1): an equipment operator counts toward the
// two-worker minimum only with the `qualified_electrical` credential. Every organisation gets
// the qualification type, so HR can record it on the Credentials desk; the code is one the
// rules read, so it is locked like the others (lib/credentials/qualification-types.ts).
export async function up(knex: Knex): Promise<void> {
  const orgs = await knex("organisations").pluck("id");
  for (const id of orgs) {
    const has = await knex("qualification_types").where({ organisation_id: id, code: "qualified_electrical" }).first("id");
    if (!has)
      await knex("qualification_types").insert({
        organisation_id: id,
        code: "qualified_electrical",
        name: "Qualified electrical worker",
        renewal_months: 36,
        warn_days: 30,
        needs_evidence: true,
      });
  }
}

export async function down(knex: Knex): Promise<void> {
  const used = knex("credentials").select("qualification_type_id");
  await knex("qualification_types").where("code", "qualified_electrical").whereNotIn("id", used).delete();
}
