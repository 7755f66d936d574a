import Link from "next/link";
import { requirePageRole } from "@/lib/auth/session";
import { CAN_OVERRIDE } from "@/lib/users/roles";
import { db } from "@/lib/db";
import { supervisorQueue } from "@/lib/queue/data";
import { Badge, PageHeader, SafetyNote } from "@/components/status";
import { fmtDate, fmtDateTimeZone } from "@/lib/format";
import { NoticesList } from "./notices-list";

export const metadata = { title: "Queue" };
export const dynamic = "force-dynamic";

const boardHref = (day: string, yard: string) => `/board?date=${day}&yard=${encodeURIComponent(yard)}`;

// Issue 18, point 13: what waits on a supervisor — blocks on upcoming crewed orders that a
// supervisor may override (or send back to the dispatcher), and overrides that lapsed when the
// crew changed. Scoped on the server to the supervisor's yards.
export default async function QueuePage() {
  const user = await requirePageRole(...CAN_OVERRIDE);
  const q = await supervisorQueue(db(), user);
  const byOrder = new Map<number, typeof q.blocks>();
  for (const b of q.blocks) byOrder.set(b.orderId, [...(byOrder.get(b.orderId) ?? []), b]);
  return (
    <div className="space-y-6">
      <PageHeader title="Queue" eyebrow={`Supervisor · ${q.yards.map((y) => y.name).join(", ") || "no yards"}`}>
        <span className="text-sm text-ink-700">
          {q.from ? `${fmtDate(q.from)} to ${fmtDate(q.to)}` : ""}
        </span>
      </PageHeader>

      <NoticesList notices={q.notices} />

      <section aria-labelledby="q-blocks" className="card p-4" data-testid="queue-blocks">
        <div className="mb-2 flex flex-wrap items-center gap-2">
          <h2 id="q-blocks" className="font-bold">
            Blocks waiting on a supervisor
          </h2>
          {q.blocks.length ? <Badge tone="block">{q.blocks.length === 1 ? "1 block" : `${q.blocks.length} blocks`}</Badge> : <Badge tone="clear">None</Badge>}
        </div>
        <p className="mb-3 text-sm text-ink-700">
          Orders with a crew placed whose block stands and may be overridden with a reason (locked rules are left to the dispatcher to fix).
        </p>
        {byOrder.size === 0 ? (
          <p className="text-sm text-ink-700">Nothing waits on you.</p>
        ) : (
          <ul className="space-y-3">
            {[...byOrder.values()].map((list) => {
              const o = list[0];
              return (
                <li key={o.orderId} className="rounded-md border border-rule p-3" data-testid={`queue-order-${o.orderNumber}`}>
                  <div className="flex flex-wrap items-baseline gap-x-3 gap-y-1">
                    <Link href={`/orders/${o.orderId}`} className="font-bold">
                      {o.orderNumber}
                    </Link>
                    <span className="min-w-0 break-words">{o.orderTitle}</span>
                    <span className="text-sm text-ink-700">
                      {o.yardName} · {o.startWords}
                    </span>
                    <Link href={boardHref(o.day, o.yardCode)} className="ml-auto text-sm">
                      Open on the board
                    </Link>
                  </div>
                  <ul className="mt-2 space-y-1 text-sm">
                    {list.map((b, i) => (
                      <li key={`${b.rule}-${b.workerId ?? ""}-${i}`} className="flex flex-wrap items-start gap-2" data-testid={`queue-block-${b.rule}`}>
                        <Badge tone="block">{b.ruleName}</Badge>
                        <span className="min-w-0 basis-full break-words sm:basis-0 sm:flex-1">
                          {b.message}
                          {b.source ? <span className="ml-1 text-xs text-ink-500">({b.source})</span> : null}
                        </span>
                      </li>
                    ))}
                  </ul>
                </li>
              );
            })}
          </ul>
        )}
      </section>

      <section aria-labelledby="q-lapsed" className="card p-4" data-testid="queue-lapsed">
        <div className="mb-2 flex flex-wrap items-center gap-2">
          <h2 id="q-lapsed" className="font-bold">
            Lapsed overrides
          </h2>
          <span className="text-sm text-ink-700">the last 14 days</span>
        </div>
        {q.lapsed.length === 0 ? (
          <p className="text-sm text-ink-700">No override has lapsed.</p>
        ) : (
          <ul className="space-y-3">
            {q.lapsed.map((l) => (
              <li key={l.overrideId} className="rounded-md border border-rule p-3 text-sm" data-testid={`queue-lapse-${l.orderNumber}`}>
                <div className="flex flex-wrap items-center gap-2">
                  <Badge tone="overridden">{l.ruleName}</Badge>
                  <Link href={`/orders/${l.orderId}`} className="font-bold">
                    {l.orderNumber}
                  </Link>
                  <span className="min-w-0 break-words">{l.orderTitle}</span>
                  <span className="text-ink-700">{fmtDate(l.day)}</span>
                  {l.blockNow === true && <Badge tone="block">Block is back</Badge>}
                  {l.blockNow === false && <Badge tone="clear">No block now</Badge>}
                </div>
                <dl className="mt-2 grid gap-x-4 gap-y-1 sm:grid-cols-[max-content_1fr]">
                  <dt className="font-semibold">Given</dt>
                  <dd>
                    by {l.givenBy}, {l.givenWords}
                    {l.workerName ? ` for ${l.workerName}` : ""}: “{l.reason}”
                  </dd>
                  <dt className="font-semibold">Lapsed</dt>
                  <dd>
                    {l.lapsedWords}: {l.change ?? "the crew changed"}
                  </dd>
                </dl>
                <Link href={boardHref(l.day, l.yardCode)} className="mt-1 inline-block">
                  Open on the board
                </Link>
              </li>
            ))}
          </ul>
        )}
      </section>
      <SafetyNote />
      <p className="sr-only">Generated {fmtDateTimeZone(new Date(), "UTC")}</p>
    </div>
  );
}
