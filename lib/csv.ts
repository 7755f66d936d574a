// CSV injection guard shared by every CSV export (issue 15, finding 12). A spreadsheet reads a
// cell as a formula when its first character that is not whitespace or a line break is
// = + - @ (OWASP "CSV Injection"); papaparse's own guard only looks at the very first
// character, so "\n=HYPERLINK(…)" or "  =1+1" went through. Export with
// `{ escapeFormulae: CSV_FORMULA }`: such cells are written with a leading "'". Import reads
// them back with unguardCell().

/** A cell a spreadsheet would run: formula characters after any leading whitespace or control characters, or a leading tab / CR / LF. */
export const CSV_FORMULA = /^[\s\u0000-\u001f\u00a0\u2000-\u200b\u3000\ufeff]*[=+\-@\uff1d\uff0b\uff0d\uff20]|^[\t\r\n]/;

/** True when a spreadsheet would treat the cell as a formula. */
export function isFormulaCell(cell: string): boolean {
  return CSV_FORMULA.test(cell);
}

/** A cell as our export wrote it back to what it was: the guard "'" removed from a guarded cell. */
export function unguardCell(cell: string): string {
  return cell.startsWith("'") && isFormulaCell(cell.slice(1)) ? cell.slice(1) : cell;
}
