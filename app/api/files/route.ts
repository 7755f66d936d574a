import { db } from "@/lib/db";
import { ApiError, handler, json } from "@/lib/api/http";
import { requireRole } from "@/lib/auth/session";
import { readUploadForm, storeUpload } from "@/lib/files/data";
import { getWorker } from "@/lib/workers/data";

// POST multipart/form-data: `file` (PDF, JPEG or PNG, up to 10 MB) and `workerId` (whose
// evidence it is). hr and admin for any worker; a lineworker for their own record only.
export const POST = handler(async (req) => {
  const user = await requireRole("hr", "admin", "lineworker");
  // Read with a streaming limit: a chunked or understated body stops at the limit (413).
  const { form, file } = await readUploadForm(req);
  const rawWorker = form.get("workerId");
  let workerId: number | null = rawWorker === null || rawWorker === "" ? null : Number(rawWorker);
  if (workerId !== null && (!Number.isSafeInteger(workerId) || workerId <= 0)) {
    throw new ApiError(422, "workerId: not a worker id", { issues: [{ field: "workerId", message: "Not a worker id" }] });
  }
  if (user.role === "lineworker") {
    if (!user.workerId) throw new ApiError(403, "Your sign-in is not linked to a worker record.");
    if (workerId !== null && workerId !== user.workerId) throw new ApiError(403, "You can only upload your own evidence.");
    workerId = user.workerId;
  } else if (workerId !== null) {
    const w = await getWorker(db(), user.organisationId, workerId);
    if (!w) throw new ApiError(422, "workerId: no such worker", { issues: [{ field: "workerId", message: "No such worker" }] });
  }
  const bytes = new Uint8Array(await file.arrayBuffer());
  const stored = await storeUpload(db(), user, { name: file.name, bytes, workerId, kind: "evidence" });
  return json({ file: stored }, 201);
});
