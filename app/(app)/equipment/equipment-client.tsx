"use client";

import { useMemo, useState } from "react";
import { SelectField } from "@/components/form/fields";
import { LabelOptions, YardOptions } from "@/components/form/options";
import { EQUIPMENT_KINDS, EQUIPMENT_KIND_LABEL, type Equipment } from "@/lib/equipment/model";
import { EquipmentForm, type YardOpt } from "./equipment-form";
import { EquipmentRow } from "./equipment-row";

/** The equipment register: filters, the add/edit form, and each yard's units with their rigging. */
export function EquipmentClient({
  initial,
  yards,
  homeYardCode,
  today,
  canEdit,
  bookings,
}: {
  initial: Equipment[];
  yards: YardOpt[];
  homeYardCode: string;
  today: string;
  canEdit: boolean;
  bookings: Record<number, { number: string; day: string }[]>;
}) {
  const [yard, setYard] = useState<string>(homeYardCode || "");
  const [kind, setKind] = useState<string>("");
  const [service, setService] = useState<"" | "in" | "out">("");
  const [editing, setEditing] = useState<Equipment | "new" | null>(null);
  const shown = useMemo(
    () =>
      initial.filter(
        (e) =>
          (!yard || e.yardCode === yard) &&
          (!kind || e.kind === kind) &&
          (!service || (service === "out" ? e.outOfService : !e.outOfService)),
      ),
    [initial, yard, kind, service],
  );
  const byYard = yards.map((y) => ({ yard: y, items: shown.filter((e) => e.yardId === y.id) })).filter((g) => g.items.length);

  return (
    <div className="grid gap-4">
      <div className="card flex flex-wrap items-end gap-3 p-3" role="group" aria-label="Filters">
        <SelectField id="eqf-yard" label="Yard" className="field w-auto" value={yard} onChange={(e) => setYard(e.target.value)}>
          <YardOptions yards={yards} by="code" all="All yards" />
        </SelectField>
        <SelectField id="eqf-kind" label="Kind" className="field w-auto" value={kind} onChange={(e) => setKind(e.target.value)}>
          <option value="">All kinds</option>
          <LabelOptions values={EQUIPMENT_KINDS} labels={EQUIPMENT_KIND_LABEL} />
        </SelectField>
        <SelectField id="eqf-service" label="Service" className="field w-auto" value={service} onChange={(e) => setService(e.target.value as "" | "in" | "out")}>
          <option value="">In and out of service</option>
          <option value="in">In service</option>
          <option value="out">Out of service</option>
        </SelectField>
        <span className="text-sm text-ink-500" data-testid="equipment-count">
          {shown.length} of {initial.length}
        </span>
        {canEdit && (
          <button type="button" className="btn-accent ml-auto" onClick={() => setEditing("new")}>
            Add equipment
          </button>
        )}
      </div>

      {editing && (
        <EquipmentForm
          key={editing === "new" ? "new" : editing.id}
          equipment={editing === "new" ? null : editing}
          yards={yards}
          homeYardCode={yard || homeYardCode}
          onClose={() => setEditing(null)}
        />
      )}

      {byYard.length === 0 && <p className="card p-6 text-sm text-ink-500">No equipment matches these filters.</p>}
      {byYard.map(({ yard: y, items }) => (
        <section key={y.id} aria-label={y.name}>
          <h2 className="mb-2 text-sm font-bold uppercase tracking-wide text-ink-500">{y.name}</h2>
          <ul className="grid gap-3 lg:grid-cols-2">
            {items.map((e) => (
              <EquipmentRow key={e.id} e={e} today={today} canEdit={canEdit} onEdit={() => setEditing(e)} bookings={bookings[e.id] ?? []} />
            ))}
          </ul>
        </section>
      ))}
    </div>
  );
}
