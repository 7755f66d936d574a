// Recurrence (RFC 5545 RRULE) for work orders and on-call rotations: the pure expansion from
// lib/time/recurrence.ts (which client components import directly) plus ensureOccurrences,
// which the board calls before loading a day. Server only.

import "@/lib/server-only";
import type { Knex } from "knex";
import { extendSeries } from "@/lib/orders/data-series";

export * from "@/lib/time/recurrence";

// --- materialising occurrences (server) -------------------------------------------------------

/**
 * Makes sure every active order series of a yard has its occurrences in work_orders through
 * `day` (and at least HORIZON_DAYS ahead of today). The board calls it before loading a day.
 * Cheap when there is nothing to do: one indexed query on order_series.materialised_through.
 * Safe under concurrency: each series is extended under a row lock. Returns how many
 * occurrences it created.
 */
/** Recurring orders are materialised at most this far ahead; a board further out shows none. */
export const MATERIALISE_AHEAD_DAYS = 731;

export async function ensureOccurrences(db: Knex, organisationId: number, yardId: number, wanted: string): Promise<number> {
  const limit = new Date(Date.now() + MATERIALISE_AHEAD_DAYS * 86_400_000).toISOString().slice(0, 10);
  const day = wanted > limit ? limit : wanted;
  const due = await db("order_series")
    .where({ organisation_id: organisationId, yard_id: yardId, active: true })
    .andWhere((w) => w.whereNull("materialised_through").orWhere("materialised_through", "<", day))
    .select("id");
  if (due.length === 0) return 0;
  let created = 0;
  for (const row of due) created += await extendSeries(db, Number(row.id), day);
  return created;
}

