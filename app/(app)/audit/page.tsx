import { requirePageRole } from "@/lib/auth/session";
import { SelectField, TextField } from "@/components/form/fields";
import { db } from "@/lib/db";
import { auditFilterChoices, listAudit } from "@/lib/audit/data";
import { orderIdByNumber, orderNumbers } from "@/lib/orders/data";
import { firstYard } from "@/lib/yards/data";
import { PageHeader } from "@/components/status";
import { fmtDateTimeZone } from "@/lib/format";
import { actionLabel, auditSentence } from "@/lib/audit/model";
import { zonedWallTimeToEpoch } from "@/lib/rules/time";
import { addDays } from "@/lib/time/days";

export const metadata = { title: "Audit" };

const DAY = /^\d{4}-\d{2}-\d{2}$/;

// Issue 18: plain sentences, times in the yard's zone with its abbreviation, filters by date,
// person, order and action; the raw detail stays under "details".
export default async function AuditPage({
  searchParams,
}: {
  searchParams: Promise<{ action?: string; entity?: string; actor?: string; order?: string; from?: string; to?: string }>;
}) {
  const user = await requirePageRole("supervisor", "admin");
  const sp = await searchParams;
  const action = sp.action?.slice(0, 60) || undefined;
  const entity = sp.entity?.slice(0, 40) || undefined;
  const actor = /^\d{1,9}$/.test(sp.actor ?? "") ? Number(sp.actor) : undefined;
  const order = sp.order?.trim().slice(0, 40) || undefined;
  const fromDay = DAY.test(sp.from ?? "") ? sp.from : undefined;
  const toDay = DAY.test(sp.to ?? "") ? sp.to : undefined;
  const yard = await firstYard(db(), user.organisationId);
  const tz: string = yard?.timezone ?? "UTC";
  const safeEpoch = (day: string | undefined) => {
    if (!day) return undefined;
    try {
      return new Date(zonedWallTimeToEpoch(`${day}T00:00`, tz));
    } catch {
      return undefined;
    }
  };
  const rowsAll = await listAudit(db(), {
    organisationId: user.organisationId,
    action,
    entity,
    actorUserId: actor,
    from: safeEpoch(fromDay),
    to: safeEpoch(toDay ? addDays(toDay, 1) : undefined),
    limit: order ? 1000 : 300,
  });
  // An order's rows: its own (work_order id) and those whose detail names its number.
  const orderId = order ? await orderIdByNumber(db(), user.organisationId, order) : null;
  const rows = order
    ? rowsAll.filter((r: Record<string, any>) => (r.entity === "work_order" && orderId !== null && Number(r.entity_id) === orderId) || JSON.stringify(r.detail ?? "").includes(order))
    : rowsAll;
  const orderIds = [...new Set(rows.filter((r: Record<string, any>) => r.entity === "work_order" && r.entity_id).map((r: Record<string, any>) => Number(r.entity_id)))];
  const [numbers, { actions, people }] = await Promise.all([
    orderNumbers(db(), user.organisationId, orderIds),
    auditFilterChoices(db(), user.organisationId),
  ]);
  return (
    <>
      <PageHeader eyebrow="Audit" title="Who did what" />
      <form className="mb-4 grid gap-3 sm:flex sm:flex-wrap sm:items-end" method="get" aria-label="Filter the audit log">
        <TextField id="from" name="from" type="date" label="From" defaultValue={fromDay ?? ""} />
        <TextField id="to" name="to" type="date" label="To" defaultValue={toDay ?? ""} />
        <SelectField id="actor" name="actor" label="Person" defaultValue={actor ? String(actor) : ""}>
          <option value="">Everyone</option>
          {people.map((p: { id: number; name: string }) => (
            <option key={p.id} value={p.id}>
              {p.name}
            </option>
          ))}
        </SelectField>
        <TextField id="order" name="order" label="Order" placeholder="WO-26-0101" defaultValue={order ?? ""} />
        <SelectField id="action" name="action" label="Action" defaultValue={action ?? ""}>
          <option value="">All actions</option>
          {actions.map((a: { action: string }) => (
            <option key={a.action} value={a.action}>
              {actionLabel(a.action)}
            </option>
          ))}
        </SelectField>
        {entity && <input type="hidden" name="entity" value={entity} />}
        <button className="btn-quiet" type="submit">
          Filter
        </button>
      </form>
      <p className="mb-2 text-xs text-ink-500">Times on {yard?.name ?? "the yard"}&apos;s clock.</p>
      <div className="card overflow-x-auto">
        <table className="w-full text-left text-sm" data-testid="audit-table">
          <thead className="bg-paper-200 text-xs uppercase text-ink-700">
            <tr>
              <th className="px-3 py-2">When</th>
              <th className="px-3 py-2">What happened</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r: Record<string, any>) => (
              <tr key={r.id} className="border-t border-rule align-top" data-action={r.action}>
                <td className="whitespace-nowrap px-3 py-2">{fmtDateTimeZone(new Date(r.created_at), tz)}</td>
                <td className="px-3 py-2">
                  <p>{auditSentence({ ...(r as Record<string, never>), action: String(r.action), order_number: r.entity === "work_order" ? (numbers.get(Number(r.entity_id)) ?? null) : null })}</p>
                  <details className="mt-0.5 text-xs text-ink-700">
                    <summary className="cursor-pointer">details</summary>
                    <p className="mt-1 break-words font-mono">
                      {r.action} · {r.entity} {r.entity_id} · {typeof r.detail === "string" ? r.detail : JSON.stringify(r.detail)}
                    </p>
                  </details>
                </td>
              </tr>
            ))}
            {rows.length === 0 && (
              <tr>
                <td colSpan={2} className="px-3 py-6 text-center text-ink-500">
                  Nothing recorded for these filters.
                </td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
    </>
  );
}
