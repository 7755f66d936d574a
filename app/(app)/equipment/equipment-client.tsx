"use client";

import { useRouter } from "next/navigation";
import { useMemo, useState } from "react";
import { Badge } from "@/components/status";
import { FieldError, FormAlert, sendJson } from "@/components/form-bits";
import {
  DIELECTRIC_TEST_MONTHS,
  EQUIPMENT_KINDS,
  EQUIPMENT_KIND_LABEL,
  LICENCE_LABEL,
  RIGGING_KINDS,
  RIGGING_KIND_LABEL,
  addMonths,
  dielectricState,
  type Equipment,
  type EquipmentKind,
  type RiggingKind,
} from "@/lib/equipment/model";

type YardOpt = { id: number; code: string; name: string };
type Issues = Record<string, string>;

const issuesOf = (body: { issues?: { field: string; message: string }[] }): Issues =>
  Object.fromEntries((body?.issues ?? []).map((i) => [i.field, i.message]));

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
        <label className="text-sm">
          <span className="label">Yard</span>
          <select className="field w-auto" value={yard} onChange={(e) => setYard(e.target.value)} aria-label="Yard">
            <option value="">All yards</option>
            {yards.map((y) => (
              <option key={y.id} value={y.code}>
                {y.name}
              </option>
            ))}
          </select>
        </label>
        <label className="text-sm">
          <span className="label">Kind</span>
          <select className="field w-auto" value={kind} onChange={(e) => setKind(e.target.value)} aria-label="Kind">
            <option value="">All kinds</option>
            {EQUIPMENT_KINDS.map((k) => (
              <option key={k} value={k}>
                {EQUIPMENT_KIND_LABEL[k]}
              </option>
            ))}
          </select>
        </label>
        <label className="text-sm">
          <span className="label">Service</span>
          <select className="field w-auto" value={service} onChange={(e) => setService(e.target.value as "" | "in" | "out")} aria-label="Service">
            <option value="">In and out of service</option>
            <option value="in">In service</option>
            <option value="out">Out of service</option>
          </select>
        </label>
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

function EquipmentRow({
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
  const router = useRouter();
  const [adding, setAdding] = useState(false);
  const [error, setError] = useState<string | null>(null);
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
                  onClick={async () => {
                    if (!window.confirm(`Remove ${r.label} from ${e.unitNumber}?`)) return;
                    const res = await sendJson(`/api/equipment/${e.id}/rigging/${r.id}`, "DELETE");
                    if (res.ok) router.refresh();
                    else setError(res.body?.error ?? "Not removed.");
                  }}
                >
                  Remove
                </button>
              )}
            </li>
          );
        })}
      </ul>
      {error && <FormAlert>{error}</FormAlert>}
      {canEdit && !adding && (
        <button type="button" className="mt-1 text-xs font-semibold text-info underline underline-offset-2" onClick={() => setAdding(true)}>
          Add rigging
        </button>
      )}
      {canEdit && adding && <RiggingForm equipmentId={e.id} unit={e.unitNumber} onClose={() => setAdding(false)} />}
    </div>
  );
}

function RiggingForm({ equipmentId, unit, onClose }: { equipmentId: number; unit: string; onClose: () => void }) {
  const router = useRouter();
  const [kind, setKind] = useState<RiggingKind>("rope_block");
  const [label, setLabel] = useState("");
  const [parts, setParts] = useState("3");
  const [sheaves, setSheaves] = useState("");
  const [wll, setWll] = useState("");
  const [inspected, setInspected] = useState("");
  const [issues, setIssues] = useState<Issues>({});
  const [error, setError] = useState<string | null>(null);
  const num = (s: string) => (s.trim() === "" ? undefined : Number(s));
  return (
    <form
      className="mt-2 grid gap-2 rounded-md border border-rule p-2 sm:grid-cols-3"
      aria-label={`Add rigging to ${unit}`}
      onSubmit={async (ev) => {
        ev.preventDefault();
        const body: Record<string, unknown> = { kind, label, wllLb: num(wll), inspectedOn: inspected || null };
        if (kind === "rope_block") {
          body.partsOfLine = num(parts);
          if (sheaves.trim()) body.sheaves = num(sheaves);
        }
        const res = await sendJson(`/api/equipment/${equipmentId}/rigging`, "POST", body);
        if (res.ok) {
          onClose();
          router.refresh();
        } else {
          setIssues(issuesOf(res.body));
          setError(res.body?.error ?? "Not saved.");
        }
      }}
    >
      <label className="text-xs">
        <span className="label">Kind</span>
        <select className="field" value={kind} onChange={(e) => setKind(e.target.value as RiggingKind)}>
          {RIGGING_KINDS.map((k) => (
            <option key={k} value={k}>
              {RIGGING_KIND_LABEL[k]}
            </option>
          ))}
        </select>
      </label>
      <label className="text-xs sm:col-span-2">
        <span className="label">Label</span>
        <input className="field" value={label} onChange={(e) => setLabel(e.target.value)} aria-invalid={!!issues.label} />
        <FieldError msg={issues.label} />
      </label>
      {kind === "rope_block" && (
        <>
          <label className="text-xs">
            <span className="label">Parts of line</span>
            <input className="field" inputMode="numeric" value={parts} onChange={(e) => setParts(e.target.value)} aria-invalid={!!issues.partsOfLine} />
            <FieldError msg={issues.partsOfLine} />
          </label>
          <label className="text-xs">
            <span className="label">Sheaves (blank = parts)</span>
            <input className="field" inputMode="numeric" value={sheaves} onChange={(e) => setSheaves(e.target.value)} aria-invalid={!!issues.sheaves} />
            <FieldError msg={issues.sheaves} />
          </label>
        </>
      )}
      <label className="text-xs">
        <span className="label">WLL (lb)</span>
        <input className="field" inputMode="numeric" value={wll} onChange={(e) => setWll(e.target.value)} aria-invalid={!!issues.wllLb} />
        <FieldError msg={issues.wllLb} />
      </label>
      <label className="text-xs">
        <span className="label">Last inspection</span>
        <input className="field" type="date" value={inspected} onChange={(e) => setInspected(e.target.value)} aria-invalid={!!issues.inspectedOn} />
        <FieldError msg={issues.inspectedOn} />
      </label>
      <div className="flex items-end gap-2 sm:col-span-3">
        <button type="submit" className="btn-primary">
          Add
        </button>
        <button type="button" className="btn-quiet" onClick={onClose}>
          Cancel
        </button>
      </div>
      {error && (
        <div className="sm:col-span-3">
          <FormAlert>{error}</FormAlert>
        </div>
      )}
    </form>
  );
}

function EquipmentForm({
  equipment,
  yards,
  homeYardCode,
  onClose,
}: {
  equipment: Equipment | null;
  yards: YardOpt[];
  homeYardCode: string;
  onClose: () => void;
}) {
  const router = useRouter();
  const e = equipment;
  const [v, setV] = useState({
    yardId: String(e?.yardId ?? yards.find((y) => y.code === homeYardCode)?.id ?? yards[0]?.id ?? ""),
    kind: (e?.kind ?? "bucket_truck") as EquipmentKind,
    unitNumber: e?.unitNumber ?? "",
    name: e?.name ?? "",
    insulated: e?.insulated ?? false,
    dielectricTestedOn: e?.dielectricTestedOn ?? "",
    annualInspectionOn: e?.annualInspectionOn ?? "",
    licence: e?.licence ?? "",
    outOfService: e?.outOfService ?? false,
    outOfServiceReason: e?.outOfServiceReason ?? "",
  });
  const [issues, setIssues] = useState<Issues>({});
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const set = <K extends keyof typeof v>(k: K, val: (typeof v)[K]) => setV((p) => ({ ...p, [k]: val }));
  const id = (f: string) => `eq-${f}`;
  return (
    <form
      className="card grid gap-3 p-4 sm:grid-cols-2 lg:grid-cols-4"
      aria-label={e ? `Edit ${e.unitNumber}` : "Add equipment"}
      onSubmit={async (ev) => {
        ev.preventDefault();
        setBusy(true);
        const body = {
          yardId: Number(v.yardId),
          kind: v.kind,
          unitNumber: v.unitNumber,
          name: v.name,
          insulated: v.insulated,
          dielectricTestedOn: v.dielectricTestedOn || null,
          annualInspectionOn: v.annualInspectionOn || null,
          licence: v.licence || null,
          outOfService: v.outOfService,
          outOfServiceReason: v.outOfService ? v.outOfServiceReason : null,
          ...(e ? { version: e.version } : {}),
        };
        const res = await sendJson(e ? `/api/equipment/${e.id}` : "/api/equipment", e ? "PATCH" : "POST", body);
        setBusy(false);
        if (res.ok) {
          onClose();
          router.refresh();
        } else {
          setIssues(issuesOf(res.body));
          setError(res.body?.error ?? "Not saved.");
        }
      }}
    >
      <h2 className="font-extrabold sm:col-span-2 lg:col-span-4">{e ? `Edit ${e.unitNumber}` : "Add equipment"}</h2>
      <div>
        <label className="label" htmlFor={id("unit")}>
          Unit number
        </label>
        <input id={id("unit")} className="field" value={v.unitNumber} onChange={(x) => set("unitNumber", x.target.value)} aria-invalid={!!issues.unitNumber} />
        <FieldError msg={issues.unitNumber} />
      </div>
      <div className="lg:col-span-2">
        <label className="label" htmlFor={id("name")}>
          Name
        </label>
        <input id={id("name")} className="field" value={v.name} onChange={(x) => set("name", x.target.value)} aria-invalid={!!issues.name} />
        <FieldError msg={issues.name} />
      </div>
      <div>
        <label className="label" htmlFor={id("yard")}>
          Yard
        </label>
        <select id={id("yard")} className="field" value={v.yardId} onChange={(x) => set("yardId", x.target.value)}>
          {yards.map((y) => (
            <option key={y.id} value={y.id}>
              {y.name}
            </option>
          ))}
        </select>
        <FieldError msg={issues.yardId} />
      </div>
      <div>
        <label className="label" htmlFor={id("kind")}>
          Kind
        </label>
        <select id={id("kind")} className="field" value={v.kind} onChange={(x) => set("kind", x.target.value as EquipmentKind)}>
          {EQUIPMENT_KINDS.map((k) => (
            <option key={k} value={k}>
              {EQUIPMENT_KIND_LABEL[k]}
            </option>
          ))}
        </select>
        <FieldError msg={issues.kind} />
      </div>
      <div>
        <label className="label" htmlFor={id("licence")}>
          Driver licence needed
        </label>
        <select id={id("licence")} className="field" value={v.licence} onChange={(x) => set("licence", x.target.value as typeof v.licence)}>
          <option value="">None</option>
          <option value="cdl_b">CDL class B</option>
          <option value="cdl_a">CDL class A</option>
        </select>
      </div>
      <div>
        <label className="label" htmlFor={id("dielectric")}>
          Last dielectric test
        </label>
        <input id={id("dielectric")} type="date" className="field" value={v.dielectricTestedOn} onChange={(x) => set("dielectricTestedOn", x.target.value)} aria-invalid={!!issues.dielectricTestedOn} />
        <FieldError msg={issues.dielectricTestedOn} />
      </div>
      <div>
        <label className="label" htmlFor={id("inspection")}>
          Annual inspection
        </label>
        <input id={id("inspection")} type="date" className="field" value={v.annualInspectionOn} onChange={(x) => set("annualInspectionOn", x.target.value)} aria-invalid={!!issues.annualInspectionOn} />
        <FieldError msg={issues.annualInspectionOn} />
      </div>
      <label className="flex items-center gap-2 text-sm font-semibold">
        <input type="checkbox" checked={v.insulated} onChange={(x) => set("insulated", x.target.checked)} />
        Insulated aerial device
      </label>
      <label className="flex items-center gap-2 text-sm font-semibold">
        <input type="checkbox" checked={v.outOfService} onChange={(x) => set("outOfService", x.target.checked)} />
        Out of service
      </label>
      {v.outOfService && (
        <div className="sm:col-span-2 lg:col-span-4">
          <label className="label" htmlFor={id("reason")}>
            Why it is out of service
          </label>
          <input id={id("reason")} className="field" value={v.outOfServiceReason} onChange={(x) => set("outOfServiceReason", x.target.value)} aria-invalid={!!issues.outOfServiceReason} />
          <FieldError msg={issues.outOfServiceReason ?? issues.outOfService} />
        </div>
      )}
      <div className="flex gap-2 sm:col-span-2 lg:col-span-4">
        <button type="submit" className="btn-primary" disabled={busy}>
          {busy ? "Saving…" : "Save"}
        </button>
        <button type="button" className="btn-quiet" onClick={onClose}>
          Cancel
        </button>
      </div>
      {error && (
        <div className="sm:col-span-2 lg:col-span-4">
          <FormAlert>{error}</FormAlert>
        </div>
      )}
    </form>
  );
}
