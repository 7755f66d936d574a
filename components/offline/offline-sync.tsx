"use client";

// On My week and the briefing (issue 20): registers the service worker, keeps the field cache to
// this user, has the worker keep this user's field pages (each visit with signal), sends the
// queue when the phone comes back online (and every 20 s while something waits), and shows the
// queue. After a delivery the page is refreshed from the server: its answer wins.
import { useRouter } from "next/navigation";
import { useEffect, useRef } from "react";
import { claimFieldCache, keepPages, registerWorker } from "@/lib/offline/cache";
import { sendQueue, useFieldQueue, useOnline } from "./field-queue";
import { QueuePanel } from "./queue-panel";

export function OfflineSync({ userId, keep, orderId, onDelivered }: { userId: number; keep: string[]; orderId?: number; onDelivered?: () => void }) {
  const router = useRouter();
  const online = useOnline();
  const q = useFieldQueue(userId);
  const keepKey = keep.join("|");
  const delivered = useRef(0);

  useEffect(() => {
    let cancelled = false;
    void (async () => {
      await registerWorker();
      await claimFieldCache(userId).catch(() => {});
      if (!cancelled && navigator.onLine) await keepPages(keepKey.split("|").filter(Boolean)).catch(() => false);
    })();
    return () => {
      cancelled = true;
    };
  }, [userId, keepKey]);

  const waiting = q.actions.some((a) => a.state === "queued");
  useEffect(() => {
    if (!online || !waiting || q.stopped === "signin") return;
    void sendQueue(userId).catch(() => {});
    const t = setInterval(() => void sendQueue(userId).catch(() => {}), 20_000);
    return () => clearInterval(t);
  }, [online, waiting, q.stopped, userId]);

  useEffect(() => {
    if (q.delivered.length > delivered.current) {
      delivered.current = q.delivered.length;
      onDelivered?.();
      router.refresh();
      if (navigator.onLine) void keepPages(keepKey.split("|").filter(Boolean)).catch(() => false);
    }
  }, [q.delivered.length, onDelivered, router, keepKey]);

  return <QueuePanel userId={userId} orderId={orderId} online={online} />;
}
