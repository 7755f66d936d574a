import { requirePageRole } from "@/lib/auth/session";
import { db } from "@/lib/db";
import { pickYard, tomorrowIn } from "@/lib/data/yards";
import { boardFor } from "@/lib/data/board-cache";
import { BoardClient } from "./board-client";

export const metadata = { title: "Board" };
export const dynamic = "force-dynamic";

export default async function BoardPage({ searchParams }: { searchParams: Promise<{ date?: string; yard?: string }> }) {
  const user = await requirePageRole("dispatcher", "supervisor", "admin");
  const sp = await searchParams;
  const { yard, yards } = await pickYard(db(), user.organisationId, sp.yard, user.homeYardId);
  if (!yard) return <p className="card p-6">No yards are set up yet. An admin adds them.</p>;
  const day = sp.date && /^\d{4}-\d{2}-\d{2}$/.test(sp.date) ? sp.date : tomorrowIn(yard.timezone);
  const { payload } = await boardFor(db(), { organisationId: user.organisationId, yard, yards, day });
  return <BoardClient day={day} yardCode={yard.code} initial={payload} role={user.role} />;
}
