"use client";

// The credentials table's columns and features (@tanstack/react-table), and the evidence cell.
import Link from "next/link";
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
} from "@tanstack/react-table";
import { CredentialState } from "@/components/credential-state";
import type { CredentialDetail } from "@/lib/credentials/model";

export const features = tableFeatures({
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

export const fmtDay = (d: string | null) => d ?? "—";
export const fmtStamp = (iso: string | null) => (iso ? iso.slice(0, 10) : "—");

export function Evidence({ row }: { row: CredentialDetail }) {
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

export const columns = helper.columns([
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

