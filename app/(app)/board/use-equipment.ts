"use client";

// Equipment on the board: drag ids, the drop handler and the optimistic write for trucks.
// Drag ids: "truck:<equipmentId>" (from the equipment pool) and "eqbook:<bookingId>" (a truck
// on an order); drop ids: "eqseat:<orderId>:<kind>" (a seat the work type needs),
// "eqadd:<orderId>" (any further equipment) and "eqpool" (off the order).
import type { DragEndEvent } from "@dnd-kit/core";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useCallback, useMemo } from "react";
import type { BoardPayload, EquipmentBooking } from "@/lib/board/model";
import { findingsForOrders } from "@/lib/rules/engine";
import type { DaySnapshot, Finding } from "@/lib/rules/types";
import { EQUIPMENT_KIND_LABEL, type Equipment } from "@/lib/equipment/model";
import { call, HttpError, type BoardKey } from "./use-board";

export const truckId = (equipmentId: number) => `truck:${equipmentId}`;
export const bookingDragId = (bookingId: number) => `eqbook:${bookingId}`;
export const equipmentSeatId = (orderId: number, kind: string) => `eqseat:${orderId}:${kind}`;
export const equipmentAddId = (orderId: number) => `eqadd:${orderId}`;
export const EQUIPMENT_POOL_DROP = "eqpool";

export type EquipmentDrag = { kind: "truck"; equipmentId: number } | { kind: "booking"; bookingId: number };
export type EquipmentDrop = { kind: "order"; orderId: number; seatKind: string | null } | { kind: "pool" };

export function parseEquipmentDrag(id: string | number | null | undefined): EquipmentDrag | null {
  const s = String(id ?? "");
  const m = /^(truck|eqbook):(\d+)$/.exec(s);
  if (!m) return null;
  return m[1] === "truck" ? { kind: "truck", equipmentId: Number(m[2]) } : { kind: "booking", bookingId: Number(m[2]) };
}

export function parseEquipmentDrop(id: string | number | null | undefined): EquipmentDrop | null {
  const s = String(id ?? "");
  if (s === EQUIPMENT_POOL_DROP) return { kind: "pool" };
  let m = /^eqseat:(\d+):([a-z_]+)$/.exec(s);
  if (m) return { kind: "order", orderId: Number(m[1]), seatKind: m[2] };
  m = /^eqadd:(\d+)$/.exec(s);
  if (m) return { kind: "order", orderId: Number(m[1]), seatKind: null };
  return null;
}

type EqChange =
  | { kind: "add"; orderId: number; equipmentId: number }
  | { kind: "remove"; booking: EquipmentBooking }
  | { kind: "move"; booking: EquipmentBooking; orderId: number };

/** Ids for bookings not yet saved: negative and never repeated (two drops in one millisecond stay apart). */
let tempIds = 0;

/** The payload with one equipment change, its snapshot and the client engine's findings. */
export function applyEquipmentLocally(p: BoardPayload, c: EqChange): BoardPayload {
  if (c.kind === "move") {
    // The server moves the same booking row (version + 1): keep its id, so it can be dragged again at once.
    const off = applyEquipmentLocally(p, { kind: "remove", booking: c.booking });
    const added = applyEquipmentLocally(off, { kind: "add", orderId: c.orderId, equipmentId: c.booking.equipmentId });
    const moved = { ...c.booking, workOrderId: c.orderId, version: c.booking.version + 1 };
    return { ...added, equipmentBookings: [...(off.equipmentBookings ?? []), moved] };
  }
  const bookings = p.equipmentBookings ?? [];
  const snap = p.snapshot as DaySnapshot;
  const list = snap.equipmentAssignments ?? [];
  let nextBookings: EquipmentBooking[];
  let nextList: typeof list;
  if (c.kind === "add") {
    nextBookings = [...bookings, { id: --tempIds, workOrderId: c.orderId, equipmentId: c.equipmentId, version: 1 }];
    nextList = [...list, { workOrderId: String(c.orderId), equipmentId: String(c.equipmentId) }];
  } else {
    nextBookings = bookings.filter((b) => b.id !== c.booking.id);
    let dropped = false;
    nextList = list.filter((a) => {
      if (!dropped && a.workOrderId === String(c.booking.workOrderId) && a.equipmentId === String(c.booking.equipmentId)) {
        dropped = true;
        return false;
      }
      return true;
    });
  }
  const snapshot = { ...snap, equipmentAssignments: nextList } as DaySnapshot;
  return { ...p, equipmentBookings: nextBookings, snapshot, findings: findingsForOrders(snapshot, p.boardOrderIds) };
}

/**
 * The new blocks a truck dropped on an order would raise (what the client engine finds after
 * the change, less what it finds now), for the hover answer on the equipment row.
 */
export function previewEquipmentDrop(p: BoardPayload, c: EqChange): Finding[] {
  const key = (f: Finding) => `${f.rule}|${f.workOrderId}|${f.workerId ?? ""}|${f.equipmentId ?? ""}`;
  const before = new Set(p.findings.filter((f) => f.level === "block").map(key));
  return applyEquipmentLocally(p, c).findings.filter((f) => f.level === "block" && !before.has(key(f)));
}

export function useEquipmentDnd(
  key: BoardKey,
  data: BoardPayload | undefined,
  notify: (msg: string, tone?: "ok" | "error") => void,
  hover?: { activeId: string | null; overId: string | null },
) {
  const qc = useQueryClient();
  const byId = useMemo(() => new Map((data?.equipment ?? []).map((e) => [e.id, e])), [data?.equipment]);
  const bookingById = useMemo(() => new Map((data?.equipmentBookings ?? []).map((b) => [b.id, b])), [data?.equipmentBookings]);

  const mutation = useMutation({
    scope: { id: `board-equipment-${key[1]}-${key[2]}` },
    mutationFn: async (c: EqChange) => {
      if (c.kind === "add") {
        return call("/api/equipment-assignments", { method: "POST", body: JSON.stringify({ workOrderId: c.orderId, equipmentId: c.equipmentId }) });
      }
      if (c.kind === "move") {
        return call(`/api/equipment-assignments/${c.booking.id}`, { method: "PATCH", body: JSON.stringify({ workOrderId: c.orderId, version: c.booking.version }) });
      }
      return call(`/api/equipment-assignments/${c.booking.id}?version=${c.booking.version}`, { method: "DELETE" });
    },
    onMutate: async (c) => {
      await qc.cancelQueries({ queryKey: key });
      const before = qc.getQueryData<BoardPayload>(key);
      if (before) qc.setQueryData<BoardPayload>(key, applyEquipmentLocally(before, c));
      return { before };
    },
    onError: (err, _c, ctx) => {
      if (ctx?.before) qc.setQueryData(key, ctx.before);
      notify(err instanceof HttpError ? err.message : "The change was not saved; check the connection and try again.", "error");
    },
    onSuccess: () => notify("Saved.", "ok"),
    onSettled: () => qc.invalidateQueries({ queryKey: key }),
  });

  /** Handles a drag that picked up equipment; false when the drag was not equipment. */
  const onDragEnd = useCallback(
    (e: DragEndEvent): boolean => {
      const from = parseEquipmentDrag(e.active.id);
      if (!from) return false;
      const to = parseEquipmentDrop(e.over?.id);
      if (!to) {
        if (e.over) notify("Drop a truck on an order's equipment row, or back on the equipment pool.", "error");
        return true;
      }
      if (from.kind === "truck") {
        if (to.kind !== "order") return true;
        const eq = byId.get(from.equipmentId);
        if (eq?.outOfService) {
          notify(`${eq.unitNumber} is out of service${eq.outOfServiceReason ? ` (${eq.outOfServiceReason})` : ""}.`, "error");
          return true;
        }
        if ((data?.equipmentBookings ?? []).some((b) => b.workOrderId === to.orderId && b.equipmentId === from.equipmentId)) return true;
        mutation.mutate({ kind: "add", orderId: to.orderId, equipmentId: from.equipmentId });
        return true;
      }
      const booking = bookingById.get(from.bookingId);
      if (!booking) return true;
      if (to.kind === "pool") mutation.mutate({ kind: "remove", booking });
      else if (to.orderId !== booking.workOrderId) mutation.mutate({ kind: "move", booking, orderId: to.orderId });
      return true;
    },
    [byId, bookingById, data?.equipmentBookings, mutation, notify],
  );

  const describe = useCallback(
    (id: string): string | null => {
      const d = parseEquipmentDrag(id);
      if (d) {
        const eq = d.kind === "truck" ? byId.get(d.equipmentId) : byId.get(bookingById.get(d.bookingId)?.equipmentId ?? -1);
        return eq ? `${eq.unitNumber} ${eq.name}` : "a truck";
      }
      const t = parseEquipmentDrop(id);
      if (!t) return null;
      if (t.kind === "pool") return "the equipment pool (off the order)";
      const number = data?.orders.find((o) => o.id === t.orderId)?.number ?? "an order";
      return t.seatKind ? `the ${EQUIPMENT_KIND_LABEL[t.seatKind as Equipment["kind"]] ?? "equipment"} seat on ${number}` : `the equipment row of ${number}`;
    },
    [byId, bookingById, data?.orders],
  );

  const dragged = useCallback(
    (activeId: string | null): Equipment | null => {
      const d = parseEquipmentDrag(activeId);
      if (!d) return null;
      return (d.kind === "truck" ? byId.get(d.equipmentId) : byId.get(bookingById.get(d.bookingId)?.equipmentId ?? -1)) ?? null;
    },
    [byId, bookingById],
  );

  // The answer while a truck hovers over an order's equipment row (computed once per target).
  const activeId = hover?.activeId ?? null;
  const overId = hover?.overId ?? null;
  const preview = useMemo((): { orderId: number; blocks: Finding[] } | null => {
    if (!data) return null;
    const from = parseEquipmentDrag(activeId);
    const to = parseEquipmentDrop(overId);
    if (!from || !to || to.kind !== "order") return null;
    if (from.kind === "truck") {
      if (byId.get(from.equipmentId)?.outOfService) return null;
      if ((data.equipmentBookings ?? []).some((b) => b.workOrderId === to.orderId && b.equipmentId === from.equipmentId)) return null;
      return { orderId: to.orderId, blocks: previewEquipmentDrop(data, { kind: "add", orderId: to.orderId, equipmentId: from.equipmentId }) };
    }
    const booking = bookingById.get(from.bookingId);
    if (!booking || booking.workOrderId === to.orderId) return null;
    return { orderId: to.orderId, blocks: previewEquipmentDrop(data, { kind: "move", booking, orderId: to.orderId }) };
  }, [data, activeId, overId, byId, bookingById]);

  return { onDragEnd, describe, dragged, preview, isPending: mutation.isPending };
}
