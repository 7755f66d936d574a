import "@/lib/server-only";
import type { Knex } from "knex";
import type { DaySnapshot } from "@/lib/rules/types";
import { gearForSnapshot, liftsForOrders } from "./data";

/**
 * Adds rubber goods and lift plans to a rule snapshot (CREW-CHECK.md, "Equipment, gear and
 * field figures"): every worker gets `gear` (an empty list when none is on record, so a climber
 * without gloves is blocked on the board), every order with a lift plan its `lift`. Items
 * retired on or before `day` do not count.
 */
export async function attachGear<S extends DaySnapshot>(db: Knex | Knex.Transaction, snapshot: S, day?: string): Promise<S> {
  const [gear, lifts] = await Promise.all([
    gearForSnapshot(db, snapshot.workers.map((w) => Number(w.id)), day),
    liftsForOrders(db, snapshot.workOrders.map((o) => Number(o.id))),
  ]);
  for (const w of snapshot.workers) w.gear = gear.get(Number(w.id)) ?? [];
  for (const o of snapshot.workOrders) {
    const lift = lifts.get(Number(o.id));
    if (lift) o.lift = lift;
  }
  return snapshot;
}
