"use client";

// Small pieces the order, rotation, leave and time forms share.
import { useRouter } from "next/navigation";
import { useState } from "react";
import type { FieldValues, Path, UseFormReturn } from "react-hook-form";

export function FieldError({ id, msg }: { id?: string; msg?: string }) {
  if (!msg) return null;
  return (
    <p id={id} className="mt-1 text-xs font-semibold text-block">
      <span aria-hidden="true">✖ </span>
      {msg}
    </p>
  );
}

export function FormAlert({ tone = "block", children }: { tone?: "block" | "clear" | "warn" | "info"; children: React.ReactNode }) {
  if (!children) return null;
  const cls = {
    block: "bg-block-bg text-block",
    clear: "bg-clear-bg text-clear",
    warn: "bg-warn-bg text-warn",
    info: "bg-info-bg text-info",
  }[tone];
  const icon = { block: "✖", clear: "✓", warn: "▲", info: "●" }[tone];
  return (
    <div role={tone === "block" ? "alert" : "status"} className={`rounded-md px-3 py-2 text-sm font-medium ${cls}`}>
      <span aria-hidden="true">{icon} </span>
      {children}
    </div>
  );
}

export interface JsonResult<T = any> {
  ok: boolean;
  status: number;
  body: T;
}

/** fetch() with a JSON body; never throws for an HTTP error (the status says). */
export async function sendJson<T = any>(url: string, method: string, body?: unknown): Promise<JsonResult<T>> {
  try {
    const res = await fetch(url, {
      method,
      headers: body === undefined ? {} : { "content-type": "application/json" },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
    const text = await res.text();
    let parsed: unknown = null;
    try {
      parsed = text ? JSON.parse(text) : null;
    } catch {
      parsed = { error: text.slice(0, 200) };
    }
    return { ok: res.ok, status: res.status, body: parsed as T };
  } catch {
    return { ok: false, status: 0, body: { error: "The server could not be reached. Check the connection and try again." } as T };
  }
}

/** Puts a route's 422 issues on the form's fields; returns the message for the rest. */
export function applyIssues<F extends FieldValues>(form: UseFormReturn<F, any, any>, body: { error?: string; issues?: { field: string; message: string }[] }) {
  let unplaced: string | null = null;
  for (const issue of body?.issues ?? []) {
    try {
      form.setError(issue.field as Path<F>, { type: "server", message: issue.message });
    } catch {
      unplaced = issue.message;
    }
  }
  return body?.error ?? unplaced ?? "Not saved.";
}


/** A button that DELETEs (or sends `method` with `body`) and refreshes the page; shows the error. */
export function ActionButton({
  url,
  method = "DELETE",
  body,
  confirm,
  label,
  className = "btn-quiet",
  done,
}: {
  url: string;
  method?: string;
  body?: unknown;
  confirm?: string;
  label: React.ReactNode;
  className?: string;
  done?: string;
}) {
  const router = useRouter();
  const [state, setState] = useState<{ busy: boolean; error: string | null; ok: boolean }>({ busy: false, error: null, ok: false });
  return (
    <span className="inline-flex flex-col items-start">
      <button
        type="button"
        className={className}
        disabled={state.busy}
        onClick={async () => {
          if (confirm && !window.confirm(confirm)) return;
          setState({ busy: true, error: null, ok: false });
          const r = await sendJson(url, method, body);
          setState({ busy: false, error: r.ok ? null : (r.body?.error ?? "Not done."), ok: r.ok });
          if (r.ok) router.refresh();
        }}
      >
        {label}
      </button>
      {state.error && (
        <span role="alert" className="mt-1 text-xs font-semibold text-block">
          ✖ {state.error}
        </span>
      )}
      {state.ok && done && (
        <span role="status" className="mt-1 text-xs font-semibold text-clear">
          ✓ {done}
        </span>
      )}
    </span>
  );
}
