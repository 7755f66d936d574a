import { expect, type Page } from "@playwright/test";
import { DEMO_ACCOUNTS } from "../../db/demo/accounts";

export function demo(role: string, email?: string) {
  const a = DEMO_ACCOUNTS.find((x) => x.role === role && (!email || x.email === email));
  if (!a) throw new Error(`no demo account for ${role}`);
  return a;
}

export async function signIn(page: Page, role: string, email?: string) {
  const a = demo(role, email);
  await page.goto("/login");
  await page.getByLabel("E-mail").fill(a.email);
  await page.getByLabel("Password").fill(a.password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page).not.toHaveURL(/\/login/);
  return a;
}

/**
 * Drags with the mouse in small steps, as a person would (dnd-kit needs real moves). The
 * board auto-scrolls while the pointer is near the window's edge, so the target is measured
 * again just before the pointer goes to it.
 */
export async function drag(page: Page, from: string, to: string) {
  const source = page.locator(from).first();
  const target = page.locator(to).first();
  await target.scrollIntoViewIfNeeded();
  await source.scrollIntoViewIfNeeded();
  const s = await source.boundingBox();
  if (!s) throw new Error(`no box for ${from}`);
  await page.mouse.move(s.x + s.width / 2, s.y + s.height / 2);
  await page.mouse.down();
  await page.mouse.move(s.x + s.width / 2 + 8, s.y + s.height / 2 + 8, { steps: 4 });
  const view = page.viewportSize()!;
  // Away from the edges, so auto-scroll stops; then to the target wherever it now is.
  await page.mouse.move(view.width / 2, view.height / 2, { steps: 8 });
  await page.waitForTimeout(150);
  for (let i = 0; i < 3; i++) {
    const t = await target.boundingBox();
    if (!t) throw new Error(`no box for ${to}`);
    await page.mouse.move(t.x + t.width / 2, t.y + t.height / 2, { steps: 10 });
    await page.waitForTimeout(100);
    const again = await target.boundingBox();
    if (again && Math.abs(again.y - t.y) < 2 && Math.abs(again.x - t.x) < 2) break;
  }
  return {
    drop: async () => {
      await page.mouse.up();
    },
  };
}

/** The seat of a given position on an order card. */
export function seat(page: Page, order: string, position: string) {
  return page.locator(`[data-testid="order-${order}"] li[data-position="${position}"]`).first();
}
