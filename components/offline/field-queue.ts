"use client";

// The phone's queue in React (issue 20): submitAction() enters an action (with its idempotency
// key and time of entry) and, with signal, sends the queue at once; useFieldQueue() follows the
// queue and the state of the last run for the panels. One run at a time per page.
import { useEffect, useState, useSyncExternalStore } from "react";
import { IDEMPOTENCY_HEADER } from "@/lib/offline/model";
import { flush, memoryStore, newAction, type FlushReport, type QueuedAction, type QueueStore, type SendResult, type StopReason } from "@/lib/offline/queue";
import { idbStore } from "@/lib/offline/store";

let fallback: QueueStore | null = null;
function store(): QueueStore {
  if (typeof indexedDB !== "undefined") return idbStore;
  return (fallback ??= memoryStore());
}

async function transport(a: QueuedAction): Promise<SendResult> {
  const headers: Record<string, string> = { [IDEMPOTENCY_HEADER]: a.key };
  let body: BodyInit | undefined;
  if (a.file) {
    const fd = new FormData();
    fd.append("file", a.file.blob, a.file.name);
    body = fd;
  } else if (a.body !== undefined) {
    headers["content-type"] = "application/json";
    body = JSON.stringify(a.body);
  }
  const res = await fetch(a.url, { method: a.method, headers, body, credentials: "same-origin", cache: "no-store" });
  return { status: res.status, body: await res.json().catch(() => null) };
}

// --- shared state (module level: every panel and form of the page sees the same queue) -----------

export interface QueueState {
  actions: QueuedAction[];
  stopped: StopReason | null;
  /** Actions entered earlier that the last runs delivered, with the server's answer. */
  delivered: { action: QueuedAction; result: SendResult }[];
  running: boolean;
  /** The queue has been read from the store at least once. */
  loaded: boolean;
}

let state: QueueState = { actions: [], stopped: null, delivered: [], running: false, loaded: false };
const listeners = new Set<() => void>();
const set = (patch: Partial<QueueState>) => {
  state = { ...state, ...patch };
  listeners.forEach((l) => l());
};
/** Keys entered by a form that is waiting for the answer itself (not announced again). */
const foreground = new Set<string>();

async function reload(userId: number) {
  const all = await store().all();
  set({ actions: all.filter((a) => a.userId === userId), loaded: true });
}

let running: Promise<FlushReport> | null = null;
/** Every answer a run got, by key: the form that entered an action finds its answer here, whichever run sent it. */
const answers = new Map<string, { kind: "sent" | "refused"; result: SendResult }>();

/** Sends this user's queue now (after a run in progress, if any). */
export async function sendQueue(userId: number): Promise<FlushReport> {
  while (running) await running.catch(() => {});
  set({ running: true });
  running = flush(store(), transport, userId);
  try {
    const report = await running;
    for (const s of report.sent) answers.set(s.action.key, { kind: "sent", result: s.result });
    for (const r of report.refused) answers.set(r.action.key, { kind: "refused", result: r.result });
    const delivered = [...report.sent, ...report.refused].filter((d) => !foreground.has(d.action.key));
    set({ stopped: report.stopped, delivered: delivered.length ? [...state.delivered, ...delivered].slice(-8) : state.delivered });
    return report;
  } finally {
    running = null;
    set({ running: false });
    await reload(userId);
  }
}

export type Outcome =
  | { kind: "sent"; result: SendResult }
  | { kind: "refused"; result: SendResult }
  | { kind: "queued"; action: QueuedAction; reason: StopReason };

export type ActionInput = Omit<QueuedAction, "key" | "createdAt" | "attempts" | "lastError" | "state" | "seq">;

/**
 * Enters an action on the phone. With signal the queue is sent at once and the form gets the
 * server's answer (a refusal is taken off the queue: the form shows it as before). Without,
 * or when the queue cannot go, the action stays "saved on this phone, not yet sent".
 */
export async function submitAction(input: ActionInput): Promise<Outcome> {
  const action = newAction(input);
  action.seq = await store().add(action);
  await reload(input.userId);
  if (typeof navigator !== "undefined" && navigator.onLine === false) return { kind: "queued", action, reason: "offline" };
  foreground.add(action.key);
  try {
    // Another run (the page's own, on a timer or the online event) may have sent it first.
    const report = await sendQueue(input.userId);
    const answer = answers.get(action.key);
    answers.delete(action.key);
    if (answer?.kind === "sent") return { kind: "sent", result: answer.result };
    if (answer?.kind === "refused") {
      await store().remove(action.seq);
      await reload(input.userId);
      return { kind: "refused", result: answer.result };
    }
    foreground.delete(action.key); // it waits in the queue: announce it when it goes
    return { kind: "queued", action, reason: report.stopped ?? "offline" };
  } catch {
    foreground.delete(action.key);
    return { kind: "queued", action, reason: "offline" };
  }
}

export async function dismissAction(userId: number, seq: number) {
  await store().remove(seq);
  await reload(userId);
}

export function clearDelivered() {
  set({ delivered: [] });
}

const subscribe = (l: () => void) => {
  listeners.add(l);
  return () => listeners.delete(l);
};
const server: QueueState = { actions: [], stopped: null, delivered: [], running: false, loaded: false };

/** The queue of this user, kept current; loads it on mount. */
export function useFieldQueue(userId: number | null): QueueState {
  const s = useSyncExternalStore(subscribe, () => state, () => server);
  useEffect(() => {
    if (userId !== null) void reload(userId).catch(() => {});
  }, [userId]);
  return s;
}

/** navigator.onLine, following the online/offline events. */
export function useOnline(): boolean {
  const [online, setOnline] = useState(true);
  useEffect(() => {
    const update = () => setOnline(navigator.onLine);
    update();
    window.addEventListener("online", update);
    window.addEventListener("offline", update);
    return () => {
      window.removeEventListener("online", update);
      window.removeEventListener("offline", update);
    };
  }, []);
  return online;
}

export const fmtEntered = (iso: string) => new Intl.DateTimeFormat("en-US", { hour: "2-digit", minute: "2-digit", hour12: false, month: "short", day: "numeric" }).format(new Date(iso));
