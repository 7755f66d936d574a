import type { Knex } from "knex";

// The yards each demo dispatcher edits (user_yards, issue 15): their home yard. Supervisors
// and admins edit every yard and need no rows. After 01_demo.ts (which empties every table).
export async function seed(knex: Knex): Promise<void> {
  const dispatchers = await knex("users").where({ role: "dispatcher" }).whereNotNull("home_yard_id").select("id", "home_yard_id");
  for (const u of dispatchers) {
    await knex("user_yards").insert({ user_id: u.id, yard_id: u.home_yard_id }).onConflict(["user_id", "yard_id"]).ignore();
  }
}
