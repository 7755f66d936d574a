import { describe, expect, it } from "vitest";
import { GROUND_LINE_HINTS, POLE_CHECKS, POLE_MATERIALS, poleCheckHint } from "@/lib/briefings/model";

// The ground-line check reads differently by pole material. Common practice (Appendix D to
// 29 CFR 1910.269 covers wood poles only: decay at and just below the ground line); steel
// poles corrode at and below the ground line; concrete poles crack and spall until the
// reinforcing steel shows (utility pole-inspection practice, recalled from memory).
describe("ground-line hint by pole material", () => {
  it("has a hint for every material the briefing offers", () => {
    for (const m of POLE_MATERIALS) expect(GROUND_LINE_HINTS[m].length).toBeGreaterThan(20);
  });

  it.each([
    ["wood", /rot/],
    ["steel", /rust|corro/i],
    ["steel", /below the ground line/],
    ["concrete", /crack/],
    ["concrete", /spalling/],
    ["concrete", /rebar/],
  ])("%s: %s", (material, re) => {
    expect(poleCheckHint("ground_line", material)).toMatch(re);
  });

  it("the general hint (PDF, no material yet) names steel and concrete too, not only wood", () => {
    const general = POLE_CHECKS.find((c) => c.key === "ground_line")!.hint;
    expect(general).toMatch(/Steel/);
    expect(general).toMatch(/Concrete/);
    expect(poleCheckHint("ground_line", undefined)).toBe(general);
  });

  it("other checks keep their own hint whatever the material", () => {
    expect(poleCheckHint("sound_test", "steel")).toBe(POLE_CHECKS.find((c) => c.key === "sound_test")!.hint);
  });
});
