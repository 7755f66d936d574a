"use client";

// Undo (issue 18), split out of board-client.tsx: the changes made here, newest last; undo
// sends the opposite change; Ctrl+Z / Cmd+Z undoes the last one, except while typing in a field.
import { useCallback, useEffect, useState } from "react";
import type { BoardPayload } from "@/lib/board/model";
import type { Change } from "./use-board";
import { describeChange, inverseOf } from "./undo";

export function useUndoableChanges(
  data: BoardPayload | undefined,
  mutation: { mutateAsync: (c: Change) => Promise<unknown>; isPending: boolean },
  nameOf: (id: number) => string,
  notify: (msg: string, tone?: "ok" | "error") => void,
) {
  const [history, setHistory] = useState<{ change: Change; label: string }[]>([]);

  /** Every board change goes through here: the locked write path, then into the undo history. */
  function apply(change: Change, opts: { undo?: boolean } = {}) {
    const label = data ? describeChange(change, data, nameOf) : "the last change";
    mutation
      .mutateAsync(change)
      .then(() => {
        if (!opts.undo) setHistory((h) => [...h.slice(-19), { change, label }]);
      })
      .catch(() => {
        /* onError has put the board back and said why */
      });
  }

  const undo = useCallback(() => {
    const last = history[history.length - 1];
    if (!last || !data || mutation.isPending) return;
    const inverse = inverseOf(last.change, data);
    setHistory((h) => h.slice(0, -1));
    if (!inverse) {
      notify(`Cannot undo ${last.label}: those seats have changed since.`, "error");
      return;
    }
    notify(`Undoing ${last.label}…`, "ok");
    apply(inverse, { undo: true });
  }, [history, data, mutation.isPending]); // eslint-disable-line react-hooks/exhaustive-deps

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (!(e.ctrlKey || e.metaKey) || e.shiftKey || e.altKey || e.key.toLowerCase() !== "z") return;
      const t = e.target as HTMLElement | null;
      if (t && (t.isContentEditable || ["INPUT", "TEXTAREA", "SELECT"].includes(t.tagName))) return;
      e.preventDefault();
      undo();
    };
    window.addEventListener("keydown", onKey);
    return () => window.removeEventListener("keydown", onKey);
  }, [undo]);

  return { history, apply, undo };
}
