import { expect, test, type Page } from "@playwright/test";
import { WORKERS } from "../../db/demo/scenario";
import { proposeExpiry } from "../../lib/credentials/model";
import { minimalPdf } from "../support/files";

// Credentials desk, end to end. Runs on a freshly seeded demo, in any order with other
// specs. It renews Lyle Kowalczyk's (CP-1005) lapsed climbing evaluation — nobody else
// relies on that one being lapsed — and never touches Brent Haugland (CP-1006), whose
// lapsed climbing the board specs use.

// Worker ids are deterministic after a fresh seed: 1–40 in WORKERS order (db/demo/scenario.ts).
const idOf = (no: string) => WORKERS.findIndex((w) => w.no === no) + 1;
const LYLE = idOf("CP-1005");
const MARCUS = idOf("CP-1001");

async function signIn(page: Page, email: string, password: string) {
  await page.goto("/login", { waitUntil: "networkidle" });
  // A click before the form has hydrated submits it natively and reloads /login: try again.
  await expect(async () => {
    if (new URL(page.url()).pathname.startsWith("/login")) {
      await page.locator('input[name="email"]').fill(email);
      await page.locator('input[name="password"]').fill(password);
      await page.getByRole("button", { name: "Sign in" }).click();
    }
    await page.waitForURL((url) => !url.pathname.startsWith("/login"), { timeout: 5_000 });
  }).toPass({ timeout: 40_000 });
}

/** A day 20 days from today in North Yard's zone (America/Chicago), away from the demo's tomorrow. */
function farDay() {
  const today = new Intl.DateTimeFormat("en-CA", { timeZone: "America/Chicago" }).format(new Date());
  const [y, m, d] = today.split("-").map(Number);
  return new Date(Date.UTC(y, m - 1, d + 20)).toISOString().slice(0, 10);
}

test("HR renews Lyle Kowalczyk's lapsed climbing evaluation with evidence; it shows as current with the new expiry", async ({ page, browser }) => {
  // A dispatcher has Lyle on a climbing order: the board shows his CLIMB_CERT block.
  const dispatcher = await browser.newContext({ viewport: { width: 1440, height: 1000 } });
  const board = await dispatcher.newPage();
  await signIn(board, "dispatch@cedarprairie.example", "board-north-26");
  const day = farDay();
  const types = await (await board.request.get("/api/work-types")).json();
  const climbType = (types.workTypes ?? types).find((t: { code: string }) => t.code === "pole_climb");
  const created = await board.request.post("/api/orders", {
    data: { title: "Renewal check: climb at pole N-7001", yardId: 1, workTypeId: climbType.id, start: `${day}T07:00`, end: `${day}T12:00`, positions: [{ position: "climber" }] },
  });
  expect(created.status()).toBe(201);
  const dayBoard = await (await board.request.get(`/api/board?date=${day}&yard=NOR`)).json();
  const card = dayBoard.orders.find((o: { title: string }) => o.title === "Renewal check: climb at pole N-7001");
  const placed = await board.request.post("/api/assignments", { data: { positionId: card.seats[0].id, workerId: LYLE } });
  expect(placed.status()).toBe(201);
  await board.goto(`/board?date=${day}&yard=NOR`);
  const cardView = board.getByTestId(`order-${card.number}`);
  await expect(async () => {
    const show = cardView.getByRole("button", { name: /Show findings/ });
    if (await show.count()) await show.click();
    await expect(cardView.getByRole("button", { name: /Hide findings/ })).toBeVisible({ timeout: 1000 });
  }).toPass({ timeout: 15_000 });
  const certFinding = cardView.locator('[data-testid="finding-CLIMB_CERT"]');
  await expect(certFinding).toContainText("Lyle Kowalczyk");

  await signIn(page, "hr@cedarprairie.example", "creds-cedar-26");

  // Find him from the desk's list, as HR would.
  await page.goto("/credentials");
  await page.getByLabel("Search").fill("Kowalczyk");
  await page.getByRole("link", { name: "Lyle Kowalczyk" }).first().click();
  await expect(page).toHaveURL(new RegExp(`/credentials/${LYLE}$`));
  await expect(page.getByRole("heading", { name: "Lyle Kowalczyk" })).toBeVisible();

  const row = page.getByTestId("current-climbing");
  await row.getByRole("button", { name: "Renew Climbing evaluation" }).click();
  const form = page.getByRole("form", { name: "Renew Climbing evaluation" });
  await expect(form).toBeVisible();

  // Issued defaults to today in the yard's zone; the expiry is proposed as issued + 12 months − 1 day.
  const issued = await form.getByLabel("Issued on").inputValue();
  expect(issued).toMatch(/^\d{4}-\d{2}-\d{2}$/);
  const expected = proposeExpiry(issued, 12)!;
  await expect(form.getByLabel("Last valid day")).toHaveValue(expected);

  await form.getByLabel(/^Evidence/).setInputFiles({
    name: "lyle-climbing-evaluation.pdf",
    mimeType: "application/pdf",
    buffer: minimalPdf("Climbing evaluation - Lyle Kowalczyk"),
  });
  await form.getByRole("button", { name: "Save renewal" }).click();

  await expect(page.getByRole("status")).toContainText(`Climbing evaluation recorded: valid through ${expected}`);
  const renewed = page.getByTestId("current-climbing");
  await expect(renewed).toContainText("Current");
  await expect(renewed).not.toContainText("Lapsed");
  await expect(renewed.getByTestId("expires")).toHaveText(expected);
  await expect(renewed).toContainText("lyle-climbing-evaluation.pdf");
  await expect(renewed).toContainText("Nadine Okonkwo");
  // The old record stays, superseded.
  await expect(page.getByTestId("history-climbing").first()).toContainText("Superseded");

  // The evidence downloads for HR, as an attachment.
  const href = await renewed.getByRole("link", { name: "lyle-climbing-evaluation.pdf" }).getAttribute("href");
  const file = await page.request.get(href!);
  expect(file.status()).toBe(200);
  expect(file.headers()["content-type"]).toBe("application/pdf");
  expect(file.headers()["content-disposition"]).toContain("attachment");

  // The desk's lapsed view no longer lists his climbing.
  await page.goto("/credentials?view=lapsed&qualification=climbing");
  await expect(page.getByRole("button", { name: /^Lapsed/ })).toHaveAttribute("aria-pressed", "true");
  await expect(page.getByRole("link", { name: "Brent Haugland" }).first()).toBeVisible();
  await expect(page.getByRole("link", { name: "Lyle Kowalczyk" })).toHaveCount(0);

  // The dispatcher's open board drops the block without a reload (board events, within 5 s).
  await expect(certFinding).toHaveCount(0, { timeout: 5_000 });
  await dispatcher.close();
});

test("a lineworker visiting another worker's credentials page is refused", async ({ page }) => {
  await signIn(page, "marcus.whitfield@cedarprairie.example", "lineworker-26");
  await page.goto(`/credentials/${LYLE}`);
  await expect(page).toHaveURL(/\/forbidden/);
  await expect(page.getByText("Your role cannot open this page.")).toBeVisible();
  await expect(page.getByText("Lyle Kowalczyk")).toHaveCount(0);

  // The API refuses too.
  expect((await page.request.get(`/api/credentials?workerId=${LYLE}`)).status()).toBe(403);

  // Their own page opens, read-only apart from sending a renewal.
  await page.goto(`/credentials/${MARCUS}`);
  await expect(page.getByRole("heading", { name: "Marcus Whitfield" })).toBeVisible();
  await expect(page.getByRole("button", { name: /^Renew / })).toHaveCount(0);
  await expect(page.getByRole("button", { name: /^Send a renewal of/ }).first()).toBeVisible();
});
