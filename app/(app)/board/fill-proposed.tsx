"use client";

// The crews a fill proposes, order by order, with the reasons for each person; each crew and
// each seat can be taken or left (Fill open positions, issue 9).

import { Badge } from "@/components/status";
import { POSITION_LABEL } from "@/lib/format";
import type { FillPreview } from "@/lib/fill/preview";

export function ProposedCrews({
  preview,
  byOrder,
  chosen,
  enabled,
  toggle,
}: {
  preview: FillPreview;
  byOrder: Map<number, FillPreview["proposals"]>;
  chosen: Set<number>;
  /** The checkboxes can be changed (a proposal is on screen and not being accepted). */
  enabled: boolean;
  toggle: (ids: number[], on: boolean) => void;
}) {
  return (
    <section aria-label="Proposed crews" className="space-y-2">
      <h3 className="text-sm font-extrabold">Proposed</h3>
      {preview.staffed.map((o) => {
        const seats = byOrder.get(o.orderId) ?? [];
        const ids = seats.map((s) => s.positionId);
        const on = ids.filter((id) => chosen.has(id)).length;
        const partial = on > 0 && on < ids.length;
        return (
          <article key={o.orderId} className="card p-3" data-testid={`fill-order-${o.number}`}>
            <label className="flex items-start gap-2">
              <input
                type="checkbox"
                className="mt-1"
                checked={on === ids.length && ids.length > 0}
                ref={(el) => {
                  if (el) el.indeterminate = partial;
                }}
                disabled={!enabled}
                onChange={(e) => toggle(ids, e.target.checked)}
                aria-label={`Take the whole crew for ${o.number}`}
              />
              <span className="min-w-0">
                <span className="text-[11px] font-bold uppercase tracking-wide text-copper">
                  {o.number} · P{o.priority}
                </span>
                <span className="block truncate font-bold" title={o.title}>
                  {o.title}
                </span>
              </span>
            </label>
            {partial && (
              <p className="mt-1">
                <Badge tone="warn">Part of a crew: the order stays short and the crew rules will block it</Badge>
              </p>
            )}
            {(preview.trucks ?? [])
              .filter((t) => t.orderId === o.orderId)
              .map((t) => (
                <p key={`t${t.equipmentId}`} className="mt-1 text-xs text-ink-700" data-testid={`fill-truck-${o.number}`}>
                  <span className="font-extrabold uppercase tracking-wide text-ink-500">Truck</span> <span className="font-bold">{t.unitNumber}</span> {t.name} · {t.reason}
                </p>
              ))}
            {o.carried.map((f, i) => (
              <p key={i} className="mt-1 text-xs text-ink-700">
                <Badge tone="block">{f.rule}</Badge>{" "}
                {["EQUIPMENT", "EQUIPMENT_BOOKED", "RIGGING", "LOCATE"].includes(f.rule) ? "stays on the order (no crew change fixes it)" : "kept from a placement made before the fill"}: {f.message}
              </p>
            ))}
            {o.overridesLapse.map((v, i) => (
              <p key={`v${i}`} className="mt-1 text-xs text-ink-700">
                <Badge tone="overridden">{v.rule} override lapses</Badge> it was given for the crew as it is now; a supervisor must give it again after this change.
              </p>
            ))}
            <ul className="mt-2 space-y-1.5">
              {seats.map((s) => (
                <li key={s.positionId} data-testid={`fill-seat-${s.positionId}`}>
                  <label className="flex items-start gap-2 text-sm">
                    <input
                      type="checkbox"
                      className="mt-1"
                      checked={chosen.has(s.positionId)}
                      disabled={!enabled}
                      onChange={(e) => toggle([s.positionId], e.target.checked)}
                      aria-label={`${POSITION_LABEL[s.position] ?? s.position} on ${o.number}: ${s.workerName}`}
                    />
                    <span>
                      <span className="text-[11px] font-extrabold uppercase tracking-wide text-ink-500">{POSITION_LABEL[s.position] ?? s.position}</span>{" "}
                      <span className="font-bold">{s.workerName}</span>
                      <span className="block text-xs text-ink-700">{s.reasons.join(" · ")}</span>
                    </span>
                  </label>
                </li>
              ))}
            </ul>
          </article>
        );
      })}
    </section>
  );
}
