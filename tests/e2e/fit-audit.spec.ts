import { expect, test, type Page } from "@playwright/test";
import { demo } from "./helpers";

/** Signs in, trying again when a click beat the form's hydration (it then posts natively). */
async function signIn(page: Page, role: string) {
  const a = demo(role);
  await expect(async () => {
    if (!page.url().includes("/login") || page.url() === "about:blank") await page.goto("/login");
    await page.waitForLoadState("load");
    await page.waitForTimeout(1_000); // let the form hydrate on a loaded machine
    await page.locator('input[name="email"]').fill(a.email);
    await page.locator('input[name="password"]').fill(a.password);
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.waitForURL((url) => !url.pathname.startsWith("/login"), { timeout: 15_000 });
  }).toPass({ timeout: 90_000 });
}

// Audit and Messages read as people read (issue 18 points 10 and 11): plain sentences, times on
// the yard's clock with the zone's abbreviation (IANA America/Chicago: CST in winter, CDT in
// summer), filters by date, person, order and action.

const tz = "America/Chicago";
const farDay = (n: number) => {
  const [y, m, d] = new Intl.DateTimeFormat("en-CA", { timeZone: tz }).format(new Date()).split("-").map(Number);
  return new Date(Date.UTC(y, m - 1, d + n)).toISOString().slice(0, 10);
};

test("the audit log says what a supervisor did in a sentence, in the yard's zone, and filters by order, person, action and date", async ({ page }) => {
  test.setTimeout(120_000);
  await signIn(page, "supervisor");
  const api = page.request;
  const day = farDay(150 + Math.floor(Math.random() * 300));
  const types = await (await api.get("/api/work-types")).json();
  const patrol = types.workTypes.find((t: { code: string }) => t.code === "patrol");
  const title = `Audit patrol ${Date.now().toString(36)}`;
  const made = await api.post("/api/orders", {
    data: { title, yardId: 1, workTypeId: patrol.id, start: `${day}T07:00`, end: `${day}T12:00`, energized: false, positions: [{ position: "ground" }] },
  });
  expect(made.status(), await made.text()).toBe(201);
  const board = await (await api.get(`/api/board?date=${day}&yard=NOR`)).json();
  const card = board.orders.find((o: { title: string }) => o.title === title);
  const cody = board.pool.find((p: { employeeNo: string }) => p.employeeNo === "CP-1023");
  expect((await api.post("/api/assignments", { data: { positionId: card.seats[0].id, workerId: cody.id } })).status()).toBe(201);

  await page.goto(`/audit?order=${card.number}`);
  const table = page.getByTestId("audit-table");
  await expect(table).toContainText(`Glenn Harrower placed Cody Brandvold as ground on ${card.number}.`);
  await expect(table.locator("tbody tr").first().locator("td").first()).toHaveText(/\d{2}:\d{2} C[SD]T$/);
  // No raw JSON on the face: the detail is folded away under "details".
  await expect(table.getByText('"workerId"')).toBeHidden();
  const rows = table.locator("tbody tr");
  const n = await rows.count();
  for (let i = 0; i < n; i++) await expect(rows.nth(i)).toContainText(card.number);

  // Person and action filters through the form.
  await page.getByLabel("Person").selectOption({ label: "Glenn Harrower" });
  await page.getByLabel("Action").selectOption("assignment.create");
  await page.getByRole("button", { name: "Filter" }).click();
  await expect(page).toHaveURL(/actor=\d+/);
  await expect(rows).toHaveCount(1);
  await expect(rows.first()).toHaveAttribute("data-action", "assignment.create");
  // A date range that ends before today finds nothing of today's.
  await page.getByLabel("To", { exact: true }).fill("2020-01-31");
  await page.getByRole("button", { name: "Filter" }).click();
  await expect(table).toContainText("Nothing recorded for these filters.");
});

test("Messages shows every time with the zone's abbreviation, never bare UTC", async ({ page }) => {
  test.setTimeout(120_000);
  await signIn(page, "supervisor");
  await page.goto("/messages");
  await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
  const text = await page.locator("body").innerText();
  const stamps = text.match(/[A-Z][a-z]{2} \d{1,2}, \d{2}:\d{2}( [A-Z]{3,4})?/g) ?? [];
  expect(stamps.length).toBeGreaterThan(0); // the demo seeds texts and e-mails
  for (const s of stamps) expect(s).toMatch(/ (CST|CDT|MST|MDT)$/);
  expect(text).not.toMatch(/\d{2}:\d{2} UTC/);
});
