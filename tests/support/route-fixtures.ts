// The records the route table's samples need (tests/support/route-table.ts), built against the
// running app's database, on days 198+ from today (far from the demo's "tomorrow"), and removed
// again afterwards: everything this file's run created is found by id above the maxima taken
// before it started (test files run one at a time).
import { randomInt } from "node:crypto";
import { smsAuthToken } from "@/tests/support/secrets";
import type { Knex } from "knex";
import twilio from "twilio";
import { addDays, todayIn } from "@/lib/time/days";
import { getPolicy } from "@/lib/policies/data";
import { getWorkType } from "@/lib/orders/data-work-types";
import { newCalendarToken } from "@/lib/workers/data-calendar";
import { emptyBriefing, type BriefingData } from "@/lib/briefings/model";
import { ROLES, type Role } from "@/lib/users/roles";
import { as, Client } from "./client";
import { makeOrder, workerByNo } from "./fixtures";
import { makeCrewDay } from "./notify";
import { minimalPdf, tinyPng } from "./files";
import type { Fx, Seat } from "./route-table";

const TABLES = [
  "work_orders",
  "order_series",
  "workers",
  "credentials",
  "files",
  "qualification_types",
  "rotations",
  "time_records",
  "unavailability",
  "inbound_messages",
  "notifications",
  "equipment",
  "rubber_goods",
] as const;

export interface Built {
  fx: Fx;
  cleanup: () => Promise<void>;
}

async function maxId(db: Knex, table: string) {
  return Number((await db(table).max({ id: "id" }).first())?.id ?? 0);
}

export async function signedInClients(): Promise<Record<Role, Client>> {
  const out = {} as Record<Role, Client>;
  for (const r of ROLES) out[r] = await as(r, r === "dispatcher" ? "dispatch@cedarprairie.example" : undefined);
  return out;
}

export async function buildFixtures(db: Knex, opts: { firstOffset?: number } = {}): Promise<Built> {
  const before: Record<string, number> = {};
  for (const t of TABLES) before[t] = await maxId(db, t);
  const clients = await signedInClients();
  const run = Date.now().toString(36);
  let n = 0;
  const uniq = () => `${run}${(++n).toString(36)}`;

  const y = await db("yards").where({ code: "NOR" }).first();
  const yard = { id: Number(y.id), code: String(y.code), timezone: String(y.timezone) };
  const orgId = Number(y.organisation_id);
  const today = todayIn(yard.timezone);
  const base = opts.firstOffset ?? 198;
  let offset = base + 2;
  const nextOffset = () => offset++;
  const nextDay = () => addDays(today, nextOffset());
  let past = -300;
  const pastDay = () => addDays(today, past++);

  const marcusRow = await workerByNo(db, "CP-1001");
  const marcusUser = await db("users").where({ email: "marcus.whitfield@cedarprairie.example" }).first();
  const otherRow = await workerByNo(db, "CP-1014");
  const marcusToken = marcusRow.calendar_token ?? null;

  const [workerId] = await db("workers").insert({
    organisation_id: orgId,
    yard_id: yard.id,
    employee_no: `RM-${run}`,
    first_name: "Route",
    last_name: "Fixture",
    classification: "journeyman",
    calendar_token: newCalendarToken(),
  });
  const worker = { id: Number(workerId), employeeNo: `RM-${run}` };
  const qualTypeCode = `rm_${run}`;
  const [qualTypeId] = await db("qualification_types").insert({ organisation_id: orgId, code: qualTypeCode, name: "Route matrix qualification", renewal_months: 12, warn_days: 30 });
  const patrol = await db("work_types").where({ organisation_id: orgId, code: "patrol" }).first();

  const reply = () => String(randomInt(1000, 10000));
  const toSeat = (o: Awaited<ReturnType<typeof makeOrder>>): Seat => ({ orderId: Number(o.id), number: o.number, day: o.day, positionIds: o.positionIds });
  const seat = async () => toSeat(await makeOrder(db, { offsetDays: nextOffset(), positions: ["lead", "ground"], workType: "patrol", energized: false }));
  const put = async (s: Seat, position: string, workerId: number, status = "draft") => {
    const [id] = await db("assignments").insert({
      work_order_id: s.orderId,
      position_id: s.positionIds[position],
      worker_id: workerId,
      holds_position: s.positionIds[position],
      status,
      sent_at: status === "draft" ? null : new Date(),
      sent_version: status === "draft" ? null : 1,
      reply_code: reply(),
      version: 1,
    });
    return Number(id);
  };

  const lead = clients.lineworker; // Marcus Whitfield
  const briefingData = (o: { fail?: boolean } = {}): BriefingData => {
    const d = emptyBriefing();
    d.hazards.energized = { present: true, notes: "12.47 kV primary in reach; cover up" };
    d.dropZone.entrants = o.fail ? [] : [Number(marcusRow.id)];
    d.procedure.steps = "Route matrix: cover up, change out, test.";
    d.controls.isolating_devices = true;
    d.controls.notes = "Cutout opened and tagged.";
    for (const k of Object.keys(d.poleCheck.items) as (keyof typeof d.poleCheck.items)[]) d.poleCheck.items[k].result = "pass";
    if (o.fail) d.poleCheck.items.ground_line = { result: "fail", notes: "Soft wood 4 in. deep", photoFileId: null };
    d.emergency.hospital = "Cedar Prairie Regional";
    d.emergency.hospitalAddress = "400 Hospital Drive, Cedar Prairie";
    d.emergency.callerWorkerId = Number(marcusRow.id);
    d.emergency.rescuerWorkerId = Number(marcusRow.id);
    return d;
  };
  const must = async (what: string, p: Promise<{ status: number; body: any }>, ok = [200, 201]) => {
    const r = await p;
    if (!ok.includes(r.status)) throw new Error(`fixture ${what}: ${r.status} ${JSON.stringify(r.body).slice(0, 300)}`);
    return r.body;
  };
  const briefingOrder = async (state: "none" | "briefed" | "acked" | "held") => {
    const o = toSeat(await makeOrder(db, { offsetDays: nextOffset(), positions: ["lead"], workType: "pole_climb" }));
    await put(o, "lead", Number(marcusRow.id), "sent");
    if (state === "briefed" || state === "acked") {
      // The route completes a briefing only from 18:00 the evening before the job (issue 18);
      // this order is days ahead, so the lead saves the draft through the route and the
      // fixture marks the round complete, as the route would at that hour.
      await must("save briefing", lead.json(`/api/briefings/${o.orderId}`, "PUT", { action: "save", version: 0, data: briefingData() }));
      await db("briefings").where({ work_order_id: o.orderId, round: 1 }).update({ state: "briefed", completed_at: new Date() });
    }
    if (state === "acked") {
      const gear = { result: "ok", testedOn: o.day };
      await must(
        "ack",
        lead.json(`/api/briefings/${o.orderId}/ack`, "POST", { round: 1, gearCheck: { gloves: gear, sleeves: gear, belt: "na", fallArrest: "na", climbers: "na", hardHat: "ok", frClothing: "ok" } }),
      );
    }
    if (state === "held") {
      await must("hold", lead.json(`/api/briefings/${o.orderId}/hold`, "POST", { version: 0, data: briefingData({ fail: true }), reason: "Route matrix: pole failed" }));
    }
    return o;
  };

  const orderBody = (day = nextDay()) => ({
    title: `Route matrix patrol ${uniq()}`,
    yardId: yard.id,
    workTypeId: Number(patrol.id),
    address: "1 Route Matrix Road",
    structureNo: null,
    start: `${day}T07:00`,
    end: `${day}T15:00`,
    energized: false,
    voltageKv: 12.47,
    emergency: false,
    crewException: null,
    minCrew: null,
    positions: [{ position: "lead" }, { position: "ground" }],
    priority: 3,
    notes: null,
    status: "planned",
    driverLicence: null,
  });
  const series = async () => {
    const body = { ...orderBody(), recurrence: { rrule: "FREQ=WEEKLY;COUNT=2", exdates: [] } };
    const r = await must("series", clients.dispatcher.json("/api/orders", "POST", body));
    return { id: Number(r.seriesId), body };
  };
  const order = async () => {
    const o = await makeOrder(db, { offsetDays: nextOffset(), positions: ["lead"], workType: "patrol", energized: false });
    return { id: Number(o.id), version: 1 };
  };
  const rotation = async () => {
    const r = await must(
      "rotation",
      clients.dispatcher.json("/api/rotations", "POST", { name: `Route matrix rotation ${uniq()}`, yardId: yard.id, rrule: "FREQ=WEEKLY;BYDAY=SU", dtstartLocal: `${addDays(today, base)}T07:00`, active: false, memberIds: [worker.id] }),
    );
    return Number(r.id);
  };
  const timeRecord = async () => {
    const day = nextDay();
    const [id] = await db("time_records").insert({ worker_id: worker.id, start_at: new Date(`${day}T14:00:00Z`), end_at: new Date(`${day}T16:00:00Z`), kind: "manual", reason: "Route matrix" });
    return Number(id);
  };
  const unavailability = async (workerId: number, status: "requested" | "approved") => {
    const day = nextDay();
    const [id] = await db("unavailability").insert({ worker_id: workerId, start_at: new Date(`${day}T06:00:00Z`), end_at: new Date(`${day}T18:00:00Z`), kind: "leave", status, note: "Route matrix" });
    return Number(id);
  };
  const qualType = async () => {
    const [id] = await db("qualification_types").insert({ organisation_id: orgId, code: `rm_${uniq()}`, name: "Route matrix spare", renewal_months: 12, warn_days: 30 });
    return Number(id);
  };
  // Issue 16: trucks, rigging and bookings of the run's own.
  const truck = async () => {
    const [id] = await db("equipment").insert({
      organisation_id: orgId,
      yard_id: yard.id,
      kind: "bucket_truck",
      unit_number: `RM-${uniq()}`,
      name: "Route matrix bucket",
      insulated: true,
      dielectric_tested_on: addDays(today, -30),
      annual_inspection_on: addDays(today, -30),
      licence: "cdl_b",
    });
    return { id: Number(id), version: 1 };
  };
  const riggingItem = async () => {
    const t = await truck();
    const [itemId] = await db("equipment_rigging").insert({ equipment_id: t.id, kind: "hand_line", label: "Route matrix hand line", wll_lb: 450, inspected_on: addDays(today, -10) });
    return { equipmentId: t.id, itemId: Number(itemId) };
  };
  const booking = async () => {
    const s = await seat();
    const t = await truck();
    const [id] = await db("equipment_assignments").insert({ work_order_id: s.orderId, equipment_id: t.id });
    return { id: Number(id), version: 1 };
  };
  const pendingCredential = async () => {
    // One pending record per worker and type (credentials_slot_unique): a type of its own each time.
    const [id] = await db("credentials").insert({ worker_id: worker.id, qualification_type_id: await qualType(), issued_on: pastDay(), expires_on: null, status: "pending" });
    return Number(id);
  };
  const inbound = async () => {
    const [id] = await db("inbound_messages").insert({ organisation_id: orgId, provider_sid: `SMRM${uniq()}`, from_phone: "+13205550999", body: "Route matrix: who is this", outcome: "unmatched", handled: false });
    return Number(id);
  };
  const lapsedClimber = async () => {
    const o = toSeat(await makeOrder(db, { offsetDays: nextOffset(), positions: ["climber"], start: "07:00", end: "12:00" }));
    const w = await workerByNo(db, "CP-1006"); // climbing lapsed (demo scenario)
    await put(o, "climber", Number(w.id));
    return { seat: o, workerId: Number(w.id) };
  };

  // Fixed records.
  const day = addDays(today, base);
  await makeOrder(db, { offsetDays: base, positions: ["lead", "ground"], workType: "patrol", energized: false });
  const sendDay = (await makeCrewDay(db, { offsetDays: base + 1, crew: [{ position: "ground", employeeNo: "CP-1014" }] })).day;
  const marcusOrder = toSeat(await makeOrder(db, { offsetDays: nextOffset(), positions: ["lead", "observer"] }));
  await put(marcusOrder, "lead", Number(marcusRow.id), "sent");
  await put(marcusOrder, "observer", Number((await workerByNo(db, "CP-1013")).id), "sent");
  const photoForm = new FormData();
  photoForm.set("file", new Blob([new Uint8Array(tinyPng())], { type: "image/png" }), "visual.png");
  const photoRes = await lead.fetch(`/api/briefings/${marcusOrder.orderId}/photo`, { method: "POST", body: photoForm });
  if (photoRes.status !== 201) throw new Error(`fixture photo: ${photoRes.status} ${await photoRes.text()}`);
  const photoFileId = Number((await photoRes.json()).file.id);
  const draft = emptyBriefing();
  draft.poleCheck.items.visual = { result: "pass", notes: "", photoFileId };
  await must("briefing draft", lead.json(`/api/briefings/${marcusOrder.orderId}`, "PUT", { action: "save", version: 0, data: draft }));
  const fileForm = new FormData();
  fileForm.set("file", new Blob([new Uint8Array(minimalPdf(`Marcus ${run}`))], { type: "application/pdf" }), "marcus-first-aid.pdf");
  const fileRes = await lead.fetch("/api/files", { method: "POST", body: fileForm });
  if (fileRes.status !== 201) throw new Error(`fixture file: ${fileRes.status} ${await fileRes.text()}`);
  const marcusFileId = Number((await fileRes.json()).file.id);
  const marcusCredential = await db("credentials").where({ worker_id: marcusRow.id }).orderBy("id").first("id");
  const marcusUnavailabilityId = await unavailability(Number(marcusRow.id), "approved");

  const webhook = `${(process.env.APP_PUBLIC_URL ?? process.env.APP_URL ?? "http://127.0.0.1:3100").replace(/\/$/, "")}/api/sms/inbound`;
  const token = smsAuthToken();

  const fx: Fx = {
    db,
    orgId,
    yard,
    clients,
    marcus: { workerId: Number(marcusRow.id), userId: Number(marcusUser.id), phone: String(marcusRow.phone_e164) },
    other: { workerId: Number(otherRow.id), phone: String(otherRow.phone_e164) },
    worker,
    day,
    sendDay,
    workTypeId: Number(patrol.id),
    qualTypeId: Number(qualTypeId),
    qualTypeCode,
    marcusOrderId: marcusOrder.orderId,
    photoFileId,
    marcusFileId,
    marcusCredentialId: Number(marcusCredential.id),
    marcusUnavailabilityId,
    seriesId: 0,
    orderId: 0,
    rotationId: 0,
    webhook,
    sign: (params) => twilio.getExpectedTwilioSignature(token, webhook, params),
    uniq,
    nextDay,
    pastDay,
    seat,
    placed: async () => {
      const s = await seat();
      return { assignmentId: await put(s, "lead", Number(otherRow.id)), seat: s };
    },
    sentTo: async (workerId) => {
      const s = await seat();
      return { assignmentId: await put(s, "lead", workerId, "sent"), seat: s };
    },
    briefingOrder,
    lapsedClimber,
    inbound,
    series,
    order,
    rotation,
    timeRecord,
    unavailability,
    pendingCredential,
    qualType,
    truck,
    riggingItem,
    booking,
    orderBody,
    pdf: () => minimalPdf(`Route matrix ${uniq()}`),
    png: () => tinyPng(),
    briefingData,
    policyBody: async () => {
      const { rules: _rules, ...p } = await getPolicy(db, orgId);
      return p;
    },
    workTypeBody: async () => {
      const t = (await getWorkType(db, orgId, Number(patrol.id)))!;
      return { name: t.name, minCrew: t.minCrew, digs: t.digs, positions: t.positions };
    },
    workerVersion: async () => Number((await db("workers").where({ id: worker.id }).first("version")).version),
    calendarToken: async () => String((await db("workers").where({ id: worker.id }).first("calendar_token")).calendar_token),
  };
  fx.seriesId = (await series()).id;
  fx.orderId = (await order()).id;
  fx.rotationId = await rotation();

  const cleanup = async () => {
    const above = (t: string) => db(t).where("id", ">", before[t]);
    const orders = db("work_orders")
      .where("id", ">", before.work_orders)
      .where((w) => w.whereNull("series_id").orWhere("series_id", ">", before.order_series))
      .select("id");
    // Only the outbox rows this run caused: texts and e-mails about its assignments and its held
    // orders. Reminder rows stay (reminders_sent remembers them, and the app's own daily job may
    // have queued some meanwhile: tests/integration/credentials-reminders.test.ts reads them).
    await db("notifications").whereIn("assignment_id", db("assignments").whereIn("work_order_id", orders.clone()).select("id")).delete();
    await above("notifications").where({ kind: "hold" }).delete();
    await above("inbound_messages").delete();
    await db("inbound_messages").whereIn("assignment_id", db("assignments").whereIn("work_order_id", orders.clone()).select("id")).update({ assignment_id: null });
    // Rubber goods the route table's samples recorded (issue 16); lift plans go with their orders.
    await above("rubber_goods").delete();
    await above("credentials").update({ supersedes_id: null });
    await above("credentials").delete();
    await above("time_records").delete();
    await above("unavailability").delete();
    await above("rotations").delete();
    await db("work_orders").whereIn("id", (await orders.clone()).map((r: { id: number }) => r.id)).delete();
    await above("order_series").delete();
    await above("files").delete();
    await above("qualification_types").delete();
    await db("equipment_assignments").whereIn("equipment_id", above("equipment").select("id")).delete();
    await above("equipment").delete();
    const workers = await above("workers").pluck("id");
    if (workers.length) {
      await db("assignments").whereIn("worker_id", workers).delete();
      await db("rotation_members").whereIn("worker_id", workers).delete();
      await db("workers").whereIn("id", workers).delete();
    }
    await db("workers").where({ id: marcusRow.id }).update({ calendar_token: marcusToken });
  };
  return { fx, cleanup };
}
