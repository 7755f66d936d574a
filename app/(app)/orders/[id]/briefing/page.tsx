import { notFound, redirect } from "next/navigation";
import { requirePageRole } from "@/lib/auth/session";
import { START_PAGE } from "@/lib/users/roles";
import { db } from "@/lib/db";
import { ApiError } from "@/lib/api/http";
import { loadBriefing, modeFor, type Mode } from "@/lib/briefings/data";
import { BriefingScreen } from "./screen";
import { BriefingFigures } from "./figures";

export const metadata = { title: "Job briefing" };
export const dynamic = "force-dynamic";

// The job briefing of one order, opened on site by the crew lead (who writes it), read and
// acknowledged by the crew from their own phones, viewed by dispatchers and supervisors.
// A lineworker who is not on the crew is sent to /forbidden.
export default async function BriefingPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requirePageRole("lineworker", "dispatcher", "supervisor");
  const raw = (await params).id;
  if (!/^\d{1,10}$/.test(raw)) notFound();
  const view = await loadBriefing(db(), user.organisationId, Number(raw));
  if (!view) notFound();
  let mode: Mode;
  try {
    mode = modeFor(user, view);
  } catch (err) {
    if (err instanceof ApiError && err.status === 403) redirect(`/forbidden?from=${START_PAGE[user.role]}`);
    throw err;
  }
  const backHref = user.role === "lineworker" ? "/me" : `/board?${new URLSearchParams({ yard: view.order.yardCode, date: view.order.workDate })}`;
  return (
    <BriefingScreen
      initial={{ ...view, mode, me: user.workerId ?? null }}
      userId={user.role === "lineworker" ? user.id : null}
      backHref={backHref}
      figures={<BriefingFigures conn={db()} organisationId={user.organisationId} orderId={Number(raw)} isLead={mode === "lead"} />}
    />
  );
}
