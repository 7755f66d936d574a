import type { Knex } from "knex";

// Security, second pass (issue 15) and user management (issue 18, point 6):
// - files.kind / files.work_order_id: what a file is for (a worker's credential evidence or a
//   briefing's pole-check photo) and, for a photo, its order: a file is attached only to its
//   own kind of record, by someone allowed to read it;
// - user_sessions: one row per sign-in, checked on every request (sign-out, deactivation and a
//   role change end sessions at once);
// - user_yards: the yards a dispatcher edits (supervisors and admins edit every yard);
// - password_resets: one-time reset links, stored as a SHA-256 of the token, expiring;
// - sign_in_limits: rate-limiter-flexible's MySQL store (its own table layout), shared by every
//   app instance.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("files", (t) => {
    t.enum("kind", ["evidence", "briefing_photo"]).notNullable().defaultTo("evidence");
    t.integer("work_order_id").unsigned().nullable().references("work_orders.id");
  });
  // Existing pole-check photos: every file a briefing round points at.
  const rounds = await knex("briefings").select("work_order_id", "data");
  for (const r of rounds) {
    const data = typeof r.data === "string" ? JSON.parse(r.data) : r.data;
    const items = data?.poleCheck?.items ?? {};
    for (const item of Object.values(items) as { photoFileId?: number | null }[]) {
      if (item?.photoFileId) {
        await knex("files").where({ id: item.photoFileId }).update({ kind: "briefing_photo", work_order_id: r.work_order_id });
      }
    }
  }

  await knex.schema.createTable("user_sessions", (t) => {
    t.engine("InnoDB");
    t.charset("utf8mb4");
    t.string("id", 64).primary(); // SHA-256 hex of the random session id carried in the token
    t.integer("user_id").unsigned().notNullable().references("users.id");
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.timestamp("expires_at", { precision: 3 }).notNullable();
    t.timestamp("revoked_at", { precision: 3 }).nullable();
    t.string("revoked_why", 40).nullable();
    t.index(["user_id", "revoked_at"]);
  });

  await knex.schema.createTable("user_yards", (t) => {
    t.engine("InnoDB");
    t.charset("utf8mb4");
    t.integer("user_id").unsigned().notNullable().references("users.id");
    t.integer("yard_id").unsigned().notNullable().references("yards.id");
    t.primary(["user_id", "yard_id"]);
  });
  const dispatchers = await knex("users").where({ role: "dispatcher" }).whereNotNull("home_yard_id").select("id", "home_yard_id");
  if (dispatchers.length) await knex("user_yards").insert(dispatchers.map((u) => ({ user_id: u.id, yard_id: u.home_yard_id })));

  await knex.schema.createTable("password_resets", (t) => {
    t.engine("InnoDB");
    t.charset("utf8mb4");
    t.increments("id");
    t.integer("user_id").unsigned().notNullable().references("users.id");
    t.string("token_hash", 64).notNullable().unique();
    t.timestamp("expires_at", { precision: 3 }).notNullable();
    t.timestamp("used_at", { precision: 3 }).nullable();
    t.integer("created_by").unsigned().nullable().references("users.id");
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
  });

  await knex.schema.alterTable("users", (t) => {
    t.timestamp("password_changed_at", { precision: 3 }).nullable();
  });

  // The layout rate-limiter-flexible's RateLimiterMySQL creates for itself (created here, so
  // the app's database user needs no CREATE right at run time).
  await knex.raw(
    "CREATE TABLE IF NOT EXISTS `sign_in_limits` (`key` VARCHAR(255) CHARACTER SET utf8 NOT NULL, `points` INT(9) NOT NULL DEFAULT 0, `expire` BIGINT UNSIGNED, PRIMARY KEY (`key`)) ENGINE = INNODB",
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists("sign_in_limits");
  await knex.schema.alterTable("users", (t) => t.dropColumn("password_changed_at"));
  await knex.schema.dropTableIfExists("password_resets");
  await knex.schema.dropTableIfExists("user_yards");
  await knex.schema.dropTableIfExists("user_sessions");
  await knex.schema.alterTable("files", (t) => {
    t.dropForeign(["work_order_id"]);
    t.dropColumn("work_order_id");
    t.dropColumn("kind");
  });
}
