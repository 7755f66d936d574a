import { readdir } from "node:fs/promises";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import knex, { type Knex } from "knex";
import { dbConfig } from "@/knexfile";
import { as, Client, type DemoRole } from "@/tests/support/client";
import { elfBytes, minimalPdf, mzBytes, tinyPng } from "@/tests/support/files";

// Evidence uploads against the running app. The server stores files under UPLOAD_DIR
// (default <repo>/.data/uploads); run this with the same UPLOAD_DIR as the app, or neither.
// Magic numbers: PDF ISO 32000-1 §7.5.2, PNG spec §5.2, ELF System V ABI, MZ (PE/DOS stub).

const UPLOAD_DIR = process.env.UPLOAD_DIR || path.join(process.cwd(), ".data", "uploads");
let db: Knex;
const clients = new Map<DemoRole, Client>();
const client = async (role: DemoRole) => {
  if (!clients.has(role)) clients.set(role, await as(role));
  return clients.get(role)!;
};
const made: number[] = [];

async function storedFiles() {
  try {
    return (await readdir(UPLOAD_DIR)).length;
  } catch {
    return 0;
  }
}
async function fileRows() {
  return Number((await db("files").count({ n: "*" }).first())?.n);
}
async function workerId(no: string) {
  return Number((await db("workers").where({ employee_no: no }).first("id")).id);
}

async function upload(c: Client, bytes: Uint8Array, name: string, worker?: number, type = "application/pdf") {
  const form = new FormData();
  form.set("file", new Blob([new Uint8Array(bytes)], { type }), name);
  if (worker) form.set("workerId", String(worker));
  const res = await c.fetch("/api/files", { method: "POST", body: form });
  return { status: res.status, body: await res.json() };
}

beforeAll(() => {
  db = knex(dbConfig());
});
afterAll(async () => {
  if (made.length) await db("files").whereIn("id", made).delete();
  await db.destroy();
});

describe("refused uploads store nothing (no row, no file) and say why", () => {
  const cases: { name: string; bytes: () => Uint8Array; file: string; type: string; status: number; message: RegExp }[] = [
    { name: "a PNG renamed .pdf", bytes: tinyPng, file: "climbing-card.pdf", type: "application/pdf", status: 415, message: /ends in \.pdf but the contents are a PNG image/ },
    { name: "an ELF executable renamed .png", bytes: elfBytes, file: "card.png", type: "image/png", status: 415, message: /executable program/ },
    { name: "an MZ executable renamed .png", bytes: mzBytes, file: "card.png", type: "image/png", status: 415, message: /executable program/ },
    { name: "an 11 MB file", bytes: () => Buffer.concat([minimalPdf(), Buffer.alloc(11 * 1024 * 1024, 0x20)]), file: "big.pdf", type: "application/pdf", status: 413, message: /limit is 10 MB/ },
    { name: "a name with ../", bytes: minimalPdf, file: "../../etc/card.pdf", type: "application/pdf", status: 422, message: /\.\./ },
    { name: "a name with a control character", bytes: minimalPdf, file: "card\u0007.pdf", type: "application/pdf", status: 422, message: /control character/ },
  ];

  it.each(cases)("$name → $status", async ({ bytes, file, type, status, message }) => {
    const hr = await client("hr");
    const [rowsBefore, filesBefore] = [await fileRows(), await storedFiles()];
    const r = await upload(hr, bytes(), file, await workerId("CP-1005"), type);
    expect(r.status).toBe(status);
    expect(r.body.error).toMatch(message);
    expect(r.body.issues?.[0]?.field).toBe("file");
    expect(await fileRows()).toBe(rowsBefore);
    expect(await storedFiles()).toBe(filesBefore);
  });

  it("the client's Content-Type is not believed: a PNG sent as application/pdf named .png is stored as image/png", async () => {
    const hr = await client("hr");
    const r = await upload(hr, tinyPng(), "card.png", await workerId("CP-1005"), "application/pdf");
    expect(r.status).toBe(201);
    made.push(r.body.file.id);
    expect(r.body.file.mime).toBe("image/png");
  });
});

describe("a valid PDF is stored under its content hash and served only to the allowed roles", () => {
  let fileId: number;
  let sha: string;
  const pdf = minimalPdf(`Evidence ${Date.now()}`);
  const name = "Évaluation d’escalade – 2026.pdf";

  it("hr uploads it: one row, one file named by its SHA-256", async () => {
    const hr = await client("hr");
    const [rowsBefore, filesBefore] = [await fileRows(), await storedFiles()];
    const r = await upload(hr, pdf, name, await workerId("CP-1005"));
    expect(r.status).toBe(201);
    fileId = r.body.file.id;
    sha = r.body.file.sha256;
    made.push(fileId);
    expect(r.body.file).toMatchObject({ mime: "application/pdf", originalName: name, sizeBytes: pdf.length });
    expect(sha).toMatch(/^[0-9a-f]{64}$/);
    expect(await fileRows()).toBe(rowsBefore + 1);
    expect(await storedFiles()).toBe(filesBefore + 1);
    expect(await readdir(UPLOAD_DIR)).toContain(sha);
    const row = await db("files").where({ id: fileId }).first();
    expect(row).toMatchObject({ sha256: sha, original_name: name, mime: "application/pdf" });
  });

  it("hr 200 and supervisor 200, as an attachment with the stored type and nosniff", async () => {
    for (const role of ["hr", "supervisor", "admin"] as const) {
      const res = await (await client(role)).fetch(`/api/files/${fileId}`);
      expect(res.status, role).toBe(200);
      expect(res.headers.get("content-type")).toBe("application/pdf");
      expect(res.headers.get("x-content-type-options")).toBe("nosniff");
      // RFC 6266 with an RFC 8187 (5987) filename* for the non-ASCII name.
      const cd = res.headers.get("content-disposition") ?? "";
      expect(cd.startsWith("attachment;")).toBe(true);
      expect(cd).toContain(`filename*=UTF-8''${encodeURIComponent(name)}`);
      expect(Buffer.from(await res.arrayBuffer()).equals(pdf)).toBe(true);
    }
  });

  it("dispatcher 403, a lineworker who is not the owner 403, signed out 401", async () => {
    expect((await (await client("dispatcher")).fetch(`/api/files/${fileId}`)).status).toBe(403);
    // Marcus Whitfield (CP-1001) is not Lyle Kowalczyk (CP-1005), whose evidence this is.
    expect((await (await client("lineworker")).fetch(`/api/files/${fileId}`)).status).toBe(403);
    expect((await new Client().fetch(`/api/files/${fileId}`)).status).toBe(401);
  });

  it("the lineworker who owns a file may fetch it; they cannot upload for someone else", async () => {
    const lw = await client("lineworker");
    const own = await upload(lw, minimalPdf(`Marcus ${Date.now()}`), "first-aid.pdf");
    expect(own.status).toBe(201);
    made.push(own.body.file.id);
    expect(own.body.file.workerId).toBe(await workerId("CP-1001"));
    expect((await lw.fetch(`/api/files/${own.body.file.id}`)).status).toBe(200);
    const other = await upload(lw, minimalPdf(), "x.pdf", await workerId("CP-1005"));
    expect(other.status).toBe(403);
  });

  it("a dispatcher cannot upload (403)", async () => {
    expect((await upload(await client("dispatcher"), minimalPdf(), "x.pdf")).status).toBe(403);
  });
});
