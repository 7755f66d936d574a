"use client";

// The equipment pool beside the people: trucks and trailers of every yard, filtered by kind and
// yard, dragged onto an order's equipment row with the board's own sensors (mouse, touch,
// keyboard). Out-of-service equipment is listed with its reason and cannot be picked up.
import { useDraggable, useDroppable } from "@dnd-kit/core";
import { memo, useMemo, useState } from "react";
import type { BoardPayload } from "@/lib/board/model";
import { Badge } from "@/components/status";
import { EQUIPMENT_KINDS, EQUIPMENT_KIND_LABEL, dielectricState, type Equipment } from "@/lib/equipment/model";
import { EQUIPMENT_POOL_DROP, truckId } from "./use-equipment";

const TruckCard = memo(function TruckCard({ e, day, on }: { e: Equipment; day: string; on: string[] }) {
  const { attributes, listeners, setNodeRef, isDragging } = useDraggable({ id: truckId(e.id), disabled: e.outOfService, data: { equipmentId: e.id } });
  const test = dielectricState(e, day);
  return (
    <div
      ref={setNodeRef}
      {...listeners}
      {...attributes}
      aria-label={`${e.unitNumber} ${e.name}, ${EQUIPMENT_KIND_LABEL[e.kind]}, ${e.yardCode}${e.outOfService ? ", out of service" : ""}`}
      aria-disabled={e.outOfService}
      data-testid={`pool-truck-${e.unitNumber}`}
      className={`touch-none rounded-md border border-rule bg-white px-2.5 py-1.5 text-sm shadow-sm outline-none focus-visible:ring-2 focus-visible:ring-copper ${
        e.outOfService ? "cursor-not-allowed opacity-60" : "cursor-grab"
      } ${isDragging ? "opacity-40" : ""}`}
    >
      <p className="truncate font-bold" title={`${e.unitNumber} ${e.name}`}>
        {e.unitNumber} <span className="font-semibold text-ink-700">{e.name}</span>
      </p>
      <div className="mt-0.5 flex flex-wrap items-center gap-1 text-[11px]">
        <span className="font-semibold text-ink-700">
          {EQUIPMENT_KIND_LABEL[e.kind]} · {e.yardCode}
        </span>
        {e.insulated && <span className="rounded border border-rule px-1 font-semibold text-ink-700">Insulated</span>}
        {test === "overdue" && <Badge tone="block">Dielectric test overdue</Badge>}
        {test === "missing" && <Badge tone="warn">No dielectric test</Badge>}
        {e.outOfService && <Badge tone="block">Out of service</Badge>}
        {on.length > 0 && <span className="text-info">on {on.join(", ")}</span>}
      </div>
      {e.outOfService && e.outOfServiceReason && <p className="mt-0.5 text-[11px] text-block">{e.outOfServiceReason}</p>}
    </div>
  );
});

export function EquipmentPool({ payload }: { payload: BoardPayload }) {
  const [kind, setKind] = useState<string>("");
  const [yard, setYard] = useState<string>(payload.yard.code);
  const { setNodeRef, isOver } = useDroppable({ id: EQUIPMENT_POOL_DROP });
  const onOrders = useMemo(() => {
    const number = new Map(payload.orders.map((o) => [o.id, o.number]));
    const m = new Map<number, string[]>();
    for (const b of payload.equipmentBookings ?? []) {
      const n = number.get(b.workOrderId);
      if (n) m.set(b.equipmentId, [...(m.get(b.equipmentId) ?? []), n]);
    }
    return m;
  }, [payload.orders, payload.equipmentBookings]);
  const list = (payload.equipment ?? []).filter((e) => (!kind || e.kind === kind) && (!yard || e.yardCode === yard));
  return (
    <section aria-label="Equipment pool" className="mt-4 border-t border-rule pt-3" data-testid="equipment-pool">
      <h2 className="text-sm font-extrabold">Equipment</h2>
      <div className="mt-1 flex gap-2">
        <select className="field w-auto py-1 text-xs" aria-label="Equipment kind" value={kind} onChange={(e) => setKind(e.target.value)}>
          <option value="">All kinds</option>
          {EQUIPMENT_KINDS.map((k) => (
            <option key={k} value={k}>
              {EQUIPMENT_KIND_LABEL[k]}
            </option>
          ))}
        </select>
        <select className="field w-auto py-1 text-xs" aria-label="Equipment yard" value={yard} onChange={(e) => setYard(e.target.value)}>
          <option value="">All yards</option>
          {payload.yards.map((y) => (
            <option key={y.id} value={y.code}>
              {y.name}
            </option>
          ))}
        </select>
      </div>
      <div
        ref={setNodeRef}
        className={`mt-2 grid max-h-[40vh] grid-cols-1 gap-1.5 overflow-y-auto rounded-md p-0.5 ${isOver ? "ring-2 ring-copper" : ""}`}
        data-testid="equipment-pool-drop"
      >
        {list.map((e) => (
          <TruckCard key={e.id} e={e} day={payload.day} on={onOrders.get(e.id) ?? []} />
        ))}
        {list.length === 0 && <p className="text-xs text-ink-500">No equipment of that kind in that yard.</p>}
      </div>
      <p className="mt-1 text-[11px] text-ink-500">Drag a truck onto an order&apos;s equipment row; drag it back here to take it off.</p>
    </section>
  );
}
