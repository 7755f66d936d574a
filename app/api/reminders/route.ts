import { db } from "@/lib/db";
import { handler, json } from "@/lib/api/http";
import { requireRole } from "@/lib/auth/session";
import { sendRemindersNow } from "@/lib/credentials/data-reminders";

// POST: hr, admin. Queues reminder e-mails now (no daily claim; still once per credential per day).
export const POST = handler(async () => {
  const user = await requireRole("hr", "admin");
  const result = await sendRemindersNow(db(), user);
  return json(result);
});
