import type { Approach } from "@/lib/rules/types";
import { FIGURES_CAUTION, type LiftPlan } from "@/lib/gear/lift";
import type { LiftCheck } from "@/lib/gear/figures";
import { Badge } from "@/components/status";

// The field figures as the order page and the briefing show them: the minimum approach distance
// with its table cited, and a lift plan's forces against each part's working load limit. Always
// with the caution: the figures assist; procedures, ratings, regulations and the crew lead decide.

export function FiguresCaution({ className = "" }: { className?: string }) {
  return (
    <p className={`rounded-md border border-rule bg-paper-200 px-3 py-2 text-xs text-ink-700 ${className}`} role="note" data-testid="figures-caution">
      <strong>Figures assist; they do not decide.</strong> {FIGURES_CAUTION}
    </p>
  );
}

const fmt = (n: number, d = 2) => n.toLocaleString("en-US", { minimumFractionDigits: d, maximumFractionDigits: d });
const lb = (n: number) => `${n.toLocaleString("en-US", { minimumFractionDigits: 1, maximumFractionDigits: 1 })} lb`;

/** The minimum approach distance for the order's voltage and site, or why there is none. */
export function ApproachFigure({
  approach,
  altitudeM,
  altitudeFrom,
  voltage,
}: {
  approach: Approach | null;
  altitudeM: number;
  altitudeFrom: "order" | "yard";
  voltage: string;
}) {
  const site = `${altitudeM.toLocaleString("en-US")} m (${altitudeFrom === "order" ? "this order's site" : "the yard's elevation"})`;
  let body: React.ReactNode;
  if (approach === null) {
    body = <p className="text-sm">No minimum approach distance: the work is not energized, its voltage is not recorded, or it is below 50 V.</p>;
  } else if ("avoidContact" in approach) {
    body = (
      <p className="text-sm">
        <strong>Avoid contact</strong> ({voltage}: 29 CFR 1910.269 Table R-6, 0.050–0.300 kV).
      </p>
    );
  } else if ("engineering" in approach) {
    body = (
      <p className="text-sm">
        Above 72.5 kV: the employer&apos;s own engineering analysis sets the distance (29 CFR 1910.269 Table R-3); the board gives no figure.
      </p>
    );
  } else {
    body = (
      <>
        <p className="text-2xl font-extrabold tabular-nums" data-testid="approach-distance">
          {fmt(approach.meters)} m <span className="text-base font-bold text-ink-700">({fmt(approach.feet)} ft)</span>
        </p>
        <p className="text-sm text-ink-700">
          {voltage}, phase-to-ground exposure, at {site}: altitude factor {approach.altitudeFactor.toFixed(2)}.
        </p>
        <p className="text-xs text-ink-500" data-testid="approach-source">
          {approach.source}
        </p>
      </>
    );
  }
  return (
    <div data-testid="approach">
      <h3 className="text-sm font-bold">Minimum approach distance</h3>
      {body}
    </div>
  );
}

const PART_LABEL: Record<LiftCheck["part"], string> = { block: "Upper block load", line: "Lead-line pull (hand line)", "sling leg": "Each sling leg" };

/** The plan's figures and each part's force against its WLL. */
export function LiftFiguresView({
  plan,
  figures,
}: {
  plan: LiftPlan;
  figures: { leadLinePullLb: number; blockLoadLb: number; slingLegLb: number; loadLb: number; source: string; checks: LiftCheck[] };
}) {
  const over = figures.checks.some((c) => c.over);
  return (
    <div data-testid="lift-figures">
      <p className="text-sm">
        <strong>{plan.loadLabel ?? "Load"}</strong>: {lb(figures.loadLb)}
        {plan.siteWeightLb !== null && plan.siteWeightLb > plan.loadLb ? " (the weight read on site)" : " (nameplate)"} · {plan.partsOfLine} part
        {plan.partsOfLine === 1 ? "" : "s"} of line over {plan.sheaves} sheave{plan.sheaves === 1 ? "" : "s"}, friction {plan.frictionPerSheave.toFixed(2)} per sheave ·{" "}
        {plan.slingLegs} sling leg{plan.slingLegs === 1 ? "" : "s"} at {plan.slingAngleDeg}° from the horizontal
      </p>
      <table className="mt-2 w-full text-left text-sm">
        <thead className="text-xs uppercase text-ink-500">
          <tr>
            <th className="py-1 pr-2">Part</th>
            <th className="py-1 pr-2 text-right">Force</th>
            <th className="py-1 pr-2 text-right">WLL</th>
            <th className="py-1">Check</th>
          </tr>
        </thead>
        <tbody>
          {figures.checks.map((c) => (
            <tr key={c.part} className="border-t border-rule" data-testid={`lift-${c.part.replace(" ", "-")}`}>
              <td className="py-1 pr-2">{PART_LABEL[c.part]}</td>
              <td className="whitespace-nowrap py-1 pr-2 text-right tabular-nums">{lb(c.forceLb)}</td>
              <td className="whitespace-nowrap py-1 pr-2 text-right tabular-nums">{c.limitLb === null ? "—" : `${c.limitLb.toLocaleString("en-US")} lb`}</td>
              <td className="py-1">
                {c.limitLb === null ? <Badge tone="muted">No WLL given</Badge> : c.over ? <Badge tone="block">Over the WLL</Badge> : <Badge tone="clear">Within</Badge>}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      {over && (
        <p className="mt-2 rounded-md bg-block-bg px-3 py-2 text-sm font-semibold text-block" role="alert">
          ✖ A part is over its working load limit: the board blocks this order (RIGGING) until the plan changes.
        </p>
      )}
      <p className="mt-1 text-xs text-ink-500">{figures.source}</p>
      {plan.confirmedAt && (
        <p className="mt-1 text-sm" data-testid="lift-confirmed">
          {plan.confirmedStale ? (
            <Badge tone="warn">Changed after the crew lead confirmed it</Badge>
          ) : (
            <Badge tone="clear">
              Confirmed by {plan.confirmedBy ?? "the crew lead"} · {plan.siteWeightLb === null ? "" : `${lb(plan.siteWeightLb)} read on site`}
            </Badge>
          )}
        </p>
      )}
    </div>
  );
}
