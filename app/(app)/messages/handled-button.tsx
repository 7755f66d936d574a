"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";

export function HandledButton({ id }: { id: number }) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  return (
    <span className="inline-flex items-center gap-2">
      <button
        type="button"
        className="btn-quiet px-2 py-1 text-xs"
        disabled={busy}
        onClick={async () => {
          setBusy(true);
          setError(null);
          const res = await fetch(`/api/messages/inbound/${id}`, {
            method: "PATCH",
            headers: { "content-type": "application/json" },
            body: JSON.stringify({ handled: true }),
          });
          setBusy(false);
          if (!res.ok) setError("Not saved; try again.");
          else router.refresh();
        }}
      >
        {busy ? "Saving…" : "Mark handled"}
      </button>
      {error && <span className="text-xs font-semibold text-block">✖ {error}</span>}
    </span>
  );
}
