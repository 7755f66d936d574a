import type { Knex } from "knex";
import { ApproachFigure, FiguresCaution, LiftFiguresView } from "@/components/field-figures";
import { getLiftPlan, riggingChoices } from "@/lib/gear/data";
import { yardElevationM as yardElevation } from "@/lib/yards/data";
import { approachFor, liftFiguresFor } from "@/lib/gear/figures";
import { isLiftingKind } from "@/lib/gear/lift";
import { energyLabel } from "@/lib/orders/voltage";
import type { OrderView } from "@/lib/orders/model";
import { LiftPlanEditor } from "./lift-plan";

/** The order page's field figures: minimum approach distance and the lift plan (issue 16). */
export async function OrderFigures({ conn, organisationId, order, canEdit }: { conn: Knex; organisationId: number; order: OrderView; canEdit: boolean }) {
  const [yardElevationM, plan, rigging] = await Promise.all([
    yardElevation(conn, order.yardId),
    getLiftPlan(conn, organisationId, order.id),
    riggingChoices(conn, order.id),
  ]);
  const approach = approachFor({ ...order, yardElevationM });
  const lifting = isLiftingKind({ workTypeName: order.workTypeName, title: order.title });
  const figures = plan ? liftFiguresFor(plan) : null;
  return (
    <section className="card mb-4 grid gap-4 p-4 md:grid-cols-2" aria-labelledby="figures-h" data-testid="order-figures">
      <h2 id="figures-h" className="text-base font-bold md:col-span-2">
        Field figures
      </h2>
      <ApproachFigure
        approach={approach}
        altitudeM={order.altitudeM ?? yardElevationM}
        altitudeFrom={order.altitudeM === null ? "yard" : "order"}
        voltage={energyLabel(order).replace(/^energized /, "")}
      />
      <div data-testid="lift-plan">
        <h3 className="text-sm font-bold">Lift plan</h3>
        {plan && figures ? (
          <LiftFiguresView plan={plan} figures={figures} />
        ) : (
          <p className="text-sm text-ink-500">{lifting ? "This is a lifting job and has no lift plan yet." : "No lift on this order."}</p>
        )}
        <LiftPlanEditor orderId={order.id} plan={plan} rigging={rigging} canEdit={canEdit} lifting={lifting} />
      </div>
      <FiguresCaution className="md:col-span-2" />
    </section>
  );
}
