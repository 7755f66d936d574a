import "@/lib/server-only";
import { randomUUID } from "node:crypto";
import type { Knex } from "knex";
import { audit, type Actor } from "@/lib/audit/data";
import { boardEvent } from "@/lib/events/data";
import { todayIn } from "@/lib/time/days";
import { parseCredentialCsv, planImport, type ImportLookups, type ImportRow } from "@/lib/credentials/csv";
import type { ImportIssue } from "@/lib/credentials/model";

export interface ImportResult {
  ok: boolean;
  dryRun: boolean;
  rows: number;
  issues: ImportIssue[];
  issueCount: number;
  ignoredColumns: string[];
  /** Rows written (or, on a dry run, that would be). */
  created: number;
  /** Existing current records that the import supersedes. */
  superseded: number;
  /** Rows that say what is already stored (an unchanged export row): nothing is written for them. */
  unchanged: number;
  importRef: string | null;
}

const MAX_ISSUES = 500;

/** DATE columns come back as YYYY-MM-DD strings (dateStrings); a Date is read in UTC to be safe. */
function dateStr(v: unknown): string | null {
  if (v === null || v === undefined) return null;
  if (v instanceof Date) return v.toISOString().slice(0, 10);
  return String(v).slice(0, 10);
}

/** One query each for workers, types and current records, whatever the number of rows. */
async function lookups(q: Knex | Knex.Transaction, organisationId: number, rows: ImportRow[], now: Date, lock: boolean): Promise<ImportLookups> {
  const nos = [...new Set(rows.map((r) => r.employee_no.trim()).filter(Boolean))];
  const workerRows = nos.length
    ? await q("workers as w")
        .join("yards as y", "y.id", "w.yard_id")
        .where("w.organisation_id", organisationId)
        .whereIn("w.employee_no", nos)
        .select("w.id", "w.employee_no", "y.timezone")
    : [];
  const typeRows = await q("qualification_types").where({ organisation_id: organisationId }).select("id", "code", "name", "renewal_months");
  const ids = workerRows.map((w) => w.id);
  const curQ = q("credentials")
    .whereIn("worker_id", ids.length ? ids : [0])
    .where("status", "current")
    .select("id", "worker_id", "qualification_type_id", "issued_on", "expires_on");
  if (lock) curQ.forUpdate();
  const cur = await curQ;
  const otherRows = await q("credentials")
    .whereIn("worker_id", ids.length ? ids : [0])
    .whereNot("status", "current")
    .select("worker_id", "qualification_type_id", "issued_on", "expires_on", "status");
  const others = new Map<string, { issuedOn: string; expiresOn: string | null; status: string }[]>();
  for (const o of otherRows) {
    const k = `${o.worker_id}:${o.qualification_type_id}`;
    const list = others.get(k) ?? [];
    list.push({ issuedOn: dateStr(o.issued_on)!, expiresOn: dateStr(o.expires_on), status: String(o.status) });
    others.set(k, list);
  }
  const cache = new Map<string, string>();
  return {
    workers: new Map(workerRows.map((w) => [String(w.employee_no).toLowerCase(), { id: Number(w.id), timezone: String(w.timezone) }])),
    types: new Map(
      typeRows.map((t) => [
        String(t.code).toLowerCase(),
        { id: Number(t.id), code: t.code, name: t.name, renewalMonths: t.renewal_months === null ? null : Number(t.renewal_months) },
      ]),
    ),
    current: new Map(
      cur.map((c) => [`${c.worker_id}:${c.qualification_type_id}`, { id: Number(c.id), issuedOn: dateStr(c.issued_on)!, expiresOn: dateStr(c.expires_on) }]),
    ),
    others,
    today: (tz) => {
      let t = cache.get(tz);
      if (!t) cache.set(tz, (t = todayIn(tz, now)));
      return t;
    },
  };
}

/**
 * Imports credentials from CSV text: every row is checked first and nothing is written unless
 * all are valid; then one transaction supersedes the current records the file renews and
 * inserts the rows in batches. A dry run only checks.
 */
export async function importCredentials(
  db: Knex,
  actor: Actor,
  csv: string,
  opts: { dryRun: boolean; now?: Date },
): Promise<ImportResult> {
  const now = opts.now ?? new Date();
  const parsed = parseCredentialCsv(csv);
  const base = { dryRun: opts.dryRun, rows: parsed.rows.length, ignoredColumns: parsed.ignoredColumns, importRef: null };
  const fail = (issues: ImportIssue[]): ImportResult => ({
    ...base,
    ok: false,
    issues: issues.slice(0, MAX_ISSUES),
    issueCount: issues.length,
    created: 0,
    superseded: 0,
    unchanged: 0,
  });
  if (parsed.issues.length) return fail(parsed.issues);

  if (opts.dryRun) {
    const { issues, plan, unchanged } = planImport(parsed.rows, await lookups(db, actor.organisationId, parsed.rows, now, false));
    if (issues.length) return fail(issues);
    return {
      ...base,
      ok: true,
      issues: [],
      issueCount: 0,
      created: plan.length,
      superseded: plan.filter((p) => p.supersedes && "currentId" in p.supersedes).length,
      unchanged: unchanged.length,
    };
  }

  return db.transaction(async (trx) => {
    const { issues, plan, unchanged } = planImport(parsed.rows, await lookups(trx, actor.organisationId, parsed.rows, now, true));
    if (issues.length) return fail(issues);
    // Nothing differs from what is stored: a no-op, nothing written.
    if (!plan.length) return { ...base, ok: true, issues: [], issueCount: 0, created: 0, superseded: 0, unchanged: unchanged.length };
    const importRef = `imp-${randomUUID()}`;
    const supersededIds = plan.flatMap((p) => (p.supersedes && "currentId" in p.supersedes ? [p.supersedes.currentId] : []));
    for (let i = 0; i < supersededIds.length; i += 1000) {
      await trx("credentials").whereIn("id", supersededIds.slice(i, i + 1000)).update({ status: "superseded" });
    }
    const rows = plan.map((p) => ({
      worker_id: p.workerId,
      qualification_type_id: p.typeId,
      issued_on: p.issuedOn,
      expires_on: p.expiresOn,
      status: p.isLatest ? "current" : "superseded",
      supersedes_id: p.supersedes && "currentId" in p.supersedes ? p.supersedes.currentId : null,
      verified_by: actor.id,
      verified_at: now,
      created_by: actor.id,
      import_ref: importRef,
      note: `Imported from CSV, line ${p.line}`,
    }));
    for (let i = 0; i < rows.length; i += 500) await trx("credentials").insert(rows.slice(i, i + 500));

    // Chains inside the file: link each row to the file row before it, by the ids just written.
    const chained = plan.filter((p) => p.supersedes && "line" in p.supersedes);
    if (chained.length) {
      const written = await trx("credentials").where({ import_ref: importRef }).select("id", "note");
      const idByLine = new Map(written.map((w) => [Number(/line (\d+)$/.exec(w.note)?.[1]), Number(w.id)]));
      const pairs = chained.map((p) => [idByLine.get(p.line)!, idByLine.get((p.supersedes as { line: number }).line)!] as const);
      for (let i = 0; i < pairs.length; i += 500) {
        const chunk = pairs.slice(i, i + 500);
        await trx.raw(
          `UPDATE credentials SET supersedes_id = CASE id ${chunk.map(() => "WHEN ? THEN ?").join(" ")} END WHERE id IN (${chunk.map(() => "?").join(",")})`,
          [...chunk.flat(), ...chunk.map((c) => c[0])],
        );
      }
    }
    await audit(trx, actor, actor.organisationId, "credential.import", "credential", null, {
      importRef,
      rows: rows.length,
      superseded: supersededIds.length,
      unchanged: unchanged.length,
      workers: new Set(plan.map((p) => p.workerId)).size,
    });
    await boardEvent(trx, { organisationId: actor.organisationId, kind: "credential", day: null, payload: { importRef } });
    return { ...base, ok: true, issues: [], issueCount: 0, created: rows.length, superseded: supersededIds.length, unchanged: unchanged.length, importRef };
  });
}
