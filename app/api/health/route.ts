import { db, isDbUnavailable } from "@/lib/db";
import { errorResponse, json } from "@/lib/api/http";

export const dynamic = "force-dynamic";

// Public: load balancers and the scripts poll it. A real query, so a dead database shows.
export async function GET() {
  try {
    await db().raw("select 1 as ok");
    return json({ db: "ok" });
  } catch (err) {
    if (isDbUnavailable(err)) return json({ db: "down", error: "The database is not reachable." }, 503);
    return errorResponse(err);
  }
}
