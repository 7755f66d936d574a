import type { Knex } from "knex";

// A user's sessions, yards and reset links go with the user row (scripts and tests delete
// users; an admin deactivates instead, which keeps them).
const TABLES = ["user_sessions", "user_yards", "password_resets"] as const;

export async function up(knex: Knex): Promise<void> {
  for (const name of TABLES) {
    await knex.schema.alterTable(name, (t) => t.dropForeign(["user_id"]));
    await knex.schema.alterTable(name, (t) => t.foreign("user_id").references("users.id").onDelete("CASCADE"));
  }
}

export async function down(knex: Knex): Promise<void> {
  for (const name of TABLES) {
    await knex.schema.alterTable(name, (t) => t.dropForeign(["user_id"]));
    await knex.schema.alterTable(name, (t) => t.foreign("user_id").references("users.id"));
  }
}
