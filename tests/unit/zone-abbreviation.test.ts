import { describe, expect, it } from "vitest";
import { fmtSpan, zoneAbbreviation } from "@/lib/time/zoned-format";

// Source: the IANA tz database rules for America/Chicago and America/Denver (US rules since
// 2007: summer time from the second Sunday of March to the first Sunday of November), as
// shipped in Node's ICU data.
describe("zoneAbbreviation: the yard's zone name at an instant", () => {
  it("names standard and summer time by the tz rules", () => {
    expect(zoneAbbreviation("2026-12-04T13:00:00Z", "America/Chicago")).toBe("CST");
    expect(zoneAbbreviation("2026-07-04T13:00:00Z", "America/Chicago")).toBe("CDT");
    expect(zoneAbbreviation("2026-12-04T13:00:00Z", "America/Denver")).toBe("MST");
    expect(zoneAbbreviation("2026-07-04T13:00:00Z", "America/Denver")).toBe("MDT");
  });

  it("changes at the 2026 transition instants (Mar 8 08:00Z, Nov 1 07:00Z for Chicago)", () => {
    expect(zoneAbbreviation("2026-03-08T07:59:59Z", "America/Chicago")).toBe("CST");
    expect(zoneAbbreviation("2026-03-08T08:00:00Z", "America/Chicago")).toBe("CDT");
    expect(zoneAbbreviation("2026-11-01T06:59:59Z", "America/Chicago")).toBe("CDT");
    expect(zoneAbbreviation("2026-11-01T07:00:00Z", "America/Chicago")).toBe("CST");
  });

  it("fmtSpan puts the order's times on the yard's clock with the zone's name", () => {
    expect(fmtSpan("2026-12-04T13:00:00Z", "2026-12-04T21:30:00Z", "America/Chicago")).toBe("Fri, Dec 4 · 07:00–15:30 CST");
    // an overnight order names the end's day
    expect(fmtSpan("2026-12-04T04:00:00Z", "2026-12-04T14:00:00Z", "America/Chicago")).toBe("Thu, Dec 3 · 22:00–Fri, Dec 4 08:00 CST");
  });
});
