// Serving the board (issue 19): each board version is narrowed for its readers (phones of other
// yards' workers hidden), serialised, digested and gzip-compressed ONCE, then answered from
// memory until the next change: a full answer on a cold start or a gap, otherwise a patch from
// the version the browser holds (lib/board/patch.ts), also compressed once per (from, to).
// Per app instance: another instance that never served the browser's version answers in full.
import "@/lib/server-only";
import { createHash } from "node:crypto";
import { gzipSync } from "node:zlib";
import type { Knex } from "knex";
import { boardFor } from "@/lib/board/data-cache";
import type { Yard } from "@/lib/yards/data";
import { digestBoard, diffBoard, type BoardDigest } from "./patch";
import type { BoardPayload } from "./model";

/** A browser this many organisation events behind (or more) gets the whole board again. */
export const MAX_EVENTS_BEHIND = 500;
/** Versions of one board (per reader group) this instance remembers digests of. */
const VERSIONS_KEPT = 24;
const VARIANTS_KEPT = 12;
const PATCHES_KEPT = 64;

export interface Body {
  json: string;
  gzip: () => Buffer;
}

export interface Variant {
  payload: BoardPayload;
  version: string;
  full: Body;
  digest: BoardDigest;
}

const sha = (s: string) => createHash("sha1").update(s).digest("base64url");

function body(json: string): Body {
  let gz: Buffer | null = null;
  return { json, gzip: () => (gz ??= gzipSync(json, { level: 6 })) };
}

interface Store {
  variants: Map<string, Promise<Variant>>;
  /** board key (org|yard|day|readers) → version → digest and cursor */
  versions: Map<string, Map<string, { digest: BoardDigest; cursor: number }>>;
  patches: Map<string, Body>;
}
const g = globalThis as unknown as { gafflineBoardServe?: Store };
const store: Store = (g.gafflineBoardServe ??= { variants: new Map(), versions: new Map(), patches: new Map() });

function trim<K, V>(m: Map<K, V>, max: number) {
  while (m.size > max) m.delete(m.keys().next().value as K);
}

/** Which workers' phones this reader may see: "all" or the yard ids (issue 15, finding 9). */
export type ReaderYards = number[] | "all";

function narrow(payload: BoardPayload, yards: ReaderYards): BoardPayload {
  if (yards === "all") return payload;
  const own = new Set(yards.map(Number));
  return { ...payload, pool: payload.pool.map((p) => (own.has(Number(p.yardId)) || p.phone === null ? p : { ...p, phone: null })) };
}

export interface BoardRef {
  organisationId: number;
  yard: Yard;
  yards: Yard[];
  day: string;
}

/** The current version of a board for a group of readers, narrowed, serialised once. */
export async function currentVariant(db: Knex, ref: BoardRef, readers: ReaderYards): Promise<Variant> {
  const built = await boardFor(db, ref);
  const readersKey = readers === "all" ? "all" : [...readers].sort((a, b) => a - b).join(",");
  const vkey = `${built.etag}|${readersKey}`;
  let v = store.variants.get(vkey);
  if (!v) {
    v = (async () => {
      const payload = narrow(built.payload, readers);
      const json = readers === "all" ? built.json : JSON.stringify(payload);
      const version = sha(vkey);
      // Digested now (one pass, about 20 ms on the bench day) so that only hashes, not the
      // payload, are kept for the versions a browser may still hold.
      const variant: Variant = { payload, version, full: body(json), digest: digestBoard(payload, sha) };
      const bkey = `${ref.organisationId}|${ref.yard.id}|${ref.day}|${readersKey}`;
      const versions = store.versions.get(bkey) ?? new Map();
      store.versions.delete(bkey);
      store.versions.set(bkey, versions);
      trim(store.versions, 64);
      versions.set(version, { digest: variant.digest, cursor: payload.cursor });
      trim(versions, VERSIONS_KEPT);
      return variant;
    })();
    store.variants.set(vkey, v);
    v.catch(() => store.variants.delete(vkey));
    trim(store.variants, VARIANTS_KEPT);
  }
  return v;
}

export interface PatchAnswer {
  kind: "patch";
  body: Body;
  version: string;
}
export interface FullAnswer {
  kind: "full";
  body: Body;
  version: string;
  /** Why the answer is full: "cold" (no version given), "gap" (unknown here, or too far behind). */
  reason: "cold" | "gap";
}

/**
 * The answer for a browser that holds version `since` (cursor `sinceCursor`) of this board:
 * a patch when this instance knows that version and it is not too far behind, else the full board.
 */
export async function boardAnswer(db: Knex, ref: BoardRef, readers: ReaderYards, since?: { version: string; cursor: number }): Promise<PatchAnswer | FullAnswer> {
  const current = await currentVariant(db, ref, readers);
  if (!since) return { kind: "full", body: current.full, version: current.version, reason: "cold" };
  if (since.version === current.version) {
    const same = current.digest;
    return { kind: "patch", body: patchBody(`${since.version}>${current.version}`, () => diffBoard(same, current.payload, same, since.version, current.version)), version: current.version };
  }
  const readersKey = readers === "all" ? "all" : [...readers].sort((a, b) => a - b).join(",");
  const known = store.versions.get(`${ref.organisationId}|${ref.yard.id}|${ref.day}|${readersKey}`)?.get(since.version);
  if (!known || known.cursor !== since.cursor || current.payload.cursor - since.cursor > MAX_EVENTS_BEHIND) {
    return { kind: "full", body: current.full, version: current.version, reason: "gap" };
  }
  return { kind: "patch", body: patchBody(`${since.version}>${current.version}`, () => diffBoard(known.digest, current.payload, current.digest, since.version, current.version)), version: current.version };
}

function patchBody(key: string, make: () => ReturnType<typeof diffBoard>): Body {
  let b = store.patches.get(key);
  if (!b) {
    b = body(JSON.stringify(make()));
    store.patches.set(key, b);
    trim(store.patches, PATCHES_KEPT);
  }
  return b;
}
