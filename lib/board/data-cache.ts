import "@/lib/server-only";
import { createHash } from "node:crypto";
import type { Knex } from "knex";
import type { BoardPayload } from "@/lib/board/model";
import { markOnCall, prepareBoardDay } from "@/lib/board/data-extras";
import { loadBoard } from "./data";
import { latestEventId } from "@/lib/events/data";
import type { Yard } from "@/lib/yards/data";


// A day's board is the same for every dispatcher of the organisation until something changes,
// and every change writes a board event. So a board built for (yard, day, latest event id) can be
// served again, already serialised, until the next event — checked with one
// indexed query against the shared table, so every app instance stays correct. The minute is
// part of the key (5 s buckets) because "no reply" flags depend on the clock, and so that a write
// made straight to the database by a script shows within seconds.

interface Entry {
  payload: BoardPayload;
  json: string;
  etag: string;
}

const MAX_ENTRIES = 8;
const g = globalThis as unknown as { gafflineBoardCache?: Map<string, Promise<Entry>> };
const cache = (g.gafflineBoardCache ??= new Map());

export async function boardFor(db: Knex, opts: { organisationId: number; yard: Yard; yards: Yard[]; day: string }): Promise<Entry> {
  const cursor = await latestEventId(db, opts.organisationId);
  const key = `${opts.organisationId}|${opts.yard.id}|${opts.day}|${cursor}|${Math.floor(Date.now() / 5_000)}`;
  let entry = cache.get(key);
  if (!entry) {
    entry = build(db, opts, key);
    cache.set(key, entry);
    entry.catch(() => cache.delete(key));
    while (cache.size > MAX_ENTRIES) cache.delete(cache.keys().next().value!);
  }
  return entry;
}

async function build(db: Knex, opts: { organisationId: number; yard: Yard; yards: Yard[]; day: string }, key: string): Promise<Entry> {
  // Recurring orders are materialised when a board is built; creating a series writes an event,
  // so a board cached before it is never served after it.
  await prepareBoardDay(db, opts.organisationId, opts.yard.id, opts.day);
  const payload = await loadBoard(db, opts);
  await markOnCall(db, payload);
  const json = JSON.stringify(payload);
  return { payload, json, etag: `"${createHash("sha1").update(key).digest("base64url")}"` };
}
