// The installation's SMS auth token for tests that sign webhook requests like the provider:
// from the environment (scripts/test sources scripts/lib/common.sh) or the generated file in
// .data. There is no default value in the repository (issue 15, finding 3).
import { readFileSync } from "node:fs";
import path from "node:path";

export function smsAuthToken(): string {
  if (process.env.TWILIO_AUTH_TOKEN) return process.env.TWILIO_AUTH_TOKEN;
  try {
    return readFileSync(path.join(process.cwd(), ".data", "sms-auth-token"), "utf8").trim();
  } catch {
    throw new Error("No SMS auth token: set TWILIO_AUTH_TOKEN or run scripts/test (it generates .data/sms-auth-token).");
  }
}
