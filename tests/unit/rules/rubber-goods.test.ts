// RUBBER_GOODS against 29 CFR 1910.137 Table I-4 (maximum use voltage per class: 00 500 V,
// 0 1,000 V, 1 7,500 V, 2 17,000 V, 3 26,500 V, 4 36,000 V, AC rms) and Table I-5 (gloves
// retested every 6 months, sleeves every 12 months), with (c)(2)(i) and (c)(2)(viii).
import { describe, expect, it } from "vitest";
import { addMonths, classFor, inTestThrough, MAX_USE_VOLTS } from "@/lib/rules/gear";
import { rubberGoods } from "@/lib/rules/rubber-goods";
import type { GearItem, Position } from "@/lib/rules/types";
import { brief, day, DAY, order, run, worker, type OrderOpts } from "./fixtures";

const gloves = (cls: GearItem["class"], testedOn: string | null = "2027-02-01"): GearItem => ({ kind: "rubber_gloves", class: cls, testedOn });
const sleeves = (cls: GearItem["class"], testedOn: string | null = "2027-02-01"): GearItem => ({ kind: "rubber_sleeves", class: cls, testedOn });

function check(gear: GearItem[] | undefined, opts: OrderOpts = {}, position: Position = "climber") {
  const w = { ...worker("w1", "journeyman", { name: "Rosa Delgado" }), ...(gear ? { gear } : {}) };
  return run(rubberGoods, day([w], [order("o1", opts)], [["o1", "w1", position]]));
}

describe("Table I-4: the class's maximum use voltage must reach the order's voltage", () => {
  it("the table itself", () => {
    expect(MAX_USE_VOLTS).toEqual({ "00": 500, "0": 1000, "1": 7500, "2": 17000, "3": 26500, "4": 36000 });
  });

  it.each([
    // [class held, highest voltage it covers (kV), a voltage just above it, the class that voltage needs]
    ["00", 0.5, 0.6, "0"],
    ["0", 1.0, 1.1, "1"],
    ["1", 7.5, 7.62, "2"],
    ["2", 17.0, 17.1, "3"],
    ["3", 26.5, 26.6, "4"],
  ] as const)("class %s covers %s kV; at %s kV it needs class %s (Table I-4)", (cls, top, above, needed) => {
    expect(check([gloves(cls)], { voltageKv: top })).toEqual([]);
    const f = check([gloves(cls)], { voltageKv: above });
    expect(brief(f)).toEqual(["o1/w1/block"]);
    expect(f[0].message).toContain(`class ${needed} or higher`);
    expect(f[0].source).toContain("Table I-4");
    expect(classFor(above)).toBe(needed);
  });

  it("class 4 covers 36 kV (Table I-4's highest); above it rubber-glove work is not possible and live-line tools are needed", () => {
    expect(check([gloves("4")], { voltageKv: 36 })).toEqual([]);
    const f = check([gloves("4")], { voltageKv: 46 });
    expect(brief(f)).toEqual(["o1/w1/block"]);
    expect(f[0].message).toMatch(/Rubber-glove work is not possible/);
    expect(f[0].message).toMatch(/live-line tools/);
    expect(classFor(36.1)).toBeNull();
  });

  it("a 12.47 kV three-phase line needs class 2: class 1 is short, class 2 and 3 are fine", () => {
    expect(check([gloves("1")], { voltageKv: 12.47 })[0].message).toContain("needs class 2 or higher (rated for 17 kV)");
    expect(check([gloves("2")], { voltageKv: 12.47 })).toEqual([]);
    expect(check([gloves("3")], { voltageKv: 12.47 })).toEqual([]);
  });

  it("Table I-4's footnote: on a single-phase tap (phases 1) the voltage to ground is compared, so a 7.2 kV tap needs class 1", () => {
    expect(check([gloves("1")], { voltageKv: 7.2, phases: 1 })).toEqual([]);
    expect(check([gloves("1")], { voltageKv: 14.4, phases: 1 })[0].message).toContain("class 2 or higher");
  });

  it("the best of several pairs counts", () => {
    expect(check([gloves("0"), gloves("2")], { voltageKv: 12.47 })).toEqual([]);
  });

  it("no gloves at all, an empty gear list included, blocks and says which class", () => {
    expect(check([], { voltageKv: 12.47 })[0].message).toContain("has no rubber gloves on record; the work needs class 2 rubber gloves");
    expect(check([sleeves("2")], { voltageKv: 12.47 })[0].message).toContain("has no rubber gloves on record");
  });
});

describe("Table I-5: gloves every 6 months, sleeves every 12 months, through the order's last day", () => {
  it(`gloves tested 6 months before the work day (${DAY}) are in test; a day earlier they are not`, () => {
    expect(check([gloves("2", "2026-10-06")])).toEqual([]);
    const f = check([gloves("2", "2026-10-05")]);
    expect(brief(f)).toEqual(["o1/w1/block"]);
    expect(f[0].message).toContain("last tested on 5 October 2026, in test only through 5 April 2027 (every 6 months)");
    expect(f[0].source).toContain("Table I-5");
  });

  it("a month-end test date keeps them in test to the end of the shorter month", () => {
    expect(addMonths("2026-08-31", 6)).toBe("2027-02-28");
    expect(addMonths("2026-10-31", 6)).toBe("2027-04-30");
    expect(inTestThrough(gloves("2", "2026-10-31"))).toBe("2027-04-30");
    expect(inTestThrough(sleeves("2", "2026-04-30"))).toBe("2027-04-30");
  });

  it("gloves never tested are not in service", () => {
    expect(check([gloves("2", null)])[0].message).toContain("no electrical test on record");
  });

  it("a multi-day order needs the test to hold through its last day, not only the first", () => {
    const span = { start: `${DAY}T07:00`, end: "2027-04-09T15:30" };
    expect(check([gloves("2", "2026-10-09")], span)).toEqual([]);
    const f = check([gloves("2", "2026-10-07")], span);
    expect(f[0].message).toContain("in test only through 7 April 2027");
    expect(f[0].message).toContain("through the order's last day, 9 April 2027");
    // An order that ends at midnight ends on the day before.
    expect(check([gloves("2", "2026-10-07")], { start: `${DAY}T07:00`, end: "2027-04-08T00:00" })).toEqual([]);
  });

  it("sleeves, when listed, every 12 months; no sleeves listed is fine", () => {
    expect(check([gloves("2"), sleeves("2", "2026-04-06")])).toEqual([]);
    const f = check([gloves("2"), sleeves("2", "2026-04-05")]);
    expect(brief(f)).toEqual(["o1/w1/block"]);
    expect(f[0].message).toContain("sleeves last tested on 5 April 2026, in test only through 5 April 2027 (every 12 months)");
    expect(check([gloves("2")])).toEqual([]);
  });

  it("gloves and sleeves both wrong: one finding naming both", () => {
    const f = check([gloves("0"), sleeves("2", "2025-01-01")], { voltageKv: 12.47 });
    expect(f).toHaveLength(1);
    expect(f[0].message).toMatch(/class 0.*; and has sleeves/);
  });
});

describe("who and when", () => {
  it.each(["climber", "aerial", "lead"] as const)("a %s on energized work is checked", (p) => {
    expect(brief(check([gloves("0")], { voltageKv: 12.47 }, p))).toEqual(["o1/w1/block"]);
  });

  it.each(["ground", "observer", "operator", "driver"] as const)("a %s is not", (p) => {
    expect(check([gloves("0")], { voltageKv: 12.47 }, p)).toEqual([]);
  });

  it("workers without a gear field are not tracked and not checked", () => {
    expect(check(undefined, { voltageKv: 12.47 })).toEqual([]);
  });

  it("energized work at 0.05 kV or more only", () => {
    expect(check([], { voltageKv: 0.024 })).toEqual([]);
    expect(check([], { voltageKv: 12.47, energized: false })).toEqual([]);
    expect(brief(check([], { voltageKv: 0.05 }))).toEqual(["o1/w1/block"]);
    expect(check([gloves("00")], { voltageKv: 0.24 })).toEqual([]);
  });

  it("an unknown voltage: one order-level block asking for it; gloves of any class in test satisfy the person", () => {
    const f = check([gloves("00")], { voltageKv: null });
    expect(brief(f)).toEqual(["o1/-/block"]);
    expect(f[0].message).toContain("voltage is not recorded");
    expect(brief(check([gloves("2", "2025-01-01")], { voltageKv: null }))).toEqual(["o1/-/block", "o1/w1/block"]);
  });

  it("one finding per person, even holding several gloved positions", () => {
    const w = { ...worker("w1", "journeyman"), gear: [gloves("0")] };
    const f = run(rubberGoods, day([w], [order("o1")], [["o1", "w1", "lead"], ["o1", "w1", "climber"]]));
    expect(brief(f)).toEqual(["o1/w1/block"]);
  });
});
