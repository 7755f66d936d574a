"use client";

// An order's equipment row on the board: a seat for each truck its work type needs (a bucket
// order a bucket truck, a digger-derrick order a derrick) and room for any further equipment.
import { useDraggable, useDroppable } from "@dnd-kit/core";
import type { Finding } from "@/lib/rules/types";
import type { EquipmentBooking, OrderCard } from "@/lib/board/model";
import { EQUIPMENT_KIND_LABEL, REQUIRED_KIND, dielectricState, type Equipment, type EquipmentKind } from "@/lib/equipment/model";
import { bookingDragId, equipmentAddId, equipmentSeatId } from "./use-equipment";

function Booked({ b, e, day }: { b: EquipmentBooking; e: Equipment | undefined; day: string }) {
  const { attributes, listeners, setNodeRef, isDragging } = useDraggable({ id: bookingDragId(b.id), disabled: b.id < 0 });
  const test = e ? dielectricState(e, day) : null;
  return (
    <span
      ref={setNodeRef}
      {...listeners}
      {...attributes}
      data-testid={`booked-${e?.unitNumber ?? b.equipmentId}`}
      aria-label={`${e?.unitNumber ?? "Truck"} ${e?.name ?? ""} on this order`}
      className={`inline-flex cursor-grab touch-none items-center gap-1 rounded border border-ink-300 bg-white px-1.5 py-0.5 text-xs font-bold outline-none focus-visible:ring-2 focus-visible:ring-copper ${
        isDragging ? "opacity-40" : ""
      }`}
    >
      {e?.unitNumber ?? `#${b.equipmentId}`}
      <span className="font-semibold text-ink-500">{e ? EQUIPMENT_KIND_LABEL[e.kind] : ""}</span>
      {test === "overdue" && <span className="text-block">✖ test overdue</span>}
    </span>
  );
}

function Slot({ id, label, testId, preview, children }: { id: string; label: string; testId: string; preview?: Finding[] | null; children?: React.ReactNode }) {
  const { setNodeRef, isOver } = useDroppable({ id });
  return (
    <li
      ref={setNodeRef}
      data-testid={testId}
      aria-label={label}
      className={`flex min-h-8 flex-wrap items-center gap-1 rounded-md border border-dashed px-2 py-1 text-xs ${
        isOver && preview?.length ? "border-block bg-block-bg" : isOver ? "border-copper bg-copper/10" : "border-rule"
      }`}
    >
      {children}
      {isOver && preview && (
        <span role="status" className={`w-full text-xs font-bold ${preview.length ? "text-block" : "text-clear"}`}>
          {preview.length ? `✖ Would block: ${[...new Set(preview.map((f) => f.rule))].join(", ")}` : "✓ No new block"}
        </span>
      )}
    </li>
  );
}

export function EquipmentSeats({
  card,
  bookings,
  equipment,
  day,
  preview,
}: {
  card: OrderCard;
  bookings: EquipmentBooking[];
  equipment: Map<number, Equipment>;
  day: string;
  /** The hover answer for a truck over this order (use-equipment.ts). */
  preview?: { orderId: number; blocks: Finding[] } | null;
}) {
  const mineNow = preview && preview.orderId === card.id ? preview.blocks : null;
  const need = REQUIRED_KIND[card.ruleType] as EquipmentKind | undefined;
  const mine = bookings.filter((b) => b.workOrderId === card.id);
  const seated = need ? mine.find((b) => equipment.get(b.equipmentId)?.kind === need) : undefined;
  const extra = mine.filter((b) => b !== seated);
  return (
    <ul className="mt-2 grid gap-1.5 sm:grid-cols-2" aria-label={`Equipment on ${card.number}`} data-testid={`equipment-${card.number}`}>
      {need && (
        <Slot id={equipmentSeatId(card.id, need)} label={`${EQUIPMENT_KIND_LABEL[need]} seat on ${card.number}`} testId={`eqseat-${card.number}`} preview={mineNow}>
          <span className="font-semibold text-ink-500">{EQUIPMENT_KIND_LABEL[need]}</span>
          {seated ? <Booked b={seated} e={equipment.get(seated.equipmentId)} day={day} /> : <span className="text-ink-500">open</span>}
        </Slot>
      )}
      <Slot id={equipmentAddId(card.id)} label={`Further equipment on ${card.number}`} testId={`eqadd-${card.number}`} preview={mineNow}>
        <span className="font-semibold text-ink-500">{need ? "More equipment" : "Equipment"}</span>
        {extra.map((b) => (
          <Booked key={b.id} b={b} e={equipment.get(b.equipmentId)} day={day} />
        ))}
        {extra.length === 0 && <span className="text-ink-500">drop a truck or trailer</span>}
      </Slot>
    </ul>
  );
}
