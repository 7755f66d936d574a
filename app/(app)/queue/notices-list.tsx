"use client";
import { useState } from "react";
import { useRouter } from "next/navigation";
import type { NoticeView } from "@/lib/notices/model";

// The supervisor's own notices (lapsed overrides), unread first, with "Mark read".
export function NoticesList({ notices }: { notices: NoticeView[] }) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const unread = notices.filter((n) => !n.readAt);
  const mark = async (ids: number[] | "all") => {
    setBusy(true);
    setError(null);
    try {
      const r = await fetch("/api/notices/read", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ ids }) });
      if (!r.ok) setError(((await r.json().catch(() => null)) as { error?: string } | null)?.error ?? `Could not mark read (${r.status}).`);
      router.refresh();
    } finally {
      setBusy(false);
    }
  };
  if (!notices.length) return null;
  return (
    <section aria-labelledby="q-notices" className="card p-4" data-testid="queue-notices">
      <div className="mb-2 flex flex-wrap items-center gap-2">
        <h2 id="q-notices" className="font-bold">
          Notices for you
        </h2>
        <span className="text-sm text-ink-700" data-testid="notices-unread">
          {unread.length === 1 ? "1 unread" : `${unread.length} unread`}
        </span>
        {unread.length > 1 && (
          <button type="button" className="btn-quiet ml-auto" disabled={busy} onClick={() => mark("all")}>
            Mark all read
          </button>
        )}
      </div>
      {error && (
        <p role="alert" className="mb-2 text-sm text-block">
          {error}
        </p>
      )}
      <ul className="space-y-2">
        {notices.slice(0, 20).map((n) => (
          <li key={n.id} className={`rounded-md border p-3 text-sm ${n.readAt ? "border-rule" : "border-copper bg-paper-200"}`} data-testid="notice">
            <div className="flex flex-wrap items-start gap-2">
              <p className="min-w-0 flex-1 font-semibold">{n.title}</p>
              {!n.readAt && (
                <button type="button" className="btn-quiet" disabled={busy} onClick={() => mark([n.id])}>
                  Mark read
                </button>
              )}
            </div>
            <p className="mt-1 break-words text-ink-700">{n.body}</p>
          </li>
        ))}
      </ul>
    </section>
  );
}
