import { ApiError, handler, json, readBodyText } from "@/lib/api/http";
import { requireRole } from "@/lib/auth/session";
import { CAN_DISPATCH } from "@/lib/users/roles";
import { parseDayInput } from "@/lib/rules/input";
import { crewCheckReport } from "@/lib/rules/report";

// The crew rules over a posted day, for other tools: the same input and output as
// `npm run crew-check`, the same engine as the board.
export const POST = handler(async (req) => {
  await requireRole(...CAN_DISPATCH);
  const text = await readBodyText(req, 20_000_000, "The day");
  let body: unknown;
  try {
    body = JSON.parse(text);
  } catch {
    throw new ApiError(400, "Request body is not valid JSON.");
  }
  const parsed = parseDayInput(body);
  if (!parsed.ok) {
    const issues = parsed.errors.map((e) => {
      const i = e.indexOf(":");
      return { field: i > 0 ? e.slice(0, i) : "(body)", message: i > 0 ? e.slice(i + 1).trim() : e };
    });
    throw new ApiError(422, `Invalid ${parsed.errors[0]}`, { issues });
  }
  return json(crewCheckReport(parsed.snapshot));
});
