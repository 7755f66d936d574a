import { createHash, randomBytes } from "node:crypto";
import { mkdir, readFile, rename, rm, stat, writeFile } from "node:fs/promises";
import path from "node:path";
import { fileTypeFromBuffer } from "file-type";
import type { Knex } from "knex";
import { ApiError } from "@/lib/api/http";
import { audit } from "@/lib/data/audit";
import { ALLOWED_UPLOADS, MAX_UPLOAD_BYTES, MAX_UPLOAD_LABEL, checkFileName, fmtBytes } from "@/lib/validation/file";

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
  input: { name: string; bytes: Uint8Array; workerId: number | null },
): Promise<StoredFile> {
  const verdict = await checkUpload(input.name, input.bytes);
  if (!verdict.ok) throw new ApiError(verdict.status, verdict.message, { issues: [{ field: "file", message: verdict.message }] });
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
      });
      await audit(trx, actor, actor.organisationId, "file.upload", "file", id, {
        name: input.name,
        mime: verdict.mime,
        size: input.bytes.byteLength,
        workerId: input.workerId,
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
