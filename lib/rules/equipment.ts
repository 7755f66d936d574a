// EQUIPMENT: a `bucket` order has a bucket truck, a `digger_derrick` order a digger derrick; an
// aerial device (a bucket truck) on energized work is insulated and its dielectric test is
// within 12 months of the work day (through the order's last day). Only when the day tracks
// equipment (an `equipment` field). These are common practice and the employer's policy,
// following the periodic dielectric test of the aerial-device standard; no OSHA table sets them.
//
// Also the driver's licence an order's equipment needs (OPERATOR_CERT reads it): the highest
// licence any of its equipment requires, class A covering class B.

import { dateWords, energizedAtLeast, ENERGIZED_WORK_KV, finding, type RuleCheck } from "./common";
import { addMonths } from "./gear";
import type { EquipmentIndex } from "./equipment-index";
import type { SnapshotIndex } from "./snapshot-index";
import type { Equipment, EquipmentKind, Finding, Licence, WorkOrder, WorkType } from "./types";

export const EQUIPMENT_SOURCE =
  "common practice and employer policy (the periodic dielectric test of the aerial-device standard); not an OSHA table";

/** Months between an insulated aerial device's dielectric tests (policy, common practice). */
export const DIELECTRIC_TEST_MONTHS = 12;

/** The kind of equipment a work type cannot go without. */
export const NEEDED_KIND: Partial<Record<WorkType, EquipmentKind>> = {
  bucket: "bucket_truck",
  digger_derrick: "digger_derrick",
};

const KIND_WORDS: Record<EquipmentKind, string> = {
  bucket_truck: "bucket truck",
  digger_derrick: "digger derrick",
  pickup: "pickup",
  trailer: "trailer",
  other: "piece of equipment",
};

export function equipmentKindWord(kind: EquipmentKind): string {
  return KIND_WORDS[kind];
}

/** Whether a piece is an aerial device (the insulation and dielectric-test checks apply). */
export function isAerialDevice(e: Pick<Equipment, "kind">): boolean {
  return e.kind === "bucket_truck";
}

/** The last day an aerial device's dielectric test covers (12 months, that day included); null = none. */
export function dielectricInTestThrough(e: Pick<Equipment, "dielectricTestedOn">): string | null {
  return e.dielectricTestedOn ? addMonths(e.dielectricTestedOn, DIELECTRIC_TEST_MONTHS) : null;
}

/** What is wrong with an aerial device for energized work through lastDay; null = fine. */
export function aerialDeviceProblem(e: Equipment, lastDay: string): string | null {
  const problems: string[] = [];
  if (!e.insulated) problems.push("is not an insulated aerial device");
  const through = dielectricInTestThrough(e);
  if (through === null) problems.push("has no dielectric test on record");
  else if (through < lastDay) {
    problems.push(
      `was last dielectric-tested on ${dateWords(e.dielectricTestedOn!)}, in test only through ${dateWords(through)} (every ${DIELECTRIC_TEST_MONTHS} months)`,
    );
  }
  return problems.length ? problems.join(" and ") : null;
}

export const equipmentRule: RuleCheck = (orders, ix) => {
  const out: Finding[] = [];
  if (!ix.equipment.tracked) return out;
  for (const order of orders) {
    const pieces = ix.equipment.of(order.id);
    const needed = NEEDED_KIND[order.workType];
    if (needed && !pieces.some((e) => e.kind === needed)) {
      const word = KIND_WORDS[needed];
      out.push(
        finding(
          "EQUIPMENT",
          "block",
          order,
          null,
          `${order.workType === "bucket" ? "Bucket" : "Digger-derrick"} work needs a ${word}; none is assigned. Assign a ${word} to the order.`,
          EQUIPMENT_SOURCE,
        ),
      );
    }
    if (!energizedAtLeast(order, ENERGIZED_WORK_KV)) continue;
    const lastDay = ix.lastDay(order);
    for (const e of pieces) {
      if (!isAerialDevice(e)) continue;
      const problem = aerialDeviceProblem(e, lastDay);
      if (problem) {
        const f = finding(
          "EQUIPMENT",
          "block",
          order,
          null,
          `${e.name} ${problem}, and the order is energized work${lastDay === order.startDate ? ` on ${dateWords(lastDay)}` : ` through ${dateWords(lastDay)}`}. ` +
            "Assign an insulated aerial device with a current dielectric test, or record its test.",
          EQUIPMENT_SOURCE,
        );
        f.equipmentId = e.id;
        out.push(f);
      }
    }
  }
  return out;
};

const LICENCE_RANK: Record<Licence, number> = { cdl_b: 1, cdl_a: 2 };

/** The highest licence any of the pieces requires (class A above class B); null = none. */
export function highestLicence(pieces: readonly Pick<Equipment, "licence">[]): Licence | null {
  let best: Licence | null = null;
  for (const e of pieces) if (e.licence && (best === null || LICENCE_RANK[e.licence] > LICENCE_RANK[best])) best = e.licence;
  return best;
}

/**
 * The licence a driver on the order needs: with equipment tracked and on the order, the highest
 * licence any of its equipment requires (null: none of it needs a commercial licence); otherwise
 * the order's own driverLicence (default class B), as before equipment was tracked.
 */
export function requiredDriverLicence(order: WorkOrder, ix: SnapshotIndex): Licence | null {
  return requiredLicenceOf(order, ix.equipment);
}

/** requiredDriverLicence from an equipment index alone (Fill's probes use it). */
export function requiredLicenceOf(order: WorkOrder, equipment: EquipmentIndex): Licence | null {
  if (equipment.tracked) {
    const pieces = equipment.of(order.id);
    if (pieces.length > 0) return highestLicence(pieces);
  }
  return order.driverLicence ?? "cdl_b";
}
