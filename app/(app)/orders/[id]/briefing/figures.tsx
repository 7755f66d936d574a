import type { Knex } from "knex";
import { ApproachFigure, FiguresCaution, LiftFiguresView } from "@/components/field-figures";
import { getOrder } from "@/lib/orders/data";
import { getLiftPlan } from "@/lib/gear/data";
import { yardElevationM as yardElevation } from "@/lib/yards/data";
import { approachFor, liftFiguresFor } from "@/lib/gear/figures";
import { isLiftingKind } from "@/lib/gear/lift";
import { energyLabel } from "@/lib/orders/voltage";
import { LiftConfirmForm } from "./lift-confirm";

/**
 * The figures the crew needs on site, in the briefing: the minimum approach distance for the
 * order's voltage and site (Table R-6 × Table R-5) and the lift plan, which the crew lead
 * confirms with the weight read off the nameplate on site.
 */
export async function BriefingFigures({ conn, organisationId, orderId, isLead }: { conn: Knex; organisationId: number; orderId: number; isLead: boolean }) {
  const order = await getOrder(conn, organisationId, orderId);
  if (!order) return null;
  const [yardElevationM, plan] = await Promise.all([yardElevation(conn, order.yardId), getLiftPlan(conn, organisationId, orderId)]);
  const figures = plan ? liftFiguresFor(plan) : null;
  const lifting = isLiftingKind({ workTypeName: order.workTypeName, title: order.title });
  return (
    <section className="card mb-4 space-y-4 p-4" aria-labelledby="bfig-h" data-testid="briefing-figures">
      <h2 id="bfig-h" className="text-base font-bold">
        Field figures
      </h2>
      <ApproachFigure
        approach={approachFor({ ...order, yardElevationM })}
        altitudeM={order.altitudeM ?? yardElevationM}
        altitudeFrom={order.altitudeM === null ? "yard" : "order"}
        voltage={energyLabel(order).replace(/^energized /, "")}
      />
      <div data-testid="briefing-lift">
        <h3 className="text-sm font-bold">Lift plan</h3>
        {plan && figures ? (
          <>
            <LiftFiguresView plan={plan} figures={figures} />
            {isLead && <LiftConfirmForm orderId={orderId} version={plan.version} plannedLb={plan.loadLb} confirmed={!!plan.confirmedAt && !plan.confirmedStale} />}
          </>
        ) : (
          <p className="text-sm text-ink-500">{lifting ? "No lift plan yet: ask dispatch for one before lifting." : "No lift on this order."}</p>
        )}
      </div>
      <FiguresCaution />
    </section>
  );
}
