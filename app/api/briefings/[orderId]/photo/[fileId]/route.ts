import { db } from "@/lib/db";
import { ApiError, handler } from "@/lib/api/http";
import { idParam } from "@/lib/api/ids";
import { requireRole } from "@/lib/auth/session";
import { briefingPhotoIds, loadBriefing, modeFor } from "@/lib/briefings/data";
import { contentDisposition, fileRow, readBlob } from "@/lib/files/data";

type P = { orderId: string; fileId: string };

// GET: a pole-check photo of this order's briefing, for whoever may read the briefing. Images
// inline (for the sheet), PDFs as a download; the stored type, nosniff and a sandbox CSP always.
export const GET = handler<P>(async (_req, ctx) => {
  const user = await requireRole("lineworker", "dispatcher", "supervisor");
  const params = await ctx.params;
  const orderId = idParam(params.orderId, "work order");
  const fileId = idParam(params.fileId, "photo");
  const view = await loadBriefing(db(), user.organisationId, orderId);
  if (!view) throw new ApiError(404, "No such work order.");
  modeFor(user, view);
  if (!(await briefingPhotoIds(db(), orderId)).has(fileId)) throw new ApiError(404, "No such photo on this briefing.");
  // Only a photo taken for this order's briefing (files.kind, files.work_order_id).
  const row = await fileRow(db(), user.organisationId, fileId, { kind: "briefing_photo", workOrderId: orderId });
  if (!row) throw new ApiError(404, "No such photo.");
  const bytes = await readBlob(row.sha256);
  if (!bytes) throw new ApiError(404, "The stored photo is missing.");
  const inline = row.mime === "image/jpeg" || row.mime === "image/png";
  return new Response(new Uint8Array(bytes), {
    headers: {
      "content-type": row.mime,
      "content-length": String(bytes.byteLength),
      "content-disposition": contentDisposition(row.original_name, inline ? "inline" : "attachment"),
      "x-content-type-options": "nosniff",
      "cache-control": "private, no-store",
      "content-security-policy": "default-src 'none'; sandbox; frame-ancestors 'none'",
    },
  });
});
