// The phone's queue of field actions (issue 20), client-safe and free of browser globals: the
// store (IndexedDB through idb in lib/offline/store.ts, a Map in the unit tests) and the
// transport (fetch) are passed in.
//
// - Every action gets its idempotency key when it is entered, and keeps it on every attempt,
//   so the server runs it once however often it is sent (lib/offline/data.ts).
// - Actions go in the order they were entered (the store's sequence), one at a time. The first
//   that cannot go stops the run and everything behind it waits: no signal, a 5xx or "still in
//   progress" (tried again later), or an expired sign-in (kept until the user signs in again).
// - An answer the server gives (2xx) is final: the action leaves the queue. A refusal (403,
//   404, 409, 422: the order went on hold meanwhile, the crew changed, a newer round) is final
//   too: the server's state wins, and the action is kept as "refused" with the server's words
//   until the user has seen it.
// - A photo taken offline is an action of its own; the briefing save or hold that refers to it
//   carries a placeholder { $photo: key } that becomes the file's id once the photo is in.
// - A briefing save or hold entered after another one of the same order was built on it: when
//   the first goes through, the next inherits the briefing's new version.

export type ActionKind = "briefing.save" | "briefing.hold" | "briefing.photo" | "briefing.ack" | "assignment.respond";

export interface QueuedFile {
  blob: Blob;
  name: string;
}

export interface QueuedAction {
  /** The store's sequence number: the order of entry. */
  seq?: number;
  /** The Idempotency-Key, fixed when the action is entered. */
  key: string;
  userId: number;
  kind: ActionKind;
  orderId: number | null;
  /** What it is, in plain words ("Gear check and acknowledgement, WO-26-0101"). */
  label: string;
  url: string;
  method: "POST" | "PUT";
  body?: unknown;
  file?: QueuedFile;
  /** When it was entered on the phone (ISO). */
  createdAt: string;
  attempts: number;
  lastError: string | null;
  state: "queued" | "refused";
  /** For a refusal: the server's status and message. */
  refusal?: { status: number; message: string };
}

export interface QueueStore {
  add(action: QueuedAction): Promise<number>;
  /** Every action, in the order of entry. */
  all(): Promise<QueuedAction[]>;
  put(action: QueuedAction): Promise<void>;
  remove(seq: number): Promise<void>;
}

export interface SendResult {
  status: number;
  body: unknown;
}

/** Sends one action; throws when no answer came (no signal). */
export type Transport = (action: QueuedAction) => Promise<SendResult>;

export type StopReason = "offline" | "server" | "signin";

export interface FlushReport {
  sent: { action: QueuedAction; result: SendResult }[];
  refused: { action: QueuedAction; result: SendResult }[];
  stopped: StopReason | null;
  /** The action the run stopped at, still queued. */
  stoppedAt: QueuedAction | null;
  /** Queued actions of this user left after the run. */
  left: number;
}

export function newKey(): string {
  const c = (globalThis as { crypto?: Crypto }).crypto;
  if (c?.randomUUID) return c.randomUUID();
  const bytes = new Uint8Array(16);
  c!.getRandomValues(bytes);
  return Array.from(bytes, (b) => b.toString(16).padStart(2, "0")).join("");
}

export function newAction(input: Omit<QueuedAction, "key" | "createdAt" | "attempts" | "lastError" | "state">, now = new Date()): QueuedAction {
  return { ...input, key: newKey(), createdAt: now.toISOString(), attempts: 0, lastError: null, state: "queued" };
}

const messageOf = (body: unknown, fallback: string) =>
  body && typeof body === "object" && typeof (body as { error?: unknown }).error === "string" ? (body as { error: string }).error : fallback;

/** Worth another try later: no answer, a server fault, a rate limit, or the same key still running. */
export function retryable(result: SendResult) {
  if (result.status >= 500 || result.status === 429 || result.status === 408) return true;
  return result.status === 409 && (result.body as { reason?: unknown } | null)?.reason === "in_progress";
}

/** Replaces every { $photo: key } in a body with the value `resolve` gives for the key. */
export function resolvePhotos(body: unknown, resolve: (key: string) => number | null | undefined): unknown {
  if (Array.isArray(body)) return body.map((v) => resolvePhotos(v, resolve));
  if (body && typeof body === "object") {
    const o = body as Record<string, unknown>;
    if (typeof o.$photo === "string" && Object.keys(o).length === 1) {
      const v = resolve(o.$photo);
      return v === undefined ? o : v;
    }
    return Object.fromEntries(Object.entries(o).map(([k, v]) => [k, resolvePhotos(v, resolve)]));
  }
  return body;
}

/** The keys of the photos a body still waits for. */
export function photoRefs(body: unknown, out = new Set<string>()): Set<string> {
  if (Array.isArray(body)) body.forEach((v) => photoRefs(v, out));
  else if (body && typeof body === "object") {
    const o = body as Record<string, unknown>;
    if (typeof o.$photo === "string" && Object.keys(o).length === 1) out.add(o.$photo);
    else Object.values(o).forEach((v) => photoRefs(v, out));
  }
  return out;
}

const versionOf = (body: unknown) => (body && typeof body === "object" ? (body as { version?: unknown }).version : undefined);
const isBriefingWrite = (a: QueuedAction) => a.kind === "briefing.save" || a.kind === "briefing.hold";

/** After an action went through, the actions behind it that depend on it are brought up to date. */
async function carryForward(store: QueueStore, done: QueuedAction, result: SendResult, rest: QueuedAction[]) {
  const fileId = done.kind === "briefing.photo" ? Number((result.body as { file?: { id?: unknown } } | null)?.file?.id) : NaN;
  const newVersion = isBriefingWrite(done) ? Number((result.body as { briefing?: { version?: unknown } | null } | null)?.briefing?.version) : NaN;
  const sentVersion = versionOf(done.body);
  for (const next of rest) {
    let body = next.body;
    if (done.kind === "briefing.photo") {
      // A refused photo leaves the item without one (null), so the record itself still goes.
      body = resolvePhotos(body, (k) => (k === done.key ? (Number.isInteger(fileId) && fileId > 0 ? fileId : null) : undefined));
    }
    if (isBriefingWrite(done) && isBriefingWrite(next) && next.orderId === done.orderId && Number.isInteger(newVersion) && versionOf(body) === sentVersion) {
      body = { ...(body as object), version: newVersion };
    }
    if (body !== next.body) {
      next.body = body;
      await store.put(next);
    }
  }
}

/** Sends this user's queued actions in order of entry; see the top of the file. */
export async function flush(store: QueueStore, send: Transport, userId: number): Promise<FlushReport> {
  const report: FlushReport = { sent: [], refused: [], stopped: null, stoppedAt: null, left: 0 };
  const mine = (await store.all()).filter((a) => a.userId === userId && a.state === "queued");
  for (let i = 0; i < mine.length; i++) {
    const action = mine[i];
    let result: SendResult;
    try {
      result = await send(action);
    } catch (err) {
      action.attempts += 1;
      action.lastError = err instanceof Error && err.message ? `Not sent: ${err.message}` : "Not sent: no signal.";
      await store.put(action);
      report.stopped = "offline";
      report.stoppedAt = action;
      break;
    }
    if (result.status === 401) {
      action.lastError = "Sign in again to send this.";
      await store.put(action);
      report.stopped = "signin";
      report.stoppedAt = action;
      break;
    }
    if (retryable(result)) {
      action.attempts += 1;
      action.lastError = messageOf(result.body, `The server answered ${result.status}; tried again later.`);
      await store.put(action);
      report.stopped = "server";
      report.stoppedAt = action;
      break;
    }
    const rest = mine.slice(i + 1);
    if (result.status >= 200 && result.status < 300) {
      await carryForward(store, action, result, rest);
      await store.remove(action.seq!);
      report.sent.push({ action, result });
    } else {
      if (action.kind === "briefing.photo") await carryForward(store, action, result, rest);
      action.state = "refused";
      action.refusal = { status: result.status, message: messageOf(result.body, `Refused (${result.status}).`) };
      action.file = undefined;
      await store.put(action);
      report.refused.push({ action, result });
    }
  }
  report.left = (await store.all()).filter((a) => a.userId === userId && a.state === "queued").length;
  return report;
}

/** A store in memory, for tests and for a browser without IndexedDB. */
export function memoryStore(): QueueStore & { rows: Map<number, QueuedAction> } {
  const rows = new Map<number, QueuedAction>();
  let seq = 0;
  const copy = (a: QueuedAction): QueuedAction => ({ ...a, body: structuredClone(a.body), refusal: a.refusal && { ...a.refusal } });
  return {
    rows,
    async add(a) {
      seq += 1;
      rows.set(seq, copy({ ...a, seq }));
      return seq;
    },
    async all() {
      return [...rows.keys()].sort((x, y) => x - y).map((k) => copy(rows.get(k)!));
    },
    async put(a) {
      if (a.seq === undefined || !rows.has(a.seq)) throw new Error("no such queued action");
      rows.set(a.seq, copy(a));
    },
    async remove(s) {
      rows.delete(s);
    },
  };
}
