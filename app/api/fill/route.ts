import { db } from "@/lib/db";
import { ApiError, handler, json, readJson } from "@/lib/api/http";
import { yardScope } from "@/lib/auth/yard-scope";
import { requireRole } from "@/lib/auth/session";
import { CAN_DISPATCH } from "@/lib/auth/roles";
import { pickYard } from "@/lib/data/yards";
import { fill } from "@/lib/fill/fill";
import { loadFillProblem } from "@/lib/fill/load";
import { toPreview } from "@/lib/fill/preview";
import { DEFAULT_SETTINGS } from "@/lib/fill/types";
import { fillRequestSchema } from "@/lib/validation/fill";

export const dynamic = "force-dynamic";
export const maxDuration = 120;

// POST: dispatcher, supervisor. Proposes crews for the open positions of a yard's day: an
// integer program (HiGHS) over the people the crew rules allow in each seat. A preview only:
// nothing is written (accept with POST /api/fill/accept).
export const POST = handler(async (req) => {
  const user = await requireRole(...CAN_DISPATCH);
  const input = await readJson(req, fillRequestSchema);
  await yardScope(user, "edit", { yardCode: input.yard });
  const { yard } = await pickYard(db(), user.organisationId, input.yard);
  if (!yard || yard.code.toLowerCase() !== input.yard.toLowerCase()) throw new ApiError(404, `No yard with code ${input.yard}.`);
  const { problem, meta } = await loadFillProblem(db(), { organisationId: user.organisationId, yard, day: input.date });
  const result = await fill(problem, {
    timeLimitSeconds: input.timeLimitSeconds ?? DEFAULT_SETTINGS.timeLimitSeconds,
    gap: input.gap ?? DEFAULT_SETTINGS.gap,
  });
  return json(toPreview(result, meta));
});
