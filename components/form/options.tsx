// Option lists the pickers share. The <option>s of a worker picker: "Name (CP-1014, NOR)", after a "pick one" option.
export function WorkerOptions({
  workers,
  placeholder = "Pick the worker…",
  emptyValue = 0,
}: {
  workers: { id: number; name: string; employeeNo: string; yardCode: string }[];
  placeholder?: string;
  emptyValue?: number | string;
}) {
  return (
    <>
      <option value={emptyValue}>{placeholder}</option>
      {workers.map((w) => (
        <option key={w.id} value={w.id}>
          {w.name} ({w.employeeNo}, {w.yardCode})
        </option>
      ))}
    </>
  );
}

/**
 * The <option>s of a yard picker, after an "All yards" option when `all` is given. `by` picks the
 * value (the code for filters in the address bar, the id for a record's field); `withCode`
 * shows "North Yard (NOR)".
 */
export function YardOptions({
  yards,
  by,
  all,
  withCode,
}: {
  yards: { id?: number; code: string; name: string }[];
  by: "code" | "id";
  all?: string;
  withCode?: boolean;
}) {
  return (
    <>
      {all !== undefined && <option value="">{all}</option>}
      {yards.map((y) => (
        <option key={y.code} value={by === "code" ? y.code : y.id}>
          {y.name}
          {withCode ? ` (${y.code})` : ""}
        </option>
      ))}
    </>
  );
}

/** The <option>s of a fixed list: each value shown by its label (a record of labels, or a function). */
export function LabelOptions<V extends string | number>({ values, labels }: { values: readonly V[]; labels: Partial<Record<V, string>> | ((v: V) => string) }) {
  return (
    <>
      {values.map((v) => (
        <option key={v} value={v}>
          {typeof labels === "function" ? labels(v) : (labels[v] ?? String(v))}
        </option>
      ))}
    </>
  );
}
