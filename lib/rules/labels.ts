// Voltage labels as line crews write them. Client-safe: no imports, no I/O.
// A single-phase tap off a 12.47Y/7.2 kV feeder is entered as phases 1 and voltageKv 7.2, and
// labelled with its system, "12.47Y/7.2 kV" (CREW-CHECK.md, Corrections 8). The system's
// phase-to-phase voltage is systemKv when given, otherwise voltageKv × √3 (the wye system the
// tap comes from), rounded to two decimals.

/** 12.47 -> "12.47", 7.2 -> "7.2", 34.5 -> "34.5", 0.24 -> "0.24". */
export function kvNumber(kv: number): string {
  return String(Math.round(kv * 100) / 100);
}

/**
 * The phase-to-phase voltage of the wye system a single-phase line is tapped from: systemKv when
 * it is above the tap's own voltage (anything else is not a wye system), otherwise voltageKv × √3.
 */
export function systemKvOf(voltageKv: number, systemKv?: number | null): number {
  return systemKv != null && systemKv > voltageKv ? systemKv : Math.round(voltageKv * Math.sqrt(3) * 100) / 100;
}

/**
 * "12.47 kV" for a three-phase line, "12.47Y/7.2 kV" for a single-phase one at 7.2 kV to
 * ground; "240 V" below 1 kV; "voltage unknown" for null.
 */
export function voltageLabel(voltageKv: number | null | undefined, phases: number | null | undefined = 3, systemKv?: number | null): string {
  if (voltageKv == null) return "voltage unknown";
  if (voltageKv < 1) return `${Math.round(voltageKv * 1000)} V${phases === 1 ? " single-phase" : ""}`;
  if (phases === 1) return `${kvNumber(systemKvOf(voltageKv, systemKv))}Y/${kvNumber(voltageKv)} kV`;
  return `${kvNumber(voltageKv)} kV`;
}
