import { db } from "@/lib/db";
import { ApiError, handler, readQuery } from "@/lib/api/http";
import { requireRole } from "@/lib/auth/session";
import { CAN_DISPATCH } from "@/lib/users/roles";
import { daySheetQuerySchema } from "@/lib/daysheet/model";
import { loadDaySheet } from "@/lib/daysheet/data";
import { daySheetPdf } from "@/lib/daysheet/pdf";

export const dynamic = "force-dynamic";

// Issue 18: the day sheet as a PDF — every crew of the day, one yard or all. Whoever may read
// the board may print it (any yard's board may be read, issue 15); phone numbers are not on it.
export const GET = handler(async (req) => {
  const user = await requireRole(...CAN_DISPATCH, "admin");
  const q = readQuery(req, daySheetQuerySchema);
  const sheet = await loadDaySheet(db(), { organisationId: user.organisationId, yardCode: q.yard ?? null, day: q.date ?? null });
  if (q.yard && !sheet.yards.length) throw new ApiError(404, `No yard with code ${q.yard}.`);
  const bytes = await daySheetPdf(sheet);
  const name = `day-sheet-${sheet.day}${q.yard ? `-${sheet.yards[0].code}` : ""}.pdf`;
  return new Response(new Uint8Array(bytes), {
    status: 200,
    headers: {
      "content-type": "application/pdf",
      "content-disposition": `inline; filename="${name}"`,
      "cache-control": "private, no-store",
    },
  });
});
