import { expect, test, type Page } from "@playwright/test";
import knex, { type Knex } from "knex";
import { dbConfig } from "../../knexfile";
import { emptyBriefing } from "../../lib/briefings/model";
import { demo } from "./helpers";
import { makeOrder, removeMadeOrders, workerByNo } from "../support/fixtures";
import { tinyPng } from "../support/files";

// Issue 20: the phone works at the pole without signal. Against the production build with its
// service worker (scripts/test; the worker is built by scripts/build-sw.ts). Two orders of the
// test's own, tomorrow at North Yard:
//   A: Marcus Whitfield (CP-1001) leads, Priya Raman (CP-1008) climbs; no briefing yet.
//   B: Priya leads, Marcus observes; Priya completed round 1 of the briefing last night.
// Marcus visits My week with signal, then loses it: he reads B's briefing and records his gear
// check and acknowledgement, then on A records a failed ground-line check with a photo and holds
// the order. Back online, each record reaches the server exactly once, A is on hold, dispatch
// was told, and the board shows it. Sign-out deletes the cached pages and the queue.
// Sources: Playwright's context.setOffline (Chromium network emulation, applied to the service
// worker's own fetches too); the Cache Storage and IndexedDB APIs (W3C Service Workers, Indexed
// Database API 3.0); 1910.269(c) job briefing and the ground-line check (common practice).

const PHONE = { width: 390, height: 844 };
const MARCUS = demo("lineworker", "marcus.whitfield@cedarprairie.example");
let db: Knex;
let A: Awaited<ReturnType<typeof makeOrder>>;
let B: Awaited<ReturnType<typeof makeOrder>>;
let marcusUserId: number;
const startedAt = new Date(Date.now() - 1000);

test.use({ viewport: PHONE });

async function signInAs(page: Page, email: string, password: string) {
  await page.goto("/login");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page).not.toHaveURL(/\/login/);
}

async function seat(o: typeof A, position: string, workerNo: string, n: number) {
  const w = await workerByNo(db, workerNo);
  await db("assignments").insert({
    work_order_id: o.id,
    position_id: o.positionIds[position],
    worker_id: w.id,
    holds_position: o.positionIds[position],
    status: "sent",
    sent_at: new Date(),
    reply_code: String(6000 + ((o.id * 13 + n) % 999)),
  });
  return w.id as number;
}

/** A JSON column as the driver gives it (mysql2 parses JSON columns; MariaDB's are LONGTEXT). */
const asJson = (v: unknown) => (typeof v === "string" ? JSON.parse(v) : v) as Record<string, any>;

/** The paths in the field cache (what the service worker keeps for offline use). */
const fieldPaths = (page: Page) =>
  page.evaluate(async () => {
    if (!(await caches.has("gaffline-field"))) return [];
    const c = await caches.open("gaffline-field");
    return (await c.keys()).map((r) => new URL(r.url).pathname).sort();
  });

test.beforeAll(async () => {
  db = knex(dbConfig());
  marcusUserId = (await db("users").where({ email: MARCUS.email }).first("id")).id;
  A = await makeOrder(db, { offsetDays: 1, positions: ["lead", "climber"], start: "07:00", end: "11:00" });
  B = await makeOrder(db, { offsetDays: 1, positions: ["lead", "climber", "observer"], start: "12:00", end: "15:30" });
  await seat(A, "lead", "CP-1001", 0);
  await seat(A, "climber", "CP-1008", 1);
  const priya = await seat(B, "lead", "CP-1008", 2);
  await seat(B, "climber", "CP-1021", 3);
  await seat(B, "observer", "CP-1001", 4);
  const data = emptyBriefing();
  data.procedure.steps = "Set the new crossarm; hand line for the old one.";
  for (const k of Object.keys(data.poleCheck.items) as (keyof typeof data.poleCheck.items)[]) data.poleCheck.items[k].result = "pass";
  const priyaUser = await db("users").where({ worker_id: priya }).first("id");
  await db("briefings").insert({
    work_order_id: B.id,
    round: 1,
    lead_worker_id: priya,
    state: "briefed",
    data: JSON.stringify(data),
    completed_at: new Date(),
    version: 1,
    updated_at: new Date(),
    updated_by: priyaUser.id,
  });
});

test.afterAll(async () => {
  await db("notifications").where({ kind: "hold" }).where("body", "like", `%${A.number}%`).delete();
  await db("files").whereIn("work_order_id", [A.id, B.id]).update({ work_order_id: null });
  await db("idempotency_keys").where({ user_id: marcusUserId }).where("created_at", ">=", startedAt).delete();
  await removeMadeOrders(db);
  await db.destroy();
});

test("offline at the pole: gear check, failed ground line with photo, acknowledgement; sent once when back online", async ({ page, context, browser }) => {
  test.setTimeout(180_000);
  await signInAs(page, MARCUS.email, MARCUS.password);
  await expect(page).toHaveURL(/\/me/);
  await expect(page.getByTestId(`my-assignment-${A.number}`)).toBeVisible();

  // The service worker is active and controls the page; My week and both briefings are kept.
  await page.waitForFunction(() => navigator.serviceWorker?.controller?.state === "activated", null, { timeout: 30_000 });
  await expect.poll(() => fieldPaths(page), { timeout: 30_000 }).toEqual(expect.arrayContaining(["/me", `/orders/${A.id}/briefing`, `/orders/${B.id}/briefing`]));
  // Nothing of another worker: only My week and the briefings of orders Marcus is on are kept.
  const marcusId = (await workerByNo(db, "CP-1001")).id;
  const his = new Set((await db("assignments").where({ worker_id: marcusId }).pluck("work_order_id")).map(Number));
  for (const p of await fieldPaths(page)) {
    expect(p).toMatch(/^\/(me|orders\/\d+\/briefing)$/);
    if (p !== "/me") expect(his.has(Number(p.split("/")[2]))).toBe(true);
  }

  // --- no signal ---
  await context.setOffline(true);
  expect(await page.evaluate(() => navigator.onLine)).toBe(false);
  expect(await page.evaluate(() => fetch("/api/health").then(() => "reached", () => "no network"))).toBe("no network");

  // B: read the briefing from the phone's copy (with its caution), then gear check and acknowledgement.
  const resB = await page.goto(`/orders/${B.id}/briefing`);
  expect(resB?.fromServiceWorker()).toBe(true);
  await expect(page.getByRole("note").filter({ hasText: "Gaffline assists; it does not decide." }).first()).toBeVisible();
  const form = page.getByTestId("ack-form");
  await expect(form).toBeVisible();
  const testedOn = new Date(Date.now() - 30 * 86_400_000).toISOString().slice(0, 10); // within 6 months: 1910.137 Table I-5 (recalled from memory)
  for (const legend of ["Rubber insulating gloves", "Rubber insulating sleeves"]) {
    await form.getByRole("group", { name: legend }).getByText("✓ OK").click();
    await form.getByLabel(`${legend}: tested on`).fill(testedOn);
  }
  await form.getByRole("group", { name: "Hard hat (class E)" }).getByText("✓ OK").click();
  await form.getByRole("group", { name: "FR clothing for the arc rating" }).getByText("✓ OK").click();
  await form.getByRole("button", { name: "I was briefed: acknowledge" }).click();
  await expect(page.getByTestId("my-ack-queued")).toContainText("saved on this phone, not yet sent");
  await expect(page.getByTestId("offline-queue")).toContainText(`Gear check and acknowledgement, ${B.number}`);

  // A: the lead's pole check; the ground line fails, with a photo; hold the order.
  const resA = await page.goto(`/orders/${A.id}/briefing`);
  expect(resA?.fromServiceWorker()).toBe(true);
  await expect(page.getByTestId("briefing-editor")).toBeVisible();
  await expect(page.getByRole("note").filter({ hasText: "Gaffline assists; it does not decide." }).first()).toBeVisible();
  await page.getByRole("group", { name: "Ground line", exact: true }).getByText("Fail", { exact: true }).click();
  await page.getByLabel("Ground line notes").fill("Shell rot: probe goes 3 in. in on the road side");
  await page.getByLabel("Ground line: photo").setInputFiles({ name: "ground-line.png", mimeType: "image/png", buffer: tinyPng() });
  await expect(page.getByTestId("pole-ground_line-pending-photo")).toContainText("Photo saved on this phone, not yet sent");
  await page.getByTestId("fail-choices").getByText("Hold the order").click();
  await page.getByRole("button", { name: "Hold the order" }).click();
  await expect(page.getByText(/Hold saved on this phone, not yet sent/)).toBeVisible();
  const queued = page.getByTestId("queued-action");
  await expect(queued).toHaveCount(3); // this order's: the photo, the draft saved with it, the hold
  await expect(queued.first()).toContainText(/entered \w{3} \d+, \d\d:\d\d/);

  // A page the phone has no copy of: the precached offline page, with the caution.
  const other = await page.goto("/audit");
  expect(other?.fromServiceWorker()).toBe(true);
  await expect(page.getByRole("heading", { level: 1 })).toContainText("No signal");
  await expect(page.getByRole("note")).toContainText("Gaffline assists; it does not decide.");
  await expect(page.getByRole("status")).toContainText("4 records are saved on this phone, not yet sent.");
  // Back to A's briefing, still offline: the form shows what is saved on the phone, photo included.
  await page.goto(`/orders/${A.id}/briefing`);
  await expect(page.getByTestId("pole-ground_line-pending-photo")).toBeVisible();
  await expect(page.getByLabel("Ground line notes")).toHaveValue(/Shell rot/);
  await expect(page.getByTestId("queued-action")).toHaveCount(3);

  // Nothing reached the server while offline.
  const marcus = await workerByNo(db, "CP-1001");
  expect((await db("work_orders").where({ id: A.id }).first()).status).toBe("planned");
  expect(await db("briefing_acks").where({ worker_id: marcus.id }).whereIn("briefing_id", db("briefings").where({ work_order_id: B.id }).select("id"))).toHaveLength(0);
  expect(await db("files").where({ work_order_id: A.id })).toHaveLength(0);

  // --- back online: the queue goes in order, once each ---
  await context.setOffline(false);
  await expect.poll(async () => (await db("work_orders").where({ id: A.id }).first()).status, { timeout: 40_000 }).toBe("on_hold");
  await expect(page.getByTestId("server-changes")).toContainText(`${A.number} is now on hold`);
  await expect(page.getByTestId("hold-banner")).toContainText("On hold");
  await expect(page.getByTestId("queued-action")).toHaveCount(0);

  const acks = await db("briefing_acks").where({ worker_id: marcus.id }).whereIn("briefing_id", db("briefings").where({ work_order_id: B.id }).select("id"));
  expect(acks).toHaveLength(1);
  expect(asJson(acks[0].gear_check).gloves).toEqual({ result: "ok", testedOn });
  const photos = await db("files").where({ work_order_id: A.id, kind: "briefing_photo" });
  expect(photos).toHaveLength(1);
  const rounds = await db("briefings").where({ work_order_id: A.id });
  expect(rounds).toHaveLength(1);
  const held = asJson(rounds[0].data);
  expect(held.poleCheck.items.ground_line.result).toBe("fail");
  expect(held.poleCheck.items.ground_line.photoFileId).toBe(photos[0].id);
  expect(rounds[0].state).toBe("on_hold");
  const holds = await db("audit_log").where({ action: "briefing.hold", entity_id: String(A.id) });
  expect(holds).toHaveLength(1);
  // Dispatch is told as today: text and e-mail through the outbox, once per recipient.
  const told = await db("notifications").where({ kind: "hold" }).where("body", "like", `%${A.number}%`).select("channel", "to_address");
  expect(told.map((r) => r.channel)).toEqual(expect.arrayContaining(["sms", "email"]));
  expect(new Set(told.map((r) => `${r.channel}:${r.to_address}`)).size).toBe(told.length);
  // Four actions, four keys, each answered once (ack, photo, draft, hold).
  const keys = await db("idempotency_keys").where({ user_id: marcusUserId }).where("created_at", ">=", startedAt);
  expect(keys).toHaveLength(4);
  expect(keys.every((k) => Number(k.status) >= 200 && Number(k.status) < 300)).toBe(true);

  // The board, in another context: A on hold.
  const board = await browser.newContext({ viewport: { width: 1440, height: 1000 } });
  const bp = await board.newPage();
  await signInAs(bp, demo("dispatcher").email, demo("dispatcher").password);
  await bp.goto(`/board?yard=NOR&date=${A.day}`);
  await expect(bp.getByTestId(`order-${A.number}`)).toContainText("On hold");
  await board.close();

  // Sign-out deletes the field cache and the queue's database; the app shell (no one's data) stays.
  await page.goto("/me");
  await expect.poll(() => fieldPaths(page)).toContain("/me");
  await page.getByRole("button", { name: "Sign out" }).click();
  await expect(page).toHaveURL(/\/login/);
  // The browser finishes a deletion once the old page's connections are gone: wait for it (5 s at most).
  // The field cache holds nothing after sign-out (Serwist's expiration bookkeeping may open an
  // empty one again; what counts is that no page of the user is left, checked for every cache below).
  await expect
    .poll(() => page.evaluate(async () => ((await caches.has("gaffline-field")) ? (await (await caches.open("gaffline-field")).keys()).length : 0)), { timeout: 5_000 })
    .toBe(0);
  await expect.poll(() => page.evaluate(async () => (await indexedDB.databases()).map((d) => d.name)), { timeout: 5_000 }).not.toContain("gaffline-offline");
  const left = await page.evaluate(async () => {
    const out: string[] = [];
    for (const name of await caches.keys()) for (const r of await (await caches.open(name)).keys()) out.push(new URL(r.url).pathname);
    return out;
  });
  for (const p of left) expect(p).toMatch(/^\/(_next\/static\/|icons\/|favicon\.ico$|offline$|manifest\.webmanifest$)/);
});

test("a sign-in that ran out while offline: the phone asks to sign in again, keeps the answer, and sends it once after", async ({ page, context }) => {
  test.setTimeout(120_000);
  const priya = { email: "priya.raman@cedarprairie.example", password: "lineworker-26" }; // db/demo/field-accounts.ts
  const priyaUser = (await db("users").where({ email: priya.email }).first("id")).id as number;
  const worker = await workerByNo(db, "CP-1008");
  const assignment = await db("assignments").where({ work_order_id: B.id, worker_id: worker.id }).first();
  await signInAs(page, priya.email, priya.password);
  await expect(page).toHaveURL(/\/me/);
  await page.waitForFunction(() => navigator.serviceWorker?.controller?.state === "activated", null, { timeout: 30_000 });
  await expect.poll(() => fieldPaths(page), { timeout: 30_000 }).toContain("/me");

  await context.setOffline(true);
  const card = page.getByTestId(`my-assignment-${B.number}`);
  await card.getByRole("button", { name: `Confirm ${B.number}` }).click();
  await expect(card).toContainText("saved on this phone, not yet sent");
  await expect(page.getByTestId("queued-action")).toContainText(`Confirm ${B.number}`);

  // The session ends while the phone is offline (RFC 9110 §15.5.2: 401 without credentials).
  await context.clearCookies();
  await context.setOffline(false);
  await expect(page.getByTestId("signin-needed")).toBeVisible({ timeout: 30_000 });
  await expect(page.getByTestId("queued-action")).toHaveCount(1);
  expect((await db("assignments").where({ id: assignment.id }).first()).status).toBe("sent");

  await page.getByTestId("signin-needed").getByRole("link", { name: "Sign in again" }).click();
  await page.getByLabel("E-mail").fill(priya.email);
  await page.getByLabel("Password").fill(priya.password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page).toHaveURL(/\/me/);
  await expect.poll(async () => (await db("assignments").where({ id: assignment.id }).first()).status, { timeout: 30_000 }).toBe("confirmed");
  await expect(page.getByTestId("queued-action")).toHaveCount(0);
  const keys = await db("idempotency_keys").where({ user_id: priyaUser }).where("created_at", ">=", startedAt);
  expect(keys).toHaveLength(1);
  await db("idempotency_keys").where({ user_id: priyaUser }).where("created_at", ">=", startedAt).delete();
});
