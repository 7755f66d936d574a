"use client";

import { signOut } from "next-auth/react";

export function SignOutButton() {
  return (
    <button
      type="button"
      onClick={() => signOut({ callbackUrl: "/login" })}
      className="rounded-md border border-paper/30 px-2.5 py-1 text-xs font-semibold text-paper hover:bg-ink-700"
    >
      Sign out
    </button>
  );
}
