// Slim board answers (issue 19): a board the browser already holds is brought up to date with a
// patch — only the entities that changed since the version it holds — instead of the whole
// 1.4 MB answer again. Pure and client-safe: the server computes a digest of each board version
// it serves (a hash per entity) and diffs the current board against the digest of the version
// the browser names; the browser applies the patch to the board it keeps. The pool's rule
// snapshot (credentials, gear, rest history in `snapshot.workers`) therefore travels once per
// board session and then only for the workers whose records changed.
import type { BoardPayload } from "./model";

type Obj = Record<string, unknown>;

/** Arrays diffed entity by entity (by their key); every other field is replaced whole when it changed. */
const COLLECTIONS: { path: string; key: (x: Obj) => string }[] = [
  { path: "orders", key: (x) => String(x.id) },
  { path: "pool", key: (x) => String(x.id) },
  { path: "overrides", key: (x) => String(x.id) },
  // Findings of a 400-order day are a few hundred kB: one by one too (keys that repeat → whole).
  { path: "findings", key: (x) => `${x.rule}|${x.workOrderId}|${x.workerId ?? ""}|${x.equipmentId ?? ""}` },
  { path: "equipment", key: (x) => String(x.id) },
  { path: "equipmentBookings", key: (x) => String(x.id) },
  { path: "snapshot.workers", key: (x) => String(x.id) },
  { path: "snapshot.workOrders", key: (x) => String(x.id) },
  { path: "snapshot.assignments", key: (x) => `${x.workOrderId}|${x.workerId}|${x.position}` },
  { path: "snapshot.equipment", key: (x) => String(x.id) },
];
const COLLECTION_PATHS = new Set(COLLECTIONS.map((c) => c.path));

export interface CollectionDigest {
  keys: string[];
  hashes: Map<string, string>;
}

export interface BoardDigest {
  /** Top-level fields (and `snapshot.<field>`) other than the collections: hash of each. */
  fields: Map<string, string>;
  /** null when the collection is absent or its keys are not unique (then it is sent whole). */
  collections: Map<string, CollectionDigest | null>;
}

export type CollectionPatch = { upsert: unknown[]; remove: string[]; order?: string[] };

export interface BoardPatch {
  /** The version the patch applies to, and the version it produces. */
  from: string;
  version: string;
  /** Fields replaced whole ("snapshot.x" for the snapshot's own fields); undefined = removed. */
  set: Record<string, unknown>;
  unset: string[];
  collections: Record<string, CollectionPatch>;
}

function get(board: Obj, path: string): unknown {
  const [a, b] = path.split(".");
  const top = board[a];
  return b === undefined ? top : top && typeof top === "object" ? (top as Obj)[b] : undefined;
}

/** Every replace-whole field of a board: top-level ones and the snapshot's own, without the collections. */
function plainFields(board: Obj): [string, unknown][] {
  const out: [string, unknown][] = [];
  for (const [k, v] of Object.entries(board)) {
    if (k === "snapshot" && v && typeof v === "object") {
      for (const [sk, sv] of Object.entries(v as Obj)) if (!COLLECTION_PATHS.has(`snapshot.${sk}`)) out.push([`snapshot.${sk}`, sv]);
    } else if (!COLLECTION_PATHS.has(k)) out.push([k, v]);
  }
  return out;
}

/** The digest of a board: `hash` maps an entity's JSON to a short fingerprint (sha1 on the server). */
export function digestBoard(board: BoardPayload, hash: (json: string) => string): BoardDigest {
  const b = board as unknown as Obj;
  const fields = new Map<string, string>();
  for (const [k, v] of plainFields(b)) if (v !== undefined) fields.set(k, hash(JSON.stringify(v)));
  const collections = new Map<string, CollectionDigest | null>();
  for (const c of COLLECTIONS) {
    const arr = get(b, c.path);
    if (!Array.isArray(arr)) {
      collections.set(c.path, null);
      continue;
    }
    const keys = arr.map((x) => c.key(x as Obj));
    const hashes = new Map<string, string>();
    arr.forEach((x, i) => hashes.set(keys[i], hash(JSON.stringify(x))));
    // Keys that repeat cannot be patched one by one: such a collection travels whole.
    collections.set(c.path, hashes.size === keys.length ? { keys, hashes } : null);
  }
  return { fields, collections };
}

/** What turns the board whose digest is `base` into `current` (whose digest is `now`). */
export function diffBoard(base: BoardDigest, current: BoardPayload, now: BoardDigest, from: string, version: string): BoardPatch {
  const c = current as unknown as Obj;
  const set: Record<string, unknown> = {};
  const unset: string[] = [];
  for (const [k, v] of plainFields(c)) {
    if (v === undefined) continue;
    if (base.fields.get(k) !== now.fields.get(k)) set[k] = v;
  }
  for (const k of base.fields.keys()) if (!now.fields.has(k)) unset.push(k);
  const collections: Record<string, CollectionPatch> = {};
  for (const spec of COLLECTIONS) {
    const was = base.collections.get(spec.path) ?? null;
    const is = now.collections.get(spec.path) ?? null;
    const arr = get(c, spec.path) as Obj[] | undefined;
    if (!is || !was) {
      // Whole: absent before or now, or keys that repeat.
      if (arr !== undefined) set[spec.path] = arr;
      else if (was) unset.push(spec.path);
      continue;
    }
    const upsert: unknown[] = [];
    const added: string[] = [];
    is.keys.forEach((k, i) => {
      const h = was.hashes.get(k);
      if (h === undefined) added.push(k);
      if (h !== is.hashes.get(k)) upsert.push(arr![i]);
    });
    const remove = was.keys.filter((k) => !is.hashes.has(k));
    // The order the browser would get by keeping its own order and appending new keys; the
    // real order travels only when it differs.
    const removed = new Set(remove);
    const naive = [...was.keys.filter((k) => !removed.has(k)), ...added];
    const sameOrder = naive.length === is.keys.length && naive.every((k, i) => k === is.keys[i]);
    if (upsert.length || remove.length || !sameOrder) collections[spec.path] = sameOrder ? { upsert, remove } : { upsert, remove, order: is.keys };
  }
  return { from, version, set, unset, collections };
}

/** The browser's side: the board it holds with the patch applied (a new object; `base` is not changed). */
export function applyBoardPatch(base: BoardPayload, patch: BoardPatch): BoardPayload {
  const out: Obj = { ...(base as unknown as Obj) };
  const snapshot: Obj = { ...(base.snapshot as unknown as Obj) };
  const put = (path: string, v: unknown) => {
    const [a, b] = path.split(".");
    if (b === undefined) out[a] = v;
    else snapshot[b] = v;
  };
  const drop = (path: string) => {
    const [a, b] = path.split(".");
    if (b === undefined) delete out[a];
    else delete snapshot[b];
  };
  for (const [k, v] of Object.entries(patch.set)) put(k, v);
  for (const k of patch.unset) drop(k);
  for (const spec of COLLECTIONS) {
    const p = patch.collections[spec.path];
    if (!p) continue;
    const [a, b] = spec.path.split(".");
    const current = (b === undefined ? out[a] : snapshot[b]) as Obj[];
    const byKey = new Map(current.map((x) => [spec.key(x), x as unknown]));
    for (const k of p.remove) byKey.delete(k);
    const added: string[] = [];
    for (const x of p.upsert) {
      const k = spec.key(x as Obj);
      if (!byKey.has(k)) added.push(k);
      byKey.set(k, x);
    }
    const order = p.order ?? [...current.map((x) => spec.key(x)).filter((k) => byKey.has(k)), ...added];
    put(spec.path, order.map((k) => byKey.get(k)));
  }
  // Untouched, the snapshot keeps its identity: the browser's rule engine is not rebuilt.
  const touched = [...Object.keys(patch.set), ...patch.unset, ...Object.keys(patch.collections)].some((k) => k.startsWith("snapshot."));
  out.snapshot = touched ? snapshot : base.snapshot;
  return out as unknown as BoardPayload;
}
