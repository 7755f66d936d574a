"use client";

// The board's data in the browser (issue 19): the first answer is the whole board (with the
// pool's rule snapshot the client engine works from); after that the browser names the version
// it holds and gets a patch (lib/board/patch.ts), so the snapshot travels once per board
// session. Changes are pushed over Server-Sent Events (/api/board/stream); while the stream is
// down the board polls /api/board/events every 2 s as before.
import { useQuery, useQueryClient } from "@tanstack/react-query";
import { useEffect, useRef, useState } from "react";
import type { BoardPayload } from "@/lib/board/model";
import { applyBoardPatch, type BoardPatch } from "@/lib/board/patch";
import { call, HttpError, type BoardKey } from "./use-board";

/** The last board each (day, yard) got from the server, with its version: what patches apply to. */
const held = new Map<string, { version: string; board: BoardPayload }>();

export function holdBoard(day: string, yard: string, version: string, board: BoardPayload) {
  held.set(`${day}|${yard}`, { version, board });
}

async function fetchBoard(day: string, yard: string, slim = true): Promise<BoardPayload> {
  const k = `${day}|${yard}`;
  const base = slim ? held.get(k) : undefined;
  const qs = new URLSearchParams({ date: day, yard });
  if (base) {
    qs.set("since", base.version);
    qs.set("cursor", String(base.board.cursor));
  }
  // Pre-compressed once per change on the server (app/api/board/route.ts).
  const res = await fetch(`/api/board?${qs}`, { headers: { "x-board-gzip": "1" } });
  const text = await res.text();
  let body: Record<string, unknown> = {};
  try {
    body = text ? JSON.parse(text) : {};
  } catch {
    body = { error: text.slice(0, 200) };
  }
  if (!res.ok) throw new HttpError(res.status, String(body.error ?? `Request failed (${res.status})`), body);
  const version = res.headers.get("x-board-version");
  const answer = res.headers.get("x-board-answer") ?? "full";
  let board: BoardPayload;
  if (answer === "patch") {
    const patch = body as unknown as BoardPatch;
    // Another fetch moved the held board on meanwhile: start over with the whole board.
    if (!base || patch.from !== base.version) return fetchBoard(day, yard, false);
    board = applyBoardPatch(base.board, patch);
  } else board = body as unknown as BoardPayload;
  if (version) held.set(k, { version, board });
  return board;
}

export function useBoardData(day: string, yard: string, initial?: BoardPayload, initialVersion?: string) {
  const key: BoardKey = ["board", day, yard];
  const fresh = initial && initial.day === day && initial.yard.code === yard ? initial : undefined;
  if (fresh && initialVersion && !held.has(`${day}|${yard}`)) holdBoard(day, yard, initialVersion, fresh);
  const query = useQuery<BoardPayload>({
    queryKey: key,
    queryFn: () => fetchBoard(day, yard),
    initialData: fresh,
    refetchInterval: 60_000,
  });
  return { key, ...query };
}

export type LiveMode = "connecting" | "stream" | "polling";

/**
 * Keeps the board current: Server-Sent Events while the stream is open, polling the events
 * route every 2 s while it is not. Any event for this day refreshes the board (a patch); while
 * a drag or a write is under way the refresh waits for it.
 */
export function useLiveBoard(key: BoardKey, cursor: number | undefined, paused: boolean): LiveMode {
  const qc = useQueryClient();
  const [mode, setMode] = useState<LiveMode>("connecting");
  const cursorRef = useRef(cursor ?? 0);
  const pausedRef = useRef(paused);
  const dirty = useRef(false);
  const [, day, yard] = key;
  useEffect(() => {
    if (cursor !== undefined && cursor > cursorRef.current) cursorRef.current = cursor;
  }, [cursor]);
  useEffect(() => {
    pausedRef.current = paused;
    if (!paused && dirty.current) {
      dirty.current = false;
      void qc.invalidateQueries({ queryKey: key });
    }
  }, [paused]); // eslint-disable-line react-hooks/exhaustive-deps

  useEffect(() => {
    let stopped = false;
    let es: EventSource | null = null;
    let retry: ReturnType<typeof setTimeout> | null = null;
    let streaming = false;
    const refresh = () => {
      if (pausedRef.current) dirty.current = true;
      else void qc.invalidateQueries({ queryKey: ["board", day, yard] });
    };
    const connect = () => {
      if (stopped) return;
      const qs = new URLSearchParams({ yard, date: day, after: String(cursorRef.current) });
      es = new EventSource(`/api/board/stream?${qs}`);
      es.onopen = () => {
        streaming = true;
        setMode("stream");
      };
      es.addEventListener("board", (m) => {
        const id = Number((m as MessageEvent).lastEventId);
        if (id > cursorRef.current) cursorRef.current = id;
        refresh();
      });
      es.addEventListener("end", () => {
        // Signed out (or the server ended the stream): polling takes over and shows the error.
        es?.close();
        streaming = false;
        setMode("polling");
      });
      es.onerror = () => {
        streaming = false;
        setMode("polling");
        // The browser retries by itself unless the stream is closed for good; then we do.
        if (es?.readyState === EventSource.CLOSED && !retry) {
          retry = setTimeout(() => {
            retry = null;
            connect();
          }, 5_000);
        }
      };
    };
    connect();
    const tick = async () => {
      if (stopped || streaming || document.hidden) return;
      try {
        const r = await call<{ events: unknown[]; cursor: number }>(`/api/board/events?after=${cursorRef.current}&date=${day}&yard=${yard}`);
        if (r.cursor > cursorRef.current) {
          cursorRef.current = r.cursor;
          if (r.events.length) refresh();
        }
      } catch {
        /* the next tick tries again; the query shows its own error */
      }
    };
    const t = setInterval(tick, 2_000);
    return () => {
      stopped = true;
      clearInterval(t);
      if (retry) clearTimeout(retry);
      es?.close();
    };
  }, [day, yard, qc]);
  return mode;
}
