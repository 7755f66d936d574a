// Issue 15: one regression test per finding, each replaying the attack as it was reproduced
// against the old code, then what must hold now (status, message, nothing stored). Sources
// beside each check: OWASP cheat sheets (CSRF, CSV injection, unvalidated redirects, file
// upload), RFC 6265 (cookies), RFC 9110 §15.5.14 (413), the SDK's own signature function
// (twilio.getExpectedTwilioSignature), sharp's documented limitInputPixels.
import { execFileSync } from "node:child_process";
import { mkdtempSync, readFileSync, statSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import bcrypt from "bcryptjs";
import knex from "knex";
import Papa from "papaparse";
import sharp from "sharp";
import twilio from "twilio";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { dbConfig } from "@/knexfile";
import { DEMO_ACCOUNTS } from "@/db/demo/accounts";
import { emptyBriefing } from "@/lib/briefings/model";
import { formatPhone } from "@/lib/notify/wording";
import { APP_URL, as, Client } from "../support/client";
import { minimalPdf, tinyPng } from "../support/files";
import { makeOrder, removeMadeOrders, workerByNo } from "../support/fixtures";
import { raw, signInFrom, streamed } from "../support/raw-http";
import { smsAuthToken } from "../support/secrets";

const db = knex(dbConfig());
const MARCUS = DEMO_ACCOUNTS.find((a) => a.email === "marcus.whitfield@cedarprairie.example")!;
const MESA = DEMO_ACCOUNTS.find((a) => a.email === "dispatch.mesa@cedarprairie.example")!;
const uniq = () => `${process.pid}${Date.now() % 1_000_000}${Math.floor(Math.random() * 1000)}`;
const madeUsers: number[] = [];

/** A sign-in of the test's own (direct insert, bcrypt cost 4), removed afterwards. */
async function tempUser(role: string, extra: Record<string, unknown> = {}) {
  const org = await db("organisations").first("id");
  const email = `sec15-${role}-${uniq()}@cedarprairie.example`;
  const password = `pw-${uniq()}-long-enough`;
  const [id] = await db("users").insert({ organisation_id: org.id, email, name: `Sec Test ${role}`, role, password_hash: await bcrypt.hash(password, 4), ...extra });
  madeUsers.push(Number(id));
  if (role === "dispatcher" && extra.home_yard_id) await db("user_yards").insert({ user_id: id, yard_id: extra.home_yard_id });
  return { id: Number(id), email, password };
}

async function signedIn(email: string, password: string) {
  const c = new Client();
  const r = await c.signIn(email, password);
  if (!r.signedIn) throw new Error(`sign-in ${email} failed: ${r.status} ${r.body.slice(0, 200)}`);
  return c;
}

async function upload(c: Client, path: string, bytes: Buffer, name: string, type: string, fields: Record<string, string> = {}) {
  const form = new FormData();
  form.append("file", new Blob([new Uint8Array(bytes)], { type }), name);
  for (const [k, v] of Object.entries(fields)) form.append(k, v);
  const res = await c.fetch(path, { method: "POST", body: form });
  return { status: res.status, body: await res.json().catch(() => ({})) };
}

/** CRC-32 (ISO 3309 / PNG spec §5.5), for hand-built PNG chunks. */
function crc32(buf: Buffer) {
  let c = ~0;
  for (const b of buf) {
    c ^= b;
    for (let k = 0; k < 8; k++) c = c & 1 ? (c >>> 1) ^ 0xedb88320 : c >>> 1;
  }
  return ~c >>> 0;
}
function chunk(type: string, data: Buffer) {
  const len = Buffer.alloc(4);
  len.writeUInt32BE(data.length);
  const td = Buffer.concat([Buffer.from(type, "latin1"), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(td));
  return Buffer.concat([len, td, crc]);
}
/** A PNG whose header (IHDR, PNG spec §11.2.2) claims width × height, with one tiny IDAT. */
function claimedPng(width: number, height: number) {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 2; // truecolour
  return Buffer.concat([
    Buffer.from("89504e470d0a1a0a", "hex"),
    chunk("IHDR", ihdr),
    chunk("IDAT", Buffer.from("78da030000000001", "hex")),
    chunk("IEND", Buffer.alloc(0)),
  ]);
}

let ids: Record<string, number> = {};
let hr: Client, marcus: Client, north: Client, mesa: Client, supervisor: Client, admin: Client;
let marcusOrder: Awaited<ReturnType<typeof makeOrder>>;

beforeAll(async () => {
  for (const no of ["CP-1001", "CP-1005", "CP-1008", "CP-1013"]) ids[no] = Number((await workerByNo(db, no)).id);
  [hr, marcus, north, mesa, supervisor, admin] = await Promise.all([
    as("hr"),
    signedIn(MARCUS.email, MARCUS.password),
    as("dispatcher", "dispatch@cedarprairie.example"),
    signedIn(MESA.email, MESA.password),
    as("supervisor"),
    as("admin"),
  ]);
  marcusOrder = await makeOrder(db, { offsetDays: 61, positions: ["lead", "climber"] });
  await db("assignments").insert({
    work_order_id: marcusOrder.id,
    position_id: marcusOrder.positionIds.lead,
    worker_id: ids["CP-1001"],
    holds_position: marcusOrder.positionIds.lead,
    status: "confirmed",
    reply_code: String(7000 + (process.pid % 999)),
  });
});

afterAll(async () => {
  await removeMadeOrders(db);
  for (const id of madeUsers) {
    await db("user_sessions").where({ user_id: id }).delete();
    await db("password_resets").where({ user_id: id }).delete();
    await db("user_yards").where({ user_id: id }).delete();
    await db("users").where({ id }).delete().catch(() => db("users").where({ id }).update({ active: false }));
  }
  await db.destroy();
});

describe("issue 15 findings, each replayed", () => {
  it("1. a crew lead cannot put another worker's evidence on a pole check (and so cannot read it)", async () => {
    // The attack: HR's upload of someone else's card, its id saved as the pole-check photo.
    const card = await upload(hr, "/api/files", minimalPdf("CPR card"), "cpr-card.pdf", "application/pdf", { workerId: String(ids["CP-1005"]) });
    expect(card.status).toBe(201);
    const data = emptyBriefing();
    data.poleCheck.items.visual = { result: "pass", notes: "", photoFileId: card.body.file.id };
    const put = await marcus.json(`/api/briefings/${marcusOrder.id}`, "PUT", { action: "save", version: 0, data });
    expect(put.status).toBe(422);
    expect(put.body.issues[0].field).toBe("poleCheck.items.visual.photoFileId");
    expect(await db("briefings").where({ work_order_id: marcusOrder.id }).first()).toBeUndefined();
    const read = await marcus.fetch(`/api/briefings/${marcusOrder.id}/photo/${card.body.file.id}`);
    expect(read.status).toBe(404);
    // A photo taken for this order's briefing still works (the check is not a blanket refusal).
    const photo = await upload(marcus, `/api/briefings/${marcusOrder.id}/photo`, tinyPng(), "ground-line.png", "image/png");
    expect(photo.status).toBe(201);
    data.poleCheck.items.visual.photoFileId = photo.body.file.id;
    expect((await marcus.json(`/api/briefings/${marcusOrder.id}`, "PUT", { action: "save", version: 0, data })).status).toBe(200);
  });

  it("2. a lineworker cannot claim an unowned upload by naming it as evidence", async () => {
    const loose = await upload(hr, "/api/files", minimalPdf("Someone's card"), "card.pdf", "application/pdf");
    expect(loose.status).toBe(201);
    const qt = await db("qualification_types").where({ organisation_id: (await db("organisations").first("id")).id }).first("id");
    const claim = await marcus.json("/api/credentials", "POST", { workerId: ids["CP-1001"], qualificationTypeId: qt.id, issuedOn: "2026-01-05", evidenceFileId: loose.body.file.id, status: "pending" });
    expect(claim.status).toBe(422);
    expect(claim.body.issues[0].field).toBe("evidenceFileId");
    expect((await db("files").where({ id: loose.body.file.id }).first()).worker_id).toBeNull();
    expect((await marcus.fetch(`/api/files/${loose.body.file.id}`)).status).toBe(403);
  });

  it("3. no SMS signing token in the repository; a reply signed with any other token is refused; the simulator needs loopback", async () => {
    // (a) nothing tracked carries the old default or any fallback token value (the old value is
    // spelled in pieces here, so this file does not carry it either)
    const OLD_DEFAULT = ["fake", "auth", "token", "for", "local", "use"].join("-");
    const tracked = execFileSync("git", ["ls-files", "-z"], { encoding: "utf8" }).split("\0").filter((f) => /\.(ts|tsx|mjs|js|sh|md|json)$|^scripts\//.test(f));
    for (const f of tracked) {
      let text = "";
      try {
        text = readFileSync(f, "utf8");
      } catch {
        continue;
      }
      expect(text.includes(OLD_DEFAULT), f).toBe(false);
      expect(/TWILIO_AUTH_TOKEN(:-|\s*\?\?\s*)["'][^"']+["']/.test(text), f).toBe(false);
    }
    // (b) the generator: a random token per installation, kept in a 600 file, stable on re-run
    const dir = mkdtempSync(path.join(tmpdir(), "gaffline-secret-"));
    const gen = () => execFileSync("bash", ["-c", `source scripts/lib/common.sh >/dev/null; DATA_DIR="${dir}"; installation_secret sms-auth-token`], { encoding: "utf8" }).trim();
    const first = gen();
    expect(first).toMatch(/^[A-Za-z0-9]{30,}$/);
    expect(gen()).toBe(first);
    expect(statSync(path.join(dir, "sms-auth-token")).mode & 0o777).toBe(0o600);
    // (c) a reply signed with a token that is not this installation's: 403, nothing stored
    const params = { MessageSid: `SMforged${uniq()}`, From: "+13205550101", To: "+13205550199", Body: "YES" };
    const signature = twilio.getExpectedTwilioSignature("a-token-someone-read-somewhere", `${APP_URL}/api/sms/inbound`, params);
    const forged = await raw("POST", "/api/sms/inbound", { headers: { "content-type": "application/x-www-form-urlencoded", "x-twilio-signature": signature }, body: new URLSearchParams(params).toString() });
    expect(forged.status).toBe(403);
    expect(await db("inbound_messages").where({ provider_sid: params.MessageSid }).first()).toBeUndefined();
    expect(smsAuthToken()).not.toBe("a-token-someone-read-somewhere");
    // (d) the simulator's gate (lib/notify/config.ts): explicit, and loopback only
    const { fakesEnabled } = await import("@/lib/notify/config");
    const saved = { ...process.env };
    try {
      process.env.FAKES_ENABLED = "1";
      process.env.APP_PUBLIC_URL = "http://127.0.0.1:3000";
      process.env.NEXTAUTH_URL = "http://127.0.0.1:3000";
      delete process.env.TWILIO_API_BASE;
      delete process.env.APP_BIND_HOST;
      expect(fakesEnabled()).toBe(true);
      process.env.APP_PUBLIC_URL = "https://dispatch.cedarprairie.example";
      expect(fakesEnabled()).toBe(false);
      process.env.APP_PUBLIC_URL = "http://127.0.0.1:3000";
      process.env.APP_BIND_HOST = "0.0.0.0";
      expect(fakesEnabled()).toBe(false);
      delete process.env.APP_BIND_HOST;
      delete process.env.FAKES_ENABLED;
      expect(fakesEnabled()).toBe(false);
    } finally {
      process.env = saved;
    }
  });

  it("4. sign-out, deactivation and a role change end a session at once", async () => {
    // Sign-out: the old cookie replayed afterwards.
    const u = await tempUser("dispatcher", { home_yard_id: (await db("yards").where({ code: "NOR" }).first()).id });
    const c = await signedIn(u.email, u.password);
    const stolen = new Client();
    (stolen as unknown as { cookies: Map<string, string> }).cookies = new Map((c as unknown as { cookies: Map<string, string> }).cookies);
    expect((await stolen.json("/api/workers")).status).toBe(200);
    const csrf = await c.json<{ csrfToken: string }>("/api/auth/csrf");
    await c.fetch("/api/auth/signout", { method: "POST", headers: { "content-type": "application/x-www-form-urlencoded" }, body: new URLSearchParams({ csrfToken: csrf.body.csrfToken, json: "true" }) });
    expect((await stolen.json("/api/workers")).status).toBe(401);
    // Deactivation by an admin: an open session stops at once.
    const d = await signedIn(u.email, u.password);
    expect((await d.json("/api/workers")).status).toBe(200);
    expect((await admin.json(`/api/users/${u.id}`, "PATCH", { active: false })).status).toBe(200);
    expect((await d.json("/api/workers")).status).toBe(401);
    expect((await admin.json(`/api/users/${u.id}`, "PATCH", { active: true })).status).toBe(200);
    // A role change: the dispatcher's session does not live on as hr, nor as dispatcher.
    const e = await signedIn(u.email, u.password);
    expect((await e.json("/api/workers")).status).toBe(200);
    expect((await admin.json(`/api/users/${u.id}`, "PATCH", { role: "hr", yardIds: [] })).status).toBe(200);
    const after = await e.json("/api/workers");
    expect(after.status).toBe(401);
    const audit = await db("audit_log").where({ entity: "user", entity_id: String(u.id) }).pluck("action");
    expect(audit).toEqual(expect.arrayContaining(["user.deactivate", "user.reactivate", "user.role"]));
  });

  it("5. the sign-in limit: X-Forwarded-For is not believed, and nobody else is locked out", async () => {
    const u = await tempUser("hr");
    // Five wrong guesses from 127.0.0.2, each claiming another address in X-Forwarded-For.
    for (let i = 0; i < 5; i++) {
      const r = await signInFrom("127.0.0.2", u.email, `wrong-${i}`, { "x-forwarded-for": `198.51.100.${i + 1}` });
      expect(r.signedIn).toBe(false);
    }
    // The guesser now waits, whatever address it claims (rotating the header bypassed the old limit).
    const again = await signInFrom("127.0.0.2", u.email, u.password, { "x-forwarded-for": "203.0.113.77" });
    expect(again.signedIn).toBe(false);
    expect(again.text).toMatch(/Too many failed sign-ins from this address\. Wait \d+ seconds/);
    // The account's owner, from their own address, is not locked out by someone else's guesses.
    const owner = await signInFrom("127.0.0.3", u.email, u.password);
    expect(owner.signedIn).toBe(true);
    // The counters are in the database (shared by every instance), keyed per account+address.
    const keys = await db("sign_in_limits").where("key", "like", `%${u.email}%`).pluck("key");
    expect(keys.some((k: string) => k.includes("127.0.0.2"))).toBe(true);
    expect(keys.some((k: string) => k.includes("198.51.100"))).toBe(false);
  });

  it("6. moving or un-cancelling an order over its crew's other order is refused (409 naming it); DOUBLE_BOOKED cannot be overridden", async () => {
    const a = await makeOrder(db, { offsetDays: 63, positions: ["lead"], start: "07:00", end: "12:00" });
    const b = await makeOrder(db, { offsetDays: 63, positions: ["lead"], start: "13:00", end: "17:00" });
    const c = await makeOrder(db, { offsetDays: 63, positions: ["lead"], start: "08:00", end: "11:00" });
    const w = ids["CP-1008"];
    let code = 6100;
    for (const o of [a, b, c]) {
      await db("assignments").insert({ work_order_id: o.id, position_id: o.positionIds.lead, worker_id: w, holds_position: o.positionIds.lead, status: "draft", reply_code: String(code++ + (process.pid % 100)) });
    }
    await db("work_orders").where({ id: c.id }).update({ status: "cancelled" });
    const current = await north.json(`/api/orders/${b.id}`);
    const move = await north.json(`/api/orders/${b.id}`, "PATCH", { version: current.body.version, start: `${b.day}T10:00` });
    expect(move.status).toBe(409);
    expect(move.body.error).toContain(a.number);
    expect(move.body.otherOrder.number).toBe(a.number);
    const row = await db("work_orders").where({ id: b.id }).first();
    expect(row.version).toBe(current.body.version);
    const cv = await north.json(`/api/orders/${c.id}`);
    const back = await north.json(`/api/orders/${c.id}`, "PATCH", { version: cv.body.version, status: "planned" });
    expect(back.status).toBe(409);
    expect(back.body.error).toMatch(/DOUBLE_BOOKED/);
    expect((await db("work_orders").where({ id: c.id }).first()).status).toBe("cancelled");
    const ov = await supervisor.json("/api/overrides", "POST", { workOrderId: a.id, rule: "DOUBLE_BOOKED", workerId: w, reason: "Crew lead says the two jobs are next door" });
    expect(ov.status).toBe(422);
    expect(ov.body.error).toMatch(/never be overridden/);
    expect(await db("overrides").where({ work_order_id: a.id, rule: "DOUBLE_BOOKED" }).first()).toBeUndefined();
  });

  it("7. oversized bodies are refused while they stream in (no Content-Length, chunked)", async () => {
    // RFC 9110 §15.5.14: 413 Content Too Large. The webhook stops at 20 kB, not after 64 MB.
    const hook = await streamed("/api/sms/inbound", 64 * 1024 * 1024, { headers: { "content-type": "application/x-www-form-urlencoded" } });
    expect(hook.status).toBe(413);
    expect(hook.sentBeforeAnswer).toBeLessThan(16 * 1024 * 1024);
    const boundary = "----sec15";
    const head = Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="big.pdf"\r\nContent-Type: application/pdf\r\n\r\n%PDF-1.4\n`);
    const up = await streamed("/api/files", 40 * 1024 * 1024, { head, headers: { "content-type": `multipart/form-data; boundary=${boundary}`, cookie: (hr as unknown as { cookieHeader(): string }).cookieHeader() } });
    expect(up.status).toBe(413);
    expect(up.sentBeforeAnswer).toBeLessThan(30 * 1024 * 1024);
    const js = await streamed("/api/orders", 8 * 1024 * 1024, { head: Buffer.from('{"title":"'), headers: { "content-type": "application/json", cookie: (north as unknown as { cookieHeader(): string }).cookieHeader() } });
    expect(js.status).toBe(413);
  });

  it("8. image bombs are refused from the header; photos are stored re-encoded to a bounded size", async () => {
    const bomb = claimedPng(12000, 12000); // 576 megapixels claimed in ~70 bytes
    const r = await upload(marcus, `/api/briefings/${marcusOrder.id}/photo`, bomb, "pole.png", "image/png");
    expect(r.status).toBe(422);
    expect(r.body.error).toMatch(/12000 × 12000 pixels/);
    // A large real photo is kept, but scaled into 2400 px on its long side (sharp).
    const big = await sharp({ create: { width: 3600, height: 1800, channels: 3, background: { r: 120, g: 90, b: 60 } } }).png().toBuffer();
    const ok = await upload(marcus, `/api/briefings/${marcusOrder.id}/photo`, big, "pole-top.png", "image/png");
    expect(ok.status).toBe(201);
    const row = await db("files").where({ id: ok.body.file.id }).first();
    expect(row.kind).toBe("briefing_photo");
    expect(row.work_order_id).toBe(marcusOrder.id);
    const stored = readFileSync(path.join(process.env.UPLOAD_DIR || path.join(process.cwd(), ".data", "uploads"), row.sha256));
    const meta = await sharp(stored).metadata();
    expect([meta.width, meta.height]).toEqual([2400, 1200]);
  });

  it("9. a Mesa dispatcher cannot change North's orders, nor read North workers' numbers or texts", async () => {
    const o = await makeOrder(db, { offsetDays: 64, positions: ["lead", "climber"] });
    const v = (await north.json(`/api/orders/${o.id}`)).body.version;
    const edit = await mesa.json(`/api/orders/${o.id}`, "PATCH", { version: v, title: "Mesa was here" });
    expect(edit.status).toBe(403);
    expect(edit.body.error).toMatch(/not one of your yards/);
    expect((await mesa.json(`/api/orders/${o.id}?version=${v}`, "DELETE")).status).toBe(403);
    expect((await mesa.json("/api/assignments", "POST", { positionId: o.positionIds.lead, workerId: ids["CP-1008"] })).status).toBe(403);
    expect((await mesa.json("/api/send", "POST", { date: o.day, yard: "NOR" })).status).toBe(403);
    const row = await db("work_orders").where({ id: o.id }).first();
    expect([row.title, row.status]).toEqual([`Test order ${o.number}`, "planned"]);
    expect(await db("assignments").where({ work_order_id: o.id }).first()).toBeUndefined();
    // Reading North's board is allowed (borrowing crews), without North workers' phone numbers.
    const board = await mesa.json(`/api/board?yard=NOR&date=${o.day}`);
    expect(board.status).toBe(200);
    const northPool = board.body.pool.filter((p: { yardCode: string }) => p.yardCode === "NOR");
    expect(northPool.length).toBeGreaterThan(0);
    expect(northPool.every((p: { phone: string | null }) => p.phone === null)).toBe(true);
    const own = await north.json(`/api/board?yard=NOR&date=${o.day}`);
    expect(own.body.pool.some((p: { yardCode: string; phone: string | null }) => p.yardCode === "NOR" && p.phone)).toBe(true);
    const worker = await mesa.json(`/api/workers/${ids["CP-1008"]}`);
    expect(worker.status).toBe(200);
    expect([worker.body.worker.phone, worker.body.worker.email, worker.body.worker.contactHidden]).toEqual([null, null, true]);
    // The thread page sends them to /forbidden (a 307, or in a streamed page Next's redirect
    // marker) and shows neither the number nor the texts.
    const thread = await mesa.fetch(`/messages/${ids["CP-1008"]}`);
    const html = await thread.text();
    expect(thread.status === 307 ? (thread.headers.get("location") ?? "") : html).toMatch(/\/forbidden\?from=\/messages/);
    const phone = (await db("workers").where({ id: ids["CP-1008"] }).first("phone_e164")).phone_e164 as string;
    expect(html.includes(phone)).toBe(false);
    expect(html.includes(formatPhone(phone) ?? phone)).toBe(false);
  });

  it("10. a state-changing request from another origin is refused (403), text/plain or not; nothing stored", async () => {
    const before = Number((await db("work_orders").count({ n: "*" }).first())!.n);
    const yard = await db("yards").where({ code: "NOR" }).first();
    const body = JSON.stringify({ title: "Forged", yardId: yard.id });
    for (const headers of <Record<string, string>[]>[
      { "content-type": "text/plain", origin: "http://127.0.0.1:9999" }, // same site, another port
      { "content-type": "text/plain", origin: "https://evil.example" },
      { "content-type": "application/json", "sec-fetch-site": "cross-site" },
      { "content-type": "text/plain", origin: "null" },
    ]) {
      const r = await north.fetch("/api/orders", { method: "POST", headers, body });
      expect(r.status, JSON.stringify(headers)).toBe(403);
    }
    expect(Number((await db("work_orders").count({ n: "*" }).first())!.n)).toBe(before);
    // The app's own origin passes the check (and then meets validation: 422, not 403).
    const own = await north.fetch("/api/orders", { method: "POST", headers: { "content-type": "application/json", origin: new URL(APP_URL).origin, "sec-fetch-site": "same-origin" }, body });
    expect(own.status).toBe(422);
  });

  it("11. a phone-simulator reply is audited with the signed-in user who typed it", async () => {
    const w = await db("workers").where({ id: ids["CP-1013"] }).first("phone_e164");
    const r = await north.json("/api/phone", "POST", { from: w.phone_e164, body: "HELP" });
    expect(r.status).toBe(200);
    const me = await db("users").where({ email: "dispatch@cedarprairie.example" }).first("id");
    const row = await db("audit_log").where({ action: "phone.simulated_reply", actor_user_id: me.id }).orderBy("id", "desc").first();
    expect(row).toBeTruthy();
    const detail = typeof row.detail === "string" ? JSON.parse(row.detail) : row.detail;
    expect(detail.from).toBe(w.phone_e164);
    const inbound = await db("inbound_messages").where({ provider_sid: detail.messageSid }).first();
    expect(inbound?.body).toBe("HELP");
  });

  it("12. CSV formula escaping holds after a leading line break or spaces (credentials export)", async () => {
    const w = await db("workers").where({ id: ids["CP-1005"] }).first("first_name");
    const evil = "\n=HYPERLINK(\"http://evil.example\",\"x\")";
    await db("workers").where({ id: ids["CP-1005"] }).update({ first_name: evil });
    try {
      const res = await hr.fetch("/api/credentials/export");
      expect(res.status).toBe(200);
      const rows = Papa.parse<string[]>((await res.text()).replace(/^\uFEFF/, ""), { skipEmptyLines: true }).data;
      const cells = rows.flat().filter((c) => c.includes("HYPERLINK"));
      expect(cells.length).toBeGreaterThan(0);
      // OWASP CSV Injection: every such cell starts with "'" so a spreadsheet shows it as text.
      for (const c of cells) expect(c.startsWith("'")).toBe(true);
    } finally {
      await db("workers").where({ id: ids["CP-1005"] }).update({ first_name: w.first_name });
    }
  });

  it("13. /forbidden?from= never links off the site", async () => {
    for (const from of ["/\\evil.example/x", "//evil.example", "/\\/evil.example", "https://evil.example", "/%09/evil.example"]) {
      const res = await fetch(`${APP_URL}/forbidden?from=${encodeURIComponent(from)}`);
      const html = await res.text();
      // The page's only link: wherever it points, resolved against the app it stays on the app.
      const href = /<a class="btn-primary[^"]*" href="([^"]*)"/.exec(html)?.[1] ?? "";
      expect(href, from).not.toBe("");
      expect(new URL(href.replace(/&amp;/g, "&"), APP_URL).origin, from).toBe(new URL(APP_URL).origin);
    }
    const good = await (await fetch(`${APP_URL}/forbidden?from=%2Fboard`)).text();
    expect(good).toMatch(/href="\/board"/);
  });

  it("14. file downloads keep their sandbox CSP (one policy, not replaced by the app's)", async () => {
    const f = await upload(hr, "/api/files", minimalPdf("Sandbox"), "sandbox.pdf", "application/pdf", { workerId: String(ids["CP-1005"]) });
    const res = await hr.fetch(`/api/files/${f.body.file.id}`);
    expect(res.status).toBe(200);
    const csp = res.headers.get("content-security-policy") ?? "";
    expect(csp).toMatch(/sandbox/);
    expect(csp).toMatch(/default-src 'none'/);
    expect(csp).not.toMatch(/script-src/);
    const page = await fetch(`${APP_URL}/login`);
    expect(page.headers.get("content-security-policy")).toMatch(/script-src 'self'/);
  });

  it("15. a malformed callbackUrl in the query or the cookie answers 400, not 500", async () => {
    const q = await raw("GET", `/api/auth/signin?callbackUrl=${encodeURIComponent("http://[::1")}`);
    expect(q.status).toBe(400);
    expect(JSON.parse(q.text).error).toMatch(/callbackUrl/);
    const c = await raw("GET", "/api/auth/session", { headers: { cookie: "next-auth.callback-url=http%3A%2F%2F%5B" } });
    expect(c.status).toBe(400);
    const bad = await raw("GET", "/api/auth/session", { headers: { cookie: "next-auth.callback-url=%E0%A4%A" } });
    expect(bad.status).toBe(400);
    expect((await raw("GET", "/api/auth/csrf", { headers: { cookie: "next-auth.callback-url=%2Fboard" } })).status).toBe(200);
  });
});

describe("user management and passwords (issue 18 point 6; issue 15)", () => {
  it("an admin adds a dispatcher with yards: audited, e-mailed a one-time link that sets the password once", async () => {
    const nor = await db("yards").where({ code: "NOR" }).first("id");
    const email = `sec15-new-${uniq()}@cedarprairie.example`;
    const r = await admin.json("/api/users", "POST", { email, name: "New Dispatcher", role: "dispatcher", yardIds: [nor.id] });
    expect(r.status).toBe(201);
    madeUsers.push(r.body.user.id);
    expect(r.body.user.yardIds).toEqual([nor.id]);
    expect((await admin.json("/api/users", "POST", { email: `x-${email}`, name: "No Yard", role: "dispatcher", yardIds: [] })).body.issues[0].field).toBe("yardIds");
    expect(await db("audit_log").where({ action: "user.create", entity_id: String(r.body.user.id) }).first()).toBeTruthy();
    const mail = await db("notifications").where({ to_address: email, kind: "account_welcome" }).first();
    const token = /reset-password\?token=([A-Za-z0-9_-]+)/.exec(mail.body)![1];
    // Stored hashed: the token itself is not in the database.
    expect(await db("password_resets").where({ token_hash: token }).first()).toBeUndefined();
    const set = await new Client().json("/api/password-reset", "POST", { token, password: "copper-conductor-26" });
    expect(set.status).toBe(200);
    expect((await new Client().json("/api/password-reset", "POST", { token, password: "another-password-26" })).status).toBe(410);
    expect((await new Client().signIn(email, "copper-conductor-26")).signedIn).toBe(true);
  });

  it("an admin reset link replaces the old password and ends the user's sessions", async () => {
    const u = await tempUser("supervisor");
    const open = await signedIn(u.email, u.password);
    const r = await admin.json(`/api/users/${u.id}/reset`, "POST");
    expect(r.status).toBe(201);
    const mail = await db("notifications").where({ to_address: u.email, kind: "password_reset" }).orderBy("id", "desc").first();
    const token = /token=([A-Za-z0-9_-]+)/.exec(mail.body)![1];
    expect((await new Client().json("/api/password-reset", "POST", { token, password: "short" })).body.issues[0].field).toBe("password");
    expect((await new Client().json("/api/password-reset", "POST", { token, password: "rubber-goods-class-2" })).status).toBe(200);
    expect((await open.json("/api/workers")).status).toBe(401);
    expect((await new Client().signIn(u.email, u.password)).signedIn).toBe(false);
    await db("password_resets").where({ user_id: u.id }).update({ expires_at: new Date(Date.now() - 1000) });
  });

  it("change my password: the current one is required; afterwards old sessions end", async () => {
    const u = await tempUser("lineworker", { worker_id: null });
    const c = await signedIn(u.email, u.password);
    const wrong = await c.json("/api/me/password", "POST", { currentPassword: "not-it", newPassword: "hot-stick-clamp-42" });
    expect(wrong.status).toBe(422);
    expect(wrong.body.issues[0].field).toBe("currentPassword");
    const ok = await c.json("/api/me/password", "POST", { currentPassword: u.password, newPassword: "hot-stick-clamp-42" });
    expect(ok.status).toBe(200);
    expect((await c.json("/api/me/password", "POST", { currentPassword: "hot-stick-clamp-42", newPassword: "x-another-one-42" })).status).toBe(401);
    expect((await new Client().signIn(u.email, "hot-stick-clamp-42")).signedIn).toBe(true);
    expect(await db("audit_log").where({ action: "user.password_change", entity_id: String(u.id) }).first()).toBeTruthy();
  });

  it("only an admin manages users; nobody changes their own role or deactivates themselves", async () => {
    expect((await north.json("/api/users")).status).toBe(403);
    expect((await supervisor.json("/api/users", "POST", { email: "x@cedarprairie.example", name: "X", role: "admin" })).status).toBe(403);
    const me = await db("users").where({ email: "admin@cedarprairie.example" }).first("id");
    const self = await admin.json(`/api/users/${me.id}`, "PATCH", { active: false });
    expect(self.status).toBe(422);
  });
});
