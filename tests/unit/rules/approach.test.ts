// Minimum approach distance: 29 CFR 1910.269 Table R-6 (AC live-line work, phase-to-ground
// exposure; metres and feet from the table's own columns) times Table R-5 (altitude correction
// factor). Every expected value below is written out from the tables, not computed by the code
// under test. Metres of Table R-6 as quoted from the eCFR text of 1910.269; the feet column
// from memory of the 2014 table (each within 0.01 ft of the metres converted); Table R-5 as
// reproduced from 1910.269 in UFC 3-560-01 Table 3-2.
import { describe, expect, it } from "vitest";
import { altitudeFactor, approachDistance, lookupVoltageKv } from "@/lib/rules/approach";

const SOURCE = "29 CFR 1910.269 Table R-6, Table R-5";
const at = (voltageKv: number | null, more: { altitudeM?: number; phases?: number; systemKv?: number | null; energized?: boolean } = {}) =>
  approachDistance({ energized: more.energized ?? true, voltageKv, phases: more.phases, systemKv: more.systemKv, altitudeM: more.altitudeM });
const dist = (meters: number, feet: number, altitudeFactor = 1) => ({ meters, feet, altitudeFactor, exposure: "phase_to_ground", source: SOURCE });

describe("Table R-6 rows (phase to phase, sea level)", () => {
  it.each([
    // [kV, expected, the row of Table R-6]
    [0.049, null, "below 0.050 kV: not in Table R-6"],
    [0.05, { avoidContact: true }, "0.050 to 0.300 kV: avoid contact"],
    [0.12, { avoidContact: true }, "0.050 to 0.300 kV: avoid contact"],
    [0.3, { avoidContact: true }, "0.050 to 0.300 kV: avoid contact"],
    [0.301, dist(0.33, 1.09), "0.301 to 0.750 kV: 0.33 m, 1.09 ft"],
    [0.48, dist(0.33, 1.09), "0.301 to 0.750 kV: 0.33 m, 1.09 ft"],
    [0.75, dist(0.33, 1.09), "0.301 to 0.750 kV: 0.33 m, 1.09 ft"],
    [0.751, dist(0.63, 2.07), "0.751 to 5.0 kV: 0.63 m, 2.07 ft"],
    [4.16, dist(0.63, 2.07), "0.751 to 5.0 kV: 0.63 m, 2.07 ft"],
    [5.0, dist(0.63, 2.07), "0.751 to 5.0 kV: 0.63 m, 2.07 ft"],
    [5.05, dist(0.65, 2.14), "between the rows: the next row up, 5.1 to 15.0 kV"],
    [5.1, dist(0.65, 2.14), "5.1 to 15.0 kV: 0.65 m, 2.14 ft"],
    [12.47, dist(0.65, 2.14), "5.1 to 15.0 kV: 0.65 m, 2.14 ft"],
    [15.0, dist(0.65, 2.14), "5.1 to 15.0 kV: 0.65 m, 2.14 ft"],
    [15.1, dist(0.77, 2.53), "15.1 to 36.0 kV: 0.77 m, 2.53 ft"],
    [24.94, dist(0.77, 2.53), "15.1 to 36.0 kV: 0.77 m, 2.53 ft"],
    [36.0, dist(0.77, 2.53), "15.1 to 36.0 kV: 0.77 m, 2.53 ft"],
    [36.1, dist(0.84, 2.76), "36.1 to 46.0 kV: 0.84 m, 2.76 ft"],
    [46.0, dist(0.84, 2.76), "36.1 to 46.0 kV: 0.84 m, 2.76 ft"],
    [46.1, dist(1.0, 3.29), "46.1 to 72.5 kV: 1.00 m, 3.29 ft"],
    [69, dist(1.0, 3.29), "46.1 to 72.5 kV: 1.00 m, 3.29 ft"],
    [72.5, dist(1.0, 3.29), "46.1 to 72.5 kV: 1.00 m, 3.29 ft"],
    [72.6, { engineering: true }, "above 72.5 kV: the employer's engineering analysis (Table R-3)"],
    [138, { engineering: true }, "above 72.5 kV: the employer's engineering analysis (Table R-3)"],
  ] as Array<[number, unknown, string]>)("%s kV -> %j (%s)", (kv, expected) => {
    expect(at(kv)).toEqual(expected);
  });

  it("no figure for de-energized work or an unknown voltage", () => {
    expect(at(12.47, { energized: false })).toBeNull();
    expect(at(null)).toBeNull();
  });
});

describe("Table R-5 altitude bands (each band's top and the first metre of the next)", () => {
  it.each([
    // [metres, factor] from Table R-5
    [-86, 1.0],
    [0, 1.0],
    [900, 1.0],
    [901, 1.02],
    [1200, 1.02],
    [1201, 1.05],
    [1500, 1.05],
    [1501, 1.08],
    [1800, 1.08],
    [1801, 1.11],
    [2100, 1.11],
    [2101, 1.14],
    [2400, 1.14],
    [2401, 1.17],
    [2700, 1.17],
    [2701, 1.2],
    [3000, 1.2],
    [3001, 1.25],
    [3600, 1.25],
    [3601, 1.3],
    [4200, 1.3],
    [4201, 1.35],
    [4800, 1.35],
    [4801, 1.39],
    [5400, 1.39],
    [5401, 1.44],
    [6000, 1.44],
  ])("%s m -> %s (Table R-5)", (m, f) => {
    expect(altitudeFactor(m)).toBe(f);
    expect(at(12.47, { altitudeM: m })).toMatchObject({ altitudeFactor: f });
  });

  it("Table R-5 ends at 6,000 m", () => {
    expect(altitudeFactor(6001)).toBeNull();
  });

  it.each([
    // The 5.1-15.0 kV row (0.65 m, 2.14 ft) times each factor, worked by hand, rounded half up to 0.01.
    [0, 1.0, 0.65, 2.14],
    [1000, 1.02, 0.66, 2.18], // 0.663, 2.1828
    [1400, 1.05, 0.68, 2.25], // 0.6825, 2.247
    [1650, 1.08, 0.7, 2.31], // 0.702, 2.3112 (CREW-CHECK.md's example site)
    [2000, 1.11, 0.72, 2.38], // 0.7215, 2.3754
    [2300, 1.14, 0.74, 2.44], // 0.741, 2.4396
    [2600, 1.17, 0.76, 2.5], // 0.7605, 2.5038
    [2900, 1.2, 0.78, 2.57], // 0.78, 2.568
    [3500, 1.25, 0.81, 2.68], // 0.8125, 2.675 (half up)
    [4000, 1.3, 0.85, 2.78], // 0.845 (half up), 2.782
    [4500, 1.35, 0.88, 2.89], // 0.8775, 2.889
    [5000, 1.39, 0.9, 2.97], // 0.9035, 2.9746
    [5800, 1.44, 0.94, 3.08], // 0.936, 3.0816
  ])("12.47 kV at %s m: factor %s -> %s m, %s ft (each column times the factor)", (m, f, meters, feet) => {
    expect(at(12.47, { altitudeM: m })).toEqual(dist(meters, feet, f));
  });

  it("the highest row at the highest factor: 46.1-72.5 kV at 6,000 m is 1.44 m, 4.74 ft (1.00 x 1.44, 3.29 x 1.44 = 4.7376)", () => {
    expect(at(69, { altitudeM: 6000 })).toEqual(dist(1.44, 4.74, 1.44));
  });

  it("avoid contact and engineering carry no altitude factor", () => {
    expect(at(0.24, { altitudeM: 2500 })).toEqual({ avoidContact: true });
    expect(at(115, { altitudeM: 2500 })).toEqual({ engineering: true });
  });
});

describe("single-phase lines (phases: 1, voltageKv to ground)", () => {
  it("up to 0.750 kV Table R-6's footnote applies: the voltage to ground picks the row", () => {
    expect(at(0.12, { phases: 1 })).toEqual({ avoidContact: true });
    expect(at(0.277, { phases: 1 })).toEqual({ avoidContact: true });
    expect(at(0.48, { phases: 1 })).toEqual(dist(0.33, 1.09));
    expect(at(0.75, { phases: 1 })).toEqual(dist(0.33, 1.09));
  });

  it("above 0.750 kV the system's phase-to-phase voltage: voltageKv x sqrt(3) when systemKv is not given", () => {
    expect(lookupVoltageKv({ voltageKv: 7.2, phases: 1 })).toBeCloseTo(12.47, 2);
    expect(at(7.2, { phases: 1 })).toEqual(dist(0.65, 2.14)); // 12.47Y/7.2 kV tap -> 5.1-15.0 row
    expect(at(2.4, { phases: 1 })).toEqual(dist(0.63, 2.07)); // 4.16Y/2.4 kV -> 0.751-5.0 row
    expect(at(19.92, { phases: 1 })).toEqual(dist(0.77, 2.53)); // 34.5Y/19.92 kV -> 15.1-36.0 row
  });

  it("a 14.4 kV tap of a 24.9 kV system gets the 15.1-36.0 kV row (CREW-CHECK.md), with or without systemKv", () => {
    expect(at(14.4, { phases: 1, systemKv: 24.9 })).toEqual(dist(0.77, 2.53));
    expect(at(14.4, { phases: 1 })).toEqual(dist(0.77, 2.53));
    // systemKv wins over the sqrt(3) estimate: a 7.62 kV tap of a 13.2 kV system stays in 5.1-15.0.
    expect(at(7.62, { phases: 1, systemKv: 13.2 })).toEqual(dist(0.65, 2.14));
  });

  it("a multiphase order ignores systemKv: voltageKv is already phase to phase", () => {
    expect(at(12.47, { phases: 3, systemKv: 34.5 })).toEqual(dist(0.65, 2.14));
  });
});
