import { expect, test } from "@playwright/test";
import { signIn } from "./helpers";
import { MAILBOX, testDb } from "../support/notify";

// Issue 18, point 13: a supervisor overrides a block on the board, the dispatcher then changes
// the crew, and the supervisor is told — the lapse is in the queue (order, rule name, who and
// when, what changed), the notice shows in the app, and an e-mail reached the local SMTP fake
// (scripts/fakes/mail.ts, GET /api/messages?to=). CLIMB_CERT blocks under employer qualification
// per 29 CFR 1910.269(a)(2) (PRODUCT.md); an override holding for one crew only is the
// product's own rule (README "Try it", step 2).

const TITLE = "Queue lapse e2e";

test("an override that lapses reaches its supervisor: queue, notice and e-mail", async ({ page, browser }) => {
  test.setTimeout(120_000);
  const db = testDb();
  try {
    const nor = await db("yards").where({ code: "NOR" }).first("id", "timezone");
    // Earlier runs' orders (same title) go, so the climber is free on the day.
    await db("work_orders").where("title", "like", `${TITLE}%`).delete();
    const [y, m, d] = new Intl.DateTimeFormat("en-CA", { timeZone: nor.timezone }).format(new Date()).split("-").map(Number);
    const day = new Date(Date.UTC(y, m - 1, d + 6)).toISOString().slice(0, 10);
    const climber = await db("workers").where({ employee_no: "CP-1006" }).first("id", "first_name", "last_name"); // climbing lapsed (demo)
    const ground = await db("workers").where({ employee_no: "CP-1014" }).first("id", "first_name", "last_name");

    // The dispatcher's browser: the order and its lapsed climber.
    const dispCtx = await browser.newContext({ baseURL: test.info().project.use.baseURL });
    const disp = await dispCtx.newPage();
    await signIn(disp, "dispatcher", "dispatch@cedarprairie.example");
    const types = await (await disp.request.get("/api/work-types")).json();
    const climb = types.workTypes.find((t: { code: string }) => t.code === "pole_climb");
    const title = `${TITLE} ${Date.now().toString(36)}`;
    const made = await disp.request.post("/api/orders", {
      data: { title, yardId: nor.id, workTypeId: climb.id, start: `${day}T13:00`, end: `${day}T16:00`, energized: true, voltageKv: 12.47, positions: [{ position: "climber" }, { position: "ground" }] },
    });
    expect(made.status(), await made.text()).toBe(201);
    const orderId = (await made.json()).id as number;
    const order = await db("work_orders").where({ id: orderId }).first("number");
    const seats = await db("positions").where({ work_order_id: orderId }).select("id", "position");
    const seatOf = (p: string) => seats.find((s) => s.position === p)!.id;
    const placed = await disp.request.post("/api/assignments", { data: { positionId: seatOf("climber"), workerId: climber.id } });
    expect(placed.status(), await placed.text()).toBe(201);

    // The supervisor sees the block waiting in the queue, then overrides it on the board.
    await signIn(page, "supervisor");
    const supEmail = "super@cedarprairie.example";
    await page.goto("/queue");
    await expect(page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: /^Queue/ })).toBeVisible();
    const waiting = page.getByTestId(`queue-order-${order.number}`);
    await expect(waiting.getByTestId("queue-block-CLIMB_CERT")).toContainText("Climbing qualification");
    await page.goto(`/board?yard=NOR&date=${day}`);
    const card = page.locator(`[data-testid="order-${order.number}"]`);
    await expect(async () => {
      const show = card.getByRole("button", { name: /Show findings/ });
      if (await show.count()) await show.click();
      await expect(card.getByRole("button", { name: /Hide findings/ })).toBeVisible({ timeout: 1000 });
    }).toPass({ timeout: 20_000 });
    const cert = card.locator('[data-testid="finding-CLIMB_CERT"]');
    await cert.getByRole("button", { name: /Override with a reason/ }).click();
    const reason = "Re-evaluation passed at the yard this morning; card to HR by noon.";
    const dialog = page.getByRole("dialog");
    await dialog.getByLabel(/Reason/).fill(reason);
    await dialog.getByRole("button", { name: "Record override" }).click();
    await expect(cert).toContainText("Overridden");

    // The dispatcher changes the crew.
    const changed = await disp.request.post("/api/assignments", { data: { positionId: seatOf("ground"), workerId: ground.id } });
    expect(changed.status(), await changed.text()).toBe(201);

    // The supervisor's queue: the lapse in words, the notice, and the count on the nav link.
    await page.goto("/queue");
    const lapse = page.getByTestId(`queue-lapse-${order.number}`);
    await expect(lapse).toContainText("Climbing qualification");
    await expect(lapse).toContainText("by Glenn Harrower");
    await expect(lapse).toContainText(reason);
    await expect(lapse).toContainText(`placed ${ground.first_name} ${ground.last_name} as ground`);
    await expect(lapse).toContainText("Block is back");
    await expect(lapse).toContainText(/C[DS]T/); // North Yard's zone, America/Chicago (IANA tz)
    const notice = page.getByTestId("notice").filter({ hasText: order.number });
    await expect(notice).toContainText(`Your override lapsed: Climbing qualification (${climber.first_name} ${climber.last_name}) on ${order.number}`);
    await expect(page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: /^Queue \(\d+\)$/ })).toBeVisible();
    // The block waits on a supervisor again.
    await expect(page.getByTestId(`queue-order-${order.number}`).getByTestId("queue-block-CLIMB_CERT")).toBeVisible();
    await expect(page.getByRole("note")).toContainText("does not decide");

    // The e-mail reached the local SMTP fake (the outbox delivers it within seconds).
    await expect(async () => {
      const r = await page.request.get(`${MAILBOX}/api/messages?to=${encodeURIComponent(supEmail)}`);
      const { messages } = (await r.json()) as { messages: { subject: string; text: string }[] };
      const mail = messages.find((x) => x.subject.includes(order.number));
      expect(mail?.subject).toBe(`Your override lapsed: Climbing qualification (${climber.first_name} ${climber.last_name}) on ${order.number}`);
      expect(mail?.text).toContain(reason);
    }).toPass({ timeout: 30_000 });

    // Mark read: the notice loses its button, the count drops.
    await notice.getByRole("button", { name: "Mark read" }).click();
    await expect(notice.getByRole("button", { name: "Mark read" })).toHaveCount(0);
    await dispCtx.close();
  } finally {
    await db.destroy();
  }
});
