import { db } from "@/lib/db";
import { ApiError, handler, json } from "@/lib/api/http";
import { idParam } from "@/lib/api/ids";
import { requireRole } from "@/lib/auth/session";
import { loadBriefing, modeFor } from "@/lib/briefings/data";
import { readUploadForm, storeUpload } from "@/lib/files/data";
import { idempotent } from "@/lib/offline/data";

type P = { orderId: string };

// POST multipart/form-data `file`: a pole-check photo, by the crew lead. The same rules as
// credential evidence (lib/files/data.ts): PDF, JPEG or PNG, at most 10 MB, the type read from the
// bytes with file-type and agreeing with the name. Answers { file }; the lead's next save puts
// its id on the pole-check item. With an Idempotency-Key (a photo taken offline), a resend
// answers the same file.
export const POST = handler<P>(async (req, ctx) => {
  const user = await requireRole("lineworker");
  return idempotent(req, user, async () => {
    const orderId = idParam((await ctx.params).orderId, "work order");
    const view = await loadBriefing(db(), user.organisationId, orderId);
    if (!view) throw new ApiError(404, "No such work order.");
    if (modeFor(user, view) !== "lead") throw new ApiError(403, "Only the crew lead adds pole-check photos.");
    const { file } = await readUploadForm(req);
    const bytes = new Uint8Array(await file.arrayBuffer());
    const stored = await storeUpload(db(), user, { name: file.name, bytes, workerId: null, kind: "briefing_photo", workOrderId: orderId });
    return json({ file: { id: stored.id, name: stored.originalName, mime: stored.mime, size: stored.sizeBytes } }, 201);
  });
});
