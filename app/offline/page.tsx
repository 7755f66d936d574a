import Link from "next/link";
import { SafetyNote } from "@/components/status";
import { QueueSummary } from "./queue-summary";

export const metadata = { title: "No signal" };

// What the service worker shows (app/sw.ts) for a page the phone has no copy of while it has
// no signal. Static and public (precached with the app shell); it names no one.
export default function OfflinePage() {
  return (
    <main className="mx-auto max-w-xl p-4">
      <p className="text-xs font-bold uppercase tracking-widest text-copper">Gaffline</p>
      <h1 className="text-xl font-extrabold tracking-tight">No signal, and no copy of this page on the phone</h1>
      <p className="mt-2 text-sm text-ink-700">
        My week and the briefings of your jobs for the next seven days are kept on this phone each time you open My week with a
        connection. Open them from here; what you record is saved on this phone and sent when the phone is back online.
      </p>
      <p className="mt-3">
        <Link href="/me" className="btn-accent min-h-11">
          Open My week
        </Link>
      </p>
      <QueueSummary />
      <SafetyNote className="mt-4" />
    </main>
  );
}
