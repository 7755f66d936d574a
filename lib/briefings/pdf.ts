// The briefing sheet as a PDF (pdf-lib, the built-in Helvetica: no font is fetched or shipped).
// Letter size, one column, wrapped text, page breaks as needed; pole-check photos (JPEG/PNG)
// are embedded small. Server only.
import { PDFDocument, StandardFonts, rgb, type PDFFont, type PDFImage, type PDFPage } from "pdf-lib";
import { fmtDateTime } from "@/lib/format";
import { energyLabel } from "@/lib/orders/voltage";
import type { BriefingView } from "@/lib/briefings/model";
import { CONTROLS, FAIL_ACTIONS, FT_TO_M, GEAR, HAZARDS, POLE_CHECKS, type GearCheck } from "@/lib/briefings/model";

export const CAUTION =
  "This sheet is a record of the job briefing and an aid to it. It is not a substitute for the employer's safety procedures, " +
  "OSHA 29 CFR 1910.269 / 1926 Subpart V, the NESC, or local codes and agreements.";

const PAGE_W = 612;
const PAGE_H = 792;
const MARGIN = 48;
const INK = rgb(0.086, 0.137, 0.169);
const MUTED = rgb(0.34, 0.4, 0.42);
const COPPER = rgb(0.66, 0.35, 0.14);
const RULE = rgb(0.85, 0.83, 0.78);

const PLAIN: Record<string, string> = {
  "\u2713": "OK",
  "\u2714": "OK",
  "\u2717": "X",
  "\u26d4": "!",
  "\u25b2": "!",
  "\u25cf": "*",
  "\u2192": "->",
  "\u2190": "<-",
  "\u2264": "<=",
  "\u2265": ">=",
  "\u2212": "-",
  "\u00a0": " ",
  "\u202f": " ",
  "\u2009": " ",
};

export interface PhotoBytes {
  fileId: number;
  mime: string;
  bytes: Uint8Array;
}

class Writer {
  page!: PDFPage;
  y = 0;
  pages: PDFPage[] = [];
  constructor(
    private doc: PDFDocument,
    private font: PDFFont,
    private bold: PDFFont,
    private header: string,
  ) {
    this.newPage();
  }

  private charset = new Set<number>();
  clean(text: string): string {
    if (!this.charset.size) for (const c of this.font.getCharacterSet()) this.charset.add(c);
    let out = "";
    for (const ch of text.replace(/\r\n?/g, "\n")) {
      const cp = ch.codePointAt(0)!;
      if (ch === "\n" || this.charset.has(cp)) out += ch;
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
      this.page.drawText(this.clean(this.header), { x: MARGIN, y: this.y, size: 8, font: this.font, color: MUTED });
      this.y -= 18;
    }
  }

  ensure(h: number) {
    if (this.y - h < MARGIN + 20) this.newPage();
  }

  wrap(text: string, size: number, font: PDFFont, width: number): string[] {
    const lines: string[] = [];
    for (const para of this.clean(text).split("\n")) {
      const words = para.split(/\s+/).filter(Boolean);
      if (!words.length) {
        lines.push("");
        continue;
      }
      let line = "";
      for (const w of words) {
        const next = line ? `${line} ${w}` : w;
        if (font.widthOfTextAtSize(next, size) <= width) line = next;
        else {
          if (line) lines.push(line);
          // A single word wider than the line is cut.
          let word = w;
          while (font.widthOfTextAtSize(word, size) > width && word.length > 1) {
            let cut = word.length - 1;
            while (cut > 1 && font.widthOfTextAtSize(word.slice(0, cut), size) > width) cut--;
            lines.push(word.slice(0, cut));
            word = word.slice(cut);
          }
          line = word;
        }
      }
      lines.push(line);
    }
    return lines;
  }

  text(text: string, opts: { size?: number; bold?: boolean; color?: ReturnType<typeof rgb>; indent?: number; gap?: number } = {}) {
    const size = opts.size ?? 10;
    const font = opts.bold ? this.bold : this.font;
    const x = MARGIN + (opts.indent ?? 0);
    const lh = size * 1.3;
    for (const line of this.wrap(text, size, font, PAGE_W - MARGIN - x)) {
      this.ensure(lh);
      this.page.drawText(line, { x, y: this.y - size, size, font, color: opts.color ?? INK });
      this.y -= lh;
    }
    this.y -= opts.gap ?? 2;
  }

  /** A label in bold and its value beside it; both wrap in their own column. */
  pair(label: string, value: string, indent = 0) {
    const size = 10;
    const labelW = 150;
    const x = MARGIN + indent;
    const labels = this.wrap(label, size, this.bold, labelW - 8);
    const lines = this.wrap(value || "-", size, this.font, PAGE_W - MARGIN - x - labelW);
    const lh = size * 1.3;
    const rows = Math.max(labels.length, lines.length);
    this.ensure(lh * Math.min(rows, 3));
    for (let i = 0; i < rows; i++) {
      this.ensure(lh);
      if (labels[i]) this.page.drawText(labels[i], { x, y: this.y - size, size, font: this.bold, color: INK });
      if (lines[i]) this.page.drawText(lines[i], { x: x + labelW, y: this.y - size, size, font: this.font, color: INK });
      this.y -= lh;
    }
    this.y -= 2;
  }

  heading(text: string, cite?: string) {
    this.ensure(44);
    this.y -= 8;
    this.page.drawLine({ start: { x: MARGIN, y: this.y }, end: { x: PAGE_W - MARGIN, y: this.y }, thickness: 0.6, color: RULE });
    this.y -= 6;
    this.text(text.toUpperCase(), { size: 9, bold: true, color: COPPER, gap: cite ? 1 : 4 });
    if (cite) this.text(cite, { size: 8, color: MUTED, gap: 4 });
  }

  image(img: PDFImage, caption: string) {
    const w = 150;
    const h = (img.height / img.width) * w;
    const box = Math.min(h, 150);
    const scale = box / h;
    this.ensure(box * 1 + 16);
    this.page.drawImage(img, { x: MARGIN + 150, y: this.y - box, width: w * scale, height: box });
    this.y -= box + 2;
    this.text(caption, { size: 8, color: MUTED, indent: 150 });
  }
}

const RESULT_WORD: Record<string, string> = { pass: "PASS", fail: "FAIL", na: "n/a (not a wood pole)" };

function gearLine(g: GearCheck | null): string {
  if (!g) return "-";
  const bits: string[] = [];
  bits.push(`gloves ${g.gloves.result === "ok" ? `OK, tested ${g.gloves.testedOn}` : "not used"}`);
  bits.push(`sleeves ${g.sleeves.result === "ok" ? `OK, tested ${g.sleeves.testedOn}` : "not used"}`);
  for (const item of GEAR) bits.push(`${item.short} ${g[item.key] === "ok" ? "OK" : "not used"}`);
  return bits.join("; ") + (g.notes ? `. ${g.notes}` : "");
}

export async function briefingPdf(view: BriefingView, photos: PhotoBytes[] = [], now = new Date()): Promise<Uint8Array> {
  const { order, crew, data, briefing, acks } = view;
  const doc = await PDFDocument.create();
  const font = await doc.embedFont(StandardFonts.Helvetica);
  const bold = await doc.embedFont(StandardFonts.HelveticaBold);
  doc.setTitle(`Job briefing ${order.number}`);
  doc.setSubject(`${order.title}: job briefing and pole check`);
  doc.setProducer("Gaffline");
  doc.setCreator("Gaffline");
  doc.setCreationDate(now);
  const w = new Writer(doc, font, bold, `Job briefing ${order.number} - ${order.title}`);
  const tz = order.timezone;
  const name = (id: number | null) => crew.find((c) => c.workerId === id)?.name ?? "-";

  w.text("GAFFLINE · JOB BRIEFING AND POLE CHECK", { size: 9, bold: true, color: COPPER, gap: 4 });
  w.text(`${order.number}  ${order.title}`, { size: 16, bold: true, gap: 6 });
  w.pair("Where", [order.address, order.structureNo ? `pole ${order.structureNo}` : null].filter(Boolean).join(", "));
  w.pair("When", `${fmtDateTime(order.start, tz)} to ${fmtDateTime(order.end, tz)} (${order.yardName}, ${tz})`);
  w.pair("Work", `${order.workTypeName}; ${energyLabel(order)}`);
  const stateWord =
    briefing?.state === "briefed" ? `completed ${briefing.completedAt ? fmtDateTime(briefing.completedAt, tz) : ""}` : briefing?.state === "on_hold" ? "ON HOLD" : "draft, not completed";
  w.pair("Briefing", `round ${briefing?.round ?? 1}, ${stateWord}${briefing?.reason ? `. Re-brief: ${briefing.reason}` : ""}`);
  if (order.status === "on_hold") w.pair("Order on hold", order.holdReason ?? "");
  w.pair("Crew lead", name(view.leadWorkerId));

  w.heading("Crew");
  const ackOf = new Map(acks.map((a) => [a.workerId, a]));
  for (const c of crew) {
    const a = ackOf.get(c.workerId);
    w.pair(
      c.name,
      `${c.positionLabel} · ${c.employeeNo}${a ? ` · acknowledged ${fmtDateTime(a.acknowledgedAt, tz)}${a.inPerson ? ` (in person, recorded by ${a.recordedBy ?? "the lead"})` : ""}` : briefing?.state === "briefed" ? " · not acknowledged yet" : ""}`,
    );
  }

  w.heading("Hazards");
  for (const h of HAZARDS) {
    const v = data.hazards[h.key];
    w.pair(h.label, v.present ? `YES. ${v.notes}` : `none noted${v.notes ? `. ${v.notes}` : ""}`);
  }

  w.heading("Drop zone");
  const m = (data.dropZone.radiusFt * FT_TO_M).toFixed(1);
  w.pair("Radius", `${data.dropZone.radiusFt} ft (${m} m) around the pole${data.dropZone.reason ? `. Larger because: ${data.dropZone.reason}` : ""}`);
  w.pair("May enter", data.dropZone.entrants.length ? data.dropZone.entrants.map(name).join(", ") : "nobody while someone is aloft");
  if (data.dropZone.notes) w.pair("Notes", data.dropZone.notes);

  w.heading("Work procedure and special precautions");
  w.pair("Procedure", data.procedure.steps);
  w.pair("Precautions", data.procedure.precautions || "-");

  w.heading("Energy-source controls");
  const on = CONTROLS.filter((c) => data.controls[c.key]).map((c) => c.label);
  w.pair("In place", on.length ? on.join("; ") : "none ticked");
  if (data.controls.notes) w.pair("Notes", data.controls.notes);

  w.heading(
    "Pole check before anyone climbs",
    "29 CFR 1910.269(q)(1)(i): the pole must be found able to carry the stresses of the work before anyone climbs, or be braced or otherwise supported. Methods: Appendix D to 1910.269. Digging about 6 in. at the ground line on two sides is common practice.",
  );
  w.pair("Pole", data.poleCheck.material);
  const photoOf = new Map(photos.map((p) => [p.fileId, p]));
  for (const c of POLE_CHECKS) {
    const item = data.poleCheck.items[c.key];
    w.pair(c.label, `${item.result ? RESULT_WORD[item.result] : "not recorded"}${item.notes ? `. ${item.notes}` : ""}`);
    const photo = item.photoFileId ? photoOf.get(item.photoFileId) : undefined;
    if (photo && (photo.mime === "image/jpeg" || photo.mime === "image/png")) {
      try {
        const img = photo.mime === "image/png" ? await doc.embedPng(photo.bytes) : await doc.embedJpg(photo.bytes);
        w.image(img, `Photo: ${c.label}`);
      } catch {
        w.text("(photo could not be embedded)", { size: 8, color: MUTED, indent: 150 });
      }
    } else if (item.photoFileId) {
      w.text("(a PDF is attached to this check in Gaffline)", { size: 8, color: MUTED, indent: 150 });
    }
  }
  if (data.poleCheck.failAction) {
    const a = FAIL_ACTIONS.find((f) => f.key === data.poleCheck.failAction);
    w.pair("After the failure", `${a?.label ?? data.poleCheck.failAction}${data.poleCheck.failActionNotes ? `. ${data.poleCheck.failActionNotes}` : ""}`);
  }

  w.heading("Emergency plan");
  w.pair("Nearest hospital", [data.emergency.hospital, data.emergency.hospitalAddress].filter(Boolean).join(", "));
  w.pair("Calls 911", name(data.emergency.callerWorkerId));
  w.pair("Does the rescue", name(data.emergency.rescuerWorkerId));
  if (data.emergency.notes) w.pair("Notes", data.emergency.notes);

  w.heading("Acknowledgements and gear checks");
  if (!acks.length) w.text(briefing?.state === "briefed" ? "Nobody has acknowledged this round yet." : "Acknowledged once the crew lead completes the briefing.", { color: MUTED });
  for (const a of acks) {
    w.pair(a.name, `${fmtDateTime(a.acknowledgedAt, tz)}${a.inPerson ? " (in person)" : " (own sign-in)"}. ${gearLine(a.gearCheck)}`);
  }
  for (const p of view.pending) if (briefing?.state === "briefed") w.pair(p.name, "not acknowledged yet");

  w.heading("Caution");
  w.text(CAUTION, { size: 9 });
  w.text("Job briefing: 29 CFR 1910.269(c) (before each job, before the first job of each day or shift, and again when conditions change).", { size: 8, color: MUTED });

  const total = w.pages.length;
  w.pages.forEach((p, i) => {
    p.drawText(w.clean(`${order.number} · printed ${fmtDateTime(now, tz)} (${tz}) · page ${i + 1} of ${total}`), { x: MARGIN, y: MARGIN - 20, size: 8, font, color: MUTED });
  });
  return doc.save();
}
