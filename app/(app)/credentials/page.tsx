import { requirePageRole } from "@/lib/auth/session";
import { db } from "@/lib/db";
import { listCurrentCredentials } from "@/lib/data/credentials";
import { PageHeader } from "@/components/status";
import { DaysLeft } from "@/components/days-left";
import { daysBetween } from "@/lib/format";
import { todayIn } from "@/lib/data/yards";

export const metadata = { title: "Credentials" };

export default async function CredentialsPage() {
  const user = await requirePageRole("hr", "admin", "supervisor");
  const rows = await listCurrentCredentials(db(), user.organisationId);
  const today = todayIn("America/Chicago");
  return (
    <>
      <PageHeader eyebrow="Credentials" title="Qualifications on file" />
      <div className="card overflow-x-auto">
        <table className="w-full text-left text-sm">
          <thead className="bg-paper-200 text-xs uppercase text-ink-500">
            <tr>
              <th className="px-3 py-2">Worker</th>
              <th className="px-3 py-2">Yard</th>
              <th className="px-3 py-2">Qualification</th>
              <th className="px-3 py-2">Issued</th>
              <th className="px-3 py-2">Expires</th>
              <th className="px-3 py-2">Days left</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.id} className="border-t border-rule">
                <td className="px-3 py-2 font-semibold">{r.workerName}</td>
                <td className="px-3 py-2">{r.yardCode}</td>
                <td className="px-3 py-2">{r.typeName}</td>
                <td className="px-3 py-2 tabular-nums">{r.issuedOn}</td>
                <td className="px-3 py-2 tabular-nums">{r.expiresOn ?? "—"}</td>
                <td className="px-3 py-2">
                  <DaysLeft days={r.expiresOn ? daysBetween(today, r.expiresOn) : null} />
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </>
  );
}
