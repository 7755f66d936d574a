"use client";

import Link from "next/link";
import { useState } from "react";

export function ResetForm({ token }: { token: string }) {
  const [error, setError] = useState<string | null>(null);
  const [done, setDone] = useState(false);
  const [busy, setBusy] = useState(false);

  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const f = new FormData(e.currentTarget);
    if (f.get("password") !== f.get("confirm")) {
      setError("The two passwords differ.");
      return;
    }
    setBusy(true);
    setError(null);
    const res = await fetch("/api/password-reset", {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ token, password: f.get("password") }),
    });
    const data = await res.json().catch(() => ({}));
    setBusy(false);
    if (!res.ok) {
      setError(data.issues?.[0]?.message ?? data.error ?? `The server answered ${res.status}.`);
      return;
    }
    setDone(true);
  }

  if (done) {
    return (
      <p role="status" className="mt-4 rounded-md bg-clear-bg px-3 py-2 text-sm font-medium text-clear">
        ✓ Password set. <Link href="/login" className="underline">Sign in</Link> with it.
      </p>
    );
  }
  return (
    <form onSubmit={onSubmit} className="mt-6 space-y-4" noValidate>
      <div>
        <label htmlFor="password" className="label">
          New password (12 characters or more)
        </label>
        <input id="password" name="password" type="password" autoComplete="new-password" minLength={12} required className="field" />
      </div>
      <div>
        <label htmlFor="confirm" className="label">
          New password again
        </label>
        <input id="confirm" name="confirm" type="password" autoComplete="new-password" minLength={12} required className="field" />
      </div>
      {error && (
        <p role="alert" className="rounded-md bg-block-bg px-3 py-2 text-sm font-medium text-block">
          ✖ {error}
        </p>
      )}
      <button type="submit" className="btn-primary w-full" disabled={busy}>
        Set password
      </button>
    </form>
  );
}
