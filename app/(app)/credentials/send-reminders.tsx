"use client";

import { RemindersButton } from "@/components/reminders-button";

/** HR's "Send reminders now": queues the reminder e-mails (never twice per credential and day). */
export function SendReminders() {
  return <RemindersButton url="/api/reminders" label="Send reminders now" />;
}
