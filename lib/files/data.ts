import "@/lib/server-only";
import { createHash, randomBytes } from "node:crypto";
import { mkdir, readFile, rename, rm, stat, writeFile } from "node:fs/promises";
import path from "node:path";
import { fileTypeFromBuffer } from "file-type";
import type { Knex } from "knex";
import sharp from "sharp";
import { ApiError, readFormData } from "@/lib/api/http";
import { audit } from "@/lib/audit/data";
import { ALLOWED_UPLOADS, MAX_UPLOAD_BYTES, MAX_UPLOAD_LABEL, checkFileName, fmtBytes } from "@/lib/files/model";

export { ALLOWED_UPLOADS, MAX_UPLOAD_BYTES, checkFileName };

// Evidence uploads. The type is read from the bytes (file-type), never from the name or the
// client's Content-Type; the name's extension must agree with the bytes. Files are stored
// outside public/ under UPLOAD_DIR/<sha256 of the content>; the original name is data in
// the files table and is only ever sent back in a Content-Disposition header.

// The upload folder is chosen at run time; the comments tell the bundler not to trace it.
export function uploadDir(): string {
  return process.env.UPLOAD_DIR || path.join(/*turbopackIgnore: true*/ process.cwd(), ".data", "uploads");
}

export type UploadVerdict =
  | { ok: true; mime: string; ext: string; label: string }
  | { ok: false; status: 413 | 415 | 422; message: string };

/** What the bytes are, from their magic numbers; undefined when file-type does not know. */
export async function sniffType(bytes: Uint8Array): Promise<{ mime: string; ext: string } | undefined> {
  const t = await fileTypeFromBuffer(bytes);
  return t ? { mime: t.mime, ext: t.ext } : undefined;
}

function describe(t: { mime: string; ext: string } | undefined) {
  if (!t) return "a kind of file we cannot recognise";
  if (ALLOWED_UPLOADS[t.mime]) return `a ${ALLOWED_UPLOADS[t.mime].label}`;
  if (["exe", "elf", "dll", "macho", "msi", "class", "dex", "wasm"].includes(t.ext) || /x-msdownload|x-elf|x-mach/.test(t.mime))
    return "an executable program";
  return `a .${t.ext} file (${t.mime})`;
}

/** Size, name and sniffed type, in that order. Pure apart from reading the bytes given. */
export async function checkUpload(name: string, bytes: Uint8Array): Promise<UploadVerdict> {
  if (bytes.byteLength > MAX_UPLOAD_BYTES) {
    return { ok: false, status: 413, message: `The file is ${fmtBytes(bytes.byteLength)}; the limit is ${MAX_UPLOAD_LABEL}.` };
  }
  if (bytes.byteLength === 0) return { ok: false, status: 422, message: "The file is empty." };
  const n = checkFileName(name);
  if (!n.ok) return { ok: false, status: 422, message: n.message };
  const sniffed = await sniffType(bytes);
  const allowed = sniffed && ALLOWED_UPLOADS[sniffed.mime];
  if (!sniffed || !allowed) {
    return {
      ok: false,
      status: 415,
      message: `The contents are ${describe(sniffed)}, not a PDF, JPEG or PNG. Upload a scan or photo of the card or certificate.`,
    };
  }
  if (!allowed.exts.includes(n.ext)) {
    return {
      ok: false,
      status: 415,
      message: `The name ends in .${n.ext} but the contents are ${describe(sniffed)}. Rename the file to .${allowed.exts[0]} or pick the right file.`,
    };
  }
  return { ok: true, mime: sniffed.mime, ext: n.ext, label: allowed.label };
}

export const sha256 = (bytes: Uint8Array) => createHash("sha256").update(bytes).digest("hex");

/** Writes the bytes once under their hash (atomically); returns whether this call created the file. */
async function putBlob(hash: string, bytes: Uint8Array): Promise<boolean> {
  const dir = uploadDir();
  await mkdir(/*turbopackIgnore: true*/ dir, { recursive: true, mode: 0o700 });
  const target = path.join(/*turbopackIgnore: true*/ dir, hash);
  try {
    await stat(/*turbopackIgnore: true*/ target);
    return false; // same content already stored
  } catch {
    /* not there yet */
  }
  const tmp = path.join(/*turbopackIgnore: true*/ dir, `.${hash}.${randomBytes(6).toString("hex")}.tmp`);
  try {
    await writeFile(/*turbopackIgnore: true*/ tmp, bytes, { mode: 0o600 });
    await rename(/*turbopackIgnore: true*/ tmp, target);
  } catch (err) {
    await rm(tmp, { force: true });
    throw err;
  }
  return true;
}

/**
 * Images: the largest picture we decode at all (from the header, before any pixel is read) and
 * the box every stored photo is scaled into. 40 megapixels is a 7300 × 5500 phone photo and
 * refuses decompression bombs (a 105 kB PNG that says 12000 × 12000 would need 576 MB of
 * pixels); 2400 px on the long side keeps a card or a pole legible in the briefing PDF.
 */
export const MAX_IMAGE_PIXELS = 40_000_000;
export const MAX_IMAGE_SIDE = 12_000;
export const STORED_IMAGE_BOX = 2400;

/**
 * Reads an image's size from its header (sharp's metadata: no pixels decoded), refuses one
 * over MAX_IMAGE_PIXELS with 422, then decodes it with the same pixel limit and re-encodes it
 * to at most STORED_IMAGE_BOX on its long side, EXIF orientation applied and metadata
 * (GPS, camera) dropped. The stored bytes are these, never the upload's.
 */
export async function boundedImage(bytes: Uint8Array, mime: string): Promise<Uint8Array> {
  let meta: Awaited<ReturnType<ReturnType<typeof sharp>["metadata"]>>;
  try {
    meta = await sharp(bytes, { limitInputPixels: false }).metadata();
  } catch {
    throw new ApiError(422, "The image cannot be read; take the photo again.", { issues: [{ field: "file", message: "Unreadable image" }] });
  }
  const w = meta.width ?? 0;
  const h = meta.height ?? 0;
  if (!w || !h || w * h > MAX_IMAGE_PIXELS || w > MAX_IMAGE_SIDE || h > MAX_IMAGE_SIDE) {
    const message = `The image is ${w} × ${h} pixels; the limit is ${MAX_IMAGE_PIXELS / 1_000_000} megapixels (${MAX_IMAGE_SIDE} px a side).`;
    throw new ApiError(422, message, { issues: [{ field: "file", message }] });
  }
  try {
    const img = sharp(bytes, { limitInputPixels: MAX_IMAGE_PIXELS, failOn: "error" })
      .rotate()
      .resize({ width: STORED_IMAGE_BOX, height: STORED_IMAGE_BOX, fit: "inside", withoutEnlargement: true });
    const out = mime === "image/png" ? await img.png({ compressionLevel: 9 }).toBuffer() : await img.jpeg({ quality: 85, mozjpeg: true }).toBuffer();
    return new Uint8Array(out);
  } catch {
    throw new ApiError(422, "The image cannot be read; take the photo again.", { issues: [{ field: "file", message: "Unreadable image" }] });
  }
}

export type FileKind = "evidence" | "briefing_photo";

/**
 * An upload's multipart body, read with a streaming limit (the file limit and room for the
 * form's other fields): chunked or understated bodies stop at the limit with 413.
 */
export async function readUploadForm(req: Request): Promise<{ form: FormData; file: File }> {
  let form: FormData;
  try {
    form = await readFormData(req, MAX_UPLOAD_BYTES + 64 * 1024, "The upload");
  } catch (err) {
    if (err instanceof ApiError && err.status === 413) {
      throw new ApiError(413, `The upload is over ${MAX_UPLOAD_LABEL}; the limit is ${MAX_UPLOAD_LABEL}.`, { issues: [{ field: "file", message: "Too large" }] });
    }
    throw err;
  }
  const file = form.get("file");
  if (!(file instanceof File)) {
    throw new ApiError(422, "Pick a file to upload.", { issues: [{ field: "file", message: "Pick a file to upload." }] });
  }
  return { form, file };
}

/**
 * The one check for every file reference (issue 15, findings 1 and 2): a record may point at a
 * file only when the file is of that record's kind, belongs to that record's owner (the worker
 * for evidence, the order for a pole-check photo) and the person saving it may read it: an
 * unowned file is never claimed by pointing at it. Throws 422 naming `field`.
 */
export async function assertAttachable(
  q: Knex | Knex.Transaction,
  actor: { id: number; organisationId: number; role: string; workerId: number | null },
  fileId: number,
  target: { kind: "evidence"; workerId: number } | { kind: "briefing_photo"; orderId: number },
  field: string,
): Promise<void> {
  const refuse = (message: string) => new ApiError(422, `Invalid ${field}: ${message}`, { issues: [{ field, message }] });
  const f = await q("files").where({ id: fileId, organisation_id: actor.organisationId }).first("id", "kind", "worker_id", "work_order_id", "uploaded_by");
  if (!f) throw refuse("No such uploaded file");
  if (f.kind !== target.kind) {
    throw refuse(f.kind === "evidence" ? "That file is credential evidence, not a pole-check photo" : "That file is a pole-check photo, not credential evidence");
  }
  if (target.kind === "evidence") {
    // Evidence is always uploaded for a worker; a lineworker only for their own record, and
    // hr/admin name the worker at upload. It may be attached only to that worker's record.
    // An upload not yet tied to a worker may be attached by the person who uploaded it only
    // (and then belongs to that worker): pointing at someone else's upload claims nothing.
    if (f.worker_id === null) {
      if (Number(f.uploaded_by) !== actor.id) throw refuse("That file was uploaded by someone else");
      await q("files").where({ id: fileId }).update({ worker_id: target.workerId });
      return;
    }
    if (Number(f.worker_id) !== target.workerId) throw refuse("That file is another worker's evidence");
    if (actor.role === "lineworker" && Number(f.worker_id) !== actor.workerId) throw refuse("That file is not yours");
  } else {
    if (f.work_order_id === null || Number(f.work_order_id) !== target.orderId) throw refuse("That photo was not taken for this order's briefing");
  }
}

export interface StoredFile {
  id: number;
  originalName: string;
  mime: string;
  sizeBytes: number;
  sha256: string;
  workerId: number | null;
}

/**
 * Checks and stores an upload: nothing is written (no row, no file) when it is refused.
 * Throws ApiError 413/415/422 with a message naming the problem.
 */
export async function storeUpload(
  db: Knex,
  actor: { id: number; organisationId: number },
  input: { name: string; bytes: Uint8Array; workerId: number | null; kind?: FileKind; workOrderId?: number | null },
): Promise<StoredFile> {
  const verdict = await checkUpload(input.name, input.bytes);
  if (!verdict.ok) throw new ApiError(verdict.status, verdict.message, { issues: [{ field: "file", message: verdict.message }] });
  if (verdict.mime.startsWith("image/")) input = { ...input, bytes: await boundedImage(input.bytes, verdict.mime) };
  const kind: FileKind = input.kind ?? "evidence";
  const hash = sha256(input.bytes);
  const created = await putBlob(hash, input.bytes);
  try {
    return await db.transaction(async (trx) => {
      const [id] = await trx("files").insert({
        organisation_id: actor.organisationId,
        sha256: hash,
        original_name: input.name.normalize("NFC"),
        mime: verdict.mime,
        size_bytes: input.bytes.byteLength,
        worker_id: input.workerId,
        uploaded_by: actor.id,
        kind,
        work_order_id: input.workOrderId ?? null,
      });
      await audit(trx, actor, actor.organisationId, "file.upload", "file", id, {
        name: input.name,
        mime: verdict.mime,
        size: input.bytes.byteLength,
        workerId: input.workerId,
        kind,
        workOrderId: input.workOrderId ?? null,
      });
      return {
        id: Number(id),
        originalName: input.name,
        mime: verdict.mime,
        sizeBytes: input.bytes.byteLength,
        sha256: hash,
        workerId: input.workerId,
      };
    });
  } catch (err) {
    if (created) {
      const others = await db("files").where({ sha256: hash }).count({ n: "*" }).first().catch(() => ({ n: 1 }));
      if (!Number(others?.n)) await rm(path.join(uploadDir(), hash), { force: true });
    }
    throw err;
  }
}

export async function readBlob(hash: string): Promise<Buffer | null> {
  if (!/^[0-9a-f]{64}$/.test(hash)) return null;
  try {
    return await readFile(/*turbopackIgnore: true*/ path.join(uploadDir(), hash));
  } catch {
    return null;
  }
}

/**
 * Content-Disposition for a download (RFC 6266): an ASCII fallback in `filename` (quotes
 * and backslashes replaced, non-ASCII as "_") and the exact name in `filename*` encoded per
 * RFC 8187 (which replaced RFC 5987): UTF-8''percent-encoded.
 */
export function contentDisposition(name: string, kind: "attachment" | "inline" = "attachment"): string {
  const clean = name.replace(/[\u0000-\u001f\u007f]/g, "");
  const fallback = clean.replace(/[^\x20-\x7e]/g, "_").replace(/["\\]/g, "_") || "download";
  const encoded = encodeURIComponent(clean).replace(/['()*]/g, (c) => "%" + c.charCodeAt(0).toString(16).toUpperCase());
  return fallback === clean
    ? `${kind}; filename="${fallback}"`
    : `${kind}; filename="${fallback}"; filename*=UTF-8''${encoded}`;
}

/** A stored file's row, of the organisation (and of the given kind and order when asked), or null. */
export async function fileRow(
  db: Knex,
  organisationId: number,
  id: number,
  only: { kind?: string; workOrderId?: number } = {},
): Promise<Record<string, any> | null> {
  const where: Record<string, unknown> = { id, organisation_id: organisationId };
  if (only.kind) where.kind = only.kind;
  if (only.workOrderId !== undefined) where.work_order_id = only.workOrderId;
  return (await db("files").where(where).first()) ?? null;
}

/** The order's briefing photos among `ids` (id, type, content hash), for the briefing PDF. */
export async function briefingPhotoFiles(db: Knex, organisationId: number, orderId: number, ids: number[]): Promise<{ id: number; mime: string; sha256: string }[]> {
  return db("files").whereIn("id", ids).where({ organisation_id: organisationId, kind: "briefing_photo", work_order_id: orderId }).select("id", "mime", "sha256");
}
