import AxeBuilder from "@axe-core/playwright";
import { expect, test, type Browser, type BrowserContext, type Page } from "@playwright/test";
import { demo } from "./helpers";

// Issue 18, accessibility: every page each role can reach, scanned with axe-core
// (@axe-core/playwright 4.11, the reference checker for WCAG 2.1 A/AA rules: tags wcag2a,
// wcag2aa, wcag21a, wcag21aa), must have no serious or critical violation. Beside the scan, the
// page's own structure: one <main>, a main <nav> when signed in, one <h1>, and a skip link that
// is the first thing Tab reaches (WCAG 2.1 SC 2.4.1 Bypass Blocks, 1.3.1 Info and Relationships).
// Read-only: nothing is saved, so it runs in any order beside the other specs.

type Role = "admin" | "supervisor" | "dispatcher" | "hr" | "lineworker";
const ROLES: Role[] = ["admin", "supervisor", "dispatcher", "hr", "lineworker"];
const TAGS = ["wcag2a", "wcag2aa", "wcag21a", "wcag21aa"];
const WIDE = { width: 1440, height: 1000 };
const PHONE = { width: 390, height: 844 };

interface Found {
  id: string;
  impact: string | null | undefined;
  help: string;
  targets: string[];
}

/** Scans the page as it is and returns the serious and critical violations, one line each for the report. */
async function scan(page: Page): Promise<Found[]> {
  const result = await new AxeBuilder({ page }).withTags(TAGS).analyze();
  // A11Y_VERBOSE=1 lists every violation, minor and moderate too, one line per rule.
  if (process.env.A11Y_VERBOSE) {
    for (const v of result.violations) console.log(`axe ${new URL(page.url()).pathname} ${v.id} ${v.impact} ${v.nodes.length}`);
  }
  return result.violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .map((v) => ({ id: v.id, impact: v.impact, help: v.help, targets: v.nodes.map((n) => n.target.join(" ")) }));
}

function report(where: string, found: Found[]) {
  return found
    .map((v) => `${where}: ${v.id} (${v.impact}) ${v.help}\n${v.targets.slice(0, 8).map((t) => `    ${t}`).join("\n")}${v.targets.length > 8 ? `\n    … ${v.targets.length - 8} more` : ""}`)
    .join("\n");
}

type State = Awaited<ReturnType<BrowserContext["storageState"]>>;
const states = new Map<Role, State>();

/** One sign-in per role for the whole file (one worker): the signed-in cookies are kept in memory and reused. */
async function stateFor(browser: Browser, role: Role): Promise<State> {
  const kept = states.get(role);
  if (kept) return kept;
  const context = await browser.newContext();
  const page = await context.newPage();
  const a = demo(role);
  // Retried: a click before the form has hydrated posts the bare form and stays on /login.
  await expect(async () => {
    await page.goto("/login");
    await page.getByLabel("E-mail").fill(a.email);
    await page.getByLabel("Password").fill(a.password);
    await page.getByRole("button", { name: "Sign in" }).click();
    await expect
      .poll(async () => (await context.cookies()).some((c) => c.name.endsWith("next-auth.session-token")), { timeout: 15_000 })
      .toBe(true);
  }).toPass({ timeout: 60_000 });
  const state = await context.storageState();
  await context.close();
  states.set(role, state);
  return state;
}

/** The href of the first link on `from` whose path matches `pattern` (the detail pages' ids come from the pages themselves). */
async function firstLink(page: Page, from: string, pattern: RegExp, text?: RegExp): Promise<string> {
  await page.goto(from);
  let found = "";
  // Retried until the page's links are there (client tables fill in after hydration).
  await expect(async () => {
    const hrefs = await page.locator("a[href]").evaluateAll((as) =>
      as.map((a) => ({ href: new URL((a as HTMLAnchorElement).href).pathname, text: a.closest("tr, li, article")?.textContent ?? a.textContent ?? "" })),
    );
    const hit = hrefs.find((h) => pattern.test(h.href) && (!text || text.test(h.text)));
    expect(hit, `a link matching ${pattern} on ${from}`).toBeTruthy();
    found = hit!.href;
  }).toPass({ timeout: 20_000 });
  return found;
}

/** The pages a role reaches: its nav links (read from the page) plus the detail pages. */
async function pagesFor(page: Page, role: Role): Promise<string[]> {
  await page.goto("/account/password");
  const links = page.locator('nav[aria-label="Main"] a');
  await expect(links.first()).toBeVisible();
  const nav = await links.evaluateAll((as) => as.map((a) => new URL((a as HTMLAnchorElement).href).pathname));
  expect(nav.length, `${role} has nav links`).toBeGreaterThan(0);
  const extra: string[] = ["/account/password"];
  if (role === "dispatcher" || role === "supervisor" || role === "admin") {
    const order = await firstLink(page, "/orders", /^\/orders\/\d+$/, /WO-26-0101/);
    extra.push(order, "/orders/calendar");
    if (role !== "admin") extra.push(`${order}/briefing`, "/orders/new");
  }
  if (role === "dispatcher" || role === "supervisor") {
    // A worker's message thread: Marcus Whitfield (CP-1001), from the roster's own answer.
    const res = await page.request.get("/api/workers?q=Whitfield");
    const { workers } = (await res.json()) as { workers: { id: number; employeeNo: string }[] };
    const marcus = workers.find((w) => w.employeeNo === "CP-1001");
    if (!marcus) throw new Error("no CP-1001 in /api/workers");
    extra.push(`/messages/${marcus.id}`);
  }
  if (role === "dispatcher" || role === "hr") extra.push("/credentials/gear");
  if (role === "hr" || role === "admin" || role === "supervisor") {
    extra.push(await firstLink(page, "/credentials", /^\/credentials\/\d+$/), "/credentials/types");
  }
  if (role === "hr" || role === "admin") extra.push("/credentials/gear", "/credentials/import");
  if (role === "admin") extra.push("/admin/users", "/admin/templates");
  if (role === "lineworker") extra.push(await firstLink(page, "/me", /^\/orders\/\d+\/briefing$/));
  return [...new Set([...nav, ...extra])];
}

/** Waits until the page has drawn its content (client pages fetch after hydration). */
async function settle(page: Page) {
  await page.waitForLoadState("load");
  // Streamed pages hold a hidden copy until it is swapped in: the visible heading is the one.
  await expect(page.locator("h1:visible").first()).toBeVisible();
  await expect(page.locator('[aria-busy="true"], [data-loading="true"]')).toHaveCount(0);
}

async function structure(page: Page, signedIn: boolean): Promise<string[]> {
  const problems: string[] = [];
  const mains = await page.locator("main").count();
  if (mains !== 1) problems.push(`${mains} <main> landmarks (want 1)`);
  const h1 = await page.locator("h1:visible").count();
  if (h1 !== 1) problems.push(`${h1} <h1> (want 1)`);
  if (signedIn && (await page.locator('nav[aria-label="Main"]').count()) !== 1) problems.push("no main <nav>");
  if (!signedIn) return problems;
  // The skip link: the first Tab stop, visible when focused, pointing at <main>.
  await page.locator("body").focus();
  await page.keyboard.press("Tab");
  const first = await page.evaluate(() => {
    const el = document.activeElement as HTMLElement | null;
    if (!el) return null;
    const href = el.getAttribute("href") ?? "";
    const target = href.startsWith("#") ? document.getElementById(href.slice(1)) : null;
    return { text: el.textContent?.trim() ?? "", targetIsMain: !!target && (target.tagName === "MAIN" || !!target.closest("main")), visible: el.getBoundingClientRect().width > 1 };
  });
  if (!first || !/skip/i.test(first.text) || !first.targetIsMain || !first.visible) {
    problems.push(`first Tab stop is not a visible skip link to <main> (${JSON.stringify(first)})`);
  }
  return problems;
}

for (const role of ROLES) {
  const widths = role === "lineworker" ? [WIDE, PHONE] : [WIDE];
  for (const viewport of widths) {
    test(`${role} at ${viewport.width} px: every page has no serious or critical axe violation`, async ({ browser }) => {
      test.setTimeout(180_000); // sign-in and the list of pages; then time per page below
      const context = await browser.newContext({ storageState: await stateFor(browser, role), viewport });
      const page = await context.newPage();
      const pages = await pagesFor(page, role);
      // A page takes about a second on the production build; the room is for a busy machine.
      test.setTimeout(180_000 + pages.length * 15_000);
      const failures: string[] = [];
      for (const url of pages) {
        await test.step(url, async () => {
          const where = `${role} ${viewport.width}px ${url}`;
          const res = await page.goto(url);
          if ((res?.status() ?? 0) >= 400) return void failures.push(`${where}: answered ${res?.status()}`);
          if (new URL(page.url()).pathname !== url) return void failures.push(`${where}: redirected to ${page.url()}`);
          await settle(page);
          const found = await scan(page);
          if (found.length) failures.push(report(where, found));
          const s = await structure(page, true);
          if (s.length) failures.push(`${where}: ${s.join("; ")}`);
        });
      }
      // The board with a card's findings open (badges of every tone, override buttons).
      if (pages.includes("/board")) {
        await test.step("/board with findings open", async () => {
          await page.goto("/board");
          await settle(page);
          const show = page.getByRole("button", { name: /Show findings/ }).first();
          await expect(async () => {
            await show.click();
            await expect(page.getByRole("button", { name: /Hide findings/ }).first()).toBeVisible({ timeout: 1000 });
          }).toPass({ timeout: 15_000 });
          const found = await scan(page);
          if (found.length) failures.push(report(`${role} ${viewport.width}px /board (findings open)`, found));
        });
      }
      await context.close();
      if (failures.length) console.log(failures.join("\n"));
      expect(failures, failures.join("\n")).toEqual([]);
    });
  }
}

for (const viewport of [WIDE, PHONE]) {
  test(`signed out at ${viewport.width} px: sign-in and set-password pages have no serious or critical axe violation`, async ({ browser }) => {
    const context = await browser.newContext({ viewport });
    const page = await context.newPage();
    const failures: string[] = [];
    // The reset link carries a token; any token shows the form (it is checked when sent).
    for (const url of ["/login", "/reset-password?token=a11y-scan-token", "/reset-password"]) {
      await page.goto(url);
      await page.waitForLoadState("load");
      await expect(page.locator("form, main p").first()).toBeVisible();
      const found = await scan(page);
      if (found.length) failures.push(report(`signed out ${viewport.width}px ${url}`, found));
      const s = await structure(page, false);
      if (s.length) failures.push(`signed out ${viewport.width}px ${url}: ${s.join("; ")}`);
    }
    await context.close();
    if (failures.length) console.log(failures.join("\n"));
    expect(failures, failures.join("\n")).toEqual([]);
  });
}

// The board is worked for hours from the keyboard too (WCAG 2.1.1 Keyboard, 2.4.3 Focus Order,
// 2.4.7 Focus Visible): from the top of the page, Tab alone reaches Send crews, then the pool's
// workers, then a worker in an order's seat (each picked up with Space: dnd-kit's KeyboardSensor,
// board.spec.ts), in the order they are drawn, and every stop on the way shows where focus is.
test("dispatcher: Tab reaches Send crews, the pool and an order's seats in order, with focus visible at every stop", async ({ browser }) => {
  test.setTimeout(120_000);
  const context = await browser.newContext({ storageState: await stateFor(browser, "dispatcher"), viewport: WIDE });
  const page = await context.newPage();
  await page.goto("/board");
  await expect(page.locator('[data-testid^="pool-worker-"]').first()).toBeVisible();
  await expect(page.locator('[data-testid^="seated-"]').first()).toBeVisible();
  await page.locator("body").focus();
  const stops: { what: string; visible: boolean }[] = [];
  let send = -1;
  let pool = -1;
  let seat = -1;
  for (let i = 0; i < 400 && (send < 0 || pool < 0 || seat < 0); i++) {
    await page.keyboard.press("Tab");
    const s = await page.evaluate(() => {
      const el = document.activeElement as HTMLElement | null;
      if (!el || el === document.body) return null;
      const css = getComputedStyle(el);
      const outline = css.outlineStyle !== "none" && parseFloat(css.outlineWidth) >= 2;
      const ring = css.boxShadow !== "none" && css.boxShadow !== "";
      const r = el.getBoundingClientRect();
      return {
        testid: el.dataset.testid ?? "",
        inSeat: !!el.closest("li[data-position]") && !!el.closest('[data-testid^="order-"]'),
        what: `${el.tagName.toLowerCase()}${el.dataset.testid ? `[${el.dataset.testid}]` : ""} "${(el.getAttribute("aria-label") ?? el.textContent ?? "").trim().slice(0, 40)}"`,
        visible: (outline || ring) && r.width > 0 && r.height > 0,
      };
    });
    if (!s) continue;
    stops.push({ what: s.what, visible: s.visible });
    if (send < 0 && s.testid === "send-crews") send = stops.length - 1;
    if (pool < 0 && s.testid.startsWith("pool-worker-")) pool = stops.length - 1;
    if (seat < 0 && s.inSeat) seat = stops.length - 1;
  }
  const trail = stops.map((s, i) => `${i}: ${s.what}${s.visible ? "" : "  <- focus not visible"}`).join("\n");
  expect(send, `Send crews reached by Tab\n${trail}`).toBeGreaterThanOrEqual(0);
  expect(pool, `a pool worker reached by Tab\n${trail}`).toBeGreaterThan(send);
  expect(seat, `a worker in an order's seat reached by Tab\n${trail}`).toBeGreaterThan(pool);
  expect(stops.filter((s) => !s.visible).map((s) => s.what), `every stop shows its focus\n${trail}`).toEqual([]);
  // Send crews held back by blocks still says why to whoever reaches it.
  const button = page.getByTestId("send-crews");
  if ((await button.getAttribute("aria-disabled")) === "true") {
    await expect(button).toHaveAccessibleDescription(/unresolved block/);
  }
  await context.close();
});
