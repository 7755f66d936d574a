// The call-out list for one seat (declined, open, or sent without a reply): everyone the
// per-worker crew rules allow there, in call-out order — fewest overtime hours in the last 28
// days first (equalisation, common practice), then home yard, then name — and the near misses
// with the rule that keeps each out. For each eligible person the engine also says which blocks
// the order would still carry with them in the seat (a crew still short of first aid, say);
// people who leave fewer of those come first, the fairness order deciding among equals.

import { findingsForOrders, SnapshotIndex } from "@/lib/rules/engine";
import { isJourneyLevel } from "@/lib/rules/common";
import type { Finding, RuleCode } from "@/lib/rules/types";
import { EligibilityProbe, exclusionOf } from "./eligibility";
import type { FillProblem } from "./types";
import { categoryOf, summarise, type Category } from "./words";

export interface CalloutEntry {
  workerId: string;
  name: string;
  classification: string;
  yardCode: string | null;
  homeYard: boolean;
  phone: string | null;
  overtimeHours: number;
  /** Blocks the order would still have with this person in the seat (rules only). */
  crewBlocks: RuleCode[];
  crewMessages: string[];
}

export interface CalloutNearMiss {
  workerId: string;
  name: string;
  phone: string | null;
  excludedBy: RuleCode;
  rules: RuleCode[];
  message: string;
}

export interface CalloutList {
  orderId: string;
  positionId: string;
  position: string;
  /** Who holds the seat now (a sent seat without a reply); they are left out of the list. */
  heldBy: string | null;
  eligible: CalloutEntry[];
  nearMisses: CalloutNearMiss[];
  nearMissCount: number;
  summary: string;
}

export function calloutList(problem: FillProblem, orderId: string, positionId: string, opts: { maxNearMisses?: number } = {}): CalloutList {
  const order = problem.orders.find((o) => o.id === orderId);
  const seat = order?.seats.find((s) => s.positionId === positionId);
  if (!order || !seat) throw new Error(`no seat ${positionId} on order ${orderId}`);
  // A held seat is ranked as if its holder were off it: the list is for replacing them.
  const snapshot =
    seat.workerId === null
      ? problem.snapshot
      : (() => {
          let dropped = false;
          const assignments = problem.snapshot.assignments.filter((a) => {
            if (!dropped && a.workOrderId === orderId && a.workerId === seat.workerId && a.position === seat.position) {
              dropped = true;
              return false;
            }
            return true;
          });
          return { ...problem.snapshot, assignments };
        })();
  const ix = new SnapshotIndex(snapshot);
  const wo = ix.orders.get(orderId)!;
  const probe = new EligibilityProbe(snapshot, [wo]);
  const onOrder = new Set(ix.crew(orderId).people.map((w) => w.id));
  const keyOf = (f: Finding) => `${f.rule}|${f.workOrderId}|${f.workerId ?? ""}`;
  const before = new Set(findingsForOrders(ix, [orderId]).filter((f) => f.level === "block" && f.workerId !== null).map(keyOf));
  const journeyThere = ix.crew(orderId).people.some((w) => isJourneyLevel(w.classification));

  const eligible: CalloutEntry[] = [];
  const misses: Array<CalloutNearMiss & { _n: number; _home: number; _ot: number }> = [];
  const counts = new Map<Category, number>();
  for (const w of problem.workers) {
    if (onOrder.has(w.id) || w.id === seat.workerId || !ix.workers.has(w.id)) continue;
    const rw = ix.workers.get(w.id)!;
    const ex = exclusionOf(probe.blocks(w.id, wo, seat.position));
    if (ex) {
      const cat = categoryOf(ex.findings[0], seat.position, rw, wo);
      counts.set(cat, (counts.get(cat) ?? 0) + 1);
      misses.push({
        workerId: w.id,
        name: w.name,
        phone: w.phone,
        excludedBy: ex.rules[0],
        rules: ex.rules,
        message: ex.findings[0].message,
        _n: ex.rules.length,
        _home: w.yardId === order.yardId ? 0 : 1,
        _ot: w.overtimeHours,
      });
      continue;
    }
    // With them in the seat: which blocks would the order still carry?
    const a = { workOrderId: orderId, workerId: w.id, position: seat.position };
    ix.add(a);
    const after = findingsForOrders(ix, [orderId]).filter((f) => f.level === "block" && !(f.workerId !== null && f.workerId !== w.id && before.has(keyOf(f))));
    ix.remove(a);
    if (rw.classification === "apprentice" && !journeyThere && !after.some((f) => f.rule === "QUALIFIED")) {
      after.push({ rule: "QUALIFIED", level: "block", workOrderId: orderId, workerId: w.id, message: `${w.name} is an apprentice and no journeyman or crew lead is on the order.`, source: "fill" });
    }
    eligible.push({
      workerId: w.id,
      name: w.name,
      classification: rw.classification,
      yardCode: w.yardCode ?? null,
      homeYard: w.yardId === order.yardId,
      phone: w.phone,
      overtimeHours: w.overtimeHours,
      crewBlocks: [...new Set(after.map((f) => f.rule))],
      crewMessages: after.map((f) => f.message),
    });
  }
  eligible.sort(
    (x, y) =>
      x.crewBlocks.length - y.crewBlocks.length ||
      x.overtimeHours - y.overtimeHours ||
      Number(y.homeYard) - Number(x.homeYard) ||
      x.name.localeCompare(y.name) ||
      (x.workerId < y.workerId ? -1 : 1),
  );
  misses.sort((x, y) => x._n - y._n || x._home - y._home || x._ot - y._ot || x.name.localeCompare(y.name));
  return {
    orderId,
    positionId,
    position: seat.position,
    heldBy: seat.workerId,
    eligible,
    nearMisses: misses.slice(0, opts.maxNearMisses ?? 25).map(({ _n, _home, _ot, ...rest }) => rest),
    nearMissCount: misses.length,
    summary: summarise(counts),
  };
}
