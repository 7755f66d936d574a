"use client";

import { useState } from "react";
import { ActionButton } from "@/components/form-bits";
import type { RotationFormValues } from "@/lib/rotations/model";
import { RotationForm, type WorkerOption, type YardOption } from "./rotation-form";

export function EditRotation(props: { yards: YardOption[]; workers: WorkerOption[]; initial: RotationFormValues; rotationId: number; version: number; name: string }) {
  const [open, setOpen] = useState(false);
  return (
    <div>
      <div className="flex flex-wrap gap-2">
        <button type="button" className="btn-quiet" aria-expanded={open} onClick={() => setOpen(!open)}>
          {open ? "Close" : "Edit rotation"}
        </button>
        <ActionButton url={`/api/rotations/${props.rotationId}`} confirm={`Delete the rotation “${props.name}”? Recorded call-outs keep their time.`} label="Delete" className="btn-quiet text-block" />
      </div>
      {open && (
        <div className="mt-3 rounded-md border border-rule bg-paper p-3">
          <RotationForm yards={props.yards} workers={props.workers} initial={props.initial} rotationId={props.rotationId} version={props.version} onDone={() => setOpen(false)} />
        </div>
      )}
    </div>
  );
}
