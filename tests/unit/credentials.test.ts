import { describe, expect, it } from "vitest";
import { formatIssue, inView, isRealDate, proposeExpiry } from "@/lib/credentials/model";
import { parseCredentialCsv, planImport, type ImportLookups } from "@/lib/credentials/csv";

describe("proposeExpiry: issued + N months − 1 day (the last valid day; policy, as the demo seed writes it)", () => {
  it.each([
    ["2026-03-15", 12, "2027-03-14"],
    ["2026-01-01", 12, "2026-12-31"],
    ["2026-01-31", 1, "2026-02-27"], // Feb 2026 has 28 days: Jan 31 + 1 month clamps to Feb 28, minus a day
    ["2024-02-29", 12, "2025-02-27"], // leap day + 12 months clamps to Feb 28 2025 (Gregorian calendar)
    ["2026-12-01", 24, "2028-11-30"],
    ["2026-06-30", 36, "2029-06-29"],
  ])("%s + %i months → %s", (issued, months, expected) => {
    expect(proposeExpiry(issued, months)).toBe(expected);
  });
  it("no renewal period: no expiry", () => expect(proposeExpiry("2026-01-01", null)).toBeNull());
  it("a renewal issued the day after the last valid day follows without a gap", () => {
    const first = proposeExpiry("2026-03-15", 12)!;
    expect(first).toBe("2027-03-14");
    expect(proposeExpiry("2027-03-15", 12)).toBe("2028-03-14");
  });
});

describe("isRealDate (ISO 8601 calendar dates, YYYY-MM-DD)", () => {
  it.each(["2026-02-28", "2024-02-29", "2026-12-31"])("%s is a date", (d) => expect(isRealDate(d)).toBe(true));
  it.each(["2026-02-29", "2026-13-01", "2026-1-1", "01/02/2026", "2026-04-31", ""])("%j is not", (d) => expect(isRealDate(d)).toBe(false));
});

describe("quick views (common practice: lapsed, lapsing in 30/60/90 days)", () => {
  it.each([
    [-1, "lapsed", true],
    [0, "lapsed", false],
    [0, "30", true],
    [30, "30", true],
    [31, "30", false],
    [31, "60", true],
    [90, "90", true],
    [-5, "90", false],
  ] as const)("%i days left in view %s: %s", (daysLeft, view, expected) => {
    expect(inView({ status: "current", daysLeft }, view)).toBe(expected);
  });
  it("pending rows are only in the pending view (and all)", () => {
    expect(inView({ status: "pending", daysLeft: 10 }, "30")).toBe(false);
    expect(inView({ status: "pending", daysLeft: null }, "pending")).toBe(true);
    expect(inView({ status: "pending", daysLeft: null }, "all")).toBe(true);
  });
});

describe("parseCredentialCsv (papaparse; RFC 4180 quoting)", () => {
  it("numbers lines as the file does: header 1, blank lines and quoted newlines counted", () => {
    const csv = 'employee_no,qualification,issued_on,expires_on\r\nCP-1,climbing,2026-01-01,\r\n\r\n"CP-2\nX",cdl_a,2026-02-01,\r\nCP-3,cdl_b,2026-03-01,2030-02-28\r\n';
    const r = parseCredentialCsv(csv);
    expect(r.issues).toEqual([]);
    expect(r.rows.map((x) => x.line)).toEqual([2, 4, 6]);
    expect(r.rows[2]).toMatchObject({ employee_no: "CP-3", expires_on: "2030-02-28" });
  });
  it("a byte-order mark, other header spellings and extra columns", () => {
    const r = parseCredentialCsv("\uFEFFEmployee Number,Qualification Code,Issued,Notes\nCP-1,climbing,2026-01-01,x\n");
    expect(r.issues).toEqual([]);
    expect(r.ignoredColumns).toEqual(["Notes"]);
    expect(r.rows[0]).toMatchObject({ line: 2, employee_no: "CP-1", qualification: "climbing", issued_on: "2026-01-01" });
  });
  it("a missing column is named on line 1", () => {
    const r = parseCredentialCsv("employee_no,issued_on\nCP-1,2026-01-01\n");
    expect(r.issues.map(formatIssue)).toEqual(["line 1, qualification: missing column in the header row"]);
  });
});

describe("planImport", () => {
  const lk: ImportLookups = {
    workers: new Map([
      ["cp-1", { id: 1, timezone: "America/Chicago" }],
      ["cp-2", { id: 2, timezone: "America/Denver" }],
    ]),
    types: new Map([
      ["climbing", { id: 10, code: "climbing", name: "Climbing evaluation", renewalMonths: 12 }],
      ["cdl_a", { id: 11, code: "cdl_a", name: "CDL class A", renewalMonths: 48 }],
    ]),
    current: new Map([["1:10", { id: 500, issuedOn: "2025-06-01", expiresOn: "2026-05-31" }]]),
    today: () => "2026-12-01",
  };
  const rows = (text: string) => parseCredentialCsv("employee_no,qualification,issued_on,expires_on\n" + text).rows;

  it("every problem is named with its line and field", () => {
    const { issues, plan } = planImport(
      rows("CP-1,climbing,2026-01-01,\nCP-9,climbing,2026-01-01,\nCP-2,welding,2026-01-01,\nCP-2,cdl_a,2026-02-30,\nCP-2,cdl_a,2026-01-01,2025-01-01\nCP-2,cdl_a,2027-01-01,\nCP-1,cdl_a,2026-01-01,soon\n"),
      lk,
    );
    expect(plan).toEqual([]);
    expect(issues.map(formatIssue)).toEqual([
      "line 3, employee_no: no worker with employee number CP-9",
      'line 4, qualification: unknown qualification code "welding" (known: climbing, cdl_a)',
      "line 5, issued_on: not a date (YYYY-MM-DD)",
      "line 6, expires_on: before issued_on",
      "line 7, issued_on: after today (2026-12-01)",
      "line 8, expires_on: not a date (YYYY-MM-DD)",
    ]);
  });

  it("a good file: expiry proposed when empty; a newer row renews the current record", () => {
    const { issues, plan } = planImport(rows("CP-1,climbing,2026-07-01,\nCP-2,cdl_a,2026-01-10,2030-01-09\n"), lk);
    expect(issues).toEqual([]);
    expect(plan[0]).toMatchObject({ workerId: 1, typeId: 10, expiresOn: "2027-06-30", isLatest: true, supersedes: { currentId: 500 } });
    expect(plan[1]).toMatchObject({ workerId: 2, typeId: 11, expiresOn: "2030-01-09", isLatest: true, supersedes: null });
  });

  it("several years of one qualification chain oldest to newest", () => {
    const { plan } = planImport(rows("CP-2,cdl_a,2024-01-10,\nCP-2,cdl_a,2016-01-10,\nCP-2,cdl_a,2020-01-10,\n"), lk);
    const byLine = new Map(plan.map((p) => [p.line, p]));
    expect(byLine.get(3)).toMatchObject({ isLatest: false, supersedes: null });
    expect(byLine.get(4)).toMatchObject({ isLatest: false, supersedes: { line: 3 } });
    expect(byLine.get(2)).toMatchObject({ isLatest: true, supersedes: { line: 4 } });
  });

  it("rows older than the current record (and not on record), and duplicates, are refused", () => {
    const { issues } = planImport(rows("CP-1,climbing,2025-01-01,\nCP-2,cdl_a,2026-01-10,\nCP-2,cdl_a,2026-01-10,\n"), lk);
    expect(issues.map(formatIssue)).toEqual([
      "line 2, issued_on: not after the worker's current record (issued 2025-06-01); older history is not imported",
      "line 4, issued_on: same worker, qualification and issue date as line 3",
    ]);
  });
});
