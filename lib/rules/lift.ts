// Lift figures for a planned lift with rope blocks, a hand line and slings. Pure, client-safe.
//
// Lead-line pull for load W on N parts of line running over n sheaves, each sheave costing a
// fraction f of the line's tension in friction (the usual allowance for plain-bearing sheaves is
// f = 0.10, common practice):
//
//     P = W x (1 + f)^n x f / ((1 + f)^N - 1)
//
// the exact form of the textbook series (each part of line carries (1 + f) times less than the
// part after it); with f = 0 it is W / N. The upper block carries the load and the lead line
// hauled downward from the ground: W + P. Each of k sling legs at angle a from the horizontal
// carries W / (k x sin a). Every figure is rounded to 0.1 lb.

import type { Lift, LiftFigures } from "./types";
import { LIFT_DEFAULTS } from "./equipment-types";

export const LIFT_SOURCE =
  "rope-block lead-line pull P = W(1+f)^n f / ((1+f)^N - 1), block load W + P, sling leg W / (legs x sin angle); friction allowance per sheave is common practice";

/** Rounds to 0.1 lb (half away from zero). */
export function tenth(x: number): number {
  return Math.round(x * 10 + (x >= 0 ? 1e-9 : -1e-9)) / 10;
}

/** The lead-line pull (unrounded). */
export function leadLinePull(loadLb: number, partsOfLine: number, sheaves: number, friction: number): number {
  if (friction === 0) return loadLb / partsOfLine;
  const g = 1 + friction;
  return (loadLb * g ** sheaves * friction) / (g ** partsOfLine - 1);
}

/** Each sling leg's tension (unrounded). */
export function slingLegTension(loadLb: number, legs: number, angleDeg: number): number {
  // sin 90° is exactly 1 in the formula; Math.sin(Math.PI / 2) is 1 too, but say so plainly.
  const s = angleDeg === 90 ? 1 : Math.sin((angleDeg * Math.PI) / 180);
  return loadLb / (legs * s);
}

/** A lift with its defaults filled in (sheaves = partsOfLine, f = 0.10, 1 leg at 90°). */
export function withLiftDefaults(lift: Partial<Lift> & Pick<Lift, "loadLb" | "partsOfLine">): Lift {
  return {
    loadLb: lift.loadLb,
    partsOfLine: lift.partsOfLine,
    sheaves: lift.sheaves ?? lift.partsOfLine,
    frictionPerSheave: lift.frictionPerSheave ?? LIFT_DEFAULTS.frictionPerSheave,
    blockWllLb: lift.blockWllLb ?? null,
    lineWllLb: lift.lineWllLb ?? null,
    slingWllLb: lift.slingWllLb ?? null,
    slingLegs: lift.slingLegs ?? LIFT_DEFAULTS.slingLegs,
    slingAngleDeg: lift.slingAngleDeg ?? LIFT_DEFAULTS.slingAngleDeg,
  };
}

/** The lift's figures (null without a lift), rounded to 0.1 lb. */
export function liftFigures(lift: (Partial<Lift> & Pick<Lift, "loadLb" | "partsOfLine">) | null | undefined): LiftFigures | null {
  if (!lift) return null;
  const l = withLiftDefaults(lift);
  const p = leadLinePull(l.loadLb, l.partsOfLine, l.sheaves, l.frictionPerSheave);
  return {
    leadLinePullLb: tenth(p),
    blockLoadLb: tenth(l.loadLb + p),
    slingLegLb: tenth(slingLegTension(l.loadLb, l.slingLegs, l.slingAngleDeg)),
    source: LIFT_SOURCE,
  };
}

export interface RiggingOverload {
  part: "block" | "line" | "sling leg";
  forceLb: number;
  limitLb: number;
}

/**
 * The parts whose computed force (rounded to 0.1 lb, as shown) exceeds their working load
 * limit; a part without a stated limit is not checked.
 */
export function riggingOverloads(lift: Lift): RiggingOverload[] {
  const f = liftFigures(lift)!;
  const out: RiggingOverload[] = [];
  if (lift.blockWllLb !== null && f.blockLoadLb > lift.blockWllLb) out.push({ part: "block", forceLb: f.blockLoadLb, limitLb: lift.blockWllLb });
  if (lift.lineWllLb !== null && f.leadLinePullLb > lift.lineWllLb) out.push({ part: "line", forceLb: f.leadLinePullLb, limitLb: lift.lineWllLb });
  if (lift.slingWllLb !== null && f.slingLegLb > lift.slingWllLb) out.push({ part: "sling leg", forceLb: f.slingLegLb, limitLb: lift.slingWllLb });
  return out;
}
