"use client";

import { useState } from "react";
import { FieldError, TextField } from "@/components/form/fields";
import { useApiMutation } from "@/lib/api/mutations";
import type { CredentialDetail } from "@/lib/credentials/model";

/** HR's verify or reject (with a reason) of a renewal a lineworker sent (PATCH /api/credentials/:id). */
export function PendingActions({ c }: { c: CredentialDetail }) {
  const [rejecting, setRejecting] = useState(false);
  const [reason, setReason] = useState("");
  const decide = useApiMutation<{ action: "verify" } | { action: "reject"; reason: string }>({
    request: (body) => ({ url: `/api/credentials/${c.id}`, method: "PATCH", body }),
    refresh: true,
  });
  // a refusal names the reason field when it is the reason that is wrong; else the route's sentence
  const error = decide.failure ? (decide.failure.issues[0]?.message ?? decide.failure.message) : undefined;

  if (rejecting) {
    return (
      <div className="flex flex-wrap items-start gap-2">
        <TextField
          id={`reject-${c.id}`}
          hideLabel
          label="Why is it rejected?"
          className="field w-56"
          placeholder="Why? e.g. card unreadable"
          value={reason}
          onChange={(e) => setReason(e.target.value)}
          error={error}
        />
        <button type="button" className="btn-primary" disabled={decide.isPending} onClick={() => decide.submit({ action: "reject", reason })}>
          Reject
        </button>
        <button type="button" className="btn-quiet" onClick={() => setRejecting(false)}>
          Cancel
        </button>
      </div>
    );
  }
  return (
    <div className="flex flex-wrap gap-2">
      <button type="button" className="btn-primary" disabled={decide.isPending} onClick={() => decide.submit({ action: "verify" })} aria-label={`Verify ${c.typeName}`}>
        Verify
      </button>
      <button
        type="button"
        className="btn-quiet"
        disabled={decide.isPending}
        onClick={() => {
          decide.reset();
          setRejecting(true);
        }}
      >
        Reject…
      </button>
      {error && (
        <div className="w-full">
          <FieldError msg={error} />
        </div>
      )}
    </div>
  );
}
