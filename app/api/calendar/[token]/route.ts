import { db } from "@/lib/db";
import { handler, json } from "@/lib/api/http";
import { calendarFeed } from "@/lib/workers/data-calendar";

type Params = { token: string };

// Public: the secret token is the key. 404 for a wrong token (the same answer as no such page).
export const GET = handler<Params>(async (_req, ctx) => {
  const { token } = await ctx.params;
  const body = await calendarFeed(db(), token);
  if (body === null) return json({ error: "No such calendar." }, 404);
  return new Response(body, {
    status: 200,
    headers: {
      "content-type": "text/calendar; charset=utf-8",
      "content-disposition": 'inline; filename="gaffline.ics"',
      "cache-control": "private, no-cache",
      "referrer-policy": "no-referrer",
      "x-robots-tag": "noindex",
    },
  });
});
