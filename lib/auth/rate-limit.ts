import type { Knex } from "knex";
import { RateLimiterMemory, RateLimiterMySQL, type RateLimiterAbstract } from "rate-limiter-flexible";

// The sign-in limit (issue 15, finding 5), with rate-limiter-flexible over the database
// (RateLimiterMySQL on the app's Knex pool, table sign_in_limits), so every app instance
// counts the same failures. Three counters, none of which lets a stranger lock anyone out:
//
// - per account AND client address: 5 failures free, then each further failure makes that
//   pair wait 30 s, 1 min, 2 min … (at most 15 min) before its next try. Only the address that guessed
//   waits; the account's owner elsewhere signs in as usual.
// - per client address: 100 failures an hour free (a shared office NAT), then the same
//   growing wait for that address, whatever account it tries (one address sweeping accounts).
// - per account over all addresses: 20 failures an hour free, then every answer for that
//   account is held back 0.25, 0.5, 1 … s (at most 5 s) — slower guessing from many
//   addresses, never a refusal of the right password.
//
// The client address comes from lib/auth/client-address.ts (TCP peer; X-Forwarded-For only
// from a configured trusted proxy).

export const SIGN_IN_LIMIT = {
  pairFree: 5,
  addressFree: 100,
  accountFree: 20,
  windowSeconds: 60 * 60,
  maxWaitSeconds: 15 * 60,
  maxHoldMs: 5000,
};

interface Limiters {
  pairFails: RateLimiterAbstract;
  pairWait: RateLimiterAbstract;
  addrFails: RateLimiterAbstract;
  addrWait: RateLimiterAbstract;
  accountFails: RateLimiterAbstract;
}

let limiters: Limiters | undefined;
let limitersFor: Knex | undefined;

function make(db: Knex | null): Limiters {
  const store = (keyPrefix: string, points: number, duration: number) =>
    db
      ? new RateLimiterMySQL({
          storeClient: db,
          storeType: "knex",
          dbName: (db.client.config.connection as { database?: string })?.database ?? process.env.DB_NAME ?? "gaffline",
          tableName: "sign_in_limits",
          tableCreated: true, // db/migrations/20261203_3000_security.ts
          keyPrefix,
          points,
          duration,
        })
      : new RateLimiterMemory({ keyPrefix, points, duration });
  const w = SIGN_IN_LIMIT.windowSeconds;
  return {
    pairFails: store("pf", 1_000_000, w),
    pairWait: store("pw", 1, SIGN_IN_LIMIT.maxWaitSeconds),
    addrFails: store("af", 1_000_000, w),
    addrWait: store("aw", 1, SIGN_IN_LIMIT.maxWaitSeconds),
    accountFails: store("cf", 1_000_000, w),
  };
}

function get(db: Knex | null): Limiters {
  if (db === null) return (limiters ??= make(null));
  if (!limiters || limitersFor !== db) {
    limiters = make(db);
    limitersFor = db;
  }
  return limiters;
}

/** The wait after `failures` failures with `free` of them free: 0, then 30, 60, 120 … s, capped. */
export function waitSeconds(failures: number, free: number): number {
  if (failures < free) return 0;
  return Math.min(30 * 2 ** (failures - free), SIGN_IN_LIMIT.maxWaitSeconds);
}

/** The hold for an account's failures over all addresses: 0, then 250, 500 … ms, capped. */
export function holdMs(failures: number): number {
  if (failures < SIGN_IN_LIMIT.accountFree) return 0;
  return Math.min(250 * 2 ** (failures - SIGN_IN_LIMIT.accountFree), SIGN_IN_LIMIT.maxHoldMs);
}

const pairKey = (email: string, ip: string) => `${email.toLowerCase()}|${ip}`;

export type Gate = { ok: true; holdMs: number } | { ok: false; retryAfterSeconds: number };

/** Before checking a password: may this address try this account now, and how long to hold. */
export async function signInGate(db: Knex | null, email: string, ip: string): Promise<Gate> {
  const l = get(db);
  const [pw, aw, cf] = await Promise.all([l.pairWait.get(pairKey(email, ip)), l.addrWait.get(ip), l.accountFails.get(email.toLowerCase())]);
  const waits = [pw, aw].filter((r) => r && r.consumedPoints > 0 && r.msBeforeNext > 0).map((r) => r!.msBeforeNext);
  if (waits.length) return { ok: false, retryAfterSeconds: Math.ceil(Math.max(...waits) / 1000) };
  return { ok: true, holdMs: holdMs(cf?.consumedPoints ?? 0) };
}

/** After checking: a failure counts on all three; a success clears this pair's count. */
export async function recordSignIn(db: Knex | null, email: string, ip: string, success: boolean): Promise<void> {
  const l = get(db);
  const key = pairKey(email, ip);
  // The history of attempts (who, from where, when) for admins; the limits live in sign_in_limits.
  if (db) await db("sign_in_attempts").insert({ email: email.slice(0, 254), ip: ip.slice(0, 64), success }).catch(() => {});
  if (success) {
    await Promise.all([l.pairFails.delete(key), l.pairWait.delete(key)]);
    return;
  }
  const [pf, af] = await Promise.all([l.pairFails.penalty(key, 1), l.addrFails.penalty(ip, 1), l.accountFails.penalty(email.toLowerCase(), 1)]);
  const pairWait = waitSeconds(pf.consumedPoints, SIGN_IN_LIMIT.pairFree);
  const addrWait = waitSeconds(af.consumedPoints, SIGN_IN_LIMIT.addressFree);
  await Promise.all([pairWait && l.pairWait.block(key, pairWait), addrWait && l.addrWait.block(ip, addrWait)]);
}
