// Recurrence (RFC 5545 RRULE) for work orders and on-call rotations: the pure expansion from
// lib/recurrence-core.ts (which client components import directly) plus ensureOccurrences,
// which the board calls before loading a day. Server only.

import type { Knex } from "knex";
import { extendSeries } from "@/lib/orders/series";

export * from "./recurrence-core";

// --- materialising occurrences (server) -------------------------------------------------------

/**
 * Makes sure every active order series of a yard has its occurrences in work_orders through
 * `day` (and at least HORIZON_DAYS ahead of today). The board calls it before loading a day.
 * Cheap when there is nothing to do: one indexed query on order_series.materialised_through.
 * Safe under concurrency: each series is extended under a row lock. Returns how many
 * occurrences it created.
 */
export async function ensureOccurrences(db: Knex, organisationId: number, yardId: number, day: string): Promise<number> {
  const due = await db("order_series")
    .where({ organisation_id: organisationId, yard_id: yardId, active: true })
    .andWhere((w) => w.whereNull("materialised_through").orWhere("materialised_through", "<", day))
    .select("id");
  if (due.length === 0) return 0;
  let created = 0;
  for (const row of due) created += await extendSeries(db, Number(row.id), day);
  return created;
}

