import { expect, test } from "@playwright/test";
import { signIn } from "./helpers";

// The order form's issue-14 fields as a dispatcher uses them: a single-phase tap entered as
// phases 1 at 7.2 kV on a 12.47 kV system shows as "12.47Y/7.2 kV" (../shared/CREW-CHECK.md,
// Corrections 8); a three-day order gets one shift a day, a shift past the order's end is
// refused beside that shift, and the saved order lists its shifts.
// On a day of the test's own (8 weeks out), cancelled at the end.

function dayFromToday(offset: number) {
  const today = new Intl.DateTimeFormat("en-CA", { timeZone: "America/Chicago" }).format(new Date());
  const [y, m, d] = today.split("-").map(Number);
  return new Date(Date.UTC(y, m - 1, d + offset)).toISOString().slice(0, 10);
}

test.use({ viewport: { width: 1300, height: 1000 } });

test("a three-day single-phase tap rebuild with its shifts", async ({ page }) => {
  await signIn(page, "dispatcher");
  const d0 = dayFromToday(58);
  const d2 = dayFromToday(60);
  await page.goto(`/orders/new?yard=NOR&date=${d0}`);
  await page.getByLabel("Title").fill(`Three-day tap rebuild ${Date.now()}`);
  await page.locator("#end").fill(`${d2}T15:30`);
  await page.locator("#voltageKv").fill("7.2");
  await page.locator("#phases").selectOption("1");
  await page.locator("#systemKv").fill("12.47");
  await expect(page.getByTestId("voltage-label")).toHaveText("Shows as 12.47Y/7.2 kV");

  const shifts = page.getByTestId("order-shifts");
  await shifts.getByRole("button", { name: /One shift a day/ }).click();
  await expect(shifts.locator('[aria-label="Shifts"] li')).toHaveCount(3);
  await shifts.getByRole("button", { name: "Add shift" }).click(); // a fourth day, past the order's end
  // The form checks with the route's own schema before sending: the error sits beside that
  // shift and nothing is posted (the route's 422 naming shifts.3.end: tests/integration/order-site-fields.test.ts).
  let posted = 0;
  page.on("request", (r) => {
    if (r.url().endsWith("/api/orders") && r.method() === "POST") posted++;
  });
  await page.getByRole("button", { name: "Create order" }).click();
  await expect(page.locator('[id="shifts.3.end-error"]')).toContainText("after the order");
  expect(posted).toBe(0);

  await shifts.getByRole("button", { name: "Remove shift 4" }).click();
  await page.getByRole("button", { name: "Create order" }).click();
  await expect(page).toHaveURL(/\/orders\/\d+/);
  await expect(page.getByTestId("order-energy")).toHaveText("energized 12.47Y/7.2 kV");
  const list = page.getByTestId("order-shift-list");
  await expect(list.locator("span")).toHaveCount(3);
  await expect(list).toContainText("07:00–15:30");

  const id = Number(new URL(page.url()).pathname.split("/").pop());
  const order = await (await page.request.get(`/api/orders/${id}`)).json();
  expect(order.shifts.map((s: { startLocal: string }) => s.startLocal.slice(0, 10))).toEqual([d0, dayFromToday(59), d2]);
  expect((await page.request.delete(`/api/orders/${id}?version=${order.version}`)).status()).toBe(200);
});
