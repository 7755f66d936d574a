import { db } from "@/lib/db";
import { ApiError, handler } from "@/lib/api/http";
import { idParam } from "@/lib/api/ids";
import { requireRole } from "@/lib/auth/session";
import { loadBriefing, modeFor } from "@/lib/briefings/data";
import { briefingPdf, type PhotoBytes } from "@/lib/briefings/pdf";
import { briefingPhotoFiles, contentDisposition, readBlob } from "@/lib/files/data";
import { POLE_CHECKS } from "@/lib/briefings/model";

type P = { orderId: string };

export const dynamic = "force-dynamic";

// GET: the briefing sheet as a PDF (current round): crew, hazards, drop zone, procedure,
// controls, pole check with photos, emergency plan, acknowledgements, and the caution.
// Same readers as the briefing: the order's crew, dispatchers, supervisors.
export const GET = handler<P>(async (_req, ctx) => {
  const user = await requireRole("lineworker", "dispatcher", "supervisor");
  const orderId = idParam((await ctx.params).orderId, "work order");
  const conn = db();
  const view = await loadBriefing(conn, user.organisationId, orderId);
  if (!view) throw new ApiError(404, "No such work order.");
  modeFor(user, view);
  const ids = POLE_CHECKS.map((c) => view.data.poleCheck.items[c.key].photoFileId).filter((v): v is number => v !== null);
  const photos: PhotoBytes[] = [];
  if (ids.length) {
    const rows = await briefingPhotoFiles(conn, user.organisationId, orderId, ids);
    for (const r of rows) {
      const bytes = await readBlob(r.sha256);
      if (bytes) photos.push({ fileId: Number(r.id), mime: String(r.mime), bytes: new Uint8Array(bytes) });
    }
  }
  const pdf = await briefingPdf(view, photos);
  const name = `briefing-${view.order.number}-round-${view.briefing?.round ?? 1}.pdf`;
  return new Response(new Uint8Array(pdf), {
    headers: {
      "content-type": "application/pdf",
      "content-length": String(pdf.byteLength),
      "content-disposition": contentDisposition(name),
      "x-content-type-options": "nosniff",
      "cache-control": "private, no-store",
    },
  });
});
