// Hand-built bytes for upload tests. Magic numbers as the format specifications give them.

/** A minimal one-page PDF (ISO 32000-1 §7.5: header "%PDF-1.4", body, xref, trailer, "%%EOF"). */
export function minimalPdf(text = "Climbing evaluation"): Buffer {
  const objs = [
    "<< /Type /Catalog /Pages 2 0 R >>",
    "<< /Type /Pages /Kids [3 0 R] /Count 1 >>",
    "<< /Type /Page /Parent 2 0 R /MediaBox [0 0 200 100] /Contents 4 0 R >>",
  ];
  const stream = `BT /F1 12 Tf 10 50 Td (${text}) Tj ET`;
  objs.push(`<< /Length ${stream.length} >>\nstream\n${stream}\nendstream`);
  let body = "%PDF-1.4\n";
  const offsets: number[] = [];
  objs.forEach((o, i) => {
    offsets.push(body.length);
    body += `${i + 1} 0 obj\n${o}\nendobj\n`;
  });
  const xref = body.length;
  body += `xref\n0 ${objs.length + 1}\n0000000000 65535 f \n`;
  for (const off of offsets) body += `${String(off).padStart(10, "0")} 00000 n \n`;
  body += `trailer\n<< /Size ${objs.length + 1} /Root 1 0 R >>\nstartxref\n${xref}\n%%EOF\n`;
  return Buffer.from(body, "latin1");
}

/**
 * A 1×1 transparent PNG (PNG spec §5.2 signature 89 50 4E 47 0D 0A 1A 0A, then IHDR, pHYs,
 * IDAT, IEND), written by libpng through sharp: decodable, since uploaded photos are now
 * re-encoded (the previous hand-made bytes had a bad IDAT that libpng refuses).
 */
export const tinyPng = () =>
  Buffer.from(
    "89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000970485973000003e8000003e801b57b526b0000000d4944415408d763606060600000000500015ef32a3a0000000049454e44ae426082",
    "hex",
  );

/** JPEG/JFIF start: SOI FF D8, APP0 "JFIF" (ITU T.81 / JFIF 1.02), then EOI. */
export const tinyJpeg = () =>
  Buffer.from([0xff, 0xd8, 0xff, 0xe0, 0x00, 0x10, 0x4a, 0x46, 0x49, 0x46, 0x00, 0x01, 0x01, 0x00, 0x00, 0x01, 0x00, 0x01, 0x00, 0x00, 0xff, 0xd9]);

/** An ELF header (System V ABI: 7F 'E' 'L' 'F', class 64-bit, little-endian, version 1). */
export const elfBytes = () => Buffer.concat([Buffer.from([0x7f, 0x45, 0x4c, 0x46, 0x02, 0x01, 0x01, 0x00]), Buffer.alloc(120)]);

/** A DOS/PE executable start: "MZ" (Microsoft PE format, DOS stub). */
export const mzBytes = () => Buffer.concat([Buffer.from("MZ", "latin1"), Buffer.alloc(254)]);
