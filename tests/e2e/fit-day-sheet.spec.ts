import { expect, test } from "@playwright/test";
import { signIn } from "./helpers";

// Issue 18: the printable day sheet. From the board's header, every order of the day of every
// yard is on the page with its crew, and the caution; printed (CSS print media), the app's bar
// and the controls are gone and the orders and the caution remain. Orders and names are
// compared with the board's own answer (GET /api/board), not with a list written here.

test("the day sheet shows every order of the day with its crew and the caution, on screen and in print", async ({ page }) => {
  test.setTimeout(120_000);
  await signIn(page, "dispatcher", "dispatch@cedarprairie.example");
  await expect(page).toHaveURL(/\/board/);
  const link = page.getByTestId("day-sheet-link");
  await expect(link).toBeVisible({ timeout: 20_000 });
  const href = (await link.getAttribute("href"))!;
  const day = /date=(\d{4}-\d{2}-\d{2})/.exec(href)![1];
  // The whole organisation's day: every yard.
  await page.goto(`/day-sheet?date=${day}`);
  await expect(page.getByRole("heading", { level: 1 })).toBeVisible();

  for (const yard of ["NOR", "MES"]) {
    const board = await (await page.request.get(`/api/board?yard=${yard}&date=${day}`)).json();
    const nameOf = new Map<number, string>(board.pool.map((w: { id: number; name: string }) => [w.id, w.name]));
    const section = page.getByTestId(`sheet-yard-${yard}`);
    await expect(section.locator('[data-testid^="sheet-order-"]')).toHaveCount(board.orders.length);
    for (const o of board.orders) {
      const card = section.getByTestId(`sheet-order-${o.number}`);
      await expect(card).toContainText(o.title);
      await expect(card.getByTestId("sheet-crew")).toHaveCount(o.seats.length);
      for (const s of o.seats) if (s.assignment) await expect(card).toContainText(nameOf.get(s.assignment.workerId)!);
    }
  }
  // The caution (PRODUCT.md "Safety posture"), with the manufacturer's ratings the sheet adds.
  await expect(page.getByTestId("day-sheet-caution")).toContainText("does not decide");
  await expect(page.getByTestId("day-sheet-caution")).toContainText("manufacturer's ratings");

  // Printed: the bar and the controls are hidden; the orders and the caution are not.
  await page.emulateMedia({ media: "print" });
  await expect(page.getByRole("navigation", { name: "Main" })).toBeHidden();
  await expect(page.getByTestId("day-sheet-print")).toBeHidden();
  await expect(page.locator('[data-testid^="sheet-order-"]').first()).toBeVisible();
  await expect(page.getByTestId("day-sheet-caution")).toBeVisible();
  await page.emulateMedia({ media: "screen" });

  // The PDF link answers a PDF.
  const pdf = await page.request.get((await page.getByTestId("day-sheet-pdf").getAttribute("href"))!);
  expect(pdf.status()).toBe(200);
  expect(pdf.headers()["content-type"]).toBe("application/pdf");
  expect((await pdf.body()).subarray(0, 5).toString()).toBe("%PDF-");
});
