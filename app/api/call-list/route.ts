import { db } from "@/lib/db";
import { ApiError, handler, json, readJson, readQuery } from "@/lib/api/http";
import { contactWorkerIds, yardScope } from "@/lib/auth/yard-scope";
import { requireRole } from "@/lib/auth/session";
import { CAN_DISPATCH } from "@/lib/users/roles";
import { createAssignment, findingsAfter } from "@/lib/assignments/data";
import { listYards } from "@/lib/yards/data";
import { seatWithOrder, unsentPlacements } from "@/lib/assignments/data-call-list";
import { calloutList } from "@/lib/fill/callout";
import { loadFillProblem } from "@/lib/fill/load";
import { sendCrews } from "@/lib/assignments/data-send";
import { calloutPlaceSchema, calloutQuerySchema } from "@/lib/fill/schema";

export const dynamic = "force-dynamic";

/** Any order not finished or cancelled may need a call-out (a decline on the morning, say). */
const CALLOUT_STATUSES = new Set(["draft", "planned", "sent", "in_progress", "on_hold"]);

async function seatContext(organisationId: number, positionId: number) {
  const seat = await seatWithOrder(db(), positionId);
  if (!seat || seat.organisation_id !== organisationId) throw new ApiError(404, "No such position.");
  const yard = (await listYards(db(), organisationId)).find((y) => y.id === seat.yard_id);
  if (!yard) throw new ApiError(404, "No such position.");
  return { seat, yard };
}

// GET ?positionId=: dispatcher, supervisor. Who to call for a declined or open seat: everyone
// the crew rules allow there — those who leave the order with fewer blocks first, then fewest
// overtime hours in the last 28 days, then home yard — each with their phone; and the near
// misses with the rule that keeps them out.
export const GET = handler(async (req) => {
  const user = await requireRole(...CAN_DISPATCH);
  const q = readQuery(req, calloutQuerySchema);
  await yardScope(user, "edit", { positionId: q.positionId });
  const { seat, yard } = await seatContext(user.organisationId, q.positionId);
  if (!CALLOUT_STATUSES.has(seat.status)) throw new ApiError(409, `${seat.number} is ${seat.status}; its crew can no longer change.`);
  const { problem, meta } = await loadFillProblem(db(), { organisationId: user.organisationId, yard, day: seat.work_date, orderIds: [seat.order_id], statuses: CALLOUT_STATUSES });
  const list = calloutList(problem, String(seat.order_id), String(seat.id));
  // Numbers of other yards' workers are not shown (issue 15, finding 9): ask their dispatcher.
  const mine = await contactWorkerIds(user);
  const phoneFor = (e: { workerId: string | number; phone?: string | null }) =>
    mine && !mine.has(Number(e.workerId)) ? { phone: null, contactHidden: true } : {};
  const num = (id: string | null) => (id === null ? null : Number(id));
  return json({
    orderId: seat.order_id,
    orderNumber: seat.number,
    positionId: seat.id,
    position: seat.position,
    day: seat.work_date,
    yard: yard.code,
    heldBy: list.heldBy === null ? null : { workerId: Number(list.heldBy), name: meta.workers.get(list.heldBy)?.name ?? null },
    eligible: list.eligible.map((e) => ({ ...e, workerId: Number(e.workerId), ...phoneFor(e) })),
    nearMisses: list.nearMisses.map((n) => ({ ...n, workerId: Number(n.workerId), ...phoneFor(n) })),
    nearMissCount: list.nearMissCount,
    summary: list.summary,
    declinedBy: num(problem.orders[0]?.seats.find((s) => s.positionId === String(seat.id))?.declinedBy ?? null),
  });
});

// POST {positionId, workerId, text}: dispatcher, supervisor. One click to place and text:
// places the person through the normal assignment write, then — when nothing else on that
// yard's day is waiting to be sent — runs Send crews for the day, which texts and e-mails
// them (lib/notify). Otherwise the text waits for Send crews and the answer says why.
export const POST = handler(async (req) => {
  const user = await requireRole(...CAN_DISPATCH);
  const input = await readJson(req, calloutPlaceSchema);
  await yardScope(user, "edit", { positionId: input.positionId });
  const { seat, yard } = await seatContext(user.organisationId, input.positionId);
  const placed = await createAssignment(db(), user, { positionId: input.positionId, workerId: input.workerId });
  const recheck = await findingsAfter(db(), user.organisationId, placed.orderIds, placed.workerIds);
  let text: { queued: boolean; messages?: number; reason?: string } = { queued: false, reason: "Not asked to text: use Send crews." };
  if (input.text) {
    const others = await unsentPlacements(db(), user.organisationId, yard.id, seat.work_date, placed.assignmentId ?? null);
    if (others > 0) {
      text = { queued: false, reason: `${others} other placement${others > 1 ? "s" : ""} on this day ${others > 1 ? "are" : "is"} not sent yet; Send crews tells everyone together.` };
    } else {
      try {
        const sent = await sendCrews(db(), user, { date: seat.work_date, yard: yard.code });
        text = { queued: sent.messages > 0, messages: sent.messages, reason: sent.messages > 0 ? undefined : "Nothing to send: no textable phone or e-mail on file; call them." };
      } catch (err) {
        if (!(err instanceof ApiError)) throw err;
        text = { queued: false, reason: err.message };
      }
    }
  }
  return json({ ...placed, recheck, text }, 201);
});
