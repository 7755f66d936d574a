"use client";

import { signOut } from "next-auth/react";
import { clearOfflineData } from "@/lib/offline/cache";
import { idbStore } from "@/lib/offline/store";

// Sign-out also deletes what the phone keeps for this user (issue 20): the cached field pages
// and the offline queue. Records still waiting to be sent are named first.
async function signOutHere() {
  const waiting = await idbStore
    .all()
    .then((all) => all.filter((a) => a.state === "queued").length)
    .catch(() => 0);
  if (waiting > 0 && !window.confirm(`${waiting} record(s) saved on this phone are not yet sent. Signing out deletes them. Sign out anyway?`)) return;
  await clearOfflineData().catch(() => {});
  await signOut({ callbackUrl: "/login" });
}

export function SignOutButton() {
  return (
    <button
      type="button"
      onClick={() => void signOutHere()}
      className="rounded-md border border-paper/30 px-2.5 py-1 text-xs font-semibold text-paper hover:bg-ink-700"
    >
      Sign out
    </button>
  );
}
