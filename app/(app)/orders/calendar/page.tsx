import Link from "next/link";
import { requirePageRole } from "@/lib/auth/session";
import { ordersContext, one, type Search } from "../context";
import { Badge, PageHeader } from "@/components/status";
import { listOrders } from "@/lib/orders/data";
import { addDays } from "@/lib/time/days";
import { fmtDate } from "@/lib/format";
import { locateBadgeLabel } from "@/lib/orders/locate";
import { STATUS_LABEL, STATUS_TONE } from "@/lib/orders/status";
import type { OrderListItem } from "@/lib/orders/model";
import { ensureOccurrences } from "@/lib/orders/data-occurrences";
import { isIsoDate } from "@/lib/rules/time";
import { weekStart } from "@/lib/time-records/data";
import { OrderFilters, statusFilter } from "../filters";

export const metadata = { title: "Orders calendar" };


export default async function OrdersCalendarPage({ searchParams }: { searchParams: Search }) {
  const user = await requirePageRole("dispatcher", "supervisor", "admin");
  const sp = await searchParams;
  const { conn, yards, workTypes, yardParam, picked, today } = await ordersContext(user, sp);
  // Default to tomorrow: the day dispatchers are building.
  const date = isIsoDate(one(sp.date)) ? one(sp.date) : addDays(today, 1);
  const view = one(sp.view) === "day" ? "day" : "week";
  const from = view === "day" ? date : weekStart(date);
  const to = view === "day" ? date : addDays(from, 6);
  for (const y of picked) await ensureOccurrences(conn, user.organisationId, y.id, to);
  const orders = await listOrders(conn, user.organisationId, {
    yardIds: picked.map((y) => y.id),
    from,
    to,
    statuses: statusFilter(one(sp.status)),
    workTypeId: Number(one(sp.workType)) || undefined,
    q: one(sp.q) || undefined,
  });
  const keep = { yard: yardParam, status: one(sp.status), workType: one(sp.workType), q: one(sp.q) };
  const href = (p: Record<string, string>) => `/orders/calendar?${new URLSearchParams({ ...keep, view, date, ...p })}`;
  const step = view === "day" ? 1 : 7;
  const showYard = picked.length > 1;

  return (
    <>
      <PageHeader eyebrow="Work orders" title={view === "day" ? `Orders on ${fmtDate(date, { weekday: "long", month: "long", day: "numeric", year: "numeric" })}` : `Week of ${fmtDate(from, { month: "long", day: "numeric", year: "numeric" })}`}>
        <nav aria-label="Views" className="flex rounded-md border border-rule bg-paper-50 p-0.5 text-sm font-semibold">
          <Link href={`/orders?${new URLSearchParams({ ...keep, from, to })}`} className="rounded px-3 py-1.5 text-ink hover:bg-paper-200">
            List
          </Link>
          <Link href={href({ view: "week" })} aria-current={view === "week" ? "page" : undefined} className={`rounded px-3 py-1.5 ${view === "week" ? "bg-ink text-paper" : "text-ink hover:bg-paper-200"}`}>
            Week
          </Link>
          <Link href={href({ view: "day" })} aria-current={view === "day" ? "page" : undefined} className={`rounded px-3 py-1.5 ${view === "day" ? "bg-ink text-paper" : "text-ink hover:bg-paper-200"}`}>
            Day
          </Link>
        </nav>
        <div className="flex gap-1">
          <Link href={href({ date: addDays(date, -step) })} className="btn-quiet" aria-label={view === "day" ? "Previous day" : "Previous week"}>
            ‹ {view === "day" ? "Day" : "Week"}
          </Link>
          <Link href={href({ date: today })} className="btn-quiet">
            Today
          </Link>
          <Link href={href({ date: addDays(date, step) })} className="btn-quiet" aria-label={view === "day" ? "Next day" : "Next week"}>
            {view === "day" ? "Day" : "Week"} ›
          </Link>
        </div>
        {user.role !== "admin" && (
          <Link href={`/orders/new?${new URLSearchParams({ date: view === "day" ? date : addDays(today, 1), yard: yardParam })}`} className="btn-accent">
            New order
          </Link>
        )}
      </PageHeader>
      <OrderFilters action="/orders/calendar" range={false} values={{ ...keep, date, view }} yards={yards} workTypes={workTypes} />
      {view === "week" ? <Week from={from} today={today} orders={orders} showYard={showYard} dayHref={(d) => href({ view: "day", date: d })} /> : <Day date={date} orders={orders} showYard={showYard} />}
    </>
  );
}

function Chip({ o, showYard }: { o: OrderListItem; showYard: boolean }) {
  const locate = locateBadgeLabel(o);
  return (
    <Link
      href={`/orders/${o.id}`}
      className={`block rounded-md border border-rule bg-white p-2 text-xs hover:border-copper ${o.status === "cancelled" ? "opacity-60" : ""}`}
      data-testid="calendar-order"
    >
      <span className="flex items-center justify-between gap-1">
        <span className="font-bold tabular-nums">
          {o.startLocal.slice(11)}–{o.endLocal.slice(11)}
          {showYard ? ` ${o.yardCode}` : ""}
        </span>
        <span className="text-ink-500">{o.number}</span>
      </span>
      <span className="mt-0.5 block text-sm font-semibold leading-snug text-ink">{o.title}</span>
      <span className="mt-1 flex flex-wrap items-center gap-1">
        <Badge tone={STATUS_TONE[o.status]}>{STATUS_LABEL[o.status]}</Badge>
        <span className="text-ink-500">
          {o.staffed}/{o.positions} filled
        </span>
        {locate && (
          <Badge tone="warn" title={o.locateWarning ?? undefined}>
            {locate}
          </Badge>
        )}
        {o.emergency && <Badge tone="warn">Emergency</Badge>}
        {o.seriesId && <span className="text-ink-500" title="Repeating order">↻ repeats</span>}
      </span>
    </Link>
  );
}

function Week({ from, today, orders, showYard, dayHref }: { from: string; today: string; orders: OrderListItem[]; showYard: boolean; dayHref: (d: string) => string }) {
  const days = Array.from({ length: 7 }, (_, i) => addDays(from, i));
  return (
    <div className="grid gap-2 lg:grid-cols-7" data-testid="calendar-week">
      {days.map((d) => {
        const list = orders.filter((o) => o.workDate === d);
        return (
          <section key={d} aria-label={fmtDate(d, { weekday: "long", month: "long", day: "numeric" })} className={`card p-2 lg:min-h-24 ${d === today ? "border-copper" : ""}`} data-date={d}>
            <h2 className="mb-2 flex items-baseline justify-between">
              <Link href={dayHref(d)} className="text-sm font-extrabold text-ink hover:text-copper">
                {fmtDate(d)}
              </Link>
              <span className="text-xs text-ink-500">
                {d === today ? "today · " : ""}
                {list.length || "no"} order{list.length === 1 ? "" : "s"}
              </span>
            </h2>
            <div className="space-y-1.5">
              {list.map((o) => (
                <Chip key={o.id} o={o} showYard={showYard} />
              ))}
            </div>
          </section>
        );
      })}
    </div>
  );
}

function Day({ date, orders, showYard }: { date: string; orders: OrderListItem[]; showYard: boolean }) {
  if (orders.length === 0) return <p className="card p-4 text-sm text-ink-500">No orders on this day.</p>;
  // The timeline spans the day's work in whole hours of the yard clock (05:00–19:00 at least).
  const hourOf = (local: string, sameDay: boolean) => (sameDay ? Number(local.slice(11, 13)) + Number(local.slice(14, 16)) / 60 : 24);
  const starts = orders.map((o) => hourOf(o.startLocal, true));
  const ends = orders.map((o) => hourOf(o.endLocal, o.endLocal.slice(0, 10) === date));
  const lo = Math.min(5, Math.floor(Math.min(...starts)));
  const hi = Math.max(19, Math.ceil(Math.max(...ends)));
  const pct = (h: number) => `${((h - lo) / (hi - lo)) * 100}%`;
  const ticks = Array.from({ length: hi - lo + 1 }, (_, i) => lo + i);
  return (
    <div className="card p-3" data-testid="calendar-day" data-date={date}>
      <div className="relative mb-2 hidden h-5 md:ml-[17.75rem] md:block" aria-hidden="true">
        {ticks.map((h) => (
          <span key={h} className="absolute -translate-x-1/2 text-xs tabular-nums text-ink-500" style={{ left: pct(h) }}>
            {String(h).padStart(2, "0")}
          </span>
        ))}
      </div>
      <ol className="space-y-2">
        {orders.map((o, i) => (
          <li key={o.id} className="md:flex md:items-center md:gap-3">
            <div className="md:w-[17rem] md:shrink-0">
              <Chip o={o} showYard={showYard} />
            </div>
            <div className="relative mt-1 h-6 flex-1 rounded bg-paper-200 md:mt-0" aria-hidden="true">
              {ticks.map((h) => (
                <span key={h} className="absolute top-0 h-full border-l border-rule" style={{ left: pct(h) }} />
              ))}
              <span
                className={`absolute top-1 h-4 rounded ${o.status === "cancelled" ? "bg-ink-300" : o.emergency ? "bg-copper" : "bg-ink"}`}
                style={{ left: pct(starts[i]), width: `calc(${pct(ends[i])} - ${pct(starts[i])})` }}
              />
            </div>
          </li>
        ))}
      </ol>
    </div>
  );
}
