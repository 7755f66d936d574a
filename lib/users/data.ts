import "@/lib/server-only";
import { createHash, randomBytes } from "node:crypto";
import bcrypt from "bcryptjs";
import type { Knex } from "knex";
import { ApiError } from "@/lib/api/http";
import { revokeUserSessions } from "@/lib/users/data-sessions";
import type { Role } from "@/lib/users/roles";
import { appPublicUrl } from "@/lib/notify/config";
import { enqueue } from "@/lib/notify/data-outbox";
import type { UserCreate, UserPatch } from "@/lib/users/model";
import { audit, type Actor } from "@/lib/audit/data";
import type { UserView } from "./model";
export type { UserView };

// Users: admin management (issue 18, point 6) and passwords (issue 15). Every change is
// audited in its transaction; a role change, deactivation or password change ends the user's
// sessions at once (lib/users/data-sessions.ts).

export const RESET_TTL_MINUTES = 60;
const BCRYPT_COST = 10;

const issue = (status: number, field: string, message: string) => new ApiError(status, `Invalid ${field}: ${message}`, { issues: [{ field, message }] });
const tokenHash = (t: string) => createHash("sha256").update(t).digest("hex");

export async function listUsers(q: Knex, organisationId: number): Promise<UserView[]> {
  const rows = await q("users as u")
    .leftJoin("workers as w", "w.id", "u.worker_id")
    .where("u.organisation_id", organisationId)
    .orderBy([{ column: "u.active", order: "desc" }, { column: "u.name" }])
    .select("u.id", "u.email", "u.name", "u.role", "u.active", "u.worker_id", "u.created_at", "w.first_name", "w.last_name");
  const yards = await q("user_yards").whereIn("user_id", rows.map((r) => r.id)).select("user_id", "yard_id");
  return rows.map((r) => ({
    id: Number(r.id),
    email: r.email,
    name: r.name,
    role: r.role,
    active: Boolean(r.active),
    workerId: r.worker_id === null ? null : Number(r.worker_id),
    workerName: r.first_name ? `${r.first_name} ${r.last_name}` : null,
    yardIds: yards.filter((y) => y.user_id === r.id).map((y) => Number(y.yard_id)),
    createdAt: new Date(r.created_at).toISOString(),
  }));
}

async function checkYards(trx: Knex.Transaction, org: number, ids: number[]) {
  if (!ids.length) return;
  const found = await trx("yards").where({ organisation_id: org }).whereIn("id", ids).pluck("id");
  const missing = ids.find((i) => !found.map(Number).includes(i));
  if (missing) throw issue(422, "yardIds", `No yard ${missing}`);
}

async function checkWorker(trx: Knex.Transaction, org: number, workerId: number, exceptUserId?: number) {
  const w = await trx("workers").where({ id: workerId, organisation_id: org }).first("id", "yard_id");
  if (!w) throw issue(422, "workerId", "No such worker");
  const taken = await trx("users").where({ worker_id: workerId }).modify((b) => (exceptUserId ? b.whereNot({ id: exceptUserId }) : b)).first("id");
  if (taken) throw issue(409, "workerId", "Another sign-in is already linked to that worker");
  return Number(w.yard_id);
}

async function setYards(trx: Knex.Transaction, userId: number, role: Role, ids: number[]) {
  await trx("user_yards").where({ user_id: userId }).delete();
  // Only dispatchers are limited to yards; supervisors and admins have all of them.
  if (role === "dispatcher" && ids.length) await trx("user_yards").insert([...new Set(ids)].map((yard_id) => ({ user_id: userId, yard_id })));
}

/** A one-time link to set a password, stored as its SHA-256, e-mailed through the outbox. */
async function issueReset(trx: Knex.Transaction, actor: Actor | null, user: { id: number; email: string; name: string; organisation_id: number }, purpose: "welcome" | "reset") {
  const token = randomBytes(32).toString("base64url");
  const expires = new Date(Date.now() + (purpose === "welcome" ? 72 * 60 : RESET_TTL_MINUTES) * 60_000);
  // An older unused link stops working when a new one is sent.
  await trx("password_resets").where({ user_id: user.id }).whereNull("used_at").update({ used_at: new Date() });
  await trx("password_resets").insert({ user_id: user.id, token_hash: tokenHash(token), expires_at: expires, created_by: actor?.id ?? null });
  const link = `${appPublicUrl()}/reset-password?token=${token}`;
  const hours = purpose === "welcome" ? "72 hours" : `${RESET_TTL_MINUTES} minutes`;
  const subject = purpose === "welcome" ? "Your Gaffline sign-in" : "Reset your Gaffline password";
  const intro = purpose === "welcome" ? "An admin made you a Gaffline sign-in. Set your password here:" : "An admin asked for a new password for your Gaffline sign-in. Set it here:";
  await enqueue(trx, [
    {
      organisationId: user.organisation_id,
      channel: "email",
      kind: purpose === "welcome" ? "account_welcome" : "password_reset",
      to: user.email,
      subject,
      body: `Hello ${user.name},\n\n${intro}\n\n${link}\n\nThe link works once and for ${hours}. If you did not expect this, tell your admin.\n`,
    },
  ]);
  return { expiresAt: expires.toISOString() };
}

export async function createUser(db: Knex, actor: Actor, input: UserCreate): Promise<UserView> {
  return db.transaction(async (trx) => {
    const org = actor.organisationId;
    if (await trx("users").where({ email: input.email }).first("id")) throw issue(409, "email", "A sign-in with that e-mail already exists");
    await checkYards(trx, org, input.yardIds);
    const workerYard = input.workerId ? await checkWorker(trx, org, input.workerId) : null;
    // No password until the person sets one through the e-mailed link: a random, unknown hash.
    const unusable = await bcrypt.hash(randomBytes(24).toString("base64url"), BCRYPT_COST);
    const [id] = await trx("users").insert({
      organisation_id: org,
      email: input.email,
      name: input.name,
      role: input.role,
      password_hash: unusable,
      worker_id: input.workerId,
      home_yard_id: input.role === "dispatcher" ? input.yardIds[0] : workerYard,
      active: true,
    });
    await setYards(trx, Number(id), input.role, input.yardIds);
    const sent = await issueReset(trx, actor, { id: Number(id), email: input.email, name: input.name, organisation_id: org }, "welcome");
    await audit(trx, actor, org, "user.create", "user", id, { email: input.email, role: input.role, yardIds: input.yardIds, workerId: input.workerId, linkExpires: sent.expiresAt });
    return (await listUsers(trx as unknown as Knex, org)).find((u) => u.id === Number(id))!;
  });
}

export async function updateUser(db: Knex, actor: Actor, id: number, patch: UserPatch): Promise<UserView> {
  return db.transaction(async (trx) => {
    const org = actor.organisationId;
    const u = await trx("users").where({ id, organisation_id: org }).forUpdate().first();
    if (!u) throw new ApiError(404, "No such user.");
    if (id === actor.id && (patch.active === false || (patch.role && patch.role !== u.role))) {
      throw issue(422, patch.active === false ? "active" : "role", "You cannot deactivate yourself or change your own role; ask another admin");
    }
    const role: Role = patch.role ?? u.role;
    const before = { role: u.role, active: Boolean(u.active), workerId: u.worker_id, yardIds: (await trx("user_yards").where({ user_id: id }).pluck("yard_id")).map(Number) };
    const workerId = patch.workerId !== undefined ? patch.workerId : u.worker_id;
    if (role === "lineworker" && !workerId) throw issue(422, "workerId", "A lineworker signs in as a worker: pick the worker");
    if (role !== "lineworker" && patch.workerId) throw issue(422, "workerId", "Only a lineworker is linked to a worker");
    if (patch.workerId) await checkWorker(trx, org, patch.workerId, id);
    const yards = patch.yardIds ?? before.yardIds;
    if (role === "dispatcher" && !yards.length) throw issue(422, "yardIds", "A dispatcher needs at least one yard");
    await checkYards(trx, org, yards);
    const update: Record<string, unknown> = {};
    if (patch.role !== undefined) update.role = role;
    if (patch.active !== undefined) update.active = patch.active;
    if (role !== "lineworker") update.worker_id = null;
    else if (patch.workerId !== undefined) update.worker_id = patch.workerId;
    if (role === "dispatcher" && patch.yardIds) update.home_yard_id = yards[0];
    if (Object.keys(update).length) await trx("users").where({ id }).update(update);
    await setYards(trx, id, role, yards);
    const after = { role, active: patch.active ?? before.active, workerId: role === "lineworker" ? workerId : null, yardIds: role === "dispatcher" ? yards : [] };
    const changed = (Object.keys(after) as (keyof typeof after)[]).filter((k) => JSON.stringify(after[k]) !== JSON.stringify(before[k]));
    if (changed.length) {
      // A new role, yards or deactivation takes effect at once: the user's sessions end.
      const ended = await revokeUserSessions(trx, id, changed.includes("active") && !after.active ? "deactivated" : "role_change");
      const action = changed.includes("active") ? (after.active ? "user.reactivate" : "user.deactivate") : changed.includes("role") ? "user.role" : "user.update";
      await audit(trx, actor, org, action, "user", id, { email: u.email, changed, from: before, to: after, sessionsEnded: ended });
    }
    return (await listUsers(trx as unknown as Knex, org)).find((x) => x.id === id)!;
  });
}

export async function adminReset(db: Knex, actor: Actor, id: number) {
  return db.transaction(async (trx) => {
    const u = await trx("users").where({ id, organisation_id: actor.organisationId }).first("id", "email", "name", "organisation_id", "active");
    if (!u) throw new ApiError(404, "No such user.");
    if (!u.active) throw new ApiError(409, "This user is deactivated; reactivate them first.");
    const sent = await issueReset(trx, actor, u, "reset");
    await audit(trx, actor, actor.organisationId, "user.password_reset_sent", "user", id, { email: u.email, expiresAt: sent.expiresAt });
    return { sent: true, to: u.email, expiresAt: sent.expiresAt };
  });
}

/** The signed-in user changes their own password; every session of theirs ends (sign in again). */
export async function changeOwnPassword(db: Knex, user: Actor, current: string, next: string) {
  return db.transaction(async (trx) => {
    const u = await trx("users").where({ id: user.id, active: true }).forUpdate().first("id", "password_hash", "organisation_id");
    if (!u) throw new ApiError(401, "Sign in first.");
    if (!(await bcrypt.compare(current, u.password_hash))) throw issue(422, "currentPassword", "That is not your current password");
    await trx("users").where({ id: user.id }).update({ password_hash: await bcrypt.hash(next, BCRYPT_COST), password_changed_at: new Date() });
    const ended = await revokeUserSessions(trx, user.id, "password_change");
    await audit(trx, user, u.organisation_id, "user.password_change", "user", user.id, { sessionsEnded: ended });
    return { changed: true, signInAgain: true };
  });
}

/** A reset link used: one time, before it expires. Ends every session of the user. */
export async function consumeReset(db: Knex, token: string, password: string) {
  return db.transaction(async (trx) => {
    const r = await trx("password_resets").where({ token_hash: tokenHash(token) }).forUpdate().first();
    if (!r || r.used_at || new Date(r.expires_at).getTime() < Date.now()) {
      throw issue(410, "token", "This link has expired or was already used; ask your admin for a new one");
    }
    const u = await trx("users").where({ id: r.user_id, active: true }).first("id", "organisation_id", "email");
    if (!u) throw issue(410, "token", "This sign-in is deactivated");
    await trx("password_resets").where({ id: r.id }).update({ used_at: new Date() });
    await trx("users").where({ id: u.id }).update({ password_hash: await bcrypt.hash(password, BCRYPT_COST), password_changed_at: new Date() });
    const ended = await revokeUserSessions(trx, u.id, "password_reset");
    await audit(trx, { id: u.id, organisationId: u.organisation_id }, u.organisation_id, "user.password_reset", "user", u.id, { sessionsEnded: ended });
    return { reset: true, email: u.email };
  });
}

/** The Admin page's user list: every sign-in of the organisation, by role then name. */
export async function listUserSummaries(db: Knex, organisationId: number) {
  return db("users")
    .where({ organisation_id: organisationId })
    .orderBy(["role", "name"])
    .select("id", "name", "email", "role", "active") as Promise<{ id: number; name: string; email: string; role: Role; active: number | boolean }[]>;
}
