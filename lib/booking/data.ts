import "@/lib/server-only";
import type { Knex } from "knex";

// "Write what you lock" (issue 17, db/migrations/20261203_5000_booking_seq.ts): bumping a row's
// booking_seq inside the transaction that checks it takes the row lock on this node (an UPDATE
// locks like FOR UPDATE) and puts the row in the transaction's write set, so a concurrent
// transaction on another Galera node that checked the same row fails certification (1213) and
// is retried (withConflictRetry in lib/db.ts) instead of committing a double booking.

/** Locks and bumps workers.booking_seq (ids sorted, so two writers never wait in a cycle). */
export async function bumpWorkers(trx: Knex.Transaction, ids: number[]) {
  const sorted = [...new Set(ids)].sort((a, b) => a - b);
  for (const id of sorted) await trx("workers").where({ id }).increment("booking_seq", 1);
}

/** Locks and bumps work_orders.booking_seq, in id order. */
export async function bumpOrders(trx: Knex.Transaction, ids: number[]) {
  const sorted = [...new Set(ids)].sort((a, b) => a - b);
  if (sorted.length) await trx("work_orders").whereIn("id", sorted).increment("booking_seq", 1);
}
