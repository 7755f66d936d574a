import Link from "next/link";
import { requirePageRole } from "@/lib/auth/session";
import { db } from "@/lib/db";
import { Badge, PageHeader } from "@/components/status";
import { ActionButton } from "@/components/form-bits";
import { fmtLocal } from "@/lib/time/zoned-format";
import { listRotations } from "@/lib/rotations/data";
import { listWorkers } from "@/lib/workers/data";
import { recentCallOuts } from "@/lib/time-records/data";
import { listYards } from "@/lib/yards/data";
import { addDays, todayIn } from "@/lib/time/days";
import { epochToZonedWallTime } from "@/lib/rules/time";
import { CallOutForm } from "./call-out-form";
import { EditRotation } from "./edit-rotation";
import { RotationForm } from "./rotation-form";

export const metadata = { title: "Rotations" };

export default async function RotationsPage() {
  const user = await requirePageRole("dispatcher", "supervisor", "hr", "admin");
  const conn = db();
  const [rotations, yards, workers] = await Promise.all([
    listRotations(conn, user.organisationId),
    listYards(conn, user.organisationId),
    listWorkers(conn, user.organisationId, { activeOnly: true }),
  ]);
  const canEdit = user.role === "dispatcher" || user.role === "supervisor";
  const home = yards.find((y) => y.id === user.homeYardId) ?? yards[0];
  // The user's own yard first.
  rotations.sort((a, b) => Number(b.yardId === home.id) - Number(a.yardId === home.id));
  const today = todayIn(home.timezone);
  const yardOptions = yards.map((y) => ({ id: y.id, code: y.code, name: y.name, timezone: y.timezone }));
  const workerOptions = workers.map((w) => ({ id: w.id, name: w.name, employeeNo: w.employeeNo, yardId: w.yardId, yardCode: w.yardCode }));
  const recent = await recentCallOuts(conn, user.organisationId);

  return (
    <>
      <PageHeader eyebrow="Rotations" title="On call and call-outs" />

      <section aria-label="On call now" className="mb-5 grid gap-3 md:grid-cols-2">
        {rotations.filter((r) => r.active).map((r) => (
          <div key={r.id} className="card flex items-center justify-between gap-3 p-4" data-testid="on-call-now">
            <div>
              <p className="text-xs font-bold uppercase tracking-widest text-copper">{r.name} · on call now</p>
              <p className="text-lg font-extrabold">{r.now ? r.now.name : "Nobody"}</p>
              {r.now && (
                <p className="text-sm text-ink-700">
                  until {fmtLocal(r.now.to, r.timezone)} · {r.now.hours} h period
                </p>
              )}
            </div>
            {r.now ? <Badge tone="info">On call</Badge> : <Badge tone="warn">No one</Badge>}
          </div>
        ))}
      </section>

      <div className="grid gap-5 xl:grid-cols-[3fr_2fr]">
        <div className="space-y-4">
          {rotations.map((r) => (
            <section key={r.id} className="card p-4" aria-label={r.name}>
              <div className="mb-3 flex flex-wrap items-start justify-between gap-2">
                <div>
                  <h2 className="text-lg font-extrabold tracking-tight">{r.name}</h2>
                  <p className="text-sm text-ink-700">
                    {r.yardCode} · hands over {r.description.charAt(0).toLowerCase() + r.description.slice(1)} at {r.dtstartLocal.slice(11, 16)} ({r.timezone}) · first hand-over{" "}
                    {r.dtstartLocal.slice(0, 10)}
                  </p>
                </div>
                {!r.active && <Badge tone="muted">Paused</Badge>}
                {r.problem && <Badge tone="block">{r.problem}</Badge>}
              </div>
              <div className="grid gap-4 md:grid-cols-2">
                <div>
                  <h3 className="label">Turn order</h3>
                  <ol className="space-y-1 text-sm">
                    {r.members.map((m, i) => (
                      <li key={m.workerId} className="flex items-center gap-2">
                        <span className="w-5 text-right font-bold tabular-nums text-ink-500">{i + 1}</span>
                        <span className="font-semibold">{m.name}</span>
                        <span className="text-xs text-ink-500">{m.employeeNo}</span>
                        {r.now?.workerId === m.workerId && <Badge tone="info">On call</Badge>}
                      </li>
                    ))}
                  </ol>
                </div>
                <div>
                  <h3 className="label">Now and next</h3>
                  <ul className="space-y-1 text-sm">
                    {r.upcoming.map((p) => (
                      <li key={p.from} className="tabular-nums">
                        <strong>{p.name}</strong>
                        <span className="block text-xs text-ink-700">
                          {fmtLocal(p.from, r.timezone)} → {fmtLocal(p.to, r.timezone)} · {p.hours} h
                        </span>
                      </li>
                    ))}
                  </ul>
                </div>
              </div>
              {canEdit && (
                <div className="mt-4 border-t border-rule pt-3">
                  <EditRotation
                    yards={yardOptions}
                    workers={workerOptions}
                    rotationId={r.id}
                    version={r.version}
                    name={r.name}
                    initial={{
                      name: r.name,
                      yardId: r.yardId,
                      rrule: r.rrule,
                      dtstartLocal: r.dtstartLocal.slice(0, 16),
                      active: r.active,
                      memberIds: r.members.map((m) => m.workerId),
                    }}
                  />
                </div>
              )}
            </section>
          ))}
          {rotations.length === 0 && <p className="card p-4 text-sm text-ink-500">No rotations yet.</p>}
          {canEdit && (
            <details className="card p-4">
              <summary className="cursor-pointer font-bold">New rotation</summary>
              <div className="mt-3">
                <RotationForm
                  yards={yardOptions}
                  workers={workerOptions}
                  initial={{ name: "", yardId: home.id, rrule: "FREQ=WEEKLY;BYDAY=MO", dtstartLocal: `${today}T07:00`, active: true, memberIds: [] }}
                />
              </div>
            </details>
          )}
        </div>

        <div className="space-y-4">
          {canEdit && (
            <section className="card p-4">
              <h2 className="mb-1 text-lg font-extrabold tracking-tight">Record a call-out</h2>
              <p className="mb-3 text-sm text-ink-700">The time counts as worked time for the rest check on the next days&apos; boards.</p>
              <CallOutForm
                workers={workerOptions}
                rotations={rotations
                  .filter((r) => r.active)
                  .map((r) => ({ id: r.id, name: r.name, yardId: r.yardId, timezone: r.timezone, onCallWorkerId: r.now?.workerId ?? null }))}
                defaults={{ start: `${today}T22:00`, end: `${addDays(today, 1)}T03:00` }}
              />
            </section>
          )}
          <section className="card p-4">
            <h2 className="mb-2 text-lg font-extrabold tracking-tight">Call-outs, last 14 days</h2>
            {recent.length === 0 ? (
              <p className="text-sm text-ink-500">None recorded.</p>
            ) : (
              <ul className="divide-y divide-rule text-sm">
                {recent.map((c) => {
                  const s = new Date(c.start_at).getTime();
                  const e = new Date(c.end_at).getTime();
                  return (
                    <li key={c.id} className="flex items-start justify-between gap-2 py-2">
                      <div>
                        <Link href={`/time?${new URLSearchParams({ worker: String(c.worker_id), week: epochToZonedWallTime(s, c.timezone).slice(0, 10) })}`} className="font-semibold text-ink hover:text-copper">
                          {c.first_name} {c.last_name}
                        </Link>
                        <span className="block text-xs text-ink-700 tabular-nums">
                          {fmtLocal(s, c.timezone)} → {fmtLocal(e, c.timezone, { weekday: undefined, month: undefined, day: undefined })} · {Math.round(((e - s) / 3_600_000) * 100) / 100} h
                          {c.rotation_name ? ` · ${c.rotation_name}` : ""}
                        </span>
                        {c.reason && <span className="block text-xs text-ink-500">{c.reason}</span>}
                      </div>
                      {canEdit && <ActionButton url={`/api/time-records/${c.id}`} confirm="Remove this call-out? Its time no longer counts for rest." label="Remove" className="btn-quiet px-2 py-1 text-xs" />}
                    </li>
                  );
                })}
              </ul>
            )}
          </section>
        </div>
      </div>
    </>
  );
}
