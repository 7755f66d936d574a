// The crew conditions of one order as rows of the model (CREW-CHECK.md; the engine in lib/rules
// stays the judge, this only steers the solver towards crews it will accept): the order's
// minimum crew, FIRST_AID, RESCUE, CREW_MIN and an apprentice only beside a journeyman.

import { energizedAtLeast, ENERGIZED_WORK_KV, isClimbingWork, isJourneyLevel } from "@/lib/rules/common";
import { twoWorkerRuleApplies } from "@/lib/rules/crew-min";
import type { Position, Worker } from "@/lib/rules/types";
import { G, type Ctx, type FillRun, type Group } from "./context";
import type { ModelBuilder } from "./build-model";

/** Adds the order's crew rows; returns the conditions the order needed (for the explanations). */
export function addCrewRows(mb: ModelBuilder, run: FillRun, c: Ctx, yc: number, off: Set<Group>): Set<Group> {
  const { ix } = run;
  const { lp } = mb;
  const o = c.fo.id;
  const need = new Set<Group>();
  const order = c.order;
  const E = c.existing;
  const candIds = [...c.cand.keys()];
  const workersOf = (pred: (w: Worker) => boolean) => candIds.filter((w) => pred(ix.workers.get(w)!));
  const sumPeople = (ws: string[]) => ws.flatMap((w) => mb.person(o, w));

  // The order's own minimum, counting everyone on site.
  if (order.minCrew !== null && order.minCrew > E.length && !off.has("MIN_CREW")) {
    need.add("MIN_CREW");
    lp.row([...sumPeople(candIds), [yc, -(order.minCrew - E.length)]], 0, Infinity);
  }
  // FIRST_AID: energized work, two or more on site, two trained.
  if (energizedAtLeast(order, ENERGIZED_WORK_KV) && !off.has("FIRST_AID")) {
    const trainedE = E.filter((w) => ix.holdsThrough(w, "first_aid_cpr", order)).length;
    const lead = c.open.get("lead")?.length ?? 0;
    const minPeople = E.length + c.openCount - Math.min(lead, c.openCount - lead);
    if (trainedE < 2 && E.length + c.openCount >= 2) {
      need.add("FIRST_AID");
      const want = 2 - trainedE;
      const terms = sumPeople(workersOf((w) => ix.holdsThrough(w, "first_aid_cpr", order)));
      if (minPeople <= 1) for (const w of candIds) { const dc = mb.vars.get(o)!.get(w)!.d; if (dc >= 0) terms.push([dc, want]); }
      lp.row([...terms, [yc, -want]], 0, Infinity, true);
    }
  }
  if (!off.has("RESCUE")) addRescueRows(mb, run, c, yc, need, workersOf);
  // CREW_MIN: two qualified workers on energized work above 600 V (the exceptions only warn).
  const jE = E.filter((w) => isJourneyLevel(w.classification)).length;
  const qualifiedOperator = (w: Worker) => w.classification === "operator" && ix.holdsThrough(w, "qualified_electrical", order);
  const oE = E.filter(qualifiedOperator).length;
  const aE = E.filter((w) => w.classification === "apprentice").length;
  const J = sumPeople(workersOf((w) => isJourneyLevel(w.classification)));
  const O = sumPeople(workersOf(qualifiedOperator));
  const A = sumPeople(workersOf((w) => w.classification === "apprentice"));
  const crewMinBlocks = twoWorkerRuleApplies(order, ix.equipment.of(o)) && (!order.exception || ix.policy.levels?.CREW_MIN === "block");
  if (crewMinBlocks && jE + oE < 2 && !off.has("CREW_MIN")) {
    need.add("CREW_MIN");
    lp.row([...J, ...O, ...A, [yc, -2]], -(jE + oE + aE), Infinity);
    if (jE === 0) {
      const g = mb.col(G, 0, 0);
      lp.row([...J, ...O, [g, 2], [yc, -2]], -(jE + oE), Infinity);
      lp.row([...J, [g, -1]], 0, Infinity);
    }
  }
  // An apprentice only beside a journeyman or crew lead.
  if (jE === 0 && !off.has("APPRENTICE")) {
    if (A.length) {
      need.add("APPRENTICE");
      lp.row([...A, ...J.map(([k, v]) => [k, -v * c.openCount] as [number, number])], -Infinity, 0);
    }
    if (aE > 0) {
      need.add("APPRENTICE");
      lp.row([...J, [yc, -1]], 0, Infinity);
    }
  }
  return need;
}

/** RESCUE: someone other than the exposed worker trained to get them down. */
function addRescueRows(mb: ModelBuilder, run: FillRun, c: Ctx, yc: number, need: Set<Group>, workersOf: (pred: (w: Worker) => boolean) => string[]) {
  const { ix } = run;
  const o = c.fo.id;
  const order = c.order;
  const E = c.existing;
  const positionsOf = ix.crew(o).positionsOf;
  const hasClimber = c.open.has("climber") || E.some((w) => positionsOf.get(w.id)?.has("climber"));
  // Who is aloft (Corrections 3, lib/rules/common.ts aloftIds): climbers; on bucket work
  // also the aerial seats, and the lead when the order has neither an aerial nor a climber
  // seat (filled or open).
  const bucketSeat = (p: Position) => c.open.has(p) || E.some((w) => positionsOf.get(w.id)?.has(p));
  const aloftSeats: Position[] =
    order.workType === "bucket"
      ? bucketSeat("aerial") || bucketSeat("climber")
        ? ["climber", "aerial"]
        : ["climber", "aerial", "lead"]
      : ["climber"];
  const rescue = (code: string, skip: Position[]) => {
    if (E.some((w) => !skip.some((p) => positionsOf.get(w.id)?.has(p)) && ix.holdsThrough(w, code, order))) return;
    need.add("RESCUE");
    const terms = workersOf((w) => ix.holdsThrough(w, code, order)).flatMap((w) => mb.personBut(o, w, skip));
    mb.lp.row([...terms, [yc, -1]], 0, Infinity);
  };
  if (isClimbingWork(order, hasClimber)) rescue("pole_top_rescue", ["climber"]);
  if (order.workType === "bucket") rescue("aerial_rescue", aloftSeats);
}
