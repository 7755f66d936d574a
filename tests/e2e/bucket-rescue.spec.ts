import { expect, test } from "@playwright/test";
import { drag, signIn } from "./helpers";

// Issue 14's first case, on the board: a 12.47 kV bucket job whose crew lead (Tomas Lindqvist,
// CP-1003, the only one on the crew with aerial-lift rescue) goes up in the bucket — he takes
// the aerial seat as well as the lead seat — with an apprentice (Mateo Quintana, CP-1014, no
// aerial-lift rescue) on the ground. Nobody on the ground can bring the bucket down with the
// lower controls, so RESCUE blocks: 29 CFR 1910.269(a)(2)(i)(B) (training in emergency
// procedures); ../shared/CREW-CHECK.md, Corrections 3 (an aloft worker never counts as their
// own rescuer). On a day of the test's own, far from the demo's tomorrow.

function dayFromToday(offset: number) {
  const today = new Intl.DateTimeFormat("en-CA", { timeZone: "America/Chicago" }).format(new Date());
  const [y, m, d] = today.split("-").map(Number);
  return new Date(Date.UTC(y, m - 1, d + offset)).toISOString().slice(0, 10);
}

test.use({ viewport: { width: 1440, height: 1100 } });

test("the only aerial-rescue holder up in the bucket shows RESCUE on the board", async ({ page }) => {
  await signIn(page, "dispatcher");
  const day = dayFromToday(27);
  const workers = await (await page.request.get("/api/workers")).json();
  const byNo = (no: string) => (workers.workers ?? workers).find((w: { employeeNo: string }) => w.employeeNo === no);
  const tomas = byNo("CP-1003");
  const mateo = byNo("CP-1014");
  const types = await (await page.request.get("/api/work-types")).json();
  const bucket = (types.workTypes ?? types).find((t: { code: string }) => t.code === "bucket");
  // An earlier run that stopped half-way leaves its order: cancel it, so nobody is double-booked.
  const earlier = await (await page.request.get(`/api/board?date=${day}&yard=NOR`)).json();
  for (const o of earlier.orders.filter((x: { title: string }) => x.title.startsWith("Crossarm from the bucket")))
    await page.request.delete(`/api/orders/${o.id}?version=${o.version}`);
  const title = `Crossarm from the bucket ${Date.now()}`;
  const created = await page.request.post("/api/orders", {
    data: {
      title,
      yardId: 1,
      workTypeId: bucket.id,
      start: `${day}T08:00`,
      end: `${day}T14:00`,
      energized: true,
      voltageKv: 12.47,
      minCrew: 2,
      positions: [{ position: "lead" }, { position: "aerial" }, { position: "ground" }],
    },
  });
  expect(created.status()).toBe(201);
  const order = (await created.json()).order;
  const seatId = (p: string) => order.seats.find((s: { position: string }) => s.position === p).id;
  expect((await page.request.post("/api/assignments", { data: { positionId: seatId("lead"), workerId: tomas.id } })).status()).toBe(201);
  expect((await page.request.post("/api/assignments", { data: { positionId: seatId("ground"), workerId: mateo.id } })).status()).toBe(201);

  await page.goto(`/board?date=${day}&yard=NOR`);
  const card = page.getByTestId(`order-${order.number}`);
  const aerial = card.locator('li[data-position="aerial"]');
  await expect(aerial).toContainText("In the bucket");

  // The lead goes up: drag him into the aerial seat too (the pool shows placed people on
  // request).
  const hidePlaced = page.getByLabel("Hide placed");
  if (await hidePlaced.isChecked()) await hidePlaced.uncheck();
  const d = await drag(page, '[data-testid="pool-worker-CP-1003"]', `[data-testid="order-${order.number}"] li[data-position="aerial"]`);
  // With the aerial seat still open the lead already counts as the one aloft (Corrections 3),
  // so RESCUE is on the card before the drop and the preview names no new block.
  await expect(aerial.getByRole("status")).toHaveText(/No new block/);
  const placed = page.waitForResponse((r) => r.url().endsWith("/api/assignments") && r.request().method() === "POST");
  await d.drop();
  expect((await placed).status()).toBe(201);
  await expect(aerial).toContainText("Tomas Lindqvist");

  await expect(async () => {
    const show = card.getByRole("button", { name: /Show findings/ });
    if (await show.count()) await show.click();
    await expect(card.getByRole("button", { name: /Hide findings/ })).toBeVisible({ timeout: 1000 });
  }).toPass({ timeout: 15_000 });
  const rescue = card.locator('[data-testid="finding-RESCUE"]');
  await expect(rescue).toHaveCount(1);
  await expect(rescue).toContainText("Block");
  await expect(rescue).toContainText(/bucket/);
  await expect(rescue).toContainText("1910.269(a)(2)(i)(B)");
  await expect(rescue.getByTestId("fix-RESCUE")).toContainText(/on the ground/);
  await expect(page.getByTestId("send-crews")).toBeDisabled();

  // With the lead back on the ground (out of the aerial seat) and a journeyman aloft, the lead
  // is the rescuer on the ground and RESCUE clears.
  const board = await (await page.request.get(`/api/board?date=${day}&yard=NOR`)).json();
  const aloft = board.orders
    .find((o: { number: string }) => o.number === order.number)
    .seats.find((s: { position: string }) => s.position === "aerial").assignment;
  expect((await page.request.delete(`/api/assignments/${aloft.id}?version=${aloft.version}`)).status()).toBe(200);
  const jesse = byNo("CP-1007");
  expect((await page.request.post("/api/assignments", { data: { positionId: seatId("aerial"), workerId: jesse.id } })).status()).toBe(201);
  const after = await (await page.request.get(`/api/board?date=${day}&yard=NOR`)).json();
  const rules = after.findings.filter((f: { workOrderId: string }) => f.workOrderId === String(order.id)).map((f: { rule: string }) => f.rule);
  expect(rules).not.toContain("RESCUE");

  // Leave the day as found.
  await page.request.delete(`/api/orders/${order.id}?version=${order.version}`);
});
