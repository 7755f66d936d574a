"use client";

// My week's calendar link is the shared one (components/calendar-link.tsx), for the signed-in worker.
import { CalendarLink as SharedCalendarLink } from "@/components/calendar-link";

export function CalendarLink({ url }: { url: string | null }) {
  return (
    <div className="card p-4">
      <SharedCalendarLink url={url} self />
    </div>
  );
}
