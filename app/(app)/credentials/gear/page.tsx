import Link from "next/link";
import { SelectField, TextField } from "@/components/form/fields";
import { YardOptions } from "@/components/form/options";
import { requirePageRole } from "@/lib/auth/session";
import { CAN_KEEP_CREDENTIALS } from "@/lib/users/roles";
import { db } from "@/lib/db";
import { listYards } from "@/lib/yards/data";
import { listGear } from "@/lib/gear/data";
import { DUE_WINDOW_DAYS, GEAR_KIND_LABEL, GEAR_VIEWS, type GearView } from "@/lib/gear/model";
import { PageHeader, SafetyNote } from "@/components/status";
import { GearStateBadge } from "@/components/gear-state";
import { CredentialTabs } from "../tabs";
import { GearImport, GearReminders } from "./gear-tools";

export const metadata = { title: "Rubber goods" };

const VIEW_LABEL: Record<GearView, string> = {
  due: `Due within ${DUE_WINDOW_DAYS} days or overdue`,
  overdue: "Overdue",
  all: "All in service",
  retired: "Retired",
};

type Search = { view?: string; yard?: string; q?: string };

// The rubber goods due list beside the credential lists: every glove and sleeve whose next
// electrical test (1910.137 Table I-5) falls within 30 days or has passed, then the rest.
export default async function GearPage({ searchParams }: { searchParams: Promise<Search> }) {
  const user = await requirePageRole("hr", "admin", "supervisor", "dispatcher");
  const sp = await searchParams;
  const canEdit = CAN_KEEP_CREDENTIALS.includes(user.role);
  const view: GearView = (GEAR_VIEWS as readonly string[]).includes(sp.view ?? "") ? (sp.view as GearView) : "due";
  const yard = sp.yard && /^[A-Za-z0-9_-]{1,20}$/.test(sp.yard) ? sp.yard : undefined;
  const q = sp.q?.slice(0, 80) || undefined;
  const [rows, yards] = await Promise.all([listGear(db(), user.organisationId, { view, yard, q }), listYards(db(), user.organisationId)]);
  const qs = (v: GearView) => `/credentials/gear?${new URLSearchParams({ view: v, ...(yard ? { yard } : {}), ...(q ? { q } : {}) })}`;
  const exportHref = `/api/gear/export?${new URLSearchParams({ view, ...(yard ? { yard } : {}), ...(q ? { q } : {}) })}`;
  return (
    <>
      <PageHeader eyebrow="Credentials" title="Rubber goods">
        {canEdit && <GearReminders />}
        <a className="btn-quiet" href={exportHref} download>
          Export CSV
        </a>
      </PageHeader>
      <CredentialTabs active="gear" canEdit={canEdit} />
      <SafetyNote className="mb-4" />
      <nav aria-label="Rubber goods views" className="mb-3 flex flex-wrap gap-2">
        {GEAR_VIEWS.map((v) => (
          <Link key={v} href={qs(v)} aria-current={v === view ? "page" : undefined} className={v === view ? "btn-primary" : "btn-quiet"}>
            {VIEW_LABEL[v]}
          </Link>
        ))}
      </nav>
      <form className="mb-4 flex flex-wrap items-end gap-2" action="/credentials/gear">
        <input type="hidden" name="view" value={view} />
        <SelectField id="gear-f-yard" name="yard" label="Yard" defaultValue={yard ?? ""}>
          <YardOptions yards={yards} by="code" all="All yards" />
        </SelectField>
        <TextField id="gear-f-q" name="q" label="Worker, number or serial" defaultValue={q ?? ""} />
        <button className="btn-quiet" type="submit">
          Filter
        </button>
      </form>

      {rows.length === 0 ? (
        <p className="text-sm text-ink-500" data-testid="gear-empty">
          Nothing in this list.
        </p>
      ) : (
        <div className="card overflow-x-auto">
          <table className="w-full text-left text-sm" data-testid="gear-table">
            <thead className="bg-paper-200 text-xs uppercase text-ink-500">
              <tr>
                <th className="px-3 py-2">Worker</th>
                <th className="px-3 py-2">Item</th>
                <th className="px-3 py-2">Serial</th>
                <th className="px-3 py-2">Size</th>
                <th className="px-3 py-2">Last test</th>
                <th className="px-3 py-2">State</th>
              </tr>
            </thead>
            <tbody>
              {rows.map((g) => (
                <tr key={g.id} className="border-t border-rule align-top" data-testid={`gear-row-${g.serial}`}>
                  <td className="px-3 py-2">
                    <Link className="font-semibold text-copper hover:underline" href={`/credentials/${g.workerId}`}>
                      {g.workerName}
                    </Link>
                    <span className="block text-xs text-ink-500">
                      {g.employeeNo} · {g.yardCode}
                    </span>
                  </td>
                  <td className="px-3 py-2">
                    {GEAR_KIND_LABEL[g.kind]}, class {g.class}
                  </td>
                  <td className="px-3 py-2 tabular-nums">{g.serial}</td>
                  <td className="px-3 py-2">{g.size ?? "—"}</td>
                  <td className="px-3 py-2 tabular-nums">{g.testedOn}</td>
                  <td className="px-3 py-2">
                    <GearStateBadge state={g.state} dueOn={g.dueOn} daysLeft={g.daysLeft} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {canEdit && <GearImport />}
    </>
  );
}
