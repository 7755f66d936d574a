import Link from "next/link";
import { notFound, redirect } from "next/navigation";
import { requirePageRole } from "@/lib/auth/session";
import { CAN_KEEP_CREDENTIALS } from "@/lib/users/roles";
import { db } from "@/lib/db";
import { workerCredentials } from "@/lib/credentials/data";
import { listTypes } from "@/lib/credentials/data-qualification-types";
import { getWorker } from "@/lib/workers/data";
import { todayIn } from "@/lib/time/days";
import { CLASSIFICATION_LABEL } from "@/lib/format";
import { Badge, PageHeader } from "@/components/status";
import { CredentialState } from "@/components/credential-state";
import { WorkerDesk } from "./worker-desk";
import { GearSection } from "./gear-section";
import { listGear } from "@/lib/gear/data";

export const metadata = { title: "Worker credentials" };

export default async function WorkerCredentialsPage({ params }: { params: Promise<{ workerId: string }> }) {
  const user = await requirePageRole("hr", "admin", "supervisor", "lineworker");
  const raw = (await params).workerId;
  const id = /^\d{1,10}$/.test(raw) ? Number(raw) : NaN;
  // A lineworker opens only their own page; anything else is refused before any lookup.
  if (user.role === "lineworker" && user.workerId !== id) redirect("/forbidden?from=/me");
  if (!Number.isSafeInteger(id)) notFound();
  const worker = await getWorker(db(), user.organisationId, id);
  if (!worker) notFound();
  const [creds, types, gear] = await Promise.all([
    workerCredentials(db(), user.organisationId, id),
    listTypes(db(), user.organisationId),
    listGear(db(), user.organisationId, { workerId: id, view: undefined }).then(async (inService) => [
      ...inService,
      ...(await listGear(db(), user.organisationId, { workerId: id, view: "retired" })),
    ]),
  ]);
  const canEdit = CAN_KEEP_CREDENTIALS.includes(user.role);
  const isOwn = user.role === "lineworker";
  const today = todayIn(worker.timezone);

  return (
    <>
      <PageHeader eyebrow={isOwn ? "My credentials" : "Credentials"} title={worker.name}>
        {isOwn ? (
          <Link href="/me" className="btn-quiet">
            Back to My week
          </Link>
        ) : (
          <Link href="/credentials" className="btn-quiet">
            All credentials
          </Link>
        )}
        {canEdit && (
          <Link href={`/roster?edit=${worker.id}`} className="btn-quiet">
            Edit worker
          </Link>
        )}
      </PageHeader>
      <p className="mb-5 flex flex-wrap items-center gap-x-3 gap-y-1 text-sm text-ink-700">
        <span className="tabular-nums font-semibold">{worker.employeeNo}</span>
        <span>{CLASSIFICATION_LABEL[worker.classification] ?? worker.classification}</span>
        <span>
          {worker.yardName} ({worker.yardCode})
        </span>
        {!worker.active && <Badge tone="muted">Inactive</Badge>}
        <span className="text-ink-500">Today in the yard: {today}</span>
      </p>

      <WorkerDesk
        worker={{ id: worker.id, name: worker.name }}
        current={creds.current}
        pending={creds.pending}
        types={types.map((t) => ({ id: t.id, code: t.code, name: t.name, renewalMonths: t.renewalMonths, needsEvidence: t.needsEvidence }))}
        today={today}
        mode={canEdit ? "hr" : isOwn ? "own" : "read"}
      />

      <GearSection workerId={worker.id} items={gear} today={today} canEdit={canEdit} />

      <section className="mt-8" aria-labelledby="history-h">
        <h2 id="history-h" className="mb-2 text-base font-bold">
          History
        </h2>
        {creds.history.length === 0 ? (
          <p className="text-sm text-ink-500">No earlier records.</p>
        ) : (
          <>
          <ul className="space-y-2 md:hidden">
            {creds.history.map((c) => (
              <li key={c.id} className="card p-3" data-testid={`history-card-${c.type}`}>
                <div className="flex items-start justify-between gap-2">
                  <p className="font-semibold">{c.typeName}</p>
                  <CredentialState status={c.status} daysLeft={c.daysLeft} warnDays={c.warnDays} />
                </div>
                <p className="text-sm text-ink-700 tabular-nums">
                  Issued {c.issuedOn} · last valid day {c.expiresOn ?? "none"}
                </p>
                <p className="text-xs text-ink-500">
                  {c.verifiedByName ?? c.createdByName ?? ""} {(c.verifiedAt ?? c.createdAt).slice(0, 10)}
                  {c.note ? ` · ${c.note}` : ""}
                </p>
              </li>
            ))}
          </ul>
          <div className="card hidden overflow-x-auto md:block">
            <table className="w-full text-left text-sm">
              <thead className="bg-paper-200 text-xs uppercase text-ink-500">
                <tr>
                  <th className="px-3 py-2">Qualification</th>
                  <th className="px-3 py-2">Issued</th>
                  <th className="px-3 py-2">Last valid day</th>
                  <th className="px-3 py-2">State</th>
                  <th className="px-3 py-2">Evidence</th>
                  <th className="px-3 py-2">Recorded</th>
                  <th className="px-3 py-2">Note</th>
                </tr>
              </thead>
              <tbody>
                {creds.history.map((c) => (
                  <tr key={c.id} className="border-t border-rule align-top" data-testid={`history-${c.type}`}>
                    <td className="px-3 py-2 font-semibold">{c.typeName}</td>
                    <td className="px-3 py-2 tabular-nums">{c.issuedOn}</td>
                    <td className="px-3 py-2 tabular-nums">{c.expiresOn ?? "No expiry"}</td>
                    <td className="px-3 py-2">
                      <CredentialState status={c.status} daysLeft={c.daysLeft} warnDays={c.warnDays} />
                    </td>
                    <td className="px-3 py-2">
                      {c.evidenceFileId ? (
                        <a className="font-semibold text-copper hover:underline" href={`/api/files/${c.evidenceFileId}`}>
                          {c.evidenceName ?? "Evidence"}
                        </a>
                      ) : (
                        <span className="text-ink-500">—</span>
                      )}
                    </td>
                    <td className="px-3 py-2 text-ink-700">
                      {c.verifiedByName ?? c.createdByName ?? "—"}
                      <span className="block text-xs text-ink-500">{(c.verifiedAt ?? c.createdAt).slice(0, 10)}</span>
                    </td>
                    <td className="px-3 py-2 text-ink-700">{c.note ?? ""}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          </>
        )}
      </section>
    </>
  );
}
