"use client";

import Link from "next/link";
import { useEffect, useMemo, useState } from "react";
import {
  createColumnHelper,
  createFilteredRowModel,
  createPaginatedRowModel,
  createSortedRowModel,
  columnFilteringFeature,
  filterFn_includesString,
  globalFilteringFeature,
  rowPaginationFeature,
  rowSortingFeature,
  sortFn_alphanumeric,
  sortFn_basic,
  sortFn_text,
  tableFeatures,
  useTable,
  type PaginationState,
  type SortingState,
} from "@tanstack/react-table";
import { CredentialState } from "@/components/credential-state";
import type { CredentialDetail } from "@/lib/credentials/model";
import { inView as inViewOf, type CredentialView } from "@/lib/credentials/model";

const features = tableFeatures({
  rowSortingFeature,
  sortedRowModel: createSortedRowModel(),
  sortFns: { alphanumeric: sortFn_alphanumeric, text: sortFn_text, basic: sortFn_basic },
  columnFilteringFeature,
  globalFilteringFeature,
  filteredRowModel: createFilteredRowModel(),
  filterFns: { includesString: filterFn_includesString },
  rowPaginationFeature,
  paginatedRowModel: createPaginatedRowModel(),
});

const helper = createColumnHelper<typeof features, CredentialDetail>();

const fmtDay = (d: string | null) => d ?? "—";
const fmtStamp = (iso: string | null) => (iso ? iso.slice(0, 10) : "—");

function Evidence({ row }: { row: CredentialDetail }) {
  if (row.evidenceFileId) {
    return (
      <a className="font-semibold text-copper underline-offset-2 hover:underline" href={`/api/files/${row.evidenceFileId}`} title={row.evidenceName ?? ""}>
        Evidence
      </a>
    );
  }
  return row.needsEvidence ? (
    <span className="text-ink-500" title="This qualification asks for evidence; none is on file">
      None
    </span>
  ) : (
    <span className="text-ink-500" title="Not asked for">
      —
    </span>
  );
}

const columns = helper.columns([
  helper.accessor("workerName", {
    header: "Worker",
    sortFn: "text",
    cell: (info) => (
      <Link href={`/credentials/${info.row.original.workerId}`} className="font-semibold text-ink underline-offset-2 hover:underline">
        {info.getValue()}
      </Link>
    ),
  }),
  helper.accessor("employeeNo", { header: "Emp. no", sortFn: "alphanumeric" }),
  helper.accessor("yardCode", { header: "Yard", sortFn: "text" }),
  helper.accessor("typeName", { header: "Qualification", sortFn: "text" }),
  helper.accessor("issuedOn", { header: "Issued", sortFn: "basic", cell: (i) => fmtDay(i.getValue()) }),
  helper.accessor("expiresOn", { header: "Last valid day", sortFn: "basic", sortUndefined: "last", cell: (i) => fmtDay(i.getValue()) }),
  helper.accessor((r) => (r.daysLeft === null ? undefined : r.daysLeft), {
    id: "daysLeft",
    header: "Days left",
    sortFn: "basic",
    sortUndefined: "last",
    cell: (i) => <CredentialState status={i.row.original.status} daysLeft={i.row.original.daysLeft} warnDays={i.row.original.warnDays} />,
  }),
  helper.display({ id: "evidence", header: "Evidence", cell: (i) => <Evidence row={i.row.original} /> }),
  helper.accessor("verifiedByName", {
    header: "Verified",
    enableSorting: false,
    cell: (i) =>
      i.row.original.verifiedByName ? (
        <span className="text-ink-700">
          {i.row.original.verifiedByName}
          <span className="block text-xs text-ink-500">{fmtStamp(i.row.original.verifiedAt)}</span>
        </span>
      ) : (
        <span className="text-ink-500">Not yet</span>
      ),
  }),
]);

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
        <div>
          <label className="label" htmlFor="cred-q">
            Search
          </label>
          <input
            id="cred-q"
            type="search"
            className="field"
            placeholder="Name, employee number, qualification"
            value={q}
            onChange={(e) => table.setGlobalFilter(e.target.value)}
          />
        </div>
        <div>
          <label className="label" htmlFor="cred-yard">
            Yard
          </label>
          <select id="cred-yard" className="field" value={yard} onChange={(e) => setYard(e.target.value)}>
            <option value="">All yards</option>
            {yards.map((y) => (
              <option key={y.code} value={y.code}>
                {y.name} ({y.code})
              </option>
            ))}
          </select>
        </div>
        <div>
          <label className="label" htmlFor="cred-type">
            Qualification
          </label>
          <select id="cred-type" className="field" value={qualification} onChange={(e) => setQualification(e.target.value)}>
            <option value="">All qualifications</option>
            {types.map((t) => (
              <option key={t.code} value={t.code}>
                {t.name}
              </option>
            ))}
          </select>
        </div>
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

      {/* Wide screens: the table. */}
      <div className="card hidden overflow-x-auto md:block">
        <table className="w-full text-left text-sm">
          <thead className="bg-paper-200 text-xs uppercase text-ink-500">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted();
                  const canSort = header.column.getCanSort();
                  return (
                    <th
                      key={header.id}
                      className="px-3 py-2"
                      aria-sort={sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : undefined}
                    >
                      {canSort ? (
                        <button
                          type="button"
                          onClick={header.column.getToggleSortingHandler()}
                          className="inline-flex items-center gap-1 font-bold uppercase hover:text-ink"
                        >
                          <table.FlexRender header={header} />
                          <span aria-hidden="true" className="text-[10px]">
                            {sorted === "asc" ? "▲" : sorted === "desc" ? "▼" : "↕"}
                          </span>
                        </button>
                      ) : (
                        <table.FlexRender header={header} />
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {shown.map((row) => (
              <tr key={row.id} className="border-t border-rule align-top" data-testid={`cred-row-${row.original.id}`}>
                {row.getAllCells().map((cell) => (
                  <td key={cell.id} className="px-3 py-2 tabular-nums">
                    <table.FlexRender cell={cell} />
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>

      {/* Phones: one card per record. */}
      <ul className="space-y-2 md:hidden">
        {shown.map(({ original: r }) => (
          <li key={r.id} className="card p-3">
            <div className="flex items-start justify-between gap-2">
              <div className="min-w-0">
                <Link href={`/credentials/${r.workerId}`} className="font-bold text-ink underline-offset-2 hover:underline">
                  {r.workerName}
                </Link>
                <p className="text-xs text-ink-500">
                  {r.employeeNo} · {r.yardCode}
                </p>
              </div>
              <CredentialState status={r.status} daysLeft={r.daysLeft} warnDays={r.warnDays} />
            </div>
            <p className="mt-1 text-sm font-semibold">{r.typeName}</p>
            <p className="text-sm text-ink-700 tabular-nums">
              Issued {fmtDay(r.issuedOn)} · last valid day {fmtDay(r.expiresOn)}
            </p>
            <div className="mt-1 flex items-center justify-between text-sm">
              <Evidence row={r} />
              <span className="text-xs text-ink-500">{r.verifiedByName ? `Verified by ${r.verifiedByName}` : "Not verified yet"}</span>
            </div>
          </li>
        ))}
      </ul>

      {table.getPageCount() > 1 && (
        <div className="mt-3 flex items-center justify-end gap-2 text-sm">
          <button type="button" className="btn-quiet" onClick={() => table.previousPage()} disabled={!table.getCanPreviousPage()}>
            Previous
          </button>
          <span>
            Page {pageIndex + 1} of {table.getPageCount()}
          </span>
          <button type="button" className="btn-quiet" onClick={() => table.nextPage()} disabled={!table.getCanNextPage()}>
            Next
          </button>
        </div>
      )}
    </section>
  );
}
