// How an order's voltage reads on cards, lists and the order page. Pure and client-safe.
//
// A single-phase tap is entered by its voltage to ground (`phases: 1`, e.g. 7.2 kV) and the
// phase-to-phase voltage of the wye system it comes off (`systemKv`, e.g. 12.47 kV); the trade
// writes that system as "12.47Y/7.2 kV" (phase-to-phase "Y" phase-to-ground, the way nominal
// system voltages are written: 12470Y/7200 V, 24940Y/14400 V — recalled from memory).
// ../shared/CREW-CHECK.md, Corrections 8.

export interface VoltageFacts {
  voltageKv: number | null;
  phases?: number | null;
  systemKv?: number | null;
}

/** 12.47 → "12.47", 7.200 → "7.2", 0.24 → "0.24": at most three decimals, no trailing zeros. */
export function kvText(kv: number): string {
  return String(Math.round(kv * 1000) / 1000);
}

/**
 * "12.47 kV" for a three-phase order; "12.47Y/7.2 kV" for a single-phase tap with its system
 * voltage; "7.2 kV single-phase" when the system is not given; null when the voltage is unknown.
 */
export function voltageLabel(o: VoltageFacts): string | null {
  if (o.voltageKv === null || o.voltageKv === undefined || !Number.isFinite(o.voltageKv)) return null;
  const v = kvText(o.voltageKv);
  if (o.phases !== 1) return `${v} kV`;
  if (o.systemKv !== null && o.systemKv !== undefined && Number.isFinite(o.systemKv) && o.systemKv > o.voltageKv)
    return `${kvText(o.systemKv)}Y/${v} kV`;
  return `${v} kV single-phase`;
}

/** "energized 12.47Y/7.2 kV", "energized, voltage unknown", or "de-energized" with what is live nearby. */
export function energyLabel(o: VoltageFacts & { energized: boolean; nearEnergizedKv?: number | null }): string {
  if (o.energized) {
    const label = voltageLabel(o);
    return label ? `energized ${label}` : "energized, voltage unknown";
  }
  if (o.nearEnergizedKv !== null && o.nearEnergizedKv !== undefined && o.nearEnergizedKv > 0)
    return `de-energized, ${kvText(o.nearEnergizedKv)} kV energized nearby`;
  return "de-energized";
}
