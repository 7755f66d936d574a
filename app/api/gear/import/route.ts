import { db } from "@/lib/db";
import { handler, json, readJson } from "@/lib/api/http";
import { requireRole } from "@/lib/auth/session";
import { importGear } from "@/lib/gear/data";
import { gearImportRequestSchema } from "@/lib/gear/model";

// POST: hr, admin. { csv, dryRun }. Rows are matched by serial: new serials are created,
// changed rows updated, the rest left alone. Every row is checked first; nothing is written
// unless all pass: 422 with issues [{ line, field, message }].
export const POST = handler(async (req) => {
  const user = await requireRole("hr", "admin");
  const { csv, dryRun } = await readJson(req, gearImportRequestSchema);
  const result = await importGear(db(), user, csv, { dryRun });
  if (!result.ok) {
    const first = result.issues[0];
    return json(
      {
        error: `${result.issueCount} problem${result.issueCount === 1 ? "" : "s"} in the file; nothing was imported. First: line ${first.line}, ${first.field}: ${first.message}`,
        ...result,
      },
      422,
    );
  }
  return json(result, dryRun || (!result.created && !result.updated) ? 200 : 201);
});
