// Every route handler under app/api, with who may call it, a sample request and whether a 2xx
// must leave an audit row. ONE table: tests/integration/route-matrix.test.ts checks it against
// the route files (nothing missing, nothing stale), walks it for every role and signed out, and
// checks the audit log; tests/integration/fuzz.test.ts fuzzes the JSON and query entries.
//
// Roles come from lib/users/roles.ts; "public" routes have no session check (health, the SMS
// webhook, the calendar feed, next-auth's own routes). A sample is built per caller from the
// fixtures (tests/support/route-fixtures.ts): mutations get fresh records for every allowed
// caller, so each one can succeed and be checked for its audit row.
import type { Knex } from "knex";
import type { Role } from "@/lib/users/roles";
import type { Client } from "./client";

export type Method = "GET" | "POST" | "PUT" | "PATCH" | "DELETE";
export type Caller = Role | "anon";

export interface Sample {
  /** The path with real ids and the query string. */
  path: string;
  /** A JSON body (sent with content-type application/json). */
  body?: unknown;
  /** A multipart body instead (a fresh FormData per call). */
  form?: () => FormData;
  /** A raw body with its content type (form-encoded webhooks). */
  raw?: { type: string; text: string };
  headers?: Record<string, string>;
}

export interface Seat {
  orderId: number;
  number: string;
  day: string;
  positionIds: Record<string, number>;
}

/** What the samples need; built once per test file by buildFixtures(). */
export interface Fx {
  db: Knex;
  orgId: number;
  yard: { id: number; code: string; timezone: string };
  clients: Record<Role, Client>;
  /** The demo lineworker sign-in: Marcus Whitfield, CP-1001. */
  marcus: { workerId: number; userId: number; phone: string };
  /** Another demo worker (Mateo Quintana, CP-1014): not Marcus. */
  other: { workerId: number; phone: string };
  /** A worker of the test's own, for HR's writes. */
  worker: { id: number; employeeNo: string };
  /** A far day of the test's own with one open order (fill, board, lists). */
  day: string;
  /** A far day with one sendable draft crew (a de-energized patrol). */
  sendDay: string;
  workTypeId: number;
  /** A qualification type of the test's own (no rule reads it). */
  qualTypeId: number;
  qualTypeCode: string;
  /** Marcus leads this order with a crew; its briefing draft carries a pole-check photo. */
  marcusOrderId: number;
  photoFileId: number;
  marcusFileId: number;
  marcusCredentialId: number;
  marcusUnavailabilityId: number;
  seriesId: number;
  orderId: number;
  rotationId: number;
  /** The SMS webhook's public URL and a signer for it. */
  webhook: string;
  sign: (params: Record<string, string>) => string;
  uniq: () => string;
  /** A wall-clock day of its own for each call (offsets 200+ from today). */
  nextDay: () => string;
  /** A past day, later on each call (renewals must be newer than the record they replace). */
  pastDay: () => string;
  // Fresh records, one per call:
  seat: () => Promise<Seat>;
  placed: () => Promise<{ assignmentId: number; seat: Seat }>;
  sentTo: (workerId: number) => Promise<{ assignmentId: number; seat: Seat }>;
  briefingOrder: (state: "none" | "briefed" | "acked" | "held") => Promise<Seat>;
  lapsedClimber: () => Promise<{ seat: Seat; workerId: number }>;
  inbound: () => Promise<number>;
  series: () => Promise<{ id: number; body: Record<string, unknown> }>;
  order: () => Promise<{ id: number; version: number }>;
  rotation: () => Promise<number>;
  timeRecord: () => Promise<number>;
  unavailability: (workerId: number, status: "requested" | "approved") => Promise<number>;
  pendingCredential: () => Promise<number>;
  qualType: () => Promise<number>;
  /** Issue 16: a fresh in-service bucket truck of the fixture's yard (version 1). */
  truck: () => Promise<{ id: number; version: number }>;
  /** A fresh rigging item on a fresh truck. */
  riggingItem: () => Promise<{ equipmentId: number; itemId: number }>;
  /** A fresh truck booked on a fresh order (booking version 1). */
  booking: () => Promise<{ id: number; version: number }>;
  orderBody: (day?: string) => Record<string, unknown>;
  pdf: () => Uint8Array;
  png: () => Uint8Array;
  briefingData: (opts?: { fail?: boolean }) => unknown;
  policyBody: () => Promise<Record<string, unknown>>;
  workTypeBody: () => Promise<Record<string, unknown>>;
  workerVersion: () => Promise<number>;
  calendarToken: () => Promise<string>;
}

export interface RouteEntry {
  method: Method;
  /** The path template as the folders spell it: /api/assignments/[id]. */
  route: string;
  roles: Role[] | "public";
  sample: (fx: Fx, caller: Caller) => Sample | Promise<Sample>;
  /** The status an allowed caller gets for the sample (one number, or per caller). */
  status: number | Partial<Record<Caller, number>>;
  /** Mutations: true when a 2xx must write an audit row; a string says why not. */
  audit?: true | string;
  /** The body is JSON read with readJson (fuzzed), or the query goes through readQuery (fuzzed). */
  fuzz?: "json" | "query";
  /**
   * Yard scope (issue 15): what a dispatcher of ANOTHER yard gets for the sample (built on the
   * North yard's records). Default: a mutation is refused (403), a read is allowed. "edit" or
   * "contact": refused (403) even as a read. A sentence: why the route touches no yard.
   */
  yard?: "edit" | "contact" | string;
}

export const ALL_ROLES: Role[] = ["admin", "dispatcher", "supervisor", "hr", "lineworker"];
const D: Role[] = ["dispatcher", "supervisor"];
const DA: Role[] = ["dispatcher", "supervisor", "admin"];
const BRIEF: Role[] = ["lineworker", "dispatcher", "supervisor"];
const HRA: Role[] = ["hr", "admin"];
const STAFF: Role[] = ["admin", "dispatcher", "supervisor", "hr"];

const form = (fields: Record<string, string | undefined>, file: Uint8Array, name: string, type: string) => () => {
  const f = new FormData();
  f.set("file", new Blob([new Uint8Array(file)], { type }), name);
  for (const [k, v] of Object.entries(fields)) if (v !== undefined) f.set(k, v);
  return f;
};
const wall = (day: string, hm: string) => `${day}T${hm}`;

export const ROUTES: RouteEntry[] = [
  // --- equipment (issue 16) ----------------------------------------------------------------
  {
    method: "GET",
    route: "/api/equipment",
    roles: ALL_ROLES,
    status: 200,
    fuzz: "query",
    sample: (fx) => ({ path: `/api/equipment?yard=${fx.yard.code}&kind=bucket_truck` }),
  },
  {
    method: "POST",
    route: "/api/equipment",
    roles: DA,
    status: 201,
    audit: true,
    fuzz: "json",
    sample: (fx) => ({
      path: "/api/equipment",
      body: { yardId: fx.yard.id, kind: "pickup", unitNumber: `RM-${fx.uniq()}`, name: "Route matrix pickup", insulated: false, dielectricTestedOn: null, annualInspectionOn: fx.pastDay(), licence: null },
    }),
  },
  {
    method: "GET",
    route: "/api/equipment/[id]",
    roles: ALL_ROLES,
    status: 200,
    sample: async (fx) => ({ path: `/api/equipment/${(await fx.truck()).id}` }),
  },
  {
    method: "PATCH",
    route: "/api/equipment/[id]",
    roles: DA,
    status: 200,
    audit: true,
    fuzz: "json",
    sample: async (fx) => ({ path: `/api/equipment/${(await fx.truck()).id}`, body: { name: "Route matrix bucket, renamed", version: 1 } }),
  },
  {
    method: "POST",
    route: "/api/equipment/[id]/rigging",
    roles: DA,
    status: 201,
    audit: true,
    fuzz: "json",
    sample: async (fx) => ({
      path: `/api/equipment/${(await fx.truck()).id}/rigging`,
      body: { kind: "rope_block", label: "Route matrix blocks", partsOfLine: 3, wllLb: 2000, inspectedOn: fx.pastDay() },
    }),
  },
  {
    method: "DELETE",
    route: "/api/equipment/[id]/rigging/[itemId]",
    roles: DA,
    status: 200,
    audit: true,
    sample: async (fx) => {
      const r = await fx.riggingItem();
      return { path: `/api/equipment/${r.equipmentId}/rigging/${r.itemId}` };
    },
  },
  {
    method: "POST",
    route: "/api/equipment-assignments",
    roles: D,
    status: 201,
    audit: true,
    fuzz: "json",
    sample: async (fx) => {
      const s = await fx.seat();
      return { path: "/api/equipment-assignments", body: { workOrderId: s.orderId, equipmentId: (await fx.truck()).id } };
    },
  },
  {
    method: "PATCH",
    route: "/api/equipment-assignments/[id]",
    roles: D,
    status: 200,
    audit: true,
    fuzz: "json",
    sample: async (fx) => {
      const b = await fx.booking();
      return { path: `/api/equipment-assignments/${b.id}`, body: { workOrderId: (await fx.seat()).orderId, version: b.version } };
    },
  },
  {
    method: "DELETE",
    route: "/api/equipment-assignments/[id]",
    roles: D,
    status: 200,
    audit: true,
    fuzz: "query",
    sample: async (fx) => {
      const b = await fx.booking();
      return { path: `/api/equipment-assignments/${b.id}?version=${b.version}` };
    },
  },
  // --- assignments and the board -------------------------------------------------------------
  {
    method: "POST",
    route: "/api/assignments",
    roles: D,
    status: 201,
    audit: true,
    fuzz: "json",
    sample: async (fx) => {
      const s = await fx.seat();
      return { path: "/api/assignments", body: { positionId: s.positionIds.lead, workerId: fx.other.workerId } };
    },
  },
  {
    method: "PATCH",
    route: "/api/assignments/[id]",
    roles: D,
    status: 200,
    audit: true,
    fuzz: "json",
    sample: async (fx) => {
      const p = await fx.placed();
      return { path: `/api/assignments/${p.assignmentId}`, body: { positionId: p.seat.positionIds.ground, version: 1 } };
    },
  },
  {
    method: "DELETE",
    route: "/api/assignments/[id]",
    roles: D,
    status: 200,
    audit: true,
    fuzz: "json",
    sample: async (fx) => ({ path: `/api/assignments/${(await fx.placed()).assignmentId}`, body: { version: 1 } }),
  },
  {
    // Issue 18: two placed workers trade seats (two fresh orders of the fixture's day).
    method: "POST",
    route: "/api/assignments/swap",
    roles: D,
    status: 200,
    audit: true,
    fuzz: "json",
    sample: async (fx) => {
      const a = await fx.placed();
      const b = await fx.sentTo(fx.marcus.workerId);
      return { path: "/api/assignments/swap", body: { a: { id: a.assignmentId, version: 1 }, b: { id: b.assignmentId, version: 1 } } };
    },
  },
  {
    method: "POST",
    route: "/api/assignments/[id]/resend",
    roles: D,
    status: 201,
    audit: true,
    sample: async (fx) => ({ path: `/api/assignments/${(await fx.sentTo(fx.other.workerId)).assignmentId}/resend` }),
  },
  {
    method: "POST",
    route: "/api/assignments/[id]/respond",
    roles: ["lineworker"],
    status: 200,
    audit: true,
    fuzz: "json",
    sample: async (fx) => ({ path: `/api/assignments/${(await fx.sentTo(fx.marcus.workerId)).assignmentId}/respond`, body: { answer: "confirm" } }),
  },
  {
    method: "GET",
    route: "/api/board",
    roles: DA,
    status: 200,
    fuzz: "query",
    sample: (fx) => ({ path: `/api/board?yard=${fx.yard.code}&date=${fx.day}` }),
  },
  {
    method: "GET",
    route: "/api/board/events",
    roles: DA,
    status: 200,
    fuzz: "query",
    sample: async (fx) => {
      const max = Number((await fx.db("board_events").max({ id: "id" }).first())?.id ?? 0);
      return { path: `/api/board/events?after=${Math.max(0, max - 5)}&date=${fx.day}&yard=${fx.yard.code}` };
    },
  },
  {
    // Issue 19: the board's Server-Sent Events; maxMs ends the sample's stream after 300 ms.
    // Not fuzzed here (a fuzzed query without maxMs would hold a stream open for minutes): its
    // query's refusals are checked in tests/integration/board-stream.test.ts.
    method: "GET",
    route: "/api/board/stream",
    roles: DA,
    status: 200,
    sample: async (fx) => {
      const max = Number((await fx.db("board_events").max({ id: "id" }).first())?.id ?? 0);
      return { path: `/api/board/stream?after=${Math.max(0, max - 5)}&date=${fx.day}&yard=${fx.yard.code}&maxMs=300` };
    },
  },
  {
    method: "POST",
    route: "/api/overrides",
    roles: ["supervisor"],
    status: 201,
    audit: true,
    fuzz: "json",
    sample: async (fx) => {
      const l = await fx.lapsedClimber();
      return { path: "/api/overrides", body: { workOrderId: l.seat.orderId, rule: "CLIMB_CERT", workerId: l.workerId, reason: "Route matrix: field evaluation passed this morning" } };
    },
  },
  {
    method: "POST",
    route: "/api/crew-check",
    yard: "a day file posted for checking; nothing of any yard is read or stored",
    roles: D,
    status: 200,
    audit: "computes findings over the posted day; writes nothing",
    fuzz: "json",
    sample: () => ({
      path: "/api/crew-check",
      body: {
        timezone: "America/Chicago",
        workers: [{ id: "w-1", name: "Rosa Delgado", classification: "journeyman", credentials: [{ type: "climbing", expiresOn: "2027-05-31" }] }],
        workOrders: [{ id: "wo-1", title: "Change out transformer", start: "2027-04-06T07:00", end: "2027-04-06T15:30", workType: "pole_climb", voltageKv: 12.47 }],
        assignments: [{ workOrderId: "wo-1", workerId: "w-1", position: "climber" }],
      },
    }),
  },
  {
    method: "POST",
    route: "/api/send",
    roles: D,
    status: 200,
    audit: true,
    fuzz: "json",
    sample: (fx) => ({ path: "/api/send", body: { date: fx.sendDay, yard: fx.yard.code } }),
  },
  // --- fill open positions and call-outs (issue 9) --------------------------------------------
  {
    method: "POST",
    route: "/api/fill",
    roles: D,
    status: 200,
    audit: "a preview: proposes crews and writes nothing (accepting is /api/fill/accept)",
    fuzz: "json",
    sample: (fx) => ({ path: "/api/fill", body: { date: fx.day, yard: fx.yard.code, timeLimitSeconds: 5 } }),
  },
  {
    method: "POST",
    route: "/api/fill/accept",
    roles: D,
    status: 200,
    audit: true,
    fuzz: "json",
    sample: async (fx) => {
      const s = await fx.seat();
      return { path: "/api/fill/accept", body: { date: s.day, yard: fx.yard.code, proposals: [{ positionId: s.positionIds.lead, workerId: fx.other.workerId }] } };
    },
  },
  {
    method: "GET",
    route: "/api/call-list",
    yard: "edit",
    roles: D,
    status: 200,
    fuzz: "query",
    sample: async (fx) => ({ path: `/api/call-list?positionId=${(await fx.seat()).positionIds.lead}` }),
  },
  {
    method: "POST",
    route: "/api/call-list",
    roles: D,
    status: 201,
    audit: true,
    fuzz: "json",
    sample: async (fx) => ({ path: "/api/call-list", body: { positionId: (await fx.seat()).positionIds.lead, workerId: fx.other.workerId, text: false } }),
  },
  // --- briefings -----------------------------------------------------------------------------
  {
    method: "GET",
    route: "/api/briefings/[orderId]",
    roles: BRIEF,
    status: 200,
    sample: (fx) => ({ path: `/api/briefings/${fx.marcusOrderId}` }),
  },
  {
    method: "PUT",
    route: "/api/briefings/[orderId]",
    roles: ["lineworker"],
    status: 200,
    audit: true,
    fuzz: "json",
    sample: async (fx) => ({ path: `/api/briefings/${(await fx.briefingOrder("none")).orderId}`, body: { action: "save", version: 0, data: fx.briefingData() } }),
  },
  {
    method: "POST",
    route: "/api/briefings/[orderId]/ack",
    roles: ["lineworker"],
    status: 201,
    audit: true,
    fuzz: "json",
    sample: async (fx) => {
      const s = await fx.briefingOrder("briefed");
      const gear = { result: "ok", testedOn: s.day };
      return {
        path: `/api/briefings/${s.orderId}/ack`,
        body: { round: 1, gearCheck: { gloves: gear, sleeves: gear, belt: "na", fallArrest: "na", climbers: "na", hardHat: "ok", frClothing: "ok" } },
      };
    },
  },
  {
    method: "POST",
    route: "/api/briefings/[orderId]/start",
    roles: ["lineworker"],
    status: 200,
    audit: true,
    fuzz: "json",
    sample: async (fx) => ({ path: `/api/briefings/${(await fx.briefingOrder("acked")).orderId}/start`, body: { round: 1 } }),
  },
  {
    method: "POST",
    route: "/api/briefings/[orderId]/hold",
    roles: ["lineworker"],
    status: 200,
    audit: true,
    fuzz: "json",
    sample: async (fx) => ({
      path: `/api/briefings/${(await fx.briefingOrder("none")).orderId}/hold`,
      body: { version: 0, data: fx.briefingData({ fail: true }), reason: "Route matrix: pole failed its ground-line check" },
    }),
  },
  {
    method: "DELETE",
    route: "/api/briefings/[orderId]/hold",
    roles: D,
    status: 200,
    audit: true,
    fuzz: "json",
    sample: async (fx) => ({ path: `/api/briefings/${(await fx.briefingOrder("held")).orderId}/hold`, body: { note: "Route matrix: new pole set" } }),
  },
  {
    method: "GET",
    route: "/api/briefings/[orderId]/pdf",
    roles: BRIEF,
    status: 200,
    sample: (fx) => ({ path: `/api/briefings/${fx.marcusOrderId}/pdf` }),
  },
  {
    method: "POST",
    route: "/api/briefings/[orderId]/photo",
    roles: ["lineworker"],
    status: 201,
    audit: true,
    sample: (fx) => ({ path: `/api/briefings/${fx.marcusOrderId}/photo`, form: form({}, fx.png(), "ground-line.png", "image/png") }),
  },
  {
    method: "GET",
    route: "/api/briefings/[orderId]/photo/[fileId]",
    roles: BRIEF,
    status: 200,
    sample: (fx) => ({ path: `/api/briefings/${fx.marcusOrderId}/photo/${fx.photoFileId}` }),
  },
  // --- calendar feed -------------------------------------------------------------------------
  {
    method: "GET",
    route: "/api/calendar/[token]",
    roles: "public",
    status: 200,
    sample: async (fx) => ({ path: `/api/calendar/${await fx.calendarToken()}` }),
  },
  {
    method: "POST",
    route: "/api/calendar/reset",
    roles: ["lineworker", "hr", "admin"],
    status: 200,
    audit: true,
    fuzz: "json",
    sample: (fx, caller) => ({ path: "/api/calendar/reset", body: caller === "lineworker" ? {} : { workerId: fx.worker.id } }),
  },
  // --- credentials and files -----------------------------------------------------------------
  {
    method: "GET",
    route: "/api/credentials",
    roles: ["hr", "admin", "supervisor", "lineworker"],
    status: 200,
    fuzz: "query",
    sample: () => ({ path: "/api/credentials?view=all" }),
  },
  {
    method: "POST",
    route: "/api/credentials",
    roles: ["hr", "admin", "lineworker"],
    status: 201,
    audit: true,
    fuzz: "json",
    sample: async (fx, caller) => {
      if (caller === "lineworker") {
        // A renewal of their own, with their own evidence: pending until HR verifies it.
        return { path: "/api/credentials", body: { workerId: fx.marcus.workerId, qualificationTypeId: await fx.qualType(), issuedOn: fx.pastDay(), evidenceFileId: fx.marcusFileId } };
      }
      return { path: "/api/credentials", body: { workerId: fx.worker.id, qualificationTypeId: fx.qualTypeId, issuedOn: fx.pastDay() } };
    },
  },
  {
    method: "GET",
    route: "/api/credentials/[id]",
    roles: ["hr", "admin", "supervisor", "lineworker"],
    status: 200,
    sample: (fx) => ({ path: `/api/credentials/${fx.marcusCredentialId}` }),
  },
  {
    method: "PATCH",
    route: "/api/credentials/[id]",
    roles: HRA,
    status: 200,
    audit: true,
    fuzz: "json",
    sample: async (fx) => ({ path: `/api/credentials/${await fx.pendingCredential()}`, body: { action: "reject", reason: "Route matrix: card unreadable" } }),
  },
  {
    method: "GET",
    route: "/api/credentials/export",
    roles: ["hr", "admin", "supervisor"],
    status: 200,
    fuzz: "query",
    sample: () => ({ path: "/api/credentials/export?view=all" }),
  },
  {
    method: "POST",
    route: "/api/credentials/import",
    roles: HRA,
    status: 201,
    audit: true,
    fuzz: "json",
    sample: (fx) => ({ path: "/api/credentials/import", body: { csv: `employee_no,qualification,issued_on\r\n${fx.worker.employeeNo},${fx.qualTypeCode},${fx.pastDay()}\r\n`, dryRun: false } }),
  },
  {
    method: "POST",
    route: "/api/files",
    roles: ["hr", "admin", "lineworker"],
    status: 201,
    audit: true,
    sample: (fx, caller) => ({
      path: "/api/files",
      form: form({ workerId: caller === "lineworker" ? undefined : String(fx.worker.id) }, fx.pdf(), "evidence.pdf", "application/pdf"),
    }),
  },
  {
    method: "GET",
    route: "/api/files/[id]",
    roles: ["hr", "supervisor", "admin", "lineworker"],
    status: 200,
    sample: (fx) => ({ path: `/api/files/${fx.marcusFileId}` }),
  },
  {
    method: "GET",
    route: "/api/qualification-types",
    roles: STAFF,
    status: 200,
    sample: () => ({ path: "/api/qualification-types" }),
  },
  {
    method: "POST",
    route: "/api/qualification-types",
    roles: HRA,
    status: 201,
    audit: true,
    fuzz: "json",
    sample: (fx) => ({ path: "/api/qualification-types", body: { code: `rm_${fx.uniq()}`, name: "Route matrix type", renewalMonths: 12, warnDays: 30 } }),
  },
  {
    method: "GET",
    route: "/api/qualification-types/[id]",
    roles: STAFF,
    status: 200,
    sample: (fx) => ({ path: `/api/qualification-types/${fx.qualTypeId}` }),
  },
  {
    method: "PATCH",
    route: "/api/qualification-types/[id]",
    roles: HRA,
    status: 200,
    audit: true,
    fuzz: "json",
    sample: (fx) => ({ path: `/api/qualification-types/${fx.qualTypeId}`, body: { warnDays: 30 } }),
  },
  {
    method: "DELETE",
    route: "/api/qualification-types/[id]",
    roles: HRA,
    status: 200,
    audit: true,
    sample: async (fx) => ({ path: `/api/qualification-types/${await fx.qualType()}` }),
  },
  {
    method: "POST",
    route: "/api/reminders",
    roles: HRA,
    status: 200,
    audit: true,
    sample: () => ({ path: "/api/reminders" }),
  },
  // --- roster --------------------------------------------------------------------------------
  {
    method: "GET",
    route: "/api/workers",
    roles: ["hr", "admin", "dispatcher", "supervisor"],
    status: 200,
    fuzz: "query",
    sample: () => ({ path: "/api/workers?active=true" }),
  },
  {
    method: "POST",
    route: "/api/workers",
    roles: HRA,
    status: 201,
    audit: true,
    fuzz: "json",
    sample: (fx) => ({ path: "/api/workers", body: { employeeNo: `RM-${fx.uniq()}`, firstName: "Route", lastName: "Matrix", classification: "ground_hand", yardId: fx.yard.id } }),
  },
  {
    method: "GET",
    route: "/api/workers/[id]",
    roles: ["hr", "admin", "dispatcher", "supervisor", "lineworker"],
    status: 200,
    sample: (fx) => ({ path: `/api/workers/${fx.marcus.workerId}` }),
  },
  {
    method: "PATCH",
    route: "/api/workers/[id]",
    roles: HRA,
    status: 200,
    audit: true,
    fuzz: "json",
    sample: async (fx) => ({ path: `/api/workers/${fx.worker.id}`, body: { version: await fx.workerVersion(), lastName: `Fixture ${fx.uniq()}` } }),
  },
  // --- work orders, series, templates, policy -------------------------------------------------
  {
    method: "GET",
    route: "/api/orders",
    roles: DA,
    status: 200,
    fuzz: "query",
    sample: (fx) => ({ path: `/api/orders?yard=${fx.yard.code}&from=${fx.day}&to=${fx.day}` }),
  },
  {
    method: "POST",
    route: "/api/orders",
    roles: D,
    status: 201,
    audit: true,
    fuzz: "json",
    sample: (fx) => ({ path: "/api/orders", body: fx.orderBody() }),
  },
  {
    method: "GET",
    route: "/api/orders/[id]",
    roles: DA,
    status: 200,
    sample: (fx) => ({ path: `/api/orders/${fx.orderId}` }),
  },
  {
    method: "PATCH",
    route: "/api/orders/[id]",
    roles: D,
    status: 200,
    audit: true,
    fuzz: "json",
    sample: async (fx) => {
      const o = await fx.order();
      return { path: `/api/orders/${o.id}`, body: { version: o.version, priority: 2 } };
    },
  },
  {
    method: "DELETE",
    route: "/api/orders/[id]",
    roles: D,
    status: 200,
    audit: true,
    fuzz: "query",
    sample: async (fx) => {
      const o = await fx.order();
      return { path: `/api/orders/${o.id}?version=${o.version}` };
    },
  },
  {
    method: "GET",
    route: "/api/order-series/[id]",
    roles: DA,
    status: 200,
    sample: (fx) => ({ path: `/api/order-series/${fx.seriesId}` }),
  },
  {
    method: "PATCH",
    route: "/api/order-series/[id]",
    roles: D,
    status: 200,
    audit: true,
    fuzz: "json",
    sample: async (fx) => {
      const s = await fx.series();
      return { path: `/api/order-series/${s.id}`, body: { ...s.body, title: `Route matrix series edited ${fx.uniq()}`, version: 1 } };
    },
  },
  {
    method: "DELETE",
    route: "/api/order-series/[id]",
    roles: D,
    status: 200,
    audit: true,
    sample: async (fx) => ({ path: `/api/order-series/${(await fx.series()).id}` }),
  },
  {
    method: "GET",
    route: "/api/work-types",
    roles: STAFF,
    status: 200,
    sample: () => ({ path: "/api/work-types" }),
  },
  {
    method: "PUT",
    route: "/api/work-types",
    roles: ["admin"],
    status: 200,
    audit: true,
    fuzz: "json",
    sample: async (fx) => ({ path: "/api/work-types", body: { workTypes: [{ id: fx.workTypeId, ...(await fx.workTypeBody()) }] } }),
  },
  {
    method: "GET",
    route: "/api/work-types/[id]",
    roles: STAFF,
    status: 200,
    sample: (fx) => ({ path: `/api/work-types/${fx.workTypeId}` }),
  },
  {
    method: "PUT",
    route: "/api/work-types/[id]",
    roles: ["admin"],
    status: 200,
    audit: true,
    fuzz: "json",
    sample: async (fx) => ({ path: `/api/work-types/${fx.workTypeId}`, body: await fx.workTypeBody() }),
  },
  {
    method: "GET",
    route: "/api/policies",
    roles: STAFF,
    status: 200,
    sample: () => ({ path: "/api/policies" }),
  },
  {
    method: "PUT",
    route: "/api/policies",
    roles: ["admin"],
    status: 200,
    audit: true,
    fuzz: "json",
    sample: async (fx) => ({ path: "/api/policies", body: await fx.policyBody() }),
  },
  // --- rotations, call-outs, time, leave -----------------------------------------------------
  {
    method: "GET",
    route: "/api/rotations",
    roles: ["dispatcher", "supervisor", "hr", "admin"],
    status: 200,
    sample: () => ({ path: "/api/rotations" }),
  },
  {
    method: "POST",
    route: "/api/rotations",
    roles: D,
    status: 201,
    audit: true,
    fuzz: "json",
    sample: (fx) => ({
      path: "/api/rotations",
      body: { name: `Route matrix rotation ${fx.uniq()}`, yardId: fx.yard.id, rrule: "FREQ=WEEKLY;BYDAY=SU", dtstartLocal: wall(fx.day, "07:00"), active: false, memberIds: [fx.worker.id] },
    }),
  },
  {
    method: "GET",
    route: "/api/rotations/[id]",
    roles: ["dispatcher", "supervisor", "hr", "admin"],
    status: 200,
    sample: (fx) => ({ path: `/api/rotations/${fx.rotationId}` }),
  },
  {
    method: "PATCH",
    route: "/api/rotations/[id]",
    roles: D,
    status: 200,
    audit: true,
    fuzz: "json",
    sample: async (fx) => ({ path: `/api/rotations/${await fx.rotation()}`, body: { version: 1, name: `Route matrix rotation ${fx.uniq()}` } }),
  },
  {
    method: "DELETE",
    route: "/api/rotations/[id]",
    roles: D,
    status: 200,
    audit: true,
    sample: async (fx) => ({ path: `/api/rotations/${await fx.rotation()}` }),
  },
  {
    method: "POST",
    route: "/api/call-outs",
    roles: D,
    status: 201,
    audit: true,
    fuzz: "json",
    sample: (fx) => {
      const day = fx.nextDay();
      return { path: "/api/call-outs", body: { workerId: fx.worker.id, start: wall(day, "22:00"), end: wall(day, "23:30"), rotationId: null, note: "Route matrix call-out" } };
    },
  },
  {
    method: "GET",
    route: "/api/time-records",
    roles: ["dispatcher", "supervisor", "hr", "admin", "lineworker"],
    status: 200,
    fuzz: "query",
    sample: (fx) => ({ path: `/api/time-records?workerId=${fx.marcus.workerId}&week=${fx.day}` }),
  },
  {
    method: "POST",
    route: "/api/time-records",
    roles: ["dispatcher", "supervisor", "hr"],
    status: 201,
    audit: true,
    fuzz: "json",
    sample: (fx) => {
      const day = fx.nextDay();
      return { path: "/api/time-records", body: { workerId: fx.worker.id, start: wall(day, "08:00"), end: wall(day, "10:00"), reason: "Route matrix: paper timesheet" } };
    },
  },
  {
    method: "DELETE",
    route: "/api/time-records/[id]",
    roles: ["dispatcher", "supervisor", "hr"],
    status: 200,
    audit: true,
    sample: async (fx) => ({ path: `/api/time-records/${await fx.timeRecord()}` }),
  },
  {
    method: "GET",
    route: "/api/leave",
    roles: ["hr", "supervisor", "dispatcher", "admin", "lineworker"],
    status: 200,
    fuzz: "query",
    sample: () => ({ path: "/api/leave" }),
  },
  {
    method: "POST",
    route: "/api/leave",
    roles: ["hr", "supervisor", "lineworker"],
    status: 201,
    audit: true,
    fuzz: "json",
    sample: (fx, caller) => {
      const day = fx.nextDay();
      return {
        path: "/api/leave",
        body: { workerId: caller === "lineworker" ? fx.marcus.workerId : fx.worker.id, kind: "training", start: wall(day, "00:00"), end: wall(day, "12:00"), note: "Route matrix" },
      };
    },
  },
  {
    method: "GET",
    route: "/api/leave/[id]",
    roles: ["hr", "supervisor", "dispatcher", "admin", "lineworker"],
    status: 200,
    sample: (fx) => ({ path: `/api/leave/${fx.marcusUnavailabilityId}` }),
  },
  {
    method: "PATCH",
    route: "/api/leave/[id]",
    roles: ["supervisor", "hr"],
    status: 200,
    audit: true,
    fuzz: "json",
    sample: async (fx) => ({ path: `/api/leave/${await fx.unavailability(fx.worker.id, "approved")}`, body: { note: "Route matrix: corrected" } }),
  },
  {
    method: "DELETE",
    route: "/api/leave/[id]",
    roles: ["supervisor", "hr", "lineworker"],
    status: 200,
    audit: true,
    sample: async (fx, caller) => ({
      path: `/api/leave/${caller === "lineworker" ? await fx.unavailability(fx.marcus.workerId, "requested") : await fx.unavailability(fx.worker.id, "approved")}`,
    }),
  },
  // --- messages and the SMS side -------------------------------------------------------------
  {
    method: "PATCH",
    route: "/api/messages/inbound/[id]",
    yard: "the sample is a reply from an unknown number: it belongs to no yard",
    roles: D,
    status: 200,
    audit: true,
    fuzz: "json",
    sample: async (fx) => ({ path: `/api/messages/inbound/${await fx.inbound()}`, body: { handled: true } }),
  },
  {
    method: "GET",
    route: "/api/phone",
    yard: "contact",
    roles: DA,
    status: 200,
    fuzz: "query",
    sample: (fx) => ({ path: `/api/phone?phone=${encodeURIComponent(fx.other.phone)}` }),
  },
  {
    method: "POST",
    route: "/api/phone",
    roles: DA,
    status: 200,
    // The simulator asks the SMS fake to deliver a text to the signed webhook, which audits it.
    audit: true,
    fuzz: "json",
    sample: (fx) => ({ path: "/api/phone", body: { from: fx.other.phone, body: `Route matrix hello ${fx.uniq()}` } }),
  },
  {
    method: "POST",
    route: "/api/sms/inbound",
    roles: "public",
    status: 200,
    audit: true,
    sample: (fx) => {
      const params = {
        MessageSid: `SM${fx.uniq().padStart(32, "0").slice(-32)}`,
        AccountSid: process.env.TWILIO_ACCOUNT_SID ?? "AC00000000000000000000000000000000",
        From: fx.other.phone,
        To: process.env.TWILIO_FROM_NUMBER ?? "+13205550199",
        Body: "Route matrix: who is this",
      };
      return { path: "/api/sms/inbound", raw: { type: "application/x-www-form-urlencoded", text: new URLSearchParams(params).toString() }, headers: { "x-twilio-signature": fx.sign(params) } };
    },
  },
  // --- platform ------------------------------------------------------------------------------
  {
    method: "GET",
    route: "/api/health",
    roles: "public",
    status: 200,
    sample: () => ({ path: "/api/health" }),
  },
  {
    method: "GET",
    route: "/api/auth/[...nextauth]",
    roles: "public",
    status: 200,
    sample: () => ({ path: "/api/auth/session" }),
  },
  {
    method: "POST",
    route: "/api/auth/[...nextauth]",
    roles: "public",
    // Without the CSRF token next-auth sends the caller back to its sign-in page.
    status: 302,
    audit: "next-auth's own route; sign-ins are recorded in sign_in_attempts (platform.test.ts)",
    sample: () => ({ path: "/api/auth/callback/credentials", raw: { type: "application/x-www-form-urlencoded", text: "email=nobody%40cedarprairie.example&password=x" } }),
  },
  // --- rubber goods and lift plans (issue 16) --------------------------------------------------
  {
    method: "GET",
    route: "/api/gear",
    roles: ["hr", "admin", "dispatcher", "supervisor", "lineworker"],
    status: 200,
    fuzz: "query",
    sample: () => ({ path: "/api/gear?view=due" }),
  },
  {
    method: "POST",
    route: "/api/gear",
    roles: HRA,
    status: 201,
    audit: true,
    fuzz: "json",
    sample: (fx) => ({ path: "/api/gear", body: { workerId: fx.worker.id, kind: "rubber_gloves", class: "2", serial: `RM-G-${fx.uniq()}`, testedOn: fx.pastDay() } }),
  },
  {
    method: "GET",
    route: "/api/gear/[id]",
    roles: ["hr", "admin", "dispatcher", "supervisor", "lineworker"],
    status: 200,
    sample: async (fx, caller) => {
      const workerId = caller === "lineworker" ? fx.marcus.workerId : fx.worker.id;
      // Retired at once: a sample on Marcus's record never counts for him on a board.
      const [id] = await fx.db("rubber_goods").insert({ organisation_id: fx.orgId, worker_id: workerId, kind: "rubber_gloves", class: "2", serial: `RM-G-${fx.uniq()}`, tested_on: fx.pastDay(), retired_on: fx.pastDay() });
      return { path: `/api/gear/${id}` };
    },
  },
  {
    method: "PATCH",
    route: "/api/gear/[id]",
    roles: HRA,
    status: 200,
    audit: true,
    fuzz: "json",
    sample: async (fx) => {
      const [id] = await fx.db("rubber_goods").insert({ organisation_id: fx.orgId, worker_id: fx.worker.id, kind: "rubber_gloves", class: "2", serial: `RM-G-${fx.uniq()}`, tested_on: fx.pastDay() });
      return { path: `/api/gear/${id}`, body: { version: 1, testedOn: fx.pastDay() } };
    },
  },
  {
    method: "GET",
    route: "/api/gear/export",
    roles: ["hr", "admin", "dispatcher", "supervisor"],
    status: 200,
    fuzz: "query",
    sample: () => ({ path: "/api/gear/export?view=all" }),
  },
  {
    method: "POST",
    route: "/api/gear/import",
    roles: HRA,
    status: 201,
    audit: true,
    fuzz: "json",
    sample: (fx) => ({ path: "/api/gear/import", body: { csv: `serial,employee_no,kind,class,tested_on\r\nRM-G-${fx.uniq()},${fx.worker.employeeNo},rubber_gloves,2,${fx.pastDay()}\r\n`, dryRun: false } }),
  },
  {
    method: "POST",
    route: "/api/gear/reminders",
    roles: HRA,
    status: 200,
    audit: true,
    sample: () => ({ path: "/api/gear/reminders" }),
  },
  {
    method: "GET",
    route: "/api/orders/[id]/lift",
    roles: DA,
    status: 200,
    sample: (fx) => ({ path: `/api/orders/${fx.orderId}/lift` }),
  },
  {
    method: "PUT",
    route: "/api/orders/[id]/lift",
    roles: DA,
    status: 200,
    audit: true,
    fuzz: "json",
    sample: async (fx) => ({
      path: `/api/orders/${(await fx.order()).id}/lift`,
      body: { loadLb: 640, partsOfLine: 3, blockWllLb: 2000, lineWllLb: 450, slingWllLb: 1000, slingLegs: 2, slingAngleDeg: 60 },
    }),
  },
  {
    method: "DELETE",
    route: "/api/orders/[id]/lift",
    roles: DA,
    status: 200,
    audit: true,
    sample: async (fx) => {
      const { id } = await fx.order();
      await fx.db("lift_plans").insert({ work_order_id: id, load_lb: 400, parts_of_line: 3, sheaves: 3 });
      return { path: `/api/orders/${id}/lift` };
    },
  },
  {
    method: "POST",
    route: "/api/briefings/[orderId]/lift",
    roles: ["lineworker"],
    status: 200,
    audit: true,
    fuzz: "json",
    sample: async (fx) => {
      const s = await fx.briefingOrder("none");
      await fx.db("lift_plans").insert({ work_order_id: s.orderId, load_lb: 400, parts_of_line: 3, sheaves: 3 });
      return { path: `/api/briefings/${s.orderId}/lift`, body: { version: 1, siteWeightLb: 415 } };
    },
  },
  // --- users and passwords (issue 18 point 6; issue 15) -----------------------------------------
  {
    method: "GET",
    route: "/api/users",
    roles: ["admin"],
    status: 200,
    sample: () => ({ path: "/api/users" }),
  },
  {
    method: "POST",
    route: "/api/users",
    roles: ["admin"],
    status: 201,
    audit: true,
    fuzz: "json",
    sample: (fx) => ({ path: "/api/users", body: { email: `rm-${fx.uniq()}@cedarprairie.example`, name: "Route Matrix", role: "hr", yardIds: [] } }),
  },
  {
    method: "PATCH",
    route: "/api/users/[id]",
    roles: ["admin"],
    status: 200,
    audit: true,
    fuzz: "json",
    sample: async (fx) => {
      const [id] = await fx.db("users").insert({ organisation_id: fx.orgId, email: `rm-${fx.uniq()}@cedarprairie.example`, name: "Route Matrix", role: "hr", password_hash: "x" });
      return { path: `/api/users/${id}`, body: { role: "supervisor" } };
    },
  },
  {
    method: "POST",
    route: "/api/users/[id]/reset",
    roles: ["admin"],
    status: 201,
    audit: true,
    sample: async (fx) => {
      const [id] = await fx.db("users").insert({ organisation_id: fx.orgId, email: `rm-${fx.uniq()}@cedarprairie.example`, name: "Route Matrix", role: "hr", password_hash: "x" });
      return { path: `/api/users/${id}/reset` };
    },
  },
  {
    method: "POST",
    route: "/api/me/password",
    roles: ALL_ROLES,
    // A wrong current password: refused, the caller's sessions (used by the rest of the matrix) live on.
    status: 422,
    audit: "the sample's current password is wrong: nothing changes",
    yard: "one's own password belongs to no yard",
    fuzz: "json",
    sample: () => ({ path: "/api/me/password", body: { currentPassword: "not-the-password", newPassword: "route-matrix-new-26" } }),
  },
  {
    method: "POST",
    route: "/api/password-reset",
    roles: "public",
    // An unknown link: 410, nothing changes (the e-mailed token is the only proof).
    status: 410,
    audit: "an unknown reset link changes nothing",
    fuzz: "json",
    sample: (fx) => ({ path: "/api/password-reset", body: { token: `unknown-${fx.uniq()}-link-of-route-matrix`, password: "route-matrix-new-26" } }),
  },
  // --- supervisor queue and notices (issue 18, point 13) ------------------------------------
  {
    method: "GET",
    route: "/api/queue",
    roles: ["supervisor"],
    status: 200,
    fuzz: "query",
    sample: (fx) => ({ path: `/api/queue?yard=${fx.yard.code}` }),
  },
  {
    method: "POST",
    route: "/api/notices/read",
    roles: ALL_ROLES,
    status: 200,
    audit: "marks the caller's own notices read; nothing of the organisation's work changes",
    yard: "one's own notices belong to no yard",
    fuzz: "json",
    sample: () => ({ path: "/api/notices/read", body: { ids: "all" } }),
  },
  // --- the printable day sheet (issue 18) ---------------------------------------------------
  {
    method: "GET",
    route: "/api/day-sheet",
    roles: DA,
    status: 200,
    fuzz: "query",
    sample: (fx) => ({ path: `/api/day-sheet?date=${fx.day}&yard=${fx.yard.code}` }),
  },
];

export const routeKey = (method: string, route: string) => `${method} ${route}`;
