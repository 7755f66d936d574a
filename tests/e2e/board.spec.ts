import { expect, test, type Page } from "@playwright/test";
import { drag, seat, signIn } from "./helpers";

// Demo scenario (db/demo/scenario.ts): WO-26-0102 is an open climbing change-out in North;
// Jesse Navarro (CP-1007) is a rested journeyman with a valid climbing evaluation; Brent
// Haugland (CP-1006) is a journeyman whose climbing evaluation lapsed 10 days ago.

const ORDER = "WO-26-0102";

function findingsOf(page: Page, order: string) {
  return page.locator(`[data-testid="order-${order}"]`);
}

async function openFindings(page: Page, order: string) {
  const card = findingsOf(page, order);
  // Retried until the page has hydrated and the list is open.
  await expect(async () => {
    const show = card.getByRole("button", { name: /Show findings/ });
    if (await show.count()) await show.click();
    await expect(card.getByRole("button", { name: /Hide findings/ })).toBeVisible({ timeout: 1000 });
  }).toPass({ timeout: 15_000 });
}

test.describe.configure({ mode: "serial" });
test.use({ viewport: { width: 1440, height: 1100 } });

test("a rested, qualified climber raises no finding; a lapsed one raises CLIMB_CERT and Send crews stays off", async ({ page }) => {
  await signIn(page, "dispatcher");
  await expect(page).toHaveURL(/\/board/);
  const climber = seat(page, ORDER, "climber");

  // Hovering shows the answer before the drop.
  const d1 = await drag(page, '[data-testid="pool-worker-CP-1007"]', `[data-testid="order-${ORDER}"] li[data-position="climber"]`);
  await expect(climber.getByRole("status")).toHaveText(/No new block/);
  await d1.drop();
  await expect(climber).toContainText("Jesse Navarro");
  await expect(page.getByRole("status").filter({ hasText: "Saved." })).toBeVisible();
  await openFindings(page, ORDER);
  await expect(findingsOf(page, ORDER).locator('[data-testid="finding-CLIMB_CERT"]')).toHaveCount(0);

  // Back to the pool, then the lapsed climber.
  const d2 = await drag(page, `[data-testid="order-${ORDER}"] li[data-position="climber"] [data-testid^="seated-"]`, '[data-testid="pool-drop"]');
  const removed = page.waitForResponse((r) => r.url().includes("/api/assignments/") && r.request().method() === "DELETE");
  await d2.drop();
  await expect(climber).toContainText("Open");
  expect((await removed).status()).toBe(200);
  const d3 = await drag(page, '[data-testid="pool-worker-CP-1006"]', `[data-testid="order-${ORDER}"] li[data-position="climber"]`);
  await expect(climber.getByRole("status")).toHaveText(/Would block: .*CLIMB_CERT/);
  const placed = page.waitForResponse((r) => r.url().endsWith("/api/assignments") && r.request().method() === "POST");
  await d3.drop();
  await expect(climber).toContainText("Brent Haugland");
  expect((await placed).status()).toBe(201);
  await page.reload();
  await openFindings(page, ORDER);
  const cert = findingsOf(page, ORDER).locator('[data-testid="finding-CLIMB_CERT"]');
  await expect(cert).toHaveCount(1);
  await expect(cert).toContainText("Block");
  await expect(cert).toContainText("Brent Haugland");
  await expect(page.getByTestId("send-crews")).toBeDisabled();
  await expect(page.getByTestId("send-reason")).toBeVisible();
  // The dispatcher is told why they cannot override.
  await expect(cert).toContainText("Only a supervisor can override");
});

test("a supervisor overrides the CLIMB_CERT block with a written reason", async ({ page }) => {
  await signIn(page, "supervisor");
  await page.goto("/board?yard=NOR"); // the supervisor has no home yard
  await openFindings(page, ORDER);
  const cert = findingsOf(page, ORDER).locator('[data-testid="finding-CLIMB_CERT"]');
  await cert.getByRole("button", { name: /Override with a reason/ }).click();
  const dialog = page.getByRole("dialog");
  await dialog.getByLabel(/Reason/).fill("short");
  await expect(dialog.getByRole("button", { name: "Record override" })).toBeDisabled();
  await dialog.getByLabel(/Reason/).fill("Re-evaluation passed this morning; paperwork to HR by noon.");
  await dialog.getByRole("button", { name: "Record override" }).click();
  await expect(dialog).toHaveCount(0);
  await expect(cert).toContainText("Overridden");
  await expect(cert).toContainText("Re-evaluation passed this morning");
});

test("the same drag done with the keyboard", async ({ page }) => {
  await signIn(page, "dispatcher");
  const target = seat(page, ORDER, "lead");
  const source = page.getByTestId("pool-worker-CP-1003"); // Tomas Lindqvist, crew lead
  await source.focus();
  await page.keyboard.press("Space");
  const overlay = page.locator('[data-testid="drag-overlay"]');
  await expect(overlay).toBeVisible();
  // Steer towards the target, one jump per key press.
  for (let i = 0; i < 30; i++) {
    const t = (await target.boundingBox())!;
    const o = (await overlay.boundingBox())!;
    const dx = t.x + t.width / 2 - (o.x + o.width / 2);
    const dy = t.y + t.height / 2 - (o.y + o.height / 2);
    if (Math.abs(dx) < t.width / 2 && Math.abs(dy) < t.height / 2) break;
    await page.keyboard.press(Math.abs(dx) > Math.abs(dy) ? (dx > 0 ? "ArrowRight" : "ArrowLeft") : dy > 0 ? "ArrowDown" : "ArrowUp");
  }
  await page.keyboard.press("Space");
  await expect(target).toContainText("Tomas Lindqvist");
});

test("a second dispatcher's board shows the change within 5 s", async ({ browser }) => {
  const a = await browser.newContext({ viewport: { width: 1440, height: 1100 } });
  const b = await browser.newContext({ viewport: { width: 1440, height: 1100 } });
  const pa = await a.newPage();
  const pb = await b.newPage();
  await signIn(pa, "dispatcher");
  await signIn(pb, "dispatcher");
  await expect(seat(pb, "WO-26-0105", "lead")).toContainText("Open");
  const d = await drag(pa, '[data-testid="pool-worker-CP-1012"]', '[data-testid="order-WO-26-0105"] li[data-position="lead"]');
  await d.drop();
  await expect(seat(pa, "WO-26-0105", "lead")).not.toContainText("Open");
  const name = (await seat(pa, "WO-26-0105", "lead").locator('[data-testid^="seated-"] span').first().textContent())!;
  await expect(seat(pb, "WO-26-0105", "lead")).toContainText(name, { timeout: 5_000 });
  await a.close();
  await b.close();
});
