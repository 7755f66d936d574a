import knex from "knex";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { dbConfig } from "@/knexfile";
import { addDays, todayIn } from "@/lib/time/days";
import { voltageLabel } from "@/lib/orders/voltage";
import { as, type Client } from "@/tests/support/client";

// The demo day (db/demo/scenario.ts, db/seeds/01_demo.ts) as the board builds it through
// GET /api/board, read the way a line foreman would (issue 14). Each order's expected crew-rule
// findings are listed with the reason beside them. Equipment and rubber-goods findings (issue 16)
// are checked here only where a practitioner would call them wrong (a visual patrol's lead
// carries gloves rated for the 24.9 kV line, so none shows). Sources: 29 CFR 1910.269 paragraphs as named; ../shared/CREW-CHECK.md
// "Corrections"; the state's one-call law for LOCATE.

const CREW_RULES = new Set([
  "CREW_MIN",
  "OBSERVER",
  "RESCUE",
  "CLIMB_CERT",
  "FIRST_AID",
  "QUALIFIED",
  "OPERATOR_CERT",
  "REST",
  "IN_CHARGE",
  "DOUBLE_BOOKED",
  "UNAVAILABLE",
  "LOCATE",
]);

interface Finding {
  rule: string;
  level: "block" | "warn";
  workOrderId: string;
  workerId: string | null;
  message: string;
  source: string;
}
interface Card {
  id: number;
  number: string;
  start: string;
  end: string;
  emergency: boolean;
  ruleType: string;
  workTypeCode: string;
  energized: boolean;
  voltageKv: number | null;
  phases?: number;
  systemKv?: number | null;
  nearEnergizedKv?: number | null;
  shifts?: { start: string; end: string }[];
  seats: { position: string; assignment: { workerId: number } | null }[];
}
interface Board {
  orders: Card[];
  findings: Finding[];
  snapshot: { workers: { id: string; name: string; classification: string; credentials: { type: string }[] }[] };
}

const db = knex(dbConfig());
let dispatcher: Client;
const boards: Record<string, Board> = {};

async function board(yard: "NOR" | "MES", date: string): Promise<Board> {
  const r = await dispatcher.json(`/api/board?yard=${yard}&date=${date}`);
  expect(r.status).toBe(200);
  return r.body as Board;
}

const tomorrowIn = (tz: string) => addDays(todayIn(tz), 1);

beforeAll(async () => {
  dispatcher = await as("dispatcher");
  boards.NOR = await board("NOR", tomorrowIn("America/Chicago"));
  boards.MES = await board("MES", tomorrowIn("America/Denver"));
  boards.NOR_TODAY = await board("NOR", todayIn("America/Chicago"));
});
afterAll(() => db.destroy());

function card(b: Board, number: string) {
  const c = b.orders.find((o) => o.number === number);
  expect(c, `${number} on the board`).toBeTruthy();
  return c!;
}
function rulesOf(b: Board, number: string, only = CREW_RULES) {
  const c = card(b, number);
  return [...new Set(b.findings.filter((f) => f.workOrderId === String(c.id) && only.has(f.rule)).map((f) => f.rule))].sort();
}
function findingsOf(b: Board, number: string) {
  const c = card(b, number);
  return b.findings.filter((f) => f.workOrderId === String(c.id));
}

describe("the demo day's crew-rule findings are the expected ones", () => {
  it.each([
    // Fully crewed climbs: climber, observer with pole-top rescue, ground hand, lead → clear.
    ["NOR", "WO-26-0101", []],
    ["MES", "WO-26-0109", []],
    // Open climb: no one on site (1910.269(l)(2)(i)), no observer (common practice), no one
    // but a climber to rescue (1910.269(a)(2)(i)(B)).
    ["NOR", "WO-26-0102", ["CREW_MIN", "OBSERVER", "RESCUE"]],
    // Pole change-out with lead and a qualified operator: the template's five are not there
    // (policy) and no observer watches the derrick (1910.269(p)(4)(ii)). Its ticket is valid.
    ["NOR", "WO-26-0103", ["CREW_MIN", "OBSERVER"]],
    // Pole set whose ticket ran out today: LOCATE (one-call law).
    ["NOR", "WO-26-0104", ["CREW_MIN", "LOCATE", "OBSERVER"]],
    // Open bucket job: CREW_MIN, RESCUE on the ground, the bucket observer warning.
    ["NOR", "WO-26-0105", ["CREW_MIN", "OBSERVER", "RESCUE"]],
    // Anchor with a valid ticket: no LOCATE.
    ["NOR", "WO-26-0108", ["CREW_MIN", "OBSERVER"]],
    // Two days of digging, ticket valid for the first only: LOCATE (Corrections 7).
    ["NOR", "WO-26-0114", ["CREW_MIN", "LOCATE", "OBSERVER"]],
    // Patrols are outside the two-worker rule (1910.269(l)(2)): clear.
    ["NOR", "WO-26-0106", []],
    ["MES", "WO-26-0112", []],
    ["MES", "WO-26-0110", ["CREW_MIN", "OBSERVER"]],
    // A lead alone on a bucket job: he is the one aloft (no aerial seat filled), nobody on the
    // ground to rescue him or watch (Corrections 3 and 4).
    ["MES", "WO-26-0111", ["CREW_MIN", "OBSERVER", "RESCUE"]],
    // The three-day reconductor, de-energized beside a live 24.9 kV circuit: two qualified
    // workers, the rescuer on the ground, its shifts leave 13.5 h rest each night → clear.
    ["MES", "WO-26-0113", []],
  ] as const)("%s %s → %j", (yard, number, expected) => {
    expect(rulesOf(boards[yard], number)).toEqual([...expected].sort());
  });

  it("the fully crewed climbs carry no finding of any code", () => {
    for (const [yard, number] of [["NOR", "WO-26-0101"], ["MES", "WO-26-0109"]] as const) {
      expect(findingsOf(boards[yard], number).map((f) => `${f.rule}: ${f.message}`), number).toEqual([]);
    }
  });

  it("a visual line patrol carries no finding of any code: patrols are outside 1910.269(l)(2), and the patroller (the lead) holds class 3 gloves, whose 26.5 kV maximum use voltage covers the 24.9 kV line (1910.137 Table I-4)", () => {
    for (const [yard, number] of [["NOR", "WO-26-0106"], ["MES", "WO-26-0112"]] as const) {
      expect(findingsOf(boards[yard], number).map((f) => `${f.rule}: ${f.message}`), number).toEqual([]);
    }
  });

  it("the bucket observer finding is a warning, the rest of those blocks (CREW-CHECK.md, Corrections 4)", () => {
    const obs = findingsOf(boards.NOR, "WO-26-0105").filter((f) => f.rule === "OBSERVER");
    expect(obs.map((f) => f.level)).toEqual(["warn"]);
    const locate = findingsOf(boards.NOR, "WO-26-0114").find((f) => f.rule === "LOCATE")!;
    expect(locate.level).toBe("block");
    expect(locate.source).toMatch(/one-call/);
  });
});

describe("the demo day rings true to a line foreman", () => {
  it("the trouble call with a conductor down is tonight's emergency order, not tomorrow's 06:00 job", () => {
    expect(boards.NOR.orders.some((o) => o.number === "WO-26-0107")).toBe(false);
    const storm = card(boards.NOR_TODAY, "WO-26-0107");
    expect(storm.emergency).toBe(true);
    expect(storm.ruleType).toBe("storm");
    const startHour = Number(new Intl.DateTimeFormat("en-GB", { timeZone: "America/Chicago", hour: "2-digit", hourCycle: "h23" }).format(new Date(storm.start)));
    expect(startHour).toBeGreaterThanOrEqual(17); // this evening
    // The emergency exception makes the two-worker finding a warning part
    // (1910.269(l)(2)(ii)(C)); the open template keeps it on the board.
    expect(findingsOf(boards.NOR_TODAY, "WO-26-0107").find((f) => f.rule === "CREW_MIN")?.source).toMatch(/\(l\)\(2\)\(ii\)/);
  });

  it("single-phase taps are entered as phases 1 at 7.2 kV on a 12.47 kV system and read 12.47Y/7.2 kV (Corrections 8)", () => {
    for (const [yard, number] of [["NOR", "WO-26-0102"], ["NOR", "WO-26-0104"], ["MES", "WO-26-0109"], ["NOR", "WO-26-0114"]] as const) {
      const c = card(boards[yard], number);
      expect([c.phases, c.voltageKv, c.systemKv], number).toEqual([1, 7.2, 12.47]);
      expect(voltageLabel({ voltageKv: c.voltageKv, phases: c.phases, systemKv: c.systemKv })).toBe("12.47Y/7.2 kV");
    }
    // A three-phase order keeps its phase-to-phase voltage.
    expect(card(boards.NOR, "WO-26-0105").phases).toBe(3);
  });

  it("whoever takes the observer seat on a climbing job holds pole-top rescue", () => {
    for (const [yard, number] of [["NOR", "WO-26-0101"], ["MES", "WO-26-0109"]] as const) {
      const b = boards[yard];
      const observer = card(b, number).seats.find((s) => s.position === "observer")!.assignment!;
      const w = b.snapshot.workers.find((x) => x.id === String(observer.workerId))!;
      expect(w.credentials.map((c) => c.type), w.name).toContain("pole_top_rescue");
    }
  });

  it("a pole change-out has a seat for whoever transfers the conductors, and bucket work an aerial seat", () => {
    for (const [yard, number] of [["NOR", "WO-26-0103"], ["MES", "WO-26-0110"]] as const) {
      const c = card(boards[yard], number);
      expect(c.workTypeCode).toBe("pole_changeout");
      expect(c.seats.map((s) => s.position)).toEqual(expect.arrayContaining(["lead", "operator", "observer", "climber", "ground"]));
    }
    for (const [yard, number] of [["NOR", "WO-26-0105"], ["MES", "WO-26-0111"], ["MES", "WO-26-0113"]] as const)
      expect(card(boards[yard], number).seats.map((s) => s.position)).toContain("aerial");
  });

  it("qualified_electrical: some operators hold it and some do not (Corrections 1)", async () => {
    const rows = await db("credentials as c")
      .join("qualification_types as q", "q.id", "c.qualification_type_id")
      .join("workers as w", "w.id", "c.worker_id")
      .where({ "q.code": "qualified_electrical", "c.status": "current" })
      .pluck("w.employee_no");
    expect(rows).toEqual(expect.arrayContaining(["CP-1017", "CP-1020", "CP-2012"]));
    expect(rows).not.toContain("CP-1019");
    expect(rows).not.toContain("CP-2013");
    // On the Credentials desk the type is listed and locked like the other rule codes.
    const types = await (await as("hr")).json("/api/qualification-types");
    expect(types.status).toBe(200);
    const list = types.body.types as { code: string; locked?: boolean }[];
    expect(list.find((t) => t.code === "qualified_electrical")?.locked).toBe(true);
  });

  it("the multi-day reconductor lists one shift a day and sits beside a live circuit", () => {
    const c = card(boards.MES, "WO-26-0113");
    expect(c.energized).toBe(false);
    expect(c.nearEnergizedKv).toBe(24.9);
    expect(c.shifts).toHaveLength(3);
    const days = c.shifts!.map((s) => new Intl.DateTimeFormat("en-CA", { timeZone: "America/Denver" }).format(new Date(s.start)));
    expect(new Set(days).size).toBe(3);
  });
});
