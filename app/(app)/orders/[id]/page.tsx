import Link from "next/link";
import { notFound } from "next/navigation";
import { requirePageRole } from "@/lib/auth/session";
import { db } from "@/lib/db";
import { Badge, PageHeader } from "@/components/status";
import { getOrder, parseJson } from "@/lib/orders/data";
import { listWorkTypes } from "@/lib/orders/data-work-types";
import { listYards } from "@/lib/yards/data";
import { todayIn } from "@/lib/time/days";
import { zoneAbbreviation } from "@/lib/time/zoned-format";
import { fmtDate, POSITION_LABEL } from "@/lib/format";
import { editValuesFromView } from "@/lib/orders/form";
import { locateBadgeLabel } from "@/lib/orders/locate";
import { energyLabel } from "@/lib/orders/voltage";
import { seriesTemplateText, type SeriesTemplate } from "@/lib/orders/data-series";
import { CREW_EXCEPTION_LABEL, STATUS_LABEL, STATUS_TONE } from "@/lib/orders/status";
import { floating, floatingToLocal, repeatFormFrom } from "@/lib/time/recurrence";
import { OrderForm, type OrderFormShape } from "../order-form";
import { OrderFigures } from "./figures";
import { OrderFindings } from "./findings";

export const metadata = { title: "Work order" };

const SEAT_STATE: Record<string, string> = {
  draft: "placed, not sent",
  sent: "sent, no answer yet",
  delivered: "delivered, no answer yet",
  confirmed: "confirmed",
};

export default async function OrderPage({ params, searchParams }: { params: Promise<{ id: string }>; searchParams: Promise<Record<string, string | undefined>> }) {
  const user = await requirePageRole("dispatcher", "supervisor", "admin");
  const id = Number((await params).id);
  const sp = await searchParams;
  if (!Number.isInteger(id) || id <= 0) notFound();
  const conn = db();
  const order = await getOrder(conn, user.organisationId, id);
  if (!order) notFound();
  const [yards, workTypes] = await Promise.all([listYards(conn, user.organisationId), listWorkTypes(conn, user.organisationId)]);
  const yardOptions = yards.map((y) => ({ id: y.id, code: y.code, name: y.name, timezone: y.timezone }));
  const readOnly = user.role === "admin";
  const today = todayIn(order.timezone);

  let seriesInitial: OrderFormShape | null = null;
  if (order.series) {
    const t = parseJson<SeriesTemplate | null>(await seriesTemplateText(conn, order.series.id), null);
    if (t) {
      const start = order.series.dtstartLocal.slice(0, 16);
      seriesInitial = {
        title: t.title,
        yardId: order.yardId,
        workTypeId: t.workTypeId,
        address: t.address,
        structureNo: t.structureNo,
        start,
        end: floatingToLocal(floating(start) + order.series.durationMinutes * 60_000).slice(0, 16),
        energized: t.energized,
        voltageKv: t.voltageKv,
        nearEnergizedKv: t.nearEnergizedKv ?? null,
        phases: t.phases ?? 3,
        systemKv: t.systemKv ?? null,
        emergency: t.emergency,
        crewException: (t.crewException as OrderFormShape["crewException"]) ?? null,
        minCrew: t.minCrew,
        positions: t.positions.map((position) => ({ position })),
        priority: t.priority,
        notes: t.notes,
        status: t.status === "draft" ? "draft" : "planned",
        holdReason: null,
        driverLicence: (t.driverLicence as OrderFormShape["driverLicence"]) ?? null,
        locateTicket: t.locateTicket,
        locateValidThrough: t.locateValidThrough,
        actualStart: null,
        actualEnd: null,
        recurrence: { rrule: order.series.rrule, exdates: order.series.exdates },
        version: order.series.version,
      };
    }
  }
  const locate = locateBadgeLabel(order);
  const created = Number(sp.created ?? 0);

  return (
    <>
      <PageHeader eyebrow={`Work order ${order.number}`} title={order.title}>
        <Link href={`/orders/calendar?${new URLSearchParams({ yard: order.yardCode, date: order.workDate, view: "day" })}`} className="btn-quiet">
          Day on the calendar
        </Link>
        <Link href="/orders" className="btn-quiet">
          All orders
        </Link>
      </PageHeader>

      {created > 1 && (
        <p role="status" className="mb-4 rounded-md bg-clear-bg px-3 py-2 text-sm font-medium text-clear">
          ✓ Repeating order created: {created} orders made through the next weeks; more appear as the days come nearer.
        </p>
      )}

      <OrderFindings organisationId={user.organisationId} orderId={order.id} />
      <section className="card mb-4 grid gap-4 p-4 md:grid-cols-[2fr_1fr]" aria-label="Summary">
        <div className="space-y-2">
          <div className="flex flex-wrap gap-1.5">
            <Badge tone={STATUS_TONE[order.status]}>{STATUS_LABEL[order.status]}</Badge>
            {order.emergency && <Badge tone="warn">Emergency</Badge>}
            {order.series && <Badge tone="muted">Repeats · {order.series.description}</Badge>}
            {order.detached && <Badge tone="muted">Edited on its own</Badge>}
          </div>
          {locate && (
            <p className="rounded-md bg-warn-bg px-3 py-2 text-sm font-semibold text-warn" data-testid="locate-warning">
              <span aria-hidden="true">▲ </span>
              {order.locateWarning}
            </p>
          )}
          {order.status === "on_hold" && order.holdReason && (
            <p className="rounded-md bg-warn-bg px-3 py-2 text-sm font-semibold text-warn">▲ On hold: {order.holdReason}</p>
          )}
          <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
            <dt className="text-ink-500">When</dt>
            <dd className="font-semibold">
              {fmtDate(order.workDate)} · {order.startLocal.slice(11)}–{order.endLocal.slice(11)}
              {order.endLocal.slice(0, 10) !== order.workDate ? ` (ends ${fmtDate(order.endLocal.slice(0, 10))})` : ""} · {zoneAbbreviation(order.start, order.timezone)} ({order.yardName})
            </dd>
            <dt className="text-ink-500">Where</dt>
            <dd>
              {order.address ?? "—"}
              {order.structureNo ? ` · pole ${order.structureNo}` : ""}
            </dd>
            <dt className="text-ink-500">Work</dt>
            <dd>
              {order.workTypeName} · <span data-testid="order-energy">{energyLabel(order)}</span>
              {order.crewException ? ` · exception: ${CREW_EXCEPTION_LABEL[order.crewException]}` : ""}
            </dd>
            {order.shifts.length > 0 && (
              <>
                <dt className="text-ink-500">Shifts</dt>
                <dd data-testid="order-shift-list">
                  {order.shifts.map((s, i) => (
                    <span key={i} className="block">
                      {fmtDate(s.startLocal.slice(0, 10))} {s.startLocal.slice(11, 16)}–{s.endLocal.slice(11, 16)}
                      {s.endLocal.slice(0, 10) !== s.startLocal.slice(0, 10) ? " (next day)" : ""}
                    </span>
                  ))}
                </dd>
              </>
            )}
            <dt className="text-ink-500">Crew</dt>
            <dd>
              {order.staffed} of {order.positions} positions filled{order.minCrew ? ` · minimum ${order.minCrew} on site` : ""}
            </dd>
          </dl>
        </div>
        <div>
          <h2 className="mb-1 text-sm font-bold">Positions</h2>
          <ul className="space-y-1 text-sm">
            {order.seats.map((s) => (
              <li key={s.id} className="flex justify-between gap-2 border-b border-rule pb-1 last:border-0">
                <span className="font-semibold">{POSITION_LABEL[s.position]}</span>
                <span className="text-right text-ink-700">
                  {s.worker ? (
                    <>
                      {s.worker.name} <span className="text-xs text-ink-500">({SEAT_STATE[s.worker.status] ?? s.worker.status})</span>
                    </>
                  ) : (
                    <span className="text-ink-500">open</span>
                  )}
                </span>
              </li>
            ))}
          </ul>
          <p className="mt-2 text-xs text-ink-500">People are placed on the Board.</p>
          {order.timeRecords.length > 0 && (
            <>
              <h2 className="mb-1 mt-3 text-sm font-bold">Time recorded</h2>
              <ul className="text-sm">
                {order.timeRecords.map((t) => (
                  <li key={t.id}>
                    {t.workerName}: {t.startLocal.replace("T", " ")} – {t.endLocal.slice(11)} ({t.hours} h)
                  </li>
                ))}
              </ul>
            </>
          )}
        </div>
      </section>

      <OrderFigures conn={conn} organisationId={user.organisationId} order={order} canEdit={!readOnly && order.status !== "cancelled"} />

      <h2 className="mb-2 text-lg font-extrabold tracking-tight">{readOnly ? "Details" : "Edit this order"}</h2>
      {order.series && !readOnly && (
        <p className="mb-3 text-xs text-ink-500">Changes here apply to this day only; later edits to the series leave this order as you made it.</p>
      )}
      <OrderForm
        mode="edit"
        yards={yardOptions}
        workTypes={workTypes}
        initial={editValuesFromView(order)}
        seats={order.seats}
        orderId={order.id}
        readOnly={readOnly || order.status === "cancelled"}
      />

      {order.series && seriesInitial && !readOnly && (
        <details className="mt-6" open={sp.series === "1"}>
          <summary className="cursor-pointer text-lg font-extrabold tracking-tight">
            Edit the whole series <span className="text-sm font-semibold text-ink-500">({order.series.description})</span>
          </summary>
          <p className="my-3 text-sm text-ink-700">
            Saving replaces the future orders of this series that nobody is on yet and that were not edited on their own. Orders
            with people placed, started, or edited on their own stay as they are; you get a list to review.
          </p>
          {order.series.active ? (
            <OrderForm
              mode="series"
              yards={yardOptions}
              workTypes={workTypes}
              initial={seriesInitial}
              seriesId={order.series.id}
              initialRepeat={repeatFormFrom(order.series.rrule, seriesInitial.start.slice(0, 10))}
              today={today}
            />
          ) : (
            <p className="card p-4 text-sm text-ink-500">This series has ended. Its orders that were kept stay on record.</p>
          )}
        </details>
      )}
    </>
  );
}
