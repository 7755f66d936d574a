// Issue 18 point 6: an admin manages sign-ins; issue 15: change my password. Playwright.
import { expect, test } from "@playwright/test";
import { signIn } from "./helpers";

test("an admin adds a dispatcher for one yard, sees them listed, deactivates and reactivates them", async ({ page }) => {
  await signIn(page, "admin");
  await page.goto("/admin/users");
  await expect(page.getByRole("heading", { name: "Users" })).toBeVisible();
  const email = `e2e-${Date.now()}@cedarprairie.example`;
  await page.getByLabel("Name").fill("Dana Whitcomb");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Role", { exact: true }).selectOption("dispatcher");
  await page.getByRole("group", { name: "Yards they dispatch" }).getByRole("checkbox").first().check();
  await page.getByRole("button", { name: "Add sign-in" }).click();
  await expect(page.getByRole("status")).toContainText("Added Dana Whitcomb");
  const row = page.getByTestId(`user-${email}`);
  await expect(row).toContainText("Active");
  await row.getByRole("button", { name: "Deactivate" }).click();
  await expect(page.getByRole("status")).toContainText("deactivated and signed out everywhere");
  await expect(row).toContainText("Deactivated");
  await row.getByRole("button", { name: "Reactivate" }).click();
  await expect(row).toContainText("Active");
});

test("a wrong current password is refused on the change-my-password page, for any role", async ({ page }) => {
  await signIn(page, "lineworker");
  await page.getByRole("link", { name: "Password" }).click();
  await expect(page).toHaveURL(/\/account\/password/);
  await page.getByLabel("Current password").fill("not-my-password");
  await page.getByLabel("New password (12 characters or more)").fill("hot-stick-clamp-42");
  await page.getByLabel("New password again").fill("hot-stick-clamp-42");
  await page.getByRole("button", { name: "Change password" }).click();
  await expect(page.getByRole("alert").filter({ hasText: "✖" })).toContainText("That is not your current password");
});
