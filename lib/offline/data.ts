// Idempotency keys (issue 20), server only: the routes the phone writes to (briefing saves and
// holds, pole-check photos, acknowledgements, confirm/decline) run their work through
// `idempotent()`. A request without the Idempotency-Key header runs as before. With one:
//   - the first request with a key reserves it (user, key, method, path, body's SHA-256) and
//     runs; its answer (2xx or 4xx) is stored and returned;
//   - a repeat of the same request gets the stored answer again, marked Idempotent-Replayed,
//     and nothing runs twice;
//   - the same key on a different request (another path or body): 422 naming the header;
//   - a repeat while the first is still running: 409 { reason: "in_progress" } with Retry-After;
//   - a 5xx (database down, a bug) is not stored: the reservation is dropped so a retry runs.
// A reservation left behind by a crashed process is taken over after STALE_MS; the routes' own
// guards (briefing version, "already acknowledged", "already on hold") still stop a double.
import { createHash } from "node:crypto";
import type { Knex } from "knex";
import { ApiError, errorResponse, readBodyBytes } from "@/lib/api/http";
import { db as pool } from "@/lib/db";
import { IDEMPOTENCY_HEADER, IDEMPOTENCY_KEY_RE } from "@/lib/offline/model";

/** Bodies are read once more to fingerprint them; past this the route's own limit answers. */
const MAX_FINGERPRINT_BYTES = 12 * 1024 * 1024;
/** A reservation still without an answer after this long belongs to a request that died. */
export const STALE_MS = 2 * 60_000;
/** Keys older than this are forgotten (a phone's queue is sent within days, not months). */
const KEEP_DAYS = 30;

export const REPLAY_HEADER = "Idempotent-Replayed";

function keyError(message: string) {
  return new ApiError(422, `Invalid ${IDEMPOTENCY_HEADER}: ${message}`, { issues: [{ field: IDEMPOTENCY_HEADER, message }] });
}

/**
 * SHA-256 of the method, the path and the body. A multipart body is sent again with a new
 * random boundary each time (RFC 7578 §4.1), so the boundary is taken out before hashing.
 */
async function fingerprint(req: Request) {
  const url = new URL(req.url);
  const bytes = await readBodyBytes(req.clone(), MAX_FINGERPRINT_BYTES);
  const boundary = /^multipart\/form-data;.*boundary="?([^";]+)"?/i.exec(req.headers.get("content-type") ?? "")?.[1];
  const body = boundary ? Buffer.from(Buffer.from(bytes).toString("latin1").replaceAll(boundary, ""), "latin1") : bytes;
  return createHash("sha256").update(`${req.method.toUpperCase()} ${url.pathname}\n`).update(body).digest("hex");
}

function replay(row: { status: number; response: string | null }) {
  return new Response(row.response ?? "", {
    status: row.status,
    headers: { "content-type": "application/json", [REPLAY_HEADER]: "true" },
  });
}

const isDup = (err: unknown) => (err as { code?: string } | null)?.code === "ER_DUP_ENTRY";

/**
 * Runs `work` at most once per (user, Idempotency-Key). Call it after requireRole (the key
 * belongs to the signed-in user) and before reading the body.
 */
export async function idempotent(req: Request, user: { id: number }, work: () => Promise<Response>, conn: Knex = pool()): Promise<Response> {
  const key = req.headers.get(IDEMPOTENCY_HEADER);
  if (key === null) return work();
  if (!IDEMPOTENCY_KEY_RE.test(key)) throw keyError("16 to 64 letters, digits, '-' or '_'");
  const fp = await fingerprint(req);
  const path = new URL(req.url).pathname.slice(0, 300);
  const method = req.method.toUpperCase().slice(0, 8);
  const reserve = () => conn("idempotency_keys").insert({ user_id: user.id, idem_key: key, method, path, fingerprint: fp, created_at: new Date() });
  try {
    await reserve();
  } catch (err) {
    if (!isDup(err)) throw err;
    const row = await conn("idempotency_keys").where({ user_id: user.id, idem_key: key }).first();
    if (!row) throw new ApiError(409, "The same action is being sent again at this moment; try again shortly.", { reason: "in_progress" });
    if (row.fingerprint !== fp) throw keyError("this key was already used for a different request");
    if (row.status !== null) return replay({ status: Number(row.status), response: row.response });
    const age = Date.now() - new Date(row.created_at).getTime();
    if (age < STALE_MS) {
      throw new ApiError(409, "The same action is still being handled; try again in a moment.", { reason: "in_progress" });
    }
    // Abandoned by a request that never finished: take it over.
    const taken = await conn("idempotency_keys").where({ id: row.id }).whereNull("status").where("created_at", row.created_at).update({ created_at: new Date() });
    if (taken !== 1) throw new ApiError(409, "The same action is being sent again at this moment; try again shortly.", { reason: "in_progress" });
  }
  let res: Response;
  try {
    res = await work();
  } catch (err) {
    res = errorResponse(err);
  }
  if (res.status >= 500) {
    await conn("idempotency_keys").where({ user_id: user.id, idem_key: key }).whereNull("status").delete().catch(() => {});
    return res;
  }
  const text = await res.clone().text();
  await conn("idempotency_keys").where({ user_id: user.id, idem_key: key }).update({ status: res.status, response: text, completed_at: new Date() });
  await conn("idempotency_keys")
    .where({ user_id: user.id })
    .where("created_at", "<", new Date(Date.now() - KEEP_DAYS * 86_400_000))
    .delete()
    .catch(() => {});
  return res;
}
