import "@/lib/server-only";
import { createHash, randomBytes } from "node:crypto";
import type { Knex } from "knex";
import type { Role } from "@/lib/users/roles";

// Server-side sessions (issue 15, finding 4). The signed next-auth token carries a random
// session id; the database keeps its SHA-256 in user_sessions. Every request checks that the
// row is live and that the user is still active with the role the token names, so sign-out
// (that session), deactivation, a role change and a password reset (all of the user's
// sessions) take effect at once. Each instance remembers an answer for at most
// SESSION_CHECK_CACHE_MS, so a revocation reaches every instance within that time; the
// instance that revokes forgets at once.

export const SESSION_MAX_AGE_SECONDS = 12 * 60 * 60;
export const SESSION_CHECK_CACHE_MS = 1000;

export interface LiveUser {
  id: number;
  name: string;
  email: string;
  role: Role;
  workerId: number | null;
  organisationId: number;
  homeYardId: number | null;
}

const hashSid = (sid: string) => createHash("sha256").update(sid).digest("hex");

const cache = new Map<string, { at: number; user: LiveUser | null }>();

export async function createSession(db: Knex, userId: number): Promise<string> {
  const sid = randomBytes(32).toString("base64url");
  await db("user_sessions").insert({
    id: hashSid(sid),
    user_id: userId,
    expires_at: new Date(Date.now() + SESSION_MAX_AGE_SECONDS * 1000),
  });
  // Old rows of anyone go after a day past their end; cheap, and keeps the table small.
  if (Math.random() < 0.05) {
    await db("user_sessions").where("expires_at", "<", new Date(Date.now() - 24 * 3600_000)).delete().catch(() => {});
  }
  return sid;
}

/** The user behind a live session whose token names `uid` and `role`; null when not live. */
export async function liveSessionUser(db: Knex, sid: string, uid: number, role: string): Promise<LiveUser | null> {
  const key = hashSid(sid);
  const hit = cache.get(key);
  const now = Date.now();
  let user: LiveUser | null;
  if (hit && now - hit.at < SESSION_CHECK_CACHE_MS) {
    user = hit.user;
  } else {
    const row = await db("user_sessions as s")
      .join("users as u", "u.id", "s.user_id")
      .where("s.id", key)
      .whereNull("s.revoked_at")
      .where("s.expires_at", ">", new Date(now))
      .where("u.active", true)
      .first("u.id", "u.name", "u.email", "u.role", "u.worker_id", "u.organisation_id", "u.home_yard_id");
    user = row
      ? {
          id: Number(row.id),
          name: row.name,
          email: row.email,
          role: row.role as Role,
          workerId: row.worker_id === null ? null : Number(row.worker_id),
          organisationId: Number(row.organisation_id),
          homeYardId: row.home_yard_id === null ? null : Number(row.home_yard_id),
        }
      : null;
    cache.set(key, { at: now, user });
    if (cache.size > 5000) cache.clear();
  }
  if (!user || user.id !== uid || user.role !== role) return null;
  return user;
}

export async function revokeSession(db: Knex, sid: string, why = "sign_out"): Promise<void> {
  const key = hashSid(sid);
  cache.delete(key);
  await db("user_sessions").where({ id: key }).whereNull("revoked_at").update({ revoked_at: new Date(), revoked_why: why });
}

/** Ends every session of a user (deactivation, role change, password change or reset). */
export async function revokeUserSessions(q: Knex | Knex.Transaction, userId: number, why: string, exceptSid?: string): Promise<number> {
  cache.clear();
  let query = q("user_sessions").where({ user_id: userId }).whereNull("revoked_at");
  if (exceptSid) query = query.whereNot({ id: hashSid(exceptSid) });
  return query.update({ revoked_at: new Date(), revoked_why: why });
}

/** The active user signing in with this e-mail (the whole row), or undefined. */
export async function activeUserByEmail(q: Knex, email: string) {
  return q("users").where({ email, active: true }).first();
}

/** The yard ids assigned to a user (user_yards): a dispatcher's editable yards. */
export async function userYardIds(q: Knex, userId: number | string): Promise<number[]> {
  const rows = await q("user_yards").where({ user_id: userId }).pluck("yard_id");
  return rows.map(Number);
}
