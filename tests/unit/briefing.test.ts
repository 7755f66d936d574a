// The briefing's schemas and completion rules (lib/briefings/model.ts), no database.
import { describe, expect, it } from "vitest";
import {
  briefingDataSchema,
  completionIssues,
  emptyBriefing,
  failuresResolved,
  gearCheckSchema,
  poleCheckPasses,
  POLE_CHECK_KEYS,
} from "@/lib/briefings/model";

const crew = [
  { workerId: 1, position: "lead" },
  { workerId: 2, position: "climber" },
  { workerId: 3, position: "observer" },
];

function complete() {
  const d = emptyBriefing();
  d.procedure.steps = "Change out the pot.";
  d.controls.isolating_devices = true;
  for (const k of POLE_CHECK_KEYS) d.poleCheck.items[k].result = "pass";
  d.emergency = { hospital: "Regional", hospitalAddress: "1 Main", callerWorkerId: 3, rescuerWorkerId: 1, notes: "" };
  return d;
}

describe("briefing data", () => {
  it("fills every default: a 15 ft (4.6 m) drop zone (common practice), wood pole, nothing recorded", () => {
    const d = briefingDataSchema.parse({});
    expect(d.dropZone.radiusFt).toBe(15);
    expect(d.poleCheck.material).toBe("wood");
    expect(POLE_CHECK_KEYS.every((k) => d.poleCheck.items[k].result === null)).toBe(true);
    expect(d.hazards.weather).toEqual({ present: false, notes: "" });
  });

  it("refuses a drop zone smaller than the default", () => {
    expect(briefingDataSchema.safeParse({ dropZone: { radiusFt: 10 } }).success).toBe(false);
  });

  it("a complete briefing has no issues; an empty one names each missing field", () => {
    expect(completionIssues(complete(), crew)).toEqual([]);
    const fields = completionIssues(emptyBriefing(), crew).map((i) => i.field);
    expect(fields).toEqual(
      expect.arrayContaining(["procedure.steps", "controls.notes", "poleCheck.items.ground_line.result", "emergency.hospital", "emergency.callerWorkerId"]),
    );
  });

  it("the rescuer is not the climber, and only crew members are named", () => {
    const d = complete();
    d.emergency.rescuerWorkerId = 2;
    expect(completionIssues(d, crew).map((i) => i.field)).toContain("emergency.rescuerWorkerId");
    d.emergency.rescuerWorkerId = 99;
    expect(completionIssues(d, crew).map((i) => i.field)).toContain("emergency.rescuerWorkerId");
  });

  it("sound and rocking tests are for wood poles (1910.269 Appendix D); n/a only on other poles", () => {
    const d = complete();
    d.poleCheck.items.sound_test.result = "na";
    expect(completionIssues(d, crew).map((i) => i.field)).toContain("poleCheck.items.sound_test.result");
    d.poleCheck.material = "steel";
    expect(completionIssues(d, crew)).toEqual([]);
    expect(poleCheckPasses(d)).toBe(true);
    d.poleCheck.items.ground_line.result = "na";
    expect(completionIssues(d, crew).map((i) => i.field)).toContain("poleCheck.items.ground_line.result");
  });

  it("a failed check needs notes and a choice; hold is not a completion; secure or bucket with notes is", () => {
    const d = complete();
    d.poleCheck.items.ground_line.result = "fail";
    let fields = completionIssues(d, crew).map((i) => i.field);
    expect(fields).toEqual(expect.arrayContaining(["poleCheck.items.ground_line.notes", "poleCheck.failAction"]));
    d.poleCheck.items.ground_line.notes = "Soft wood";
    d.poleCheck.failAction = "hold";
    expect(completionIssues(d, crew).map((i) => i.message).join()).toMatch(/Hold the order/);
    d.poleCheck.failAction = "secure";
    fields = completionIssues(d, crew).map((i) => i.field);
    expect(fields).toEqual(["poleCheck.failActionNotes"]);
    d.poleCheck.failActionNotes = "Digger derrick boom holding the pole; new pole lashed";
    expect(completionIssues(d, crew)).toEqual([]);
    expect(poleCheckPasses(d)).toBe(false);
    expect(failuresResolved(d)).toBe(true);
  });
});

describe("gear check", () => {
  const base = {
    gloves: { result: "ok" as const, testedOn: "2026-10-01" },
    sleeves: { result: "ok" as const, testedOn: "2026-01-15" },
    belt: "ok" as const,
    fallArrest: "ok" as const,
    climbers: "ok" as const,
    hardHat: "ok" as const,
    frClothing: "ok" as const,
  };

  it("gloves within 6 months and sleeves within 12 of the work day pass (29 CFR 1910.137 Table I-5, recalled from memory)", () => {
    expect(gearCheckSchema({ workDate: "2026-12-02", climbing: true }).safeParse(base).success).toBe(true);
  });

  it("gloves tested 7 months before are out of test; a date after the work day is refused", () => {
    const old = gearCheckSchema({ workDate: "2026-12-02" }).safeParse({ ...base, gloves: { result: "ok", testedOn: "2026-05-01" } });
    expect(old.error?.issues[0].path).toEqual(["gloves", "testedOn"]);
    const future = gearCheckSchema({ workDate: "2026-12-02" }).safeParse({ ...base, gloves: { result: "ok", testedOn: "2026-12-03" } });
    expect(future.error?.issues[0].message).toMatch(/after the work day/);
  });

  it("a climber must check belt, fall arrest and climbers; a ground hand may mark them not used", () => {
    const ground = { ...base, belt: "na" as const, fallArrest: "na" as const, climbers: "na" as const };
    expect(gearCheckSchema({ workDate: "2026-12-02", climbing: false }).safeParse(ground).success).toBe(true);
    const r = gearCheckSchema({ workDate: "2026-12-02", climbing: true }).safeParse(ground);
    expect(r.error?.issues.map((i) => i.path[0])).toEqual(["belt", "fallArrest", "climbers"]);
  });

  it("an unanswered item is refused, naming it", () => {
    const { hardHat: _omit, ...rest } = base;
    const r = gearCheckSchema().safeParse(rest);
    expect(r.error?.issues[0].path).toEqual(["hardHat"]);
  });
});
