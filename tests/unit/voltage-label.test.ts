import { describe, expect, it } from "vitest";
import { energyLabel, kvText, voltageLabel } from "@/lib/orders/voltage";

// Nominal distribution system voltages are written phase-to-phase "Y" phase-to-ground:
// 12470Y/7200 V, 24940Y/14400 V, 4160Y/2400 V (ANSI C84.1's table of nominal system voltages,
// recalled from memory). ../shared/CREW-CHECK.md, Corrections 8: a single-phase tap off a
// 12.47Y/7.2 kV feeder is entered with phases 1 and voltageKv 7.2 and labelled "12.47Y/7.2 kV".
describe("voltageLabel", () => {
  it.each([
    [{ voltageKv: 7.2, phases: 1, systemKv: 12.47 }, "12.47Y/7.2 kV"], // CREW-CHECK.md Corrections 8
    [{ voltageKv: 14.4, phases: 1, systemKv: 24.94 }, "24.94Y/14.4 kV"], // 24940Y/14400 V (from memory)
    [{ voltageKv: 2.4, phases: 1, systemKv: 4.16 }, "4.16Y/2.4 kV"], // 4160Y/2400 V (from memory)
    [{ voltageKv: 12.47, phases: 3, systemKv: null }, "12.47 kV"],
    [{ voltageKv: 12.47 }, "12.47 kV"], // phases default to 3 (CREW-CHECK.md: `phases` default 3)
    [{ voltageKv: 7.2, phases: 1, systemKv: null }, "7.2 kV single-phase"], // system not given: say what is known
    [{ voltageKv: 7.2, phases: 1, systemKv: 7.2 }, "7.2 kV single-phase"], // a system at or below the tap is not a wye system
    [{ voltageKv: null, phases: 1, systemKv: 12.47 }, null],
  ])("%o → %s", (facts, label) => {
    expect(voltageLabel(facts)).toBe(label);
  });

  it("drops the trailing zeros a DECIMAL(7,3) column returns", () => {
    expect(kvText(Number("7.200"))).toBe("7.2");
    expect(kvText(Number("12.470"))).toBe("12.47");
  });

  it("says what is live nearby on a de-energized order (CREW-CHECK.md, Corrections 2)", () => {
    expect(energyLabel({ energized: false, voltageKv: 12.47, nearEnergizedKv: 12.47 })).toBe("de-energized, 12.47 kV energized nearby");
    expect(energyLabel({ energized: false, voltageKv: null })).toBe("de-energized");
    expect(energyLabel({ energized: true, voltageKv: 7.2, phases: 1, systemKv: 12.47 })).toBe("energized 12.47Y/7.2 kV");
    expect(energyLabel({ energized: true, voltageKv: null })).toBe("energized, voltage unknown");
  });
});
