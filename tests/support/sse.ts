// A Server-Sent Events reader for tests (the text/event-stream format of the HTML Living
// Standard, "Server-sent events" §9.2: fields id/event/data/retry, a blank line ends an event,
// lines starting with ':' are comments). Reads one stream over a signed-in Client.
import type { Client } from "./client";

export interface SseEvent {
  id: string | null;
  event: string;
  data: string;
  at: number;
}

export interface SseStream {
  status: number;
  contentType: string | null;
  events: SseEvent[];
  /** Resolves when `n` events of type `type` have arrived (rejects after `timeoutMs`). */
  waitFor: (n: number, timeoutMs?: number, type?: string) => Promise<SseEvent[]>;
  /** The id of the last event received (what a browser sends back as Last-Event-ID). */
  lastId: () => string | null;
  ended: Promise<void>;
  close: () => void;
}

export async function openStream(c: Client, path: string, lastEventId?: string | null): Promise<SseStream> {
  const ac = new AbortController();
  const headers: Record<string, string> = { accept: "text/event-stream" };
  if (lastEventId) headers["last-event-id"] = lastEventId;
  const res = await c.fetch(path, { headers, signal: ac.signal });
  const events: SseEvent[] = [];
  let last: string | null = null;
  const waiters = new Set<() => void>();
  let done!: () => void;
  const ended = new Promise<void>((r) => (done = r));
  if (res.body && res.status === 200) {
    (async () => {
      const reader = res.body!.pipeThrough(new TextDecoderStream()).getReader();
      let buf = "";
      let cur: { id: string | null; event: string; data: string[] } = { id: null, event: "message", data: [] };
      try {
        for (;;) {
          const { value, done: end } = await reader.read();
          if (end) break;
          buf += value;
          let i: number;
          while ((i = buf.indexOf("\n")) >= 0) {
            const line = buf.slice(0, i).replace(/\r$/, "");
            buf = buf.slice(i + 1);
            if (line === "") {
              if (cur.data.length) {
                if (cur.id !== null) last = cur.id;
                events.push({ id: cur.id, event: cur.event, data: cur.data.join("\n"), at: Date.now() });
                for (const w of waiters) w();
              }
              cur = { id: null, event: "message", data: [] };
            } else if (!line.startsWith(":")) {
              const k = line.indexOf(":");
              const field = k < 0 ? line : line.slice(0, k);
              const v = k < 0 ? "" : line.slice(k + 1).replace(/^ /, "");
              if (field === "id") cur.id = v;
              else if (field === "event") cur.event = v;
              else if (field === "data") cur.data.push(v);
            }
          }
        }
      } catch {
        /* aborted */
      }
      done();
      for (const w of waiters) w();
    })();
  } else done();
  let closed = false;
  ended.then(() => (closed = true));
  return {
    status: res.status,
    contentType: res.headers.get("content-type"),
    events,
    lastId: () => last,
    ended,
    close: () => ac.abort(),
    waitFor: (n, timeoutMs = 5_000, type = "board") =>
      new Promise((resolve, reject) => {
        const of = () => events.filter((e) => e.event === type);
        const check = () => {
          if (of().length >= n) {
            waiters.delete(check);
            clearTimeout(t);
            resolve(of());
          } else if (closed) {
            waiters.delete(check);
            clearTimeout(t);
            reject(new Error(`stream ended with ${of().length} of ${n} ${type} events`));
          }
        };
        const t = setTimeout(() => {
          waiters.delete(check);
          reject(new Error(`${of().length} of ${n} ${type} events within ${timeoutMs} ms`));
        }, timeoutMs);
        waiters.add(check);
        check();
      }),
  };
}
