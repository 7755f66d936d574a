import type { Knex } from "knex";

// Issue 20: the phone sends what it recorded offline with an Idempotency-Key per action, and may
// send one again (no answer came back, the signal dropped mid-way). One row per key and user:
// the request it was first used for (method, path, a SHA-256 of the body) and the answer given,
// replayed for a repeat so a resend never records twice (lib/offline/data.ts).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("idempotency_keys", (t) => {
    t.bigIncrements("id");
    t.integer("user_id").unsigned().notNullable().references("users.id").onDelete("CASCADE");
    t.string("idem_key", 64).notNullable();
    t.string("method", 8).notNullable();
    t.string("path", 300).notNullable();
    t.specificType("fingerprint", "CHAR(64)").notNullable();
    // NULL while the first request is being handled.
    t.smallint("status").unsigned().nullable();
    t.specificType("response", "LONGTEXT").nullable();
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.timestamp("completed_at", { precision: 3 }).nullable();
    t.unique(["user_id", "idem_key"]);
    t.index(["created_at"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists("idempotency_keys");
}
