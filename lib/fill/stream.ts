// POST /api/fill's streamed answer (when the client asks for `application/x-ndjson`): one JSON
// object per line — `{"type":"progress","phase","elapsedMs","gap"}` at each step of the fill and
// each solver round, then `{"type":"result","preview":…}`, or `{"type":"cancelled"}`, or
// `{"type":"error","error"}`. The client cancels by aborting its request: the stream's cancel
// (or the request's signal) aborts the fill's signal, and the fill stops at its next step or
// solver round (lib/fill/steps/context.ts checkpoint). The fill only proposes, so nothing has
// been written either way.

import { FillCancelled } from "./steps/context";
import type { FillProgress } from "./types";

export type FillStreamLine<T> =
  | ({ type: "progress" } & FillProgress)
  | { type: "result"; preview: T }
  | { type: "cancelled" }
  | { type: "error"; error: string };

export const NDJSON = "application/x-ndjson";

export function wantsStream(req: Request): boolean {
  return (req.headers.get("accept") ?? "").includes(NDJSON);
}

/**
 * Runs `work` with an abort signal and a progress callback, streaming its progress and answer.
 * `requestSignal` (the request's own) aborts it too when the client goes away.
 */
export function streamFill<T>(
  work: (hooks: { signal: AbortSignal; onProgress: (p: FillProgress) => void }) => Promise<T>,
  requestSignal?: AbortSignal,
): ReadableStream<Uint8Array> {
  const abort = new AbortController();
  const stop = () => abort.abort();
  requestSignal?.addEventListener("abort", stop, { once: true });
  const enc = new TextEncoder();
  let closed = false;
  return new ReadableStream<Uint8Array>({
    async start(controller) {
      const send = (line: FillStreamLine<T>) => {
        if (closed) return;
        try {
          controller.enqueue(enc.encode(`${JSON.stringify(line)}\n`));
        } catch {
          closed = true; // the reader is gone
        }
      };
      try {
        const preview = await work({ signal: abort.signal, onProgress: (p) => send({ type: "progress", ...p }) });
        send({ type: "result", preview });
      } catch (err) {
        if (err instanceof FillCancelled || abort.signal.aborted) send({ type: "cancelled" });
        else {
          console.error("fill failed", err);
          send({ type: "error", error: "The fill failed on the server; nothing was written. Try again." });
        }
      } finally {
        requestSignal?.removeEventListener("abort", stop);
        if (!closed) {
          closed = true;
          controller.close();
        }
      }
    },
    cancel() {
      closed = true;
      stop();
    },
  });
}
