import { afterAll, beforeAll, describe, expect, it } from "vitest";
import knex, { type Knex } from "knex";
import { dbConfig } from "@/knexfile";
import { as, Client, type DemoRole } from "@/tests/support/client";
import { minimalPdf } from "@/tests/support/files";
import { addDaysIso, proposeExpiry } from "@/lib/credentials/model";

// Workers and credentials through the running app (APP_URL) and its database (DB_NAME).
// Roles as the product brief gives them: hr and admin keep workers and credentials,
// dispatchers and supervisors read the roster, a lineworker sees only their own.

let db: Knex;
const clients = new Map<DemoRole, Client>();
const client = async (role: DemoRole) => {
  if (!clients.has(role)) clients.set(role, await as(role));
  return clients.get(role)!;
};
const run = Date.now().toString(36).slice(-6).toUpperCase();
const created: number[] = [];
// Dates relative to today (UTC, a day's margin for the yards' zones), never fixed calendar dates.
const today = new Date().toISOString().slice(0, 10);
const daysAgo = (n: number) => addDaysIso(today, -n);

async function workerIdOf(no: string) {
  const w = await db("workers").where({ employee_no: no }).first("id");
  return Number(w.id);
}

beforeAll(() => {
  db = knex(dbConfig());
});
afterAll(async () => {
  if (created.length) {
    await db("credentials").whereIn("worker_id", created).update({ supersedes_id: null });
    await db("credentials").whereIn("worker_id", created).delete();
    await db("files").whereIn("worker_id", created).delete();
    await db("workers").whereIn("id", created).delete();
  }
  await db.destroy();
});

// Test workers are created inactive, so no board's pool ever shows them.
const newWorker = (over: Record<string, unknown> = {}) => ({
  employeeNo: `T${run}-${Math.floor(Math.random() * 1e6)}`,
  firstName: "Test",
  lastName: "Worker",
  classification: "journeyman",
  yardId: 1,
  phone: "(320) 555-0177",
  email: "",
  smsOptIn: true,
  active: false,
  ...over,
});

describe("workers", () => {
  it("hr creates a worker; the phone is stored as E.164 (libphonenumber-js as reference)", async () => {
    const hr = await client("hr");
    const r = await hr.json("/api/workers", "POST", newWorker());
    expect(r.status).toBe(201);
    created.push(r.body.worker.id);
    expect(r.body.worker.phone).toBe("+13205550177");
    const row = await db("workers").where({ id: r.body.worker.id }).first();
    expect(row.phone_e164).toBe("+13205550177");
    const audit = await db("audit_log").where({ action: "worker.create", entity_id: String(r.body.worker.id) }).first();
    expect(audit).toBeTruthy();
  });

  it("an invalid phone answers 422 naming the phone field, and nothing is stored", async () => {
    const hr = await client("hr");
    const body = newWorker({ phone: "555-12" });
    const r = await hr.json("/api/workers", "POST", body);
    expect(r.status).toBe(422);
    expect(r.body.issues.map((i: { field: string }) => i.field)).toContain("phone");
    expect(await db("workers").where({ employee_no: body.employeeNo }).first()).toBeUndefined();
  });

  it("missing and bad fields are each named", async () => {
    const hr = await client("hr");
    const r = await hr.json("/api/workers", "POST", { employeeNo: "", classification: "wizard", yardId: 1 });
    expect(r.status).toBe(422);
    const fields = r.body.issues.map((i: { field: string }) => i.field);
    expect(fields).toEqual(expect.arrayContaining(["employeeNo", "firstName", "lastName", "classification"]));
  });

  it("a duplicate employee number is 409 naming employeeNo", async () => {
    const hr = await client("hr");
    const r = await hr.json("/api/workers", "POST", newWorker({ employeeNo: "CP-1001" }));
    expect(r.status).toBe(409);
    expect(r.body.issues[0].field).toBe("employeeNo");
  });

  it("PATCH with the current version saves and bumps it; a stale version is 409 with the current record", async () => {
    const hr = await client("hr");
    const c = await hr.json("/api/workers", "POST", newWorker());
    created.push(c.body.worker.id);
    const id = c.body.worker.id;
    const ok = await hr.json(`/api/workers/${id}`, "PATCH", { lastName: "Renamed", phone: "+44 20 7946 0958", version: 1 });
    expect(ok.status).toBe(200);
    expect(ok.body.worker).toMatchObject({ lastName: "Renamed", phone: "+442079460958", version: 2 });
    const stale = await hr.json(`/api/workers/${id}`, "PATCH", { lastName: "Lost update", version: 1 });
    expect(stale.status).toBe(409);
    expect(stale.body.current).toMatchObject({ lastName: "Renamed", version: 2 });
    expect((await db("workers").where({ id }).first()).last_name).toBe("Renamed");
    const events = await db("board_events").where({ kind: "worker" }).whereRaw("JSON_EXTRACT(payload, '$.workerId') = ?", [id]);
    expect(events.length).toBeGreaterThanOrEqual(2);
  });

  it("a name with <script> is stored as typed and pages render it as text (React escapes it)", async () => {
    const hr = await client("hr");
    const c = await hr.json("/api/workers", "POST", newWorker({ lastName: "<script>alert(1)</script>" }));
    expect(c.status).toBe(201);
    created.push(c.body.worker.id);
    const page = await hr.fetch(`/credentials/${c.body.worker.id}`);
    expect(page.status).toBe(200);
    const html = await page.text();
    expect(html).not.toContain("<script>alert(1)</script>");
    expect(html).toContain("&lt;script&gt;alert(1)&lt;/script&gt;");
  });

  it("a dispatcher reads the roster but cannot create or edit workers (403)", async () => {
    const d = await client("dispatcher");
    expect((await d.json("/api/workers")).status).toBe(200);
    expect((await d.json("/api/workers", "POST", newWorker())).status).toBe(403);
    expect((await d.json(`/api/workers/${await workerIdOf("CP-1003")}`, "PATCH", { lastName: "X", version: 1 })).status).toBe(403);
  });

  it("signed out: 401", async () => {
    expect((await new Client().json("/api/workers")).status).toBe(401);
  });
});

describe("credentials access", () => {
  it("a lineworker reads their own credentials, and gets 403 for another worker's", async () => {
    const lw = await client("lineworker");
    const own = await workerIdOf("CP-1001");
    const other = await workerIdOf("CP-1005");
    const mine = await lw.json(`/api/credentials?workerId=${own}`);
    expect(mine.status).toBe(200);
    expect(mine.body.credentials.every((c: { workerId: number }) => c.workerId === own)).toBe(true);
    const theirs = await lw.json(`/api/credentials?workerId=${other}`);
    expect(theirs.status).toBe(403);
    const cred = await db("credentials").where({ worker_id: other, status: "current" }).first("id");
    expect((await lw.json(`/api/credentials/${cred.id}`)).status).toBe(403);
    expect((await lw.json(`/api/workers/${other}`)).status).toBe(403);
  });

  it("a lineworker opening another worker's credentials page is sent to /forbidden", async () => {
    const lw = await client("lineworker");
    const res = await lw.fetch(`/credentials/${await workerIdOf("CP-1005")}`);
    // Next answers a server redirect() with 307 (or streams a meta refresh for a page already started).
    const location = res.headers.get("location") ?? "";
    const body = res.status === 200 ? await res.text() : "";
    expect(location.includes("/forbidden") || body.includes("/forbidden")).toBe(true);
  });

  it("a supervisor reads credentials but cannot add one (403)", async () => {
    const s = await client("supervisor");
    expect((await s.json("/api/credentials?view=lapsed")).status).toBe(200);
    const r = await s.json("/api/credentials", "POST", { workerId: 1, qualificationTypeId: 1, issuedOn: "2026-01-01" });
    expect(r.status).toBe(403);
  });

  it("the lapsed view lists Brent Haugland's climbing (CP-1006), untouched by these tests", async () => {
    const hr = await client("hr");
    const r = await hr.json("/api/credentials?view=lapsed&qualification=climbing");
    expect(r.status).toBe(200);
    const nos = r.body.credentials.map((c: { employeeNo: string }) => c.employeeNo);
    expect(nos).toContain("CP-1006");
    expect(r.body.credentials.every((c: { daysLeft: number }) => c.daysLeft < 0)).toBe(true);
  });
});

describe("add, renew, pending renewal, verify", () => {
  let workerId: number;
  let climbing: number;
  let firstAid: number;

  beforeAll(async () => {
    const hr = await client("hr");
    const c = await hr.json("/api/workers", "POST", newWorker());
    workerId = c.body.worker.id;
    created.push(workerId);
    climbing = Number((await db("qualification_types").where({ code: "climbing" }).first("id")).id);
    firstAid = Number((await db("qualification_types").where({ code: "first_aid_cpr" }).first("id")).id);
  });

  async function upload(client: Client, forWorker: number) {
    const form = new FormData();
    form.set("file", new Blob([new Uint8Array(minimalPdf())], { type: "application/pdf" }), "card.pdf");
    form.set("workerId", String(forWorker));
    const res = await client.fetch("/api/files", { method: "POST", body: form });
    expect(res.status).toBe(201);
    return (await res.json()).file.id as number;
  }

  it("a type that needs evidence refuses a record without it (422 on evidenceFileId)", async () => {
    const hr = await client("hr");
    const r = await hr.json("/api/credentials", "POST", { workerId, qualificationTypeId: climbing, issuedOn: daysAgo(5) });
    expect(r.status).toBe(422);
    expect(r.body.issues[0].field).toBe("evidenceFileId");
  });

  it("renewing supersedes the old record in one step and proposes issued + 12 months − 1 day", async () => {
    const hr = await client("hr");
    const e1 = await upload(hr, workerId);
    const firstIssued = daysAgo(400);
    const first = await hr.json("/api/credentials", "POST", { workerId, qualificationTypeId: climbing, issuedOn: firstIssued, evidenceFileId: e1 });
    expect(first.status).toBe(201);
    expect(first.body.credential).toMatchObject({ status: "current", expiresOn: proposeExpiry(firstIssued, 12), verifiedByName: "Nadine Okonkwo" });
    expect(first.body.credential.daysLeft).toBeLessThan(0);
    const e2 = await upload(hr, workerId);
    const secondIssued = daysAgo(3);
    const second = await hr.json("/api/credentials", "POST", { workerId, qualificationTypeId: climbing, issuedOn: secondIssued, evidenceFileId: e2 });
    expect(second.status).toBe(201);
    expect(second.body.credential).toMatchObject({ status: "current", expiresOn: proposeExpiry(secondIssued, 12), supersedesId: first.body.credential.id });
    const rows = await db("credentials").where({ worker_id: workerId, qualification_type_id: climbing }).orderBy("id");
    expect(rows.map((r) => r.status)).toEqual(["superseded", "current"]);
    expect(await db("audit_log").where({ action: "credential.renew", entity_id: String(second.body.credential.id) }).first()).toBeTruthy();
  });

  it("an issue date after today, or an expiry before the issue date, is named", async () => {
    const hr = await client("hr");
    const future = await hr.json("/api/credentials", "POST", { workerId, qualificationTypeId: firstAid, issuedOn: "2099-01-01", evidenceFileId: await upload(hr, workerId) });
    expect(future.status).toBe(422);
    expect(future.body.issues[0].field).toBe("issuedOn");
    const backwards = await hr.json("/api/credentials", "POST", { workerId, qualificationTypeId: firstAid, issuedOn: daysAgo(10), expiresOn: daysAgo(20) });
    expect(backwards.status).toBe(422);
    expect(backwards.body.issues[0].field).toBe("expiresOn");
  });

  it("the lineworker's renewal is pending until HR verifies it; then it supersedes the old record", async () => {
    const lw = await client("lineworker");
    const hr = await client("hr");
    const own = await workerIdOf("CP-1001");
    // Their own first aid / CPR (Marcus Whitfield's record is put back as it was afterwards).
    const before = await db("credentials").where({ worker_id: own, qualification_type_id: firstAid, status: "current" }).first();
    const issuedOn = daysAgo(2);
    const otherTry = await lw.json("/api/credentials", "POST", { workerId: await workerIdOf("CP-1005"), qualificationTypeId: firstAid, issuedOn });
    expect(otherTry.status).toBe(403);
    const noEvidence = await lw.json("/api/credentials", "POST", { workerId: own, qualificationTypeId: firstAid, issuedOn });
    expect(noEvidence.status).toBe(422);
    const file = await upload(lw, own);
    const sent = await lw.json("/api/credentials", "POST", { workerId: own, qualificationTypeId: firstAid, issuedOn, evidenceFileId: file, status: "current" });
    expect(sent.status).toBe(201);
    expect(sent.body.credential.status).toBe("pending"); // a lineworker never writes current
    // Still counted as before: the pending row does not replace the current one.
    expect((await db("credentials").where({ id: before.id }).first()).status).toBe("current");
    // Lineworkers cannot verify.
    expect((await lw.json(`/api/credentials/${sent.body.credential.id}`, "PATCH", { action: "verify" })).status).toBe(403);
    const v = await hr.json(`/api/credentials/${sent.body.credential.id}`, "PATCH", { action: "verify" });
    expect(v.status).toBe(200);
    try {
      expect(v.body.credential).toMatchObject({ status: "current", supersedesId: before.id, verifiedByName: "Nadine Okonkwo", expiresOn: proposeExpiry(issuedOn, 24) });
      expect((await db("credentials").where({ id: before.id }).first()).status).toBe("superseded");
      const again = await hr.json(`/api/credentials/${before.id}`, "PATCH", { action: "verify" });
      expect(again.status).toBe(409);
    } finally {
      await db("credentials").where({ id: sent.body.credential.id }).delete();
      await db("credentials").where({ id: before.id }).update({ status: "current" });
      await db("files").where({ id: file }).delete();
    }
  });
});

describe("qualification types", () => {
  it("the codes the crew rules read cannot be renamed or deleted; names and periods can change", async () => {
    const hr = await client("hr");
    const t = await db("qualification_types").where({ code: "traffic_control" }).first();
    const rename = await hr.json(`/api/qualification-types/${t.id}`, "PATCH", { code: "flagging" });
    expect(rename.status).toBe(422);
    expect(rename.body.issues[0].field).toBe("code");
    expect((await hr.json(`/api/qualification-types/${t.id}`, "DELETE")).status).toBe(409);
    const edit = await hr.json(`/api/qualification-types/${t.id}`, "PATCH", { name: t.name, warnDays: t.warn_days });
    expect(edit.status).toBe(200);
    expect(edit.body.type).toMatchObject({ code: "traffic_control", locked: true });
  });

  it("a new type can be added and, while unused, deleted; a dispatcher cannot add one", async () => {
    const hr = await client("hr");
    const code = `test_${run.toLowerCase()}`;
    const add = await hr.json("/api/qualification-types", "POST", { code, name: "Confined space", renewalMonths: 24, warnDays: 45, needsEvidence: true });
    expect(add.status).toBe(201);
    expect(add.body.type).toMatchObject({ code, locked: false });
    expect((await (await client("dispatcher")).json("/api/qualification-types", "POST", { code: code + "x", name: "X", renewalMonths: 1, warnDays: 1 })).status).toBe(403);
    expect((await hr.json(`/api/qualification-types/${add.body.type.id}`, "DELETE")).status).toBe(200);
  });
});
