import { expect, test } from "@playwright/test";
import { demo, signIn } from "./helpers";

// Each role lands on its own start page (lib/users/roles.ts START_PAGE).
const LANDING: [string, RegExp, string][] = [
  ["dispatcher", /\/board/, "Board"],
  ["supervisor", /\/board/, "Board"],
  ["hr", /\/credentials/, "Credentials"],
  ["lineworker", /\/me/, "My week"],
  ["admin", /\/admin/, "Admin"],
];

for (const [role, url, nav] of LANDING) {
  test(`${role} signs in and lands on ${nav}`, async ({ page }) => {
    await signIn(page, role);
    await expect(page).toHaveURL(url);
    await expect(page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: nav })).toHaveAttribute("aria-current", "page");
    await expect(page.getByText("Gaffline").first()).toBeVisible();
  });
}

test("a wrong password is refused without saying which part was wrong", async ({ page }) => {
  const a = demo("dispatcher");
  await page.goto("/login");
  await page.getByLabel("E-mail").fill(a.email);
  await page.getByLabel("Password").fill("not-the-password");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.locator("form [role=alert]")).toHaveText(/E-mail or password is not right/);
  await expect(page).toHaveURL(/\/login/);
});

test("a lineworker cannot open the dispatcher's board", async ({ page }) => {
  await signIn(page, "lineworker");
  await page.goto("/board");
  await expect(page).toHaveURL(/\/forbidden/);
  await expect(page.getByText("Your role cannot open this page.")).toBeVisible();
  await expect(page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Board" })).toHaveCount(0);
});

test("signed-out visitors are sent to sign in", async ({ page }) => {
  await page.goto("/board");
  await expect(page).toHaveURL(/\/login/);
});

test("the shipped font is Manrope, served by the app itself", async ({ page }) => {
  const fontRequests: string[] = [];
  page.on("request", (r) => {
    if (r.resourceType() === "font") fontRequests.push(r.url());
  });
  await page.goto("/login");
  await page.evaluate(() => document.fonts.ready);
  const family = await page.evaluate(() => getComputedStyle(document.body).fontFamily);
  expect(family).toMatch(/Manrope/);
  expect(await page.evaluate(() => document.fonts.check("16px Manrope"))).toBe(true);
  const base = new URL(page.url()).origin;
  for (const u of fontRequests) expect(u.startsWith(base)).toBe(true);
});
