import { approachDistance } from "@/lib/rules/approach";
import { liftFigures, riggingOverloads, withLiftDefaults } from "@/lib/rules/lift";
import type { Approach, LiftFigures } from "@/lib/rules/types";
import { toRuleLift, type LiftPlan } from "./lift";

// The field figures as the order page and the briefing show them: the rule engine's own
// functions (lib/rules/approach.ts, lib/rules/lift.ts) over the stored order and plan, so the
// screens and the RIGGING finding can never disagree. Client-safe.

export interface SiteInput {
  energized: boolean;
  voltageKv: number | null;
  phases: number | null;
  systemKv: number | null;
  /** The order's own altitude, when it overrides the yard's. */
  altitudeM: number | null;
  yardElevationM: number;
}

/** The elevation the order is worked at: its own override, else its yard's. */
export const siteAltitude = (s: Pick<SiteInput, "altitudeM" | "yardElevationM">) => s.altitudeM ?? s.yardElevationM ?? 0;

export function approachFor(s: SiteInput): Approach | null {
  return approachDistance({
    energized: s.energized,
    voltageKv: s.voltageKv,
    phases: s.phases ?? 3,
    systemKv: s.systemKv,
    altitudeM: siteAltitude(s),
  });
}

export interface LiftCheck {
  part: "block" | "line" | "sling leg";
  forceLb: number;
  limitLb: number | null;
  over: boolean;
}

/** The plan's figures and each part's force against its WLL (null limit = none stated). */
export function liftFiguresFor(plan: Parameters<typeof toRuleLift>[0]): (LiftFigures & { loadLb: number; checks: LiftCheck[] }) | null {
  const lift = withLiftDefaults(toRuleLift(plan));
  const f = liftFigures(lift);
  if (!f) return null;
  const over = new Set(riggingOverloads(lift).map((o) => o.part));
  return {
    ...f,
    loadLb: lift.loadLb,
    checks: [
      { part: "block", forceLb: f.blockLoadLb, limitLb: lift.blockWllLb, over: over.has("block") },
      { part: "line", forceLb: f.leadLinePullLb, limitLb: lift.lineWllLb, over: over.has("line") },
      { part: "sling leg", forceLb: f.slingLegLb, limitLb: lift.slingWllLb, over: over.has("sling leg") },
    ],
  };
}

export type { LiftPlan };
