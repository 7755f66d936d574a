import { db } from "@/lib/db";
import { ApiError, handler } from "@/lib/api/http";
import { idParam } from "@/lib/api/ids";
import { requireRole } from "@/lib/auth/session";
import { contentDisposition, fileRow, readBlob } from "@/lib/files/data";

type P = { id: string };

// GET: hr, supervisor, admin; a lineworker only files of their own worker record.
// Always a download (attachment), with the stored type and nosniff.
export const GET = handler<P>(async (_req, ctx) => {
  const user = await requireRole("hr", "supervisor", "admin", "lineworker");
  const id = idParam((await ctx.params).id, "file");
  const row = await fileRow(db(), user.organisationId, id);
  if (!row) throw new ApiError(404, "No such file.");
  if (user.role === "lineworker" && (row.worker_id === null || Number(row.worker_id) !== user.workerId)) {
    throw new ApiError(403, "You can only open your own evidence.");
  }
  const bytes = await readBlob(row.sha256);
  if (!bytes) throw new ApiError(404, "The stored file is missing; upload it again.");
  return new Response(new Uint8Array(bytes), {
    headers: {
      "content-type": row.mime,
      "content-length": String(bytes.byteLength),
      "content-disposition": contentDisposition(row.original_name),
      "x-content-type-options": "nosniff",
      "cache-control": "private, no-store",
      "content-security-policy": "default-src 'none'; sandbox; frame-ancestors 'none'",
    },
  });
});
