import Link from "next/link";
import { SelectField, TextField } from "@/components/form/fields";
import { WorkerOptions } from "@/components/form/options";
import { requirePageRole } from "@/lib/auth/session";
import { db } from "@/lib/db";
import { Badge, PageHeader } from "@/components/status";
import { ActionButton } from "@/components/form-bits";
import { calendarToken, calendarUrlFor } from "@/lib/workers/data-calendar";
import { workerWeek, weekStart, type TimeKind } from "@/lib/time-records/data";
import { listWorkers } from "@/lib/workers/data";
import { addDays, todayIn } from "@/lib/time/days";
import { fmtDate } from "@/lib/format";
import { isIsoDate } from "@/lib/rules/time";
import { CalendarLink } from "@/components/calendar-link";
import { ManualForm } from "./manual-form";

export const metadata = { title: "Time" };

const KIND: Record<TimeKind, { word: string; tone: "info" | "clear" | "warn" | "muted" }> = {
  shift: { word: "Shift", tone: "muted" },
  order: { word: "Order", tone: "clear" },
  call_out: { word: "Call-out", tone: "warn" },
  manual: { word: "Entered by hand", tone: "info" },
};

const h = (n: number) => n.toFixed(2);

export default async function TimePage({ searchParams }: { searchParams: Promise<Record<string, string | undefined>> }) {
  const user = await requirePageRole("dispatcher", "supervisor", "hr", "admin", "lineworker");
  const sp = await searchParams;
  const conn = db();
  const own = user.role === "lineworker";
  const workers = own ? [] : await listWorkers(conn, user.organisationId, { activeOnly: true });
  const workerId = own ? user.workerId : Number(sp.worker) || null;
  const week = workerId ? await workerWeek(conn, user.organisationId, workerId, sp.week && isIsoDate(sp.week) ? sp.week : undefined) : null;
  const canEnter = ["dispatcher", "supervisor", "hr"].includes(user.role);
  const canLink = Boolean(week) && (own || user.role === "hr" || user.role === "admin");
  const token = canLink && workerId ? await calendarToken(conn, workerId) : null;
  const href = (w: string) => `/time?${new URLSearchParams({ ...(own ? {} : { worker: String(workerId) }), week: w })}`;

  return (
    <>
      <PageHeader eyebrow="Time" title={own ? "My time" : week ? `Time: ${week.worker.name}` : "Time worked"}>
        {week && (
          <div className="flex gap-1">
            <Link href={href(addDays(week.week, -7))} className="btn-quiet" aria-label="Previous week">
              ‹ Week
            </Link>
            <Link href={href(weekStart(todayIn(week.worker.timezone)))} className="btn-quiet">
              This week
            </Link>
            <Link href={href(addDays(week.week, 7))} className="btn-quiet" aria-label="Next week">
              Week ›
            </Link>
          </div>
        )}
      </PageHeader>

      {!own && (
        <form method="get" action="/time" className="card mb-4 flex flex-wrap items-end gap-3 p-3" aria-label="Pick worker and week">
          <SelectField id="t-worker" name="worker" label="Worker" wrapperClassName="min-w-64 flex-1" defaultValue={workerId ?? ""}>
            <WorkerOptions workers={workers} placeholder="Pick a worker…" emptyValue="" />
          </SelectField>
          <TextField id="t-week" type="date" name="week" label="Week of" defaultValue={week?.week ?? sp.week ?? ""} />
          <button type="submit" className="btn-primary">
            Show
          </button>
        </form>
      )}

      {!week ? (
        <p className="card p-4 text-sm text-ink-500">{own ? "Your sign-in is not linked to a worker." : "Pick a worker to see their week."}</p>
      ) : (
        <div className="grid gap-5 xl:grid-cols-[3fr_1fr]">
          <div className="space-y-4">
            <section className="card grid grid-cols-2 gap-3 p-4 sm:grid-cols-4" aria-label="Week totals" data-testid="week-totals">
              <Stat label="Worked this week" value={`${h(week.totals.hours)} h`} />
              <Stat label={`Over ${week.regularHoursDay} h a day`} value={`${h(week.totals.dailyOvertime)} h`} />
              <Stat label={`Over ${week.regularHoursWeek} h a week`} value={`${h(week.totals.weeklyOvertime)} h`} />
              <Stat label="Overtime" value={`${h(week.totals.overtime)} h`} strong={week.totals.overtime > 0} />
              <p className="col-span-2 text-xs text-ink-500 sm:col-span-4">
                Week of {fmtDate(week.week, { month: "long", day: "numeric", year: "numeric" })} · {week.worker.yardCode} clock ({week.worker.timezone}). Overlapping
                entries count once; work that crosses midnight counts on the day it started. Overtime is the hours beyond the regular day, plus regular-day hours
                beyond the regular week (policy).
              </p>
            </section>

            <section className="card overflow-x-auto" aria-label="Days">
              <table className="w-full text-left text-sm">
                <thead className="bg-paper-200 text-xs uppercase text-ink-500">
                  <tr>
                    <th className="px-3 py-2">Day</th>
                    <th className="px-3 py-2">Worked</th>
                    <th className="px-3 py-2 text-right">Hours</th>
                    <th className="px-3 py-2 text-right">Over {week.regularHoursDay} h</th>
                  </tr>
                </thead>
                <tbody>
                  {week.totals.days.map((d) => (
                    <tr key={d.date} className="border-t border-rule align-top" data-testid="time-day" data-date={d.date}>
                      <td className="whitespace-nowrap px-3 py-2 font-semibold">{fmtDate(d.date)}</td>
                      <td className="px-3 py-2">
                        {d.records.length === 0 && <span className="text-ink-500">—</span>}
                        <ul className="space-y-1.5">
                          {d.records.map((r) => (
                            <li key={r.id} className="flex flex-wrap items-center gap-2" data-testid="time-record">
                              <Badge tone={KIND[r.kind].tone}>{KIND[r.kind].word}</Badge>
                              <span className="tabular-nums">
                                {r.startLocal.slice(11)}–{r.endLocal.slice(0, 10) !== r.startLocal.slice(0, 10) ? `${fmtDate(r.endLocal.slice(0, 10))} ` : ""}
                                {r.endLocal.slice(11)} · {h(r.hours)} h
                              </span>
                              {r.orderId && (
                                <Link href={`/orders/${r.orderId}`} className="text-xs font-semibold text-copper hover:underline">
                                  {r.orderNumber}
                                </Link>
                              )}
                              {r.rotationName && <span className="text-xs text-ink-500">{r.rotationName}</span>}
                              {r.reason && <span className="text-xs text-ink-500">{r.reason}</span>}
                              {canEnter && (r.kind === "manual" || r.kind === "call_out") && (
                                <ActionButton url={`/api/time-records/${r.id}`} confirm="Remove this time? It no longer counts for rest." label="Remove" className="text-xs font-semibold text-block hover:underline" />
                              )}
                            </li>
                          ))}
                        </ul>
                      </td>
                      <td className="px-3 py-2 text-right font-semibold tabular-nums">{d.hours ? h(d.hours) : ""}</td>
                      <td className="px-3 py-2 text-right tabular-nums">{d.overRegular ? <span className="font-semibold text-warn">{h(d.overRegular)}</span> : ""}</td>
                    </tr>
                  ))}
                </tbody>
                <tfoot>
                  <tr className="border-t-2 border-ink">
                    <td className="px-3 py-2 font-bold" colSpan={2}>
                      Week
                    </td>
                    <td className="px-3 py-2 text-right font-bold tabular-nums">{h(week.totals.hours)}</td>
                    <td className="px-3 py-2 text-right font-bold tabular-nums">{h(week.totals.dailyOvertime)}</td>
                  </tr>
                </tfoot>
              </table>
            </section>
          </div>

          <div className="space-y-4">
            {canEnter && (
              <section className="card p-4">
                <h2 className="mb-1 text-lg font-extrabold tracking-tight">Enter time by hand</h2>
                <p className="mb-3 text-sm text-ink-700">For work not on an order or a call-out. Say why.</p>
                <ManualForm workerId={week.worker.id} defaults={{ start: `${week.week}T07:00`, end: `${week.week}T15:30` }} />
              </section>
            )}
            {canLink && (
              <section className="card p-4">
                <h2 className="mb-1 text-lg font-extrabold tracking-tight">Calendar feed</h2>
                <p className="mb-3 text-sm text-ink-700">{own ? "Your" : `${week.worker.name}'s`} orders in any calendar app that takes an iCalendar link.</p>
                <CalendarLink workerId={week.worker.id} url={token ? calendarUrlFor(token) : null} self={own} />
              </section>
            )}
          </div>
        </div>
      )}
    </>
  );
}

function Stat({ label, value, strong }: { label: string; value: string; strong?: boolean }) {
  return (
    <div>
      <p className="label">{label}</p>
      <p className={`text-xl font-extrabold tabular-nums ${strong ? "text-warn" : ""}`}>{value}</p>
    </div>
  );
}
