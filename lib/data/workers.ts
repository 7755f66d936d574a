import type { Knex } from "knex";

export interface WorkerRow {
  id: number;
  employeeNo: string;
  firstName: string;
  lastName: string;
  name: string;
  classification: string;
  yardId: number;
  yardCode: string;
  phone: string | null;
  email: string | null;
  smsOptIn: boolean;
  active: boolean;
}

export const toWorker = (r: Record<string, unknown>): WorkerRow => ({
  id: Number(r.id),
  employeeNo: String(r.employee_no),
  firstName: String(r.first_name),
  lastName: String(r.last_name),
  name: `${r.first_name} ${r.last_name}`,
  classification: String(r.classification),
  yardId: Number(r.yard_id),
  yardCode: String(r.yard_code ?? ""),
  phone: (r.phone_e164 as string) ?? null,
  email: (r.email as string) ?? null,
  smsOptIn: Boolean(r.sms_opt_in),
  active: Boolean(r.active),
});

export async function listWorkers(db: Knex, organisationId: number, opts: { activeOnly?: boolean } = {}) {
  const q = db("workers as w")
    .join("yards as y", "y.id", "w.yard_id")
    .where("w.organisation_id", organisationId)
    .select("w.*", "y.code as yard_code")
    .orderBy(["w.last_name", "w.first_name"]);
  if (opts.activeOnly) q.where("w.active", true);
  return (await q).map(toWorker);
}
