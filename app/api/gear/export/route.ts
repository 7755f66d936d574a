import Papa from "papaparse";
import { db } from "@/lib/db";
import { CSV_FORMULA } from "@/lib/csv";
import { handler, readQuery } from "@/lib/api/http";
import { requireRole } from "@/lib/auth/session";
import { listGear } from "@/lib/gear/data";
import { GEAR_CSV_COLUMNS, gearQuerySchema } from "@/lib/gear/model";
import { todayIn } from "@/lib/time/days";

// GET: hr, admin, dispatcher, supervisor. The rubber goods list as CSV with the list's filters.
// The first columns are the import's, so an edited export imports again (unchanged rows stay
// as they are); the rest are read-only context.
export const GET = handler(async (req) => {
  const user = await requireRole("hr", "admin", "dispatcher", "supervisor");
  const f = readQuery(req, gearQuerySchema);
  const rows = await listGear(db(), user.organisationId, f);
  const csv = Papa.unparse(
    {
      fields: [...GEAR_CSV_COLUMNS, "worker", "yard", "next_test_due", "state"],
      data: rows.map((r) => [
        r.serial,
        r.employeeNo,
        r.kind,
        r.class,
        r.size ?? "",
        r.testedOn,
        r.issuedOn ?? "",
        r.retiredOn ?? "",
        r.workerName,
        r.yardCode,
        r.dueOn,
        r.state,
      ]),
    },
    // Cells starting with = + - @ are prefixed so a spreadsheet does not run them (CSV injection);
    // the import reads our own prefix back.
    { escapeFormulae: CSV_FORMULA, newline: "\r\n" }, // lib/csv.ts: also after leading whitespace or line breaks
  );
  const view = f.view && f.view !== "all" ? `-${f.view}` : "";
  return new Response("\uFEFF" + csv + "\r\n", {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": `attachment; filename="rubber-goods-${todayIn("UTC")}${view}.csv"`,
      "cache-control": "private, no-store",
      "x-content-type-options": "nosniff",
    },
  });
});
