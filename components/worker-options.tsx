// The <option>s of a worker picker: "Name (CP-1014, NOR)", after a "pick one" option.
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
