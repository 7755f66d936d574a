import { db } from "@/lib/db";
import { handler, readQuery } from "@/lib/api/http";
import { requireRole } from "@/lib/auth/session";
import { listCredentials } from "@/lib/credentials/data";
import { todayIn } from "@/lib/time/days";
import { credentialQuerySchema } from "@/lib/credentials/model";
import { credentialExportCsv } from "@/lib/credentials/csv";

// GET: hr, admin, supervisor. The desk's table as CSV, with the same filters as the list.
// The first four columns are the import's, so an edited export can be imported again.
export const GET = handler(async (req) => {
  const user = await requireRole("hr", "admin", "supervisor");
  const f = readQuery(req, credentialQuerySchema);
  const rows = await listCredentials(db(), user.organisationId, f);
  const csv = credentialExportCsv(rows);
  const day = todayIn("UTC");
  const view = f.view && f.view !== "all" ? `-${f.view}` : "";
  return new Response(csv, {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": `attachment; filename="credentials-${day}${view}.csv"`,
      "cache-control": "private, no-store",
      "x-content-type-options": "nosniff",
    },
  });
});
