// The printable day sheet (issue 18): every crew of a day, per yard, as the print page and the
// PDF show it. Plain JSON and pure wording, client-safe.
import { z } from "zod";
import { POSITION_LABEL } from "@/lib/format";

/** The caution the sheet carries (the words of <SafetyNote />, and what it does not replace). */
export const DAY_SHEET_CAUTION =
  "Gaffline assists; it does not decide. This sheet and its checks do not replace your employer's safety program, " +
  "the crew lead's job briefing and judgement, the manufacturer's ratings, OSHA 29 CFR 1910.269 / 1926 Subpart V, " +
  "the NESC, or local codes and agreements.";

export interface SheetCrewMember {
  position: string;
  positionLabel: string;
  /** null: the seat is open. */
  name: string | null;
  employeeNo: string | null;
  status: string | null;
}

export interface SheetFinding {
  level: "block" | "warn";
  rule: string;
  ruleName: string;
  message: string;
  /** "Overridden by Glenn Harrower: reason" when a valid override covers it. */
  override: string | null;
}

export interface SheetOrder {
  id: number;
  number: string;
  title: string;
  where: string;
  work: string;
  /** "07:00–15:30 CST" in the yard's zone (with the end day when it runs past the day). */
  when: string;
  status: string;
  holdReason: string | null;
  crew: SheetCrewMember[];
  trucks: string[];
  findings: SheetFinding[];
  locateWarning: string | null;
}

export interface SheetYard {
  code: string;
  name: string;
  timezone: string;
  /** The zone's abbreviation on that day ("CST"). */
  zone: string;
  orders: SheetOrder[];
}

export interface DaySheet {
  day: string;
  /** "Friday, December 4, 2026". */
  dayWords: string;
  yards: SheetYard[];
  generatedAt: string;
}

export const ASSIGNMENT_STATUS_WORDS: Record<string, string> = {
  draft: "not sent",
  sent: "sent, no answer",
  delivered: "delivered, no answer",
  confirmed: "confirmed",
};

export const positionLabel = (p: string) => POSITION_LABEL[p] ?? p;

/** "Fri, Dec 4" … for the sheet's file name and titles. */
export function sheetTitle(sheet: Pick<DaySheet, "dayWords" | "yards">) {
  const yards = sheet.yards.map((y) => y.name).join(", ");
  return `Day sheet ${sheet.dayWords}${yards ? ` (${yards})` : ""}`;
}

/** One line per crew member: "Lead: Marcus Whitfield (CP-1001), confirmed" or "Climber: open". */
export function crewLine(c: SheetCrewMember) {
  return c.name ? `${c.positionLabel}: ${c.name}${c.employeeNo ? ` (${c.employeeNo})` : ""}${c.status ? `, ${c.status}` : ""}` : `${c.positionLabel}: open`;
}

export function findingLine(f: SheetFinding) {
  return `${f.level === "block" ? "Block" : "Warning"} - ${f.ruleName}: ${f.message}${f.override ? ` (${f.override})` : ""}`;
}


/** ?date=YYYY-MM-DD&yard=NOR (both optional: tomorrow, every yard). */
export const daySheetQuerySchema = z.object({
  date: z
    .string()
    .regex(/^\d{4}-\d{2}-\d{2}$/, "date must be a day as YYYY-MM-DD")
    .refine((s) => {
      const [y, m, d] = s.split("-").map(Number);
      const t = new Date(Date.UTC(y, m - 1, d));
      return t.getUTCFullYear() === y && t.getUTCMonth() === m - 1 && t.getUTCDate() === d && y >= 2000 && y <= 2100;
    }, "date must be a real day between 2000 and 2100")
    .optional(),
  yard: z
    .string()
    .trim()
    .regex(/^[A-Za-z0-9_-]{1,10}$/, "yard must be a yard code such as NOR")
    .optional(),
});
