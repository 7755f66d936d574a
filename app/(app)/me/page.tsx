import { requirePageRole } from "@/lib/auth/session";
import { db } from "@/lib/db";
import { Badge, PageHeader } from "@/components/status";
import { fmtDate, fmtTime, POSITION_LABEL } from "@/lib/format";

export const metadata = { title: "My week" };

const STATE: Record<string, { tone: "info" | "clear" | "block" | "muted"; word: string }> = {
  draft: { tone: "muted", word: "Planned" },
  sent: { tone: "info", word: "Waiting for your answer" },
  delivered: { tone: "info", word: "Waiting for your answer" },
  confirmed: { tone: "clear", word: "Confirmed" },
  declined: { tone: "block", word: "Declined" },
};

export default async function MyWeekPage() {
  const user = await requirePageRole("lineworker");
  const rows = user.workerId
    ? await db()("assignments as a")
        .join("work_orders as o", "o.id", "a.work_order_id")
        .join("positions as p", "p.id", "a.position_id")
        .join("yards as y", "y.id", "o.yard_id")
        .where("a.worker_id", user.workerId)
        .whereNot("a.status", "removed")
        .where("o.end_at", ">=", new Date(Date.now() - 12 * 3600_000))
        .where("o.start_at", "<", new Date(Date.now() + 8 * 86_400_000))
        .orderBy("o.start_at")
        .select("a.id", "a.status", "a.reply_code", "p.position", "o.number", "o.title", "o.address", "o.structure_no", "o.start_at", "o.end_at", "o.work_date", "y.timezone")
    : [];
  return (
    <>
      <PageHeader eyebrow="My week" title={`Hello, ${user.name.split(" ")[0]}`} />
      {rows.length === 0 && <p className="card p-4 text-sm text-ink-500">Nothing is planned for you in the next seven days.</p>}
      <ul className="space-y-3">
        {rows.map((r) => {
          const s = STATE[r.status] ?? STATE.draft;
          return (
            <li key={r.id} className="card p-4">
              <div className="flex flex-wrap items-center justify-between gap-2">
                <p className="text-xs font-bold uppercase tracking-wide text-copper">
                  {fmtDate(r.work_date)} · {fmtTime(r.start_at, r.timezone)}–{fmtTime(r.end_at, r.timezone)}
                </p>
                <Badge tone={s.tone}>{s.word}</Badge>
              </div>
              <p className="mt-1 font-bold">{r.title}</p>
              <p className="text-sm text-ink-700">
                {r.number} · {POSITION_LABEL[r.position]} · {r.address}
                {r.structure_no ? ` · pole ${r.structure_no}` : ""}
              </p>
            </li>
          );
        })}
      </ul>
    </>
  );
}
