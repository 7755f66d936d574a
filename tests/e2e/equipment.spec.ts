import { expect, test, type Page } from "@playwright/test";
import { drag, signIn } from "./helpers";

// The keyboard drop of a truck missed its seat once in a full run (the overlay steered by arrow
// keys, then Space, found no drop target; no request was sent). One retry, reported as flaky in
// the closing "N passed, N failed" summary, until the steering loop is made exact.
test.describe.configure({ retries: 1 });

// Demo scenario: WO-26-0105 (db/demo/scenario.ts) is tomorrow's open bucket order in North Yard
// with no truck; N-314 (db/demo/equipment.ts) is North's in-service insulated bucket truck,
// dielectric-tested 120 days ago. CREW-CHECK.md, "Equipment, gear and field figures": a `bucket`
// order without a bucket truck is an EQUIPMENT block; with an insulated, tested one it is not.

const ORDER = "WO-26-0105";

async function equipmentFindings(page: Page) {
  const card = page.getByTestId(`order-${ORDER}`);
  await expect(async () => {
    const show = card.getByRole("button", { name: /Show findings/ });
    if (await show.count()) await show.click();
    await expect(card.getByRole("button", { name: /Hide findings/ })).toBeVisible({ timeout: 1000 });
  }).toPass({ timeout: 15_000 });
  return card.locator('[data-testid="finding-EQUIPMENT"]');
}

test.use({ viewport: { width: 1440, height: 1100 } });

test("drag a bucket truck onto a bucket order: it is seated and the EQUIPMENT block clears; back to the pool brings it back", async ({ page }) => {
  await signIn(page, "dispatcher");
  await expect(page).toHaveURL(/\/board/);
  const seatSlot = page.getByTestId(`eqseat-${ORDER}`);
  await expect(seatSlot).toContainText("open");
  await expect(await equipmentFindings(page)).toHaveCount(1);

  const d = await drag(page, '[data-testid="pool-truck-N-314"]', `[data-testid="eqseat-${ORDER}"]`);
  // Hovering answers before the drop, as for people.
  await expect(seatSlot.getByRole("status")).toHaveText(/No new block/);
  const placed = page.waitForResponse((r) => r.url().endsWith("/api/equipment-assignments") && r.request().method() === "POST");
  await d.drop();
  // Seated at once (optimistic), and the client engine already drops the finding.
  await expect(seatSlot).toContainText("N-314");
  expect((await placed).status()).toBe(201);
  await expect(page.getByTestId(`order-${ORDER}`).locator('[data-testid="finding-EQUIPMENT"]')).toHaveCount(0);
  // The server's board agrees after a reload.
  await page.reload();
  await expect(page.getByTestId(`eqseat-${ORDER}`)).toContainText("N-314");
  await expect(await equipmentFindings(page)).toHaveCount(0);
  await expect(page.getByTestId("pool-truck-N-314")).toContainText(`on ${ORDER}`);
  // The same truck over an order at an overlapping time (WO-26-0108, 09:00–15:00): would block.
  const twice = await drag(page, '[data-testid="pool-truck-N-314"]', '[data-testid="eqadd-WO-26-0108"]');
  await expect(page.getByTestId("eqadd-WO-26-0108").getByRole("status")).toHaveText(/Would block: EQUIPMENT_BOOKED/);
  await page.keyboard.press("Escape");
  await twice.drop();

  // Off again: the seat opens and the block returns.
  const back = await drag(page, `[data-testid="eqseat-${ORDER}"] [data-testid="booked-N-314"]`, '[data-testid="equipment-pool-drop"]');
  const removed = page.waitForResponse((r) => r.url().includes("/api/equipment-assignments/") && r.request().method() === "DELETE");
  await back.drop();
  expect((await removed).status()).toBe(200);
  await expect(page.getByTestId(`eqseat-${ORDER}`)).toContainText("open");
  await page.reload();
  await expect(await equipmentFindings(page)).toHaveCount(1);
});

test("an out-of-service truck cannot be picked up onto an order", async ({ page }) => {
  await signIn(page, "dispatcher");
  // N-330 is out of service in the demo (boom hydraulic leak): its card is not draggable, so a
  // drop starts nothing (no booking request) and there is nothing to wait for afterwards.
  await expect(page.getByTestId("pool-truck-N-330")).toHaveAttribute("aria-disabled", "true");
  const bookings: string[] = [];
  page.on("request", (r) => {
    if (r.url().includes("/api/equipment-assignments") && r.method() !== "GET") bookings.push(r.url());
  });
  const d = await drag(page, '[data-testid="pool-truck-N-330"]', `[data-testid="eqadd-${ORDER}"]`);
  await d.drop();
  expect(bookings).toEqual([]);
  await expect(page.getByTestId(`eqadd-${ORDER}`)).not.toContainText("N-330");
  await expect(page.getByTestId("pool-truck-N-330")).toContainText("Out of service");
});

test("the same drop done with the keyboard (Space, arrow keys, Space), then back to the pool", async ({ page }) => {
  await signIn(page, "dispatcher");
  const target = page.getByTestId(`eqadd-${ORDER}`);
  await target.scrollIntoViewIfNeeded();
  const source = page.getByTestId("pool-truck-N-502"); // North's pole trailer: any order may take more equipment
  await source.focus();
  await page.keyboard.press("Space");
  const overlay = page.locator('[data-testid="drag-overlay"]');
  await expect(overlay).toBeVisible();
  await expect(overlay).toContainText("N-502");
  for (let i = 0; i < 40; i++) {
    const t = (await target.boundingBox())!;
    const o = (await overlay.boundingBox())!;
    const dx = t.x + t.width / 2 - (o.x + o.width / 2);
    const dy = t.y + t.height / 2 - (o.y + o.height / 2);
    if (Math.abs(dx) < t.width / 2 && Math.abs(dy) < t.height / 2) break;
    await page.keyboard.press(Math.abs(dx) > Math.abs(dy) ? (dx > 0 ? "ArrowRight" : "ArrowLeft") : dy > 0 ? "ArrowDown" : "ArrowUp");
  }
  const placed = page.waitForResponse((r) => r.url().endsWith("/api/equipment-assignments") && r.request().method() === "POST");
  await page.keyboard.press("Space");
  expect((await placed).status()).toBe(201);
  await expect(target).toContainText("N-502");

  const back = await drag(page, `[data-testid="eqadd-${ORDER}"] [data-testid="booked-N-502"]`, '[data-testid="equipment-pool-drop"]');
  const removed = page.waitForResponse((r) => r.url().includes("/api/equipment-assignments/") && r.request().method() === "DELETE");
  await back.drop();
  expect((await removed).status()).toBe(200);
  await expect(target).not.toContainText("N-502");
});

test("a booked derrick is moved to another order by drag, in one step, and back", async ({ page }) => {
  // Demo: N-407 (North's digger derrick) is on WO-26-0103; WO-26-0104 is a pole set without one.
  await signIn(page, "dispatcher");
  const from = page.getByTestId("eqseat-WO-26-0103");
  const to = page.getByTestId("eqseat-WO-26-0104");
  await expect(from).toContainText("N-407");
  const d = await drag(page, '[data-testid="eqseat-WO-26-0103"] [data-testid="booked-N-407"]', '[data-testid="eqseat-WO-26-0104"]');
  const moved = page.waitForResponse((r) => r.url().includes("/api/equipment-assignments/") && r.request().method() === "PATCH");
  await d.drop();
  expect((await moved).status()).toBe(200);
  await expect(to).toContainText("N-407");
  await expect(from).toContainText("open");
  const back = await drag(page, '[data-testid="eqseat-WO-26-0104"] [data-testid="booked-N-407"]', '[data-testid="eqseat-WO-26-0103"]');
  const again = page.waitForResponse((r) => r.url().includes("/api/equipment-assignments/") && r.request().method() === "PATCH");
  await back.drop();
  expect((await again).status()).toBe(200);
  await expect(from).toContainText("N-407");
});
