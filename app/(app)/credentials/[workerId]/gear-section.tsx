"use client";

import { useState } from "react";
import { GEAR_KIND_LABEL, RETEST_MONTHS, type GearItem } from "@/lib/gear/model";
import { GearForm } from "./gear-form";
import { GearItemCard } from "./gear-item";

/**
 * The worker's rubber gloves and sleeves on the Credentials desk: class, size, serial, last
 * electrical test and when the next one is due (1910.137 Table I-5: gloves every 6 months,
 * sleeves every 12). HR records new items, new test dates and retirements; others read.
 */
export function GearSection({ workerId, items, today, canEdit }: { workerId: number; items: GearItem[]; today: string; canEdit: boolean }) {
  const [adding, setAdding] = useState(false);
  const inService = items.filter((i) => i.state !== "retired");
  const retired = items.filter((i) => i.state === "retired");

  return (
    <section className="mt-8" aria-labelledby="gear-h" data-testid="gear-section">
      <div className="mb-2 flex flex-wrap items-end justify-between gap-2">
        <div>
          <h2 id="gear-h" className="text-base font-bold">
            Rubber goods
          </h2>
          <p className="text-xs text-ink-500">
            Gloves are retested every {RETEST_MONTHS.rubber_gloves} months, sleeves every {RETEST_MONTHS.rubber_sleeves} (29 CFR 1910.137 Table I-5). The class
            must be rated for the line&apos;s voltage (Table I-4).
          </p>
        </div>
        {canEdit && !adding && (
          <button type="button" className="btn-quiet" onClick={() => setAdding(true)}>
            Record gloves or sleeves
          </button>
        )}
      </div>

      {adding && <GearForm workerId={workerId} today={today} onDone={() => setAdding(false)} onCancel={() => setAdding(false)} />}

      {inService.length === 0 ? (
        <p className="text-sm text-ink-500" data-testid="gear-none">
          No rubber gloves or sleeves on record. On energized work a climber, a worker aloft or a crew lead without rated, tested gloves is blocked on the board.
        </p>
      ) : (
        <ul className="grid gap-2 md:grid-cols-2">
          {inService.map((g) => (
            <GearItemCard key={g.id} g={g} today={today} canEdit={canEdit} />
          ))}
        </ul>
      )}
      {retired.length > 0 && (
        <details className="mt-2 text-sm">
          <summary className="cursor-pointer text-ink-700">Retired ({retired.length})</summary>
          <ul className="mt-1 space-y-1 text-ink-500">
            {retired.map((g) => (
              <li key={g.id}>
                {GEAR_KIND_LABEL[g.kind]}, class {g.class}, serial {g.serial}, retired {g.retiredOn}
              </li>
            ))}
          </ul>
        </details>
      )}
    </section>
  );
}
