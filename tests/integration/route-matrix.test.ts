// Route × role matrix (issue 10): every route handler under app/api is in the one table
// (tests/support/route-table.ts), every entry is walked for every role and signed out, and every
// mutation that succeeds leaves an audit row (DEVELOPERS.md: "Every mutation writes an audit row").
// Against the running app (APP_URL) and its database (DB_NAME).
import { readdir, readFile } from "node:fs/promises";
import path from "node:path";
import knex from "knex";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { dbConfig } from "@/knexfile";
import { addDays, todayIn } from "@/lib/time/days";
import { ROLES, type Role } from "@/lib/users/roles";
import { Client } from "../support/client";
import { makeOrder } from "../support/fixtures";
import { buildFixtures } from "../support/route-fixtures";
import { ROUTES, routeKey, type Caller, type Fx, type RouteEntry, type Sample } from "../support/route-table";

const db = knex(dbConfig());
let fx: Fx;
let cleanup: () => Promise<void> = async () => undefined;
const anon = new Client();

interface Outcome {
  key: string;
  caller: Caller;
  status: number;
  audit: number | null;
}
const outcomes: Outcome[] = [];

beforeAll(async () => {
  const built = await buildFixtures(db);
  fx = built.fx;
  cleanup = built.cleanup;
}, 120_000);

afterAll(async () => {
  try {
    await cleanup();
  } finally {
    await db.destroy();
  }
  // Which entries reached 2xx for which callers (the report in the Reliability table).
  const by = new Map<string, Outcome[]>();
  for (const o of outcomes) by.set(o.key, [...(by.get(o.key) ?? []), o]);
  const lines = [...by].map(([k, os]) => {
    const ok = os.filter((o) => o.status >= 200 && o.status < 300);
    const audited = ok.filter((o) => (o.audit ?? 0) > 0).length;
    return `${k.padEnd(52)} ${os.map((o) => `${o.caller}:${o.status}`).join(" ")}${ok.length && !k.startsWith("GET") ? `  audited ${audited}/${ok.length}` : ""}`;
  });
  console.log(`[route-matrix] ${by.size} entries, ${outcomes.length} calls\n${lines.join("\n")}`);
});

// --- (a) the table against the route files ---------------------------------------------------

const METHODS = ["GET", "POST", "PUT", "PATCH", "DELETE", "HEAD", "OPTIONS"];

async function routeFiles(dir: string): Promise<string[]> {
  const out: string[] = [];
  for (const e of await readdir(dir, { withFileTypes: true })) {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) out.push(...(await routeFiles(p)));
    else if (/^route\.(ts|tsx|js|mjs)$/.test(e.name)) out.push(p);
  }
  return out;
}

/** The HTTP methods a route file exports, read from its source. */
function exportedMethods(src: string): string[] {
  const found = new Set<string>();
  for (const m of src.matchAll(/export\s+(?:const|let|var)\s+([A-Z]+)\b/g)) found.add(m[1]);
  for (const m of src.matchAll(/export\s+(?:async\s+)?function\s*\*?\s*([A-Z]+)\s*\(/g)) found.add(m[1]);
  for (const m of src.matchAll(/export\s*\{([^}]*)\}/g)) {
    for (const part of m[1].split(",")) {
      const name = part.trim().split(/\s+as\s+/).pop()?.trim();
      if (name) found.add(name);
    }
  }
  return [...found].filter((m) => METHODS.includes(m)).sort();
}

const templateOf = (file: string) =>
  "/" +
  path
    .relative("app", path.dirname(file))
    .split(path.sep)
    .filter((seg) => !/^\(.*\)$/.test(seg))
    .join("/");

describe("the route table lists every route handler", () => {
  it("parses the three export styles", () => {
    expect(exportedMethods("export const GET = handler(async () => {});\nexport const POST = handler(")).toEqual(["GET", "POST"]);
    expect(exportedMethods("export async function GET() {}\nexport function DELETE(req) {}")).toEqual(["DELETE", "GET"]);
    expect(exportedMethods("const handler = NextAuth(o);\nexport { handler as GET, handler as POST };")).toEqual(["GET", "POST"]);
    expect(exportedMethods("export const dynamic = 'force-dynamic'; export const maxDuration = 120;")).toEqual([]);
  });

  it("no route file or method is missing from the table, and no table entry lacks a route", async () => {
    const files = await routeFiles("app/api");
    expect(files.length).toBeGreaterThan(30);
    const inCode = new Set<string>();
    for (const f of files) for (const m of exportedMethods(await readFile(f, "utf8"))) inCode.add(routeKey(m, templateOf(f)));
    const inTable = new Set(ROUTES.map((r) => routeKey(r.method, r.route)));
    expect(inTable.size, "duplicate table entries").toBe(ROUTES.length);
    const missing = [...inCode].filter((k) => !inTable.has(k)).sort();
    const stale = [...inTable].filter((k) => !inCode.has(k)).sort();
    expect(missing, `route handlers missing from tests/support/route-table.ts:\n  ${missing.join("\n  ")}`).toEqual([]);
    expect(stale, `table entries with no route handler:\n  ${stale.join("\n  ")}`).toEqual([]);
  });

  it("every mutation entry says whether it is audited", () => {
    const silent = ROUTES.filter((r) => r.method !== "GET" && r.audit === undefined).map((r) => routeKey(r.method, r.route));
    expect(silent).toEqual([]);
  });
});

// --- (b) every entry for every role, and (c) the audit rows -----------------------------------

async function call(c: Client, method: string, s: Sample) {
  const headers: Record<string, string> = { ...(s.headers ?? {}) };
  let body: BodyInit | undefined;
  if (s.form) body = s.form();
  else if (s.raw) {
    headers["content-type"] = s.raw.type;
    body = s.raw.text;
  } else if (s.body !== undefined) {
    headers["content-type"] = "application/json";
    body = JSON.stringify(s.body);
  }
  const res = await c.fetch(s.path, { method, headers, body });
  const text = await res.text();
  return { status: res.status, text, type: res.headers.get("content-type") ?? "" };
}

const auditMax = async () => Number((await db("audit_log").max({ id: "id" }).first())?.id ?? 0);
const expected = (e: RouteEntry, caller: Caller) => (typeof e.status === "number" ? e.status : (e.status[caller] ?? e.status[caller as Role]));

describe("every route for every role", () => {
  it.each(ROUTES.map((e) => [routeKey(e.method, e.route), e] as const))("%s", async (key, e) => {
    const allowed: Caller[] = e.roles === "public" ? ["anon", ...ROLES] : e.roles;
    const denied: Caller[] = e.roles === "public" ? [] : (["anon", ...ROLES] as Caller[]).filter((r) => !allowed.includes(r));
    const client = (c: Caller) => (c === "anon" ? anon : fx.clients[c]);
    // Refused callers first, with one sample: the role check comes before anything is read.
    if (denied.length) {
      const probe = await e.sample(fx, allowed[0]);
      for (const caller of denied) {
        const r = await call(client(caller), e.method, probe);
        outcomes.push({ key, caller, status: r.status, audit: null });
        expect(r.status, `${caller} → ${key}: ${r.text.slice(0, 200)}`).toBe(caller === "anon" ? 401 : 403);
        expect(r.type, `${caller} → ${key} answers JSON`).toMatch(/application\/json/);
        expect(JSON.parse(r.text).error, `${caller} → ${key} says why`).toBeTruthy();
      }
    }
    // Allowed callers: a fresh sample each, the declared status, and an audit row for a mutation.
    for (const caller of allowed) {
      const s = await e.sample(fx, caller);
      const before = await auditMax();
      const r = await call(client(caller), e.method, s);
      const wrote = Number((await db("audit_log").where("id", ">", before).count({ n: "*" }).first())?.n ?? 0);
      outcomes.push({ key, caller, status: r.status, audit: wrote });
      expect(r.status, `${caller} → ${key}: ${r.text.slice(0, 300)}`).not.toBe(401);
      expect(r.status, `${caller} → ${key}: ${r.text.slice(0, 300)}`).not.toBe(403);
      expect(r.status, `${caller} → ${key}: ${r.text.slice(0, 300)}`).toBeLessThan(500);
      const want = expected(e, caller);
      if (want !== undefined) expect(r.status, `${caller} → ${key}: ${r.text.slice(0, 300)}`).toBe(want);
      if (e.method !== "GET" && e.audit === true && r.status >= 200 && r.status < 300) {
        expect(wrote, `${caller} → ${key} answered ${r.status} but wrote no audit_log row`).toBeGreaterThan(0);
      }
    }
  });

  it("the audit check was real: every audited mutation reached 2xx and wrote its audit row", () => {
    const audited = ROUTES.filter((r) => r.method !== "GET" && r.audit === true).map((r) => routeKey(r.method, r.route));
    const reached = new Set(outcomes.filter((o) => o.status >= 200 && o.status < 300 && (o.audit ?? 0) > 0).map((o) => o.key));
    expect(audited.filter((k) => !reached.has(k))).toEqual([]);
    expect(audited.length).toBeGreaterThanOrEqual(40);
  });
});

// --- yard scope: a dispatcher of one yard against every route of another (issue 15) -----------
// Every sample is built on the North yard's records (fixtures). The Mesa dispatcher may read
// North's board and records (to borrow a crew) but changes nothing of North's, and reads no
// North worker's phone, e-mail or texts: each mutation a dispatcher may call answers 403 and
// writes no audit row, unless its table entry says why it touches no yard.

describe("a dispatcher of another yard (Mesa) against every route a dispatcher may call", () => {
  let mesa: Client;
  beforeAll(async () => {
    mesa = new Client();
    const r = await mesa.signIn("dispatch.mesa@cedarprairie.example", "board-mesa-26");
    if (!r.signedIn) throw new Error(`Mesa dispatcher sign-in failed: ${r.status}`);
  });
  const mine = ROUTES.filter((e) => e.roles !== "public" && e.roles.includes("dispatcher"));
  const scoped = (e: RouteEntry) => e.yard === "edit" || e.yard === "contact" || (e.yard === undefined && e.method !== "GET");
  it("the fixtures' yard is North and the Mesa dispatcher is assigned Mesa only", async () => {
    expect(fx.yard.code).toBe("NOR");
    const u = await db("users").where({ email: "dispatch.mesa@cedarprairie.example" }).first("id");
    const yards = await db("user_yards as uy").join("yards as y", "y.id", "uy.yard_id").where("uy.user_id", u.id).pluck("y.code");
    expect(yards).toEqual(["MES"]);
    expect(mine.filter(scoped).length).toBeGreaterThanOrEqual(30);
  });
  it.each(mine.map((e) => [routeKey(e.method, e.route), e] as const))("%s", async (key, e) => {
    const s = await e.sample(fx, "dispatcher");
    const before = await auditMax();
    const r = await call(mesa, e.method, s);
    const wrote = Number((await db("audit_log").where("id", ">", before).count({ n: "*" }).first())?.n ?? 0);
    outcomes.push({ key: `${key} (other yard)`, caller: "dispatcher", status: r.status, audit: wrote });
    if (scoped(e)) {
      expect(r.status, `Mesa → ${key}: ${r.text.slice(0, 300)}`).toBe(403);
      expect(JSON.parse(r.text).error, `Mesa → ${key} says why`).toMatch(/yard/);
      expect(wrote, `Mesa → ${key} was refused but wrote an audit row`).toBe(0);
    } else {
      expect(r.status, `Mesa → ${key}: ${r.text.slice(0, 300)}`).not.toBe(403);
      expect(r.status, `Mesa → ${key}: ${r.text.slice(0, 300)}`).toBeLessThan(500);
    }
  });
});

// --- a lineworker reads only their own ---------------------------------------------------------

describe("a lineworker (Marcus Whitfield, CP-1001) reads and writes only their own", () => {
  it("My week lists their assignments and not a crew they are not on", async () => {
    // Five days out: inside My week's window (8 days), away from the demo's tomorrow.
    const mine = await makeOrder(db, { offsetDays: 5, positions: ["lead"], workType: "patrol", energized: false });
    const theirs = await makeOrder(db, { offsetDays: 5, positions: ["lead"], workType: "patrol", energized: false });
    try {
      for (const [o, w] of [
        [mine, fx.marcus.workerId],
        [theirs, fx.other.workerId],
      ] as const) {
        await db("assignments").insert({ work_order_id: o.id, position_id: o.positionIds.lead, worker_id: w, holds_position: o.positionIds.lead, status: "sent", sent_at: new Date(), reply_code: "4242" });
      }
      const page = await fx.clients.lineworker.fetch("/me");
      expect(page.status).toBe(200);
      const html = await page.text();
      expect(html).toContain(mine.number);
      expect(html).not.toContain(theirs.number);
    } finally {
      await db("work_orders").whereIn("id", [mine.id, theirs.id]).delete();
    }
  });

  it("another worker's assignment, briefing, credentials, files, record, time and leave are refused", async () => {
    const lw = fx.clients.lineworker;
    const hr = fx.clients.hr;
    // Assignments: answering someone else's.
    const a = await fx.sentTo(fx.other.workerId);
    expect((await lw.json(`/api/assignments/${a.assignmentId}/respond`, "POST", { answer: "confirm" })).status).toBe(403);
    // Briefings of an order they are not on: the briefing, its sheet and its photos.
    const elsewhere = a.seat.orderId;
    expect((await lw.json(`/api/briefings/${elsewhere}`)).status).toBe(403);
    expect((await lw.fetch(`/api/briefings/${elsewhere}/pdf`)).status).toBe(403);
    expect((await lw.fetch(`/api/briefings/${elsewhere}/photo/${fx.photoFileId}`)).status).toBe(403);
    // Credentials: the list holds only their own rows; someone else's is 403.
    const list = await lw.json<{ credentials: { id: number; workerId: number }[] }>("/api/credentials");
    expect(list.status).toBe(200);
    expect(list.body.credentials.length).toBeGreaterThan(0);
    expect(new Set(list.body.credentials.map((c) => c.workerId))).toEqual(new Set([fx.marcus.workerId]));
    expect((await lw.json(`/api/credentials?workerId=${fx.other.workerId}`)).status).toBe(403);
    const othersCredential = await db("credentials").where({ worker_id: fx.other.workerId }).first("id");
    expect((await lw.json(`/api/credentials/${othersCredential.id}`)).status).toBe(403);
    expect((await lw.json("/api/credentials", "POST", { workerId: fx.other.workerId, qualificationTypeId: fx.qualTypeId, issuedOn: "2026-01-02", evidenceFileId: fx.marcusFileId })).status).toBe(403);
    // Files: their own opens, another worker's does not, and they cannot upload for someone else.
    expect((await lw.fetch(`/api/files/${fx.marcusFileId}`)).status).toBe(200);
    const form = new FormData();
    form.set("file", new Blob([new Uint8Array(fx.pdf())], { type: "application/pdf" }), "other.pdf");
    form.set("workerId", String(fx.worker.id));
    const up = await hr.fetch("/api/files", { method: "POST", body: form });
    expect(up.status).toBe(201);
    const othersFile = (await up.json()).file.id;
    expect((await lw.fetch(`/api/files/${othersFile}`)).status).toBe(403);
    const forOther = new FormData();
    forOther.set("file", new Blob([new Uint8Array(fx.pdf())], { type: "application/pdf" }), "x.pdf");
    forOther.set("workerId", String(fx.other.workerId));
    expect((await lw.fetch("/api/files", { method: "POST", body: forOther })).status).toBe(403);
    // The worker record.
    expect((await lw.json(`/api/workers/${fx.marcus.workerId}`)).status).toBe(200);
    expect((await lw.json(`/api/workers/${fx.other.workerId}`)).status).toBe(403);
    // Time: their own week only.
    expect((await lw.json(`/api/time-records?workerId=${fx.other.workerId}`)).status).toBe(403);
    const week = await lw.json("/api/time-records");
    expect(week.status).toBe(200);
    // Leave: the list is their own; another's entry is "no such entry"; no request or withdrawal for another.
    const theirs = await fx.unavailability(fx.other.workerId, "requested");
    const leave = await lw.json<{ entries: { id: number; workerId: number }[] }>("/api/leave");
    expect(leave.status).toBe(200);
    expect(leave.body.entries.every((x) => x.workerId === fx.marcus.workerId)).toBe(true);
    expect(leave.body.entries.map((x) => x.id)).not.toContain(theirs);
    expect((await lw.json(`/api/leave?workerId=${fx.other.workerId}`)).status).toBe(403);
    expect((await lw.json(`/api/leave/${theirs}`)).status).toBe(404);
    expect((await lw.json(`/api/leave/${theirs}`, "DELETE")).status).toBe(403);
    const day = addDays(todayIn(fx.yard.timezone), 260);
    expect((await lw.json("/api/leave", "POST", { workerId: fx.other.workerId, kind: "leave", start: `${day}T00:00`, end: `${day}T12:00` })).status).toBe(403);
    // The calendar link of someone else.
    expect((await lw.json("/api/calendar/reset", "POST", { workerId: fx.other.workerId })).status).toBe(403);
  });
});
