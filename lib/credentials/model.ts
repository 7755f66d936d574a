import { z } from "zod";
import { addDays } from "@/lib/time/days";

// Schemas for credentials: add/renew (HR), a lineworker's renewal (pending), HR's verify or
// reject, the list query and the CSV import. Shared by the routes, the forms and the tests.

export const ISO_DATE = /^\d{4}-\d{2}-\d{2}$/;

/** True for a real calendar date written YYYY-MM-DD (2026-02-30 is not). */
export function isRealDate(s: string): boolean {
  if (!ISO_DATE.test(s)) return false;
  const [y, m, d] = s.split("-").map(Number);
  const t = new Date(Date.UTC(y, m - 1, d));
  return t.getUTCFullYear() === y && t.getUTCMonth() === m - 1 && t.getUTCDate() === d && y >= 1900 && y <= 2200;
}

export const isoDate = z
  .string({ error: "not a date (YYYY-MM-DD)" })
  .trim()
  .refine(isRealDate, "not a date (YYYY-MM-DD)");

const pad = (n: number, w = 2) => String(n).padStart(w, "0");

/** The day `days` after `date`: lib/time/days.ts's addDays under the name the credential code uses. */
export const addDaysIso = addDays;

/** Calendar months, clamped to the month's last day (Jan 31 + 1 month = Feb 28/29). */
export function addMonthsIso(date: string, months: number): string {
  const [y, m, d] = date.split("-").map(Number);
  const first = new Date(Date.UTC(y, m - 1 + months, 1));
  const lastDay = new Date(Date.UTC(first.getUTCFullYear(), first.getUTCMonth() + 1, 0)).getUTCDate();
  return `${pad(first.getUTCFullYear(), 4)}-${pad(first.getUTCMonth() + 1)}-${pad(Math.min(d, lastDay))}`;
}

/**
 * The proposed last valid day: issued + N months − 1 day. `expires_on` is the last day the
 * credential is valid (the crew rules treat it so), so a 12-month card issued 2026-03-15 is
 * good through 2027-03-14 and a new card issued on 2027-03-15 follows without a gap or an
 * overlap day. Null when the type has no renewal period (no expiry).
 */
export function proposeExpiry(issuedOn: string, renewalMonths: number | null | undefined): string | null {
  if (renewalMonths === null || renewalMonths === undefined || !isRealDate(issuedOn)) return null;
  return addDaysIso(addMonthsIso(issuedOn, renewalMonths), -1);
}

const expiryAfterIssue = <T extends { issuedOn: string; expiresOn?: string | null }>(v: T, ctx: z.RefinementCtx) => {
  if (v.expiresOn && v.issuedOn && v.expiresOn < v.issuedOn) {
    ctx.addIssue({ code: "custom", path: ["expiresOn"], message: "The expiry is before the issue date" });
  }
};

/** POST /api/credentials: add or renew (HR, admin) or submit a renewal (lineworker: pending). */
export const credentialCreateSchema = z
  .object({
    workerId: z.number({ error: "Pick a worker" }).int().positive(),
    qualificationTypeId: z.number({ error: "Pick a qualification" }).int().positive(),
    issuedOn: isoDate,
    // Omitted: proposed from the type's renewal period. Null: no expiry.
    expiresOn: isoDate.nullable().optional(),
    evidenceFileId: z.number().int().positive().nullable().optional(),
    status: z.enum(["current", "pending"]).default("current"),
    note: z.string().trim().max(500).optional(),
  })
  .strict()
  .superRefine(expiryAfterIssue);

export type CredentialCreateInput = z.input<typeof credentialCreateSchema>;
export type CredentialCreate = z.output<typeof credentialCreateSchema>;

/**
 * The add/renew form (react-hook-form). Its fields are the route schema's; an empty expiry
 * means "use the proposal" (the route proposes the same date). The form checks its payload
 * with credentialCreateSchema before sending it.
 */
export const credentialFormSchema = z
  .object({
    qualificationTypeId: z.coerce.number({ error: "Pick a qualification" }).int().positive("Pick a qualification"),
    issuedOn: isoDate,
    expiresOn: z
      .string()
      .trim()
      .refine((s) => s === "" || isRealDate(s), "not a date (YYYY-MM-DD)"),
    note: z.string().trim().max(500, "At most 500 characters").optional(),
  })
  .superRefine(expiryAfterIssue);
export type CredentialFormInput = z.input<typeof credentialFormSchema>;
export type CredentialFormValues = z.output<typeof credentialFormSchema>;

/** PATCH /api/credentials/[id]: HR verifies (pending → current, or stamps an unverified record) or rejects. */
export const credentialPatchSchema = z.discriminatedUnion("action", [
  z
    .object({
      action: z.literal("verify"),
      issuedOn: isoDate.optional(),
      expiresOn: isoDate.nullable().optional(),
    })
    .strict(),
  z
    .object({
      action: z.literal("reject"),
      reason: z.string({ error: "Say why" }).trim().min(3, "Say why (a few words)").max(500),
    })
    .strict(),
]);
export type CredentialPatch = z.output<typeof credentialPatchSchema>;

export const CREDENTIAL_VIEWS = ["all", "lapsed", "30", "60", "90", "pending"] as const;
export type CredentialView = (typeof CREDENTIAL_VIEWS)[number];

/** Whether a record belongs to a quick view. "30" = lapsing within 30 days (not yet lapsed). */
export function inView(c: { status: string; daysLeft: number | null }, view: CredentialView | undefined): boolean {
  switch (view ?? "all") {
    case "all":
      return true;
    case "pending":
      return c.status === "pending";
    case "lapsed":
      return c.status === "current" && c.daysLeft !== null && c.daysLeft < 0;
    default: {
      const n = Number(view);
      return c.status === "current" && c.daysLeft !== null && c.daysLeft >= 0 && c.daysLeft <= n;
    }
  }
}

export const credentialQuerySchema = z.object({
  view: z.enum(CREDENTIAL_VIEWS).optional(),
  yard: z.string().trim().max(20).optional(),
  qualification: z.string().trim().max(40).optional(),
  q: z.string().trim().max(80).optional(),
  workerId: z.coerce.number().int().positive().optional(),
});
export type CredentialQuery = z.output<typeof credentialQuerySchema>;

// --- CSV import ---------------------------------------------------------------------------

export const IMPORT_COLUMNS = ["employee_no", "qualification", "issued_on", "expires_on"] as const;
export const IMPORT_REQUIRED = ["employee_no", "qualification", "issued_on"] as const;
/** Other spellings accepted in a header row. */
export const IMPORT_ALIASES: Record<string, (typeof IMPORT_COLUMNS)[number]> = {
  employee_no: "employee_no",
  employee_number: "employee_no",
  emp_no: "employee_no",
  qualification: "qualification",
  qualification_code: "qualification",
  code: "qualification",
  issued_on: "issued_on",
  issued: "issued_on",
  expires_on: "expires_on",
  expires: "expires_on",
};
export const IMPORT_MAX_ROWS = 10_000;

export const importRequestSchema = z
  .object({
    csv: z.string({ error: "csv is required (the file's text)" }).min(1, "The file is empty"),
    dryRun: z.boolean().default(false),
  })
  .strict();

export interface ImportIssue {
  line: number;
  field: string;
  message: string;
}

/** Row-level checks that need no database: dates, required cells. */
export const importRowSchema = z.object({
  employee_no: z.string().trim().min(1, "empty (the worker's employee number)").max(20, "longer than 20 characters"),
  qualification: z.string().trim().min(1, "empty (a qualification code such as climbing)").max(40, "longer than 40 characters"),
  issued_on: isoDate,
  expires_on: z
    .string()
    .trim()
    .optional()
    .transform((s) => (s ? s : undefined))
    .refine((s) => s === undefined || isRealDate(s), "not a date (YYYY-MM-DD)"),
});

/** "line 7, expires_on: not a date (YYYY-MM-DD)" */
export const formatIssue = (i: ImportIssue) => `line ${i.line}, ${i.field}: ${i.message}`;

/** One credential with everything the desk shows. Plain JSON (dates as strings). */
export interface CredentialDetail {
  id: number;
  workerId: number;
  workerName: string;
  employeeNo: string;
  workerActive: boolean;
  yardId: number;
  yardCode: string;
  timezone: string;
  typeId: number;
  type: string;
  typeName: string;
  warnDays: number;
  renewalMonths: number | null;
  needsEvidence: boolean;
  issuedOn: string;
  expiresOn: string | null;
  status: CredentialStatus;
  /** Whole days from today (in the worker's yard zone) to the last valid day; null = no expiry. */
  daysLeft: number | null;
  evidenceFileId: number | null;
  evidenceName: string | null;
  verifiedByName: string | null;
  verifiedAt: string | null;
  createdByName: string | null;
  createdAt: string;
  supersedesId: number | null;
  note: string | null;
  importRef: string | null;
}

export interface QualificationType {
  id: number;
  code: string;
  name: string;
  renewalMonths: number | null;
  warnDays: number;
  needsEvidence: boolean;
  /** Read by the crew rules: the code can never change or go. */
  locked: boolean;
  /** How many credential records use it (any status). */
  inUse: number;
}

export type CredentialStatus = "current" | "superseded" | "pending" | "rejected";
