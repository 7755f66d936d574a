"use client";

// Runs Fill open positions with a streamed answer (issue 19): POST /api/fill with
// `Accept: application/x-ndjson` reads the server's progress lines (the fill's step, the time
// since it started, the solver's gap while it prices) and then the proposal. `cancel()` aborts
// the request; the server's fill sees the abort and stops at its next step or solver round
// (lib/fill/stream.ts). The fill only proposes, so a cancelled run has written nothing.

import { useCallback, useRef, useState } from "react";
import type { FillPreview } from "@/lib/fill/preview";
import type { FillStreamLine } from "@/lib/fill/stream";
import type { FillProgress } from "@/lib/fill/types";
import { HttpError } from "./use-board";

export type FillOutcome = { kind: "preview"; preview: FillPreview } | { kind: "cancelled" };

export function useFillRun() {
  const [progress, setProgress] = useState<FillProgress | null>(null);
  const controller = useRef<AbortController | null>(null);

  const run = useCallback(async (body: { date: string; yard: string; timeLimitSeconds: number; gap: number }): Promise<FillOutcome> => {
    controller.current?.abort();
    const ac = new AbortController();
    controller.current = ac;
    setProgress(null);
    try {
      const res = await fetch("/api/fill", {
        method: "POST",
        headers: { "content-type": "application/json", accept: "application/x-ndjson" },
        body: JSON.stringify(body),
        signal: ac.signal,
      });
      if (!res.ok || !res.body) {
        const text = await res.text();
        let parsed: Record<string, unknown> = {};
        try {
          parsed = text ? JSON.parse(text) : {};
        } catch {
          parsed = { error: text.slice(0, 200) };
        }
        throw new HttpError(res.status, String(parsed.error ?? `Request failed (${res.status})`), parsed);
      }
      const reader = res.body.pipeThrough(new TextDecoderStream()).getReader();
      let buffer = "";
      for (;;) {
        const { done, value } = await reader.read();
        if (done) break;
        buffer += value;
        let nl: number;
        while ((nl = buffer.indexOf("\n")) >= 0) {
          const line = buffer.slice(0, nl).trim();
          buffer = buffer.slice(nl + 1);
          if (!line) continue;
          const msg = JSON.parse(line) as FillStreamLine<FillPreview>;
          if (msg.type === "progress") setProgress({ phase: msg.phase, elapsedMs: msg.elapsedMs, gap: msg.gap });
          else if (msg.type === "result") return { kind: "preview", preview: msg.preview };
          else if (msg.type === "cancelled") return { kind: "cancelled" };
          else throw new HttpError(500, msg.error, {});
        }
      }
      throw new HttpError(502, "The fill's answer ended early; nothing was written. Try again.", {});
    } catch (err) {
      if (ac.signal.aborted) return { kind: "cancelled" };
      throw err;
    } finally {
      if (controller.current === ac) controller.current = null;
    }
  }, []);

  const cancel = useCallback(() => controller.current?.abort(), []);

  return { run, cancel, progress };
}
