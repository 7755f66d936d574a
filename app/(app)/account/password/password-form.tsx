"use client";

import { signOut } from "next-auth/react";
import { useState } from "react";

export function PasswordForm() {
  const [error, setError] = useState<string | null>(null);
  const [done, setDone] = useState(false);
  const [busy, setBusy] = useState(false);

  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const f = new FormData(e.currentTarget);
    setBusy(true);
    setError(null);
    const res = await fetch("/api/me/password", {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ currentPassword: f.get("current"), newPassword: f.get("next"), confirm: f.get("confirm") }),
    });
    const data = await res.json().catch(() => ({}));
    setBusy(false);
    if (!res.ok) {
      setError(data.issues?.[0]?.message ?? data.error ?? `The server answered ${res.status}.`);
      return;
    }
    setDone(true);
    setTimeout(() => void signOut({ callbackUrl: "/login" }), 1500);
  }

  if (done) {
    return (
      <p role="status" className="rounded-md bg-clear-bg px-3 py-2 text-sm font-medium text-clear">
        ✓ Password changed. Signing you out: sign in again with the new password.
      </p>
    );
  }
  return (
    <form onSubmit={onSubmit} className="space-y-4" noValidate>
      <div>
        <label htmlFor="current" className="label">
          Current password
        </label>
        <input id="current" name="current" type="password" autoComplete="current-password" required className="field" />
      </div>
      <div>
        <label htmlFor="next" className="label">
          New password (12 characters or more)
        </label>
        <input id="next" name="next" type="password" autoComplete="new-password" minLength={12} required className="field" />
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
        Change password
      </button>
    </form>
  );
}
