import { expect, test } from "@playwright/test";
import { signIn } from "./helpers";

// The order page shows the order's findings and the caution (issue 18), the same findings the
// board's card counts. A digging order whose locate ticket lapsed shows LOCATE (state one-call
// law sets the ticket's life; the product checks it is valid through the order's last day).

test("the order page lists the order's findings with the caution, matching the board", async ({ page }) => {
  test.setTimeout(120_000);
  await signIn(page, "dispatcher", "dispatch@cedarprairie.example");
  const api = page.request;
  const [y, m, d] = new Intl.DateTimeFormat("en-CA", { timeZone: "America/Chicago" }).format(new Date()).split("-").map(Number);
  const day = new Date(Date.UTC(y, m - 1, d + 200 + Math.floor(Math.random() * 300))).toISOString().slice(0, 10);
  const before = new Date(Date.parse(`${day}T12:00:00Z`) - 86_400_000).toISOString().slice(0, 10);
  const types = await (await api.get("/api/work-types")).json();
  const anchor = types.workTypes.find((t: { code: string }) => t.code === "anchor");
  const title = `Order page dig ${Date.now().toString(36)}`;
  const made = await api.post("/api/orders", {
    data: { title, yardId: 1, workTypeId: anchor.id, start: `${day}T07:00`, end: `${day}T12:00`, energized: false, positions: [{ position: "ground" }], locateTicket: "LT-ORDER-PAGE", locateValidThrough: before },
  });
  expect(made.status(), await made.text()).toBe(201);
  const board = await (await api.get(`/api/board?date=${day}&yard=NOR`)).json();
  const card = board.orders.find((o: { title: string }) => o.title === title);
  const onBoard = board.findings.filter((f: { workOrderId: string; level: string }) => f.workOrderId === String(card.id) && f.level === "block");
  expect(onBoard.map((f: { rule: string }) => f.rule)).toContain("LOCATE");

  await page.goto(`/orders/${card.id}`);
  const section = page.getByTestId("order-findings");
  await expect(section).toContainText(`${onBoard.length} block`);
  await expect(section.getByTestId("order-finding-LOCATE")).toContainText("Locate ticket");
  await expect(section.getByRole("note")).toContainText("Gaffline assists; it does not decide.");
});
