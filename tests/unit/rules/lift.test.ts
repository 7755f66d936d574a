// Lift figures: lead-line pull P = W (1+f)^n f / ((1+f)^N - 1), block load W + P, sling leg
// W / (legs x sin angle), rounded to 0.1 lb (CREW-CHECK.md). Checked against:
// - the contract's own worked example (640 lb on 3 parts over 3 sheaves, f = 0.10, two legs at 60°);
// - the frictionless case f = 0, where the pull is W / N;
// - a published worked example: Pipeline Rules of Thumb Handbook, "Find advantages of block and
//   tackle, taking into account pull out friction": a 4-part tackle with plain (journal) bearing
//   sheaves of 91.7% efficiency has a mechanical advantage of about 3.25, so a 3,250 lb load
//   needs about 1,000 lb on the lead line. A sheave efficiency E is a friction allowance
//   f = 1/E - 1 per sheave in the formula above.
// - sling-leg tension by angle: the sine rule every rigging handbook tabulates (a leg at 30° from
//   the horizontal carries the load of one leg doubled; at 45°, times 1.414; at 60°, times 1.155).
import { describe, expect, it } from "vitest";
import { leadLinePull, liftFigures, riggingOverloads, withLiftDefaults } from "@/lib/rules/lift";

describe("lift figures", () => {
  it("CREW-CHECK.md's example: 640 lb, 3 parts, 3 sheaves, f 0.10, 2 legs at 60° -> 257.4 / 897.4 / 369.5 lb", () => {
    expect(liftFigures({ loadLb: 640, partsOfLine: 3, sheaves: 3, slingLegs: 2, slingAngleDeg: 60 })).toMatchObject({
      leadLinePullLb: 257.4,
      blockLoadLb: 897.4,
      slingLegLb: 369.5,
    });
  });

  it.each([
    [1000, 1, 1000],
    [1000, 2, 500],
    [1000, 3, 333.3],
    [1000, 4, 250],
    [2250, 5, 450],
  ])("f = 0: %s lb on %s parts pulls W / N = %s lb, whatever the sheave count", (w, n, p) => {
    for (const sheaves of [0, n, n + 1]) {
      const f = liftFigures({ loadLb: w, partsOfLine: n, sheaves, frictionPerSheave: 0 })!;
      expect(f.leadLinePullLb).toBe(p);
      expect(f.blockLoadLb).toBe(Math.round((w + w / n) * 10) / 10);
    }
  });

  it("the exact form tends to W / N as friction vanishes (no jump at f = 0)", () => {
    expect(leadLinePull(1000, 4, 4, 1e-9)).toBeCloseTo(250, 4);
  });

  it("Pipeline Rules of Thumb Handbook: 4-part tackle, 91.7% sheaves, 3,250 lb -> about 1,000 lb lead line (MA about 3.25)", () => {
    const f = 1 / 0.917 - 1;
    const p = leadLinePull(3250, 4, 4, f);
    // The handbook rounds the mechanical advantage to 3.25; the exact series gives 3.237.
    expect(3250 / p).toBeCloseTo(3.24, 2);
    expect(Math.abs(p - 1000) / 1000).toBeLessThan(0.01);
  });

  it("with the usual 10% per sheave a single sheave needs 10% more than the load (1 part over 1 sheave)", () => {
    expect(liftFigures({ loadLb: 500, partsOfLine: 1 })).toMatchObject({ leadLinePullLb: 550, blockLoadLb: 1050, slingLegLb: 500 });
  });

  it.each([
    [90, 1, 1000],
    [60, 1, 1154.7],
    [45, 1, 1414.2],
    [30, 1, 2000],
    [60, 2, 577.4],
    [30, 2, 1000],
    [90, 4, 250],
  ])("sling at %s° from horizontal, %s legs: each leg carries %s lb of a 1,000 lb load", (angle, legs, leg) => {
    expect(liftFigures({ loadLb: 1000, partsOfLine: 2, slingLegs: legs, slingAngleDeg: angle })!.slingLegLb).toBe(leg);
  });

  it("defaults: sheaves = parts of line, f = 0.10, one leg at 90°", () => {
    expect(withLiftDefaults({ loadLb: 640, partsOfLine: 3 })).toEqual({
      loadLb: 640,
      partsOfLine: 3,
      sheaves: 3,
      frictionPerSheave: 0.1,
      blockWllLb: null,
      lineWllLb: null,
      slingWllLb: null,
      slingLegs: 1,
      slingAngleDeg: 90,
    });
    expect(liftFigures(null)).toBeNull();
  });

  it("overloads name the part, the force and the limit; a force equal to the limit is not over it", () => {
    const lift = withLiftDefaults({ loadLb: 640, partsOfLine: 3, blockWllLb: 897.4, lineWllLb: 250, slingLegs: 2, slingAngleDeg: 60, slingWllLb: 300 });
    expect(riggingOverloads(lift)).toEqual([
      { part: "line", forceLb: 257.4, limitLb: 250 },
      { part: "sling leg", forceLb: 369.5, limitLb: 300 },
    ]);
    expect(riggingOverloads({ ...lift, blockWllLb: 897.3, lineWllLb: null, slingWllLb: null })).toEqual([{ part: "block", forceLb: 897.4, limitLb: 897.3 }]);
  });
});
