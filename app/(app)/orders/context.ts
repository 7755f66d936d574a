import type { SessionUser } from "@/lib/auth/session";
import { db } from "@/lib/db";
import { listWorkTypes } from "@/lib/orders/data-work-types";
import { listYards } from "@/lib/yards/data";
import { todayIn } from "@/lib/time/days";

export type Search = Promise<Record<string, string | string[] | undefined>>;
export const one = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v) ?? "";

/**
 * What the orders list and the calendar both start from: the yards and work types, the yards the
 * filter picked (the user's home yard by default), and today on the first picked yard's clock.
 */
export async function ordersContext(user: SessionUser, sp: Awaited<Search>) {
  const conn = db();
  const [yards, workTypes] = await Promise.all([listYards(conn, user.organisationId), listWorkTypes(conn, user.organisationId)]);
  const home = yards.find((y) => y.id === user.homeYardId);
  const yardParam = "yard" in sp ? one(sp.yard) : (home?.code ?? "");
  const picked = yardParam ? yards.filter((y) => y.code === yardParam) : yards;
  const tz = (picked[0] ?? yards[0])?.timezone ?? "UTC";
  return { conn, yards, workTypes, yardParam, picked, tz, today: todayIn(tz) };
}
