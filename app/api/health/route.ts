import { answeringPort, dbStats, isDbUnavailable } from "@/lib/db";
import { errorResponse, json } from "@/lib/api/http";

export const dynamic = "force-dynamic";

// Public: load balancers and the scripts poll it. A real query, so a dead database shows.
// `?stats=1` adds which database port answered (scaled out: DB_HOSTS) and this instance's
// counters: failovers, conflict retries and give-ups, statement time-outs.
export async function GET(req: Request) {
  const withStats = new URL(req.url).searchParams.get("stats") === "1";
  const counters = () => {
    const { failovers, conflictRetries, conflictsGivenUp, statementTimeouts, nodeFailures } = dbStats();
    return { failovers, conflictRetries, conflictsGivenUp, statementTimeouts, nodeFailures };
  };
  try {
    const port = await answeringPort();
    return json(withStats ? { db: "ok", port, ...counters() } : { db: "ok" });
  } catch (err) {
    if (isDbUnavailable(err)) return json({ db: "down", error: "The database is not reachable.", ...(withStats ? counters() : {}) }, 503);
    return errorResponse(err);
  }
}
