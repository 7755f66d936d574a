import { expect, test, type Page } from "@playwright/test";
import { demo } from "./helpers";
import { makeCrewDay, removeMade, testDb, type MadeDay } from "../support/notify";

// Send crews, then answer as the lineworkers from the Phone simulator: the board shows each
// answer without a reload (it follows board events, polled every 2 s). The test makes its own
// small board: a de-energized line patrol on a day far from the demo's "tomorrow", so no crew
// rule blocks Send crews.

const db = testDb();

/** Sign in on the /login form; retried, because a dev server's hot reload can wipe a half-filled form. */
async function signIn(page: Page, role: string) {
  const a = demo(role);
  await expect(async () => {
    await page.goto("/login");
    await page.getByLabel("E-mail").fill(a.email);
    await page.getByLabel("Password").fill(a.password);
    await page.getByRole("button", { name: "Sign in" }).click();
    await expect(page).not.toHaveURL(/\/login/, { timeout: 5_000 });
  }).toPass({ timeout: 45_000 });
}
let d: MadeDay;

test.describe.configure({ mode: "serial" });
test.use({ viewport: { width: 1440, height: 1000 } });

test.beforeAll(async () => {
  d = await makeCrewDay(db, {
    offsetDays: 150,
    crew: [
      { position: "lead", employeeNo: "CP-1001" }, // Marcus Whitfield
      { position: "ground", employeeNo: "CP-1007" }, // Jesse Navarro
    ],
  });
});

test.afterAll(async () => {
  await removeMade(db);
  await db.destroy();
});

test("send crews, confirm by text from the phone simulator, and the board shows it live; a decline reopens the position", async ({ browser }) => {
  const [marcus, jesse] = d.assignments;

  const boardCtx = await browser.newContext();
  const board = await boardCtx.newPage();
  await signIn(board, "dispatcher");
  await board.goto(`/board?date=${d.day}&yard=${d.yardCode}`);
  const card = board.getByTestId(`order-${d.number}`);
  await expect(card).toBeVisible();
  const lead = board.getByTestId(`seat-${marcus.positionId}`);
  const ground = board.getByTestId(`seat-${jesse.positionId}`);
  await expect(lead).toContainText("Not sent");

  // Send crews (retried until the page has hydrated and the click lands).
  await expect(async () => {
    await board.getByTestId("send-crews").click();
    await expect(board.getByRole("status").filter({ hasText: /Sent: 2 assignments, 4 messages/ })).toBeVisible({ timeout: 2000 });
  }).toPass({ timeout: 20_000 });
  await expect(lead).toContainText(/Sent|Delivered/);

  // The lineworker's phone, in another window.
  const phoneCtx = await browser.newContext();
  const phone = await phoneCtx.newPage();
  await signIn(phone, "supervisor");
  await phone.goto(`/phone?phone=${encodeURIComponent(marcus.phone!)}`);
  const texts = phone.getByTestId("phone-texts");
  await expect(texts).toContainText(`Reply Y ${marcus.replyCode} to confirm`, { timeout: 15_000 });
  await phone.getByLabel("Reply text").fill(`Y ${marcus.replyCode}`);
  await phone.getByRole("button", { name: "Send", exact: true }).click();
  await expect(texts).toContainText("you're confirmed", { timeout: 10_000 });

  // The board, never reloaded, shows the confirmation within 5 s.
  await board.bringToFront();
  await expect(lead).toContainText("Confirmed", { timeout: 5_000 });

  // Jesse declines with a reason: his position reopens and says who declined and why.
  await phone.bringToFront();
  await phone.getByLabel("Phone of").selectOption(jesse.phone!);
  await expect(texts).toContainText(`Reply Y ${jesse.replyCode} to confirm`, { timeout: 15_000 });
  await phone.getByLabel("Reply text").fill(`N ${jesse.replyCode} sick kid`);
  await phone.getByRole("button", { name: "Send", exact: true }).click();
  await expect(texts).toContainText("you've declined", { timeout: 10_000 });

  await board.bringToFront();
  await expect(ground).toContainText("Declined by Jesse Navarro", { timeout: 5_000 });
  await expect(ground).toContainText("sick kid");
  await expect(card).toHaveClass(/ring-block/);
  await expect(lead).toContainText("Confirmed");

  await boardCtx.close();
  await phoneCtx.close();
});

test("the phone simulator is not for lineworkers", async ({ page }) => {
  await signIn(page, "lineworker");
  await page.goto("/phone");
  await expect(page).toHaveURL(/\/forbidden/);
});
