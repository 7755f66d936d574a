import { expect, test } from "@playwright/test";
import { signIn } from "./helpers";

// The equipment register (issue 16): dispatchers, supervisors and admins edit; every signed-in
// role reads. Unit numbers here are the test's own (E2E-…), so a re-run never collides.

test("a dispatcher adds a truck (out of service without a reason is refused beside the field), then puts it out of service with a reason and adds rigging", async ({ page }) => {
  const unit = `E2E-${Date.now().toString(36).slice(-5).toUpperCase()}`;
  await signIn(page, "dispatcher");
  await page.goto("/equipment");
  await expect(page.getByRole("heading", { name: "Trucks, trailers and rigging" })).toBeVisible();
  await expect(page.getByTestId("equipment-N-314")).toContainText("Bluestem 55 ft insulated bucket");
  await expect(page.getByTestId("equipment-N-330")).toContainText("Boom hydraulic leak");

  await page.getByRole("button", { name: "Add equipment" }).click();
  const form = page.getByRole("form", { name: "Add equipment" });
  await form.getByLabel("Unit number").fill(unit);
  await form.getByLabel("Name").fill("Test bucket");
  await form.getByLabel("Out of service", { exact: true }).check();
  await form.getByRole("button", { name: "Save" }).click();
  // Out of service without a reason: 422 naming outOfServiceReason, shown beside the field.
  await expect(form.locator("p", { hasText: "Say why it is out of service" })).toBeVisible();
  await form.getByLabel("Out of service", { exact: true }).uncheck();
  await form.getByRole("button", { name: "Save" }).click();
  const card = page.getByTestId(`equipment-${unit}`);
  await expect(card).toBeVisible();
  await expect(card).toContainText("In service");
  await expect(card).toContainText("No dielectric test");

  await card.getByRole("button", { name: `Edit ${unit}` }).click();
  const edit = page.getByRole("form", { name: `Edit ${unit}` });
  await edit.getByLabel("Out of service", { exact: true }).check();
  await edit.getByLabel("Why it is out of service").fill("Outrigger pad cracked");
  await edit.getByRole("button", { name: "Save" }).click();
  await expect(card).toContainText("Out of service");
  await expect(card.getByTestId("oos-reason")).toHaveText("Outrigger pad cracked");

  // Rigging: zero parts of line is refused; three parts with a WLL is kept.
  await card.getByRole("button", { name: "Add rigging" }).click();
  const rig = page.getByRole("form", { name: `Add rigging to ${unit}` });
  await rig.getByLabel("Label").fill("3-part blocks");
  await rig.getByLabel("Parts of line").fill("0");
  await rig.getByLabel("WLL (lb)").fill("2000");
  await rig.getByRole("button", { name: "Add" }).click();
  await expect(rig.locator("p", { hasText: "partsOfLine must be at least 1" })).toBeVisible();
  await rig.getByLabel("Parts of line").fill("3");
  await rig.getByRole("button", { name: "Add" }).click();
  await expect(page.getByTestId(`rigging-${unit}`)).toContainText("3 parts, 3 sheaves");
  await expect(page.getByTestId(`rigging-${unit}`)).toContainText("WLL 2,000 lb");
});

test("a lineworker reads the register but has no edit controls", async ({ page }) => {
  await signIn(page, "lineworker");
  await page.goto("/equipment");
  await expect(page.getByTestId("equipment-N-314")).toBeVisible();
  await expect(page.getByRole("button", { name: "Add equipment" })).toHaveCount(0);
  await expect(page.getByRole("button", { name: /^Edit / })).toHaveCount(0);
  await expect(page.getByRole("button", { name: "Add rigging" })).toHaveCount(0);
});
