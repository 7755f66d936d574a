import "@/lib/server-only";
import type { Knex } from "knex";
import { ApiError } from "@/lib/api/http";
import { audit, type Actor } from "@/lib/audit/data";
import { boardEvent } from "@/lib/events/data";
import { todayIn } from "@/lib/time/days";
import { parseGearCsv, planGearImport, type GearIssue, type GearLookups, type RawGearRow } from "./csv";
import { gearState, inGearView, type GearClass, type GearCreate, type GearItem, type GearKind, type GearPatch, type GearQuery, type RuleGear } from "./model";
import { toRuleLift, type LiftConfirm, type LiftPlan, type LiftPlanBody, type RiggingChoice } from "./lift";

// Data access for rubber goods and lift plans (Knex). Every write: one transaction, an audit
// row, and a board event (gear can change RUBBER_GOODS on any day; a lift plan its order's
// RIGGING), so an open board re-checks.

type Q = Knex | Knex.Transaction;
const iso = (v: unknown) => (v instanceof Date ? v.toISOString() : v ? new Date(String(v)).toISOString() : null);
const day = (v: unknown): string | null => (v === null || v === undefined ? null : v instanceof Date ? v.toISOString().slice(0, 10) : String(v).slice(0, 10));

function gearQuery(q: Q, organisationId: number) {
  return q("rubber_goods as g")
    .join("workers as w", "w.id", "g.worker_id")
    .join("yards as y", "y.id", "w.yard_id")
    .where("g.organisation_id", organisationId)
    .select(
      "g.id",
      "g.worker_id",
      "w.first_name",
      "w.last_name",
      "w.employee_no",
      "y.code as yard_code",
      "y.timezone",
      "g.kind",
      "g.class",
      "g.size",
      "g.serial",
      "g.tested_on",
      "g.issued_on",
      "g.retired_on",
      "g.note",
      "g.version",
    );
}

function toItem(r: Record<string, any>, now: Date): GearItem {
  const testedOn = day(r.tested_on)!;
  const retiredOn = day(r.retired_on);
  const st = gearState({ kind: r.kind, testedOn, retiredOn }, todayIn(r.timezone, now));
  return {
    id: Number(r.id),
    workerId: Number(r.worker_id),
    workerName: `${r.first_name} ${r.last_name}`,
    employeeNo: r.employee_no,
    yardCode: r.yard_code,
    kind: r.kind,
    class: r.class,
    size: r.size ?? null,
    serial: r.serial,
    testedOn,
    issuedOn: day(r.issued_on),
    retiredOn,
    note: r.note ?? null,
    version: Number(r.version),
    dueOn: st.dueOn,
    daysLeft: st.daysLeft,
    state: st.state,
  };
}

/** The desk's list: filtered by view (in service, due, overdue, retired), yard, worker, name. Due first. */
export async function listGear(db: Q, organisationId: number, f: GearQuery, now = new Date()): Promise<GearItem[]> {
  const q = gearQuery(db, organisationId);
  if (f.workerId) q.where("g.worker_id", f.workerId);
  if (f.yard) q.where("y.code", f.yard);
  if (f.q) {
    const like = `%${f.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    q.where((w) => w.whereRaw("CONCAT(w.first_name, ' ', w.last_name) LIKE ?", [like]).orWhere("w.employee_no", "like", like).orWhere("g.serial", "like", like));
  }
  const rows = (await q.orderBy([{ column: "g.tested_on" }, { column: "g.id" }])).map((r) => toItem(r, now));
  return rows.filter((r) => inGearView(r, f.view)).sort((a, b) => (a.dueOn < b.dueOn ? -1 : a.dueOn > b.dueOn ? 1 : a.id - b.id));
}

export async function getGear(db: Q, organisationId: number, id: number, now = new Date()): Promise<GearItem | null> {
  const r = await gearQuery(db, organisationId).where("g.id", id).first();
  return r ? toItem(r, now) : null;
}

async function workerInOrg(q: Q, organisationId: number, workerId: number) {
  const w = await q("workers as w")
    .join("yards as y", "y.id", "w.yard_id")
    .where({ "w.id": workerId, "w.organisation_id": organisationId })
    .first("w.id", "w.first_name", "w.last_name", "w.employee_no", "y.timezone");
  return w ?? null;
}

const unprocessable = (field: string, message: string) => new ApiError(422, `Invalid ${field}: ${message}`, { issues: [{ field, message }] });

async function serialTaken(q: Q, organisationId: number, serial: string, exceptId?: number) {
  const r = await q("rubber_goods").where({ organisation_id: organisationId, serial }).first("id", "worker_id");
  return r && Number(r.id) !== exceptId ? r : null;
}

/** HR records a pair of gloves or sleeves. */
export async function createGear(db: Knex, actor: Actor, input: GearCreate, now = new Date()): Promise<GearItem> {
  return db.transaction(async (trx) => {
    const w = await workerInOrg(trx, actor.organisationId, input.workerId);
    if (!w) throw unprocessable("workerId", "no such worker");
    const today = todayIn(w.timezone, now);
    if (input.testedOn > today) throw unprocessable("testedOn", `after today (${today})`);
    if (await serialTaken(trx, actor.organisationId, input.serial)) throw unprocessable("serial", "already on record (serials are unique)");
    const [id] = await trx("rubber_goods").insert({
      organisation_id: actor.organisationId,
      worker_id: input.workerId,
      kind: input.kind,
      class: input.class,
      size: input.size || null,
      serial: input.serial,
      tested_on: input.testedOn,
      issued_on: input.issuedOn ?? null,
      note: input.note || null,
      updated_by: actor.id,
    });
    await audit(trx, actor, actor.organisationId, "gear.create", "rubber_goods", id, {
      workerId: input.workerId,
      kind: input.kind,
      class: input.class,
      serial: input.serial,
      testedOn: input.testedOn,
    });
    await boardEvent(trx, { organisationId: actor.organisationId, kind: "credential", day: null, payload: { gear: id, workerId: input.workerId } });
    return (await getGear(trx, actor.organisationId, id, now))!;
  });
}

/** HR records a new test date, corrects an item, or retires it. Versioned: a stale edit is 409. */
export async function patchGear(db: Knex, actor: Actor, id: number, patch: GearPatch, now = new Date()): Promise<GearItem> {
  return db.transaction(async (trx) => {
    const cur = await trx("rubber_goods").where({ id, organisation_id: actor.organisationId }).forUpdate().first();
    if (!cur) throw new ApiError(404, "No such item.");
    if (Number(cur.version) !== patch.version) {
      throw new ApiError(409, "Someone changed this item since you opened it; reload to see the current record.", {
        current: await getGear(trx, actor.organisationId, id, now),
      });
    }
    const w = await workerInOrg(trx, actor.organisationId, Number(cur.worker_id));
    const today = todayIn(w?.timezone ?? "UTC", now);
    if (patch.testedOn && patch.testedOn > today) throw unprocessable("testedOn", `after today (${today})`);
    if (patch.serial && (await serialTaken(trx, actor.organisationId, patch.serial, id))) throw unprocessable("serial", "already on record (serials are unique)");
    const issuedOn = patch.issuedOn !== undefined ? patch.issuedOn : day(cur.issued_on);
    const retiredOn = patch.retiredOn !== undefined ? patch.retiredOn : day(cur.retired_on);
    if (issuedOn && retiredOn && retiredOn < issuedOn) throw unprocessable("retiredOn", "before the issue date");
    const changes: Record<string, unknown> = {};
    if (patch.kind !== undefined) changes.kind = patch.kind;
    if (patch.class !== undefined) changes.class = patch.class;
    if (patch.size !== undefined) changes.size = patch.size || null;
    if (patch.serial !== undefined) changes.serial = patch.serial;
    if (patch.testedOn !== undefined) changes.tested_on = patch.testedOn;
    if (patch.issuedOn !== undefined) changes.issued_on = patch.issuedOn;
    if (patch.retiredOn !== undefined) changes.retired_on = patch.retiredOn;
    if (patch.note !== undefined) changes.note = patch.note || null;
    await trx("rubber_goods")
      .where({ id })
      .update({ ...changes, version: Number(cur.version) + 1, updated_by: actor.id, updated_at: trx.fn.now(3) });
    await audit(trx, actor, actor.organisationId, patch.retiredOn ? "gear.retire" : "gear.update", "rubber_goods", id, {
      workerId: Number(cur.worker_id),
      serial: cur.serial,
      changes,
    });
    await boardEvent(trx, { organisationId: actor.organisationId, kind: "credential", day: null, payload: { gear: id, workerId: Number(cur.worker_id) } });
    return (await getGear(trx, actor.organisationId, id, now))!;
  });
}

/**
 * Every listed worker's rubber goods in service on `onDay` (not retired by then), in the rule
 * snapshot's shape. Every worker asked for gets an entry: an empty list when they have none.
 */
export async function gearForSnapshot(q: Q, workerIds: number[], onDay?: string): Promise<Map<number, RuleGear[]>> {
  const out = new Map<number, RuleGear[]>(workerIds.map((id) => [id, []]));
  if (!workerIds.length) return out;
  const rows = await q("rubber_goods")
    .whereIn("worker_id", workerIds)
    .where((w) => {
      w.whereNull("retired_on");
      if (onDay) w.orWhere("retired_on", ">", onDay);
    })
    .orderBy([{ column: "worker_id" }, { column: "id" }])
    .select("worker_id", "kind", "class", "tested_on");
  for (const r of rows) {
    out.get(Number(r.worker_id))?.push({ kind: r.kind as GearKind, class: r.class as GearClass, testedOn: day(r.tested_on)! });
  }
  return out;
}

// --- CSV import -------------------------------------------------------------------------------

export interface GearImportResult {
  ok: boolean;
  dryRun: boolean;
  rows: number;
  created: number;
  updated: number;
  unchanged: number;
  issues: GearIssue[];
  issueCount: number;
  ignoredColumns: string[];
}

async function importLookups(q: Q, organisationId: number, rows: RawGearRow[], now: Date, lock: boolean): Promise<GearLookups> {
  const nos = [...new Set(rows.map((r) => (r.employee_no ?? "").trim()).filter(Boolean))];
  const workers = nos.length
    ? await q("workers as w")
        .join("yards as y", "y.id", "w.yard_id")
        .where("w.organisation_id", organisationId)
        .whereIn("w.employee_no", nos)
        .select("w.id", "w.employee_no", "y.timezone")
    : [];
  const serials = [...new Set(rows.map((r) => (r.serial ?? "").trim()).filter(Boolean))];
  const existing: Record<string, any>[] = [];
  for (let i = 0; i < serials.length; i += 1000) {
    const eq = q("rubber_goods").where("organisation_id", organisationId).whereIn("serial", serials.slice(i, i + 1000)).select("*");
    if (lock) eq.forUpdate();
    existing.push(...(await eq));
  }
  return {
    workers: new Map(workers.map((w) => [String(w.employee_no).toLowerCase(), { id: Number(w.id), today: todayIn(String(w.timezone), now) }])),
    existing: new Map(
      existing.map((e) => [
        String(e.serial).toLowerCase(),
        {
          id: Number(e.id),
          serial: String(e.serial),
          workerId: Number(e.worker_id),
          kind: e.kind,
          class: e.class,
          size: e.size ?? null,
          testedOn: day(e.tested_on)!,
          issuedOn: day(e.issued_on),
          retiredOn: day(e.retired_on),
        },
      ]),
    ),
  };
}

/** All-or-nothing: every row is checked first; nothing is written unless all pass. */
export async function importGear(db: Knex, actor: Actor, csv: string, opts: { dryRun: boolean; now?: Date }): Promise<GearImportResult> {
  const now = opts.now ?? new Date();
  const parsed = parseGearCsv(csv);
  const base = { dryRun: opts.dryRun, rows: parsed.rows.length, ignoredColumns: parsed.ignoredColumns };
  const fail = (issues: GearIssue[]): GearImportResult => ({ ...base, ok: false, created: 0, updated: 0, unchanged: 0, issues: issues.slice(0, 500), issueCount: issues.length });
  if (parsed.issues.length) return fail(parsed.issues);
  const run = async (q: Q) => {
    const { issues, plan } = planGearImport(parsed.rows, await importLookups(q, actor.organisationId, parsed.rows, now, !opts.dryRun));
    return { issues, plan };
  };
  const count = (plan: Awaited<ReturnType<typeof run>>["plan"]) => ({
    created: plan.filter((p) => p.action === "create").length,
    updated: plan.filter((p) => p.action === "update").length,
    unchanged: plan.filter((p) => p.action === "unchanged").length,
  });
  if (opts.dryRun) {
    const { issues, plan } = await run(db);
    if (issues.length) return fail(issues);
    return { ...base, ok: true, issues: [], issueCount: 0, ...count(plan) };
  }
  return db.transaction(async (trx) => {
    const { issues, plan } = await run(trx);
    if (issues.length) return fail(issues);
    const c = count(plan);
    for (const p of plan) {
      if (p.action === "unchanged") continue;
      const values = {
        worker_id: p.workerId,
        kind: p.kind,
        class: p.class,
        size: p.size,
        tested_on: p.testedOn,
        issued_on: p.issuedOn,
        retired_on: p.retiredOn,
        updated_by: actor.id,
      };
      if (p.action === "create") {
        await trx("rubber_goods").insert({ ...values, organisation_id: actor.organisationId, serial: p.serial, note: `Imported from CSV, line ${p.line}` });
      } else {
        await trx("rubber_goods")
          .where({ id: p.id })
          .update({ ...values, version: trx.raw("version + 1"), updated_at: trx.fn.now(3) });
      }
    }
    if (c.created || c.updated) {
      await audit(trx, actor, actor.organisationId, "gear.import", "rubber_goods", null, {
        ...c,
        serials: plan.filter((p) => p.action !== "unchanged").slice(0, 200).map((p) => p.serial),
      });
      await boardEvent(trx, { organisationId: actor.organisationId, kind: "credential", day: null, payload: { gearImport: c } });
    }
    return { ...base, ok: true, issues: [], issueCount: 0, ...c };
  });
}

// --- lift plans -------------------------------------------------------------------------------

function toPlan(r: Record<string, any>): LiftPlan {
  const num = (v: unknown) => (v === null || v === undefined ? null : Number(v));
  return {
    id: Number(r.id),
    workOrderId: Number(r.work_order_id),
    loadLabel: r.load_label ?? null,
    loadLb: Number(r.load_lb),
    partsOfLine: Number(r.parts_of_line),
    sheaves: Number(r.sheaves),
    frictionPerSheave: Number(r.friction_per_sheave),
    blockRiggingId: num(r.block_rigging_id),
    blockWllLb: num(r.block_wll_lb),
    lineRiggingId: num(r.line_rigging_id),
    lineWllLb: num(r.line_wll_lb),
    slingRiggingId: num(r.sling_rigging_id),
    slingWllLb: num(r.sling_wll_lb),
    slingLegs: Number(r.sling_legs),
    slingAngleDeg: Number(r.sling_angle_deg),
    note: r.note ?? null,
    version: Number(r.version),
    updatedAt: iso(r.updated_at),
    siteWeightLb: num(r.site_weight_lb),
    confirmedBy: r.confirmed_name ?? null,
    confirmedAt: iso(r.confirmed_at),
    confirmedStale: r.confirmed_at != null && Number(r.confirmed_version) !== Number(r.version),
  };
}

function planQuery(q: Q) {
  return q("lift_plans as l")
    .leftJoin("users as u", "u.id", "l.confirmed_by")
    .select("l.*", "u.name as confirmed_name");
}

/** The order (in the organisation) the plan belongs to, or 404. */
async function orderOf(q: Q, organisationId: number, orderId: number, lock = false) {
  const oq = q("work_orders").where({ id: orderId, organisation_id: organisationId }).first("id", "yard_id", "work_date", "number", "status");
  if (lock) oq.forUpdate();
  const o = await oq;
  if (!o) throw new ApiError(404, "No such work order.");
  return o as { id: number; yard_id: number; work_date: string; number: string; status: string };
}

export async function getLiftPlan(q: Q, organisationId: number, orderId: number): Promise<LiftPlan | null> {
  await orderOf(q, organisationId, orderId);
  const r = await planQuery(q).where("l.work_order_id", orderId).first();
  return r ? toPlan(r) : null;
}

/** Lift plans of several orders (the rule snapshot), in the engine's input shape. */
export async function liftsForOrders(q: Q, orderIds: number[]): Promise<Map<number, ReturnType<typeof toRuleLift>>> {
  const out = new Map<number, ReturnType<typeof toRuleLift>>();
  if (!orderIds.length) return out;
  const rows = await q("lift_plans").whereIn("work_order_id", orderIds).select("*");
  for (const r of rows) out.set(Number(r.work_order_id), toRuleLift(toPlan(r)));
  return out;
}

/** The rigging the order's booked equipment carries (EQUIP-16's register). */
export async function riggingChoices(q: Q, orderId: number): Promise<RiggingChoice[]> {
  const rows = await q("equipment_assignments as ea")
    .join("equipment as e", "e.id", "ea.equipment_id")
    .join("equipment_rigging as r", "r.equipment_id", "e.id")
    .where("ea.work_order_id", orderId)
    .orderBy([{ column: "e.unit_number" }, { column: "r.kind" }, { column: "r.id" }])
    .select("r.id", "r.equipment_id", "e.unit_number", "r.kind", "r.label", "r.parts_of_line", "r.sheaves", "r.wll_lb", "r.inspected_on");
  return rows.map((r) => ({
    id: Number(r.id),
    equipmentId: Number(r.equipment_id),
    unitNumber: r.unit_number,
    kind: r.kind,
    label: r.label,
    partsOfLine: r.parts_of_line === null ? null : Number(r.parts_of_line),
    sheaves: r.sheaves === null ? null : Number(r.sheaves),
    wllLb: Number(r.wll_lb),
    inspectedOn: day(r.inspected_on),
  }));
}

/**
 * Saves the order's lift plan (creates it, or replaces it when `version` matches). A rigging
 * item chosen from the truck supplies its WLL (and a block its parts of line and sheaves unless
 * given); it must be on equipment booked to this order.
 */
export async function putLiftPlan(db: Knex, actor: Actor, orderId: number, body: LiftPlanBody): Promise<LiftPlan> {
  return db.transaction(async (trx) => {
    const order = await orderOf(trx, actor.organisationId, orderId, true);
    const cur = await trx("lift_plans").where({ work_order_id: orderId }).forUpdate().first();
    if (cur && body.version !== undefined && Number(cur.version) !== body.version) {
      throw new ApiError(409, "Someone changed this lift plan since you opened it; reload to see the current plan.", {
        current: toPlan((await planQuery(trx).where("l.work_order_id", orderId).first())!),
      });
    }
    if (cur && body.version === undefined) throw unprocessable("version", "the plan exists: send the version you edited");
    const choices = new Map((await riggingChoices(trx, orderId)).map((c) => [c.id, c]));
    const pick = (field: string, id: number | null | undefined, kind: RiggingChoice["kind"]) => {
      if (id === null || id === undefined) return null;
      const c = choices.get(id);
      if (!c) throw unprocessable(field, "not rigging carried by equipment on this order");
      if (c.kind !== kind) throw unprocessable(field, `that item is a ${c.kind.replace("_", " ")}`);
      return c;
    };
    const block = pick("blockRiggingId", body.blockRiggingId, "rope_block");
    const line = pick("lineRiggingId", body.lineRiggingId, "hand_line");
    const sling = pick("slingRiggingId", body.slingRiggingId, "sling");
    const partsOfLine = body.partsOfLine;
    const row = {
      load_label: body.loadLabel || null,
      load_lb: body.loadLb,
      parts_of_line: partsOfLine,
      sheaves: body.sheaves ?? block?.sheaves ?? partsOfLine,
      friction_per_sheave: body.frictionPerSheave ?? 0.1,
      block_rigging_id: block?.id ?? null,
      block_wll_lb: block?.wllLb ?? body.blockWllLb ?? null,
      line_rigging_id: line?.id ?? null,
      line_wll_lb: line?.wllLb ?? body.lineWllLb ?? null,
      sling_rigging_id: sling?.id ?? null,
      sling_wll_lb: sling?.wllLb ?? body.slingWllLb ?? null,
      sling_legs: body.slingLegs,
      sling_angle_deg: body.slingAngleDeg,
      note: body.note || null,
      updated_by: actor.id,
      updated_at: trx.fn.now(3),
    };
    if (cur) await trx("lift_plans").where({ id: cur.id }).update({ ...row, version: Number(cur.version) + 1 });
    else await trx("lift_plans").insert({ ...row, work_order_id: orderId });
    const saved = toPlan((await planQuery(trx).where("l.work_order_id", orderId).first())!);
    await audit(trx, actor, actor.organisationId, cur ? "lift_plan.update" : "lift_plan.create", "work_order", orderId, {
      number: order.number,
      loadLb: saved.loadLb,
      partsOfLine: saved.partsOfLine,
      blockWllLb: saved.blockWllLb,
      lineWllLb: saved.lineWllLb,
      slingWllLb: saved.slingWllLb,
      slingLegs: saved.slingLegs,
      slingAngleDeg: saved.slingAngleDeg,
    });
    await boardEvent(trx, { organisationId: actor.organisationId, yardId: order.yard_id, day: day(order.work_date), kind: "order", payload: { liftPlan: orderId } });
    return saved;
  });
}

export async function deleteLiftPlan(db: Knex, actor: Actor, orderId: number) {
  return db.transaction(async (trx) => {
    const order = await orderOf(trx, actor.organisationId, orderId, true);
    const n = await trx("lift_plans").where({ work_order_id: orderId }).delete();
    if (!n) throw new ApiError(404, "This order has no lift plan.");
    await audit(trx, actor, actor.organisationId, "lift_plan.delete", "work_order", orderId, { number: order.number });
    await boardEvent(trx, { organisationId: actor.organisationId, yardId: order.yard_id, day: day(order.work_date), kind: "order", payload: { liftPlan: orderId } });
  });
}

/**
 * The crew lead confirms the plan in the briefing, with the weight read off the nameplate on
 * site. A heavier site weight replaces the planned one in the crew rules (RIGGING re-checks).
 */
export async function confirmLiftPlan(db: Knex, actor: Actor, orderId: number, body: LiftConfirm): Promise<LiftPlan> {
  return db.transaction(async (trx) => {
    const order = await orderOf(trx, actor.organisationId, orderId, true);
    const cur = await trx("lift_plans").where({ work_order_id: orderId }).forUpdate().first();
    if (!cur) throw new ApiError(404, "This order has no lift plan to confirm.");
    if (Number(cur.version) !== body.version) {
      throw new ApiError(409, "The lift plan changed since you opened it; read the new plan before confirming.", {
        current: toPlan((await planQuery(trx).where("l.work_order_id", orderId).first())!),
      });
    }
    await trx("lift_plans")
      .where({ id: cur.id })
      .update({ site_weight_lb: body.siteWeightLb, confirmed_by: actor.id, confirmed_at: trx.fn.now(3), confirmed_version: cur.version });
    await audit(trx, actor, actor.organisationId, "lift_plan.confirm", "work_order", orderId, {
      number: order.number,
      version: Number(cur.version),
      plannedLb: Number(cur.load_lb),
      siteWeightLb: body.siteWeightLb,
    });
    await boardEvent(trx, { organisationId: actor.organisationId, yardId: order.yard_id, day: day(order.work_date), kind: "briefing", payload: { liftPlan: orderId } });
    return toPlan((await planQuery(trx).where("l.work_order_id", orderId).first())!);
  });
}
