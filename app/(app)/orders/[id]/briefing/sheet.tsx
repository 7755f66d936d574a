// The briefing as a read-only sheet: what the crew reads before acknowledging, what dispatch
// sees, and what prints. No hooks: used inside the client screen.
import type { BriefingView } from "@/lib/briefings/data";
import { Badge } from "@/components/status";
import { CONTROLS, FAIL_ACTIONS, FT_TO_M, GEAR, HAZARDS, POLE_CHECKS, type BriefingData, type GearCheck } from "@/lib/briefings/model";
import { fmtStamp } from "./when";

const RESULT: Record<string, { tone: "clear" | "block" | "muted"; word: string }> = {
  pass: { tone: "clear", word: "Pass" },
  fail: { tone: "block", word: "Fail" },
  na: { tone: "muted", word: "n/a" },
};

export function Section({ title, children, cite, id }: { title: string; children: React.ReactNode; cite?: React.ReactNode; id?: string }) {
  return (
    <section className="card break-inside-avoid p-4 print:rounded-none print:border-0 print:border-t print:bg-transparent print:p-0 print:pt-3 print:shadow-none" aria-labelledby={id}>
      <h2 id={id} className="text-xs font-bold uppercase tracking-widest text-copper">
        {title}
      </h2>
      {cite && <p className="mt-0.5 text-xs text-ink-500">{cite}</p>}
      <div className="mt-2">{children}</div>
    </section>
  );
}

function Row({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <div className="grid grid-cols-1 gap-0.5 py-1.5 sm:grid-cols-[12rem_1fr] sm:gap-3">
      <dt className="text-sm font-semibold">{label}</dt>
      <dd className="text-sm text-ink-700">{children}</dd>
    </div>
  );
}

export function gearSummary(g: GearCheck | null) {
  if (!g) return "—";
  const bits = [
    `gloves ${g.gloves.result === "ok" ? `OK (tested ${g.gloves.testedOn})` : "not used"}`,
    `sleeves ${g.sleeves.result === "ok" ? `OK (tested ${g.sleeves.testedOn})` : "not used"}`,
    ...GEAR.map((x) => `${x.short} ${g[x.key] === "ok" ? "OK" : "not used"}`),
  ];
  return bits.join(" · ") + (g.notes ? ` — ${g.notes}` : "");
}

export function BriefingSheet({ view, data, photoUrl }: { view: BriefingView; data: BriefingData; photoUrl: (fileId: number) => string }) {
  const { crew, acks, order } = view;
  const name = (id: number | null) => crew.find((c) => c.workerId === id)?.name ?? "—";
  const ackOf = new Map(acks.map((a) => [a.workerId, a]));
  return (
    <div className="space-y-3 print:space-y-2" data-testid="briefing-sheet">
      <Section title="Crew and positions">
        <ul className="divide-y divide-rule">
          {crew.map((c) => {
            const a = ackOf.get(c.workerId);
            return (
              <li key={c.workerId} className="flex flex-wrap items-center justify-between gap-2 py-1.5 text-sm">
                <span>
                  <strong>{c.name}</strong> <span className="text-ink-500">· {c.positionLabel}</span>
                </span>
                {a ? (
                  <Badge tone="clear">Acknowledged {fmtStamp(a.acknowledgedAt, order.timezone)}{a.inPerson ? " (in person)" : ""}</Badge>
                ) : view.briefing?.state === "briefed" ? (
                  <Badge tone="warn">Not acknowledged</Badge>
                ) : null}
              </li>
            );
          })}
        </ul>
      </Section>

      <Section title="Hazards">
        <dl>
          {HAZARDS.map((h) => {
            const v = data.hazards[h.key];
            return (
              <Row key={h.key} label={h.label}>
                {v.present ? <strong className="text-block">Yes. </strong> : <span className="text-ink-500">None noted. </span>}
                {v.notes}
              </Row>
            );
          })}
        </dl>
      </Section>

      <Section title="Drop zone">
        <dl>
          <Row label="Radius around the pole">
            <strong>
              {data.dropZone.radiusFt} ft ({(data.dropZone.radiusFt * FT_TO_M).toFixed(1)} m)
            </strong>
            {data.dropZone.reason ? ` — larger because: ${data.dropZone.reason}` : ""}
          </Row>
          <Row label="May enter while someone is aloft">{data.dropZone.entrants.length ? data.dropZone.entrants.map(name).join(", ") : "Nobody"}</Row>
          {data.dropZone.notes && <Row label="Notes">{data.dropZone.notes}</Row>}
        </dl>
      </Section>

      <Section title="Work procedure and special precautions">
        <p className="whitespace-pre-line text-sm">{data.procedure.steps || "—"}</p>
        {data.procedure.precautions && <p className="mt-2 whitespace-pre-line text-sm text-ink-700">Precautions: {data.procedure.precautions}</p>}
      </Section>

      <Section title="Energy-source controls">
        <ul className="text-sm">
          {CONTROLS.map((c) => (
            <li key={c.key}>
              <span aria-hidden="true">{data.controls[c.key] ? "☑" : "☐"}</span> {c.label}
              <span className="sr-only">{data.controls[c.key] ? ": yes" : ": no"}</span>
            </li>
          ))}
        </ul>
        {data.controls.notes && <p className="mt-2 text-sm text-ink-700">{data.controls.notes}</p>}
      </Section>

      <Section title="Pole check before anyone climbs" cite={<PoleCite />}>
        <p className="text-sm">
          Pole: <strong className="capitalize">{data.poleCheck.material}</strong>
        </p>
        <dl>
          {POLE_CHECKS.map((c) => {
            const item = data.poleCheck.items[c.key];
            const r = item.result ? RESULT[item.result] : null;
            return (
              <Row key={c.key} label={c.label}>
                {r ? <Badge tone={r.tone}>{r.word}</Badge> : <span className="text-ink-500">Not recorded</span>} {item.notes}
                {item.photoFileId && (
                  <a href={photoUrl(item.photoFileId)} target="_blank" rel="noopener noreferrer" className="ml-1 font-semibold text-copper underline no-print">
                    Photo
                  </a>
                )}
              </Row>
            );
          })}
        </dl>
        {data.poleCheck.failAction && (
          <p className="mt-2 rounded-md bg-warn-bg px-3 py-2 text-sm font-semibold text-warn">
            ▲ After the failure: {FAIL_ACTIONS.find((f) => f.key === data.poleCheck.failAction)?.label}
            {data.poleCheck.failActionNotes ? ` — ${data.poleCheck.failActionNotes}` : ""}
          </p>
        )}
      </Section>

      <Section title="Emergency plan">
        <dl>
          <Row label="Nearest hospital">{[data.emergency.hospital, data.emergency.hospitalAddress].filter(Boolean).join(", ") || "—"}</Row>
          <Row label="Calls 911">{name(data.emergency.callerWorkerId)}</Row>
          <Row label="Does the rescue">{name(data.emergency.rescuerWorkerId)}</Row>
          {data.emergency.notes && <Row label="Notes">{data.emergency.notes}</Row>}
        </dl>
      </Section>

      {acks.length > 0 && (
        <Section title="Acknowledgements and gear checks">
          <dl>
            {acks.map((a) => (
              <Row key={a.workerId} label={a.name}>
                {fmtStamp(a.acknowledgedAt, order.timezone)}
                {a.inPerson ? ` · in person, recorded by ${a.recordedBy ?? "the lead"}` : " · own sign-in"}
                <span className="block text-xs text-ink-500">{gearSummary(a.gearCheck)}</span>
              </Row>
            ))}
          </dl>
        </Section>
      )}
    </div>
  );
}

export function PoleCite() {
  return (
    <>
      29 CFR 1910.269(q)(1)(i): before anyone climbs, the pole must be found able to carry the stresses of the work, or be braced or
      otherwise supported. Methods: 1910.269 Appendix D (inspecting and testing wood poles). Digging about 6 in. at the ground line on
      two sides of a wood pole is common practice; a steel pole is checked for corrosion at and below the ground line, a concrete
      pole for cracks, spalling and exposed rebar.
    </>
  );
}
