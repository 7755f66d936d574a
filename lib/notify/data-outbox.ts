import "@/lib/server-only";
// The notification outbox: rows are written in the same transaction as the change they tell
// about, and any number of app instances deliver them.
//
// Delivery, per batch:
//   1. claim: a short transaction takes due 'queued' rows with SELECT … FOR UPDATE SKIP LOCKED
//      (so two instances never take the same row, and neither waits for the other) and marks
//      them 'sending' with a random claim_token and claimed_at;
//   2. send each outside any transaction (SMS through the twilio SDK, e-mail over SMTP);
//   3. settle with UPDATE … WHERE id = ? AND claim_token = ?: 'sent' with the provider's id, or
//      back to 'queued' with attempts + 1 and next_attempt_at = now + 2^(attempts-1) × 2 s
//      (capped at 5 min), or 'failed' with last_error after 8 attempts or a permanent refusal.
// A row left in 'sending' longer than the lease (2 min; every provider call times out well
// before that) belonged to an instance that died mid-send. It is not blindly sent again:
//   - SMS: the provider is asked for messages to that number since the claim; one with the
//     same body means it went out, and the row is settled 'sent' with that SID. Only when the
//     provider has no such message is the row queued again. If the provider cannot be asked,
//     the row waits for another lease.
//   - e-mail: SMTP cannot be asked, so the row is queued again and re-sent with the same
//     Message-ID, which mail clients use to fold a duplicate.
// Times come from the database (UTC_TIMESTAMP), never from an instance's own clock.
//
// Scaled out on Galera (README "Scaling out"), FOR UPDATE and SKIP LOCKED hold only on the node
// that runs them: two loops on two nodes would take the same rows and one of the two claims
// would fail certification at commit (1213) every time. So the claim is partitioned: a row
// belongs to partition CRC32(id) MOD P (a hash: Galera hands each node ids of one residue
// modulo the cluster size, so id MOD P would put every row in its writer's partition), where P is the number of database nodes in DB_HOSTS and an
// instance's partition is the position of its own (first-listed) node in the sorted list
// (DELIVERY_PARTITION=k/P overrides). Instances on the same node share a partition and SKIP
// LOCKED keeps them apart there. A row of another partition is taken only once it has waited
// PARTITION_GRACE_SECONDS past due (its owners may all be down); should two claims still meet,
// certification refuses one and withConflictRetry runs it again, and the refused claim sent nothing.
import { randomBytes, randomUUID } from "node:crypto";
import type { Knex } from "knex";
import { boardEvent } from "@/lib/events/data";
import { dbHosts, withConflictRetry } from "@/lib/db";
import { emailAdapter, isPermanentEmailError, type EmailAdapter, type StoredAttachment } from "./email";
import { isPermanentSmsError, smsAdapter, type SmsAdapter } from "./sms";

export const MAX_ATTEMPTS = 8;
export const LEASE_SECONDS = 120;
export const BACKOFF_BASE_MS = 2_000;
export const BACKOFF_CAP_MS = 5 * 60_000;

/** Kinds whose delivery moves an assignment from 'sent' to 'delivered'. */
export const ASSIGNMENT_KINDS = ["assignment", "change", "resend"];

export type Channel = "sms" | "email";

export interface OutboxInput {
  organisationId: number;
  workerId?: number | null;
  assignmentId?: number | null;
  channel: Channel;
  kind: string;
  to: string;
  subject?: string | null;
  body: string;
  html?: string | null;
  attachments?: StoredAttachment[];
  /** Unique: a second enqueue with the same key writes nothing. */
  dedupeKey?: string | null;
}

const now3 = (q: Knex | Knex.Transaction) => q.raw("UTC_TIMESTAMP(3)");

function mailDomain() {
  const m = /@([A-Za-z0-9.-]+)>?\s*$/.exec(process.env.MAIL_FROM ?? "");
  return m ? m[1] : "gaffline.invalid";
}

/** Writes outbox rows (inside the caller's transaction); returns how many were new. */
export async function enqueue(q: Knex | Knex.Transaction, rows: OutboxInput[]): Promise<number> {
  if (!rows.length) return 0;
  const keys = rows.map((r) => r.dedupeKey).filter((k): k is string => Boolean(k));
  const existing = new Set<string>(
    keys.length ? ((await q("notifications").whereIn("dedupe_key", keys).pluck("dedupe_key")) as string[]) : [],
  );
  const seen = new Set<string>();
  const fresh = rows.filter((r) => {
    if (!r.dedupeKey) return true;
    if (existing.has(r.dedupeKey) || seen.has(r.dedupeKey)) return false;
    seen.add(r.dedupeKey);
    return true;
  });
  if (!fresh.length) return 0;
  const domain = mailDomain();
  const values = fresh.map((r) => ({
    organisation_id: r.organisationId,
    worker_id: r.workerId ?? null,
    assignment_id: r.assignmentId ?? null,
    channel: r.channel,
    kind: r.kind,
    to_address: r.to,
    subject: r.subject ?? null,
    body: r.body,
    attachments: r.channel === "email" ? JSON.stringify({ html: r.html ?? null, files: r.attachments ?? [] }) : null,
    state: "queued",
    attempts: 0,
    next_attempt_at: now3(q),
    dedupe_key: r.dedupeKey ?? null,
    message_key: r.channel === "email" ? `<${randomUUID()}@${domain}>` : null,
  }));
  for (let i = 0; i < values.length; i += 500) {
    // A concurrent writer with the same key (two sends racing) leaves one row: the unique key decides.
    await q("notifications").insert(values.slice(i, i + 500)).onConflict("dedupe_key").merge(["dedupe_key"]);
  }
  return fresh.length;
}

interface ClaimedRow {
  id: number;
  organisation_id: number;
  worker_id: number | null;
  assignment_id: number | null;
  channel: Channel;
  kind: string;
  to_address: string;
  subject: string | null;
  body: string;
  attachments: unknown;
  attempts: number;
  message_key: string | null;
  claim_token: string;
  sms_opt_in: number | null;
  prior_claimed_at?: Date | null;
}

export interface DrainOptions {
  limit?: number;
  concurrency?: number;
  leaseSeconds?: number;
  sms?: SmsAdapter;
  email?: EmailAdapter;
}

export interface DrainResult {
  claimed: number;
  sent: number;
  retried: number;
  failed: number;
  recovered: number;
  requeued: number;
}

export function backoffMs(attempts: number) {
  return Math.min(BACKOFF_BASE_MS * 2 ** Math.max(0, attempts - 1), BACKOFF_CAP_MS);
}

function parseAttachments(raw: unknown): { html: string | null; files: StoredAttachment[] } {
  let v = raw;
  if (typeof v === "string") {
    try {
      v = JSON.parse(v);
    } catch {
      return { html: null, files: [] };
    }
  }
  if (Array.isArray(v)) return { html: null, files: v as StoredAttachment[] };
  if (v && typeof v === "object") {
    const o = v as { html?: string | null; files?: StoredAttachment[] };
    return { html: o.html ?? null, files: o.files ?? [] };
  }
  return { html: null, files: [] };
}

const token = () => randomBytes(16).toString("hex");

const withLockRetry = <T>(fn: () => Promise<T>) => withConflictRetry(fn, "outbox claim");

export const PARTITION_GRACE_SECONDS = 10;

/** This instance's outbox partition: { index k, count P } (P = 1: every row is its own). */
export function deliveryPartition(env: Record<string, string | undefined> = process.env): { index: number; count: number } {
  const m = /^(\d+)\/(\d+)$/.exec(env.DELIVERY_PARTITION ?? "");
  if (m && Number(m[2]) >= 1 && Number(m[1]) < Number(m[2])) return { index: Number(m[1]), count: Number(m[2]) };
  const hosts = dbHosts(env).map((h) => `${h.host}:${h.port}`);
  const sorted = [...new Set(hosts)].sort();
  if (sorted.length < 2) return { index: 0, count: 1 };
  return { index: sorted.indexOf(hosts[0]), count: sorted.length };
}

/** Restricts a claim to this instance's partition, plus other partitions' rows overdue by the grace. */
function inPartition(q: Knex.QueryBuilder, trx: Knex.Transaction, column: "next_attempt_at" | "claimed_at", extraSeconds = 0) {
  const { index, count } = deliveryPartition();
  if (count < 2) return q;
  return q.where((w) =>
    w.whereRaw("MOD(CRC32(id), ?) = ?", [count, index]).orWhere(column, "<", trx.raw("UTC_TIMESTAMP(3) - INTERVAL ? SECOND", [PARTITION_GRACE_SECONDS + extraSeconds])),
  );
}

const SELECT_CLAIMED = [
  "n.id",
  "n.organisation_id",
  "n.worker_id",
  "n.assignment_id",
  "n.channel",
  "n.kind",
  "n.to_address",
  "n.subject",
  "n.body",
  "n.attachments",
  "n.attempts",
  "n.message_key",
  "n.claim_token",
  "w.sms_opt_in",
];

/** Takes up to `limit` due rows for this caller. */
async function claim(db: Knex, limit: number): Promise<ClaimedRow[]> {
  const claimToken = token();
  const ids = await withLockRetry(() =>
    db.transaction(
      async (trx) => {
        const rows = await inPartition(trx("notifications").where("state", "queued").where("next_attempt_at", "<=", now3(trx)), trx, "next_attempt_at")
          .orderBy([{ column: "next_attempt_at" }, { column: "id" }])
          .limit(limit)
          .forUpdate()
          .skipLocked()
          .select("id");
        const ids = rows.map((r: { id: number | string }) => Number(r.id));
        if (ids.length) {
          await trx("notifications").whereIn("id", ids).update({ state: "sending", claim_token: claimToken, claimed_at: now3(trx) });
        }
        return ids;
      },
      { isolationLevel: "read committed" },
    ),
  );
  if (!ids.length) return [];
  const rows = await db("notifications as n")
    .leftJoin("workers as w", "w.id", "n.worker_id")
    .whereIn("n.id", ids)
    .where("n.claim_token", claimToken)
    .select(SELECT_CLAIMED);
  return rows.map((r: ClaimedRow) => ({ ...r, id: Number(r.id) }));
}

/** Takes rows whose claim outlived the lease (their instance died mid-send). */
async function claimStale(db: Knex, limit: number, leaseSeconds: number): Promise<ClaimedRow[]> {
  const claimToken = token();
  const found = await withLockRetry(() =>
    db.transaction(
      async (trx) => {
        const rows = await inPartition(
          trx("notifications").where("state", "sending").where("claimed_at", "<", trx.raw("UTC_TIMESTAMP(3) - INTERVAL ? SECOND", [leaseSeconds])),
          trx,
          "claimed_at",
          leaseSeconds,
        )
          .orderBy("id")
          .limit(limit)
          .forUpdate()
          .skipLocked()
          .select("id", "claimed_at");
        if (rows.length) {
          await trx("notifications")
            .whereIn("id", rows.map((r: { id: number }) => r.id))
            .update({ claim_token: claimToken, claimed_at: now3(trx) });
        }
        return rows as { id: number | string; claimed_at: Date }[];
      },
      { isolationLevel: "read committed" },
    ),
  );
  if (!found.length) return [];
  const prior = new Map(found.map((r) => [Number(r.id), r.claimed_at]));
  const rows = await db("notifications as n")
    .leftJoin("workers as w", "w.id", "n.worker_id")
    .whereIn("n.id", [...prior.keys()])
    .where("n.claim_token", claimToken)
    .select(SELECT_CLAIMED);
  return rows.map((r: ClaimedRow) => ({ ...r, id: Number(r.id), prior_claimed_at: prior.get(Number(r.id)) ?? null }));
}

/** Settles a row as sent; true when this caller still held the claim. */
async function settleSent(db: Knex, row: ClaimedRow, providerId: string, note: string | null, delivered: number[]) {
  // Retried on a conflict (a reply to the same assignment committed on another node): the
  // message went out, so this must not turn into a send failure and a second send.
  return withConflictRetry(() => db.transaction(async (trx) => {
    const n = await trx("notifications")
      .where({ id: row.id, claim_token: row.claim_token })
      .update({
        state: "sent",
        provider_id: providerId.slice(0, 100),
        sent_at: now3(trx),
        attempts: trx.raw("attempts + 1"),
        claim_token: null,
        last_error: note,
      });
    if (n === 1 && row.assignment_id && ASSIGNMENT_KINDS.includes(row.kind)) {
      const moved = await trx("assignments")
        .where({ id: row.assignment_id, status: "sent" })
        .update({ status: "delivered", delivered_at: trx.raw("COALESCE(delivered_at, UTC_TIMESTAMP(3))") });
      if (moved) delivered.push(row.assignment_id);
    }
    return n === 1;
  }), "outbox settle");
}

async function settleFailure(db: Knex, row: ClaimedRow, err: unknown, permanent: boolean) {
  const message = describeError(err).slice(0, 1000);
  const attempts = row.attempts + 1;
  const give_up = permanent || attempts >= MAX_ATTEMPTS;
  const update = give_up
    ? { state: "failed", attempts, claim_token: null, last_error: message }
    : {
        state: "queued",
        attempts,
        claim_token: null,
        last_error: message,
        next_attempt_at: db.raw("UTC_TIMESTAMP(3) + INTERVAL ? MICROSECOND", [(backoffMs(attempts) + Math.floor(Math.random() * 250)) * 1000]),
      };
  await db("notifications").where({ id: row.id, claim_token: row.claim_token }).update(update);
  return give_up ? "failed" : "retried";
}

export function describeError(err: unknown) {
  const e = err as { status?: number; code?: number | string; message?: string; responseCode?: number; response?: string } | null;
  if (!e) return "unknown error";
  const bits: string[] = [];
  if (e.status) bits.push(`HTTP ${e.status}`);
  if (e.responseCode) bits.push(`SMTP ${e.responseCode}`);
  if (e.code !== undefined) bits.push(String(e.code));
  bits.push(e.message ?? String(err));
  return bits.join(" ");
}

async function deliver(db: Knex, row: ClaimedRow, sms: SmsAdapter, email: EmailAdapter, delivered: number[]) {
  let providerId: string;
  try {
    if (row.channel === "sms") {
      if (row.worker_id && row.sms_opt_in === 0) {
        return await settleFailure(db, row, new Error("The worker has opted out of texts (STOP); not sent."), true);
      }
      providerId = (await sms.send({ to: row.to_address, body: row.body })).sid;
    } else {
      const { html, files } = parseAttachments(row.attachments);
      const r = await email.send({
        to: row.to_address,
        subject: row.subject ?? "Gaffline",
        text: row.body,
        html,
        attachments: files,
        messageId: row.message_key ?? `<notification-${row.id}@${mailDomain()}>`,
      });
      providerId = r.messageId;
    }
  } catch (err) {
    const permanent = row.channel === "sms" ? isPermanentSmsError(err) : isPermanentEmailError(err);
    return settleFailure(db, row, err, permanent);
  }
  // Sent. If recording that fails (the database went away), the row stays claimed and the
  // stale-claim recovery finds the provider's copy: never queued again as if it had failed.
  try {
    return (await settleSent(db, row, providerId, null, delivered)) ? "sent" : "lost-claim";
  } catch (err) {
    console.error(`[outbox] notification ${row.id} was sent but could not be recorded yet:`, describeError(err));
    return "unsettled";
  }
}

/** A stale claim: find out whether it went out before sending it again. */
async function recover(db: Knex, row: ClaimedRow, sms: SmsAdapter, delivered: number[]) {
  if (row.channel === "sms") {
    const since = row.prior_claimed_at ? new Date(row.prior_claimed_at) : new Date(Date.now() - LEASE_SECONDS * 2000);
    let found: { sid: string; body: string }[];
    try {
      found = (await sms.findSent({ to: row.to_address, since })).filter((m) => m.body === row.body);
      // A message another row already owns (an identical re-send a minute earlier) is not this one.
      if (found.length) {
        const owned = new Set(
          (await db("notifications").whereIn("provider_id", found.map((m) => m.sid)).whereNot("id", row.id).pluck("provider_id")) as string[],
        );
        found = found.filter((m) => !owned.has(m.sid));
      }
    } catch (err) {
      // Cannot tell: keep it claimed (claimed_at was renewed) and ask again after another lease.
      const attempts = row.attempts + 1;
      await db("notifications")
        .where({ id: row.id, claim_token: row.claim_token })
        .update(
          attempts >= MAX_ATTEMPTS
            ? { state: "failed", attempts, claim_token: null, last_error: `Could not verify a stale send: ${describeError(err)}`.slice(0, 1000) }
            : { attempts, last_error: `Stale send not yet verified: ${describeError(err)}`.slice(0, 1000) },
        );
      return "unverified";
    }
    if (found.length) {
      await settleSent(db, row, found[0].sid, "Recovered after an interrupted send: the provider had accepted it.", delivered);
      return "recovered";
    }
  }
  await db("notifications")
    .where({ id: row.id, claim_token: row.claim_token })
    .update({
      state: "queued",
      claim_token: null,
      next_attempt_at: now3(db),
      last_error: row.channel === "sms" ? "Interrupted send; the provider had no copy, so it is sent again." : "Interrupted send; sent again with the same Message-ID.",
    });
  return "requeued";
}

async function pool<T>(items: T[], size: number, fn: (item: T) => Promise<unknown>) {
  let next = 0;
  const workers = Array.from({ length: Math.min(size, items.length) }, async () => {
    while (next < items.length) {
      const item = items[next++];
      await fn(item);
    }
  });
  await Promise.all(workers);
}

/** One pass of the delivery loop. Safe to run from any number of processes at once. */
export async function drainOnce(db: Knex, opts: DrainOptions = {}): Promise<DrainResult> {
  const limit = opts.limit ?? 50;
  const sms = opts.sms ?? smsAdapter();
  const email = opts.email ?? emailAdapter();
  const result: DrainResult = { claimed: 0, sent: 0, retried: 0, failed: 0, recovered: 0, requeued: 0 };
  const delivered: number[] = [];

  const stale = await claimStale(db, limit, opts.leaseSeconds ?? LEASE_SECONDS);
  for (const row of stale) {
    const r = await recover(db, row, sms, delivered);
    if (r === "recovered") result.recovered++;
    else if (r === "requeued") result.requeued++;
  }

  const rows = await claim(db, limit);
  result.claimed = rows.length;
  await pool(rows, opts.concurrency ?? 10, async (row) => {
    const r = await deliver(db, row, sms, email, delivered);
    if (r === "sent") result.sent++;
    else if (r === "retried") result.retried++;
    else if (r === "failed") result.failed++;
  });

  if (delivered.length) await announceDelivered(db, delivered);
  return result;
}

/** One board event per yard and day whose assignments were just delivered. */
async function announceDelivered(db: Knex, assignmentIds: number[]) {
  const groups = await db("assignments as a")
    .join("work_orders as o", "o.id", "a.work_order_id")
    .whereIn("a.id", assignmentIds)
    .groupBy("o.organisation_id", "o.yard_id", "o.work_date")
    .select("o.organisation_id", "o.yard_id", "o.work_date")
    .count({ n: "*" });
  for (const g of groups as { organisation_id: number; yard_id: number; work_date: string; n: number }[]) {
    await boardEvent(db, {
      organisationId: g.organisation_id,
      yardId: g.yard_id,
      day: g.work_date,
      kind: "send",
      payload: { delivered: Number(g.n) },
    });
  }
}

// --- the loop ------------------------------------------------------------------------------------

interface LoopHandle {
  poke: () => void;
  stop: () => Promise<void>;
}

const g = globalThis as unknown as { gafflineDeliveryLoop?: LoopHandle };

/** Wakes this process's delivery loop now (after a write that queued messages). */
export function pokeDelivery() {
  g.gafflineDeliveryLoop?.poke();
}

export function deliveryLoopRunning() {
  return Boolean(g.gafflineDeliveryLoop);
}

/**
 * Drains the outbox about once a second, at once when poked, back to back while there is a
 * backlog. One per process (kept on globalThis across hot reloads); other processes run their own.
 */
export function startDeliveryLoop(getDb: () => Knex, opts: { intervalMs?: number; limit?: number } = {}): LoopHandle {
  if (g.gafflineDeliveryLoop) return g.gafflineDeliveryLoop;
  const interval = opts.intervalMs ?? 1_000;
  const limit = opts.limit ?? 50;
  let stopped = false;
  let wake: (() => void) | null = null;
  let poked = false;
  let lastLog = 0;
  let done: Promise<void> = Promise.resolve();

  const run = async () => {
    while (!stopped) {
      let full = false;
      try {
        const r = await drainOnce(getDb(), { limit });
        full = r.claimed >= limit;
      } catch (err) {
        if (Date.now() - lastLog > 30_000) {
          lastLog = Date.now();
          console.error("[outbox] delivery pass failed; retrying", describeError(err));
        }
      }
      if (stopped) break;
      if (full || poked) {
        poked = false;
        continue;
      }
      await new Promise<void>((resolve) => {
        const t = setTimeout(resolve, interval);
        wake = () => {
          clearTimeout(t);
          resolve();
        };
      });
      wake = null;
    }
  };
  done = run();
  const handle: LoopHandle = {
    poke: () => {
      poked = true;
      wake?.();
    },
    stop: async () => {
      stopped = true;
      wake?.();
      await done;
      if (g.gafflineDeliveryLoop === handle) delete g.gafflineDeliveryLoop;
    },
  };
  g.gafflineDeliveryLoop = handle;
  return handle;
}
