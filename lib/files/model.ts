// What an evidence upload may be. Pure: used by the upload form (early hints) and by
// lib/files/data.ts on the server, which also checks the bytes.

export const MAX_UPLOAD_BYTES = 10 * 1024 * 1024; // 10 MB (MiB)
export const MAX_UPLOAD_LABEL = "10 MB";

/** Sniffed MIME type → the extensions a name may end in. */
export const ALLOWED_UPLOADS: Record<string, { label: string; exts: string[] }> = {
  "application/pdf": { label: "PDF", exts: ["pdf"] },
  "image/jpeg": { label: "JPEG image", exts: ["jpg", "jpeg"] },
  "image/png": { label: "PNG image", exts: ["png"] },
};
export const ALLOWED_EXTS = Object.values(ALLOWED_UPLOADS).flatMap((t) => t.exts);
export const ACCEPT_ATTR = "application/pdf,image/jpeg,image/png,.pdf,.jpg,.jpeg,.png";

export type NameCheck = { ok: true; ext: string } | { ok: false; message: string };

// C0 and C1 control characters, DEL.
const CONTROL = /[\u0000-\u001f\u007f-\u009f]/;
// Bidirectional overrides and isolates: "invoice\u202Efdp.exe" displays as "invoiceexe.pdf".
const BIDI = /[\u202a-\u202e\u2066-\u2069\u200e\u200f\u061c]/;
const RESERVED = /[<>:"|?*]/;

/**
 * The original name is kept as data (never used as a path), but names that try to be paths
 * or hide what they are are refused outright, with a message saying why.
 */
export function checkFileName(name: string): NameCheck {
  if (typeof name !== "string" || name.trim() === "") return { ok: false, message: "The file has no name." };
  if (name.length > 200) return { ok: false, message: "The file name is longer than 200 characters; shorten it." };
  if (CONTROL.test(name)) return { ok: false, message: "The file name contains a control character; rename the file." };
  if (BIDI.test(name))
    return { ok: false, message: "The file name contains an invisible text-direction character; rename the file." };
  if (name.includes("..")) return { ok: false, message: 'The file name contains ".."; rename the file.' };
  if (/[/\\]/.test(name)) return { ok: false, message: "The file name contains a path separator (/ or \\); rename the file." };
  if (RESERVED.test(name)) return { ok: false, message: 'The file name contains one of < > : " | ? *; rename the file.' };
  if (name.startsWith(".")) return { ok: false, message: "The file name starts with a dot; rename the file." };
  const m = /\.([A-Za-z0-9]+)$/.exec(name);
  const ext = m?.[1].toLowerCase();
  if (!ext || !ALLOWED_EXTS.includes(ext)) {
    return { ok: false, message: "Only PDF, JPEG or PNG files are taken: the name must end in .pdf, .jpg, .jpeg or .png." };
  }
  return { ok: true, ext };
}

export function fmtBytes(n: number) {
  if (n < 1024) return `${n} B`;
  if (n < 1024 * 1024) return `${(n / 1024).toFixed(0)} KB`;
  return `${(n / 1024 / 1024).toFixed(1)} MB`;
}
