// The day sheet as a PDF (pdf-lib and its built-in Helvetica, as lib/briefings/pdf.ts: no font
// is fetched or shipped). Letter size; each page carries the caution at its foot, the first
// page at its head too. Server only.
import { PDFDocument, StandardFonts, rgb, type PDFFont, type PDFPage } from "pdf-lib";
import { crewLine, DAY_SHEET_CAUTION, findingLine, sheetTitle, type DaySheet } from "./model";

const PAGE_W = 612;
const PAGE_H = 792;
const MARGIN = 40;
const FOOT = 46;
const INK = rgb(0.086, 0.137, 0.169);
const MUTED = rgb(0.34, 0.4, 0.42);
const COPPER = rgb(0.66, 0.35, 0.14);
const BLOCK = rgb(0.7, 0.28, 0);
const WARN = rgb(0.54, 0.35, 0);
const RULE = rgb(0.85, 0.83, 0.78);

const PLAIN: Record<string, string> = { "\u2013": "-", "\u2014": "-", "\u2019": "'", "\u2018": "'", "\u201c": '"', "\u201d": '"', "\u00a0": " ", "\u202f": " ", "\u2009": " ", "\u2264": "<=", "\u2265": ">=", "\u00d7": "x" };

class Sheet {
  page!: PDFPage;
  y = 0;
  pages: PDFPage[] = [];
  private charset = new Set<number>();
  constructor(
    private doc: PDFDocument,
    private font: PDFFont,
    private bold: PDFFont,
    private header: string,
  ) {
    for (const c of font.getCharacterSet()) this.charset.add(c);
    this.newPage();
  }

  clean(text: string) {
    let out = "";
    for (const ch of text) {
      if (this.charset.has(ch.codePointAt(0)!)) out += ch;
      else if (PLAIN[ch] !== undefined) out += PLAIN[ch];
      else {
        const base = ch.normalize("NFD").replace(/[\u0300-\u036f]/g, "");
        out += base && [...base].every((c) => this.charset.has(c.codePointAt(0)!)) ? base : "?";
      }
    }
    return out;
  }

  newPage() {
    this.page = this.doc.addPage([PAGE_W, PAGE_H]);
    this.pages.push(this.page);
    this.y = PAGE_H - MARGIN;
    if (this.pages.length > 1) {
      this.page.drawText(this.clean(this.header), { x: MARGIN, y: this.y - 8, size: 8, font: this.font, color: MUTED });
      this.y -= 20;
    }
  }

  ensure(h: number) {
    if (this.y - h < MARGIN + FOOT) this.newPage();
  }

  wrap(text: string, size: number, font: PDFFont, width: number) {
    const lines: string[] = [];
    const words = this.clean(text).split(/\s+/).filter(Boolean);
    let line = "";
    for (const w of words) {
      const next = line ? `${line} ${w}` : w;
      if (font.widthOfTextAtSize(next, size) <= width) line = next;
      else {
        if (line) lines.push(line);
        line = w;
      }
    }
    if (line) lines.push(line);
    return lines.length ? lines : [""];
  }

  text(text: string, o: { size?: number; bold?: boolean; color?: ReturnType<typeof rgb>; indent?: number; gap?: number } = {}) {
    const size = o.size ?? 9.5;
    const font = o.bold ? this.bold : this.font;
    const x = MARGIN + (o.indent ?? 0);
    const lh = size * 1.3;
    for (const line of this.wrap(text, size, font, PAGE_W - MARGIN - x)) {
      this.ensure(lh);
      this.page.drawText(line, { x, y: this.y - size, size, font, color: o.color ?? INK });
      this.y -= lh;
    }
    this.y -= o.gap ?? 1;
  }

  /** A block that should not split from its first lines: keep `h` points together. */
  keep(h: number) {
    this.ensure(Math.min(h, PAGE_H - 2 * MARGIN - FOOT - 30));
  }

  rule() {
    this.ensure(8);
    this.page.drawLine({ start: { x: MARGIN, y: this.y - 3 }, end: { x: PAGE_W - MARGIN, y: this.y - 3 }, thickness: 0.6, color: RULE });
    this.y -= 8;
  }

  /** The caution at the foot of every page, and the page number. */
  footers(caution: string) {
    const n = this.pages.length;
    this.pages.forEach((p, i) => {
      const lines = this.wrap(caution, 7, this.font, PAGE_W - 2 * MARGIN);
      let y = MARGIN + 10 + lines.length * 9;
      for (const l of lines) {
        p.drawText(l, { x: MARGIN, y, size: 7, font: this.font, color: MUTED });
        y -= 9;
      }
      p.drawText(this.clean(`Page ${i + 1} of ${n}`), { x: PAGE_W - MARGIN - 50, y: MARGIN - 4, size: 7, font: this.font, color: MUTED });
    });
  }
}

export async function daySheetPdf(sheet: DaySheet, now = new Date()): Promise<Uint8Array> {
  const doc = await PDFDocument.create();
  const font = await doc.embedFont(StandardFonts.Helvetica);
  const bold = await doc.embedFont(StandardFonts.HelveticaBold);
  const title = sheetTitle(sheet);
  doc.setTitle(title);
  doc.setSubject("Every crew of the day: crew, trucks, findings");
  doc.setProducer("Gaffline");
  doc.setCreator("Gaffline");
  doc.setCreationDate(now);
  const w = new Sheet(doc, font, bold, title);
  w.text("GAFFLINE · DAY SHEET", { size: 9, bold: true, color: COPPER, gap: 3 });
  w.text(sheet.dayWords, { size: 18, bold: true, gap: 4 });
  w.text(DAY_SHEET_CAUTION, { size: 8.5, color: MUTED, gap: 8 });
  for (const yard of sheet.yards) {
    w.keep(60);
    w.text(`${yard.name} - times in ${yard.zone} (${yard.timezone})`, { size: 13, bold: true, gap: 2 });
    w.text(yard.orders.length === 1 ? "1 order" : `${yard.orders.length} orders`, { size: 8.5, color: MUTED, gap: 4 });
    if (!yard.orders.length) w.text("No orders on this day.", { gap: 8 });
    for (const o of yard.orders) {
      w.keep(70 + o.crew.length * 12);
      w.rule();
      w.text(`${o.number}  ${o.title}`, { size: 11, bold: true, gap: 1 });
      w.text(`${o.when} · ${o.where}`, { gap: 0 });
      w.text(`${o.work} · ${o.status}${o.holdReason ? `: ${o.holdReason}` : ""}`, { color: MUTED, gap: 3 });
      w.text("Crew", { bold: true, size: 9, gap: 0 });
      for (const c of o.crew) w.text(crewLine(c), { indent: 10, gap: 0 });
      if (!o.crew.length) w.text("No positions.", { indent: 10, gap: 0 });
      w.text(`Truck${o.trucks.length === 1 ? "" : "s"}: ${o.trucks.length ? o.trucks.join("; ") : "none booked"}`, { gap: 2 });
      if (o.locateWarning) w.text(`Locate: ${o.locateWarning}`, { color: WARN, gap: 1 });
      if (o.findings.length) {
        w.text("Findings", { bold: true, size: 9, gap: 0 });
        for (const f of o.findings) w.text(findingLine(f), { indent: 10, color: f.override ? MUTED : f.level === "block" ? BLOCK : WARN, gap: 0 });
      } else {
        w.text("Findings: none for this crew.", { gap: 0 });
      }
      w.y -= 6;
    }
    w.y -= 8;
  }
  w.footers(DAY_SHEET_CAUTION);
  return doc.save();
}
