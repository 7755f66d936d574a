import Link from "next/link";
import { requirePageRole } from "@/lib/auth/session";
import { ordersContext, one, type Search } from "./context";
import { Badge, PageHeader } from "@/components/status";
import { listOrders } from "@/lib/orders/data";
import { addDays } from "@/lib/time/days";
import { fmtDate } from "@/lib/format";
import { locateBadgeLabel } from "@/lib/orders/locate";
import { STATUS_LABEL, STATUS_TONE } from "@/lib/orders/status";
import type { OrderListItem } from "@/lib/orders/model";
import { ensureOccurrences } from "@/lib/orders/data-occurrences";
import { isIsoDate } from "@/lib/rules/time";
import { OrderFilters, statusFilter } from "./filters";

export const metadata = { title: "Work orders" };


export default async function OrdersPage({ searchParams }: { searchParams: Search }) {
  const user = await requirePageRole("dispatcher", "supervisor", "admin");
  const sp = await searchParams;
  const { conn, yards, workTypes, yardParam, picked, today } = await ordersContext(user, sp);
  const from = isIsoDate(one(sp.from)) ? one(sp.from) : today;
  const to = isIsoDate(one(sp.to)) ? one(sp.to) : addDays(from, 13);
  for (const y of picked) await ensureOccurrences(conn, user.organisationId, y.id, to);
  const orders = await listOrders(conn, user.organisationId, {
    yardIds: picked.map((y) => y.id),
    from,
    to,
    statuses: statusFilter(one(sp.status)),
    workTypeId: Number(one(sp.workType)) || undefined,
    q: one(sp.q) || undefined,
  });
  const canEdit = user.role !== "admin";
  const calendarHref = `/orders/calendar?${new URLSearchParams({ yard: yardParam, date: from, view: "week" })}`;

  return (
    <>
      <PageHeader eyebrow="Work orders" title={`Orders ${fmtDate(from)} – ${fmtDate(to)}`}>
        <nav aria-label="Views" className="flex rounded-md border border-rule bg-paper-50 p-0.5 text-sm font-semibold">
          <span aria-current="page" className="rounded px-3 py-1.5 bg-ink text-paper">
            List
          </span>
          <Link href={calendarHref} className="rounded px-3 py-1.5 text-ink hover:bg-paper-200">
            Calendar
          </Link>
        </nav>
        {canEdit && (
          <Link href="/orders/new" className="btn-accent">
            New order
          </Link>
        )}
      </PageHeader>
      <OrderFilters
        action="/orders"
        range
        values={{ yard: yardParam, from, to, status: one(sp.status), workType: one(sp.workType), q: one(sp.q) }}
        yards={yards}
        workTypes={workTypes}
      />
      {orders.length === 0 ? (
        <p className="card p-4 text-sm text-ink-500">No orders match. Change the dates or filters{canEdit ? ", or create a new order" : ""}.</p>
      ) : (
        <>
          <p className="mb-2 text-xs text-ink-500">
            {orders.length} order{orders.length === 1 ? "" : "s"} · times are each yard&apos;s own clock
          </p>
          <div className="card hidden overflow-x-auto md:block">
            <table className="w-full text-left text-sm">
              <thead className="bg-paper-200 text-xs uppercase text-ink-500">
                <tr>
                  <th className="px-3 py-2">Day</th>
                  <th className="px-3 py-2">Time</th>
                  <th className="px-3 py-2">Order</th>
                  <th className="px-3 py-2">Work type</th>
                  <th className="px-3 py-2">Crew</th>
                  <th className="px-3 py-2">Priority</th>
                  <th className="px-3 py-2">Status</th>
                  <th className="px-3 py-2">Warnings</th>
                </tr>
              </thead>
              <tbody>
                {orders.map((o) => (
                  <tr key={o.id} className="border-t border-rule align-top" data-testid="order-row">
                    <td className="whitespace-nowrap px-3 py-2 font-semibold">{fmtDate(o.workDate)}</td>
                    <td className="whitespace-nowrap px-3 py-2 tabular-nums">
                      {o.startLocal.slice(11)}–{o.endLocal.slice(11)}
                      {yards.length > 1 && !yardParam ? <span className="ml-1 text-xs text-ink-500">{o.yardCode}</span> : null}
                    </td>
                    <td className="px-3 py-2">
                      <Link href={`/orders/${o.id}`} className="font-bold text-ink hover:text-copper hover:underline">
                        {o.title}
                      </Link>
                      <div className="text-xs text-ink-500">
                        {o.number}
                        {o.structureNo ? ` · pole ${o.structureNo}` : ""}
                        {o.address ? ` · ${o.address}` : ""}
                      </div>
                    </td>
                    <td className="px-3 py-2">{o.workTypeName}</td>
                    <td className="whitespace-nowrap px-3 py-2 tabular-nums">
                      <CrewCount o={o} />
                    </td>
                    <td className="px-3 py-2 tabular-nums">{o.priority}</td>
                    <td className="px-3 py-2">
                      <Badge tone={STATUS_TONE[o.status]}>{STATUS_LABEL[o.status]}</Badge>
                    </td>
                    <td className="px-3 py-2">
                      <Warnings o={o} />
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          <ul className="space-y-2 md:hidden">
            {orders.map((o) => (
              <li key={o.id} className="card p-3" data-testid="order-card">
                <div className="flex items-center justify-between gap-2">
                  <p className="text-xs font-bold uppercase tracking-wide text-copper">
                    {fmtDate(o.workDate)} · {o.startLocal.slice(11)}–{o.endLocal.slice(11)}
                  </p>
                  <Badge tone={STATUS_TONE[o.status]}>{STATUS_LABEL[o.status]}</Badge>
                </div>
                <Link href={`/orders/${o.id}`} className="mt-1 block font-bold text-ink hover:text-copper">
                  {o.title}
                </Link>
                <p className="text-xs text-ink-500">
                  {o.number} · {o.workTypeName} · <CrewCount o={o} />
                </p>
                <div className="mt-1">
                  <Warnings o={o} />
                </div>
              </li>
            ))}
          </ul>
        </>
      )}
    </>
  );
}

function CrewCount({ o }: { o: OrderListItem }) {
  return (
    <span title={`${o.staffed} of ${o.positions} positions filled`}>
      {o.staffed}/{o.positions} filled
    </span>
  );
}

function Warnings({ o }: { o: OrderListItem }) {
  const locate = locateBadgeLabel(o);
  return (
    <span className="flex flex-wrap gap-1">
      {locate && (
        <Badge tone="warn" title={o.locateWarning ?? undefined}>
          {locate}
        </Badge>
      )}
      {o.emergency && <Badge tone="warn">Emergency</Badge>}
      {o.seriesId && <Badge tone="muted">Repeats</Badge>}
      {o.status === "on_hold" && o.holdReason && <span className="text-xs text-warn">{o.holdReason}</span>}
    </span>
  );
}
