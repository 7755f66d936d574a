"use client";

import { useApiMutation } from "@/lib/api/mutations";

export function HandledButton({ id }: { id: number }) {
  const mark = useApiMutation<void>({ request: () => ({ url: `/api/messages/inbound/${id}`, method: "PATCH", body: { handled: true } }), refresh: true });
  return (
    <span className="inline-flex items-center gap-2">
      <button type="button" className="btn-quiet px-2 py-1 text-xs" disabled={mark.isPending} onClick={() => mark.submit()}>
        {mark.isPending ? "Saving…" : "Mark handled"}
      </button>
      {mark.failure && <span className="text-xs font-semibold text-block">✖ Not saved; try again.</span>}
    </span>
  );
}
