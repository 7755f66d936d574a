// The orders list's and calendar's filter bar: a plain GET form, so it works before any script loads.
import Link from "next/link";
import { ORDER_STATUSES, STATUS_LABEL } from "@/lib/orders/status";

export interface FilterValues {
  yard: string;
  from?: string;
  to?: string;
  date?: string;
  status: string;
  workType: string;
  q: string;
  view?: string;
}

export function OrderFilters({
  action,
  values,
  yards,
  workTypes,
  range,
}: {
  action: string;
  values: FilterValues;
  yards: { code: string; name: string }[];
  workTypes: { id: number; name: string }[];
  range: boolean;
}) {
  return (
    <form method="get" action={action} className="card mb-4 grid grid-cols-2 gap-3 p-3 sm:grid-cols-3 lg:flex lg:flex-wrap lg:items-end" role="search" aria-label="Filter orders">
      <div>
        <label className="label" htmlFor="f-yard">
          Yard
        </label>
        <select id="f-yard" name="yard" defaultValue={values.yard} className="field">
          <option value="">All yards</option>
          {yards.map((y) => (
            <option key={y.code} value={y.code}>
              {y.name}
            </option>
          ))}
        </select>
      </div>
      {range ? (
        <>
          <div>
            <label className="label" htmlFor="f-from">
              From
            </label>
            <input id="f-from" type="date" name="from" defaultValue={values.from} className="field" />
          </div>
          <div>
            <label className="label" htmlFor="f-to">
              To
            </label>
            <input id="f-to" type="date" name="to" defaultValue={values.to} className="field" />
          </div>
        </>
      ) : (
        <>
          <div>
            <label className="label" htmlFor="f-date">
              Day
            </label>
            <input id="f-date" type="date" name="date" defaultValue={values.date} className="field" />
          </div>
          <div>
            <label className="label" htmlFor="f-view">
              Show
            </label>
            <select id="f-view" name="view" defaultValue={values.view} className="field">
              <option value="week">Week</option>
              <option value="day">Day</option>
            </select>
          </div>
        </>
      )}
      <div>
        <label className="label" htmlFor="f-status">
          Status
        </label>
        <select id="f-status" name="status" defaultValue={values.status} className="field">
          <option value="">Open (not done or cancelled)</option>
          <option value="all">Any status</option>
          {ORDER_STATUSES.map((s) => (
            <option key={s} value={s}>
              {STATUS_LABEL[s]}
            </option>
          ))}
        </select>
      </div>
      <div>
        <label className="label" htmlFor="f-type">
          Work type
        </label>
        <select id="f-type" name="workType" defaultValue={values.workType} className="field">
          <option value="">All work types</option>
          {workTypes.map((t) => (
            <option key={t.id} value={String(t.id)}>
              {t.name}
            </option>
          ))}
        </select>
      </div>
      <div className="col-span-2 sm:col-span-2 lg:min-w-56 lg:flex-1">
        <label className="label" htmlFor="f-q">
          Search
        </label>
        <input id="f-q" type="search" name="q" defaultValue={values.q} placeholder="Title, number, address, pole" className="field" />
      </div>
      <div className="flex gap-2">
        <button type="submit" className="btn-primary">
          Show
        </button>
        <Link href={action} className="btn-quiet">
          Clear
        </Link>
      </div>
    </form>
  );
}

export const OPEN_STATUSES = ["draft", "planned", "sent", "in_progress", "on_hold"];

export function statusFilter(s: string | undefined): string[] | undefined {
  if (!s) return OPEN_STATUSES;
  if (s === "all") return undefined;
  return (ORDER_STATUSES as readonly string[]).includes(s) ? [s] : OPEN_STATUSES;
}
