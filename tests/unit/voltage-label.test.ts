import { describe, expect, it } from "vitest";
import { energyLabel, voltageLabel } from "@/lib/orders/voltage";

// Nominal distribution system voltages are written phase-to-phase "Y" phase-to-ground:
// 12470Y/7200 V, 24940Y/14400 V, 4160Y/2400 V (ANSI C84.1's table of nominal system voltages,
// recalled from memory). ../shared/CREW-CHECK.md, Corrections 8: a single-phase tap off a
// 12.47Y/7.2 kV feeder is entered with phases 1 and voltageKv 7.2 and labelled "12.47Y/7.2 kV".
// The order's fields as stored (DECIMAL(7,3) columns, phases 1 or 3) go through the rules' label.
describe("voltageLabel over an order's stored fields", () => {
  it.each([
    [{ voltageKv: 7.2, phases: 1, systemKv: 12.47 }, "12.47Y/7.2 kV"], // CREW-CHECK.md Corrections 8
    [{ voltageKv: 14.4, phases: 1, systemKv: 24.94 }, "24.94Y/14.4 kV"], // 24940Y/14400 V (from memory)
    [{ voltageKv: 2.4, phases: 1, systemKv: 4.16 }, "4.16Y/2.4 kV"], // 4160Y/2400 V (from memory)
    [{ voltageKv: Number("12.470"), phases: 3, systemKv: null }, "12.47 kV"], // trailing zeros of DECIMAL(7,3) dropped
    [{ voltageKv: 12.47 }, "12.47 kV"], // phases default to 3 (CREW-CHECK.md: `phases` default 3)
    // System not given: the wye system the tap comes from, 7.2 × √3 = 12.47 (CREW-CHECK.md, `phases`).
    [{ voltageKv: 7.2, phases: 1, systemKv: null }, "12.47Y/7.2 kV"],
    // A system at or below the tap's voltage is not a wye system: ignored, √3 used instead.
    [{ voltageKv: 7.2, phases: 1, systemKv: 7.2 }, "12.47Y/7.2 kV"],
    [{ voltageKv: null, phases: 1, systemKv: 12.47 }, null],
  ])("%o → %s", (facts, label) => {
    expect(voltageLabel(facts)).toBe(label);
  });

  it("says what is live nearby on a de-energized order (CREW-CHECK.md, Corrections 2)", () => {
    expect(energyLabel({ energized: false, voltageKv: 12.47, nearEnergizedKv: Number("24.900") })).toBe("de-energized, 24.9 kV energized nearby");
    expect(energyLabel({ energized: false, voltageKv: null })).toBe("de-energized");
    expect(energyLabel({ energized: true, voltageKv: 7.2, phases: 1, systemKv: 12.47 })).toBe("energized 12.47Y/7.2 kV");
    expect(energyLabel({ energized: true, voltageKv: null })).toBe("energized, voltage unknown");
  });
});
