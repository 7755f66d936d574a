// Voltage labels (CREW-CHECK.md Corrections 8). A 12.47 kV wye feeder has 7.2 kV phase to
// ground (12.47 / √3 = 7.20; 12470Y/7200 V is a standard nominal system voltage in ANSI C84.1,
// from memory); 24.94Y/14.4 and 34.5Y/19.92 likewise (common practice).
import { describe, expect, it } from "vitest";
import { systemKvOf, voltageLabel } from "@/lib/rules/labels";

describe("voltageLabel", () => {
  it.each([
    [7.2, 1, undefined, "12.47Y/7.2 kV"],
    [14.4, 1, undefined, "24.94Y/14.4 kV"],
    [14.4, 1, 24.9, "24.9Y/14.4 kV"],
    [19.92, 1, 34.5, "34.5Y/19.92 kV"],
    [12.47, 3, undefined, "12.47 kV"],
    [34.5, 3, undefined, "34.5 kV"],
    [12.47, undefined, undefined, "12.47 kV"],
    [0.24, 3, undefined, "240 V"],
    [0.12, 1, undefined, "120 V single-phase"],
    [null, 3, undefined, "voltage unknown"],
  ])("%s kV, phases %s, system %s -> %s", (kv, phases, system, label) => {
    expect(voltageLabel(kv, phases, system)).toBe(label);
  });

  it("the system of a tap is voltageKv × √3 unless systemKv is given", () => {
    expect(systemKvOf(7.2)).toBe(12.47);
    expect(systemKvOf(7.2, 12.47)).toBe(12.47);
    expect(systemKvOf(7.62)).toBe(13.2);
    // A "system" at or below the tap's own voltage is not a wye system: √3 instead.
    expect(systemKvOf(7.2, 7.2)).toBe(12.47);
    expect(systemKvOf(7.2, 0)).toBe(12.47);
  });
});
