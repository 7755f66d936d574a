// Bad input (issue 10): every JSON route, every query route and every id in a path, fuzzed with
// fast-check — wrong types, ~1 MB strings, 5,000-level nesting, lone surrogates, SQL and HTML
// metacharacters, prototype-pollution keys, raw garbage bytes. The app must never answer 500
// (DEVELOPERS.md: "Never a 500 for bad input"), and what was stored before the run must be
// unchanged (checksums of workers, assignments, credentials, work_orders and policies, rows that
// existed before; audit_log, board_events and sign_in_attempts may grow).
// Strings with quotes and unicode must round-trip byte for byte.
import { createHash, randomBytes } from "node:crypto";
import bcrypt from "bcryptjs";
import fc from "fast-check";
import knex from "knex";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { dbConfig } from "@/knexfile";
import type { Role } from "@/lib/users/roles";
import { Client } from "../support/client";
import { streamed } from "../support/raw-http";
import { isIsoDate } from "@/lib/rules/time";
import { buildFixtures } from "../support/route-fixtures";
import { ROUTES, routeKey, type Fx, type RouteEntry, type Sample } from "../support/route-table";

const RUNS = Number(process.env.FUZZ_RUNS ?? 15);
const db = knex(dbConfig());
let fx: Fx;
let cleanup: () => Promise<void> = async () => undefined;
let before: Record<string, number> = {};
let sums: Record<string, string> = {};
// Organisation-wide settings (the policy, crew templates) are fuzzed in an organisation of the
// test's own: a body that happens to be valid changes that one, never the demo's.
let orgIdsBefore: number[] = [];
const spare = { orgId: 0, workTypeId: 0, email: "", admin: new Client() };
const OTHER_ORG: Record<string, () => Sample> = {
  "PUT /api/policies": () => ({
    path: "/api/policies",
    body: { minRestHours: 8, maxShiftHours: 16, credentialWarnDays: 30, regularHoursWeek: 40, regularHoursDay: 8, replyDeadlineHours: 10, raisedToBlock: [] },
  }),
  "PUT /api/work-types": () => ({ path: "/api/work-types", body: { workTypes: [{ id: spare.workTypeId, name: "Fuzz patrol", minCrew: 1, digs: false, positions: ["lead"] }] } }),
  "PUT /api/work-types/[id]": () => ({ path: `/api/work-types/${spare.workTypeId}`, body: { name: "Fuzz patrol", minCrew: 1, digs: false, positions: ["lead"] } }),
};
const counts = { requests: 0, byStatus: new Map<number, number>() };
const datesTried = { routes: 0, cases: 0 };
const streamedTried = { total: 0, refused: 0 };

// --- the nasty values, as JSON text fragments (so keys like __proto__ survive) -----------------

const deepArray = (n: number) => "[".repeat(n) + "]".repeat(n);
const deepObject = (n: number) => '{"a":'.repeat(n) + "1" + "}".repeat(n);
const NASTY_TEXT = [
  "' OR '1'='1",
  "'; DROP TABLE workers; --",
  '" OR ""="',
  "1; DELETE FROM assignments WHERE 1=1",
  "\\'; SELECT SLEEP(10); --",
  "<script>alert(1)</script>",
  '"><img src=x onerror=alert(1)>',
  "%00%27%22",
  "\u0000",
  "\ud800",
  "a\udfffb",
  "\ud83d",
  "😀👷‍♀️🔌",
  "Ω≈ç√∫ 中文 עברית",
  "\u202e\u2066evil",
  "../../etc/passwd",
  "${7*7}{{7*7}}",
  "0x7fffffff",
  "NaN",
  " ",
  "0000-00-00",
  "2026-02-30",
  "2026-13-01",
  "9999-12-31",
  "2026-02-30T07:00",
  "2026-03-08T02:30",
  "+275760-09-13",
];
const jsonText = (s: string) => JSON.stringify(s);
const nastyFragment: fc.Arbitrary<string> = fc.oneof(
  fc.constantFrom(...NASTY_TEXT).map(jsonText),
  fc.constant(jsonText("x".repeat(999_000))), // just under readJson's 1 MB limit
  fc.constant(jsonText("é".repeat(600_000))), // 1.2 MB of UTF-8
  fc.constant(deepArray(5000)),
  fc.constant(deepObject(5000)),
  fc.constant('{"__proto__":{"role":"admin","isAdmin":true},"constructor":{"prototype":{"polluted":true}}}'),
  fc.constantFrom("-1", "0", "9007199254740993", "1e308", "-1e308", "1.5", "null", "true", "[]", "{}", '[null,{"__proto__":1}]'),
  fc.string({ unit: "binary", maxLength: 40 }).map(jsonText),
  fc.string({ unit: "grapheme", maxLength: 40 }).map(jsonText),
  fc.jsonValue({ maxDepth: 3 }).map((v) => JSON.stringify(v) ?? "null"),
);

/** Field paths of a sample body (objects only, two levels deep, arrays' first element). */
function paths(v: unknown, prefix: (string | number)[] = [], depth = 0): (string | number)[][] {
  if (depth > 2 || v === null || typeof v !== "object") return [];
  const out: (string | number)[][] = [];
  const entries: [string | number, unknown][] = Array.isArray(v) ? (v.length ? [[0, v[0]]] : []) : Object.entries(v);
  for (const [k, child] of entries) {
    out.push([...prefix, k]);
    out.push(...paths(child, [...prefix, k], depth + 1));
  }
  return out;
}

const SENTINEL = "\u0001FUZZ\u0001";
function withField(body: unknown, path: (string | number)[], fragment: string): string {
  const copy = structuredClone(body) as Record<string | number, unknown>;
  let at: Record<string | number, unknown> = copy;
  for (const k of path.slice(0, -1)) at = at[k] as Record<string | number, unknown>;
  at[path[path.length - 1]] = SENTINEL;
  return JSON.stringify(copy).replace(JSON.stringify(SENTINEL), fragment);
}

type Case = { kind: "body"; text: string } | { kind: "bytes"; bytes: Uint8Array };

function bodyCases(sample: unknown): fc.Arbitrary<Case> {
  const ps = paths(sample);
  const options: fc.Arbitrary<Case>[] = [
    // The whole body replaced.
    nastyFragment.map((text) => ({ kind: "body" as const, text })),
    // Not JSON at all, or bytes that are not UTF-8.
    fc.constantFrom("{", "{'a':1}", '{"a":1,}', "\u0000", "[".repeat(100_000), "undefined").map((text) => ({ kind: "body" as const, text })),
    fc.uint8Array({ minLength: 1, maxLength: 64 }).map((bytes) => ({ kind: "bytes" as const, bytes: new Uint8Array([0xff, 0xfe, ...bytes]) })),
  ];
  if (sample && typeof sample === "object" && !Array.isArray(sample)) {
    // Prototype-pollution keys beside a valid body.
    options.push(
      fc.constantFrom('"__proto__":{"role":"admin"}', '"constructor":{"prototype":{"polluted":true}}', '"__proto__":null', '"prototype":[1]').map((extra) => ({
        kind: "body" as const,
        text: JSON.stringify(sample).replace(/^\{/, `{${extra},`),
      })),
    );
  }
  if (ps.length) {
    // One field of a valid body replaced (weighted: this is where validation is tested).
    const mutate = fc.tuple(fc.constantFrom(...ps), nastyFragment).map(([p, f]) => ({ kind: "body" as const, text: withField(sample, p, f) }));
    options.push(mutate, mutate, mutate);
  }
  return fc.oneof(...options);
}

const NASTY_QUERY = fc.oneof(
  fc.constantFrom(...NASTY_TEXT),
  fc.constant("x".repeat(8_000)),
  fc.constantFrom("-1", "0", "1e308", "99999999999999999999", "2026-02-30", "9999-12-31", "0000-00-00", "true", "[]", "%", "%zz"),
  fc.string({ unit: "grapheme", maxLength: 30 }),
);

function queryCases(sample: Sample): fc.Arbitrary<string> {
  const u = new URL(sample.path, "http://x");
  const keys = [...u.searchParams.keys()];
  const swap = fc.tuple(keys.length ? fc.constantFrom(...keys) : fc.constant("q"), NASTY_QUERY).map(([k, v]) => {
    const q = new URLSearchParams(u.searchParams);
    q.set(k, v);
    return `${u.pathname}?${q}`;
  });
  const extra = fc.constantFrom("__proto__[role]=admin", "constructor[prototype][polluted]=1", "__proto__=1", "a=1&a=2&a=3").map((e) => `${u.pathname}?${u.searchParams}&${e}`);
  const dup = keys.length ? fc.constantFrom(...keys).map((k) => `${u.pathname}?${u.searchParams}&${encodeURIComponent(k)}=second`) : extra;
  return fc.oneof(swap, swap, extra, dup);
}

// Not ids, and other spellings of a real id ("0x1f" is 31, "1e1" is 10 to Number()): all "no such record".
const BAD_IDS = ["0", "-1", "1.5", "1e1", "1e308", "99999999999999999999", "2147483648", "0x1f", "0b11", "%2B7", "7%20", "%207", "NaN", "Infinity", "%20", "%27%20OR%201%3D1", "%00", "..%2F..%2Fetc", "%F0%9F%98%80", "1%3B%20DROP%20TABLE%20workers"];

// --- helpers ---------------------------------------------------------------------------------

/**
 * Defects found here in code another issue owns, reported rather than fixed in this one; each is
 * tolerated only for exactly the input that shows it, and listed in the run's summary line.
 * POST /api/fill: lib/fill/schema.ts checks the date's shape but not that it is a real day
 * (0000-00-00, 2026-02-30, 9999-12-31 → 500); the fix is the refine lib/board/schema.ts uses.
 */
const KNOWN_OPEN: Record<string, (requestText: string) => boolean> = {};
const knownSeen = new Map<string, number>();
function tolerated(key: string, status: number, requestText: string) {
  if (status < 500 || !KNOWN_OPEN[key]?.(requestText)) return false;
  knownSeen.set(key, (knownSeen.get(key) ?? 0) + 1);
  return true;
}

const PREFERENCE: Role[] = ["dispatcher", "supervisor", "hr", "admin", "lineworker"];
const fuzzer = (e: RouteEntry): Role | "anon" => (e.roles === "public" ? "anon" : PREFERENCE.find((r) => (e.roles as Role[]).includes(r))!);

async function send(c: Client, method: string, path: string, body?: Case, headers: Record<string, string> = {}) {
  const init: RequestInit = { method, headers: { ...headers } };
  if (body) {
    (init.headers as Record<string, string>)["content-type"] = "application/json";
    init.body = body.kind === "body" ? body.text : new Blob([new Uint8Array(body.bytes)]);
  }
  const res = await c.fetch(path, init);
  const text = await res.text();
  counts.requests++;
  counts.byStatus.set(res.status, (counts.byStatus.get(res.status) ?? 0) + 1);
  return { status: res.status, text };
}

const KEY_TABLES = ["workers", "assignments", "credentials", "work_orders"] as const;

async function checksum(): Promise<Record<string, string>> {
  const out: Record<string, string> = {};
  for (const t of KEY_TABLES) {
    // booking_seq is a counter that a successful placement, leave or worked-time write bumps on
    // an existing worker (the Galera certification key, issue 17), not stored content.
    const rows = (await db(t).where("id", "<=", before[t]).orderBy("id")).map(({ booking_seq: _seq, ...r }: Record<string, unknown>) => r);
    out[t] = `${rows.length}:${createHash("sha256").update(JSON.stringify(rows)).digest("hex")}`;
  }
  const policies = await db("policies").whereIn("organisation_id", orgIdsBefore).orderBy("organisation_id");
  out.policies = `${policies.length}:${createHash("sha256").update(JSON.stringify(policies)).digest("hex")}`;
  return out;
}

const client = (c: Role | "anon") => (c === "anon" ? new Client() : fx.clients[c]); // a signed-out caller for public routes

beforeAll(async () => {
  // The rows that exist before this file runs are the ones that must not change.
  for (const t of KEY_TABLES) before[t] = Number((await db(t).max({ id: "id" }).first())?.id ?? 0);
  orgIdsBefore = (await db("organisations").pluck("id")).map(Number);
  const built = await buildFixtures(db, { firstOffset: 330 });
  fx = built.fx;
  cleanup = built.cleanup;
  const run = Date.now().toString(36);
  [spare.orgId] = await db("organisations").insert({ name: "Fuzz Test Co-op", slug: `fuzz-${run}` });
  await db("policies").insert({ organisation_id: spare.orgId });
  [spare.workTypeId] = await db("work_types").insert({ organisation_id: spare.orgId, code: "patrol", name: "Fuzz patrol", rule_type: "patrol", min_crew: 1, digs: false });
  await db("work_type_positions").insert({ work_type_id: spare.workTypeId, position: "lead", sort: 0 });
  const password = randomBytes(12).toString("hex");
  spare.email = `fuzz-admin-${run}@fuzz.example`;
  await db("users").insert({ organisation_id: spare.orgId, email: spare.email, name: "Fuzz Admin", role: "admin", password_hash: await bcrypt.hash(password, 4) });
  if (!(await spare.admin.signIn(spare.email, password)).signedIn) throw new Error("the fuzz organisation's admin could not sign in");
  sums = await checksum();
}, 120_000);

afterAll(async () => {
  console.log(
    `[fuzz] ${counts.requests} requests; statuses ${[...counts.byStatus].sort((a, b) => a[0] - b[0]).map(([s, n]) => `${s}×${n}`).join(" ")}` +
      (knownSeen.size ? `; known open (see KNOWN_OPEN): ${[...knownSeen].map(([k, n]) => `${k} ×${n}`).join(", ")}` : ""),
  );
  try {
    await cleanup();
    if (spare.orgId) {
      // The test's own organisation and everything it wrote (its audit rows included).
      for (const t of ["audit_log", "board_events", "users", "policies"]) await db(t).where({ organisation_id: spare.orgId }).delete();
      await db("work_types").where({ organisation_id: spare.orgId }).delete();
      await db("sign_in_attempts").where({ email: spare.email }).delete();
      await db("organisations").where({ id: spare.orgId }).delete();
    }
  } finally {
    await db.destroy();
  }
});

// --- the properties --------------------------------------------------------------------------

const JSON_ROUTES = ROUTES.filter((e) => e.fuzz === "json");
const QUERY_ROUTES = ROUTES.filter((e) => e.fuzz === "query");
const PARAM_ROUTES = ROUTES.filter((e) => e.route.includes("[") && !e.route.includes("[...") && e.roles !== "public");

describe(`JSON bodies (${RUNS} runs per route)`, () => {
  it.each(JSON_ROUTES.map((e) => [routeKey(e.method, e.route), e] as const))("%s never answers 500", async (key, e) => {
    const who = fuzzer(e);
    const own = OTHER_ORG[key] as (() => Sample) | undefined;
    const c = own ? spare.admin : client(who)!;
    const s = own ? own() : await e.sample(fx, who);
    await fc.assert(
      fc.asyncProperty(bodyCases(s.body ?? {}), async (body) => {
        const r = await send(c, e.method, s.path, body);
        if (tolerated(key, r.status, body.kind === "body" ? body.text : "")) return;
        if (r.status >= 500) throw new Error(`${e.method} ${s.path} → ${r.status} ${r.text.slice(0, 300)}\nbody: ${body.kind === "body" ? body.text.slice(0, 300) : `bytes ${body.bytes.length}`}`);
        // Errors are JSON with a message, never a stack trace.
        if (r.status >= 400 && r.status !== 413) {
          const parsed = JSON.parse(r.text);
          if (typeof parsed.error !== "string" || /\bat .+\.(js|ts):\d+/.test(r.text)) throw new Error(`${r.status} without a plain JSON error: ${r.text.slice(0, 300)}`);
        }
      }),
      { numRuns: RUNS, endOnFailure: true },
    );
  });
});

describe("query strings", () => {
  it.each(QUERY_ROUTES.map((e) => [routeKey(e.method, e.route), e] as const))("%s never answers 500", async (_key, e) => {
    const who = fuzzer(e);
    const c = client(who)!;
    const s = await e.sample(fx, who);
    await fc.assert(
      fc.asyncProperty(queryCases(s), async (path) => {
        const r = await send(c, e.method, path, s.body === undefined ? undefined : { kind: "body", text: JSON.stringify(s.body) });
        if (r.status >= 500) throw new Error(`${e.method} ${path.slice(0, 200)} → ${r.status} ${r.text.slice(0, 300)}`);
      }),
      { numRuns: RUNS, endOnFailure: true },
    );
  });
});

describe("ids in the path", () => {
  it.each(PARAM_ROUTES.map((e) => [routeKey(e.method, e.route), e] as const))("%s: a bad or aliased id is 404, never 500", async (_key, e) => {
    const who = fuzzer(e);
    const c = client(who)!;
    const s = await e.sample(fx, who);
    const segments = e.route.split("/");
    const real = new URL(s.path, "http://x");
    const parts = real.pathname.split("/");
    for (let i = 0; i < segments.length; i++) {
      if (!segments[i].startsWith("[")) continue;
      for (const bad of BAD_IDS) {
        const p = [...parts];
        p[i] = bad;
        const path = p.join("/") + real.search;
        const r = await send(c, e.method, path, s.body === undefined ? undefined : { kind: "body", text: JSON.stringify(s.body) });
        expect(r.status, `${e.method} ${path} → ${r.text.slice(0, 200)}`).toBeLessThan(500);
        expect([400, 404], `${e.method} ${path} → ${r.status} ${r.text.slice(0, 200)}`).toContain(r.status);
      }
    }
  });
});

// Every date or date-time field of every JSON sample, and every date in a query, gets each
// impossible or out-of-range day: systematic, where the random runs above only sample.
const BAD_DAYS = ["0000-00-00", "2026-02-30", "2026-13-01", "2025-02-29", "0001-01-01", "9999-12-31", "+275760-09-13", "2026-1-5", "２０２６-０１-０５"];
const BAD_TIMES = ["T07:00", "T24:00", "T23:60", "T02:30", ""]; // 02:30 on 2026-03-08 is in a DST gap (America/Chicago)

function dateFields(v: unknown, prefix: (string | number)[] = []): (string | number)[][] {
  if (typeof v === "string") return /^\d{4}-\d{2}-\d{2}/.test(v) ? [prefix] : [];
  if (!v || typeof v !== "object") return [];
  const entries: [string | number, unknown][] = Array.isArray(v) ? v.map((x, i) => [i, x] as [number, unknown]).slice(0, 2) : Object.entries(v);
  return entries.flatMap(([k, child]) => dateFields(child, [...prefix, k]));
}

describe("dates: impossible and out-of-range days are refused, never 500", () => {
  const withDates = ROUTES.filter((e) => e.fuzz === "json" || e.fuzz === "query");
  it.each(withDates.map((e) => [routeKey(e.method, e.route), e] as const))("%s", async (key, e) => {
    const who = fuzzer(e);
    const own = OTHER_ORG[key] as (() => Sample) | undefined;
    const c = own ? spare.admin : client(who)!;
    const s = own ? own() : await e.sample(fx, who);
    const url = new URL(s.path, "http://x");
    let tried = 0;
    // Planned before the loops: every date parameter and every date field gets every bad value.
    const timeValues = BAD_DAYS.length * BAD_TIMES.slice(0, 1).length + BAD_TIMES.length;
    const planned =
      [...url.searchParams.values()].filter((v) => /^\d{4}-\d{2}-\d{2}$/.test(v)).length * (BAD_DAYS.length + 1) +
      (s.body === undefined ? [] : dateFields(s.body)).reduce((n, p) => {
        let at: unknown = s.body;
        for (const k of p) at = (at as Record<string | number, unknown>)[k];
        return n + (String(at).includes("T") ? timeValues : BAD_DAYS.length);
      }, 0);
    for (const [k, v] of url.searchParams) {
      if (!/^\d{4}-\d{2}-\d{2}$/.test(v)) continue;
      for (const bad of [...BAD_DAYS, "2026-03-08"]) {
        const q = new URLSearchParams(url.searchParams);
        q.set(k, bad);
        const path = `${url.pathname}?${q}`;
        const r = await send(c, e.method, path, s.body === undefined ? undefined : { kind: "body", text: JSON.stringify(s.body) });
        tried++;
        expect(r.status, `${e.method} ${path}: ${r.text.slice(0, 200)}`).toBeLessThan(500);
      }
    }
    for (const p of s.body === undefined ? [] : dateFields(s.body)) {
      let at: unknown = s.body;
      for (const k of p) at = (at as Record<string | number, unknown>)[k];
      const isTime = String(at).includes("T");
      const values = isTime ? [...BAD_DAYS.flatMap((d) => BAD_TIMES.slice(0, 1).map((t) => d + t)), ...BAD_TIMES.map((t) => `2026-03-08${t}`)] : BAD_DAYS;
      for (const bad of values) {
        const text = withField(s.body, p, JSON.stringify(bad));
        const r = await send(c, e.method, s.path, { kind: "body", text });
        tried++;
        if (tolerated(key, r.status, text)) continue;
        expect(r.status, `${e.method} ${s.path} ${p.join(".")}=${bad}: ${r.text.slice(0, 200)}`).toBeLessThan(500);
      }
    }
    // Every planned case was sent (none skipped by an early exit); the total is checked below.
    expect(tried).toBe(planned);
    datesTried.cases += tried;
    if (tried) datesTried.routes++;
  });

  it("the date cases were real: many routes, hundreds of bad days", () => {
    expect(datesTried.routes).toBeGreaterThanOrEqual(10);
    expect(datesTried.cases).toBeGreaterThanOrEqual(300);
  });
});

// Streamed oversized bodies (issue 15, finding 7): chunked, with no Content-Length, so nothing
// but counting as the body arrives can stop them. Every JSON route (readJson's 1 MB limit), every
// upload (10 MB plus room for the form) and the SMS webhook (20 kB) must answer 413 before the
// whole body is sent, and never 500. RFC 9110 §15.5.14 (413 Content Too Large).
describe("streamed oversized bodies are refused while they arrive (413)", () => {
  const uploads = ROUTES.filter((e) => e.method === "POST" && (e.route === "/api/files" || e.route.endsWith("/photo")));
  const webhook = ROUTES.filter((e) => e.route === "/api/sms/inbound");
  const cases = [
    ...JSON_ROUTES.map((e) => [routeKey(e.method, e.route), e, 32 * 1024 * 1024, "application/json"] as const),
    ...uploads.map((e) => [routeKey(e.method, e.route), e, 64 * 1024 * 1024, "multipart/form-data; boundary=----fuzz"] as const),
    ...webhook.map((e) => [routeKey(e.method, e.route), e, 32 * 1024 * 1024, "application/x-www-form-urlencoded"] as const),
  ];
  it.each(cases)("%s", async (key, e, size, type) => {
    const who = fuzzer(e);
    const c = who === "anon" ? null : OTHER_ORG[key] ? spare.admin : client(who)!;
    const s = OTHER_ORG[key] ? OTHER_ORG[key]() : await e.sample(fx, who);
    const cookie = c ? (c as unknown as { cookieHeader(): string }).cookieHeader() : "";
    const head = Buffer.from(type.startsWith("multipart") ? '------fuzz\r\nContent-Disposition: form-data; name="file"; filename="big.pdf"\r\nContent-Type: application/pdf\r\n\r\n%PDF-1.4\n' : type === "application/json" ? '{"x":"' : "Body=");
    const r = await streamed(s.path, size, { method: e.method, head, headers: { "content-type": type, ...(cookie ? { cookie } : {}) } });
    streamedTried.total++;
    expect(r.status, `${key}: ${r.text.slice(0, 200)}`).toBe(413);
    expect(r.sentBeforeAnswer, `${key} read the whole body first`).toBeLessThan(size);
    streamedTried.refused++;
  });
  it("every JSON route, upload and the webhook was tried", () => {
    expect(streamedTried.total).toBe(cases.length);
    expect(cases.length).toBeGreaterThanOrEqual(40);
    console.log(`[security] streamed oversized bodies: ${streamedTried.refused}/${streamedTried.total} refused with 413`);
  });
});

describe("what was stored before is unchanged", () => {
  it("checksums of workers, assignments, credentials, work_orders and policies match", async () => {
    expect(await checksum()).toEqual(sums);
  });
});

describe("quotes and unicode round-trip byte for byte", () => {
  const tricky = [
    `O'Brien "Ace" \\ back\\slash`,
    "Zoë Łukasz-Ørsted",
    "李 小龍",
    "Nguyễn Thị Minh Khai",
    "😀👷‍♀️ Emoji",
    "Robert'); DROP TABLE workers;--",
    "<b>bold</b> & &amp; 'x'",
    "e\u0301clair", // a combining accent (NFD), kept as sent
  ];

  it("worker names: POST then GET gives the same strings", async () => {
    const hr = fx.clients.hr;
    for (const [i, name] of tricky.entries()) {
      const first = name.slice(0, 80);
      const r = await hr.json("/api/workers", "POST", { employeeNo: `RT-${fx.uniq()}`, firstName: first, lastName: `Last ${i}`, classification: "ground_hand", yardId: fx.yard.id });
      expect(r.status, `${JSON.stringify(name)}: ${JSON.stringify(r.body).slice(0, 200)}`).toBe(201);
      const back = await hr.json(`/api/workers/${r.body.worker.id}`);
      expect(Buffer.from(back.body.worker.firstName, "utf8").equals(Buffer.from(first, "utf8")), `${JSON.stringify(first)} came back as ${JSON.stringify(back.body.worker.firstName)}`).toBe(true);
      const row = await db("workers").where({ id: r.body.worker.id }).first("first_name");
      expect(row.first_name).toBe(first);
    }
  });

  it("an order's title and notes: POST then GET gives the same strings", async () => {
    const d = fx.clients.dispatcher;
    const notes = tricky.join("\n") + "\n\t tab, NUL-free; 4-byte 𝔘𝔫𝔦𝔠𝔬𝔡𝔢 and a quote: \"'`";
    const title = `Pole 7 "north" O'Hare — ${tricky[2]} ${tricky[4]}`;
    const r = await d.json("/api/orders", "POST", { ...fx.orderBody(), title, notes });
    expect(r.status, JSON.stringify(r.body).slice(0, 300)).toBe(201);
    const back = await d.json(`/api/orders/${r.body.id}`);
    expect(back.body.title).toBe(title);
    expect(back.body.notes).toBe(notes);
    expect(Buffer.from(back.body.notes).equals(Buffer.from(notes))).toBe(true);
  });
});
