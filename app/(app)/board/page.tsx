import { contactYards, requirePageRole } from "@/lib/auth/session";
import { db } from "@/lib/db";
import { pickYard } from "@/lib/yards/data";
import { tomorrowIn } from "@/lib/time/days";
import { currentVariant } from "@/lib/board/data-serve";
import { BoardClient } from "./board-client";

export const metadata = { title: "Board" };
export const dynamic = "force-dynamic";

export default async function BoardPage({ searchParams }: { searchParams: Promise<{ date?: string; yard?: string }> }) {
  const user = await requirePageRole("dispatcher", "supervisor", "admin");
  const sp = await searchParams;
  const { yard, yards } = await pickYard(db(), user.organisationId, sp.yard, user.homeYardId);
  if (!yard) return <p className="card p-6">No yards are set up yet. An admin adds them.</p>;
  const day = sp.date && /^\d{4}-\d{2}-\d{2}$/.test(sp.date) ? sp.date : tomorrowIn(yard.timezone);
  // The same narrowed, versioned board the API serves (phones of other yards' workers hidden),
  // so the browser's first refresh is a patch against it.
  const { payload, version } = await currentVariant(db(), { organisationId: user.organisationId, yard, yards, day }, await contactYards(user));
  return <BoardClient day={day} yardCode={yard.code} initial={payload} initialVersion={version} role={user.role} />;
}
