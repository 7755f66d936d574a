import Link from "next/link";
import { requirePageRole } from "@/lib/auth/session";
import { db } from "@/lib/db";
import { Badge, PageHeader, SafetyNote, StateIcon, type Tone } from "@/components/status";
import { OfflineSync } from "@/components/offline/offline-sync";
import { MyCredentials } from "@/app/(app)/credentials/my-credentials";
import { calendarTokenAndYard, calendarUrlFor } from "@/lib/workers/data-calendar";
import { briefingsToAcknowledge } from "@/lib/briefings/data";
import { listUnavailability } from "@/lib/leave/data";
import { POSITION_LABEL } from "@/lib/format";
import { CalendarLink } from "./calendar-link";
import { mapLink, myAssignments, phoneText, whenLocal, type MyAssignment } from "@/lib/assignments/data-my-week";
import { LeaveForm } from "./leave-form";
import { RespondButtons } from "./respond-buttons";

export const metadata = { title: "My week" };
export const dynamic = "force-dynamic";

const STATE: Record<string, { tone: Tone; word: string }> = {
  draft: { tone: "muted", word: "Planned, not sent yet" },
  sent: { tone: "info", word: "Waiting for your answer" },
  delivered: { tone: "info", word: "Waiting for your answer" },
  confirmed: { tone: "clear", word: "Confirmed" },
  declined: { tone: "block", word: "Declined" },
};

const BRIEFING: Record<string, { tone: Tone; word: string }> = {
  not_started: { tone: "muted", word: "Briefing not started" },
  draft: { tone: "info", word: "Briefing in progress" },
  acks: { tone: "info", word: "Briefed: acknowledgements pending" },
  briefed: { tone: "clear", word: "Briefed" },
  on_hold: { tone: "block", word: "On hold" },
};

function briefingWord(a: MyAssignment) {
  if (a.orderStatus === "on_hold" || a.briefingState === "on_hold") return BRIEFING.on_hold;
  if (a.briefingState === "briefed") return BRIEFING.briefed;
  if (a.roundState === "briefed") return BRIEFING.acks;
  if (a.roundState === "draft") return BRIEFING.draft;
  return BRIEFING.not_started;
}

const LEAVE_STATE: Record<string, { tone: Tone; word: string }> = {
  requested: { tone: "info", word: "Waiting for a supervisor" },
  approved: { tone: "clear", word: "Approved" },
  refused: { tone: "block", word: "Refused" },
};

export default async function MyWeekPage() {
  const user = await requirePageRole("lineworker");
  const conn = db();
  const now = new Date();
  if (!user.workerId) {
    return (
      <>
        <PageHeader eyebrow="My week" title={`Hello, ${user.name.split(" ")[0]}`} />
        <p className="card p-4 text-sm text-ink-700">Your sign-in is not linked to a worker record yet. Ask an admin to link it.</p>
      </>
    );
  }
  const [assignments, toAck, worker, leave] = await Promise.all([
    myAssignments(conn, user.workerId, now),
    briefingsToAcknowledge(conn, user.workerId, new Date(now.getTime() - 12 * 3_600_000)),
    calendarTokenAndYard(conn, user.workerId),
    listUnavailability(conn, user.organisationId, { workerId: user.workerId }),
  ]);
  const upcomingLeave = leave.filter((l) => new Date(l.end).getTime() > now.getTime());
  const calendarUrl = worker?.calendar_token ? calendarUrlFor(String(worker.calendar_token)) : null;
  // Issue 20: this page and the briefings of the lineworker's own jobs (the next seven days,
  // not declined) are kept on the phone on each visit with signal.
  const keep = ["/me", ...new Set(assignments.filter((a) => a.status !== "declined").map((a) => `/orders/${a.orderId}/briefing`))];

  return (
    <div className="mx-auto max-w-2xl">
      <PageHeader eyebrow="My week" title={`Hello, ${user.name.split(" ")[0]}`} />
      <OfflineSync userId={user.id} keep={keep} />

      {toAck.length > 0 && (
        <section aria-labelledby="ack-h" className="mb-6">
          <h2 id="ack-h" className="sr-only">
            Briefings to acknowledge
          </h2>
          <ul className="space-y-2">
            {toAck.map((b) => (
              <li key={`${b.orderId}-${b.round}`} className="card border-copper bg-copper-100 p-4" data-testid={`ack-card-${b.number}`}>
                <p className="text-xs font-bold uppercase tracking-widest text-copper">Briefing to acknowledge</p>
                <p className="mt-1 font-bold">
                  {b.number} · {b.title}
                </p>
                <p className="text-sm text-ink-700">
                  {b.leadWorkerId === user.workerId
                    ? `You completed the job briefing${b.round > 1 ? ` (re-brief, round ${b.round})` : ""}. Add your own gear check and acknowledgement.`
                    : `Your crew lead completed the job briefing${b.round > 1 ? ` (re-brief, round ${b.round})` : ""}. Read it, check your gear, and acknowledge.`}
                </p>
                <Link href={`/orders/${b.orderId}/briefing`} className="btn-accent mt-3 min-h-11 w-full sm:w-auto">
                  Read and acknowledge
                </Link>
              </li>
            ))}
          </ul>
        </section>
      )}

      <section aria-labelledby="jobs-h">
        <h2 id="jobs-h" className="mb-2 text-base font-bold">
          Your jobs, the next seven days
        </h2>
        {assignments.length === 0 && <p className="card p-4 text-sm text-ink-500">Nothing is planned for you in the next seven days.</p>}
        <ul className="space-y-3">
          {assignments.map((a) => (
            <AssignmentCard key={a.id} a={a} me={user.workerId!} userId={user.id} />
          ))}
        </ul>
        <SafetyNote className="mt-3" />
      </section>

      <MyCredentials workerId={user.workerId} organisationId={user.organisationId} />

      <section aria-labelledby="leave-h" className="mt-8">
        <h2 id="leave-h" className="mb-2 text-base font-bold">
          Leave
        </h2>
        {upcomingLeave.length > 0 && (
          <ul className="mb-3 space-y-2">
            {upcomingLeave.map((l) => {
              const s = LEAVE_STATE[l.status] ?? LEAVE_STATE.requested;
              return (
                <li key={l.id} className="card flex flex-wrap items-start justify-between gap-2 p-3" data-testid="my-leave">
                  <div className="min-w-0">
                    <p className="font-semibold capitalize">{l.kind}</p>
                    <p className="text-sm tabular-nums text-ink-700">
                      {l.startLocal.replace("T", " ").slice(0, 16)} → {l.endLocal.replace("T", " ").slice(0, 16)}
                    </p>
                    {l.note && <p className="text-sm text-ink-500">{l.note}</p>}
                  </div>
                  <Badge tone={s.tone}>{s.word}</Badge>
                </li>
              );
            })}
          </ul>
        )}
        <LeaveForm workerId={user.workerId} yardName={worker?.yard_name ?? "yard"} />
      </section>

      <section aria-labelledby="cal-h" className="mt-8 mb-4">
        <h2 id="cal-h" className="mb-2 text-base font-bold">
          Calendar
        </h2>
        <CalendarLink url={calendarUrl} />
      </section>
    </div>
  );
}

function AssignmentCard({ a, me, userId }: { a: MyAssignment; me: number; userId: number }) {
  const s = STATE[a.status] ?? STATE.draft;
  const onHold = a.orderStatus === "on_hold" || a.briefingState === "on_hold";
  const b = briefingWord(a);
  const place = [a.address, a.structureNo ? `pole ${a.structureNo}` : null].filter(Boolean).join(" · ");
  const live = a.status !== "declined";
  return (
    <li className="card p-4" data-testid={`my-assignment-${a.number}`}>
      <div className="flex flex-wrap items-center justify-between gap-2">
        <p className="text-xs font-bold uppercase tracking-wide text-copper">{whenLocal(a.start, a.end, a.timezone)}</p>
        <Badge tone={s.tone}>{s.word}</Badge>
      </div>
      <p className="mt-1 font-bold leading-snug">{a.title}</p>
      <p className="text-sm text-ink-700">
        {a.number} · you are <strong>{POSITION_LABEL[a.position] ?? a.position}</strong>
        {a.isLead && a.position !== "lead" ? " and crew lead" : ""}
      </p>
      {place && (
        <p className="mt-1 text-sm">
          {a.address ? (
            <a href={mapLink(a.address)} target="_blank" rel="noopener noreferrer" className="font-semibold text-copper underline underline-offset-2">
              {place} <span className="sr-only">(map, opens in a new tab)</span>
              <span aria-hidden="true"> ↗</span>
            </a>
          ) : (
            place
          )}
        </p>
      )}
      {a.declineReason && a.status === "declined" && <p className="mt-1 text-sm text-ink-500">Your reason: {a.declineReason}</p>}
      {onHold && a.holdReason && (
        <p className="mt-2 flex items-start gap-1.5 rounded-md bg-block-bg px-3 py-2 text-sm font-semibold text-block">
          <StateIcon tone="block" className="mt-1 h-3 w-3 shrink-0" />
          <span>On hold: {a.holdReason}</span>
        </p>
      )}

      {live && a.crew.length > 0 && (
        <details className="mt-3 rounded-md border border-rule bg-white" open={a.crew.length <= 5}>
          <summary className="cursor-pointer px-3 py-2 text-sm font-semibold">Crew ({a.crew.length})</summary>
          <ul className="divide-y divide-rule border-t border-rule">
            {a.crew.map((c, i) => (
              <li key={`${c.workerId}-${i}`} className="flex items-center justify-between gap-2 px-3 py-2 text-sm">
                <span className="min-w-0">
                  <span className="font-semibold">{c.name}</span>
                  {c.workerId === me && <span className="text-ink-500"> (you)</span>}
                  <span className="block text-xs text-ink-500">{c.position}</span>
                </span>
                {c.phone && c.workerId !== me ? (
                  <a href={`tel:${c.phone}`} className="btn-quiet min-h-11 shrink-0 px-3 tabular-nums" aria-label={`Call ${c.name}`}>
                    {phoneText(c.phone)}
                  </a>
                ) : null}
              </li>
            ))}
          </ul>
        </details>
      )}

      {live && (
        <div className="mt-3 flex flex-wrap items-center gap-2">
          <Badge tone={b.tone}>{b.word}</Badge>
          <Link href={`/orders/${a.orderId}/briefing`} className="text-sm font-semibold text-copper underline underline-offset-2">
            {a.isLead ? "Open the briefing (you lead)" : "Briefing"}
          </Link>
        </div>
      )}

      {a.status === "draft" && <p className="mt-2 text-xs text-ink-500">You can answer once dispatch sends the crew.</p>}
      {(a.status === "sent" || a.status === "delivered" || a.status === "confirmed") && (
        <RespondButtons assignmentId={a.id} status={a.status} orderNumber={a.number} userId={userId} />
      )}
    </li>
  );
}
