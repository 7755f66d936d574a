import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { gearCsvRowSchema, gearCreateSchema, gearState, nextTestDue } from "@/lib/gear/model";
import { parseGearCsv, planGearImport, unguard, type GearLookups } from "@/lib/gear/csv";
import { liftPlanSchema, isLiftingKind, toRuleLift } from "@/lib/gear/lift";
import { approachFor, liftFiguresFor } from "@/lib/gear/figures";

// The rubber goods register's own arithmetic and checks (no database). Sources beside each.

describe("next electrical test (29 CFR 1910.137 Table I-5)", () => {
  // Table I-5: rubber insulating gloves "before first issue and every 6 months thereafter";
  // rubber insulating sleeves "before first issue and every 12 months thereafter".
  it.each([
    ["rubber_gloves", "2027-01-20", "2027-07-20"],
    ["rubber_gloves", "2026-08-31", "2027-02-28"], // no 31 February: the month's last day
    ["rubber_gloves", "2027-08-31", "2028-02-29"], // 2028 is a leap year
    ["rubber_sleeves", "2026-09-02", "2027-09-02"],
    ["rubber_sleeves", "2028-02-29", "2029-02-28"],
  ] as const)("%s tested %s fall due %s", (kind, tested, due) => {
    expect(nextTestDue(kind, tested)).toBe(due);
  });

  it("usable on the due date, overdue the day after; due within 30 days is on the due list", () => {
    const g = { kind: "rubber_gloves" as const, testedOn: "2027-01-20" };
    expect(gearState(g, "2027-07-20")).toMatchObject({ state: "due", daysLeft: 0 });
    expect(gearState(g, "2027-07-21")).toMatchObject({ state: "overdue", daysLeft: -1 });
    expect(gearState(g, "2027-06-20")).toMatchObject({ state: "due", daysLeft: 30 });
    expect(gearState(g, "2027-06-19")).toMatchObject({ state: "ok", daysLeft: 31 });
    expect(gearState({ ...g, retiredOn: "2027-02-01" }, "2027-03-01").state).toBe("retired");
  });
});

describe("schemas", () => {
  it("a class outside 1910.137 Table I-4 (00, 0, 1, 2, 3, 4) names the field", () => {
    const r = gearCreateSchema.safeParse({ workerId: 1, kind: "rubber_gloves", class: "5", serial: "A1", testedOn: "2027-01-01" });
    expect(r.success).toBe(false);
    expect(r.error!.issues[0].path).toEqual(["class"]);
    for (const c of ["00", "0", "1", "2", "3", "4"]) {
      expect(gearCreateSchema.safeParse({ workerId: 1, kind: "rubber_gloves", class: c, serial: "A1", testedOn: "2027-01-01" }).success).toBe(true);
    }
  });

  it("the CSV row reads 'gloves' and 'class 2' as the export's rubber_gloves and 2", () => {
    const r = gearCsvRowSchema.parse({ serial: "S1", employee_no: "CP-1", kind: "Gloves", class: "Class 2", tested_on: "2027-01-01" });
    expect(r).toMatchObject({ kind: "rubber_gloves", class: "2", size: null, issued_on: null, retired_on: null });
  });

  it.each([
    [{ loadLb: -1 }, "loadLb"],
    [{ loadLb: 0 }, "loadLb"],
    [{ partsOfLine: 0 }, "partsOfLine"],
    [{ partsOfLine: 1.5 }, "partsOfLine"],
    [{ slingAngleDeg: 0.5 }, "slingAngleDeg"],
    [{ slingAngleDeg: 90.1 }, "slingAngleDeg"],
    [{ slingLegs: 0 }, "slingLegs"],
  ])("lift plan %o is refused naming %s", (patch, field) => {
    const r = liftPlanSchema.safeParse({ loadLb: 640, partsOfLine: 3, ...patch });
    expect(r.success).toBe(false);
    expect(r.error!.issues[0].path).toEqual([field]);
  });
});

describe("CSV", () => {
  it("our export's formula guard reads back (papaparse escapeFormulae prefixes a quote)", () => {
    const csv = Papa.unparse([["serial"], ["=HYPERLINK(1)"], ["-12"], ["plain"]], { escapeFormulae: true });
    const cells = Papa.parse<string[]>(csv).data.slice(1).map((r) => unguard(r[0]));
    expect(cells).toEqual(["=HYPERLINK(1)", "-12", "plain"]);
    expect(unguard("'quoted text")).toBe("'quoted text"); // a quote before ordinary text stays
  });

  const lookups = (): GearLookups => ({
    workers: new Map([["cp-1", { id: 1, today: "2027-03-01" }]]),
    existing: new Map([
      ["s-1", { id: 10, serial: "S-1", workerId: 1, kind: "rubber_gloves", class: "2", size: "10", testedOn: "2027-01-01", issuedOn: null, retiredOn: null }],
    ]),
  });
  const file = (...rows: string[]) => ["serial,employee_no,kind,class,size,tested_on", ...rows].join("\r\n");

  it("an unchanged row is unchanged, a changed one an update naming what changed, a new serial a create", () => {
    const p = parseGearCsv(file("S-1,CP-1,rubber_gloves,2,10,2027-01-01", "s-2,CP-1,rubber_sleeves,2,,2027-02-01"));
    expect(p.issues).toEqual([]);
    expect(planGearImport(p.rows, lookups()).plan.map((x) => x.action)).toEqual(["unchanged", "create"]);
    const q = parseGearCsv(file("S-1,CP-1,rubber_gloves,3,10,2027-02-15"));
    const plan = planGearImport(q.rows, lookups()).plan;
    expect(plan[0]).toMatchObject({ action: "update", id: 10, changed: ["class", "testedOn"] });
  });

  it("every problem with its own line (header = line 1; a quoted line break in row 2 counts) and no plan", () => {
    const p = parseGearCsv(file('S-9,CP-1,rubber_gloves,2,"10\nlong",2027-01-01', "S-8,CP-9,rubber_gloves,2,,2027-01-01", "S-7,CP-1,rubber_gloves,2,,2027-03-02", "S-9,CP-1,rubber_gloves,2,,2027-01-01"));
    const r = planGearImport(p.rows, lookups());
    expect(r.plan).toEqual([]);
    expect(r.issues.map((i) => `${i.line}:${i.field}`)).toEqual(["4:employee_no", "5:tested_on", "6:serial"]);
  });

  it("a header without a required column is refused before any row", () => {
    expect(parseGearCsv("serial,employee_no,kind,tested_on\r\nS-1,CP-1,rubber_gloves,2027-01-01").issues).toEqual([{ line: 1, field: "class", message: "missing column in the header row" }]);
  });
});

describe("field figures through the rule engine", () => {
  it("approach: the yard's elevation unless the order has its own (Table R-6 5.1–15.0 kV row 0.65 m / 2.14 ft, Table R-5)", () => {
    const site = { energized: true, voltageKv: 12.47, phases: 3, systemKv: null, yardElevationM: 1650 };
    // Table R-5: above 1,500 m up to 1,800 m the factor is 1.08: 0.65 × 1.08 = 0.702 → 0.70 m; 2.14 × 1.08 = 2.3112 → 2.31 ft.
    expect(approachFor({ ...site, altitudeM: null })).toMatchObject({ meters: 0.7, feet: 2.31, altitudeFactor: 1.08 });
    // The order's own 800 m: at or below 900 m the factor is 1.00.
    expect(approachFor({ ...site, altitudeM: 800 })).toMatchObject({ meters: 0.65, feet: 2.14, altitudeFactor: 1 });
    expect(approachFor({ ...site, energized: false, altitudeM: null })).toBeNull();
  });

  it("lift: a heavier weight read on site replaces the nameplate; each part against its WLL", () => {
    const plan = { loadLb: 640, siteWeightLb: 700, partsOfLine: 1, sheaves: 1, frictionPerSheave: 0, blockWllLb: 2000, lineWllLb: 650, slingWllLb: null, slingLegs: 1, slingAngleDeg: 90 };
    expect(toRuleLift(plan).loadLb).toBe(700);
    // f = 0: P = W / N = 700 lb on one part of line, over the 650 lb line; block W + P = 1,400 lb.
    const f = liftFiguresFor(plan)!;
    expect(f.checks).toEqual([
      { part: "block", forceLb: 1400, limitLb: 2000, over: false },
      { part: "line", forceLb: 700, limitLb: 650, over: true },
      { part: "sling leg", forceLb: 700, limitLb: null, over: false },
    ]);
  });

  it("a transformer set or change-out is a lifting kind by its work type or title", () => {
    expect(isLiftingKind({ workTypeName: "Climbing transformer change-out" })).toBe(true);
    expect(isLiftingKind({ title: "Set 50 kVA transformer, pole N-2" })).toBe(true);
    expect(isLiftingKind({ workTypeName: "Line patrol", title: "Feeder 3 patrol" })).toBe(false);
  });
});
