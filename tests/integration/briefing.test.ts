// The job briefing with the pole check, against the running app (APP_URL) and MariaDB.
// Orders of the test's own, 52 and 53 days out, crewed with the demo's field sign-ins
// (db/demo/field-accounts.ts): Marcus Whitfield leads, Priya Raman climbs, Kayla Sorensen
// observes; Luis Carrasco is on the second order only, so he is the outsider on the first.
import knex from "knex";
import { extractText, getDocumentProxy } from "unpdf";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { dbConfig } from "@/knexfile";
import { DEMO_ACCOUNTS } from "@/db/demo/accounts";
import { FIELD_ACCOUNTS } from "@/db/demo/field-accounts";
import { emptyBriefing, type BriefingData, type GearCheckValues } from "@/lib/briefings/model";
import { as, Client } from "../support/client";
import { makeOrder, removeMadeOrders, workerByNo } from "../support/fixtures";
import { elfBytes, tinyPng } from "../support/files";

const db = knex(dbConfig());
const MARCUS = DEMO_ACCOUNTS.find((a) => a.email === "marcus.whitfield@cedarprairie.example")!;
const field = (no: string) => FIELD_ACCOUNTS.find((a) => a.workerNo === no)!;

async function signedIn(email: string, password: string) {
  const c = new Client();
  const r = await c.signIn(email, password);
  if (!r.signedIn) throw new Error(`sign-in ${email} failed: ${r.status}`);
  return c;
}

let ids: Record<string, number> = {};
let orderA: Awaited<ReturnType<typeof makeOrder>>;
let orderB: Awaited<ReturnType<typeof makeOrder>>;
let lead: Client, priya: Client, kayla: Client, luis: Client;

async function crew(o: typeof orderA, seats: Record<string, string>) {
  let n = 0;
  for (const [position, no] of Object.entries(seats)) {
    await db("assignments").insert({
      work_order_id: o.id,
      position_id: o.positionIds[position],
      worker_id: ids[no],
      holds_position: o.positionIds[position],
      status: "sent",
      sent_at: new Date(),
      reply_code: String(8000 + ((o.id * 7 + n++) % 1999)),
    });
  }
}

/** A briefing a lead could complete: everything filled in, every pole check a pass. */
function fullBriefing(): BriefingData {
  const d = emptyBriefing();
  d.hazards.energized = { present: true, notes: "12.47 kV primary; cover up the phase in reach" };
  d.hazards.traffic = { present: true, notes: "Cones and signs on the shoulder" };
  d.dropZone.radiusFt = 20;
  d.dropZone.reason = "40 ft pole and a 25 kVA pot on the hand line";
  d.dropZone.entrants = [ids["CP-1001"]];
  d.procedure.steps = "Cover up, lower old pot on the hand line, raise the new one, reconnect, test.";
  d.controls.isolating_devices = true;
  d.controls.hot_line_tag = true;
  d.controls.notes = "Cutout opened and tagged; recloser on non-reclose at the substation.";
  for (const k of Object.keys(d.poleCheck.items) as (keyof typeof d.poleCheck.items)[]) d.poleCheck.items[k].result = "pass";
  d.emergency.hospital = "Cedar Prairie Regional";
  d.emergency.hospitalAddress = "400 Hospital Drive, Cedar Prairie";
  d.emergency.callerWorkerId = ids["CP-1013"];
  d.emergency.rescuerWorkerId = ids["CP-1001"];
  return d;
}

const gear = (climbing: boolean, testedOn: string): GearCheckValues => ({
  gloves: { result: "ok", testedOn },
  sleeves: { result: "ok", testedOn },
  belt: climbing ? "ok" : "na",
  fallArrest: climbing ? "ok" : "na",
  climbers: climbing ? "ok" : "na",
  hardHat: "ok",
  frClothing: "ok",
});

beforeAll(async () => {
  for (const no of ["CP-1001", "CP-1008", "CP-1013", "CP-1021"]) ids[no] = (await workerByNo(db, no)).id;
  // Today, in the evening: a briefing is completed at the earliest from 18:00 the evening before
  // the job (issue 18), so orders days ahead could not be completed here.
  orderA = await makeOrder(db, { offsetDays: 0, positions: ["lead", "climber", "observer"], start: "19:00", end: "21:00" });
  orderB = await makeOrder(db, { offsetDays: 0, positions: ["lead", "climber", "observer", "ground"], start: "21:30", end: "23:30" });
  await crew(orderA, { lead: "CP-1001", climber: "CP-1008", observer: "CP-1013" });
  await crew(orderB, { lead: "CP-1001", climber: "CP-1008", observer: "CP-1013", ground: "CP-1021" });
  lead = await signedIn(MARCUS.email, MARCUS.password);
  priya = await signedIn(field("CP-1008").email, field("CP-1008").password);
  kayla = await signedIn(field("CP-1013").email, field("CP-1013").password);
  luis = await signedIn(field("CP-1021").email, field("CP-1021").password);
});

afterAll(async () => {
  const numbers = [orderA?.number, orderB?.number].filter(Boolean) as string[];
  for (const n of numbers) await db("notifications").where({ kind: "hold" }).where("body", "like", `%${n}%`).delete();
  // Photos uploaded here point at the orders (files.work_order_id): let go of them first.
  const made = [orderA?.id, orderB?.id].filter(Boolean) as number[];
  if (made.length) await db("files").whereIn("work_order_id", made).update({ work_order_id: null });
  await removeMadeOrders(db);
  await db.destroy();
});

describe("who may open a briefing", () => {
  it("the lead edits, the crew reads, dispatch and supervisors view; anyone else is refused", async () => {
    const g = await lead.json(`/api/briefings/${orderA.id}`);
    expect(g.status).toBe(200);
    expect(g.body.mode).toBe("lead");
    expect(g.body.crew.map((c: { name: string }) => c.name)).toEqual(["Marcus Whitfield", "Priya Raman", "Kayla Sorensen"]);
    expect(g.body.briefing).toBeNull();
    // Prefilled from the order: energized 12.47 kV; the drop zone starts at 15 ft (common practice).
    expect(g.body.data.hazards.energized.present).toBe(true);
    expect(g.body.data.dropZone.radiusFt).toBe(15);
    expect((await priya.json(`/api/briefings/${orderA.id}`)).body.mode).toBe("crew");
    expect((await (await as("dispatcher")).json(`/api/briefings/${orderA.id}`)).body.mode).toBe("viewer");
    expect((await (await as("supervisor")).json(`/api/briefings/${orderA.id}`)).body.mode).toBe("viewer");
    expect((await (await as("hr")).json(`/api/briefings/${orderA.id}`)).status).toBe(403);
    expect((await new Client().json(`/api/briefings/${orderA.id}`)).status).toBe(401);
    expect((await lead.json(`/api/briefings/999999999`)).status).toBe(404);
  });

  it("a lineworker not on the crew gets 403 on GET, on the PDF and on ack; a crew member who is not the lead cannot write", async () => {
    expect((await luis.json(`/api/briefings/${orderA.id}`)).status).toBe(403);
    expect((await luis.fetch(`/api/briefings/${orderA.id}/pdf`)).status).toBe(403);
    const ack = await luis.json(`/api/briefings/${orderA.id}/ack`, "POST", { round: 1, gearCheck: gear(false, orderA.day) });
    expect(ack.status).toBe(403);
    const put = await kayla.json(`/api/briefings/${orderA.id}`, "PUT", { action: "save", version: 0, data: fullBriefing() });
    expect(put.status).toBe(403);
    const disp = await (await as("dispatcher")).json(`/api/briefings/${orderA.id}`, "PUT", { action: "save", version: 0, data: fullBriefing() });
    expect(disp.status).toBe(403);
  });
});

describe("the lead saves and completes; the crew acknowledges", () => {
  it("saves a draft, refuses a stale version, and refuses to complete an incomplete briefing (422 naming fields)", async () => {
    const draft = emptyBriefing();
    draft.procedure.steps = "Change out the pot.";
    const s = await lead.json(`/api/briefings/${orderA.id}`, "PUT", { action: "save", version: 0, data: draft });
    expect(s.status).toBe(200);
    expect(s.body.briefing).toMatchObject({ round: 1, state: "draft", version: 1 });
    const stale = await lead.json(`/api/briefings/${orderA.id}`, "PUT", { action: "save", version: 0, data: draft });
    expect(stale.status).toBe(409);
    const bad = await lead.json(`/api/briefings/${orderA.id}`, "PUT", { action: "complete", version: 1, data: draft });
    expect(bad.status).toBe(422);
    const fields = bad.body.issues.map((i: { field: string }) => i.field);
    expect(fields).toContain("poleCheck.items.ground_line.result");
    expect(fields).toContain("emergency.hospital");
    const junk = await lead.json(`/api/briefings/${orderA.id}`, "PUT", { action: "save", version: 1, data: { dropZone: { radiusFt: "wide" } } });
    expect(junk.status).toBe(422);
    expect(junk.body.issues[0].field).toBe("data.dropZone.radiusFt");
  });

  it("completes; the climber's gear check needs climbing gear; each member acknowledges; then the board says briefed", async () => {
    const c = await lead.json(`/api/briefings/${orderA.id}`, "PUT", { action: "complete", version: 1, data: fullBriefing() });
    expect(c.status).toBe(200);
    expect(c.body.briefing).toMatchObject({ round: 1, state: "briefed" });
    // Completed, but nobody has acknowledged yet: the board still says not started.
    expect((await db("work_orders").where({ id: orderA.id }).first()).briefing_state).toBe("not_started");
    // A completed round is not edited in place.
    expect((await lead.json(`/api/briefings/${orderA.id}`, "PUT", { action: "save", version: 2, data: fullBriefing() })).status).toBe(409);

    expect((await priya.json(`/api/briefings/${orderA.id}/ack`, "POST", { round: 2, gearCheck: gear(true, orderA.day) })).status).toBe(409);
    const noClimbers = await priya.json(`/api/briefings/${orderA.id}/ack`, "POST", { round: 1, gearCheck: gear(false, orderA.day) });
    expect(noClimbers.status).toBe(422);
    expect(noClimbers.body.issues.map((i: { field: string }) => i.field)).toContain("gearCheck.climbers");
    // Rubber gloves out of test (more than 6 months: 29 CFR 1910.137 Table I-5, recalled from memory).
    const old = await priya.json(`/api/briefings/${orderA.id}/ack`, "POST", { round: 1, gearCheck: gear(true, "2020-01-01") });
    expect(old.status).toBe(422);
    expect(old.body.issues[0].field).toBe("gearCheck.gloves.testedOn");

    expect((await priya.json(`/api/briefings/${orderA.id}/ack`, "POST", { round: 1, gearCheck: gear(true, orderA.day) })).status).toBe(201);
    expect((await priya.json(`/api/briefings/${orderA.id}/ack`, "POST", { round: 1, gearCheck: gear(true, orderA.day) })).status).toBe(200);
    expect((await kayla.json(`/api/briefings/${orderA.id}/ack`, "POST", { round: 1, gearCheck: gear(false, orderA.day) })).status).toBe(201);
    // Kayla may not acknowledge for someone else; only the lead records an in-person acknowledgement.
    expect((await kayla.json(`/api/briefings/${orderA.id}/ack`, "POST", { round: 1, workerId: ids["CP-1001"], gearCheck: gear(false, orderA.day) })).status).toBe(403);
    // Not yet everybody: start is refused.
    expect((await lead.json(`/api/briefings/${orderA.id}/start`, "POST", { round: 1 })).status).toBe(409);
    expect((await lead.json(`/api/briefings/${orderA.id}/ack`, "POST", { round: 1, gearCheck: gear(false, orderA.day) })).status).toBe(201);

    const row = await db("work_orders").where({ id: orderA.id }).first();
    expect(row.briefing_state).toBe("briefed");
    const ev = await db("board_events").where({ kind: "briefing" }).orderBy("id", "desc").first();
    expect(JSON.parse(typeof ev.payload === "string" ? ev.payload : JSON.stringify(ev.payload))).toMatchObject({ orderId: orderA.id, state: "briefed" });
    const audit = await db("audit_log").where({ action: "briefing.complete", entity: "briefing" }).orderBy("id", "desc").first();
    expect(audit).toBeTruthy();
  });

  it("the PDF is application/pdf and names the crew, the pole check and the caution", async () => {
    const res = await lead.fetch(`/api/briefings/${orderA.id}/pdf`);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("application/pdf");
    const bytes = new Uint8Array(await res.arrayBuffer());
    const { text } = await extractText(await getDocumentProxy(bytes), { mergePages: true });
    for (const name of ["Marcus Whitfield", "Priya Raman", "Kayla Sorensen"]) expect(text).toContain(name);
    expect(text).toContain(orderA.number);
    expect(text).toMatch(/Ground line\s+PASS/);
    expect(text).toMatch(/20 ft \(6\.1 m\)/);
    expect(text).toContain("not a substitute");
    expect((await (await as("dispatcher")).fetch(`/api/briefings/${orderA.id}/pdf`)).status).toBe(200);
  });

  it("the lead marks the work started once everyone acknowledged; a re-brief starts a new round and resets acknowledgements", async () => {
    const s = await lead.json(`/api/briefings/${orderA.id}/start`, "POST", { round: 1 });
    expect(s.status).toBe(200);
    const row = await db("work_orders").where({ id: orderA.id }).first();
    expect(row.status).toBe("in_progress");
    expect(row.actual_start_at).not.toBeNull();
    // 1910.269(c)(3)(ii) (recalled from memory): brief again when conditions change.
    const r = await lead.json(`/api/briefings/${orderA.id}`, "PUT", { action: "rebrief", version: 2, reason: "Wind picked up past 30 mph gusts" });
    expect(r.status).toBe(200);
    expect(r.body.briefing).toMatchObject({ round: 2, state: "draft", reason: "Wind picked up past 30 mph gusts" });
    expect(r.body.acks).toEqual([]);
    expect(r.body.history.map((h: { round: number }) => h.round)).toEqual([1, 2]);
    expect((await db("work_orders").where({ id: orderA.id }).first()).briefing_state).toBe("not_started");
  });
});

describe("a pole that fails its ground-line check and is held", () => {
  it("puts the order on hold, queues texts and e-mails to dispatch, shows on the board, and start is refused 409", async () => {
    const before = await db("notifications").where({ kind: "hold" }).count({ n: "*" }).first();
    const d = fullBriefing();
    d.dropZone.entrants = [];
    d.poleCheck.items.ground_line = { result: "fail", notes: "Soft, punky wood 4 in. deep on the road side", photoFileId: null };

    // A photo of the failure: PNG accepted (sniffed with file-type); an executable named .png refused.
    const form = new FormData();
    form.append("file", new Blob([new Uint8Array(tinyPng())], { type: "image/png" }), "ground-line.png");
    const up = await lead.fetch(`/api/briefings/${orderB.id}/photo`, { method: "POST", body: form });
    expect(up.status).toBe(201);
    const photo = (await up.json()).file;
    const exe = new FormData();
    exe.append("file", new Blob([new Uint8Array(elfBytes())], { type: "image/png" }), "ground-line.png");
    expect((await lead.fetch(`/api/briefings/${orderB.id}/photo`, { method: "POST", body: exe })).status).toBe(415);
    expect((await priya.fetch(`/api/briefings/${orderB.id}/photo`, { method: "POST", body: form })).status).toBe(403);
    d.poleCheck.items.ground_line.photoFileId = photo.id;

    // Completing with an unhandled failure is refused: secure, bucket or hold.
    const c = await lead.json(`/api/briefings/${orderB.id}`, "PUT", { action: "complete", version: 0, data: d });
    expect(c.status).toBe(422);
    expect(c.body.issues.map((i: { field: string }) => i.field)).toContain("poleCheck.failAction");

    const reason = "Pole failed its ground-line check: soft wood 4 in. deep on the road side";
    const h = await lead.json(`/api/briefings/${orderB.id}/hold`, "POST", { version: 0, data: d, reason });
    expect(h.status).toBe(200);
    expect(h.body.briefing.state).toBe("on_hold");
    expect(h.body.data.poleCheck.failAction).toBe("hold");
    const row = await db("work_orders").where({ id: orderB.id }).first();
    expect(row).toMatchObject({ status: "on_hold", hold_reason: reason, briefing_state: "on_hold" });

    // Written to the outbox as 'queued'; a running delivery loop may have taken them since.
    const rows = await db("notifications").where({ kind: "hold" }).where("body", "like", `%${orderB.number}%`);
    expect(rows.length).toBeGreaterThanOrEqual(2);
    const yardRow = await db("yards").where({ code: "NOR" }).first();
    expect(rows.find((r) => r.channel === "sms")?.to_address).toBe(yardRow.dispatcher_phone);
    expect(rows.filter((r) => r.channel === "email").map((r) => r.to_address)).toContain("dispatch@cedarprairie.example");
    const after = await db("notifications").where({ kind: "hold" }).count({ n: "*" }).first();
    expect(Number(after?.n) - Number(before?.n)).toBe(rows.length);

    // Nobody can mark the climb started.
    const s = await lead.json(`/api/briefings/${orderB.id}/start`, "POST", { round: 1 });
    expect(s.status).toBe(409);
    expect(s.body.error).toMatch(/on hold/);
    expect((await lead.json(`/api/briefings/${orderB.id}/hold`, "POST", { version: 1, data: d, reason })).status).toBe(409);

    // The board shows it (dispatcher).
    const disp = await as("dispatcher");
    const board = await disp.json(`/api/board?yard=NOR&date=${orderB.day}`);
    expect(board.status).toBe(200);
    const card = board.body.orders.find((o: { id: number }) => o.id === orderB.id);
    expect(card).toMatchObject({ status: "on_hold", briefingState: "on_hold", holdReason: reason });

    // The photo is readable by the crew and dispatch, not by others.
    expect((await priya.fetch(`/api/briefings/${orderB.id}/photo/${photo.id}`)).status).toBe(200);
    expect((await disp.fetch(`/api/briefings/${orderB.id}/photo/${photo.id}`)).status).toBe(200);
    expect((await priya.fetch(`/api/briefings/${orderA.id}/photo/${photo.id}`)).status).toBe(404);

    // Dispatch lifts the hold once the pole is dealt with: back to planned, a fresh round for the lead.
    expect((await lead.json(`/api/briefings/${orderB.id}/hold`, "DELETE", { note: "Pole replaced" })).status).toBe(403);
    const lift = await disp.json(`/api/briefings/${orderB.id}/hold`, "DELETE", { note: "New 45 ft class 3 set this morning" });
    expect(lift.status).toBe(200);
    expect(lift.body.briefing).toMatchObject({ round: 2, state: "draft" });
    expect(lift.body.data.poleCheck.items.ground_line.result).toBeNull();
    expect(await db("work_orders").where({ id: orderB.id }).first()).toMatchObject({ status: "planned", hold_reason: null, briefing_state: "not_started" });
  });
});
