import { unguardCell } from "@/lib/csv";
import Papa from "papaparse";
import {
  GEAR_CSV_ALIASES,
  GEAR_CSV_COLUMNS,
  GEAR_CSV_MAX_ROWS,
  GEAR_CSV_REQUIRED,
  gearCsvRowSchema,
  type GearClass,
  type GearCsvColumn,
  type GearKind,
} from "./model";

// The rubber goods CSV: parsing with the file's own line numbers, and the plan of an import
// (which rows create, which update, which are unchanged), from lookups handed in. Pure, so the
// route and the unit tests share it. An import never deletes: a row missing from the file
// keeps its record; retire an item with its retired_on cell.

export interface GearIssue {
  line: number;
  field: string;
  message: string;
}

export type RawGearRow = { line: number } & Partial<Record<GearCsvColumn, string>>;

const norm = (h: string) => h.replace(/^\uFEFF/, "").trim().toLowerCase().replace(/[\s-]+/g, "_");

/**
 * A cell our own export wrote with a formula guard (papaparse's escapeFormulae prefixes "'" to
 * a cell starting with = + - @ tab or CR) reads back as what it was.
 */
export function unguard(cell: string): string {
  return unguardCell(cell);
}

export function parseGearCsv(text: string): { rows: RawGearRow[]; issues: GearIssue[]; ignoredColumns: string[] } {
  const issues: GearIssue[] = [];
  const rows: RawGearRow[] = [];
  const ignoredColumns: string[] = [];
  const src = text.replace(/^\uFEFF/, "");
  let header: (GearCsvColumn | null)[] | null = null;
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
          const key = GEAR_CSV_ALIASES[norm(h)] ?? null;
          if (!key && h.trim()) ignoredColumns.push(h.trim());
          return key;
        });
        for (const col of GEAR_CSV_REQUIRED) {
          if (!header.includes(col)) issues.push({ line: startLine, field: col, message: "missing column in the header row" });
        }
        return;
      }
      if (rows.length >= GEAR_CSV_MAX_ROWS) {
        tooMany = true;
        parser.abort();
        return;
      }
      const rec: RawGearRow = { line: startLine };
      header.forEach((key, i) => {
        if (key && rec[key] === undefined) rec[key] = unguard((cells[i] ?? "").trim());
      });
      rows.push(rec);
    },
  });
  if (!header) issues.push({ line: 1, field: "(file)", message: `no header row; the first row names the columns (${GEAR_CSV_COLUMNS.join(", ")})` });
  else if (!rows.length && !issues.length) issues.push({ line: 2, field: "(file)", message: "no rows under the header" });
  if (tooMany) issues.push({ line: 1, field: "(file)", message: `more than ${GEAR_CSV_MAX_ROWS} rows; split the file` });
  return { rows, issues, ignoredColumns };
}

export interface GearRecordValues {
  workerId: number;
  kind: GearKind;
  class: GearClass;
  size: string | null;
  testedOn: string;
  issuedOn: string | null;
  retiredOn: string | null;
}

export interface GearLookups {
  /** employee_no (lower case) → worker id and the yard's today */
  workers: Map<string, { id: number; today: string }>;
  /** serial (lower case) → the existing record */
  existing: Map<string, GearRecordValues & { id: number; serial: string }>;
}

export type GearPlanRow =
  | ({ line: number; action: "create"; serial: string } & GearRecordValues)
  | ({ line: number; action: "update"; id: number; serial: string; changed: string[] } & GearRecordValues)
  | { line: number; action: "unchanged"; id: number; serial: string };

const FIELDS: (keyof GearRecordValues)[] = ["workerId", "kind", "class", "size", "testedOn", "issuedOn", "retiredOn"];

/** Checks every row; returns every issue (line + field) and, when there are none, the plan. */
export function planGearImport(rows: RawGearRow[], lk: GearLookups): { issues: GearIssue[]; plan: GearPlanRow[] } {
  const issues: GearIssue[] = [];
  const plan: GearPlanRow[] = [];
  const seen = new Map<string, number>();
  for (const row of rows) {
    const parsed = gearCsvRowSchema.safeParse(row);
    if (!parsed.success) {
      for (const i of parsed.error.issues) issues.push({ line: row.line, field: String(i.path[0] ?? "(row)"), message: i.message });
      continue;
    }
    const r = parsed.data;
    const key = r.serial.toLowerCase();
    const first = seen.get(key);
    if (first !== undefined) {
      issues.push({ line: row.line, field: "serial", message: `the same serial as line ${first}` });
      continue;
    }
    seen.set(key, row.line);
    const worker = lk.workers.get(r.employee_no.toLowerCase());
    if (!worker) {
      issues.push({ line: row.line, field: "employee_no", message: `no worker with employee number ${r.employee_no}` });
      continue;
    }
    let bad = false;
    if (r.tested_on > worker.today) {
      issues.push({ line: row.line, field: "tested_on", message: `after today (${worker.today})` });
      bad = true;
    }
    if (r.issued_on && r.retired_on && r.retired_on < r.issued_on) {
      issues.push({ line: row.line, field: "retired_on", message: "before issued_on" });
      bad = true;
    }
    if (bad) continue;
    const values: GearRecordValues = {
      workerId: worker.id,
      kind: r.kind,
      class: r.class,
      size: r.size,
      testedOn: r.tested_on,
      issuedOn: r.issued_on,
      retiredOn: r.retired_on,
    };
    const cur = lk.existing.get(key);
    if (!cur) {
      plan.push({ line: row.line, action: "create", serial: r.serial, ...values });
      continue;
    }
    const changed = FIELDS.filter((f) => (values[f] ?? null) !== (cur[f] ?? null));
    if (!changed.length) plan.push({ line: row.line, action: "unchanged", id: cur.id, serial: cur.serial });
    else plan.push({ line: row.line, action: "update", id: cur.id, serial: cur.serial, changed, ...values });
  }
  issues.sort((a, b) => a.line - b.line || a.field.localeCompare(b.field));
  return { issues, plan: issues.length ? [] : plan };
}
