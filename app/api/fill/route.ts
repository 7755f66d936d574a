import { db } from "@/lib/db";
import { ApiError, handler, json, readJson } from "@/lib/api/http";
import { yardScope } from "@/lib/auth/yard-scope";
import { requireRole } from "@/lib/auth/session";
import { CAN_DISPATCH } from "@/lib/users/roles";
import { pickYard } from "@/lib/yards/data";
import { fill, FillCancelled } from "@/lib/fill/fill";
import { loadFillProblem } from "@/lib/fill/load";
import { toPreview } from "@/lib/fill/preview";
import { NDJSON, streamFill, wantsStream } from "@/lib/fill/stream";
import { DEFAULT_SETTINGS } from "@/lib/fill/types";
import { fillRequestSchema } from "@/lib/fill/schema";
import { fillTrucks } from "@/lib/fill/load-trucks";

export const dynamic = "force-dynamic";
export const maxDuration = 120;

// POST: dispatcher, supervisor. Proposes crews for the open positions of a yard's day: an
// integer program (HiGHS) over the people the crew rules allow in each seat. A preview only:
// nothing is written (accept with POST /api/fill/accept). Streams progress on request (below).
export const POST = handler(async (req) => {
  const user = await requireRole(...CAN_DISPATCH);
  const input = await readJson(req, fillRequestSchema);
  await yardScope(user, "edit", { yardCode: input.yard });
  const { yard } = await pickYard(db(), user.organisationId, input.yard);
  if (!yard || yard.code.toLowerCase() !== input.yard.toLowerCase()) throw new ApiError(404, `No yard with code ${input.yard}.`);
  const loaded = await loadFillProblem(db(), { organisationId: user.organisationId, yard, day: input.date });
  const { meta } = loaded;
  // Issue 16: trucks first (a fast pass), so the people's solve sees each order with its truck.
  const { problem, trucks } = await fillTrucks(db(), user.organisationId, loaded.problem);
  const settings = {
    timeLimitSeconds: input.timeLimitSeconds ?? DEFAULT_SETTINGS.timeLimitSeconds,
    gap: input.gap ?? DEFAULT_SETTINGS.gap,
  };
  const propose = async (hooks: Parameters<typeof fill>[2] = {}) => {
    const result = await fill(problem, settings, hooks);
    const staffed = new Set(result.proposals.map((p) => p.orderId));
    return {
      ...toPreview(result, meta),
      // Trucks for the orders the fill staffs (an order left open keeps its truck for the dispatcher to choose).
      trucks: trucks
        .filter((t) => staffed.has(t.orderId))
        .map((t) => ({ orderId: Number(t.orderId), equipmentId: Number(t.equipmentId), unitNumber: t.unitNumber, name: t.name, kind: t.kind, reason: t.reason })),
    };
  };
  // Issue 19: with `Accept: application/x-ndjson` the answer streams the fill's progress, and
  // the client's abort stops the fill (lib/fill/stream.ts). Otherwise one JSON answer.
  if (wantsStream(req)) {
    return new Response(streamFill(propose, req.signal), {
      headers: { "content-type": `${NDJSON}; charset=utf-8`, "cache-control": "no-store", "x-accel-buffering": "no" },
    });
  }
  try {
    return json(await propose({ signal: req.signal }));
  } catch (err) {
    // The client went away: the fill stopped early and nothing was written.
    if (err instanceof FillCancelled) throw new ApiError(409, "The fill was cancelled; nothing was written.");
    throw err;
  }
});
