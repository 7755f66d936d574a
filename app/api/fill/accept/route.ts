import { db } from "@/lib/db";
import { ApiError, handler, json, readJson } from "@/lib/api/http";
import { yardScope } from "@/lib/auth/yard-scope";
import { requireRole } from "@/lib/auth/session";
import { CAN_DISPATCH } from "@/lib/users/roles";
import { audit } from "@/lib/audit/data";
import { createAssignment, findingsAfter } from "@/lib/assignments/data";
import { pickYard } from "@/lib/yards/data";
import { fillAcceptSchema } from "@/lib/fill/schema";
import { bookEquipment } from "@/lib/equipment/data";
import { orderPlace, positionsWithOrders } from "@/lib/orders/data";

export const dynamic = "force-dynamic";

// POST: dispatcher, supervisor. Places the chosen proposals one seat at a time through the
// normal assignment write (order locks, versions, the double-booking refusal, audit rows and
// board events). A seat that fails (taken meanwhile, worker now clashing) is reported on its
// own; the others still go in. The answer carries the server's re-check of every touched order.
export const POST = handler(async (req) => {
  const user = await requireRole(...CAN_DISPATCH);
  const input = await readJson(req, fillAcceptSchema);
  await yardScope(user, "edit", { yardCode: input.yard });
  const { yard } = await pickYard(db(), user.organisationId, input.yard);
  if (!yard || yard.code.toLowerCase() !== input.yard.toLowerCase()) throw new ApiError(404, `No yard with code ${input.yard}.`);

  const ids = [...new Set(input.proposals.map((p) => p.positionId))];
  const seats = await positionsWithOrders(db(), ids);
  const seatOf = new Map(seats.map((s) => [s.id as number, s]));

  const results: Array<{ positionId: number; workerId: number; ok: boolean; assignmentId?: number | null; status?: number; error?: string }> = [];
  const orderIds = new Set<number>();
  const workerIds = new Set<number>();
  const seen = new Set<number>();
  const ordered = [...input.proposals].sort((a, b) => (seatOf.get(a.positionId)?.work_order_id ?? 0) - (seatOf.get(b.positionId)?.work_order_id ?? 0) || a.positionId - b.positionId);
  for (const p of ordered) {
    const seat = seatOf.get(p.positionId);
    if (!seat || seat.organisation_id !== user.organisationId || seat.yard_id !== yard.id || seat.work_date !== input.date) {
      results.push({ ...p, ok: false, status: 422, error: `Position ${p.positionId} is not on the ${yard.code} board for ${input.date}.` });
      continue;
    }
    if (seen.has(p.positionId)) {
      results.push({ ...p, ok: false, status: 422, error: "The same position was proposed twice; only the first was placed." });
      continue;
    }
    seen.add(p.positionId);
    try {
      const r = await createAssignment(db(), user, { positionId: p.positionId, workerId: p.workerId });
      results.push({ ...p, ok: true, assignmentId: r.assignmentId });
      for (const o of r.orderIds) orderIds.add(o);
      for (const w of r.workerIds) workerIds.add(w);
    } catch (err) {
      if (!(err instanceof ApiError)) throw err;
      results.push({ ...p, ok: false, status: err.status, error: err.message });
      orderIds.add(seat.work_order_id);
    }
  }
  // Issue 16: the proposed trucks, each through the locked booking write (409 when it went elsewhere meanwhile).
  const trucks: Array<{ workOrderId: number; equipmentId: number; ok: boolean; status?: number; error?: string }> = [];
  for (const t of input.trucks) {
    const on = await orderPlace(db(), t.workOrderId);
    if (!on || on.organisation_id !== user.organisationId || on.yard_id !== yard.id || on.work_date !== input.date) {
      trucks.push({ ...t, ok: false, status: 422, error: `Order ${t.workOrderId} is not on the ${yard.code} board for ${input.date}.` });
      continue;
    }
    try {
      await bookEquipment(db(), user, t);
      trucks.push({ ...t, ok: true });
      orderIds.add(t.workOrderId);
    } catch (err) {
      if (!(err instanceof ApiError)) throw err;
      trucks.push({ ...t, ok: false, status: err.status, error: err.message });
    }
  }
  const placed = results.filter((r) => r.ok).length;
  const refused = results.length - placed;
  const recheck = orderIds.size ? await findingsAfter(db(), user.organisationId, [...orderIds], [...workerIds]) : { orderIds: [], findings: [] };
  await audit(db(), user, user.organisationId, "fill.accept", "fill", `${yard.code}:${input.date}`, {
    yard: yard.code,
    day: input.date,
    placed,
    refused,
    trucks: trucks.filter((t) => t.ok).length,
    orders: [...new Set(seats.filter((s) => orderIds.has(s.work_order_id)).map((s) => s.number))],
  });
  return json({
    placed,
    refused,
    results,
    trucks,
    recheck,
    blocks: recheck.findings.filter((f) => f.level === "block"),
  });
});
