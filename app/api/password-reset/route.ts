import { db } from "@/lib/db";
import { handler, json, readJson } from "@/lib/api/http";
import { consumeReset } from "@/lib/users/data";
import { passwordResetSchema } from "@/lib/users/model";

// POST (public: the e-mailed link is the proof): { token, password }. The token works once and
// until it expires (410 after); the user's sessions end and they sign in with the new password.
export const POST = handler(async (req) => {
  const input = await readJson(req, passwordResetSchema);
  return json(await consumeReset(db(), input.token, input.password));
});
