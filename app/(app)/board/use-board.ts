"use client";

import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useEffect, useMemo, useState } from "react";
import type { BoardPayload, SeatAssignment } from "@/lib/board/model";
import { createEngine, type RuleEngine } from "@/lib/rules/engine";
import type { Assignment, Finding, Position } from "@/lib/rules/types";

export type BoardKey = readonly ["board", string, string];

export class HttpError extends Error {
  constructor(
    public status: number,
    message: string,
    public body: Record<string, unknown>,
  ) {
    super(message);
  }
}

async function call<T>(url: string, init?: RequestInit): Promise<T> {
  const res = await fetch(url, { ...init, headers: { "content-type": "application/json", ...(init?.headers ?? {}) } });
  const text = await res.text();
  let body: Record<string, unknown> = {};
  try {
    body = text ? JSON.parse(text) : {};
  } catch {
    body = { error: text.slice(0, 200) };
  }
  if (!res.ok) throw new HttpError(res.status, String(body.error ?? `Request failed (${res.status})`), body);
  return body as T;
}

export type Change =
  | { kind: "add"; positionId: number; workerId: number }
  | { kind: "move"; assignment: SeatAssignment; fromPositionId: number; positionId: number }
  | { kind: "remove"; assignment: SeatAssignment; fromPositionId: number }
  /** Issue 18: two placed workers trade seats (one request, one transaction). */
  | { kind: "swap"; positionA: number; positionB: number };

/** The two seats' assignments exchanged, for the optimistic view of a swap. */
function swapLocally(p: BoardPayload, c: { positionA: number; positionB: number }): BoardPayload {
  const seatPos = new Map<number, { orderId: number; position: Position; a: SeatAssignment | null }>();
  for (const o of p.orders) for (const s of o.seats) seatPos.set(s.id, { orderId: o.id, position: s.position, a: s.assignment });
  const A = seatPos.get(c.positionA);
  const B = seatPos.get(c.positionB);
  if (!A?.a || !B?.a) return p;
  const orders = p.orders.map((o) => ({
    ...o,
    seats: o.seats.map((s) =>
      s.id === c.positionA ? { ...s, assignment: { ...B.a!, status: "draft" as const } } : s.id === c.positionB ? { ...s, assignment: { ...A.a!, status: "draft" as const } } : s,
    ),
  }));
  const key = (x: { orderId: number; position: Position }, w: number) => `${x.orderId}|${w}|${x.position}`;
  const drop = new Set([key(A, A.a.workerId), key(B, B.a.workerId)]);
  const assignments: Assignment[] = p.snapshot.assignments.filter((x) => !drop.has(`${x.workOrderId}|${x.workerId}|${x.position}`));
  assignments.push({ workOrderId: String(A.orderId), workerId: String(B.a.workerId), position: A.position });
  assignments.push({ workOrderId: String(B.orderId), workerId: String(A.a.workerId), position: B.position });
  return { ...p, orders, snapshot: { ...p.snapshot, assignments } };
}

/** The payload with one change applied, for the optimistic view. */
export function applyLocally(p: BoardPayload, c: Change): BoardPayload {
  if (c.kind === "swap") return swapLocally(p, c);
  const seatPos = new Map<number, { orderId: number; position: Position }>();
  for (const o of p.orders) for (const s of o.seats) seatPos.set(s.id, { orderId: o.id, position: s.position });
  let moving: SeatAssignment | null = null;
  const orders = p.orders.map((o) => ({
    ...o,
    seats: o.seats.map((s) => {
      if ((c.kind === "move" || c.kind === "remove") && s.id === c.fromPositionId) {
        moving = s.assignment;
        return { ...s, assignment: null };
      }
      return s;
    }),
  }));
  const target = c.kind === "remove" ? null : c.positionId;
  const workerId = c.kind === "add" ? c.workerId : c.assignment.workerId;
  const placed = orders.map((o) => ({
    ...o,
    seats: o.seats.map((s) =>
      s.id === target
        ? {
            ...s,
            assignment: {
              ...(moving ?? { id: -1, status: "draft" as const, version: 0, replyCode: "", sentAt: null, respondedAt: null, noReply: false }),
              workerId,
              status: "draft" as const,
            },
            declinedBy: null,
          }
        : s,
    ),
  }));
  const assignments: Assignment[] = p.snapshot.assignments.filter((a) => {
    if (c.kind === "add") return true;
    const from = seatPos.get(c.fromPositionId)!;
    return !(a.workOrderId === String(from.orderId) && a.workerId === String(workerId) && a.position === from.position);
  });
  if (target !== null) {
    const to = seatPos.get(target)!;
    assignments.push({ workOrderId: String(to.orderId), workerId: String(workerId), position: to.position });
  }
  return { ...p, orders: placed, snapshot: { ...p.snapshot, assignments } };
}

export function useBoardMutations(key: BoardKey, notify: (msg: string, tone?: "ok" | "error") => void) {
  const qc = useQueryClient();
  return useMutation({
    // One at a time, in order: each write sends the version the previous one produced.
    scope: { id: `board-${key[1]}-${key[2]}` },
    mutationFn: async (c: Change) => {
      const latest = qc.getQueryData<BoardPayload>(key);
      const versionOf = (positionId: number) => {
        for (const o of latest?.orders ?? []) for (const s of o.seats) if (s.id === positionId) return { order: o.version, a: s.assignment };
        return null;
      };
      if (c.kind === "swap") {
        const A = versionOf(c.positionA)?.a;
        const B = versionOf(c.positionB)?.a;
        if (!A || !B) throw new HttpError(409, "One of these seats is empty now; nothing was swapped.", {});
        return call("/api/assignments/swap", {
          method: "POST",
          body: JSON.stringify({ a: { id: A.id, version: A.version }, b: { id: B.id, version: B.version } }),
        });
      }
      if (c.kind === "add") {
        return call("/api/assignments", {
          method: "POST",
          body: JSON.stringify({ positionId: c.positionId, workerId: c.workerId }),
        });
      }
      const current = versionOf(c.fromPositionId)?.a ?? c.assignment;
      if (c.kind === "move") {
        return call(`/api/assignments/${current.id}`, {
          method: "PATCH",
          body: JSON.stringify({ positionId: c.positionId, version: current.version }),
        });
      }
      return call(`/api/assignments/${current.id}?version=${current.version}`, { method: "DELETE" });
    },
    onMutate: async (c) => {
      await qc.cancelQueries({ queryKey: key });
      const before = qc.getQueryData<BoardPayload>(key);
      if (before) qc.setQueryData<BoardPayload>(key, { ...applyLocally(before, c), findings: before.findings });
      return { before };
    },
    onError: (err, _c, ctx) => {
      if (ctx?.before) qc.setQueryData(key, ctx.before);
      notify(err instanceof HttpError ? err.message : "The change was not saved; check the connection and try again.", "error");
    },
    onSuccess: () => notify("Saved.", "ok"),
    onSettled: () => qc.invalidateQueries({ queryKey: key }),
  });
}

/** The client-side engine over the payload's snapshot, for instant findings and drop previews. */
export function useEngine(payload: BoardPayload | undefined) {
  return useMemo<RuleEngine | null>(() => (payload ? createEngine(payload.snapshot) : null), [payload?.snapshot]); // eslint-disable-line react-hooks/exhaustive-deps
}

export function useToast() {
  const [toast, setToast] = useState<{ msg: string; tone: "ok" | "error"; at: number } | null>(null);
  useEffect(() => {
    if (!toast) return;
    const t = setTimeout(() => setToast(null), toast.tone === "error" ? 8000 : 2500);
    return () => clearTimeout(t);
  }, [toast]);
  return { toast, notify: (msg: string, tone: "ok" | "error" = "ok") => setToast({ msg, tone, at: Date.now() }) };
}

export { call };
export type { Finding };
