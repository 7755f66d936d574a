// Why each proposed person: the order's priority, their overtime against the others eligible,
// home yard, why they lead, the crew conditions they are one of few to meet, yesterday's pairs.

import { isJourneyLevel } from "@/lib/rules/common";
import type { Assignment, Position, Worker } from "@/lib/rules/types";
import { overtimeTenths, priorityOf } from "../objective";
import type { FillWorker } from "../types";
import { hoursText, ordinal, POSITION_WORD } from "../words";
import type { Ctx, FillRun, Group } from "./context";

/** The reasons shown beside a proposal of `w` in seat `p` of the order, with `crew` the people proposed there. */
export function reasonsFor(run: FillRun, c: Ctx, p: Position, w: FillWorker, crew: Assignment[], needs: Set<Group>): string[] {
  const { ix, poolById, pairsOf } = run;
  const out: string[] = [`priority ${priorityOf(c.fo)} order`];
  const eligible = c.eligible.get(p)!.map((id) => poolById.get(id)!);
  const mine = overtimeTenths(w);
  const lower = eligible.filter((x2) => overtimeTenths(x2) < mine).length;
  out.push(
    lower === 0
      ? `${hoursText(w.overtimeHours)} overtime in 28 days (lowest eligible${eligible.length > 1 ? ` of ${eligible.length}` : ""})`
      : `${hoursText(w.overtimeHours)} overtime in 28 days (${ordinal(lower + 1)} lowest of ${eligible.length} eligible; the ${lower === 1 ? "one" : lower} lower ${lower === 1 ? "is" : "are"} placed elsewhere or would break a crew rule)`,
  );
  out.push(w.yardId === c.fo.yardId ? "home yard" : `from ${w.yardCode ?? `yard ${w.yardId}`} (not the order's yard)`);
  const rw = ix.workers.get(w.id)!;
  if (p === "lead") {
    // Issue 18: why this person leads.
    const leads = eligible.filter((x2) => x2.classification === "crew_lead").length;
    out.push(
      w.classification === "crew_lead"
        ? "crew lead in the lead seat (crew leads are preferred for lead)"
        : leads === 0
          ? "no crew lead could take the lead seat, so a journey-level worker leads"
          : "a crew lead was eligible but is needed elsewhere or would break a crew rule",
    );
    if (c.order.workType === "digger_derrick" && c.order.energized) {
      const aid = ix.holdsThrough(rw, "first_aid_cpr", c.order);
      const rescue = ix.holdsThrough(rw, "pole_top_rescue", c.order) || ix.holdsThrough(rw, "aerial_rescue", c.order);
      out.push(aid && rescue ? "holds first aid/CPR and rescue training (preferred to lead energized derrick work)" : `leads without ${[aid ? "" : "first aid/CPR", rescue ? "" : "rescue training"].filter(Boolean).join(" or ")}: nobody better was free`);
    }
  }
  const mineSeats = crew.filter((a) => a.workerId === w.id).map((a) => a.position);
  if (mineSeats.length > 1) out.push(`also ${mineSeats.filter((x2) => x2 !== p).map((x2) => `the ${POSITION_WORD[x2]}`).join(" and ")} (the lead may double)`);
  // Credentials the crew rules count, named only where this person is one the count rests on.
  const crewIds = new Set([...c.existing.map((x2) => x2.id), ...crew.map((a) => a.workerId)]);
  const crewWorkers = [...crewIds].map((id) => ix.workers.get(id)!);
  const holds = (x2: Worker, code: string) => ix.holdsThrough(x2, code, c.order);
  if (needs.has("FIRST_AID") && holds(rw, "first_aid_cpr") && crewWorkers.filter((x2) => holds(x2, "first_aid_cpr")).length <= 2) {
    out.push("first aid/CPR trained (one of the two the crew needs)");
  }
  if (needs.has("RESCUE") && !mineSeats.includes("climber") && !mineSeats.includes("aerial")) {
    const climbing = (id: string) =>
      c.existing.some((x2) => x2.id === id && ["climber", "aerial"].some((p) => ix.crew(c.fo.id).positionsOf.get(id)?.has(p as Position))) ||
      crew.some((a) => a.workerId === id && (a.position === "climber" || a.position === "aerial"));
    const code = c.order.workType === "bucket" ? "aerial_rescue" : "pole_top_rescue";
    const rescuers = crewWorkers.filter((x2) => !climbing(x2.id) && holds(x2, code));
    if (rescuers.length === 1 && rescuers[0].id === w.id) {
      out.push(code === "aerial_rescue" ? "aerial-lift rescue trained, on the ground (the crew's only one)" : "pole-top rescue trained, not climbing (the crew's only one)");
    }
  }
  const people = new Set([...c.existing.map((x2) => x2.id), ...crew.map((a) => a.workerId)]);
  const hasApprentice = [...people].some((id) => ix.workers.get(id)?.classification === "apprentice");
  if (hasApprentice && isJourneyLevel(rw.classification) && !c.existing.some((x2) => isJourneyLevel(x2.classification))) out.push("journey-level beside the apprentice");
  const mates = [...(pairsOf.get(w.id) ?? [])].filter((v) => people.has(v)).map((v) => ix.workers.get(v)?.name ?? v);
  if (mates.length) out.push(`worked with ${mates.join(", ")} yesterday`);
  return out;
}
