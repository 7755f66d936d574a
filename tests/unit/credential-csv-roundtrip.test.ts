import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { proposeExpiry } from "@/lib/credentials/model";
import { credentialExportCsv, parseCredentialCsv, planImport, type ExportRow, type ImportLookups } from "@/lib/credentials/csv";

// The credentials CSV round trip (issue 18 point 2): the desk's export imports back as a no-op,
// and an export with a few rows edited changes exactly those rows. The export is CSV as
// RFC 4180 writes it (quoted cells, CRLF), produced and read here by papaparse, the same
// library the app uses; renewal arithmetic as lib/credentials/model.ts proposes it
// (issued + N months − 1 day, policy).

const TYPES = [
  { id: 10, code: "climbing", name: "Climbing evaluation", renewalMonths: 12 },
  { id: 11, code: "first_aid_cpr", name: "First aid / CPR", renewalMonths: 24 },
  { id: 12, code: "cdl_a", name: "CDL class A", renewalMonths: null },
];

interface Stored {
  id: number;
  workerId: number;
  typeId: number;
  issuedOn: string;
  expiresOn: string | null;
  status: "current" | "pending" | "superseded";
}

// 30 workers × 3 qualifications, a few with a pending renewal and some history, dates varied.
function store(): Stored[] {
  const out: Stored[] = [];
  let id = 1;
  for (let w = 1; w <= 30; w++) {
    for (const t of TYPES) {
      const issued = `202${4 + ((w + t.id) % 2)}-${String(((w * 7 + t.id) % 12) + 1).padStart(2, "0")}-${String(((w * 3) % 27) + 1).padStart(2, "0")}`;
      out.push({ id: id++, workerId: w, typeId: t.id, issuedOn: "2019-01-05", expiresOn: "2020-01-04", status: "superseded" });
      // Every fifth worker's expiry was set by hand, not the proposed one.
      const expires = w % 5 === 0 ? "2031-07-31" : proposeExpiry(issued, t.renewalMonths);
      out.push({ id: id++, workerId: w, typeId: t.id, issuedOn: issued, expiresOn: expires, status: "current" });
      if (w % 7 === 0 && t.code === "climbing") out.push({ id: id++, workerId: w, typeId: t.id, issuedOn: "2026-11-02", expiresOn: "2027-11-01", status: "pending" });
    }
  }
  return out;
}

const no = (w: number) => `CP-${2000 + w}`;

function exportOf(rows: Stored[]): string {
  const shown: ExportRow[] = rows
    .filter((r) => r.status !== "superseded") // the desk lists current and pending (lib/credentials/data.ts)
    .map((r) => {
      const t = TYPES.find((x) => x.id === r.typeId)!;
      return {
        employeeNo: no(r.workerId),
        type: t.code,
        issuedOn: r.issuedOn,
        expiresOn: r.expiresOn,
        workerName: r.workerId === 3 ? "=HYPERLINK(\"x\")" : `Worker, "W${r.workerId}"`,
        yardCode: "NOR",
        typeName: t.name,
        status: r.status,
        daysLeft: 12,
        evidenceName: r.workerId % 4 === 0 ? "card, scanned\nback side.pdf" : null,
        verifiedByName: "Nadine Okonkwo",
        verifiedAt: "2026-11-30T15:00:00.000Z",
      };
    });
  return credentialExportCsv(shown);
}

function lookupsOf(rows: Stored[]): ImportLookups {
  const others = new Map<string, { issuedOn: string; expiresOn: string | null; status: string }[]>();
  for (const r of rows.filter((x) => x.status !== "current")) {
    const k = `${r.workerId}:${r.typeId}`;
    others.set(k, [...(others.get(k) ?? []), { issuedOn: r.issuedOn, expiresOn: r.expiresOn, status: r.status }]);
  }
  return {
    workers: new Map(Array.from({ length: 30 }, (_, i) => [no(i + 1).toLowerCase(), { id: i + 1, timezone: "America/Chicago" }])),
    types: new Map(TYPES.map((t) => [t.code, t])),
    current: new Map(
      rows.filter((r) => r.status === "current").map((r) => [`${r.workerId}:${r.typeId}`, { id: r.id, issuedOn: r.issuedOn, expiresOn: r.expiresOn }]),
    ),
    others,
    today: () => "2026-12-03",
  };
}

/** Edits cells of an export as a spreadsheet would: parse, change, write back (RFC 4180 via papaparse). */
function edit(csv: string, change: (row: string[], i: number) => void): string {
  const parsed = Papa.parse<string[]>(csv.replace(/^\uFEFF/, ""), { skipEmptyLines: true });
  const [head, ...body] = parsed.data;
  body.forEach((r, i) => change(r, i));
  return Papa.unparse([head, ...body], { newline: "\r\n" });
}

describe("credentials CSV round trip", () => {
  const rows = store();
  const lk = lookupsOf(rows);
  const csv = exportOf(rows);

  it("the export has a row per current or pending record (multi-line and quoted cells included)", () => {
    const parsed = parseCredentialCsv(csv);
    expect(parsed.issues).toEqual([]);
    expect(parsed.rows).toHaveLength(rows.filter((r) => r.status !== "superseded").length);
  });

  it("re-importing the unchanged export is a no-op: no issue, nothing planned, every row unchanged", () => {
    const parsed = parseCredentialCsv(csv);
    const { issues, plan, unchanged } = planImport(parsed.rows, lk);
    expect(issues).toEqual([]);
    expect(plan).toEqual([]);
    expect(unchanged).toHaveLength(parsed.rows.length);
  });

  it("only the import's four columns count: editing a name or the status column changes nothing", () => {
    const text = edit(csv, (r, i) => {
      if (i < 5) {
        r[4] = "Renamed";
        r[7] = "lapsed";
      }
    });
    const { issues, plan } = planImport(parseCredentialCsv(text).rows, lk);
    expect(issues).toEqual([]);
    expect(plan).toEqual([]);
  });

  it("export → edit three rows → import changes exactly those three", () => {
    const parsed = parseCredentialCsv(csv);
    const target = (i: number) => parsed.rows[i];
    // Row 0: a renewal (newer issue date, expiry left empty: proposed from 12 months).
    // Row 4: a corrected expiry on the same issue date. Row 10: a renewal with a given expiry.
    const text = edit(csv, (r, i) => {
      if (i === 0) {
        r[2] = "2026-11-20";
        r[3] = "";
      }
      if (i === 4) r[3] = "2030-02-28";
      if (i === 10) {
        r[2] = "2026-10-01";
        r[3] = "2028-09-30";
      }
    });
    const edited = parseCredentialCsv(text);
    const { issues, plan, unchanged } = planImport(edited.rows, lk);
    expect(issues).toEqual([]);
    expect(unchanged).toHaveLength(edited.rows.length - 3);
    expect(plan.map((p) => p.line).sort((a, b) => a - b)).toEqual([target(0).line, target(4).line, target(10).line]);
    const byLine = new Map(plan.map((p) => [p.line, p]));
    const cur = (i: number) => {
      const r = parsed.rows[i];
      const w = Number(r.employee_no.slice(3)) - 2000;
      const t = TYPES.find((x) => x.code === r.qualification)!;
      return lk.current.get(`${w}:${t.id}`)!;
    };
    const first = byLine.get(target(0).line)!;
    const t0 = TYPES.find((x) => x.code === target(0).qualification)!;
    expect(first).toMatchObject({ issuedOn: "2026-11-20", expiresOn: proposeExpiry("2026-11-20", t0.renewalMonths), isLatest: true, supersedes: { currentId: cur(0).id } });
    expect(byLine.get(target(4).line)).toMatchObject({ issuedOn: target(4).issued_on, expiresOn: "2030-02-28", correction: true, supersedes: { currentId: cur(4).id } });
    expect(byLine.get(target(10).line)).toMatchObject({ issuedOn: "2026-10-01", expiresOn: "2028-09-30", supersedes: { currentId: cur(10).id } });
  });

  it("an edited expiry on a row awaiting verification is refused, naming its line, not silently applied", () => {
    const parsed = parseCredentialCsv(csv);
    const pendingIdx = parsed.rows.findIndex((r) => r.issued_on === "2026-11-02");
    expect(pendingIdx).toBeGreaterThanOrEqual(0);
    const text = edit(csv, (r, i) => {
      if (i === pendingIdx) r[3] = "2027-12-31";
    });
    const { issues, plan } = planImport(parseCredentialCsv(text).rows, lk);
    expect(plan).toEqual([]);
    expect(issues).toHaveLength(1);
    expect(issues[0]).toMatchObject({ line: parsed.rows[pendingIdx].line, field: "expires_on" });
    expect(issues[0].message).toContain("awaits verification");
  });
});
