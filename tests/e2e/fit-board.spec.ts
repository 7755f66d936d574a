import { expect, test, type APIRequestContext, type Page } from "@playwright/test";
import { drag, signIn } from "./helpers";

// Board fit and finish (issue 18): swap by dropping one worker on another, undo of the last
// change (button and Ctrl+Z) through the same locked write path, a held order never "Clear",
// a digging order with a lapsed locate ticket blocks the card, the day's count and Send crews
// (the LOCATE rule: a ticket valid through the order's last day — the state's one-call law sets
// its life), a worker placed in another yard shows as placed there, and a drag near the
// window's bottom edge lands in the aimed seat. Every test works on a far day of its own with
// orders it creates, so the demo's days are untouched. Sign-in: Corinne Maddox, North dispatch.

/** A day `n` days from today in North Yard's zone (America/Chicago, IANA). */
function farDay(n: number) {
  const today = new Intl.DateTimeFormat("en-CA", { timeZone: "America/Chicago" }).format(new Date());
  const [y, m, d] = today.split("-").map(Number);
  return new Date(Date.UTC(y, m - 1, d + n)).toISOString().slice(0, 10);
}

/** A far day of this run's own (reruns on one database do not meet their earlier orders). */
const RUN_BASE = 100 + Math.floor(Math.random() * 400);
const ownDay = (n: number) => farDay(RUN_BASE + n);

interface Card {
  id: number;
  number: string;
  title: string;
  version: number;
  status: string;
  seats: { id: number; position: string; assignment: { id: number; workerId: number; version: number } | null }[];
}

async function workTypeId(api: APIRequestContext, code: string) {
  const body = await (await api.get("/api/work-types")).json();
  return (body.workTypes as { id: number; code: string }[]).find((t) => t.code === code)!.id;
}

async function board(api: APIRequestContext, day: string, yard = "NOR") {
  const r = await api.get(`/api/board?date=${day}&yard=${yard}`);
  expect(r.status()).toBe(200);
  return r.json();
}

async function makeOrder(
  api: APIRequestContext,
  day: string,
  title: string,
  positions: string[],
  extra: Record<string, unknown> = {},
  yard = { id: 1, code: "NOR" },
  type = "patrol",
): Promise<Card> {
  const created = await api.post("/api/orders", {
    data: {
      title,
      yardId: yard.id,
      workTypeId: await workTypeId(api, type),
      start: `${day}T07:00`,
      end: `${day}T12:00`,
      energized: false,
      positions: positions.map((position) => ({ position })),
      ...extra,
    },
  });
  expect(created.status(), await created.text()).toBe(201);
  const b = await board(api, day, yard.code);
  return b.orders.find((o: Card) => o.title === title);
}

async function poolId(api: APIRequestContext, day: string, employeeNo: string): Promise<number> {
  const b = await board(api, day);
  return b.pool.find((p: { employeeNo: string }) => p.employeeNo === employeeNo).id;
}

async function place(api: APIRequestContext, positionId: number, workerId: number) {
  const r = await api.post("/api/assignments", { data: { positionId, workerId } });
  expect(r.status(), await r.text()).toBe(201);
}

async function seatHolder(api: APIRequestContext, day: string, title: string, position: string, yard = "NOR") {
  const b = await board(api, day, yard);
  const card = b.orders.find((o: Card) => o.title === title) as Card;
  return card.seats.find((s) => s.position === position)!.assignment?.workerId ?? null;
}

async function openBoard(page: Page, day: string) {
  await page.goto(`/board?date=${day}&yard=NOR`);
  await expect(page.getByTestId("orders")).toBeVisible();
}


test("dropping one placed worker on another swaps them in one write; Undo and Ctrl+Z put the board back", async ({ page }) => {
  await page.setViewportSize({ width: 1440, height: 1000 });
  await signIn(page, "dispatcher", "dispatch@cedarprairie.example");
  const api = page.request;
  const day = ownDay(0);
  const run = Date.now().toString(36);
  const a = await makeOrder(api, day, `Swap A ${run}`, ["lead", "ground"]);
  const b = await makeOrder(api, day, `Swap B ${run}`, ["lead", "ground"]);
  const andre = await poolId(api, day, "CP-1012");
  const curtis = await poolId(api, day, "CP-1010");
  await place(api, a.seats.find((s) => s.position === "lead")!.id, andre);
  await place(api, b.seats.find((s) => s.position === "lead")!.id, curtis);

  await openBoard(page, day);
  const seatA = a.seats.find((s) => s.position === "lead")!.id;
  const seatB = b.seats.find((s) => s.position === "lead")!.id;
  const swap = page.waitForResponse((r) => r.url().endsWith("/api/assignments/swap") && r.request().method() === "POST");
  const d = await drag(page, `[data-testid="seated-${seatA}"]`, `[data-testid="seat-${seatB}"]`);
  await d.drop();
  expect((await swap).status()).toBe(200);
  await expect.poll(() => seatHolder(api, day, `Swap A ${run}`, "lead")).toBe(curtis);
  expect(await seatHolder(api, day, `Swap B ${run}`, "lead")).toBe(andre);
  // One audit row for the swap (DEVELOPERS.md: every mutation audited in its transaction).
  await expect(page.getByTestId(`seat-${seatA}`)).toContainText("Curtis Fairbanks");

  // Undo with the keyboard: the opposite swap, through the same route.
  const undoSwap = page.waitForResponse((r) => r.url().endsWith("/api/assignments/swap"));
  await page.locator("body").click({ position: { x: 5, y: 5 } });
  await page.keyboard.press("Control+z");
  expect((await undoSwap).status()).toBe(200);
  await expect.poll(() => seatHolder(api, day, `Swap A ${run}`, "lead")).toBe(andre);
  expect(await seatHolder(api, day, `Swap B ${run}`, "lead")).toBe(curtis);

  // A drop from the pool, then the Undo button takes it back off.
  const cody = await poolId(api, day, "CP-1023");
  const groundA = a.seats.find((s) => s.position === "ground")!.id;
  const add = page.waitForResponse((r) => r.url().endsWith("/api/assignments") && r.request().method() === "POST");
  const d2 = await drag(page, `[data-testid="pool-worker-CP-1023"]`, `[data-testid="seat-${groundA}"]`);
  await d2.drop();
  expect((await add).status()).toBe(201);
  await expect.poll(() => seatHolder(api, day, `Swap A ${run}`, "ground")).toBe(cody);
  const undoButton = page.getByTestId("undo");
  await expect(undoButton).toBeEnabled();
  await expect(undoButton).toHaveAttribute("title", /Cody Brandvold placed as ground/);
  const del = page.waitForResponse((r) => r.url().includes("/api/assignments/") && r.request().method() === "DELETE");
  await undoButton.click();
  expect((await del).status()).toBe(200);
  await expect.poll(() => seatHolder(api, day, `Swap A ${run}`, "ground")).toBe(null);
});

test("a stale swap is refused (409) and nothing moves: the locked path checks both versions", async ({ page }) => {
  await signIn(page, "dispatcher", "dispatch@cedarprairie.example");
  const api = page.request;
  const day = ownDay(5);
  const run = Date.now().toString(36);
  const a = await makeOrder(api, day, `Stale A ${run}`, ["lead"]);
  const b = await makeOrder(api, day, `Stale B ${run}`, ["lead"]);
  await place(api, a.seats[0].id, await poolId(api, day, "CP-1012"));
  await place(api, b.seats[0].id, await poolId(api, day, "CP-1010"));
  const now = await board(api, day);
  const ca = now.orders.find((o: Card) => o.id === a.id) as Card;
  const cb = now.orders.find((o: Card) => o.id === b.id) as Card;
  const r = await api.post("/api/assignments/swap", {
    data: { a: { id: ca.seats[0].assignment!.id, version: ca.seats[0].assignment!.version + 5 }, b: { id: cb.seats[0].assignment!.id, version: cb.seats[0].assignment!.version } },
  });
  expect(r.status()).toBe(409);
  const bad = await api.post("/api/assignments/swap", { data: { a: { id: ca.seats[0].assignment!.id, version: 1 } } });
  expect(bad.status()).toBe(422);
  expect((await bad.json()).issues[0].field).toBe("b");
  expect(await seatHolder(api, day, `Stale A ${run}`, "lead")).toBe(ca.seats[0].assignment!.workerId);
});

test("a held order shows On hold, never a green Clear", async ({ page }) => {
  await signIn(page, "dispatcher", "dispatch@cedarprairie.example");
  const api = page.request;
  const day = ownDay(2);
  const run = Date.now().toString(36);
  const o = await makeOrder(api, day, `Held ${run}`, ["ground"]);
  await openBoard(page, day);
  const card = page.getByTestId(`order-${o.number}`);
  await expect(card.getByTestId("crew-state")).toContainText("Clear");
  const held = await api.patch(`/api/orders/${o.id}`, { data: { status: "on_hold", holdReason: "Customer asked to wait", version: o.version } });
  expect(held.status(), await held.text()).toBe(200);
  await page.reload();
  await expect(card.getByTestId("hold")).toContainText("On hold");
  await expect(card.getByTestId("crew-state")).toContainText("On hold");
  await expect(card.getByTestId("crew-state")).not.toContainText("Clear");
});

test("a digging order whose locate ticket lapses before the day blocks: the card, the day's count and Send crews (server too)", async ({ page }) => {
  await signIn(page, "dispatcher", "dispatch@cedarprairie.example");
  const api = page.request;
  const day = ownDay(1);
  const run = Date.now().toString(36);
  const before = await board(api, day);
  const o = await makeOrder(
    api,
    day,
    `Anchor dig ${run}`,
    ["ground"],
    { locateTicket: `LT-${run}`, locateValidThrough: ownDay(0) /* the day before the order */ },
    { id: 1, code: "NOR" },
    "anchor",
  );
  const after = await board(api, day);
  const locate = after.findings.filter((f: { rule: string; workOrderId: string }) => f.rule === "LOCATE" && f.workOrderId === String(o.id));
  expect(locate).toHaveLength(1);
  expect(locate[0].level).toBe("block");

  await openBoard(page, day);
  const card = page.getByTestId(`order-${o.number}`);
  await expect(card.getByTestId("crew-state")).toContainText(/block/);
  await expect(card.getByTestId("crew-state")).not.toContainText("Clear");
  const unresolvedBefore = before.findings.filter((f: { level: string }) => f.level === "block").length;
  await expect(page.getByTestId("day-summary")).toContainText(`${unresolvedBefore + after.findings.filter((f: { level: string; workOrderId: string }) => f.level === "block" && f.workOrderId === String(o.id)).length} unresolved block`);
  await expect(page.getByTestId("send-crews")).toBeDisabled();
  // The server refuses too, naming the rule (lib/assignments/data-send.ts re-checks under the lock).
  const sent = await api.post("/api/send", { data: { date: day, yard: "NOR" } });
  expect(sent.status()).toBe(409);
  expect((await sent.json()).blocks.map((b: { rule: string }) => b.rule)).toContain("LOCATE");
});

test("a worker placed on another yard's order that day shows as placed there in this yard's pool", async ({ page, browser }) => {
  // Felipe Ortega (Mesa dispatch) places a North worker on a Mesa order; Corinne's North board
  // lists that worker as placed at Mesa, hidden under "Hide placed" like anyone placed here.
  const mesa = await browser.newContext();
  const mp = await mesa.newPage();
  await signIn(mp, "dispatcher", "dispatch.mesa@cedarprairie.example");
  const day = ownDay(3);
  const run = Date.now().toString(36);
  const o = await makeOrder(mp.request, day, `Mesa patrol ${run}`, ["ground"], {}, { id: 2, code: "MES" });
  const cody = (await board(mp.request, day, "MES")).pool.find((p: { employeeNo: string }) => p.employeeNo === "CP-1023");
  const placed = await mp.request.post("/api/assignments", { data: { positionId: o.seats[0].id, workerId: cody.id } });
  // Yard scope is the order's yard: a Mesa dispatcher may place any worker on a Mesa order.
  expect(placed.status(), await placed.text()).toBe(201);
  await mesa.close();

  await signIn(page, "dispatcher", "dispatch@cedarprairie.example");
  const north = await board(page.request, day);
  expect(north.placedElsewhere.map((e: { workerId: number; number: string }) => [e.workerId, e.number])).toContainEqual([cody.id, o.number]);
  await openBoard(page, day);
  await expect(page.getByTestId("pool-worker-CP-1023")).toHaveCount(0); // hidden: placed
  await page.getByLabel("Hide placed").uncheck();
  await expect(page.getByTestId("pool-worker-CP-1023")).toContainText(`On ${o.number} at Mesa Yard`);
});

test("a drag held near the window's bottom edge lands in the aimed seat; the page does not run away", async ({ page }) => {
  await page.setViewportSize({ width: 1440, height: 900 });
  await signIn(page, "dispatcher", "dispatch@cedarprairie.example");
  const api = page.request;
  const day = ownDay(4);
  const run = Date.now().toString(36);
  const orders: Card[] = [];
  for (let i = 0; i < 8; i++) orders.push(await makeOrder(api, day, `Edge ${run} ${i}`, ["lead", "ground", "observer", "driver"]));
  await openBoard(page, day);
  // Scroll so that a seat sits ~90 px above the window's bottom edge: inside dnd-kit's default
  // auto-scroll zone (the bottom 20 % of the window), outside the board's tuned one (5 %).
  const aimed = orders[5].seats.find((s) => s.position === "ground")!.id;
  const target = page.getByTestId(`seat-${aimed}`);
  await target.scrollIntoViewIfNeeded();
  const box0 = (await target.boundingBox())!;
  await page.mouse.wheel(0, box0.y + box0.height / 2 - (900 - 90));
  await page.waitForTimeout(300);
  const startY = await page.evaluate(() => window.scrollY);
  // The pool is sticky: its first worker is on screen without scrolling back up.
  const source = page.locator('[data-testid="pool-worker-CP-1023"]');
  await expect(source).toBeInViewport();
  const s = (await source.boundingBox())!;
  const t = (await target.boundingBox())!;
  expect(t.y + t.height / 2).toBeGreaterThan(900 * 0.8);
  await page.mouse.move(s.x + s.width / 2, s.y + s.height / 2);
  await page.mouse.down();
  await page.mouse.move(s.x + s.width / 2 + 10, s.y + s.height / 2 + 10, { steps: 3 });
  await page.mouse.move(t.x + t.width / 2, t.y + t.height / 2, { steps: 25 });
  await page.waitForTimeout(1500); // held there, as a person reading the preview would
  const drift = (await page.evaluate(() => window.scrollY)) - startY;
  expect(Math.abs(drift)).toBeLessThan(40);
  const add = page.waitForResponse((r) => r.url().endsWith("/api/assignments") && r.request().method() === "POST");
  await page.mouse.up();
  expect((await add).status()).toBe(201);
  const cody = await poolId(api, day, "CP-1023");
  await expect.poll(() => seatHolder(api, day, `Edge ${run} 5`, "ground")).toBe(cody);
});
