import { describe, expect, it } from "vitest";
import { checkFileName, MAX_UPLOAD_BYTES } from "@/lib/files/model";
import { checkUpload, contentDisposition, sniffType } from "@/lib/files/data";
import { elfBytes, minimalPdf, mzBytes, tinyJpeg, tinyPng } from "@/tests/support/files";

// Type sniffing uses file-type (magic numbers); the expected types come from the format
// specifications named in tests/support/files.ts. Names are checked before the bytes.

describe("sniffType (file-type reading magic numbers)", () => {
  it("PDF: %PDF- header (ISO 32000-1 §7.5.2)", async () => expect((await sniffType(minimalPdf()))?.mime).toBe("application/pdf"));
  it("PNG: 8-byte signature (PNG spec §5.2)", async () => expect((await sniffType(tinyPng()))?.mime).toBe("image/png"));
  it("JPEG: SOI FF D8 FF (ITU T.81)", async () => expect((await sniffType(tinyJpeg()))?.mime).toBe("image/jpeg"));
  it("ELF: 7F 45 4C 46 (System V ABI)", async () => expect((await sniffType(elfBytes()))?.ext).toBe("elf"));
  it("MZ: DOS/PE executable", async () => expect((await sniffType(mzBytes()))?.ext).toBe("exe"));
  it("plain text has no magic number", async () => expect(await sniffType(Buffer.from("hello, world"))).toBeUndefined());
});

describe("checkFileName (common practice: refuse names that act as paths or hide what they are)", () => {
  it.each([
    ["climbing-card.pdf", "pdf"],
    ["Carte d’évaluation – Kowalczyk.PDF", "pdf"],
    ["scan 2026.jpeg", "jpeg"],
    ["photo.JPG", "jpg"],
    ["card.png", "png"],
  ])("accepts %s", (name, ext) => {
    const r = checkFileName(name);
    expect(r.ok).toBe(true);
    if (r.ok) expect(r.ext).toBe(ext);
  });

  it.each([
    ["../../etc/passwd.pdf", /\.\./],
    ["..\\windows\\card.pdf", /\.\./],
    ["uploads/card.pdf", /path separator/],
    ["C:\\card.pdf", /path separator/],
    ["card\u0000.pdf", /control character/],
    ["card\n.pdf", /control character/],
    ["invoice\u202Efdp.exe", /text-direction/],
    ["card.exe", /PDF, JPEG or PNG/],
    ["card", /PDF, JPEG or PNG/],
    [".pdf", /starts with a dot/],
    ['"card".pdf', /one of/],
    ["", /no name/],
    ["a".repeat(201) + ".pdf", /longer than 200/],
  ])("refuses %j", (name, message) => {
    const r = checkFileName(name);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toMatch(message);
  });
});

describe("checkUpload: size, then name, then the bytes", () => {
  it("a small PDF named .pdf is taken", async () => {
    expect(await checkUpload("card.pdf", minimalPdf())).toMatchObject({ ok: true, mime: "application/pdf" });
  });
  it("a PNG renamed .pdf is refused: the extension and the bytes disagree", async () => {
    const r = await checkUpload("card.pdf", tinyPng());
    expect(r).toMatchObject({ ok: false, status: 415 });
    if (!r.ok) expect(r.message).toMatch(/ends in \.pdf but the contents are a PNG image/);
  });
  it("a JPEG named .jpeg or .jpg is taken; named .png it is refused", async () => {
    expect((await checkUpload("c.jpeg", tinyJpeg())).ok).toBe(true);
    expect((await checkUpload("c.jpg", tinyJpeg())).ok).toBe(true);
    expect((await checkUpload("c.png", tinyJpeg())).ok).toBe(false);
  });
  it.each([
    ["ELF", elfBytes()],
    ["MZ", mzBytes()],
  ])("an executable (%s) renamed .png is refused as an executable", async (_k, bytes) => {
    const r = await checkUpload("card.png", bytes);
    expect(r).toMatchObject({ ok: false, status: 415 });
    if (!r.ok) expect(r.message).toMatch(/executable program/);
  });
  it("text renamed .pdf is refused (no magic number)", async () => {
    const r = await checkUpload("card.pdf", Buffer.from("%PD not really"));
    expect(r).toMatchObject({ ok: false, status: 415 });
  });
  it("exactly 10 MB is taken; one byte more is refused with 413", async () => {
    const pdf = minimalPdf();
    const at = Buffer.concat([pdf, Buffer.alloc(MAX_UPLOAD_BYTES - pdf.length, 0x20)]);
    expect((await checkUpload("big.pdf", at)).ok).toBe(true);
    const over = Buffer.concat([at, Buffer.from(" ")]);
    const r = await checkUpload("big.pdf", over);
    expect(r).toMatchObject({ ok: false, status: 413 });
    if (!r.ok) expect(r.message).toMatch(/limit is 10 MB/);
  });
  it("an 11 MB file is refused before anything else is looked at", async () => {
    const r = await checkUpload("../x.exe", Buffer.alloc(11 * 1024 * 1024));
    expect(r).toMatchObject({ ok: false, status: 413 });
  });
  it("an empty file is refused", async () => {
    expect(await checkUpload("card.pdf", Buffer.alloc(0))).toMatchObject({ ok: false, status: 422 });
  });
  it("a bad name is refused before sniffing", async () => {
    const r = await checkUpload("../card.pdf", minimalPdf());
    expect(r).toMatchObject({ ok: false, status: 422 });
  });
});

describe("contentDisposition (RFC 6266 with RFC 8187 / 5987 filename*)", () => {
  it("plain ASCII: filename only", () => {
    expect(contentDisposition("card.pdf")).toBe('attachment; filename="card.pdf"');
  });
  it("non-ASCII: an ASCII fallback plus filename*=UTF-8''percent-encoded (RFC 6266 §5 example)", () => {
    // RFC 6266 §5: attachment; filename="EURO rates"; filename*=utf-8''%e2%82%ac%20rates
    expect(contentDisposition("€ rates.pdf")).toBe(`attachment; filename="_ rates.pdf"; filename*=UTF-8''%E2%82%AC%20rates.pdf`);
    expect(contentDisposition("Évaluation.pdf")).toContain("filename*=UTF-8''%C3%89valuation.pdf");
  });
  it("quotes and backslashes never break out of the quoted string", () => {
    const h = contentDisposition('a"b\\c.pdf');
    expect(h.startsWith('attachment; filename="a_b_c.pdf"')).toBe(true);
    expect(h).toContain("filename*=UTF-8''a%22b%5Cc.pdf");
  });
  it("RFC 8187 attr-char: ' ( ) * are percent-encoded too", () => {
    expect(contentDisposition("l'été (1).pdf")).toContain("filename*=UTF-8''l%27%C3%A9t%C3%A9%20%281%29.pdf");
  });
});
