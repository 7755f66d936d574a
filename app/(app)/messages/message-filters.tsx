import Link from "next/link";
import { SelectField, TextField } from "@/components/form/fields";
import { LabelOptions } from "@/components/form/options";

const CHANNEL = { "": "All", sms: "Texts out", email: "E-mails out", inbound: "Text replies in" };
const STATE = { "": "Any", queued: "Queued", sending: "Sending", sent: "Sent", failed: "Failed" };

/** The GET filter form: channel, state, worker, day. */
export function MessageFilters({
  f,
  workers,
  filtered,
}: {
  f: { channel?: string; state?: string; worker?: number; day?: string };
  workers: { id: number | string; first_name: string; last_name: string }[];
  filtered: boolean;
}) {
  return (
    <form method="get" className="card mb-4 grid grid-cols-2 gap-3 p-3 sm:flex sm:flex-wrap sm:items-end" aria-label="Filter messages">
      <SelectField name="channel" label="Channel" defaultValue={f.channel ?? ""}>
        <LabelOptions values={["", "sms", "email", "inbound"]} labels={CHANNEL} />
      </SelectField>
      <SelectField name="state" label="State" defaultValue={f.state ?? ""}>
        <LabelOptions values={["", "queued", "sending", "sent", "failed"]} labels={STATE} />
      </SelectField>
      <SelectField name="worker" wrapperClassName="col-span-2 sm:col-span-1" label="Worker" defaultValue={f.worker ? String(f.worker) : ""}>
        <option value="">Everyone</option>
        {workers.map((w) => (
          <option key={w.id} value={w.id}>
            {w.last_name}, {w.first_name}
          </option>
        ))}
      </SelectField>
      <TextField name="day" type="date" label="Day" defaultValue={f.day ?? ""} />
      <div className="flex items-end gap-2">
        <button type="submit" className="btn-primary">
          Filter
        </button>
        {filtered && (
          <Link href="/messages" className="btn-quiet">
            Clear
          </Link>
        )}
      </div>
    </form>
  );
}
