import Papa from "papaparse";
import { CSV_FORMULA } from "@/lib/csv";
import {
  IMPORT_ALIASES,
  IMPORT_COLUMNS,
  IMPORT_MAX_ROWS,
  IMPORT_REQUIRED,
  importRowSchema,
  proposeExpiry,
  type ImportIssue,
} from "./model";

// The credentials CSV: parsing (papaparse) with true line numbers, and the row checks that
// need only lookups handed in. Pure, so the import page (preview) and the route share it.

export interface ImportRow {
  line: number;
  employee_no: string;
  qualification: string;
  issued_on: string;
  expires_on?: string;
}

export interface ParsedCsv {
  rows: ImportRow[];
  issues: ImportIssue[];
  ignoredColumns: string[];
}

/** The export's columns: the import's four first, so an edited export imports again. */
export const EXPORT_COLUMNS = [
  ...IMPORT_COLUMNS,
  "worker",
  "yard",
  "qualification_name",
  "status",
  "days_left",
  "evidence",
  "verified_by",
  "verified_at",
] as const;

export interface ExportRow {
  employeeNo: string;
  type: string;
  issuedOn: string;
  expiresOn: string | null;
  workerName: string;
  yardCode: string;
  typeName: string;
  status: string;
  daysLeft: number | null;
  evidenceName: string | null;
  verifiedByName: string | null;
  verifiedAt: string | null;
}

/** The desk's table as CSV text (BOM, CRLF), shared by the export route and the round-trip tests. */
export function credentialExportCsv(rows: ExportRow[]): string {
  const csv = Papa.unparse(
    {
      fields: [...EXPORT_COLUMNS],
      data: rows.map((r) => [
        r.employeeNo,
        r.type,
        r.issuedOn,
        r.expiresOn ?? "",
        r.workerName,
        r.yardCode,
        r.typeName,
        r.status,
        r.daysLeft ?? "",
        r.evidenceName ?? "",
        r.verifiedByName ?? "",
        r.verifiedAt ?? "",
      ]),
    },
    // Cells a spreadsheet would run (= + - @ after any leading whitespace or line break) are
    // prefixed with "'" (CSV injection; lib/csv.ts).
    { escapeFormulae: CSV_FORMULA, newline: "\r\n" },
  );
  return "\uFEFF" + csv + "\r\n";
}

const norm = (h: string) => h.replace(/^\uFEFF/, "").trim().toLowerCase().replace(/[\s-]+/g, "_");

/** Parses the file's text. Line numbers are the file's own (header = line 1), multi-line cells included. */
export function parseCredentialCsv(text: string): ParsedCsv {
  const issues: ImportIssue[] = [];
  const rows: ImportRow[] = [];
  const ignoredColumns: string[] = [];
  const src = text.replace(/^\uFEFF/, "");
  let header: (string | null)[] | null = null;
  let pos = 0;
  let line = 1;
  let tooMany = false;
  Papa.parse<string[]>(src, {
    header: false,
    skipEmptyLines: false,
    step: (res, parser) => {
      const startLine = line;
      const end = res.meta.cursor;
      for (let i = pos; i < end; i++) if (src.charCodeAt(i) === 10) line++;
      // The newline that ends this row belongs to it.
      if (src.charCodeAt(end) === 10) {
        line++;
        pos = end + 1;
      } else if (src.charCodeAt(end) === 13 && src.charCodeAt(end + 1) === 10) {
        line++;
        pos = end + 2;
      } else pos = end;
      const cells = res.data;
      if (!cells.length || cells.every((c) => (c ?? "").trim() === "")) return;
      if (!header) {
        header = cells.map((h) => {
          const key = IMPORT_ALIASES[norm(h)] ?? null;
          if (!key && h.trim()) ignoredColumns.push(h.trim());
          return key;
        });
        for (const col of IMPORT_REQUIRED) {
          if (!header.includes(col)) issues.push({ line: startLine, field: col, message: "missing column in the header row" });
        }
        return;
      }
      if (rows.length >= IMPORT_MAX_ROWS) {
        tooMany = true;
        parser.abort();
        return;
      }
      const rec: Record<string, string> = {};
      header.forEach((key, i) => {
        if (key && rec[key] === undefined) rec[key] = (cells[i] ?? "").trim();
      });
      rows.push({
        line: startLine,
        employee_no: rec.employee_no ?? "",
        qualification: rec.qualification ?? "",
        issued_on: rec.issued_on ?? "",
        expires_on: rec.expires_on || undefined,
      });
    },
  });
  if (!header) issues.push({ line: 1, field: "(file)", message: `no header row; the first row names the columns (${IMPORT_COLUMNS.join(", ")})` });
  else if (!rows.length && !issues.length) issues.push({ line: 2, field: "(file)", message: "no rows under the header" });
  if (tooMany) issues.push({ line: 1, field: "(file)", message: `more than ${IMPORT_MAX_ROWS} rows; split the file` });
  return { rows, issues, ignoredColumns };
}

export interface ImportLookups {
  /** employee_no (lower case) → worker */
  workers: Map<string, { id: number; timezone: string }>;
  /** code (lower case) → type */
  types: Map<string, { id: number; code: string; name: string; renewalMonths: number | null }>;
  /** `${workerId}:${typeId}` → the current record (expiresOn: null = no expiry; absent = not looked up) */
  current: Map<string, { id: number; issuedOn: string; expiresOn?: string | null }>;
  /**
   * `${workerId}:${typeId}` → the worker's other records of that qualification (pending,
   * superseded, rejected), so that a row the export wrote from them reads as unchanged.
   */
  others?: Map<string, { issuedOn: string; expiresOn: string | null; status: string }[]>;
  today: (timezone: string) => string;
}

export interface PlannedRow {
  line: number;
  workerId: number;
  typeId: number;
  issuedOn: string;
  expiresOn: string | null;
  /** The newest of its worker and qualification in the file: becomes current. */
  isLatest: boolean;
  /** The record it replaces: the existing current one for the first of a chain, else the previous file row. */
  supersedes: { currentId: number } | { line: number } | null;
  /** Same issue date as the current record, another expiry: a correction that replaces it. */
  correction?: boolean;
}

/** Checks every row against the lookups; returns all issues (line + field) and, when none, the plan. */
export function planImport(rows: ImportRow[], lk: ImportLookups): { issues: ImportIssue[]; plan: PlannedRow[]; unchanged: number[] } {
  const issues: ImportIssue[] = [];
  const ok: PlannedRow[] = [];
  /** Lines that say what is already stored: no-ops, so an export imports back unchanged. */
  const unchanged: number[] = [];
  for (const row of rows) {
    const parsed = importRowSchema.safeParse(row);
    if (!parsed.success) {
      for (const i of parsed.error.issues) issues.push({ line: row.line, field: String(i.path[0] ?? "(row)"), message: i.message });
      continue;
    }
    const r = parsed.data;
    let bad = false;
    const worker = lk.workers.get(r.employee_no.toLowerCase());
    if (!worker) {
      issues.push({ line: row.line, field: "employee_no", message: `no worker with employee number ${r.employee_no}` });
      bad = true;
    }
    const type = lk.types.get(r.qualification.toLowerCase());
    if (!type) {
      const known = [...lk.types.values()].map((t) => t.code).join(", ");
      issues.push({ line: row.line, field: "qualification", message: `unknown qualification code "${r.qualification}" (known: ${known})` });
      bad = true;
    }
    if (worker) {
      const today = lk.today(worker.timezone);
      if (r.issued_on > today) {
        issues.push({ line: row.line, field: "issued_on", message: `after today (${today})` });
        bad = true;
      }
    }
    if (r.expires_on && r.expires_on < r.issued_on) {
      issues.push({ line: row.line, field: "expires_on", message: "before issued_on" });
      bad = true;
    }
    if (bad || !worker || !type) continue;
    const expiresOn = r.expires_on ?? proposeExpiry(r.issued_on, type.renewalMonths);
    const key = `${worker.id}:${type.id}`;
    const cur = lk.current.get(key);
    // An empty expiry matches a record without one, or the expiry the import would propose.
    const sameExpiry = (stored: string | null) => (r.expires_on ? r.expires_on === stored : stored === null || stored === expiresOn);
    let correction = false;
    if (cur && cur.issuedOn === r.issued_on) {
      if (cur.expiresOn === undefined || sameExpiry(cur.expiresOn)) {
        unchanged.push(row.line);
        continue;
      }
      correction = true;
    } else {
      const other = lk.others?.get(key)?.find((o) => o.issuedOn === r.issued_on);
      if (other) {
        if (sameExpiry(other.expiresOn)) {
          unchanged.push(row.line);
          continue;
        }
        issues.push({
          line: row.line,
          field: "expires_on",
          message:
            other.status === "pending"
              ? `differs from the record issued ${r.issued_on} that awaits verification; verify or reject it on the desk first`
              : `differs from the older record issued ${r.issued_on}; older history is not changed by an import`,
        });
        continue;
      }
    }
    ok.push({
      line: row.line,
      workerId: worker.id,
      typeId: type.id,
      issuedOn: r.issued_on,
      expiresOn,
      isLatest: false,
      supersedes: null,
      ...(correction ? { correction: true } : {}),
    });
  }
  // Chains per worker and qualification, oldest first.
  const groups = new Map<string, PlannedRow[]>();
  for (const p of ok) {
    const k = `${p.workerId}:${p.typeId}`;
    const g = groups.get(k);
    if (g) g.push(p);
    else groups.set(k, [p]);
  }
  for (const [key, g] of groups) {
    g.sort((a, b) => (a.issuedOn < b.issuedOn ? -1 : a.issuedOn > b.issuedOn ? 1 : a.line - b.line));
    const cur = lk.current.get(key);
    for (let i = 0; i < g.length; i++) {
      const p = g[i];
      if (i > 0 && g[i - 1].issuedOn === p.issuedOn) {
        const first = Math.min(p.line, g[i - 1].line);
        const later = Math.max(p.line, g[i - 1].line);
        issues.push({ line: later, field: "issued_on", message: `same worker, qualification and issue date as line ${first}` });
      }
      if (cur && (p.issuedOn < cur.issuedOn || (p.issuedOn === cur.issuedOn && !p.correction))) {
        issues.push({
          line: p.line,
          field: "issued_on",
          message: `not after the worker's current record (issued ${cur.issuedOn}); older history is not imported`,
        });
      }
      p.supersedes = i === 0 ? (cur ? { currentId: cur.id } : null) : { line: g[i - 1].line };
      p.isLatest = i === g.length - 1;
    }
  }
  issues.sort((a, b) => a.line - b.line || a.field.localeCompare(b.field));
  return { issues, plan: issues.length ? [] : ok, unchanged };
}
