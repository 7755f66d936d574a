// One follower of the board_events table per app instance (issue 19): while at least one board
// stream is open, a single query every POLL_MS reads the rows after the last settled id and
// hands each new row to every open stream of this process, whichever instance wrote it. Cost:
// one indexed range query per tick per instance, whatever the number of open boards.
//
// Ids are handed out at insert but become visible at commit, so a row with a lower id can appear
// after a higher one (two writers committing out of order, or Galera's per-node auto-increment
// steps). The follower therefore re-reads from the lowest id it has not settled: a missing id
// stays open for HOLE_MS (a rolled-back insert never appears), and a late row is still handed
// out once when it appears.
import "@/lib/server-only";
import type { Knex } from "knex";

export interface HubEvent {
  id: number;
  organisationId: number;
  yardId: number | null;
  day: string | null;
  kind: string;
  payload: unknown;
}

type Listener = (e: HubEvent) => void;

export const POLL_MS = Number(process.env.BOARD_EVENTS_POLL_MS ?? 100);
const HOLE_MS = 5_000;
const BATCH = 500;

interface Hub {
  listeners: Set<Listener>;
  timer: ReturnType<typeof setTimeout> | null;
  /** Every id ≤ low is settled (handed out, or given up as never committed). */
  low: number;
  ready: Promise<void> | null;
  handed: Set<number>;
  holes: Map<number, number>;
  ticks: number;
}

const g = globalThis as unknown as { gafflineEventHub?: Hub };
const hub: Hub = (g.gafflineEventHub ??= { listeners: new Set(), timer: null, low: 0, ready: null, handed: new Set(), holes: new Map(), ticks: 0 });

function parsePayload(p: unknown) {
  if (typeof p !== "string") return p ?? null;
  try {
    return JSON.parse(p);
  } catch {
    return null;
  }
}

export function toHubEvent(r: Record<string, unknown>): HubEvent {
  const day = r.day instanceof Date ? r.day.toISOString().slice(0, 10) : (r.day as string | null);
  return {
    id: Number(r.id),
    organisationId: Number(r.organisation_id),
    yardId: r.yard_id === null ? null : Number(r.yard_id),
    day: day ?? null,
    kind: String(r.kind),
    payload: parsePayload(r.payload),
  };
}

async function tick(db: Knex) {
  hub.ticks++;
  const rows = await db("board_events").where("id", ">", hub.low).orderBy("id").limit(BATCH).select("id", "organisation_id", "yard_id", "day", "kind", "payload");
  let maxSeen = hub.low;
  for (const r of rows) {
    const e = toHubEvent(r);
    maxSeen = Math.max(maxSeen, e.id);
    if (hub.handed.has(e.id)) continue;
    hub.handed.add(e.id);
    hub.holes.delete(e.id);
    for (const l of hub.listeners) {
      try {
        l(e);
      } catch {
        /* one stream's failure is its own */
      }
    }
  }
  // Settle: walk up from low over handed-out ids and holes older than HOLE_MS.
  const now = Date.now();
  let n = hub.low + 1;
  while (n <= maxSeen) {
    if (hub.handed.has(n)) {
      hub.handed.delete(n);
    } else {
      const since = hub.holes.get(n) ?? now;
      hub.holes.set(n, since);
      if (now - since < HOLE_MS) break;
      hub.holes.delete(n);
    }
    hub.low = n;
    n++;
  }
  // Holes above the first open one are remembered with their first sight too.
  for (let k = n + 1; k < maxSeen; k++) if (!hub.handed.has(k) && !hub.holes.has(k)) hub.holes.set(k, now);
}

function schedule(db: Knex) {
  hub.timer = setTimeout(async () => {
    try {
      await tick(db);
    } catch {
      /* database unreachable: try again next tick */
    }
    if (hub.listeners.size) schedule(db);
    else stop();
  }, POLL_MS);
  hub.timer.unref?.();
}

function stop() {
  if (hub.timer) clearTimeout(hub.timer);
  hub.timer = null;
  hub.ready = null;
  hub.handed.clear();
  hub.holes.clear();
}

/**
 * Subscribe to every board event this instance sees from now on. `ready` resolves once the
 * follower has its starting point: every row committed after that reaches the listener.
 */
export function subscribe(db: Knex, listener: Listener): { ready: Promise<void>; unsubscribe: () => void } {
  hub.listeners.add(listener);
  if (!hub.ready) {
    hub.ready = (async () => {
      const row = await db("board_events").max({ id: "id" }).first();
      hub.low = Number(row?.id ?? 0);
      if (!hub.timer) schedule(db);
    })();
    hub.ready.catch(() => (hub.ready = null));
  }
  return {
    ready: hub.ready,
    unsubscribe: () => {
      hub.listeners.delete(listener);
    },
  };
}

/** For tests and the health of the follower: how many streams listen, ticks so far. */
export function hubStats() {
  return { listeners: hub.listeners.size, running: hub.timer !== null, ticks: hub.ticks, low: hub.low };
}
