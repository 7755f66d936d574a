import { expect, test, type APIRequestContext, type Browser, type Page } from "@playwright/test";
import { signIn } from "./helpers";

// Issue 19: a change made in one browser reaches another open board without a reload — pushed
// over Server-Sent Events (HTML Living Standard §9.2, EventSource), and, when the stream is
// blocked, through the polling fallback. The placement goes through the first browser's own
// session (its request context shares the signed-in cookies).

type Seat = { positionId: number; orderNumber: string; workerId: number; workerName: string };

/** An open seat on tomorrow's North board and a free worker (not placed, not away). */
async function openSeat(req: APIRequestContext, skipWorkers: Set<number>): Promise<Seat> {
  const r = await req.get("/api/board?yard=NOR");
  expect(r.status()).toBe(200);
  const b = await r.json();
  const placed = new Set<number>();
  for (const o of b.orders) for (const s of o.seats) if (s.assignment) placed.add(s.assignment.workerId);
  for (const e of b.placedElsewhere ?? []) placed.add(e.workerId);
  const free = b.pool.filter((p: { id: number; unavailableReason: string | null }) => !placed.has(p.id) && !p.unavailableReason && !skipWorkers.has(p.id));
  for (const o of b.orders) {
    if (o.status === "cancelled") continue;
    const s = o.seats.find((x: { assignment: unknown; position: string }) => !x.assignment && x.position === "ground");
    if (s && free.length) return { positionId: s.id, orderNumber: o.number, workerId: free[0].id, workerName: free[0].name };
  }
  throw new Error("no open ground seat with a free worker on tomorrow's North board");
}

async function watcher(browser: Browser, blockStream: boolean) {
  const context = await browser.newContext({ viewport: { width: 1440, height: 1000 } });
  if (blockStream) await context.route("**/api/board/stream**", (r) => r.abort());
  const page = await context.newPage();
  const polls: string[] = [];
  page.on("request", (r) => {
    if (r.url().includes("/api/board/events")) polls.push(r.url());
  });
  await signIn(page, "supervisor");
  await page.goto("/board?yard=NOR");
  await expect(page.getByTestId("live-status")).toHaveAttribute("data-mode", blockStream ? "polling" : "stream", { timeout: 20_000 });
  return { context, page, polls };
}

async function placeAndCheck(writer: Page, watcherPage: Page, skip: Set<number>) {
  const seat = await openSeat(writer.request, skip);
  skip.add(seat.workerId);
  const card = watcherPage.locator(`[data-testid="order-${seat.orderNumber}"]`);
  await expect(card).toBeVisible();
  await expect(card).not.toContainText(seat.workerName);
  const r = await writer.request.post("/api/assignments", { data: { positionId: seat.positionId, workerId: seat.workerId }, headers: { origin: new URL(writer.url()).origin } });
  expect(r.status()).toBe(201);
  const { assignmentId } = await r.json();
  await expect(card).toContainText(seat.workerName, { timeout: 10_000 });
  return async () => {
    await writer.request.delete(`/api/assignments/${assignmentId}?version=1`, { headers: { origin: new URL(writer.url()).origin } });
  };
}

test.describe.configure({ mode: "serial" });
// Two signed-in browsers on the large board: generous on a shared machine.
test.setTimeout(120_000);

test("a second browser sees a drop pushed over the stream, without polling", async ({ browser, page }) => {
  await signIn(page, "dispatcher");
  await page.goto("/board?yard=NOR");
  const w = await watcher(browser, false);
  const pollsBefore = w.polls.length;
  const undo = await placeAndCheck(page, w.page, new Set());
  expect(w.polls.length - pollsBefore).toBe(0); // the stream carried it
  await undo();
  await w.context.close();
});

test("with the stream blocked, the board falls back to polling and still sees the drop", async ({ browser, page }) => {
  await signIn(page, "dispatcher");
  await page.goto("/board?yard=NOR");
  const w = await watcher(browser, true);
  const undo = await placeAndCheck(page, w.page, new Set());
  expect(w.polls.length).toBeGreaterThan(0);
  await undo();
  await w.context.close();
});
