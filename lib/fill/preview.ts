// The fill's answer as the API sends it: numeric database ids, order numbers and names beside
// the ids, and plain-word status. JSON only.

import type { FillMeta } from "./load";
import type { FillResult } from "./types";

export interface FillPreview {
  /** Issue 16: the trucks proposed with the crews (app/api/fill/route.ts adds them). */
  trucks?: Array<{ orderId: number; equipmentId: number; unitNumber: string; name: string; kind: string; reason: string }>;
  day: string;
  yard: { code: string; name: string };
  proposals: Array<{
    orderId: number;
    orderNumber: string;
    positionId: number;
    position: string;
    workerId: number;
    workerName: string;
    reasons: string[];
  }>;
  staffed: Array<{
    orderId: number;
    number: string;
    title: string;
    priority: number;
    /** Blocks the order keeps from people placed before the fill. */
    carried: Array<{ rule: string; workerId: number | null; message: string }>;
    /** Supervisor overrides that lapse when this crew changes (they are given for one crew). */
    overridesLapse: Array<{ rule: string; workerId: number | null; reason: string }>;
  }>;
  open: Array<{
    orderId: number;
    orderNumber: string;
    positionId: number;
    position: string;
    candidates: Array<{ workerId: number; name: string; excludedBy: string; rules: string[]; message: string }>;
    excludedCount: number;
    eligibleCount: number;
    summary: string;
  }>;
  openOrders: Array<{ orderId: number; number: string; title: string; priority: number; reason: string; rule: string | null }>;
  status: string;
  optimal: boolean;
  gap: number | null;
  objective: FillResult["objective"];
  solveMs: number;
  timings: FillResult["timings"];
  size: FillResult["size"];
  settings: FillResult["settings"];
}

export function toPreview(r: FillResult, meta: FillMeta): FillPreview {
  const order = (id: string) => meta.orders.get(id)!;
  const wid = (id: string | null) => (id === null ? null : Number(id));
  return {
    day: meta.day,
    yard: { code: meta.yard.code, name: meta.yard.name },
    proposals: r.proposals.map((p) => ({
      orderId: Number(p.orderId),
      orderNumber: order(p.orderId).number,
      positionId: Number(p.positionId),
      position: p.position,
      workerId: Number(p.workerId),
      workerName: p.workerName,
      reasons: p.reasons,
    })),
    staffed: r.staffed.map((s) => ({
      orderId: Number(s.orderId),
      number: order(s.orderId).number,
      title: order(s.orderId).title,
      priority: order(s.orderId).priority,
      carried: s.carried.map((f) => ({ rule: f.rule, workerId: wid(f.workerId), message: f.message })),
      overridesLapse: meta.overridden.get(s.orderId) ?? [],
    })),
    open: r.open.map((o) => ({
      orderId: Number(o.orderId),
      orderNumber: order(o.orderId).number,
      positionId: Number(o.positionId),
      position: o.position,
      candidates: o.candidates.map((c) => ({ workerId: Number(c.workerId), name: c.name, excludedBy: c.excludedBy, rules: c.rules, message: c.message })),
      excludedCount: o.excludedCount,
      eligibleCount: o.eligibleCount,
      summary: o.summary,
    })),
    openOrders: r.openOrders.map((o) => ({
      orderId: Number(o.orderId),
      number: order(o.orderId).number,
      title: order(o.orderId).title,
      priority: order(o.orderId).priority,
      reason: o.reason,
      rule: o.rule,
    })),
    status: r.status,
    optimal: r.optimal,
    gap: r.gap,
    objective: r.objective,
    solveMs: r.solveMs,
    timings: r.timings,
    size: r.size,
    settings: r.settings,
  };
}
