// Work each app instance does in the background, started once per process from
// instrumentation.ts. Nothing here assumes a single instance: the outbox is claimed row by row
// (SKIP LOCKED), and a daily job claims its day in job_claims before it runs.
import { db } from "@/lib/db";
import { startDeliveryLoop } from "@/lib/notify/data-outbox";
import { runDailyReminders } from "@/lib/credentials/data-reminders";
import { runDailyGearReminders } from "@/lib/gear/data-reminders";

export interface BackgroundJob {
  name: string;
  everyMs: number;
  run: () => Promise<void>;
}

/** Periodic jobs; each tick is cheap when there is nothing to do. */
export const backgroundJobs: BackgroundJob[] = [
  // Once a day (claimed in job_claims, so one instance does it): credential reminders and HR's digest.
  { name: "credential-reminders", everyMs: 60_000, run: async () => void (await runDailyReminders(db())) },
  // Once a day: rubber goods test reminders (1910.137 Table I-5 intervals).
  { name: "gear-reminders", everyMs: 60_000, run: async () => void (await runDailyGearReminders(db())) },
];

const g = globalThis as unknown as { gafflineBackground?: boolean };

export function startBackground() {
  if (g.gafflineBackground) return;
  if (process.env.NEXT_PHASE === "phase-production-build") return; // never during next build
  g.gafflineBackground = true;
  // DELIVERY_LOOP=off: tests and tools that drive drainOnce themselves.
  if (process.env.DELIVERY_LOOP !== "off") startDeliveryLoop(db);
  for (const job of backgroundJobs) {
    let running = false;
    const tick = async () => {
      if (running) return;
      running = true;
      try {
        await job.run();
      } catch (err) {
        console.error(`[background] ${job.name} failed`, err instanceof Error ? err.message : err);
      } finally {
        running = false;
      }
    };
    const t = setInterval(tick, job.everyMs);
    t.unref?.();
  }
}
