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

/** Drags with the mouse in small steps, as a person would (dnd-kit needs real moves). */
export async function drag(page: Page, from: string, to: string) {
  const source = page.locator(from).first();
  const target = page.locator(to).first();
  // Both ends in view before the drag starts: scrolling mid-drag is the auto-scroller's job.
  await target.scrollIntoViewIfNeeded();
  await source.scrollIntoViewIfNeeded();
  const s = await source.boundingBox();
  if (!s) throw new Error(`no box for ${from}`);
  await page.mouse.move(s.x + s.width / 2, s.y + s.height / 2);
  await page.mouse.down();
  await page.mouse.move(s.x + s.width / 2 + 8, s.y + s.height / 2 + 8, { steps: 4 });
  const t = await target.boundingBox();
  if (!t) throw new Error(`no box for ${to}`);
  await page.mouse.move(t.x + t.width / 2, t.y + t.height / 2, { steps: 12 });
  await page.mouse.move(t.x + t.width / 2 + 1, t.y + t.height / 2 + 1, { steps: 2 });
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
