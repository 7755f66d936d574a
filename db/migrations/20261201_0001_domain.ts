import type { Knex } from "knex";

// The whole domain in one first migration. InnoDB, utf8mb4; times are UTC DATETIME(3),
// calendar dates are DATE in the yard's zone. Later changes get their own migration files.

const CLASSIFICATIONS = ["journeyman", "apprentice", "ground_hand", "operator", "crew_lead"];
const POSITIONS = ["climber", "observer", "operator", "ground", "lead", "driver"];
const ROLES = ["admin", "dispatcher", "supervisor", "hr", "lineworker"];

export async function up(knex: Knex): Promise<void> {
  const table = (name: string, build: (t: Knex.CreateTableBuilder) => void) =>
    knex.schema.createTable(name, (t) => {
      t.engine("InnoDB");
      t.charset("utf8mb4");
      t.collate("utf8mb4_unicode_ci");
      build(t);
    });

  await table("organisations", (t) => {
    t.increments("id");
    t.string("name", 160).notNullable();
    t.string("slug", 60).notNullable().unique();
    t.string("dispatcher_phone", 20).nullable();
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
  });

  await table("yards", (t) => {
    t.increments("id");
    t.integer("organisation_id").unsigned().notNullable().references("organisations.id");
    t.string("code", 20).notNullable();
    t.string("name", 120).notNullable();
    t.string("timezone", 64).notNullable(); // IANA zone name
    t.string("address", 255).nullable();
    t.string("dispatcher_phone", 20).nullable();
    t.unique(["organisation_id", "code"]);
  });

  await table("policies", (t) => {
    t.integer("organisation_id").unsigned().primary().references("organisations.id");
    t.decimal("min_rest_hours", 5, 2).notNullable().defaultTo(8);
    t.decimal("max_shift_hours", 5, 2).notNullable().defaultTo(16);
    t.integer("credential_warn_days").notNullable().defaultTo(30);
    t.decimal("regular_hours_week", 5, 2).notNullable().defaultTo(40);
    t.decimal("regular_hours_day", 5, 2).notNullable().defaultTo(8);
    t.integer("reply_deadline_hours").notNullable().defaultTo(10); // flag no reply this long before start
    t.json("rule_levels").nullable(); // { RULE: "block" } raises only
    t.timestamp("updated_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
  });

  await table("workers", (t) => {
    t.increments("id");
    t.integer("organisation_id").unsigned().notNullable().references("organisations.id");
    t.integer("yard_id").unsigned().notNullable().references("yards.id");
    t.string("employee_no", 20).notNullable();
    t.string("first_name", 80).notNullable();
    t.string("last_name", 80).notNullable();
    t.enum("classification", CLASSIFICATIONS).notNullable();
    t.string("phone_e164", 16).nullable();
    t.string("email", 254).nullable();
    t.boolean("sms_opt_in").notNullable().defaultTo(true);
    t.boolean("active").notNullable().defaultTo(true);
    t.string("calendar_token", 64).nullable().unique();
    t.integer("version").notNullable().defaultTo(1);
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.timestamp("updated_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.unique(["organisation_id", "employee_no"]);
    t.index(["organisation_id", "active", "yard_id"]);
    t.index(["phone_e164"]);
  });

  await table("users", (t) => {
    t.increments("id");
    t.integer("organisation_id").unsigned().notNullable().references("organisations.id");
    t.string("email", 254).notNullable().unique();
    t.string("name", 160).notNullable();
    t.enum("role", ROLES).notNullable();
    t.string("password_hash", 100).notNullable();
    t.integer("worker_id").unsigned().nullable().references("workers.id");
    t.integer("home_yard_id").unsigned().nullable().references("yards.id");
    t.boolean("active").notNullable().defaultTo(true);
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
  });

  await table("sign_in_attempts", (t) => {
    t.bigIncrements("id");
    t.string("email", 254).notNullable();
    t.string("ip", 64).notNullable();
    t.boolean("success").notNullable();
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(["email", "created_at"]);
    t.index(["ip", "created_at"]);
  });

  await table("files", (t) => {
    t.increments("id");
    t.integer("organisation_id").unsigned().notNullable().references("organisations.id");
    t.string("sha256", 64).notNullable();
    t.string("original_name", 255).notNullable();
    t.string("mime", 100).notNullable();
    t.integer("size_bytes").unsigned().notNullable();
    t.integer("worker_id").unsigned().nullable().references("workers.id"); // whose evidence it is
    t.integer("uploaded_by").unsigned().nullable().references("users.id");
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(["sha256"]);
  });

  await table("qualification_types", (t) => {
    t.increments("id");
    t.integer("organisation_id").unsigned().notNullable().references("organisations.id");
    t.string("code", 40).notNullable();
    t.string("name", 120).notNullable();
    t.integer("renewal_months").nullable(); // null: no renewal
    t.integer("warn_days").notNullable().defaultTo(30);
    t.boolean("needs_evidence").notNullable().defaultTo(false);
    t.unique(["organisation_id", "code"]);
  });

  await table("credentials", (t) => {
    t.increments("id");
    t.integer("worker_id").unsigned().notNullable().references("workers.id");
    t.integer("qualification_type_id").unsigned().notNullable().references("qualification_types.id");
    t.date("issued_on").notNullable();
    t.date("expires_on").nullable(); // last valid day; null = no expiry
    t.enum("status", ["current", "superseded", "pending"]).notNullable().defaultTo("current");
    t.integer("evidence_file_id").unsigned().nullable().references("files.id");
    t.integer("verified_by").unsigned().nullable().references("users.id");
    t.timestamp("verified_at", { precision: 3 }).nullable();
    t.integer("supersedes_id").unsigned().nullable().references("credentials.id");
    t.integer("created_by").unsigned().nullable().references("users.id");
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(["worker_id", "status"]);
    t.index(["expires_on"]);
  });

  await table("work_types", (t) => {
    t.increments("id");
    t.integer("organisation_id").unsigned().notNullable().references("organisations.id");
    t.string("code", 40).notNullable(); // a rule work type: pole_climb, bucket, digger_derrick, patrol, storm, other
    t.string("name", 120).notNullable();
    t.enum("rule_type", ["pole_climb", "bucket", "digger_derrick", "patrol", "storm", "other"]).notNullable();
    t.integer("min_crew").notNullable().defaultTo(1);
    t.boolean("digs").notNullable().defaultTo(false); // needs an underground-locate ticket
    t.unique(["organisation_id", "code"]);
  });

  await table("work_type_positions", (t) => {
    t.increments("id");
    t.integer("work_type_id").unsigned().notNullable().references("work_types.id").onDelete("CASCADE");
    t.enum("position", POSITIONS).notNullable();
    t.integer("sort").notNullable().defaultTo(0);
  });

  await table("order_series", (t) => {
    t.increments("id");
    t.integer("organisation_id").unsigned().notNullable().references("organisations.id");
    t.integer("yard_id").unsigned().notNullable().references("yards.id");
    t.text("rrule").notNullable(); // RFC 5545 RRULE line(s)
    t.string("dtstart_local", 19).notNullable(); // YYYY-MM-DDTHH:mm:ss wall clock in the yard's zone
    t.integer("duration_minutes").notNullable();
    t.json("exdates").nullable(); // ["YYYY-MM-DD", ...]
    t.json("template").notNullable(); // the order fields each occurrence copies
    t.date("materialised_through").nullable();
    t.integer("created_by").unsigned().nullable().references("users.id");
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
  });

  await table("work_orders", (t) => {
    t.increments("id");
    t.integer("organisation_id").unsigned().notNullable().references("organisations.id");
    t.integer("yard_id").unsigned().notNullable().references("yards.id");
    t.string("number", 30).notNullable();
    t.string("title", 200).notNullable();
    t.integer("work_type_id").unsigned().notNullable().references("work_types.id");
    t.string("address", 255).nullable();
    t.string("structure_no", 60).nullable(); // pole or structure number
    t.decimal("latitude", 9, 6).nullable();
    t.decimal("longitude", 9, 6).nullable();
    t.datetime("start_at", { precision: 3 }).notNullable();
    t.datetime("end_at", { precision: 3 }).notNullable();
    t.date("work_date").notNullable(); // start date in the yard's zone: the board's day
    t.boolean("energized").notNullable().defaultTo(true);
    t.decimal("voltage_kv", 7, 3).nullable();
    t.boolean("emergency").notNullable().defaultTo(false);
    t.enum("crew_exception", ["routine_switching", "live_line_tools", "emergency"]).nullable();
    t.integer("min_crew").nullable();
    t.enum("driver_licence", ["cdl_a", "cdl_b"]).nullable();
    t.integer("priority").notNullable().defaultTo(3); // 1 highest … 5 lowest
    t.text("notes").nullable();
    t.enum("status", ["draft", "planned", "sent", "in_progress", "done", "on_hold", "cancelled"])
      .notNullable()
      .defaultTo("planned");
    t.string("hold_reason", 500).nullable();
    t.string("locate_ticket", 40).nullable();
    t.date("locate_valid_through").nullable();
    t.enum("briefing_state", ["not_started", "briefed", "on_hold"]).notNullable().defaultTo("not_started");
    t.datetime("actual_start_at", { precision: 3 }).nullable();
    t.datetime("actual_end_at", { precision: 3 }).nullable();
    t.integer("series_id").unsigned().nullable().references("order_series.id");
    t.date("occurrence_date").nullable();
    t.integer("version").notNullable().defaultTo(1);
    t.integer("created_by").unsigned().nullable().references("users.id");
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.timestamp("updated_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.unique(["organisation_id", "number"]);
    t.unique(["series_id", "occurrence_date"]);
    t.index(["yard_id", "work_date"]);
    t.index(["start_at", "end_at"]);
  });

  await table("positions", (t) => {
    t.increments("id");
    t.integer("work_order_id").unsigned().notNullable().references("work_orders.id").onDelete("CASCADE");
    t.enum("position", POSITIONS).notNullable();
    t.integer("sort").notNullable().defaultTo(0);
    t.index(["work_order_id"]);
  });

  await table("assignments", (t) => {
    t.increments("id");
    t.integer("work_order_id").unsigned().notNullable().references("work_orders.id").onDelete("CASCADE");
    t.integer("position_id").unsigned().notNullable().references("positions.id").onDelete("CASCADE");
    t.integer("worker_id").unsigned().notNullable().references("workers.id");
    // holds_position = position_id while the assignment occupies the seat, NULL once declined
    // or removed, so one seat has at most one live assignment while history is kept.
    t.integer("holds_position").unsigned().nullable().unique();
    t.enum("status", ["draft", "sent", "delivered", "confirmed", "declined", "removed"])
      .notNullable()
      .defaultTo("draft");
    t.string("reply_code", 8).notNullable(); // the code a text reply names: "Y 4821"
    t.integer("version").notNullable().defaultTo(1);
    t.integer("sent_version").nullable(); // version last told to the worker
    t.datetime("sent_at", { precision: 3 }).nullable();
    t.datetime("responded_at", { precision: 3 }).nullable();
    t.string("decline_reason", 500).nullable();
    t.enum("response_channel", ["sms", "web", "email"]).nullable();
    t.integer("created_by").unsigned().nullable().references("users.id");
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.timestamp("updated_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(["work_order_id"]);
    t.index(["worker_id", "status"]);
    t.index(["reply_code"]);
  });

  await table("overrides", (t) => {
    t.increments("id");
    t.integer("work_order_id").unsigned().notNullable().references("work_orders.id").onDelete("CASCADE");
    t.string("rule", 20).notNullable();
    t.integer("worker_id").unsigned().nullable().references("workers.id");
    t.string("reason", 1000).notNullable();
    t.string("crew_hash", 64).notNullable(); // the crew it was given for; a change lapses it
    t.integer("actor_user_id").unsigned().notNullable().references("users.id");
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.timestamp("lapsed_at", { precision: 3 }).nullable();
    t.index(["work_order_id"]);
  });

  await table("rotations", (t) => {
    t.increments("id");
    t.integer("organisation_id").unsigned().notNullable().references("organisations.id");
    t.integer("yard_id").unsigned().notNullable().references("yards.id");
    t.string("name", 120).notNullable();
    t.text("rrule").notNullable(); // hand-over recurrence, e.g. FREQ=WEEKLY;BYDAY=MO
    t.string("dtstart_local", 19).notNullable(); // first hand-over, wall clock in the yard's zone
    t.boolean("active").notNullable().defaultTo(true);
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
  });

  await table("rotation_members", (t) => {
    t.increments("id");
    t.integer("rotation_id").unsigned().notNullable().references("rotations.id").onDelete("CASCADE");
    t.integer("worker_id").unsigned().notNullable().references("workers.id");
    t.integer("sort").notNullable();
    t.unique(["rotation_id", "sort"]);
  });

  await table("time_records", (t) => {
    t.increments("id");
    t.integer("worker_id").unsigned().notNullable().references("workers.id");
    t.datetime("start_at", { precision: 3 }).notNullable();
    t.datetime("end_at", { precision: 3 }).notNullable();
    t.enum("kind", ["shift", "order", "call_out", "manual"]).notNullable();
    t.integer("work_order_id").unsigned().nullable().references("work_orders.id").onDelete("SET NULL");
    t.integer("rotation_id").unsigned().nullable().references("rotations.id").onDelete("SET NULL");
    t.string("reason", 500).nullable();
    t.integer("created_by").unsigned().nullable().references("users.id");
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(["worker_id", "start_at"]);
  });

  await table("unavailability", (t) => {
    t.increments("id");
    t.integer("worker_id").unsigned().notNullable().references("workers.id");
    t.datetime("start_at", { precision: 3 }).notNullable();
    t.datetime("end_at", { precision: 3 }).notNullable();
    t.enum("kind", ["leave", "training", "sickness"]).notNullable();
    t.enum("status", ["requested", "approved", "refused"]).notNullable().defaultTo("approved");
    t.string("note", 500).nullable();
    t.integer("requested_by").unsigned().nullable().references("users.id");
    t.integer("decided_by").unsigned().nullable().references("users.id");
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(["worker_id", "start_at"]);
  });

  await table("notifications", (t) => {
    t.bigIncrements("id");
    t.integer("organisation_id").unsigned().notNullable().references("organisations.id");
    t.integer("worker_id").unsigned().nullable().references("workers.id");
    t.integer("assignment_id").unsigned().nullable().references("assignments.id").onDelete("SET NULL");
    t.enum("channel", ["sms", "email"]).notNullable();
    t.string("kind", 30).notNullable(); // assignment, change, removal, reply, hold, reminder, digest
    t.string("to_address", 254).notNullable();
    t.string("subject", 255).nullable();
    t.text("body").notNullable();
    t.json("attachments").nullable();
    t.enum("state", ["queued", "sending", "sent", "failed"]).notNullable().defaultTo("queued");
    t.integer("attempts").notNullable().defaultTo(0);
    t.datetime("next_attempt_at", { precision: 3 }).notNullable();
    t.string("claim_token", 40).nullable();
    t.datetime("claimed_at", { precision: 3 }).nullable();
    t.string("provider_id", 100).nullable();
    t.enum("delivery", ["unknown", "delivered", "undelivered"]).notNullable().defaultTo("unknown");
    t.string("last_error", 1000).nullable();
    t.string("dedupe_key", 120).nullable().unique();
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.datetime("sent_at", { precision: 3 }).nullable();
    t.index(["state", "next_attempt_at"]);
    t.index(["worker_id", "created_at"]);
    t.index(["provider_id"]);
  });

  await table("inbound_messages", (t) => {
    t.bigIncrements("id");
    t.integer("organisation_id").unsigned().nullable().references("organisations.id");
    t.string("provider_sid", 64).notNullable().unique(); // a repeated delivery is ignored
    t.string("from_phone", 20).notNullable();
    t.string("to_phone", 20).nullable();
    t.string("body", 1600).notNullable();
    t.integer("worker_id").unsigned().nullable().references("workers.id");
    t.integer("assignment_id").unsigned().nullable().references("assignments.id").onDelete("SET NULL");
    t.string("outcome", 40).notNullable(); // confirmed, declined, opt_out, opt_in, help, unmatched
    t.boolean("handled").notNullable().defaultTo(false);
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(["worker_id", "created_at"]);
  });

  await table("board_events", (t) => {
    t.bigIncrements("id");
    t.integer("organisation_id").unsigned().notNullable().references("organisations.id");
    t.integer("yard_id").unsigned().nullable().references("yards.id");
    t.date("day").nullable();
    t.string("kind", 40).notNullable();
    t.json("payload").nullable();
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(["organisation_id", "id"]);
  });

  await table("audit_log", (t) => {
    t.bigIncrements("id");
    t.integer("organisation_id").unsigned().notNullable().references("organisations.id");
    t.integer("actor_user_id").unsigned().nullable().references("users.id");
    t.string("action", 60).notNullable();
    t.string("entity", 40).notNullable();
    t.string("entity_id", 40).nullable();
    t.json("detail").nullable();
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(["organisation_id", "created_at"]);
    t.index(["entity", "entity_id"]);
  });

  await table("briefings", (t) => {
    t.increments("id");
    t.integer("work_order_id").unsigned().notNullable().references("work_orders.id").onDelete("CASCADE");
    t.integer("round").notNullable().defaultTo(1); // a re-brief starts a new round
    t.integer("lead_worker_id").unsigned().nullable().references("workers.id");
    t.enum("state", ["draft", "briefed", "on_hold"]).notNullable().defaultTo("draft");
    t.json("data").notNullable(); // hazards, drop zone, procedure, controls, pole check, emergency plan
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.timestamp("completed_at", { precision: 3 }).nullable();
    t.unique(["work_order_id", "round"]);
  });

  await table("briefing_acks", (t) => {
    t.increments("id");
    t.integer("briefing_id").unsigned().notNullable().references("briefings.id").onDelete("CASCADE");
    t.integer("worker_id").unsigned().notNullable().references("workers.id");
    t.json("gear_check").nullable();
    t.timestamp("acknowledged_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.unique(["briefing_id", "worker_id"]);
  });

  // A named daily job claimed once per day by whichever app instance gets there first.
  await table("job_claims", (t) => {
    t.string("job", 40).notNullable();
    t.date("day").notNullable();
    t.string("claimed_by", 80).notNullable();
    t.timestamp("claimed_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.primary(["job", "day"]);
  });

  await table("reminders_sent", (t) => {
    t.integer("credential_id").unsigned().notNullable().references("credentials.id").onDelete("CASCADE");
    t.date("day").notNullable();
    t.timestamp("created_at", { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.primary(["credential_id", "day"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const name of [
    "reminders_sent",
    "job_claims",
    "briefing_acks",
    "briefings",
    "audit_log",
    "board_events",
    "inbound_messages",
    "notifications",
    "unavailability",
    "time_records",
    "rotation_members",
    "rotations",
    "overrides",
    "assignments",
    "positions",
    "work_orders",
    "order_series",
    "work_type_positions",
    "work_types",
    "credentials",
    "qualification_types",
    "files",
    "sign_in_attempts",
    "users",
    "workers",
    "policies",
    "yards",
    "organisations",
  ]) {
    await knex.schema.dropTableIfExists(name);
  }
}
