// The orders list's and calendar's filter bar: a plain GET form, so it works before any script loads.
import Link from "next/link";
import { SelectField, TextField } from "@/components/form/fields";
import { LabelOptions, YardOptions } from "@/components/form/options";
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
      <SelectField id="f-yard" name="yard" label="Yard" defaultValue={values.yard}>
        <YardOptions yards={yards} by="code" all="All yards" />
      </SelectField>
      {range ? (
        <>
          <TextField id="f-from" type="date" name="from" label="From" defaultValue={values.from} />
          <TextField id="f-to" type="date" name="to" label="To" defaultValue={values.to} />
        </>
      ) : (
        <>
          <TextField id="f-date" type="date" name="date" label="Day" defaultValue={values.date} />
          <SelectField id="f-view" name="view" label="Show" defaultValue={values.view}>
            <option value="week">Week</option>
            <option value="day">Day</option>
          </SelectField>
        </>
      )}
      <SelectField id="f-status" name="status" label="Status" defaultValue={values.status}>
        <option value="">Open (not done or cancelled)</option>
        <option value="all">Any status</option>
        <LabelOptions values={ORDER_STATUSES} labels={STATUS_LABEL} />
      </SelectField>
      <SelectField id="f-type" name="workType" label="Work type" defaultValue={values.workType}>
        <option value="">All work types</option>
        {workTypes.map((t) => (
          <option key={t.id} value={String(t.id)}>
            {t.name}
          </option>
        ))}
      </SelectField>
      <TextField
        id="f-q"
        type="search"
        name="q"
        label="Search"
        wrapperClassName="col-span-2 sm:col-span-2 lg:min-w-56 lg:flex-1"
        defaultValue={values.q}
        placeholder="Title, number, address, pole"
      />
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
