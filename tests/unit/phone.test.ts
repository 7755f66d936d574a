import { describe, expect, it } from "vitest";
import { isValidPhoneNumber, parsePhoneNumberWithError } from "libphonenumber-js/max";
import { toE164 } from "@/lib/workers/model";
import { workerSchema } from "@/lib/workers/model";

// Reference: libphonenumber-js (max metadata, generated from Google's libphonenumber
// PhoneNumberMetadata.xml). Every case is checked twice: against the literal E.164 string
// (ITU-T E.164: "+", country code, national significant number, no punctuation) and against
// what the reference library itself returns for the same input and default country (US).
// The numbers are from ranges set aside for fiction or documentation where one exists
// (NANP 555-01XX, Ofcom's drama ranges, ACMA's fictitious ranges) — recalled from memory.

const valid: { input: string; e164: string; note: string }[] = [
  { input: "(320) 555-0123", e164: "+13205550123", note: "US, national format, default country US" },
  { input: "320.555.0199", e164: "+13205550199", note: "US, dots" },
  { input: "+1 505 555 0192", e164: "+15055550192", note: "US, international format" },
  { input: "1-320-555-0101", e164: "+13205550101", note: "US, trunk prefix 1" },
  { input: "+1 (416) 555-0123", e164: "+14165550123", note: "Canada (NANP +1)" },
  { input: "+44 20 7946 0958", e164: "+442079460958", note: "UK London, Ofcom drama range 020 7946 0xxx" },
  { input: "+44 7911 123456", e164: "+447911123456", note: "UK mobile (07911; Ofcom's 07700 900xxx drama range is not a valid number in the reference)" },
  { input: "+49 30 901820", e164: "+4930901820", note: "Germany, Berlin" },
  { input: "+49 1512 3456789", e164: "+4915123456789", note: "Germany, mobile" },
  { input: "+61 2 5550 1234", e164: "+61255501234", note: "Australia, ACMA fictitious 02 5550 xxxx" },
  { input: "+61 491 570 156", e164: "+61491570156", note: "Australia mobile, ACMA fictitious 0491 570 xxx" },
  { input: "+91 98765 43210", e164: "+919876543210", note: "India, mobile" },
  { input: "+55 11 91234-5678", e164: "+5511912345678", note: "Brazil, São Paulo mobile (9th digit)" },
  { input: "+52 55 1234 5678", e164: "+525512345678", note: "Mexico City" },
];

const invalid: { input: string; note: string }[] = [
  { input: "123", note: "too short" },
  { input: "555-0123", note: "US, 7 digits without area code" },
  { input: "(020) 7946 0958", note: "UK national format read as US (default country) — not a US number" },
  { input: "+1 555 0100", note: "+1 with too few digits" },
  { input: "+44 20 7946 095", note: "UK, one digit short" },
  { input: "+49 30", note: "Germany, too short" },
  { input: "+999 1234 5678", note: "no such country code" },
  { input: "+1 800 FLOWERS", note: "letters (vanity) refused by our input check" },
  { input: "", note: "empty" },
  { input: "+91 98765 4321", note: "India mobile, one digit short" },
  { input: "+44 7700 900123", note: "UK, Ofcom drama range: not a valid mobile in the reference metadata" },
];

describe("toE164 (reference: libphonenumber-js max metadata)", () => {
  it.each(valid)("$note: $input → $e164", ({ input, e164 }) => {
    expect(toE164(input)).toBe(e164);
    // The reference agrees, for the same input and default country.
    expect(isValidPhoneNumber(input, "US")).toBe(true);
    expect(parsePhoneNumberWithError(input, "US").number).toBe(e164);
  });

  it.each(invalid)("$note: $input is refused", ({ input }) => {
    expect(toE164(input)).toBeNull();
    if (input && !/[A-Za-z]/.test(input)) expect(isValidPhoneNumber(input, "US")).toBe(false);
  });

  it("E.164: the result is + and at most 15 digits (ITU-T E.164 §6)", () => {
    for (const v of valid) expect(toE164(v.input)).toMatch(/^\+[1-9]\d{1,14}$/);
  });
});

describe("workerSchema phone field", () => {
  const base = { employeeNo: "T-1", firstName: "Ada", lastName: "Line", classification: "journeyman", yardId: 1 };
  it("stores E.164 (libphonenumber-js as reference)", () => {
    expect(workerSchema.parse({ ...base, phone: "(320) 555-0123" }).phone).toBe("+13205550123");
  });
  it("empty phone is no phone", () => {
    expect(workerSchema.parse({ ...base, phone: "" }).phone).toBeNull();
    expect(workerSchema.parse(base).phone).toBeNull();
  });
  it("an invalid phone is an issue on the phone field", () => {
    const r = workerSchema.safeParse({ ...base, phone: "12" });
    expect(r.success).toBe(false);
    expect(r.error?.issues[0].path).toEqual(["phone"]);
  });
});
