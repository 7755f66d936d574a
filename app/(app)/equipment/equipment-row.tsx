"use client";

import { useState } from "react";
import { FormAlert } from "@/components/form/fields";
import { Badge } from "@/components/status";
import { useApiMutation } from "@/lib/api/mutations";
import { DIELECTRIC_TEST_MONTHS, EQUIPMENT_KIND_LABEL, LICENCE_LABEL, RIGGING_KIND_LABEL, addMonths, dielectricState, type Equipment } from "@/lib/equipment/model";
import { RiggingForm } from "./rigging-form";

export function EquipmentRow({
  e,
  today,
  canEdit,
  onEdit,
  bookings,
}: {
  e: Equipment;
  today: string;
  canEdit: boolean;
  onEdit: () => void;
  bookings: { number: string; day: string }[];
}) {
  const test = dielectricState(e, today);
  const inspectionDue = e.annualInspectionOn ? addMonths(e.annualInspectionOn, 12) : null;
  return (
    <li className="card p-3" data-testid={`equipment-${e.unitNumber}`}>
      <div className="flex flex-wrap items-start justify-between gap-2">
        <div className="min-w-0">
          <p className="text-[11px] font-bold uppercase tracking-wide text-copper">
            {e.unitNumber} · {EQUIPMENT_KIND_LABEL[e.kind]}
          </p>
          <h3 className="font-extrabold">{e.name}</h3>
        </div>
        <div className="flex flex-wrap items-center gap-1">
          {e.outOfService ? <Badge tone="block">Out of service</Badge> : <Badge tone="clear">In service</Badge>}
          {e.insulated && <Badge tone="info">Insulated</Badge>}
          {test === "overdue" && <Badge tone="block">Dielectric test overdue</Badge>}
          {test === "missing" && <Badge tone="warn">No dielectric test</Badge>}
        </div>
      </div>
      {e.outOfService && e.outOfServiceReason && (
        <p className="mt-1 text-sm font-semibold text-block" data-testid="oos-reason">
          {e.outOfServiceReason}
        </p>
      )}
      <dl className="mt-2 grid grid-cols-2 gap-x-3 gap-y-1 text-xs sm:grid-cols-3">
        {test !== null && (
          <div>
            <dt className="text-ink-500">Dielectric test</dt>
            <dd className="font-semibold">
              {e.dielectricTestedOn ?? "none"}
              {e.dielectricTestedOn && ` (due ${addMonths(e.dielectricTestedOn, DIELECTRIC_TEST_MONTHS)})`}
            </dd>
          </div>
        )}
        <div>
          <dt className="text-ink-500">Annual inspection</dt>
          <dd className={`font-semibold ${inspectionDue && inspectionDue < today ? "text-block" : ""}`}>
            {e.annualInspectionOn ?? "none"}
            {inspectionDue && ` (due ${inspectionDue})`}
          </dd>
        </div>
        <div>
          <dt className="text-ink-500">Driver needs</dt>
          <dd className="font-semibold">{e.licence ? LICENCE_LABEL[e.licence] : "No commercial licence"}</dd>
        </div>
      </dl>
      {bookings.length > 0 && (
        <p className="mt-1 text-xs text-ink-700">
          <span className="font-semibold">Booked:</span> {bookings.map((b) => `${b.number} (${b.day})`).join(", ")}
        </p>
      )}
      <RiggingList e={e} canEdit={canEdit} today={today} />
      {canEdit && (
        <div className="mt-2 flex gap-2">
          <button type="button" className="btn-quiet" onClick={onEdit} aria-label={`Edit ${e.unitNumber}`}>
            Edit
          </button>
        </div>
      )}
    </li>
  );
}

function RiggingList({ e, canEdit, today }: { e: Equipment; canEdit: boolean; today: string }) {
  const [adding, setAdding] = useState(false);
  const remove = useApiMutation<{ id: number }>({ request: (r) => ({ url: `/api/equipment/${e.id}/rigging/${r.id}`, method: "DELETE" }), refresh: true });
  return (
    <div className="mt-2 border-t border-rule pt-2">
      <p className="text-xs font-bold uppercase tracking-wide text-ink-500">Rigging carried</p>
      {e.rigging.length === 0 && <p className="text-xs text-ink-500">None recorded.</p>}
      <ul className="mt-1 space-y-0.5 text-xs" data-testid={`rigging-${e.unitNumber}`}>
        {e.rigging.map((r) => {
          const stale = r.inspectedOn ? addMonths(r.inspectedOn, 12) < today : true;
          return (
            <li key={r.id} className="flex flex-wrap items-center gap-2">
              <span className="font-semibold">{RIGGING_KIND_LABEL[r.kind]}</span>
              <span>{r.label}</span>
              {r.kind === "rope_block" && (
                <span className="text-ink-500">
                  {r.partsOfLine} parts, {r.sheaves} sheaves
                </span>
              )}
              <span className="text-ink-500">WLL {r.wllLb.toLocaleString("en-US")} lb</span>
              <span className={stale ? "font-semibold text-warn" : "text-ink-500"}>inspected {r.inspectedOn ?? "never"}</span>
              {canEdit && (
                <button
                  type="button"
                  className="text-xs font-semibold text-ink-700 underline underline-offset-2 hover:text-block"
                  aria-label={`Remove ${r.label} from ${e.unitNumber}`}
                  onClick={() => {
                    if (window.confirm(`Remove ${r.label} from ${e.unitNumber}?`)) void remove.submit(r);
                  }}
                >
                  Remove
                </button>
              )}
            </li>
          );
        })}
      </ul>
      {remove.errorText && <FormAlert>{remove.errorText}</FormAlert>}
      {canEdit && !adding && (
        <button type="button" className="mt-1 text-xs font-semibold text-info underline underline-offset-2" onClick={() => setAdding(true)}>
          Add rigging
        </button>
      )}
      {canEdit && adding && <RiggingForm equipmentId={e.id} unit={e.unitNumber} onClose={() => setAdding(false)} />}
    </div>
  );
}
