import { WORKERS } from "./scenario";

// Rubber goods and field figures of the demo (our invented Cedar Prairie cooperative).
// Dates are days before the seed day in the worker's yard. Everyone who may climb, work aloft
// or lead (crew leads, journeymen, apprentices) has class 2 gloves — rated for 17 kV, enough for
// the demo's 12.47 kV and 7.2 kV lines — tested recently; the exceptions make the desk's lists
// and the RUBBER_GOODS rule worth looking at.

export interface DemoGear {
  no: string;
  kind: "rubber_gloves" | "rubber_sleeves";
  class: "00" | "0" | "1" | "2" | "3" | "4";
  size: string;
  testedDaysAgo: number;
  issuedDaysAgo?: number;
  retiredDaysAgo?: number;
}

/** Elevation above sea level (m): Mesa Yard sits high enough for Table R-5's factor (1.08 above 1,500 m). */
export const YARD_ELEVATION_M: Record<string, number> = { NOR: 340, MES: 1650 };

/** Dominic Pruett (CP-2010), an apprentice, has only the class 0 gloves from his ground-hand days. */
export const CLASS_0_ONLY = "CP-2010";
/** Ava Castellano (CP-2011): her gloves' 6-month test is overdue. */
export const OVERDUE_TEST = "CP-2011";
/** Andre Beauchamp (CP-1012): gloves due for their test within the month. */
export const DUE_SOON = "CP-1012";
/**
 * The patrollers of the 24.9 kV circuits (WO-26-0106 North, WO-26-0112 Mesa) carry class 3
 * gloves (maximum use voltage 26.5 kV, 1910.137 Table I-4): the lead on energized work needs
 * gloves rated for the line (CREW-CHECK.md, RUBBER_GOODS), even on a patrol.
 */
export const CLASS_3 = new Set(["CP-1004", "CP-2008"]);

const CLIMBING = new Set(["crew_lead", "journeyman", "apprentice"]);
const SIZES = ["9", "9.5", "10", "10.5", "11", "11.5"];

export const DEMO_GEAR: DemoGear[] = WORKERS.filter((w) => CLIMBING.has(w.cls)).flatMap((w, i): DemoGear[] => {
  const size = SIZES[i % SIZES.length];
  if (w.no === CLASS_0_ONLY) return [{ no: w.no, kind: "rubber_gloves", class: "0", size, testedDaysAgo: 40, issuedDaysAgo: 400 }];
  if (w.no === OVERDUE_TEST) return [{ no: w.no, kind: "rubber_gloves", class: "2", size, testedDaysAgo: 214, issuedDaysAgo: 214 }];
  if (w.no === DUE_SOON) return [{ no: w.no, kind: "rubber_gloves", class: "2", size, testedDaysAgo: 166, issuedDaysAgo: 166 }];
  // Tested in the tool room's round last week, so they stay in test for the next ~6 months
  // (the far-off days that tests and Fill plan on included).
  const gloves: DemoGear = { no: w.no, kind: "rubber_gloves", class: CLASS_3.has(w.no) ? "3" : "2", size, testedDaysAgo: 1 + (i % 5), issuedDaysAgo: 1 + (i % 5) };
  // Journeymen and crew leads also wear class 2 sleeves (12-month test).
  const sleeves: DemoGear[] =
    w.cls === "apprentice" ? [] : [{ no: w.no, kind: "rubber_sleeves", class: "2", size: i % 2 ? "regular" : "long", testedDaysAgo: 30 + ((i * 13) % 90) }];
  // A retired pair on record for one worker (kept, no longer counted).
  const retired: DemoGear[] = w.no === "CP-1008" ? [{ no: w.no, kind: "rubber_gloves", class: "2", size, testedDaysAgo: 230, issuedDaysAgo: 400, retiredDaysAgo: 30 }] : [];
  return [gloves, ...sleeves, ...retired];
});

/** A serial as the tool room stamps it: CP-G-1008-1. */
export const serialOf = (g: DemoGear, n: number) => `CP-${g.kind === "rubber_gloves" ? "G" : "S"}-${g.no.slice(3)}-${n}`;

/** Lift plans for the demo's transformer change-outs (nameplate weights are our own demo values). */
export const DEMO_LIFTS: {
  order: string;
  loadLabel: string;
  loadLb: number;
  partsOfLine: number;
  blockWllLb: number;
  lineWllLb: number;
  slingWllLb: number;
  slingLegs: number;
  slingAngleDeg: number;
}[] = [
  { order: "WO-26-0101", loadLabel: "25 kVA pole-mount transformer", loadLb: 410, partsOfLine: 3, blockWllLb: 2000, lineWllLb: 450, slingWllLb: 1000, slingLegs: 1, slingAngleDeg: 90 },
  { order: "WO-26-0102", loadLabel: "50 kVA pole-mount transformer", loadLb: 640, partsOfLine: 3, blockWllLb: 2000, lineWllLb: 450, slingWllLb: 1000, slingLegs: 2, slingAngleDeg: 60 },
  { order: "WO-26-0109", loadLabel: "15 kVA pole-mount transformer", loadLb: 265, partsOfLine: 2, blockWllLb: 1500, lineWllLb: 450, slingWllLb: 800, slingLegs: 1, slingAngleDeg: 90 },
];
