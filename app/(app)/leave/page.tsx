import { requirePageRole } from "@/lib/auth/session";
import { db } from "@/lib/db";
import { Badge, PageHeader } from "@/components/status";
import { ActionButton } from "@/components/form-bits";
import { listUnavailability, type UnavailabilityView } from "@/lib/leave/data";
import { listWorkers } from "@/lib/workers/data";
import { listYards } from "@/lib/yards/data";
import { addDays, todayIn } from "@/lib/time/days";
import { fmtLocal } from "@/lib/time/zoned-format";
import { LeaveForm } from "@/components/leave-form";

export const metadata = { title: "Leave" };

const KIND_LABEL = { leave: "Leave", training: "Training", sickness: "Sickness" } as const;
const STATUS = {
  requested: { tone: "warn", word: "Waiting for a decision" },
  approved: { tone: "clear", word: "Approved" },
  refused: { tone: "muted", word: "Refused" },
} as const;

export default async function LeavePage() {
  const user = await requirePageRole("hr", "supervisor", "dispatcher", "admin", "lineworker");
  const conn = db();
  const own = user.role === "lineworker";
  const canEnter = own ? Boolean(user.workerId) : user.role === "hr" || user.role === "supervisor";
  const canDecide = user.role === "supervisor";
  const canRemove = user.role === "hr" || user.role === "supervisor";
  const [yards, workers] = await Promise.all([listYards(conn, user.organisationId), listWorkers(conn, user.organisationId, { activeOnly: true })]);
  const home = yards.find((y) => y.id === user.homeYardId) ?? yards[0];
  const today = todayIn(home.timezone);
  const entries = await listUnavailability(conn, user.organisationId, {
    workerId: own ? (user.workerId ?? -1) : undefined,
    from: addDays(today, -30),
  });
  const now = Date.now();
  const pending = entries.filter((e) => e.status === "requested");
  const coming = entries.filter((e) => e.status === "approved" && Date.parse(e.end) >= now);
  const rest = entries.filter((e) => e.status === "refused" || (e.status === "approved" && Date.parse(e.end) < now));
  const formWorkers = (own ? workers.filter((w) => w.id === user.workerId) : workers).map((w) => ({ id: w.id, name: w.name, employeeNo: w.employeeNo, yardCode: w.yardCode }));

  const Entry = ({ e }: { e: UnavailabilityView }) => (
    <li className="flex flex-wrap items-start justify-between gap-3 py-2.5" data-testid="leave-entry">
      <div>
        <p className="font-semibold">
          {own ? KIND_LABEL[e.kind] : `${e.workerName} · ${KIND_LABEL[e.kind]}`}
          {!own && <span className="ml-1 text-xs font-normal text-ink-500">{e.employeeNo}</span>}
        </p>
        <p className="text-sm tabular-nums text-ink-700">
          {fmtLocal(e.start, e.timezone)} → {fmtLocal(e.end, e.timezone)}
        </p>
        {e.note && <p className="text-xs text-ink-500">{e.note}</p>}
        <p className="text-xs text-ink-500">
          {e.requestedBy ? `Entered by ${e.requestedBy}` : ""}
          {e.decidedBy && e.status !== "requested" ? ` · ${e.status} by ${e.decidedBy}` : ""}
        </p>
      </div>
      <div className="flex flex-wrap items-center gap-2">
        <Badge tone={STATUS[e.status].tone}>{STATUS[e.status].word}</Badge>
        {canDecide && e.status === "requested" && (
          <>
            <ActionButton url={`/api/leave/${e.id}`} method="PATCH" body={{ status: "approved" }} label="Approve" className="btn-primary px-2 py-1 text-xs" />
            <ActionButton url={`/api/leave/${e.id}`} method="PATCH" body={{ status: "refused" }} label="Refuse" className="btn-quiet px-2 py-1 text-xs" />
          </>
        )}
        {((own && e.status === "requested") || canRemove) && (
          <ActionButton
            url={`/api/leave/${e.id}`}
            confirm={own ? "Withdraw this request?" : "Remove this entry? The boards re-check at once."}
            label={own ? "Withdraw" : "Remove"}
            className="btn-quiet px-2 py-1 text-xs"
          />
        )}
      </div>
    </li>
  );

  const List = ({ title, list, empty }: { title: string; list: UnavailabilityView[]; empty: string }) => (
    <section className="card p-4" aria-label={title}>
      <h2 className="mb-1 text-lg font-extrabold tracking-tight">
        {title} <span className="text-sm font-semibold text-ink-500">({list.length})</span>
      </h2>
      {list.length === 0 ? <p className="text-sm text-ink-500">{empty}</p> : <ul className="divide-y divide-rule">{list.map((e) => <Entry key={e.id} e={e} />)}</ul>}
    </section>
  );

  return (
    <>
      <PageHeader eyebrow="Leave" title={own ? "My leave" : "Leave, training and sickness"} />
      <div className="grid gap-5 lg:grid-cols-[3fr_2fr]">
        <div className="space-y-4">
          <List title="Waiting for a decision" list={pending} empty={canDecide ? "Nothing to decide." : "No open requests."} />
          <List title="Coming up and current" list={coming} empty="Nobody is away." />
          <List title="Past and refused (30 days)" list={rest} empty="None." />
        </div>
        {canEnter && (
          <section className="card h-fit p-4">
            <h2 className="mb-1 text-lg font-extrabold tracking-tight">{own ? "Ask for leave" : "Enter leave"}</h2>
            <p className="mb-3 text-sm text-ink-700">
              {own ? "Your request waits for a supervisor." : "Entered here it counts as approved at once."} Overlapping entries for one person are refused.
            </p>
            <LeaveForm workers={formWorkers} asks={own} defaults={{ start: `${addDays(today, 7)}T00:00`, end: `${addDays(today, 8)}T00:00` }} />
          </section>
        )}
      </div>
    </>
  );
}
