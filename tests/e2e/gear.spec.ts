import { expect, test, type Page } from "@playwright/test";
import { WORKERS } from "../../db/demo/scenario";
import { CLASS_0_ONLY } from "../../db/demo/gear";

// Rubber goods and field figures, end to end, on a freshly seeded demo (in any order with other
// specs). Each test makes its own order on a far day (away from the demo's tomorrow). The
// rubber goods test touches only Dominic Pruett (CP-2010), the demo's apprentice with class 0
// gloves only; nobody else's spec relies on his gear.

// A development server compiles each page on first use; the built app answers in well under this.
test.setTimeout(180_000);

const idOf = (no: string) => WORKERS.findIndex((w) => w.no === no) + 1;
const DOMINIC = idOf(CLASS_0_ONLY);
const MARCUS = idOf("CP-1001");

async function signIn(page: Page, email: string, password: string) {
  await page.goto("/login", { waitUntil: "networkidle" });
  await expect(async () => {
    if (new URL(page.url()).pathname.startsWith("/login")) {
      await page.locator('input[name="email"]').fill(email);
      await page.locator('input[name="password"]').fill(password);
      await page.getByRole("button", { name: "Sign in" }).click();
    }
    await page.waitForURL((url) => !url.pathname.startsWith("/login"), { timeout: 5_000 });
  }).toPass({ timeout: 40_000 });
}

function dayAhead(tz: string, n: number) {
  const today = new Intl.DateTimeFormat("en-CA", { timeZone: tz }).format(new Date());
  const [y, m, d] = today.split("-").map(Number);
  return new Date(Date.UTC(y, m - 1, d + n)).toISOString().slice(0, 10);
}

/** Cancels what an earlier run of this spec left on the day (a rerun on the same database). */
async function clearEarlierRuns(page: Page, code: string, day: string, prefix: string) {
  const board = await (await page.request.get(`/api/board?date=${day}&yard=${code}`)).json();
  for (const o of board.orders.filter((x: { title: string }) => x.title.startsWith(prefix))) {
    expect((await page.request.delete(`/api/orders/${o.id}`)).status()).toBeLessThan(300);
  }
}

async function climbOrder(page: Page, yardId: number, day: string, title: string, positions: string[]) {
  const types = await (await page.request.get("/api/work-types")).json();
  const climbType = (types.workTypes ?? types).find((t: { code: string }) => t.code === "pole_climb");
  const created = await page.request.post("/api/orders", {
    data: { title, yardId, workTypeId: climbType.id, start: `${day}T07:00`, end: `${day}T12:00`, energized: true, voltageKv: 12.47, positions: positions.map((position) => ({ position })) },
  });
  expect(created.status(), await created.text()).toBe(201);
  const code = yardId === 1 ? "NOR" : "MES";
  const board = await (await page.request.get(`/api/board?date=${day}&yard=${code}`)).json();
  return board.orders.find((o: { title: string }) => o.title === title) as { id: string; number: string; seats: { id: number; position: string }[] };
}

test("a climber with class 0 gloves on a 12.47 kV order is blocked (RUBBER_GOODS); HR records class 2 gloves and the open board drops the block within 5 s", async ({ page, browser }) => {
  // Only Dominic's class 0 gloves count at the start (a rerun on the same database retires
  // the class 2 pair an earlier run recorded).
  await signIn(page, "hr@cedarprairie.example", "creds-cedar-26");
  const mine = await (await page.request.get(`/api/gear?workerId=${DOMINIC}`)).json();
  for (const g of mine.gear.filter((x: { class: string; kind: string }) => x.kind === "rubber_gloves" && x.class !== "0")) {
    expect((await page.request.patch(`/api/gear/${g.id}`, { data: { version: g.version, retiredOn: g.testedOn } })).status()).toBe(200);
  }

  const dispatcher = await browser.newContext({ viewport: { width: 1440, height: 1000 } });
  const board = await dispatcher.newPage();
  await signIn(board, "dispatch.mesa@cedarprairie.example", "board-mesa-26");
  const day = dayAhead("America/Denver", 24);
  const title = `Gloves check: climb at pole M-7${Date.now() % 1000}`;
  await clearEarlierRuns(board, "MES", day, "Gloves check: ");
  const card = await climbOrder(board, 2, day, title, ["climber"]);
  const placed = await board.request.post("/api/assignments", { data: { positionId: card.seats[0].id, workerId: DOMINIC } });
  expect(placed.status(), await placed.text()).toBe(201);
  await board.goto(`/board?date=${day}&yard=MES`);
  const cardView = board.getByTestId(`order-${card.number}`);
  await expect(async () => {
    const show = cardView.getByRole("button", { name: /Show findings/ });
    if (await show.count()) await show.click();
    await expect(cardView.getByRole("button", { name: /Hide findings/ })).toBeVisible({ timeout: 1000 });
  }).toPass({ timeout: 15_000 });
  // 29 CFR 1910.137 Table I-4: class 0 is rated for 1,000 V AC; a 12.47 kV line needs class 2.
  const rubber = cardView.locator('[data-testid="finding-RUBBER_GOODS"]');
  await expect(rubber).toContainText("Dominic Pruett");
  await expect(rubber).toContainText("class 2");

  // HR records a new pair on Dominic's Credentials page: class 2, tested today.
  await page.goto(`/credentials/${DOMINIC}`);
  const section = page.getByTestId("gear-section");
  await expect(section).toContainText("Class 0");
  await section.getByRole("button", { name: "Record gloves or sleeves" }).click();
  const form = page.getByRole("form", { name: "Record rubber goods" });
  await form.getByLabel("Kind").selectOption("rubber_gloves");
  await form.getByLabel("Class").selectOption("2");
  await form.getByLabel("Size").fill("10");
  const serial = `CP-G-2010-E2E${Date.now() % 100000}`;
  await form.getByLabel("Serial or label").fill(serial);
  // The test date defaults to today in the worker's yard.
  await expect(form.getByLabel("Last electrical test")).toHaveValue(/^\d{4}-\d{2}-\d{2}$/);
  await form.getByRole("button", { name: "Save" }).click();
  const item = page.getByTestId(`gear-${serial}`);
  await expect(item).toContainText("Class 2 (max use 17 kV AC)");
  await expect(item).toContainText("In test");

  // The dispatcher's open board drops the block without a reload (board events).
  await expect(rubber).toHaveCount(0, { timeout: 5_000 });
  await dispatcher.close();
});

test("the briefing at 390 px shows the minimum approach distance and the lift plan; the crew lead confirms it", async ({ page, browser }) => {
  const office = await browser.newContext({ viewport: { width: 1280, height: 900 } });
  const d = await office.newPage();
  await signIn(d, "dispatch@cedarprairie.example", "board-north-26");
  const day = dayAhead("America/Chicago", 26);
  await clearEarlierRuns(d, "NOR", day, "Change out 50 kVA transformer, pole N-7");
  const card = await climbOrder(d, 1, day, `Change out 50 kVA transformer, pole N-7${Date.now() % 1000}`, ["lead"]);
  expect((await d.request.post("/api/assignments", { data: { positionId: card.seats[0].id, workerId: MARCUS } })).status()).toBe(201);
  // The contract's example lift (CREW-CHECK.md): 640 lb, 3 parts of line, 2 legs at 60°.
  const plan = await d.request.put(`/api/orders/${card.id}/lift`, {
    data: { loadLabel: "50 kVA pole-mount transformer", loadLb: 640, partsOfLine: 3, blockWllLb: 2000, lineWllLb: 450, slingWllLb: 1000, slingLegs: 2, slingAngleDeg: 60 },
  });
  expect(plan.status(), await plan.text()).toBe(200);
  await office.close();

  await page.setViewportSize({ width: 390, height: 844 });
  await signIn(page, "marcus.whitfield@cedarprairie.example", "lineworker-26");
  await page.goto(`/orders/${card.id}/briefing`);
  const figures = page.getByTestId("briefing-figures");
  // 29 CFR 1910.269 Table R-6, 5.1–15.0 kV phase-to-ground: 0.65 m (2.14 ft); North Yard sits
  // below 900 m, so the Table R-5 factor is 1.00.
  await expect(figures.getByTestId("approach-distance")).toHaveText("0.65 m (2.14 ft)");
  await expect(figures.getByTestId("approach-source")).toHaveText("29 CFR 1910.269 Table R-6, Table R-5");
  await expect(figures.getByTestId("figures-caution")).toContainText("crew lead's judgement");
  // P = 640 × 1.1³ × 0.1 / (1.1³ − 1) = 257.4 lb; block 897.4 lb; each leg 640 / (2 sin 60°) = 369.5 lb.
  await expect(figures.getByTestId("lift-line")).toContainText("257.4 lb");
  await expect(figures.getByTestId("lift-block")).toContainText("897.4 lb");
  await expect(figures.getByTestId("lift-sling-leg")).toContainText("369.5 lb");
  await figures.scrollIntoViewIfNeeded();
  // Nothing overflows the phone's width.
  const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
  expect(overflow).toBeLessThanOrEqual(0);

  await figures.getByLabel("Nameplate weight read on site (lb)").fill("655");
  await figures.getByRole("button", { name: "Confirm the lift plan" }).click();
  await expect(figures.getByRole("status")).toContainText("Lift plan confirmed");
  await expect(figures.getByTestId("lift-confirmed")).toContainText("655.0 lb read on site");
});
