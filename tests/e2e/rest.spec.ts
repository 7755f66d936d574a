import { expect, test } from "@playwright/test";
import { drag, signIn } from "./helpers";

// A late call-out recorded tonight joins tomorrow's early order into one stretch of worked time:
// 21:00–03:30 on call, 2.5 h off, then 06:00–14:00 is a 17 h stretch with less than 8 h rest —
// over the 16 h maximum, so REST blocks ("16 on, 8 off": common practice in utility labour
// agreements, the policy's defaults). On days of the test's own, far from the demo's tomorrow.

function dayFromToday(offset: number) {
  const today = new Intl.DateTimeFormat("en-CA", { timeZone: "America/Chicago" }).format(new Date());
  const [y, m, d] = today.split("-").map(Number);
  return new Date(Date.UTC(y, m - 1, d + offset)).toISOString().slice(0, 10);
}

test.use({ viewport: { width: 1440, height: 1100 } });

test("a late call-out puts a REST block on the next early order", async ({ page }) => {
  await signIn(page, "dispatcher");
  const eve = dayFromToday(24);
  const day = dayFromToday(25);
  const workers = await (await page.request.get("/api/workers")).json();
  const denise = (workers.workers ?? workers).find((w: { employeeNo: string }) => w.employeeNo === "CP-1019");
  const types = await (await page.request.get("/api/work-types")).json();
  const storm = (types.workTypes ?? types).find((t: { code: string }) => t.code === "storm");
  const title = `Early storm repair ${Date.now()}`;
  const created = await page.request.post("/api/orders", {
    data: { title, yardId: 1, workTypeId: storm.id, start: `${day}T06:00`, end: `${day}T14:00`, positions: [{ position: "lead" }, { position: "ground" }] },
  });
  expect(created.status()).toBe(201);
  const callOut = await page.request.post("/api/call-outs", {
    data: { workerId: denise.id, start: `${eve}T21:00`, end: `${day}T03:30`, note: "Feeder 4 outage call-out" },
  });
  expect(callOut.status()).toBe(201);

  await page.goto(`/board?date=${day}&yard=NOR`);
  const board = await (await page.request.get(`/api/board?date=${day}&yard=NOR`)).json();
  const card = board.orders.find((o: { title: string }) => o.title === title);
  const seat = `[data-testid="order-${card.number}"] li[data-position="ground"]`;
  const d = await drag(page, '[data-testid="pool-worker-CP-1019"]', seat);
  await expect(page.locator(seat).getByRole("status")).toHaveText(/Would block: .*REST/);
  const placed = page.waitForResponse((r) => r.url().endsWith("/api/assignments") && r.request().method() === "POST");
  await d.drop();
  expect((await placed).status()).toBe(201);

  const cardView = page.getByTestId(`order-${card.number}`);
  await expect(async () => {
    const show = cardView.getByRole("button", { name: /Show findings/ });
    if (await show.count()) await show.click();
    await expect(cardView.getByRole("button", { name: /Hide findings/ })).toBeVisible({ timeout: 1000 });
  }).toPass({ timeout: 15_000 });
  const rest = cardView.locator('[data-testid="finding-REST"]');
  await expect(rest).toContainText("Denise Abernathy");
  await expect(rest).toContainText("Block");
});
