"use client";

import Link from "next/link";
import type { Row, useTable } from "@tanstack/react-table";
import { CredentialState } from "@/components/credential-state";
import type { CredentialDetail } from "@/lib/credentials/model";
import { Evidence, fmtDay, type features } from "./credentials-columns";

type T = ReturnType<typeof useTable<typeof features, CredentialDetail>>;

/** The page of records: a sortable table on wide screens, cards on phones, and the pager. */
export function CredentialRows({ table, shown }: { table: T; shown: Row<typeof features, CredentialDetail>[] }) {
  const { pageIndex } = table.state.pagination;
  return (
    <>
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
    </>
  );
}
