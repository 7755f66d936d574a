// The job briefing with the pole check, on Knex. One row per round (a re-brief starts a new
// round, and acknowledgements belong to a round, so they reset). The crew lead (the worker in
// the order's lead seat) writes it; the crew acknowledges it, each from their own sign-in,
// with their gear check; dispatchers and supervisors read it.
//
// work_orders.briefing_state, what the board shows:
//   on_hold      the lead held the order (usually a pole that failed its check);
//   briefed      the lead completed the current round AND every crew member acknowledged it;
//   not_started  anything else (no briefing, a draft, or acknowledgements still missing).
//
// Every write locks the order row first, then the briefing row, writes an audit row and a
// board event ("briefing") in the same transaction.
import "@/lib/server-only";
import type { Knex } from "knex";
import { completionTooEarly, emergencyRoleIssues, RESCUE_CODES, type BriefingFacts } from "@/lib/briefings/checks";
import { ApiError } from "@/lib/api/http";
import { audit, type Actor } from "@/lib/audit/data";
import { voltageLabel } from "@/lib/orders/voltage";
import { boardEvent } from "@/lib/events/data";
import { appPublicUrl } from "@/lib/notify/config";
import { assertAttachable } from "@/lib/files/data";
import { toGsm7 } from "@/lib/notify/wording";
import { enqueue, type OutboxInput } from "@/lib/notify/data-outbox";
import type { Role } from "@/lib/users/roles";
import { POSITION_LABEL } from "@/lib/format";
import {
  briefingDataSchema,
  completionIssues,
  emptyBriefing,
  failedChecks,
  failuresResolved,
  gearCheckSchema,
  poleCheckPasses,
  POLE_CHECKS,
  type BriefingData,
  type GearCheck,
} from "@/lib/briefings/model";
import type { BriefingView, CrewMember, OrderFacts, AckView, RoundView } from "./model";
export type { BriefingView, CrewMember, OrderFacts, AckView, RoundView };

type Q = Knex | Knex.Transaction;

export interface BriefingActor extends Actor {
  role: Role;
  workerId: number | null;
  name?: string;
}

export type Mode = "lead" | "crew" | "viewer";

const iso = (d: unknown) => (d ? new Date(d as string).toISOString() : null);
const num = (v: unknown) => (v === null || v === undefined ? null : Number(v));

export function parseData(raw: unknown): BriefingData {
  let v = raw;
  if (typeof v === "string") {
    try {
      v = JSON.parse(v);
    } catch {
      v = {};
    }
  }
  const r = briefingDataSchema.safeParse(v ?? {});
  return r.success ? r.data : emptyBriefing();
}

function parseGear(raw: unknown): GearCheck | null {
  let v = raw;
  if (typeof v === "string") {
    try {
      v = JSON.parse(v);
    } catch {
      return null;
    }
  }
  return (v as GearCheck) ?? null;
}

async function orderFacts(q: Q, organisationId: number, orderId: number, lock = false): Promise<OrderFacts | null> {
  const query = q("work_orders as o")
    .join("yards as y", "y.id", "o.yard_id")
    .join("work_types as t", "t.id", "o.work_type_id")
    .where({ "o.id": orderId, "o.organisation_id": organisationId })
    .first(
      "o.*",
      "y.code as yard_code",
      "y.name as yard_name",
      "y.timezone",
      "t.name as work_type_name",
      "t.rule_type",
    );
  if (lock) query.forUpdate();
  const r = await query;
  if (!r) return null;
  return {
    id: Number(r.id),
    organisationId: Number(r.organisation_id),
    number: String(r.number),
    title: String(r.title),
    address: r.address ?? null,
    structureNo: r.structure_no ?? null,
    start: iso(r.start_at)!,
    end: iso(r.end_at)!,
    workDate: String(r.work_date),
    timezone: String(r.timezone),
    yardId: Number(r.yard_id),
    yardCode: String(r.yard_code),
    yardName: String(r.yard_name),
    energized: Boolean(r.energized),
    voltageKv: num(r.voltage_kv),
    phases: Number(r.phases) === 1 ? 1 : 3,
    systemKv: num(r.system_kv),
    nearEnergizedKv: num(r.near_energized_kv),
    status: String(r.status),
    holdReason: r.hold_reason ?? null,
    briefingState: String(r.briefing_state),
    actualStartAt: iso(r.actual_start_at),
    workTypeName: String(r.work_type_name),
    ruleType: String(r.rule_type),
    notes: r.notes ?? null,
    version: Number(r.version),
  };
}

const POSITION_ORDER = ["lead", "climber", "aerial", "observer", "operator", "ground", "driver"];

/** The people holding a seat on the order (live assignments), one entry per person. */
export async function orderCrew(q: Q, orderId: number): Promise<CrewMember[]> {
  const rows = await q("assignments as a")
    .join("positions as p", "p.id", "a.position_id")
    .join("workers as w", "w.id", "a.worker_id")
    .where("a.work_order_id", orderId)
    .whereNotNull("a.holds_position")
    .orderBy([{ column: "p.sort" }, { column: "p.id" }])
    .select(
      "a.worker_id",
      "a.status",
      "p.position",
      "w.first_name",
      "w.last_name",
      "w.employee_no",
      "w.classification",
      "w.phone_e164",
      "w.email",
      q.raw("EXISTS (SELECT 1 FROM users u WHERE u.worker_id = w.id AND u.active = 1) AS has_sign_in"),
    );
  const byWorker = new Map<number, CrewMember>();
  for (const r of rows) {
    const id = Number(r.worker_id);
    const m = byWorker.get(id);
    if (m) {
      m.positions.push(String(r.position));
      continue;
    }
    byWorker.set(id, {
      workerId: id,
      name: `${r.first_name} ${r.last_name}`,
      employeeNo: String(r.employee_no),
      classification: String(r.classification),
      positions: [String(r.position)],
      positionLabel: "",
      phone: r.phone_e164 ?? null,
      email: r.email ?? null,
      assignmentStatus: String(r.status),
      hasSignIn: Boolean(Number(r.has_sign_in)),
      climbs: false,
    });
  }
  const crew = [...byWorker.values()];
  for (const m of crew) {
    m.positions.sort((a, b) => POSITION_ORDER.indexOf(a) - POSITION_ORDER.indexOf(b));
    m.positionLabel = m.positions.map((p) => POSITION_LABEL[p] ?? p).join(" + ");
    m.climbs = m.positions.includes("climber");
  }
  crew.sort((a, b) => POSITION_ORDER.indexOf(a.positions[0]) - POSITION_ORDER.indexOf(b.positions[0]));
  return crew;
}

/** The crew lead: the worker in the lead seat; on an order without a lead seat and one person, that person. */
export async function leadOf(q: Q, orderId: number, crew: CrewMember[]): Promise<number | null> {
  const lead = crew.find((c) => c.positions.includes("lead"));
  if (lead) return lead.workerId;
  const hasLeadSeat = await q("positions").where({ work_order_id: orderId, position: "lead" }).first("id");
  if (!hasLeadSeat && crew.length === 1) return crew[0].workerId;
  return null;
}

function roundView(r: Record<string, any>, updatedByName: string | null = null): RoundView {
  return {
    id: Number(r.id),
    round: Number(r.round),
    state: r.state,
    version: Number(r.version),
    leadWorkerId: num(r.lead_worker_id),
    completedAt: iso(r.completed_at),
    updatedAt: iso(r.updated_at)!,
    updatedBy: updatedByName,
    reason: r.reason ?? null,
    holdPrevStatus: r.hold_prev_status ?? null,
  };
}

async function currentRound(q: Q, orderId: number, lock = false) {
  const query = q("briefings").where({ work_order_id: orderId }).orderBy("round", "desc").first();
  if (lock) query.forUpdate();
  return query;
}

/** A new briefing's first draft: what the order already says. */
export function prefill(order: OrderFacts, crew: CrewMember[], leadWorkerId: number | null): BriefingData {
  const d = emptyBriefing();
  if (order.energized) {
    d.hazards.energized.present = true;
    const label = voltageLabel(order);
    d.hazards.energized.notes = `Energized ${label ? `${label} ` : ""}primary on this pole and the spans either side.`;
  } else if (order.nearEnergizedKv !== null && order.nearEnergizedKv > 0) {
    d.hazards.energized.present = true;
    d.hazards.energized.notes = `This work is de-energized, but parts energized at ${order.nearEnergizedKv} kV are within reach: keep the minimum approach distance from them and cover them up.`;
  }
  // Those aloft: climbers and whoever is in the bucket (CREW-CHECK.md, Corrections 3).
  const climbers = crew.filter((c) => c.climbs || c.positions.includes("aerial")).map((c) => c.workerId);
  d.dropZone.entrants = crew.filter((c) => !climbers.includes(c.workerId) && (c.positions.includes("ground") || c.positions.includes("lead"))).map((c) => c.workerId);
  const observer = crew.find((c) => c.positions.includes("observer"));
  const notClimbing = crew.filter((c) => !climbers.includes(c.workerId));
  d.emergency.callerWorkerId = observer?.workerId ?? notClimbing[0]?.workerId ?? leadWorkerId ?? null;
  d.emergency.rescuerWorkerId = (notClimbing.find((c) => c.positions.includes("lead")) ?? notClimbing.find((c) => c.workerId !== d.emergency.callerWorkerId))?.workerId ?? null;
  return d;
}

function startVerdict(order: OrderFacts, briefing: RoundView | null, data: BriefingData, pending: CrewMember[]): { allowed: boolean; reason: string | null } {
  if (order.status === "on_hold" || order.briefingState === "on_hold" || briefing?.state === "on_hold") {
    return { allowed: false, reason: `${order.number} is on hold${order.holdReason ? `: ${order.holdReason}` : ""}. Nobody starts until dispatch lifts the hold.` };
  }
  if (order.status === "cancelled" || order.status === "done") return { allowed: false, reason: `${order.number} is ${order.status}.` };
  if (order.actualStartAt) return { allowed: false, reason: `Work on ${order.number} was marked started already.` };
  if (!briefing || briefing.state !== "briefed") return { allowed: false, reason: "Complete the job briefing first." };
  if (!poleCheckPasses(data) && !failuresResolved(data)) return { allowed: false, reason: "The pole check has no pass: every check must pass before anyone climbs." };
  if (pending.length) return { allowed: false, reason: `Waiting for ${pending.map((p) => p.name).join(", ")} to acknowledge the briefing.` };
  return { allowed: true, reason: null };
}

export async function loadBriefing(q: Q, organisationId: number, orderId: number): Promise<BriefingView | null> {
  const order = await orderFacts(q, organisationId, orderId);
  if (!order) return null;
  const crew = await orderCrew(q, orderId);
  const leadWorkerId = await leadOf(q, orderId, crew);
  const row = await q("briefings as b")
    .leftJoin("users as u", "u.id", "b.updated_by")
    .where("b.work_order_id", orderId)
    .orderBy("b.round", "desc")
    .first("b.*", "u.name as updated_by_name");
  const briefing = row ? roundView(row, row.updated_by_name ?? null) : null;
  const data = row ? parseData(row.data) : prefill(order, crew, leadWorkerId);
  const ackRows = row
    ? await q("briefing_acks as k")
        .join("workers as w", "w.id", "k.worker_id")
        .leftJoin("users as u", "u.id", "k.recorded_by")
        .where("k.briefing_id", row.id)
        .orderBy("k.acknowledged_at")
        .select("k.*", "w.first_name", "w.last_name", "u.name as recorded_by_name")
    : [];
  const acks: AckView[] = ackRows.map((k) => ({
    workerId: Number(k.worker_id),
    name: `${k.first_name} ${k.last_name}`,
    acknowledgedAt: iso(k.acknowledged_at)!,
    gearCheck: parseGear(k.gear_check),
    inPerson: Boolean(k.in_person),
    recordedBy: k.in_person ? (k.recorded_by_name ?? null) : null,
  }));
  const acked = new Set(acks.map((a) => a.workerId));
  const pending = briefing?.state === "briefed" ? crew.filter((c) => !acked.has(c.workerId)) : crew;
  const history = (await q("briefings").where({ work_order_id: orderId }).orderBy("round").select("round", "state", "completed_at", "reason")).map((h) => ({
    round: Number(h.round),
    state: String(h.state),
    completedAt: iso(h.completed_at),
    reason: h.reason ?? null,
  }));
  return { order, crew, leadWorkerId, briefing, data, acks, pending, history, start: startVerdict(order, briefing, data, pending) };
}

/** Who may do what: 403 for a lineworker not on the crew and for roles that do not see briefings. */
export function modeFor(user: BriefingActor, view: Pick<BriefingView, "crew" | "leadWorkerId">): Mode {
  if (user.role === "lineworker") {
    if (!user.workerId || !view.crew.some((c) => c.workerId === user.workerId)) {
      throw new ApiError(403, "You are not on this order's crew, so its briefing is not yours to open.");
    }
    return user.workerId === view.leadWorkerId ? "lead" : "crew";
  }
  if (user.role === "dispatcher" || user.role === "supervisor") return "viewer";
  throw new ApiError(403, "Briefings are for the crew, dispatchers and supervisors.");
}

// --- writes ----------------------------------------------------------------------------------------

interface Locked {
  order: OrderFacts;
  crew: CrewMember[];
  leadWorkerId: number | null;
  row: Record<string, any> | undefined;
}

async function lockFor(trx: Knex.Transaction, user: BriefingActor, orderId: number): Promise<Locked> {
  const order = await orderFacts(trx, user.organisationId, orderId, true);
  if (!order) throw new ApiError(404, "No such work order.");
  const crew = await orderCrew(trx, orderId);
  const leadWorkerId = await leadOf(trx, orderId, crew);
  const row = await currentRound(trx, orderId, true);
  return { order, crew, leadWorkerId, row };
}

function requireLead(user: BriefingActor, l: Locked) {
  const mode = modeFor(user, l);
  if (mode !== "lead") {
    throw new ApiError(403, l.leadWorkerId ? "Only the crew lead on this order writes the briefing." : "Nobody holds the lead seat on this order; dispatch must place a crew lead.");
  }
}

function checkVersion(l: Locked, version: number) {
  const current = l.row ? Number(l.row.version) : 0;
  if (version !== current) {
    throw new ApiError(409, "Someone saved this briefing after you opened it. Reload to see their changes.", {
      reason: "stale",
      currentVersion: current,
    });
  }
}

/** Updates work_orders.briefing_state from the current round and its acknowledgements. */
export async function refreshBriefingState(trx: Knex.Transaction, orderId: number): Promise<string> {
  const order = await trx("work_orders").where({ id: orderId }).first("id", "organisation_id", "yard_id", "work_date", "briefing_state");
  if (!order) return "not_started";
  const row = await currentRound(trx, orderId);
  let state = "not_started";
  if (row?.state === "on_hold") state = "on_hold";
  else if (row?.state === "briefed") {
    const crew = await orderCrew(trx, orderId);
    const acked = new Set((await trx("briefing_acks").where({ briefing_id: row.id }).pluck("worker_id")).map(Number));
    if (crew.length > 0 && crew.every((c) => acked.has(c.workerId))) state = "briefed";
  }
  if (state !== order.briefing_state) {
    await trx("work_orders").where({ id: orderId }).update({ briefing_state: state, updated_at: new Date() });
  }
  return state;
}

async function tellBoard(trx: Knex.Transaction, order: OrderFacts, payload: Record<string, unknown>) {
  await boardEvent(trx, { organisationId: order.organisationId, yardId: order.yardId, day: order.workDate, kind: "briefing", payload: { orderId: order.id, ...payload } });
}

function cleanData(data: BriefingData, crew: CrewMember[]): BriefingData {
  const ids = new Set(crew.map((c) => c.workerId));
  return { ...data, dropZone: { ...data.dropZone, entrants: [...new Set(data.dropZone.entrants)].filter((w) => ids.has(w)) } };
}

async function assertPhotos(trx: Knex.Transaction, user: BriefingActor, orderId: number, data: BriefingData) {
  // Every pole-check photo must be a photo taken for this order's briefing (lib/files/data.ts
  // assertAttachable): another worker's evidence or another order's photo is refused.
  for (const c of POLE_CHECKS) {
    const id = data.poleCheck.items[c.key].photoFileId;
    if (id !== null) await assertAttachable(trx, user, id, { kind: "briefing_photo", orderId }, `poleCheck.items.${c.key}.photoFileId`);
  }
}

const EDITABLE_STATUSES = new Set(["draft", "planned", "sent", "in_progress"]);

function assertOpen(order: OrderFacts) {
  if (order.status === "on_hold") throw new ApiError(409, `${order.number} is on hold; dispatch lifts the hold before a new briefing.`, { reason: "on_hold" });
  if (!EDITABLE_STATUSES.has(order.status)) throw new ApiError(409, `${order.number} is ${order.status}; its briefing is closed.`, { reason: "closed" });
}

/** Rescue training valid on the work day, and names, for the crew of a briefing (issue 18). */
async function briefingFacts(trx: Knex.Transaction, l: Locked): Promise<BriefingFacts> {
  const ids = l.crew.map((c) => c.workerId);
  const rows = ids.length
    ? await trx("credentials as c")
        .join("qualification_types as q", "q.id", "c.qualification_type_id")
        .whereIn("c.worker_id", ids)
        .where("c.status", "current")
        .whereIn("q.code", [RESCUE_CODES.climb, RESCUE_CODES.aerial])
        .where((w) => w.whereNull("c.expires_on").orWhere("c.expires_on", ">=", l.order.workDate))
        .where("c.issued_on", "<=", l.order.workDate)
        .select("c.worker_id", "q.code")
    : [];
  const rescueTraining = new Map<number, Set<string>>();
  for (const r of rows) rescueTraining.set(Number(r.worker_id), (rescueTraining.get(Number(r.worker_id)) ?? new Set()).add(String(r.code)));
  return { ruleType: l.order.ruleType, rescueTraining, names: new Map(l.crew.map((c) => [c.workerId, c.name])) };
}

/** Save a draft or complete the current round. */
export async function saveBriefing(
  db: Knex,
  user: BriefingActor,
  orderId: number,
  input: { action: "save" | "complete"; version: number; data: BriefingData },
) {
  return db.transaction(async (trx) => {
    const l = await lockFor(trx, user, orderId);
    requireLead(user, l);
    assertOpen(l.order);
    checkVersion(l, input.version);
    if (l.row && l.row.state === "briefed") {
      throw new ApiError(409, "This briefing is complete. If conditions changed, start a re-brief.", { reason: "completed" });
    }
    if (l.row && l.row.state === "on_hold") throw new ApiError(409, "This briefing is on hold.", { reason: "on_hold" });
    const data = cleanData(input.data, l.crew);
    await assertPhotos(trx, user, orderId, data);
    if (input.action === "complete") {
      const seats = l.crew.flatMap((c) => c.positions.map((p) => ({ workerId: c.workerId, position: p })));
      const issues = completionIssues(data, seats);
      // Issue 18: a trained rescuer, a caller on the ground, and not before the evening before.
      issues.push(...emergencyRoleIssues(data.emergency, seats, await briefingFacts(trx, l)));
      const early = completionTooEarly(Date.now(), l.order.workDate, l.order.timezone);
      if (early) issues.push({ field: "action", message: early });
      if (issues.length) throw new ApiError(422, `Not complete: ${issues[0].message}.`, { issues });
    }
    const now = new Date();
    const state = input.action === "complete" ? "briefed" : "draft";
    let id: number;
    let round: number;
    if (!l.row) {
      round = 1;
      [id] = await trx("briefings").insert({
        work_order_id: orderId,
        round,
        lead_worker_id: l.leadWorkerId,
        state,
        data: JSON.stringify(data),
        completed_at: state === "briefed" ? now : null,
        version: 1,
        updated_at: now,
        updated_by: user.id,
      });
    } else {
      id = Number(l.row.id);
      round = Number(l.row.round);
      await trx("briefings")
        .where({ id })
        .update({
          lead_worker_id: l.leadWorkerId,
          state,
          data: JSON.stringify(data),
          completed_at: state === "briefed" ? now : null,
          version: Number(l.row.version) + 1,
          updated_at: now,
          updated_by: user.id,
        });
    }
    await audit(trx, user, user.organisationId, input.action === "complete" ? "briefing.complete" : "briefing.save", "briefing", id, {
      order: l.order.number,
      round,
      ...(input.action === "complete" ? { poleCheck: poleCheckPasses(data) ? "pass" : `fail: ${failedChecks(data).join(", ")} → ${data.poleCheck.failAction}` } : {}),
    });
    const boardState = await refreshBriefingState(trx, orderId);
    if (input.action === "complete") await tellBoard(trx, l.order, { round, state: boardState, action: "complete" });
    return { id, round, state };
  });
}

/** A new round after conditions changed: data carried over, acknowledgements start again. */
export async function rebrief(db: Knex, user: BriefingActor, orderId: number, input: { version: number; reason: string }) {
  return db.transaction(async (trx) => {
    const l = await lockFor(trx, user, orderId);
    requireLead(user, l);
    assertOpen(l.order);
    checkVersion(l, input.version);
    if (!l.row) throw new ApiError(409, "There is no briefing yet to repeat; hold the first one.", { reason: "none" });
    if (l.row.state === "draft") throw new ApiError(409, "The current briefing is still a draft; change it and complete it.", { reason: "draft" });
    const round = Number(l.row.round) + 1;
    const data = parseData(l.row.data);
    const now = new Date();
    const [id] = await trx("briefings").insert({
      work_order_id: orderId,
      round,
      lead_worker_id: l.leadWorkerId,
      state: "draft",
      data: JSON.stringify(data),
      version: 1,
      updated_at: now,
      updated_by: user.id,
      reason: input.reason,
    });
    await audit(trx, user, user.organisationId, "briefing.rebrief", "briefing", id, { order: l.order.number, round, reason: input.reason });
    const state = await refreshBriefingState(trx, orderId);
    await tellBoard(trx, l.order, { round, state, action: "rebrief" });
    return { id, round, state: "draft" as const };
  });
}

async function dispatcherRecipients(trx: Knex.Transaction, order: OrderFacts) {
  const yard = await trx("yards").where({ id: order.yardId }).first("dispatcher_phone");
  const org = await trx("organisations").where({ id: order.organisationId }).first("dispatcher_phone");
  const phone: string | null = yard?.dispatcher_phone || org?.dispatcher_phone || null;
  const users = await trx("users")
    .where({ organisation_id: order.organisationId, role: "dispatcher", active: true })
    .select("email", "home_yard_id");
  const mine = users.filter((u) => u.home_yard_id === null || Number(u.home_yard_id) === order.yardId);
  const emails = [...new Set((mine.length ? mine : users).map((u) => String(u.email)))];
  return { phone, emails };
}

function holdMessages(order: OrderFacts, briefingId: number, round: number, reason: string, leadName: string, failed: string[], to: { phone: string | null; emails: string[] }): OutboxInput[] {
  const pole = order.structureNo ? `pole ${order.structureNo}` : "the pole";
  const link = `${appPublicUrl()}/orders/${order.id}/briefing`;
  const rows: OutboxInput[] = [];
  const key = `hold:${briefingId}:${round}`;
  if (to.phone) {
    // At most two GSM-7 segments (306 characters): the reason is shortened, the link never.
    const head = toGsm7(`Gaffline HOLD ${order.number}, ${pole}${order.address ? `, ${order.address}` : ""}: `);
    const tail = toGsm7(` Lead ${leadName}. Nobody climbs. ${link}`);
    // toGsm7 trims each piece, so the spaces between them are put back here.
    const room = Math.max(40, 300 - head.length - tail.length - 2);
    const why = toGsm7(reason);
    const sms = `${head} ${why.length > room ? `${why.slice(0, room - 3)}...` : why} ${tail}`;
    rows.push({
      organisationId: order.organisationId,
      channel: "sms",
      kind: "hold",
      to: to.phone,
      body: sms,
      dedupeKey: `${key}:sms:${to.phone}`,
    });
  }
  const lines = [
    `${leadName}, crew lead on ${order.number}, has put the order on hold.`,
    "",
    `Order: ${order.number} ${order.title}`,
    `Where: ${[order.address, order.structureNo ? `pole ${order.structureNo}` : null].filter(Boolean).join(", ") || "-"}`,
    `Reason: ${reason}`,
    failed.length ? `Failed pole checks: ${failed.join(", ")}` : null,
    "",
    "Nobody can mark the work started while the order is on hold. Replace or secure the pole, then lift the hold on the briefing page:",
    link,
  ].filter((l): l is string => l !== null);
  for (const email of to.emails) {
    rows.push({
      organisationId: order.organisationId,
      channel: "email",
      kind: "hold",
      to: email,
      subject: `On hold: ${order.number}, ${pole} (${order.yardName})`,
      body: lines.join("\n"),
      dedupeKey: `${key}:email:${email}`,
    });
  }
  return rows;
}

/** The lead holds the order: saved with the data, the order goes on hold, dispatch is told. */
export async function holdOrder(db: Knex, user: BriefingActor, orderId: number, input: { version: number; data: BriefingData; reason: string }) {
  return db.transaction(async (trx) => {
    const l = await lockFor(trx, user, orderId);
    requireLead(user, l);
    if (l.order.status === "on_hold") throw new ApiError(409, `${l.order.number} is already on hold.`, { reason: "on_hold" });
    if (!EDITABLE_STATUSES.has(l.order.status)) throw new ApiError(409, `${l.order.number} is ${l.order.status}.`, { reason: "closed" });
    checkVersion(l, input.version);
    const data = cleanData(input.data, l.crew);
    await assertPhotos(trx, user, orderId, data);
    const failed = failedChecks(data);
    if (failed.length) data.poleCheck.failAction = "hold";
    const now = new Date();
    let id: number;
    let round: number;
    const columns = {
      lead_worker_id: l.leadWorkerId,
      state: "on_hold",
      data: JSON.stringify(data),
      updated_at: now,
      updated_by: user.id,
      hold_prev_status: l.order.status,
    };
    if (!l.row || l.row.state === "on_hold") {
      round = l.row ? Number(l.row.round) + 1 : 1;
      [id] = await trx("briefings").insert({ ...columns, work_order_id: orderId, round, version: 1 });
    } else {
      id = Number(l.row.id);
      round = Number(l.row.round);
      await trx("briefings").where({ id }).update({ ...columns, version: Number(l.row.version) + 1 });
    }
    const reason = input.reason.slice(0, 500);
    await trx("work_orders")
      .where({ id: orderId })
      .update({ status: "on_hold", hold_reason: reason, briefing_state: "on_hold", version: l.order.version + 1, updated_at: now });
    const lead = l.crew.find((c) => c.workerId === l.leadWorkerId);
    const failedLabels = failed.map((k) => POLE_CHECKS.find((c) => c.key === k)!.label);
    const queued = await enqueue(trx, holdMessages(l.order, id, round, reason, lead?.name ?? user.name ?? "The crew lead", failedLabels, await dispatcherRecipients(trx, l.order)));
    await audit(trx, user, user.organisationId, "briefing.hold", "work_order", orderId, {
      order: l.order.number,
      round,
      reason,
      failed,
      previousStatus: l.order.status,
      notifications: queued,
    });
    await tellBoard(trx, l.order, { round, state: "on_hold", action: "hold" });
    await boardEvent(trx, { organisationId: l.order.organisationId, yardId: l.order.yardId, day: l.order.workDate, kind: "order", payload: { orderId, status: "on_hold" } });
    return { id, round, state: "on_hold" as const, notifications: queued };
  });
}

/** Dispatch lifts a briefing hold: the order goes back to where it was; the lead briefs anew. */
export async function liftHold(db: Knex, user: BriefingActor, orderId: number, input: { note: string }) {
  return db.transaction(async (trx) => {
    const l = await lockFor(trx, user, orderId);
    if (user.role !== "dispatcher" && user.role !== "supervisor") throw new ApiError(403, "Dispatch lifts a hold.");
    if (l.order.status !== "on_hold" || !l.row || l.row.state !== "on_hold") {
      throw new ApiError(409, `${l.order.number} is not held by its briefing.`, { reason: "not_held" });
    }
    const back = l.row.hold_prev_status && l.row.hold_prev_status !== "on_hold" ? String(l.row.hold_prev_status) : "planned";
    const now = new Date();
    const data = parseData(l.row.data);
    data.poleCheck.failAction = null;
    data.poleCheck.failActionNotes = "";
    // The pole is to be checked again: the failed items are cleared for the new round.
    for (const c of POLE_CHECKS) if (data.poleCheck.items[c.key].result === "fail") data.poleCheck.items[c.key].result = null;
    const round = Number(l.row.round) + 1;
    const [id] = await trx("briefings").insert({
      work_order_id: orderId,
      round,
      lead_worker_id: l.leadWorkerId,
      state: "draft",
      data: JSON.stringify(data),
      version: 1,
      updated_at: now,
      updated_by: user.id,
      reason: `Hold lifted: ${input.note}`.slice(0, 500),
    });
    await trx("work_orders").where({ id: orderId }).update({ status: back, hold_reason: null, briefing_state: "not_started", version: l.order.version + 1, updated_at: now });
    await audit(trx, user, user.organisationId, "briefing.lift_hold", "work_order", orderId, { order: l.order.number, note: input.note, status: back, round });
    await tellBoard(trx, l.order, { round, state: "not_started", action: "lift" });
    await boardEvent(trx, { organisationId: l.order.organisationId, yardId: l.order.yardId, day: l.order.workDate, kind: "order", payload: { orderId, status: back } });
    return { id, round, status: back };
  });
}

/** A crew member acknowledges the current round with their gear check; the lead may record one given in person. */
export async function acknowledge(db: Knex, user: BriefingActor, orderId: number, input: { round: number; workerId?: number; gearCheck: GearCheck }) {
  return db.transaction(async (trx) => {
    const l = await lockFor(trx, user, orderId);
    if (user.role !== "lineworker") throw new ApiError(403, "Crew members acknowledge their own briefing.");
    const mode = modeFor(user, l);
    const target = input.workerId ?? user.workerId!;
    const inPerson = target !== user.workerId;
    if (inPerson && mode !== "lead") throw new ApiError(403, "You can acknowledge only for yourself.");
    const member = l.crew.find((c) => c.workerId === target);
    if (!member) throw new ApiError(422, "That person is not on this crew.", { issues: [{ field: "workerId", message: "Not on this crew" }] });
    if (!l.row || l.row.state !== "briefed") {
      throw new ApiError(409, l.row?.state === "on_hold" ? "The order is on hold." : "The crew lead has not completed the briefing yet.", { reason: "not_briefed" });
    }
    if (Number(l.row.round) !== input.round) {
      throw new ApiError(409, "The crew lead started a new briefing since you opened it. Read it again, then acknowledge.", { reason: "new_round", round: Number(l.row.round) });
    }
    const gear = gearCheckSchema({ workDate: l.order.workDate, climbing: member.climbs }).safeParse(input.gearCheck);
    if (!gear.success) {
      const issues = gear.error.issues.map((i) => ({ field: `gearCheck.${i.path.map(String).join(".")}`, message: i.message }));
      throw new ApiError(422, `Gear check: ${issues[0].message}.`, { issues });
    }
    const existing = await trx("briefing_acks").where({ briefing_id: l.row.id, worker_id: target }).first("id", "acknowledged_at");
    if (existing) return { unchanged: true, acknowledgedAt: iso(existing.acknowledged_at), boardState: l.order.briefingState };
    const now = new Date();
    await trx("briefing_acks").insert({
      briefing_id: l.row.id,
      worker_id: target,
      gear_check: JSON.stringify(gear.data),
      acknowledged_at: now,
      recorded_by: inPerson ? user.id : null,
      in_person: inPerson,
    });
    await audit(trx, user, user.organisationId, "briefing.ack", "briefing", Number(l.row.id), {
      order: l.order.number,
      round: Number(l.row.round),
      workerId: target,
      inPerson,
    });
    const boardState = await refreshBriefingState(trx, orderId);
    await tellBoard(trx, l.order, { round: Number(l.row.round), state: boardState, action: "ack", workerId: target });
    return { unchanged: false, acknowledgedAt: now.toISOString(), boardState };
  });
}

/** The lead marks the work (the climb) started: refused while on hold or without a pole-check pass. */
export async function startWork(db: Knex, user: BriefingActor, orderId: number, input: { round: number }) {
  return db.transaction(async (trx) => {
    const l = await lockFor(trx, user, orderId);
    requireLead(user, l);
    const data = l.row ? parseData(l.row.data) : emptyBriefing();
    const briefing = l.row ? roundView(l.row) : null;
    let pending: CrewMember[] = l.crew;
    if (l.row && l.row.state === "briefed") {
      const acked = new Set((await trx("briefing_acks").where({ briefing_id: l.row.id }).pluck("worker_id")).map(Number));
      pending = l.crew.filter((c) => !acked.has(c.workerId));
    }
    const verdict = startVerdict(l.order, briefing, data, pending);
    if (!verdict.allowed) throw new ApiError(409, verdict.reason ?? "Not now.", { reason: "refused" });
    if (briefing && briefing.round !== input.round) throw new ApiError(409, "A newer briefing round exists; reload.", { reason: "new_round" });
    const now = new Date();
    await trx("work_orders").where({ id: orderId }).update({ status: "in_progress", actual_start_at: now, version: l.order.version + 1, updated_at: now });
    await audit(trx, user, user.organisationId, "briefing.start", "work_order", orderId, { order: l.order.number, round: briefing?.round, at: now.toISOString() });
    await tellBoard(trx, l.order, { action: "start", state: l.order.briefingState });
    await boardEvent(trx, { organisationId: l.order.organisationId, yardId: l.order.yardId, day: l.order.workDate, kind: "order", payload: { orderId, status: "in_progress" } });
    return { status: "in_progress", actualStartAt: now.toISOString() };
  });
}

/** Files referenced by any round of this order's briefing (pole-check photos). */
export async function briefingPhotoIds(q: Q, orderId: number): Promise<Set<number>> {
  const rows = await q("briefings").where({ work_order_id: orderId }).select("data");
  const ids = new Set<number>();
  for (const r of rows) {
    const d = parseData(r.data);
    for (const c of POLE_CHECKS) {
      const f = d.poleCheck.items[c.key].photoFileId;
      if (f) ids.add(f);
    }
  }
  return ids;
}

/** For My week: briefings waiting for this worker's acknowledgement. */
export async function briefingsToAcknowledge(q: Q, workerId: number, since: Date) {
  const rows = await q("briefings as b")
    .join("work_orders as o", "o.id", "b.work_order_id")
    .join("assignments as a", function () {
      this.on("a.work_order_id", "=", "o.id").andOn("a.worker_id", "=", q.raw("?", [workerId]));
    })
    .whereNotNull("a.holds_position")
    .where("b.state", "briefed")
    .where("o.end_at", ">=", since)
    .whereRaw("b.round = (SELECT MAX(b2.round) FROM briefings b2 WHERE b2.work_order_id = b.work_order_id)")
    .whereNotExists(q("briefing_acks as k").whereRaw("k.briefing_id = b.id").where("k.worker_id", workerId))
    .distinct("o.id", "o.number", "o.title", "b.round", "b.completed_at", "b.lead_worker_id");
  return rows.map((r) => ({
    orderId: Number(r.id),
    number: String(r.number),
    title: String(r.title),
    round: Number(r.round),
    completedAt: iso(r.completed_at),
    leadWorkerId: num(r.lead_worker_id),
  }));
}
