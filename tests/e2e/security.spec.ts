import { expect, test, type Page } from "@playwright/test";
import knex, { type Knex } from "knex";
import { dbConfig } from "../../knexfile";
import { signIn } from "./helpers";

// The Content-Security-Policy the app ships (next.config.mjs) is one it really runs under: every
// main page, for the role that uses it, loads and hydrates without a single CSP violation
// (Chromium reports them as "Refused to …" console errors and securitypolicyviolation events;
// CSP Level 3 §5.3). And a name with markup in it renders as text (React escapes text content).

const VIOLATION = /Content Security Policy|Refused to/i;

async function watch(page: Page) {
  const seen: string[] = [];
  page.on("console", (m) => {
    if (VIOLATION.test(m.text())) seen.push(`console ${m.type()}: ${m.text()}`);
  });
  page.on("pageerror", (e) => {
    if (VIOLATION.test(e.message)) seen.push(`pageerror: ${e.message}`);
  });
  await page.addInitScript(() => {
    document.addEventListener("securitypolicyviolation", (e) => {
      const w = window as unknown as { __csp?: string[] };
      (w.__csp ??= []).push(`${e.violatedDirective} blocked ${e.blockedURI || "(inline)"} at ${e.sourceFile}:${e.lineNumber}`);
    });
  });
  return seen;
}

async function visit(page: Page, path: string, seen: string[]) {
  const res = await page.goto(path);
  expect(res?.status(), path).toBeLessThan(400);
  await page.waitForLoadState("load");
  // Hydration and the first polls run; a violation from them shows up here too.
  await page.waitForTimeout(700);
  const events = await page.evaluate(() => (window as unknown as { __csp?: string[] }).__csp ?? []);
  for (const e of events) seen.push(`${path}: ${e}`);
  const csp = res?.headers()["content-security-policy"] ?? "";
  expect(csp, `${path} is served with the policy`).toContain("frame-ancestors 'none'");
}

test("signed-out pages run under the CSP", async ({ page }) => {
  const seen = await watch(page);
  await visit(page, "/login", seen);
  await visit(page, "/forbidden", seen);
  expect(seen).toEqual([]);
});

const PAGES: [string, string[]][] = [
  ["dispatcher", ["/board", "/orders", "/orders/new", "/orders/calendar", "/rotations", "/messages", "/roster", "/leave", "/time", "/phone"]],
  ["supervisor", ["/board", "/audit", "/credentials"]],
  ["hr", ["/credentials", "/credentials/import", "/credentials/types", "/roster", "/rotations"]],
  ["admin", ["/admin", "/admin/templates", "/audit"]],
  ["lineworker", ["/me", "/time", "/leave"]],
];

for (const [role, paths] of PAGES) {
  test(`${role}: ${paths.join(", ")} run under the CSP`, async ({ page }) => {
    const seen = await watch(page);
    await signIn(page, role);
    for (const p of paths) await visit(page, p, seen);
    expect(seen).toEqual([]);
  });
}

test("pages with a record in the path run under the CSP: an order, its briefing, a worker's credentials and messages", async ({ page }) => {
  const seen = await watch(page);
  await signIn(page, "supervisor");
  const orders = await (await page.request.get("/api/orders?yard=NOR")).json();
  const order = orders.orders[0];
  const workers = await (await page.request.get("/api/workers?yard=NOR")).json();
  const worker = workers.workers[0];
  for (const p of [`/orders/${order.id}`, `/orders/${order.id}/briefing`, `/credentials/${worker.id}`, `/messages/${worker.id}`]) await visit(page, p, seen);
  expect(seen).toEqual([]);
});

test.describe("markup in a name", () => {
  const first = "<script>window.__x=1</script>";
  const last = `O'Brien "Ace"`;
  let db: Knex;
  let workerId: number | null = null;
  test.beforeAll(() => {
    db = knex(dbConfig());
  });
  test.afterAll(async () => {
    if (workerId) await db("workers").where({ id: workerId }).delete();
    await db.destroy();
  });

  test("renders as text on the roster and the credentials page, and never runs", async ({ page }) => {
    const seen = await watch(page);
    await signIn(page, "hr");
    const yards = await db("yards").where({ code: "NOR" }).first("id");
    const created = await page.request.post("/api/workers", {
      data: { employeeNo: `XSS-${Date.now().toString(36)}`, firstName: first, lastName: last, classification: "ground_hand", yardId: yards.id },
    });
    expect(created.status()).toBe(201);
    const body = await created.json();
    workerId = body.worker.id;
    expect(body.worker.firstName).toBe(first);
    expect(body.worker.lastName).toBe(last);

    await visit(page, "/roster", seen);
    const shown = page.getByText(`${first} ${last}`, { exact: true }).first();
    await expect(shown).toBeVisible();
    expect(await page.evaluate(() => (window as unknown as { __x?: number }).__x)).toBeUndefined();
    // No script element made of it (the RSC payload carries the name as an escaped string, which is fine).
    const asScript = () => page.evaluate(() => [...document.scripts].some((s) => s.textContent?.trim() === "window.__x=1"));
    expect(await asScript()).toBe(false);

    await visit(page, `/credentials/${workerId}`, seen);
    await expect(page.getByText(first, { exact: false }).first()).toBeVisible();
    expect(await page.evaluate(() => (window as unknown as { __x?: number }).__x)).toBeUndefined();
    expect(await asScript()).toBe(false);
    expect(seen).toEqual([]);
  });
});
