import { expect, test, type Page } from "@playwright/test";

// Work orders, recurrence and call-outs through the screens a dispatcher uses. Runs on the
// demo seed; everything it makes is removed at the end (the series is ended, the call-out
// deleted), and it touches only Mateo Quintana (CP-1014), a rested apprentice nobody else's
// spec relies on.

const CHI = "America/Chicago";
const todayIn = (tz: string) =>
  new Intl.DateTimeFormat("en-CA", { timeZone: tz, year: "numeric", month: "2-digit", day: "2-digit" }).format(new Date());
const addDays = (d: string, n: number) => {
  const t = new Date(`${d}T00:00:00Z`);
  t.setUTCDate(t.getUTCDate() + n);
  return t.toISOString().slice(0, 10);
};

async function signIn(page: Page, email: string, password: string) {
  await page.goto("/login");
  await page.fill('input[name="email"]', email);
  await page.fill('input[name="password"]', password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL((u) => !u.pathname.startsWith("/login"));
}

test.describe("work orders and call-outs", () => {
  const cleanup: ((page: Page) => Promise<unknown>)[] = [];

  test.afterEach(async ({ page }) => {
    for (const f of cleanup.splice(0).reverse()) await f(page).catch(() => undefined);
  });

  test("a dispatcher creates a weekly order and finds next week's occurrence on the calendar (RFC 5545 FREQ=WEEKLY)", async ({ page }) => {
    await signIn(page, "dispatch@cedarprairie.example", "board-north-26");
    const today = todayIn(CHI);
    const first = addDays(today, 21); // three weeks out: clear of tomorrow's demo board
    const title = `Weekly feeder patrol e2e ${Date.now().toString(36)}`;

    await page.goto("/orders/new");
    await page.getByLabel("Title").fill(title);
    await page.getByLabel("Work type").selectOption({ label: "Bucket truck work" });
    await page.getByLabel("Address or location").fill("Feeder 3, Relay Road");
    await page.getByLabel("Start", { exact: true }).fill(`${first}T07:00`);
    await page.getByLabel("End", { exact: true }).fill(`${first}T15:00`);
    await page.getByLabel("Repeats").selectOption("weekly");
    await page.getByLabel("Ends").selectOption("count");
    await page.getByLabel("Number of times").fill("4");
    // The preview is the same expansion the server materialises: next week's date is listed.
    const preview = page.getByTestId("occurrence-preview");
    await expect(preview.locator("li")).toHaveCount(4);
    const created = page.waitForResponse((r) => r.url().endsWith("/api/orders") && r.request().method() === "POST");
    await page.getByRole("button", { name: "Create repeating order" }).click();
    const res = await created;
    expect(res.status()).toBe(201);
    const body = await res.json();
    expect(body.created).toBe(4);
    cleanup.push((p) => p.request.delete(`/api/order-series/${body.seriesId}`));
    await page.waitForURL(/\/orders\/\d+/);
    await expect(page.getByRole("status").filter({ hasText: "Repeating order created" })).toBeVisible();

    const nextWeek = addDays(first, 7);
    await page.goto(`/orders/calendar?yard=NOR&view=day&date=${nextWeek}`);
    const card = page.getByTestId("calendar-order").filter({ hasText: title });
    await expect(card).toHaveCount(1);
    await expect(card).toContainText("07:00–15:00");
    // and in the week view, on that day's column
    await page.goto(`/orders/calendar?yard=NOR&view=week&date=${nextWeek}`);
    await expect(page.locator(`[data-date="${nextWeek}"]`).getByTestId("calendar-order").filter({ hasText: title })).toHaveCount(1);
  });

  test("a late call-out shows in the worker's week with its hours (kind call_out, read by the rest rule)", async ({ page }) => {
    await signIn(page, "dispatch@cedarprairie.example", "board-north-26");
    const today = todayIn(CHI);
    const tomorrow = addDays(today, 1);

    await page.goto("/rotations");
    const form = page.getByRole("form", { name: "Record a call-out" });
    await form.getByLabel("Rotation").selectOption({ label: "North on-call" });
    await form.getByLabel("Worker called out").selectOption({ label: "Mateo Quintana (CP-1014, NOR)" });
    await form.getByLabel("Started").fill(`${today}T22:00`);
    await form.getByLabel("Ended").fill(`${tomorrow}T03:00`);
    await form.getByLabel("What was it").fill("e2e: transformer fuse out at N-2871");
    const posted = page.waitForResponse((r) => r.url().endsWith("/api/call-outs"));
    await form.getByRole("button", { name: "Record call-out" }).click();
    const res = await posted;
    expect(res.status()).toBe(201);
    const { id, hours } = await res.json();
    cleanup.push((p) => p.request.delete(`/api/time-records/${id}`));
    expect(hours).toBe(5); // 22:00 → 03:00, no clock change tonight
    await expect(form.getByRole("status")).toContainText("5 h for Mateo Quintana");

    await form.getByRole("link", { name: "See the week" }).click();
    await page.waitForURL(/\/time\?/);
    const day = page.locator(`[data-testid="time-day"][data-date="${today}"]`);
    const record = day.getByTestId("time-record").filter({ hasText: "Call-out" });
    await expect(record).toContainText("22:00–");
    await expect(record).toContainText("03:00 · 5.00 h");
    await expect(page.getByTestId("week-totals")).toBeVisible();
  });
});
