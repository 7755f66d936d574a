"use client";

import { useState, type ReactNode } from "react";
import { POSITION_LABEL } from "@/lib/format";
import { POSITIONS, type Position } from "@/lib/rules/types";

/** The <option>s of a seat's position; `lead` says it is the employee in charge when `explain` is set. */
export function PositionOptions({ explain = false }: { explain?: boolean }) {
  return (
    <>
      {POSITIONS.map((p) => (
        <option key={p} value={p}>
          {POSITION_LABEL[p]}
          {explain && p === "lead" ? " (employee in charge)" : ""}
        </option>
      ))}
    </>
  );
}

/** A position picker and "Add position" (then any extra controls, like "Reset to template"). */
export function AddPosition({ onAdd, children }: { onAdd: (p: Position) => void; children?: ReactNode }) {
  const [p, setP] = useState<Position>("ground");
  return (
    <div className="mt-2 flex items-center gap-2">
      <select aria-label="Position to add" className="field w-auto" value={p} onChange={(e) => setP(e.target.value as Position)}>
        <PositionOptions />
      </select>
      <button type="button" className="btn-quiet" onClick={() => onAdd(p)}>
        Add position
      </button>
      {children}
    </div>
  );
}
