import { requirePageRole } from "@/lib/auth/session";
import { db } from "@/lib/db";
import { listWorkers } from "@/lib/data/workers";
import { Badge, PageHeader } from "@/components/status";
import { CLASSIFICATION_LABEL } from "@/lib/format";

export const metadata = { title: "Roster" };

export default async function RosterPage() {
  const user = await requirePageRole("hr", "admin", "dispatcher", "supervisor");
  const workers = await listWorkers(db(), user.organisationId);
  return (
    <>
      <PageHeader eyebrow="Roster" title={`Workers (${workers.length})`} />
      <div className="card overflow-x-auto">
        <table className="w-full text-left text-sm">
          <thead className="bg-paper-200 text-xs uppercase text-ink-500">
            <tr>
              <th className="px-3 py-2">Emp. no</th>
              <th className="px-3 py-2">Name</th>
              <th className="px-3 py-2">Classification</th>
              <th className="px-3 py-2">Yard</th>
              <th className="px-3 py-2">Phone</th>
              <th className="px-3 py-2">E-mail</th>
              <th className="px-3 py-2">Texts</th>
              <th className="px-3 py-2">State</th>
            </tr>
          </thead>
          <tbody>
            {workers.map((w) => (
              <tr key={w.id} className="border-t border-rule">
                <td className="px-3 py-2 tabular-nums">{w.employeeNo}</td>
                <td className="px-3 py-2 font-semibold">{w.name}</td>
                <td className="px-3 py-2">{CLASSIFICATION_LABEL[w.classification]}</td>
                <td className="px-3 py-2">{w.yardCode}</td>
                <td className="px-3 py-2 tabular-nums">{w.phone ?? "—"}</td>
                <td className="px-3 py-2">{w.email ?? "—"}</td>
                <td className="px-3 py-2">{w.smsOptIn ? "Yes" : "Opted out"}</td>
                <td className="px-3 py-2">{w.active ? <Badge tone="clear">Active</Badge> : <Badge tone="muted">Inactive</Badge>}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </>
  );
}
