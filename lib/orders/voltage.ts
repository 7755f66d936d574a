// How an order reads on cards, lists and the order page: its voltage and whether it is live.
// Pure and client-safe. The voltage label itself is the rules' own (lib/rules/labels.ts), so the
// board, the findings and the order page write a tap the same way: a single-phase tap entered as
// phases 1 at 7.2 kV on a 12.47 kV system reads "12.47Y/7.2 kV" (../shared/CREW-CHECK.md,
// Corrections 8).
import { kvNumber, voltageLabel as rulesVoltageLabel } from "@/lib/rules/labels";

export interface VoltageFacts {
  voltageKv: number | null;
  phases?: number | null;
  systemKv?: number | null;
}

/** "12.47 kV", "12.47Y/7.2 kV", "240 V"; null when the voltage is unknown. */
export function voltageLabel(o: VoltageFacts): string | null {
  if (o.voltageKv === null || o.voltageKv === undefined || !Number.isFinite(o.voltageKv)) return null;
  const phases = o.phases === 1 ? 1 : 3;
  // A system voltage at or below the tap's own is not a wye system: fall back to voltage × √3.
  const system = o.systemKv != null && o.systemKv > o.voltageKv ? o.systemKv : null;
  return rulesVoltageLabel(o.voltageKv, phases, system);
}

/** "energized 12.47Y/7.2 kV", "energized, voltage unknown", or "de-energized" with what is live nearby. */
export function energyLabel(o: VoltageFacts & { energized: boolean; nearEnergizedKv?: number | null }): string {
  if (o.energized) {
    const label = voltageLabel(o);
    return label ? `energized ${label}` : "energized, voltage unknown";
  }
  if (o.nearEnergizedKv !== null && o.nearEnergizedKv !== undefined && o.nearEnergizedKv > 0)
    return `de-energized, ${kvNumber(o.nearEnergizedKv)} kV energized nearby`;
  return "de-energized";
}
