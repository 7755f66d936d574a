"use client";

// The offline page's count of what waits on this phone (no names: the page is public).
import { useEffect, useState } from "react";
import { idbStore } from "@/lib/offline/store";

export function QueueSummary() {
  const [n, setN] = useState<number | null>(null);
  useEffect(() => {
    if (typeof indexedDB === "undefined") return;
    idbStore
      .all()
      .then((all) => setN(all.filter((a) => a.state === "queued").length))
      .catch(() => setN(null));
  }, []);
  if (!n) return null;
  return (
    <p className="mt-3 rounded-md bg-warn-bg px-3 py-2 text-sm font-semibold text-warn" role="status">
      {n === 1 ? "1 record is" : `${n} records are`} saved on this phone, not yet sent.
    </p>
  );
}
