import { z } from "zod";
import { parsePhoneNumberFromString, type CountryCode } from "libphonenumber-js/max";

// One schema for the roster form (react-hook-form + zodResolver) and the workers routes.
// Phones are stored as E.164. Numbers without a country code are read as US numbers; the
// "max" metadata checks the digits themselves, not only the length.

export const CLASSIFICATIONS = ["journeyman", "apprentice", "ground_hand", "operator", "crew_lead"] as const;
export const DEFAULT_PHONE_COUNTRY: CountryCode = "US";

/** The E.164 form of a phone number, or null when it is not a valid number. */
export function toE164(raw: string, defaultCountry: CountryCode = DEFAULT_PHONE_COUNTRY): string | null {
  const text = raw.trim();
  if (!text || text.length > 40) return null;
  // Only digits, spaces and the usual punctuation; letters (vanity numbers) are refused.
  if (!/^[+\d\s().\-/]+$/.test(text)) return null;
  const parsed = parsePhoneNumberFromString(text, defaultCountry);
  if (!parsed || !parsed.isValid()) return null;
  return parsed.number;
}

// No control characters or bidirectional overrides in names (they make lists lie).
const CONTROL = /[\u0000-\u001f\u007f-\u009f\u202a-\u202e\u2066-\u2069]/;
const personName = (what: string) =>
  z
    .string({ error: `Enter the ${what}` })
    .trim()
    .min(1, `Enter the ${what}`)
    .max(80, `The ${what} is longer than 80 characters`)
    .refine((s) => !CONTROL.test(s), `The ${what} contains a control character`);

const phone = z
  .string()
  .trim()
  .max(40, "Phone number is too long")
  .transform((s, ctx) => {
    if (s === "") return null;
    const e164 = toE164(s);
    if (!e164) {
      ctx.addIssue({
        code: "custom",
        message: "Not a valid phone number. Use a US number like (320) 555-0123 or start with + and the country code",
      });
      return z.NEVER;
    }
    return e164;
  });

const email = z
  .string()
  .trim()
  .max(254, "E-mail address is too long")
  .transform((s, ctx) => {
    if (s === "") return null;
    if (!z.email().safeParse(s).success) {
      ctx.addIssue({ code: "custom", message: "Not a valid e-mail address" });
      return z.NEVER;
    }
    return s.toLowerCase();
  });

export const workerFields = {
  employeeNo: z
    .string({ error: "Enter the employee number" })
    .trim()
    .min(1, "Enter the employee number")
    .max(20, "Employee number is longer than 20 characters")
    .regex(/^[A-Za-z0-9][A-Za-z0-9._-]*$/, "Use letters, digits, dot, dash or underscore"),
  firstName: personName("first name"),
  lastName: personName("last name"),
  classification: z.enum(CLASSIFICATIONS, { error: "Pick a classification" }),
  yardId: z.coerce.number({ error: "Pick a yard" }).int("Pick a yard").positive("Pick a yard"),
  phone: phone.nullable().optional().transform((v) => v ?? null),
  email: email.nullable().optional().transform((v) => v ?? null),
  smsOptIn: z.boolean().default(true),
  active: z.boolean().default(true),
};

export const workerSchema = z.object(workerFields).strict();

/** PATCH: any subset of the fields plus the version the editor started from. */
export const workerPatchSchema = z
  .object({
    employeeNo: workerFields.employeeNo.optional(),
    firstName: workerFields.firstName.optional(),
    lastName: workerFields.lastName.optional(),
    classification: workerFields.classification.optional(),
    yardId: workerFields.yardId.optional(),
    phone: phone.nullable().optional(),
    email: email.nullable().optional(),
    smsOptIn: z.boolean().optional(),
    active: z.boolean().optional(),
    version: z.number({ error: "version is required (the version you started editing)" }).int().positive(),
  })
  .strict();

export type WorkerFormInput = z.input<typeof workerSchema>;
export type WorkerInput = z.output<typeof workerSchema>;
export type WorkerPatch = z.output<typeof workerPatchSchema>;

export const workerQuerySchema = z.object({
  q: z.string().trim().max(80).optional(),
  yard: z.string().trim().max(20).optional(),
  active: z.enum(["true", "false", "all"]).optional(),
});

export interface WorkerRow {
  id: number;
  employeeNo: string;
  firstName: string;
  lastName: string;
  name: string;
  classification: string;
  yardId: number;
  yardCode: string;
  phone: string | null;
  email: string | null;
  smsOptIn: boolean;
  active: boolean;
  version: number;
}
