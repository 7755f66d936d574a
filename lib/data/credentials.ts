import type { Knex } from "knex";

export interface CredentialRow {
  id: number;
  workerId: number;
  workerName: string;
  employeeNo: string;
  yardCode: string;
  type: string;
  typeName: string;
  issuedOn: string;
  expiresOn: string | null;
  status: string;
  evidenceFileId: number | null;
}

/** Current credentials (the newest of each kind per worker), optionally for one worker. */
export async function listCurrentCredentials(db: Knex, organisationId: number, workerId?: number) {
  const q = db("credentials as c")
    .join("workers as w", "w.id", "c.worker_id")
    .join("yards as y", "y.id", "w.yard_id")
    .join("qualification_types as q", "q.id", "c.qualification_type_id")
    .where("w.organisation_id", organisationId)
    .where("c.status", "current")
    .select(
      "c.id",
      "c.worker_id",
      "w.first_name",
      "w.last_name",
      "w.employee_no",
      "y.code as yard_code",
      "q.code as type",
      "q.name as type_name",
      "c.issued_on",
      "c.expires_on",
      "c.status",
      "c.evidence_file_id",
    )
    .orderBy([{ column: "c.expires_on", order: "asc" }]);
  if (workerId) q.where("c.worker_id", workerId);
  const rows = await q;
  return rows.map(
    (r): CredentialRow => ({
      id: r.id,
      workerId: r.worker_id,
      workerName: `${r.first_name} ${r.last_name}`,
      employeeNo: r.employee_no,
      yardCode: r.yard_code,
      type: r.type,
      typeName: r.type_name,
      issuedOn: r.issued_on,
      expiresOn: r.expires_on,
      status: r.status,
      evidenceFileId: r.evidence_file_id,
    }),
  );
}
