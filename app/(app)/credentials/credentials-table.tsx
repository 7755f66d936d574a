"use client";

import Link from "next/link";
import { useEffect, useMemo, useState } from "react";
import { useTable, type PaginationState, type SortingState } from "@tanstack/react-table";
import { SelectField, TextField } from "@/components/form/fields";
import { YardOptions } from "@/components/form/options";
import type { CredentialDetail } from "@/lib/credentials/model";
import { inView as inViewOf, type CredentialView } from "@/lib/credentials/model";
import { columns, features } from "./credentials-columns";
import { CredentialRows } from "./credentials-rows";

const SEARCHABLE = new Set(["workerName", "employeeNo", "yardCode", "typeName"]);

const VIEWS: { key: CredentialView; label: string }[] = [
  { key: "lapsed", label: "Lapsed" },
  { key: "30", label: "Lapsing in 30 days" },
  { key: "60", label: "60 days" },
  { key: "90", label: "90 days" },
  { key: "pending", label: "Waiting for HR" },
  { key: "all", label: "All" },
];

interface Props {
  rows: CredentialDetail[];
  yards: { code: string; name: string }[];
  types: { code: string; name: string }[];
  canEdit: boolean;
  initial: { view: CredentialView; yard: string; qualification: string; q: string };
}

export function CredentialsTable({ rows, yards, types, canEdit, initial }: Props) {
  const [view, setView] = useState<CredentialView>(initial.view);
  const [yard, setYard] = useState(initial.yard);
  const [qualification, setQualification] = useState(initial.qualification);
  const [q, setQ] = useState(initial.q);
  const [sorting, setSorting] = useState<SortingState>([{ id: "daysLeft", desc: false }]);
  const [pagination, setPagination] = useState<PaginationState>({ pageIndex: 0, pageSize: 25 });

  // Yard and qualification narrow the rows first; the quick views count within that.
  const scoped = useMemo(
    () => rows.filter((r) => (!yard || r.yardCode === yard) && (!qualification || r.type === qualification)),
    [rows, yard, qualification],
  );
  const counts = useMemo(() => {
    const c = {} as Record<CredentialView, number>;
    for (const v of VIEWS) c[v.key] = scoped.filter((r) => inViewOf(r, v.key)).length;
    return c;
  }, [scoped]);
  const data = useMemo(() => scoped.filter((r) => inViewOf(r, view)), [scoped, view]);

  const table = useTable({
    features,
    columns,
    data,
    getRowId: (r) => String(r.id),
    state: { sorting, pagination, globalFilter: q },
    onSortingChange: setSorting,
    onPaginationChange: setPagination,
    onGlobalFilterChange: (u) => setQ((prev) => String(typeof u === "function" ? u(prev) : (u ?? ""))),
    globalFilterFn: "includesString",
    getColumnCanGlobalFilter: (column) => SEARCHABLE.has(column.id),
    autoResetPageIndex: true,
  });

  // Keep the address bar in step, so a view can be bookmarked or sent to someone.
  useEffect(() => {
    const p = new URLSearchParams();
    if (view !== "all") p.set("view", view);
    if (yard) p.set("yard", yard);
    if (qualification) p.set("qualification", qualification);
    if (q) p.set("q", q);
    const s = p.toString();
    window.history.replaceState(null, "", s ? `?${s}` : window.location.pathname);
  }, [view, yard, qualification, q]);

  const exportHref = useMemo(() => {
    const p = new URLSearchParams();
    if (view !== "all") p.set("view", view);
    if (yard) p.set("yard", yard);
    if (qualification) p.set("qualification", qualification);
    if (q) p.set("q", q);
    return `/api/credentials/export${p.size ? `?${p}` : ""}`;
  }, [view, yard, qualification, q]);

  const shown = table.getRowModel().rows;
  const total = table.getPrePaginatedRowModel().rows.length;
  const { pageIndex, pageSize } = table.state.pagination;

  return (
    <section aria-label="Credentials">
      <div className="mb-3 flex flex-wrap gap-2" role="group" aria-label="Quick views">
        {VIEWS.map((v) => (
          <button
            key={v.key}
            type="button"
            onClick={() => setView(v.key)}
            aria-pressed={view === v.key}
            className={`rounded-full border px-3 py-1 text-sm font-semibold ${
              view === v.key ? "border-ink bg-ink text-paper" : "border-rule bg-paper-50 text-ink hover:bg-paper-200"
            }`}
          >
            {v.label} <span className={view === v.key ? "text-paper/70" : "text-ink-500"}>{counts[v.key]}</span>
          </button>
        ))}
      </div>

      <div className="card mb-3 grid gap-3 p-3 sm:grid-cols-2 lg:grid-cols-[2fr_1fr_1fr_auto] lg:items-end">
        <TextField
          id="cred-q"
          type="search"
          label="Search"
          placeholder="Name, employee number, qualification"
          value={q}
          onChange={(e) => table.setGlobalFilter(e.target.value)}
        />
        <SelectField id="cred-yard" label="Yard" value={yard} onChange={(e) => setYard(e.target.value)}>
          <YardOptions yards={yards} by="code" all="All yards" withCode />
        </SelectField>
        <SelectField id="cred-type" label="Qualification" value={qualification} onChange={(e) => setQualification(e.target.value)}>
          <option value="">All qualification types</option>
          {types.map((t) => (
            <option key={t.code} value={t.code}>
              {t.name}
            </option>
          ))}
        </SelectField>
        <div className="flex gap-2">
          <a className="btn-quiet" href={exportHref} download>
            Export CSV
          </a>
          {canEdit && (
            <Link className="btn-quiet" href="/credentials/import">
              Import CSV
            </Link>
          )}
        </div>
      </div>

      <p className="mb-2 text-sm text-ink-500" aria-live="polite">
        {total === 0 ? "No records match." : `${total} record${total === 1 ? "" : "s"}`}
        {total > pageSize && ` · showing ${pageIndex * pageSize + 1}–${Math.min(total, (pageIndex + 1) * pageSize)}`}
      </p>

      <CredentialRows table={table} shown={shown} />
    </section>
  );
}
