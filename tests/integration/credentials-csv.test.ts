import Papa from "papaparse";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import knex, { type Knex } from "knex";
import { dbConfig } from "@/knexfile";
import { as, type Client } from "@/tests/support/client";
import { addDaysIso, proposeExpiry } from "@/lib/credentials/model";

// CSV import and export against the running app. The import is all-or-nothing: one bad
// row and nothing is written. The rows go to workers made for this test (inactive, so no
// board shows them) and are removed afterwards; the demo's own records are not touched.

let db: Knex;
let hr: Client;
const run = Date.now().toString(36).slice(-5).toUpperCase();
const WORKERS = 250;
const nos = Array.from({ length: WORKERS }, (_, i) => `CSV${run}-${String(i + 1).padStart(4, "0")}`);
let codes: string[] = [];
let months = new Map<string, number | null>();
const today = new Date().toISOString().slice(0, 10);

const count = async () => Number((await db("credentials").count({ n: "*" }).first())?.n);
const header = "employee_no,qualification,issued_on,expires_on";

beforeAll(async () => {
  db = knex(dbConfig());
  hr = await as("hr");
  const types = await db("qualification_types").where({ organisation_id: 1 }).orderBy("id").select("code", "renewal_months");
  codes = types.map((t) => t.code).slice(0, 8);
  months = new Map(types.map((t) => [t.code, t.renewal_months]));
  await db("workers").insert(
    nos.map((no, i) => ({
      organisation_id: 1,
      yard_id: 1,
      employee_no: no,
      first_name: i === 0 ? "=SUM(1+1)" : "Import",
      last_name: `Test ${i + 1}`,
      classification: "journeyman",
      active: false,
    })),
  );
});

afterAll(async () => {
  const ids = (await db("workers").whereIn("employee_no", nos).select("id")).map((w) => w.id);
  await db("credentials").whereIn("worker_id", ids).whereNotNull("supersedes_id").update({ supersedes_id: null });
  await db("credentials").whereIn("worker_id", ids).delete();
  await db("workers").whereIn("id", ids).delete();
  await db.destroy();
});

describe("import", () => {
  it("one bad row: 422 naming its line and field, and nothing is stored", async () => {
    const rows = [header];
    for (let i = 0; i < 10; i++) rows.push(`${nos[i]},climbing,${addDaysIso(today, -30)},`);
    // Line 7 of the file (header is line 1): an impossible date.
    rows[6] = `${nos[5]},climbing,${addDaysIso(today, -30)},2026-13-45`;
    const before = await count();
    const r = await hr.json("/api/credentials/import", "POST", { csv: rows.join("\n"), dryRun: false });
    expect(r.status).toBe(422);
    expect(r.body.issues).toEqual([{ line: 7, field: "expires_on", message: "not a date (YYYY-MM-DD)" }]);
    expect(r.body.error).toContain("line 7, expires_on: not a date (YYYY-MM-DD)");
    expect(await count()).toBe(before);
  });

  it("unknown workers and codes are named too, each with its line", async () => {
    const csv = [header, `${nos[0]},climbing,${addDaysIso(today, -3)},`, `NOPE-${run},climbing,${addDaysIso(today, -3)},`, `${nos[1]},welding,${addDaysIso(today, -3)},`].join("\r\n");
    const r = await hr.json("/api/credentials/import", "POST", { csv, dryRun: true });
    expect(r.status).toBe(422);
    expect(r.body.issues.map((i: { line: number; field: string }) => `${i.line}:${i.field}`)).toEqual(["3:employee_no", "4:qualification"]);
  });

  it("a dispatcher or supervisor cannot import (403)", async () => {
    for (const role of ["dispatcher", "supervisor"] as const) {
      const c = await as(role);
      expect((await c.json("/api/credentials/import", "POST", { csv: header, dryRun: true })).status).toBe(403);
    }
  });

  it("2,000 generated rows: a dry run writes nothing, the import writes all 2,000 in a few seconds", async () => {
    const lines = [header];
    nos.forEach((no, i) => {
      codes.forEach((code, j) => {
        const issued = addDaysIso(today, -(10 + ((i * 7 + j * 13) % 300)));
        // Half give the expiry, half leave it to the proposal.
        lines.push(`${no},${code},${issued},${(i + j) % 2 ? "" : (proposeExpiry(issued, months.get(code) ?? 12) ?? "")}`);
      });
    });
    expect(lines.length - 1).toBe(2000);
    const csv = lines.join("\n") + "\n";
    const before = await count();

    const dry = await hr.json("/api/credentials/import", "POST", { csv, dryRun: true });
    expect(dry.status).toBe(200);
    expect(dry.body).toMatchObject({ ok: true, rows: 2000, created: 2000, superseded: 0 });
    expect(await count()).toBe(before);

    const started = Date.now();
    const r = await hr.json("/api/credentials/import", "POST", { csv, dryRun: false });
    const took = Date.now() - started;
    expect(r.status).toBe(201);
    expect(r.body).toMatchObject({ ok: true, rows: 2000, created: 2000 });
    expect(await count()).toBe(before + 2000);
    expect(took).toBeLessThan(5000); // "a few seconds" (batch inserts, one lookup per table)

    const ids = (await db("workers").whereIn("employee_no", nos).select("id")).map((w) => w.id);
    const current = await db("credentials").whereIn("worker_id", ids).where("status", "current").count({ n: "*" }).first();
    expect(Number(current?.n)).toBe(2000);
    expect(await db("audit_log").where({ action: "credential.import" }).whereRaw("JSON_EXTRACT(detail, '$.importRef') = ?", [r.body.importRef]).first()).toBeTruthy();
    expect(await db("board_events").where({ kind: "credential" }).whereRaw("JSON_EXTRACT(payload, '$.importRef') = ?", [r.body.importRef]).first()).toBeTruthy();
  });

  it("importing the same row again is a no-op (it says what is stored); an older one is refused", async () => {
    // Worker 0, code 0 was issued today − 10 above, expiry proposed from the empty cell.
    const before = await count();
    const same = [header, `${nos[0]},${codes[0]},${addDaysIso(today, -10)},`].join("\n");
    const r = await hr.json("/api/credentials/import", "POST", { csv: same, dryRun: false });
    expect(r.status).toBe(201);
    expect(r.body).toMatchObject({ created: 0, superseded: 0, unchanged: 1, importRef: null });
    expect(await count()).toBe(before);
    const older = [header, `${nos[0]},${codes[0]},${addDaysIso(today, -400)},`].join("\n");
    const o = await hr.json("/api/credentials/import", "POST", { csv: older, dryRun: true });
    expect(o.status).toBe(422);
    expect(o.body.issues[0]).toMatchObject({ line: 2, field: "issued_on" });
  });

  it("the demo's whole export imports back as a no-op; edited rows, and only those, change (issue 18)", async () => {
    const exp = await hr.fetch("/api/credentials/export");
    expect(exp.status).toBe(200);
    const text = await exp.text();
    const before = await count();
    const again = await hr.json("/api/credentials/import", "POST", { csv: text, dryRun: false });
    expect(again.status, JSON.stringify(again.body.issues?.slice(0, 3))).toBe(201);
    expect(again.body).toMatchObject({ created: 0, superseded: 0, importRef: null });
    expect(again.body.unchanged).toBe(again.body.rows);
    expect(await count()).toBe(before);

    // Edit two of this test's own workers' rows (the demo's records stay as they are): a corrected
    // expiry on worker 2's current record, a renewal of worker 3's. RFC 4180 via papaparse.
    const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ""), { skipEmptyLines: true });
    const [head, ...body] = parsed.data;
    const i2 = body.findIndex((r) => r[0] === nos[2]);
    const i3 = body.findIndex((r) => r[0] === nos[3]);
    expect(i2).toBeGreaterThanOrEqual(0);
    expect(i3).toBeGreaterThanOrEqual(0);
    const old2 = { issued: body[i2][2], code: body[i2][1] };
    body[i2][3] = addDaysIso(today, 700);
    body[i3][2] = addDaysIso(today, -2);
    body[i3][3] = "";
    const edited = Papa.unparse([head, ...body], { newline: "\r\n" });
    const dry = await hr.json("/api/credentials/import", "POST", { csv: edited, dryRun: true });
    expect(dry.status).toBe(200);
    expect(dry.body).toMatchObject({ created: 2, superseded: 2, unchanged: body.length - 2 });
    const done = await hr.json("/api/credentials/import", "POST", { csv: edited, dryRun: false });
    expect(done.status).toBe(201);
    expect(done.body).toMatchObject({ created: 2, superseded: 2 });
    expect(await count()).toBe(before + 2);
    const w2 = await db("workers").where({ employee_no: nos[2] }).first("id");
    const t2 = await db("qualification_types").where({ organisation_id: 1, code: old2.code }).first("id");
    const now2 = await db("credentials").where({ worker_id: w2.id, qualification_type_id: t2.id, status: "current" }).first();
    expect(now2).toMatchObject({ issued_on: old2.issued, expires_on: addDaysIso(today, 700) });
    // And the edited file, imported once more, is now a no-op too.
    const third = await hr.json("/api/credentials/import", "POST", { csv: edited, dryRun: false });
    expect(third.body).toMatchObject({ created: 0, superseded: 0 });
  });

  it("a newer row renews: the old record becomes superseded and the new one points at it", async () => {
    const w = await db("workers").where({ employee_no: nos[1] }).first("id");
    const old = await db("credentials").where({ worker_id: w.id, status: "current" }).orderBy("qualification_type_id").first();
    const code = (await db("qualification_types").where({ id: old.qualification_type_id }).first("code")).code;
    const csv = [header, `${nos[1]},${code},${addDaysIso(today, -1)},`].join("\n");
    const r = await hr.json("/api/credentials/import", "POST", { csv, dryRun: false });
    expect(r.status).toBe(201);
    expect(r.body).toMatchObject({ created: 1, superseded: 1 });
    expect((await db("credentials").where({ id: old.id }).first()).status).toBe("superseded");
    const now = await db("credentials").where({ worker_id: w.id, qualification_type_id: old.qualification_type_id, status: "current" }).first();
    expect(now.supersedes_id).toBe(old.id);
  });
});

describe("export", () => {
  it("CSV of the table with the import's columns first; formula-looking cells are defused (OWASP CSV injection)", async () => {
    const res = await hr.fetch(`/api/credentials/export?q=${encodeURIComponent(`CSV${run}-0001`)}`);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toContain("text/csv");
    expect(res.headers.get("content-disposition")).toMatch(/^attachment; filename="credentials-\d{4}-\d{2}-\d{2}\.csv"$/);
    const text = (await res.text()).replace(/^\uFEFF/, "");
    const parsed = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true });
    expect(parsed.meta.fields?.slice(0, 4)).toEqual(["employee_no", "qualification", "issued_on", "expires_on"]);
    expect(parsed.data.length).toBe(8);
    expect(parsed.data.every((r) => r.employee_no === `CSV${run}-0001`)).toBe(true);
    expect(parsed.data[0].worker.startsWith("'=SUM(1+1)")).toBe(true);
  });

  it("the lapsed view exports Brent Haugland's climbing (CP-1006)", async () => {
    const res = await hr.fetch("/api/credentials/export?view=lapsed");
    const parsed = Papa.parse<Record<string, string>>((await res.text()).replace(/^\uFEFF/, ""), { header: true, skipEmptyLines: true });
    expect(parsed.data.some((r) => r.employee_no === "CP-1006" && r.qualification === "climbing")).toBe(true);
    expect(parsed.data.every((r) => Number(r.days_left) < 0)).toBe(true);
  });
});
