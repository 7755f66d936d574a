import type { Knex } from "knex";

// Send crews and text replies (issue 5):
// - assignments.told_hash: a fingerprint of what the worker was last told (order, start, end,
//   address, pole, position). A re-send compares it with the order as it is now and sends a
//   change message only when the time or place really changed. (work_orders.version is not
//   used for this: every crew change bumps it too, which would re-text the whole crew.)
// - assignments.delivered_at: when the provider first accepted a message for it.
// - notifications: an index for the stale-claim sweep (assignment_id already has its foreign
//   key's index); `message_key` is the Message-ID an e-mail carries (a resend after a crash
//   keeps the same one, so mail clients can fold the copy).
// - inbound_messages.reply_body: what we answered, for the thread view; handled_by/at: the
//   dispatcher who dealt with an unmatched reply.

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("assignments", (t) => {
    t.string("told_hash", 64).nullable();
    t.datetime("delivered_at", { precision: 3 }).nullable();
  });
  await knex.schema.alterTable("notifications", (t) => {
    t.string("message_key", 120).nullable();
    t.index(["state", "claimed_at"], "notifications_state_claimed_idx");
  });
  await knex.schema.alterTable("inbound_messages", (t) => {
    t.string("reply_body", 1600).nullable();
    t.integer("handled_by").unsigned().nullable().references("users.id");
    t.datetime("handled_at", { precision: 3 }).nullable();
    t.index(["outcome", "handled"], "inbound_outcome_idx");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("inbound_messages", (t) => {
    t.dropIndex(["outcome", "handled"], "inbound_outcome_idx");
    t.dropForeign(["handled_by"]);
    t.dropColumn("handled_by");
    t.dropColumn("handled_at");
    t.dropColumn("reply_body");
  });
  await knex.schema.alterTable("notifications", (t) => {
    t.dropIndex(["state", "claimed_at"], "notifications_state_claimed_idx");
    t.dropColumn("message_key");
  });
  await knex.schema.alterTable("assignments", (t) => {
    t.dropColumn("delivered_at");
    t.dropColumn("told_hash");
  });
}
