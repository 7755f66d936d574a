import { db } from "@/lib/db";
import { handler, json } from "@/lib/api/http";
import { requireRole } from "@/lib/auth/session";
import { sendGearRemindersNow } from "@/lib/gear/data-reminders";

// POST: hr, admin. Queues test reminder e-mails now for every glove and sleeve due within 30
// days or overdue (at most one per item and day).
export const POST = handler(async () => {
  const user = await requireRole("hr", "admin");
  return json(await sendGearRemindersNow(db(), user));
});
