import type { Knex } from "knex";

// Failed sign-ins are counted in the database, so the limit holds across app instances.
export const SIGN_IN_LIMIT = { failures: 5, windowMinutes: 15 };

export async function signInBlocked(db: Knex, email: string, ip: string) {
  const since = new Date(Date.now() - SIGN_IN_LIMIT.windowMinutes * 60_000);
  const [byEmail, byIp] = await Promise.all([
    db("sign_in_attempts").where({ email, success: false }).where("created_at", ">=", since).count({ n: "*" }).first(),
    db("sign_in_attempts").where({ ip, success: false }).where("created_at", ">=", since).count({ n: "*" }).first(),
  ]);
  // Per account and address: an account is not locked by someone else's guesses elsewhere
  // beyond the window, and one address cannot sweep many accounts.
  return Number(byEmail?.n ?? 0) >= SIGN_IN_LIMIT.failures || Number(byIp?.n ?? 0) >= SIGN_IN_LIMIT.failures * 4;
}

export async function recordSignIn(db: Knex, email: string, ip: string, success: boolean) {
  await db("sign_in_attempts").insert({ email, ip, success });
  if (success) {
    // A successful sign-in clears the account's failure count.
    await db("sign_in_attempts").where({ email, success: false }).delete();
  }
}
