import { requirePageRole } from "@/lib/auth/session";
import { db } from "@/lib/db";
import { listAudit } from "@/lib/data/audit";
import { PageHeader } from "@/components/status";

export const metadata = { title: "Audit" };

export default async function AuditPage({ searchParams }: { searchParams: Promise<{ action?: string; entity?: string }> }) {
  const user = await requirePageRole("supervisor", "admin");
  const sp = await searchParams;
  const action = sp.action?.slice(0, 60) || undefined;
  const entity = sp.entity?.slice(0, 40) || undefined;
  const rows = await listAudit(db(), { organisationId: user.organisationId, action, entity, limit: 300 });
  const actions = await db()("audit_log").where({ organisation_id: user.organisationId }).distinct("action").orderBy("action");
  return (
    <>
      <PageHeader eyebrow="Audit" title="Who did what" />
      <form className="mb-4 flex flex-wrap items-end gap-3" method="get">
        <div>
          <label className="label" htmlFor="action">
            Action
          </label>
          <select id="action" name="action" defaultValue={action ?? ""} className="field">
            <option value="">All actions</option>
            {actions.map((a) => (
              <option key={a.action} value={a.action}>
                {a.action}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label className="label" htmlFor="entity">
            Record
          </label>
          <select id="entity" name="entity" defaultValue={entity ?? ""} className="field">
            <option value="">All records</option>
            {["assignment", "override", "work_order", "credential", "worker", "policy", "send"].map((e) => (
              <option key={e} value={e}>
                {e}
              </option>
            ))}
          </select>
        </div>
        <button className="btn-quiet" type="submit">
          Filter
        </button>
      </form>
      <div className="card overflow-x-auto">
        <table className="w-full text-left text-sm">
          <thead className="bg-paper-200 text-xs uppercase text-ink-500">
            <tr>
              <th className="px-3 py-2">When (UTC)</th>
              <th className="px-3 py-2">Who</th>
              <th className="px-3 py-2">Action</th>
              <th className="px-3 py-2">Record</th>
              <th className="px-3 py-2">Detail</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.id} className="border-t border-rule align-top">
                <td className="whitespace-nowrap px-3 py-2">{new Date(r.created_at).toISOString().slice(0, 16).replace("T", " ")}</td>
                <td className="px-3 py-2">{r.actor_name ?? "system"}</td>
                <td className="px-3 py-2 font-semibold">{r.action}</td>
                <td className="px-3 py-2">
                  {r.entity} {r.entity_id}
                </td>
                <td className="max-w-md break-words px-3 py-2 text-xs text-ink-700">
                  {typeof r.detail === "string" ? r.detail : JSON.stringify(r.detail)}
                </td>
              </tr>
            ))}
            {rows.length === 0 && (
              <tr>
                <td colSpan={5} className="px-3 py-6 text-center text-ink-500">
                  Nothing recorded yet.
                </td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
    </>
  );
}
