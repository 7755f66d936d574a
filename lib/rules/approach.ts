// Minimum approach distance for an order: 29 CFR 1910.269 Table R-6 (AC live-line work,
// phase-to-ground exposure) times the Table R-5 altitude correction factor. Pure, client-safe.
//
// Where the values come from (the regulation's text, read through the stored copies this
// project could reach; see tests/unit/rules/approach.test.ts for the row-by-row checks):
// - Table R-6, phase-to-ground metres: 0.33 / 0.63 / 0.65 / 0.77 / 0.84 / 1.00 m for the rows
//   0.301-0.750 / 0.751-5.0 / 5.1-15.0 / 15.1-36.0 / 36.1-46.0 / 46.1-72.5 kV, and "avoid
//   contact" for 0.050-0.300 kV, as quoted from the current eCFR text of 1910.269. The feet
//   column (1.09 / 2.07 / 2.14 / 2.53 / 2.76 / 3.29 ft) is the table's own column, recalled from
//   memory of the 2014 text and checked against the metres (each within 0.01 ft of m x 3.2808,
//   the table having converted from unrounded metres); the full OSHA page itself was not
//   reachable from here.
// - Table R-5, altitude correction factors: <= 900 m 1.00, then 1.02, 1.05, 1.08, 1.11, 1.14,
//   1.17, 1.20 for each further 300 m up to 3,000 m, then 1.25, 1.30, 1.35, 1.39, 1.44 for each
//   further 600 m up to 6,000 m (as reproduced in UFC 3-560-01 Table 3-2 from 1910.269).
// Above 72.5 kV the employer's own engineering analysis applies (Table R-3), so the figure is
// { engineering: true }; 0.050-0.300 kV is { avoidContact: true }; below 0.050 kV, unknown voltage
// or de-energized work there is no figure (null).

import type { Approach, WorkOrder } from "./types";

export const APPROACH_SOURCE = "29 CFR 1910.269 Table R-6, Table R-5";

export interface ApproachRow {
  /** The row's voltage range (kV, phase to phase), inclusive. */
  fromKv: number;
  toKv: number;
  /** Phase-to-ground exposure distance in the table's metre column, hundredths (0.65 m = 65). */
  cm: number;
  /** ... and in the table's foot column, hundredths (2.14 ft = 214). */
  centiFeet: number;
}

/** 29 CFR 1910.269 Table R-6, phase-to-ground exposure, rows with a distance. */
export const TABLE_R6: readonly ApproachRow[] = [
  { fromKv: 0.301, toKv: 0.75, cm: 33, centiFeet: 109 },
  { fromKv: 0.751, toKv: 5.0, cm: 63, centiFeet: 207 },
  { fromKv: 5.1, toKv: 15.0, cm: 65, centiFeet: 214 },
  { fromKv: 15.1, toKv: 36.0, cm: 77, centiFeet: 253 },
  { fromKv: 36.1, toKv: 46.0, cm: 84, centiFeet: 276 },
  { fromKv: 46.1, toKv: 72.5, cm: 100, centiFeet: 329 },
];

/** Table R-6's first row: 0.050 to 0.300 kV, avoid contact. */
export const AVOID_CONTACT = { fromKv: 0.05, toKv: 0.3 } as const;
/** Table R-6's last row ends at 72.5 kV; above it Table R-3's engineering analysis applies. */
export const TABLE_R6_TOP_KV = 72.5;

export interface AltitudeRow {
  /** Highest altitude (metres) of the band, inclusive; the band starts just above the previous row's. */
  toM: number;
  toFt: number;
  /** Correction factor in hundredths (1.05 = 105). */
  factor: number;
}

/** 29 CFR 1910.269 Table R-5, altitude correction factor. */
export const TABLE_R5: readonly AltitudeRow[] = [
  { toM: 900, toFt: 3000, factor: 100 },
  { toM: 1200, toFt: 4000, factor: 102 },
  { toM: 1500, toFt: 5000, factor: 105 },
  { toM: 1800, toFt: 6000, factor: 108 },
  { toM: 2100, toFt: 7000, factor: 111 },
  { toM: 2400, toFt: 8000, factor: 114 },
  { toM: 2700, toFt: 9000, factor: 117 },
  { toM: 3000, toFt: 10000, factor: 120 },
  { toM: 3600, toFt: 12000, factor: 125 },
  { toM: 4200, toFt: 14000, factor: 130 },
  { toM: 4800, toFt: 16000, factor: 135 },
  { toM: 5400, toFt: 18000, factor: 139 },
  { toM: 6000, toFt: 20000, factor: 144 },
];

/** The highest altitude Table R-5 covers (metres). */
export const TABLE_R5_TOP_M = 6000;

/**
 * Table R-5's factor for a site elevation in metres: 1.00 up to and including 900 m, 1.02
 * above 900 m up to 1,200 m, and so on. Null above 6,000 m (the table ends there).
 */
export function altitudeFactor(altitudeM: number): number | null {
  const f = altitudeFactorHundredths(altitudeM);
  return f === null ? null : f / 100;
}

function altitudeFactorHundredths(altitudeM: number): number | null {
  for (const row of TABLE_R5) if (altitudeM <= row.toM) return row.factor;
  return null;
}

/** The voltage a single-phase line is looked up by, above Table R-6's footnote rows. */
export const SQRT3 = Math.sqrt(3);

/**
 * The voltage (kV) Table R-6 is entered with, or null when unknown. Multiphase lines: the
 * order's voltageKv, which is phase to phase. Single-phase lines (`phases: 1`), whose
 * voltageKv is the voltage to ground: Table R-6's footnote (use the voltage to ground) covers
 * its rows up to 0.750 kV only, so up to 0.750 kV the voltage to ground; above that the system's
 * phase-to-phase voltage, systemKv when given, otherwise voltageKv x sqrt(3) (the wye system the
 * tap comes from). So a 14.4 kV tap of a 24.9 kV system falls in the 15.1-36.0 kV row.
 */
export function lookupVoltageKv(order: Pick<WorkOrder, "voltageKv" | "phases" | "systemKv">): number | null {
  const v = order.voltageKv;
  if (v === null || v === undefined) return null;
  if ((order.phases ?? 3) !== 1 || v <= 0.75) return v;
  return order.systemKv != null && order.systemKv > 0 ? order.systemKv : v * SQRT3;
}

/**
 * The row a lookup voltage falls in. Rows are inclusive at both ends and the table leaves gaps
 * between them (0.300/0.301, 5.0/5.1 ...): a voltage in a gap takes the next row up (the larger
 * distance), since it is above the lower row's range.
 */
export function tableR6Row(kv: number): ApproachRow | "avoid_contact" | "engineering" | null {
  if (kv < AVOID_CONTACT.fromKv) return null;
  if (kv <= AVOID_CONTACT.toKv) return "avoid_contact";
  for (const row of TABLE_R6) if (kv <= row.toKv) return row;
  return "engineering";
}

/** Hundredths x hundredths -> rounded to hundredths, half up, in exact integer arithmetic. */
function scaled(hundredths: number, factorHundredths: number): number {
  return Math.floor((hundredths * factorHundredths + 50) / 100) / 100;
}

/**
 * The order's minimum approach distance (see the file comment): null when the order is not
 * energized, its voltage is unknown or below 0.050 kV, or its site is above Table R-5's last row.
 */
export function approachDistance(
  order: Pick<WorkOrder, "energized" | "voltageKv" | "phases" | "systemKv" | "altitudeM">,
): Approach | null {
  if (!order.energized) return null;
  const kv = lookupVoltageKv(order);
  if (kv === null) return null;
  const row = tableR6Row(kv);
  if (row === null) return null;
  if (row === "avoid_contact") return { avoidContact: true };
  if (row === "engineering") return { engineering: true };
  const factor = altitudeFactorHundredths(order.altitudeM ?? 0);
  if (factor === null) return null;
  return {
    meters: scaled(row.cm, factor),
    feet: scaled(row.centiFeet, factor),
    altitudeFactor: factor / 100,
    exposure: "phase_to_ground",
    source: APPROACH_SOURCE,
  };
}
