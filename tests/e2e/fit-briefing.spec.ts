import { expect, test, type APIRequestContext } from "@playwright/test";
import knex from "knex";
import { dbConfig } from "../../knexfile";
import { emptyBriefing } from "../../lib/briefings/model";
import { signIn } from "./helpers";

// The briefing refuses (issue 18 point 12), on the route (422 naming the field) and in the form:
// - a rescuer without rescue training valid on the work day (pole-top rescue on climbing work:
//   1910.269(b)(1) and the emergency procedures of (a)(2)(i)(B); one trained person besides the
//   exposed worker is common practice),
// - the climber as the one who calls for help (they are aloft: common practice),
// - completion before 18:00 the evening before the job, on the yard's clock (the product's rule).
// Demo people (db/seeds): Marcus Whitfield leads and holds pole-top rescue, Priya Raman climbs,
// Cody Brandvold (ground hand) holds no rescue training.

const tz = "America/Chicago"; // North Yard, IANA zone
const dayFrom = (n: number) => {
  const [y, m, d] = new Intl.DateTimeFormat("en-CA", { timeZone: tz }).format(new Date()).split("-").map(Number);
  return new Date(Date.UTC(y, m - 1, d + n)).toISOString().slice(0, 10);
};

async function order(api: APIRequestContext, day: string, title: string, start: string, end: string) {
  const types = await (await api.get("/api/work-types")).json();
  const climb = types.workTypes.find((t: { code: string }) => t.code === "pole_climb");
  const r = await api.post("/api/orders", {
    data: { title, yardId: 1, workTypeId: climb.id, start: `${day}T${start}`, end: `${day}T${end}`, positions: [{ position: "lead" }, { position: "climber" }, { position: "ground" }] },
  });
  expect(r.status(), await r.text()).toBe(201);
  const b = await (await api.get(`/api/board?date=${day}&yard=NOR`)).json();
  const card = b.orders.find((o: { title: string }) => o.title === title);
  const id = (no: string) => b.pool.find((p: { employeeNo: string }) => p.employeeNo === no).id as number;
  return { card, id };
}

async function seat(api: APIRequestContext, card: { seats: { id: number; position: string }[] }, position: string, workerId: number) {
  const r = await api.post("/api/assignments", { data: { positionId: card.seats.find((s) => s.position === position)!.id, workerId } });
  expect(r.status(), await r.text()).toBe(201);
}

test("the form and the route refuse an untrained rescuer and the climber as the caller, naming each field", async ({ page, browser }) => {
  test.setTimeout(120_000);
  const disp = await browser.newContext();
  const dp = await disp.newPage();
  await signIn(dp, "dispatcher", "dispatch@cedarprairie.example");
  const day = dayFrom(0); // today: inside the completion window whatever the hour
  const run = Date.now().toString(36);
  // Early in the morning (the demo's orders run by day and tonight); an earlier run's order in
  // this slot is taken off first, so its crew is free again.
  const db = knex(dbConfig());
  const old = await db("work_orders").where("title", "like", "Rescue check %").pluck("id");
  if (old.length) await db("assignments").whereIn("work_order_id", old).update({ holds_position: null, status: "removed" });
  await db.destroy();
  const { card, id } = await order(dp.request, day, `Rescue check ${run}`, "00:30", "02:00");
  const marcus = id("CP-1001");
  const priya = id("CP-1008");
  const cody = id("CP-1023");
  await seat(dp.request, card, "lead", marcus);
  await seat(dp.request, card, "climber", priya);
  await seat(dp.request, card, "ground", cody);
  await disp.close();

  await signIn(page, "lineworker");
  const data = emptyBriefing();
  data.emergency.callerWorkerId = priya;
  data.emergency.rescuerWorkerId = cody;
  const saved = await page.request.put(`/api/briefings/${card.id}`, { data: { action: "save", version: 0, data } });
  expect(saved.status(), await saved.text()).toBe(200);
  const done = await page.request.put(`/api/briefings/${card.id}`, { data: { action: "complete", version: 1, data } });
  expect(done.status()).toBe(422);
  const issues = (await done.json()).issues as { field: string; message: string }[];
  expect(issues.find((i) => i.field === "emergency.rescuerWorkerId")?.message).toContain("Cody Brandvold has no pole-top rescue training");
  expect(issues.find((i) => i.field === "emergency.callerWorkerId")?.message).toContain("must stay on the ground");
  expect(issues.find((i) => i.field === "action")).toBeUndefined();

  await page.goto(`/orders/${card.id}/briefing`);
  await expect(page.getByTestId("briefing-editor")).toBeVisible();
  await expect(page.getByTestId("briefing-window")).toContainText("18:00");
  await page.getByRole("button", { name: "Complete briefing" }).click();
  await expect(page.getByText(/Cody Brandvold has no pole-top rescue training/)).toBeVisible();
  await expect(page.getByText(/works aloft on this job; the one who calls for help must stay on the ground/)).toBeVisible();

  // With Marcus (trained, on the ground) doing the rescue and Cody calling, those two pass.
  data.emergency.callerWorkerId = cody;
  data.emergency.rescuerWorkerId = marcus;
  const again = await page.request.put(`/api/briefings/${card.id}`, { data: { action: "complete", version: 1, data } });
  const fields = ((await again.json()).issues ?? []).map((i: { field: string }) => i.field);
  expect(fields).not.toContain("emergency.rescuerWorkerId");
  expect(fields).not.toContain("emergency.callerWorkerId");
});

test("completion days before the job is refused until 18:00 the evening before, and the screen says so", async ({ page, browser }) => {
  test.setTimeout(120_000);
  const disp = await browser.newContext();
  const dp = await disp.newPage();
  await signIn(dp, "dispatcher", "dispatch@cedarprairie.example");
  const day = dayFrom(2 + Math.floor(Math.random() * 300));
  const run = Date.now().toString(36);
  const { card, id } = await order(dp.request, day, `Early brief ${run}`, "07:00", "12:00");
  await seat(dp.request, card, "lead", id("CP-1001"));
  await disp.close();

  await signIn(page, "lineworker");
  const data = emptyBriefing();
  const r = await page.request.put(`/api/briefings/${card.id}`, { data: { action: "complete", version: 0, data } });
  expect(r.status()).toBe(422);
  const early = ((await r.json()).issues as { field: string; message: string }[]).find((i) => i.field === "action");
  expect(early?.message).toContain("from 18:00 the evening before the job");
  // The day before, 18:00 on Chicago's clock, with its zone abbreviation (CST or CDT, IANA).
  const prev = new Date(`${day}T12:00:00Z`);
  prev.setUTCDate(prev.getUTCDate() - 1);
  const words = new Intl.DateTimeFormat("en-US", { timeZone: "UTC", month: "short", day: "numeric" }).format(prev);
  expect(early?.message).toContain(words);
  expect(early?.message).toMatch(/18:00 C[SD]T/);
  await page.goto(`/orders/${card.id}/briefing`);
  await expect(page.getByTestId("briefing-window")).toContainText(`${words}, 18:00`);
});
