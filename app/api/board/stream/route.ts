import { z } from "zod";
import type { NextRequest } from "next/server";
import { getToken } from "next-auth/jwt";
import { db } from "@/lib/db";
import { ApiError, handler, readQuery } from "@/lib/api/http";
import { canAccessYard, requireRole, requireYardAccess } from "@/lib/auth/session";
import { CAN_DISPATCH } from "@/lib/users/roles";
import { useSecureCookies } from "@/lib/auth/options";
import { liveSessionUser } from "@/lib/users/data-sessions";
import { calendarDay } from "@/lib/time/days";
import { pickYard } from "@/lib/yards/data";
import { eventsSince, lastEventId } from "@/lib/events/data";
import { subscribe, toHubEvent, type HubEvent } from "@/lib/board/data-stream";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

// Server-Sent Events (issue 19): a board's events pushed as they are written, through any
// instance (lib/board/data-stream.ts follows the shared table once per process). Each event's id
// is its board_events id; a reconnecting EventSource sends Last-Event-ID and gets what came
// after it, once, in order. The session is checked again every RECHECK_MS: a signed-out or
// deactivated user's stream ends.
const RECHECK_MS = Number(process.env.BOARD_STREAM_RECHECK_MS ?? 5_000);
const PING_MS = 15_000;
/** A stream ends after this long (the browser reconnects with Last-Event-ID). */
const MAX_MS = 10 * 60_000;

const querySchema = z.object({
  yard: z.string().trim().min(1, "yard is required").max(20),
  date: calendarDay(),
  after: z.coerce.number({ error: "after must be a number" }).int().min(0).optional(),
  /** How long this stream stays open at most, in ms (tests and the route matrix use a short one). */
  maxMs: z.coerce.number({ error: "maxMs must be a number" }).int().min(100).max(MAX_MS).optional(),
});

const encoder = new TextEncoder();

export const GET = handler(async (req) => {
  const user = await requireRole(...CAN_DISPATCH, "admin");
  const q = readQuery(req, querySchema);
  const { yard } = await pickYard(db(), user.organisationId, q.yard);
  if (!yard || yard.code.toLowerCase() !== q.yard.toLowerCase()) throw new ApiError(404, `No yard with code ${q.yard}.`);
  await requireYardAccess(user, yard.id, "read");
  // Event details (worker and order ids) only for the reader's own yards; another yard's board
  // gets the bare event (id, kind, day), enough to refresh the board it may read.
  const details = await canAccessYard(user, yard.id, "contact");
  const lastId = req.headers.get("last-event-id");
  const after = lastId && /^\d{1,12}$/.test(lastId) ? Number(lastId) : (q.after ?? null);
  const token = await getToken({ req: req as NextRequest, secret: process.env.NEXTAUTH_SECRET, secureCookie: useSecureCookies });
  const sid = typeof token?.sid === "string" ? token.sid : null;
  const uid = typeof token?.uid === "number" ? token.uid : null;
  if (!sid || uid === null) throw new ApiError(401, "Sign in first.");

  const mine = (e: HubEvent) => e.organisationId === user.organisationId && (e.yardId === null || e.yardId === yard.id) && (e.day === null || e.day === q.date);
  const frame = (e: HubEvent) =>
    encoder.encode(`id: ${e.id}\nevent: board\ndata: ${JSON.stringify({ id: e.id, kind: e.kind, day: e.day, ...(details ? { payload: e.payload } : {}) })}\n\n`);

  let cleanup = () => {};
  const stream = new ReadableStream<Uint8Array>({
    async start(controller) {
      let closed = false;
      const sent = new Set<number>();
      let live = false;
      const buffered: HubEvent[] = [];
      // A write to a stream the client has gone from throws: that ends this stream's listener.
      const write = (bytes: Uint8Array) => {
        if (closed) return;
        try {
          controller.enqueue(bytes);
        } catch {
          close();
        }
      };
      const send = (e: HubEvent) => {
        if (closed || sent.has(e.id)) return;
        sent.add(e.id);
        if (sent.size > 5000) for (const id of [...sent].slice(0, 2500)) sent.delete(id);
        write(frame(e));
      };
      const sub = subscribe(db(), (e) => {
        if (!mine(e)) return;
        if (live) send(e);
        else buffered.push(e);
      });
      const timers: ReturnType<typeof setInterval>[] = [];
      const close = (reason?: string) => {
        if (closed) return;
        if (reason) write(encoder.encode(`event: end\ndata: ${JSON.stringify({ reason })}\n\n`));
        closed = true;
        sub.unsubscribe();
        for (const t of timers) clearInterval(t);
        try {
          controller.close();
        } catch {
          /* already closed by the client */
        }
      };
      cleanup = () => close();
      req.signal.addEventListener("abort", () => close());
      try {
        write(encoder.encode(`retry: 1000\n: open\n\n`));
        await sub.ready;
        // What the browser missed: every event after its last id, from the table (in id order);
        // then what the follower hands out (each id once: `sent`).
        let cursor = after;
        if (cursor === null) cursor = await lastEventId(db(), user.organisationId);
        for (;;) {
          const page = await eventsSince(db(), user.organisationId, cursor, yard.id, q.date);
          for (const r of page.events) send(toHubEvent({ ...r, organisation_id: user.organisationId, yard_id: yard.id, day: q.date }));
          if (page.events.length < 200) break;
          cursor = page.cursor;
        }
        live = true;
        for (const e of buffered.sort((a, b) => a.id - b.id)) send(e);
        buffered.length = 0;
      } catch (err) {
        console.error("[board stream] could not start", err);
        return close("error");
      }
      timers.push(setInterval(() => write(encoder.encode(`: ping\n\n`)), PING_MS));
      timers.push(
        setInterval(async () => {
          try {
            const who = await liveSessionUser(db(), sid, uid, user.role);
            if (!who) close("signed out");
          } catch {
            /* the database is unreachable: keep the stream; the next check decides */
          }
        }, RECHECK_MS),
      );
      const ttl = setTimeout(() => close(), q.maxMs ?? MAX_MS);
      timers.push(ttl as unknown as ReturnType<typeof setInterval>);
    },
    cancel() {
      cleanup();
    },
  });
  return new Response(stream, {
    status: 200,
    headers: {
      "content-type": "text/event-stream; charset=utf-8",
      "cache-control": "no-cache, no-transform",
      connection: "keep-alive",
      "x-accel-buffering": "no",
    },
  });
});
