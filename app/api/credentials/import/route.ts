import { db } from "@/lib/db";
import { handler, json, readJson } from "@/lib/api/http";
import { requireRole } from "@/lib/auth/session";
import { importCredentials } from "@/lib/credentials/data-import";
import { importRequestSchema } from "@/lib/credentials/model";

// POST: hr, admin. { csv, dryRun }. Every row is checked; nothing is written unless all pass.
// 200 with the counts when good; 422 with issues [{ line, field, message }] when not.
export const POST = handler(async (req) => {
  const user = await requireRole("hr", "admin");
  const { csv, dryRun } = await readJson(req, importRequestSchema);
  const result = await importCredentials(db(), user, csv, { dryRun });
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
  return json(result, dryRun ? 200 : 201);
});
