"use client";

// What the board shows, derived from the payload (split out of board-client.tsx): workers by
// id, where each is placed, the findings (the client engine's while a write is in flight, the
// server's otherwise) by order, and the blocks still unresolved.
import { useMemo } from "react";
import type { BoardPayload } from "@/lib/board/model";
import { findingKey } from "@/lib/board/model";
import { findingsForOrders } from "@/lib/rules/engine";
import type { Finding } from "@/lib/rules/types";
import type { WorkerInfo } from "./order-card";

export function useBoardViews(data: BoardPayload | undefined, pending: boolean) {
  const workers = useMemo(() => {
    const m = new Map<number, WorkerInfo>();
    for (const p of data?.pool ?? []) m.set(p.id, { name: p.name, classification: p.classification, phone: p.phone });
    return m;
  }, [data?.pool]);

  const placedOn = useMemo(() => {
    const m = new Map<number, string[]>();
    for (const o of data?.orders ?? [])
      for (const s of o.seats)
        if (s.assignment) {
          const list = m.get(s.assignment.workerId) ?? [];
          if (!list.includes(o.number)) list.push(o.number);
          m.set(s.assignment.workerId, list);
        }
    // Held on another yard's order that day: placed there, not free (issue 18).
    for (const e of data?.placedElsewhere ?? []) {
      const list = m.get(e.workerId) ?? [];
      const label = `${e.number} at ${e.yardName}`;
      if (!list.includes(label)) list.push(label);
      m.set(e.workerId, list);
    }
    return m;
  }, [data?.orders, data?.placedElsewhere]);

  // While a write is in flight the view shows the client engine's findings over the
  // optimistic crew; once the server answers, its own findings (the authority) come back.
  const findings = useMemo(() => {
    if (!data) return [];
    if (pending) return findingsForOrders(data.snapshot, data.boardOrderIds);
    return data.findings;
  }, [data, pending]);

  const byOrder = useMemo(() => {
    const m = new Map<string, Finding[]>();
    for (const f of findings) {
      const list = m.get(f.workOrderId) ?? [];
      list.push(f);
      m.set(f.workOrderId, list);
    }
    return m;
  }, [findings]);

  const validOverrides = useMemo(() => new Set((data?.overrides ?? []).filter((o) => o.valid).map(findingKey)), [data?.overrides]);
  const unresolved = findings.filter((f) => f.level === "block" && (f.locked || !validOverrides.has(findingKey(f))));
  const warnCount = findings.filter((f) => f.level === "warn").length;
  return { workers, placedOn, findings, byOrder, unresolved, warnCount };
}
