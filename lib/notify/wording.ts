// The wording of every text and e-mail Gaffline sends, and the SMS length rules.
//
// Texts stay within two SMS segments. GSM 03.38 / 3GPP TS 23.038 (recalled from memory): the
// 7-bit default alphabet fits 160 characters in one message, 153 per part once concatenated
// (the user data header takes 7 septets); characters of the extension table (^ { } \ [ ] ~ | €)
// take two septets (escape + char). One character outside the alphabet switches the whole
// message to UCS-2: 70 per message, 67 per part. So we map typographic characters to plain
// ones and drop accents the GSM alphabet lacks before measuring.
import { createEvent, type DateArray } from "ics";
import { parsePhoneNumberFromString } from "libphonenumber-js";
import { POSITION_LABEL } from "@/lib/format";

export const MAX_SEGMENTS = 2;
export const GSM_SINGLE = 160;
export const GSM_PART = 153;
export const UCS2_SINGLE = 70;
export const UCS2_PART = 67;
export const MAX_GSM_UNITS = GSM_PART * MAX_SEGMENTS; // 306

const GSM_BASIC =
  "@£$¥èéùìòÇ\nØø\rÅåΔ_ΦΓΛΩΠΨΣΘΞÆæßÉ !\"#¤%&'()*+,-./0123456789:;<=>?¡ABCDEFGHIJKLMNOPQRSTUVWXYZÄÖÑÜ§¿abcdefghijklmnopqrstuvwxyzäöñüà";
const GSM_EXTENSION = "^{}\\[~]|€\f";
const BASIC = new Set([...GSM_BASIC]);
const EXTENSION = new Set([...GSM_EXTENSION]);

export function isGsm7(text: string) {
  for (const ch of text) if (!BASIC.has(ch) && !EXTENSION.has(ch)) return false;
  return true;
}

/** Septets a GSM-7 text takes (extension characters count 2). */
export function gsmUnits(text: string) {
  let n = 0;
  for (const ch of text) n += EXTENSION.has(ch) ? 2 : 1;
  return n;
}

export function smsSegments(text: string): { encoding: "GSM-7" | "UCS-2"; units: number; segments: number } {
  if (isGsm7(text)) {
    const units = gsmUnits(text);
    return { encoding: "GSM-7", units, segments: units <= GSM_SINGLE ? 1 : Math.ceil(units / GSM_PART) };
  }
  const units = text.length; // UTF-16 code units
  return { encoding: "UCS-2", units, segments: units <= UCS2_SINGLE ? 1 : Math.ceil(units / UCS2_PART) };
}

const TYPOGRAPHIC: Record<string, string> = {
  "\u2018": "'", "\u2019": "'", "\u201A": "'", "\u201B": "'", "\u2032": "'", "\u00B4": "'", "`": "'",
  "\u201C": '"', "\u201D": '"', "\u201E": '"', "\u2033": '"', "\u00AB": '"', "\u00BB": '"',
  "\u2010": "-", "\u2011": "-", "\u2012": "-", "\u2013": "-", "\u2014": "-", "\u2015": "-", "\u2212": "-",
  "\u2026": "...", "\u00A0": " ", "\u2009": " ", "\u202F": " ", "\u2022": "*", "\u00B7": "-", "\u00D7": "x",
  "\u00B0": " deg", "\u00BD": "1/2", "\u00BC": "1/4", "\u00BE": "3/4", "\t": " ",
};

/** Text as the GSM-7 alphabet can carry it: typographic marks made plain, missing accents dropped. */
export function toGsm7(text: string) {
  let out = "";
  for (const ch of text) {
    if (BASIC.has(ch) || EXTENSION.has(ch)) out += ch;
    else if (TYPOGRAPHIC[ch] !== undefined) out += TYPOGRAPHIC[ch];
    else if (/\p{Extended_Pictographic}|\p{So}|\p{M}|\p{Cf}/u.test(ch)) continue; // emoji, symbols, joiners
    else {
      const base = ch.normalize("NFD").replace(/[\u0300-\u036f]/g, "");
      out += [...base].every((c) => BASIC.has(c)) && base ? base : "?";
    }
  }
  return out.replace(/ {2,}/g, " ").trim();
}

/**
 * Fills a template so the text fits MAX_SEGMENTS GSM-7 segments, shortening the named parts
 * (in the order given) with "..." when it is too long.
 */
export function fitSms(template: (p: Record<string, string>) => string, parts: Record<string, string>, shrink: string[]) {
  const p: Record<string, string> = {};
  for (const [k, v] of Object.entries(parts)) p[k] = toGsm7(v);
  for (const key of shrink) {
    const over = gsmUnits(template(p)) - MAX_GSM_UNITS;
    if (over <= 0) break;
    const chars = [...p[key]];
    const keep = chars.length - over - 3;
    p[key] = keep >= 4 ? chars.slice(0, keep).join("").trimEnd() + "..." : "";
  }
  let text = template(p).replace(/\.{4,}/g, "...");
  if (gsmUnits(text) > MAX_GSM_UNITS) {
    // Only when the fixed words alone are too long (never with our templates).
    let cut = "";
    for (const ch of text) {
      if (gsmUnits(cut + ch) > MAX_GSM_UNITS) break;
      cut += ch;
    }
    text = cut;
  }
  return text;
}

// --- facts about a job -------------------------------------------------------------------------

export interface JobFacts {
  assignmentId: number;
  orderNumber: string;
  title: string;
  address: string | null;
  structureNo: string | null;
  start: Date;
  end: Date;
  timezone: string;
  position: string; // climber, lead, …
  replyCode: string;
  workerFirstName: string;
  workerName: string;
  yardName: string;
  dispatcherPhone: string | null;
  crew: { name: string; position: string }[];
  version: number;
  /** The equipment on the order (issue 16): unit number and name. */
  trucks?: { unit: string; name: string }[];
}

export function positionLabel(p: string) {
  return POSITION_LABEL[p] ?? p;
}

function partsOf(d: Date, timezone: string) {
  const f = new Intl.DateTimeFormat("en-US", {
    timeZone: timezone,
    weekday: "short",
    month: "short",
    day: "numeric",
    hour: "2-digit",
    minute: "2-digit",
    hour12: false,
  }).formatToParts(d);
  const get = (t: string) => f.find((x) => x.type === t)?.value ?? "";
  const hour = get("hour") === "24" ? "00" : get("hour");
  return { day: `${get("weekday")} ${get("month")} ${get("day")}`, weekday: get("weekday"), time: `${hour}:${get("minute")}` };
}

/** "Tue Dec 2 07:00-15:30" in the yard's zone (the end's weekday added when it is another day). */
export function whenText(start: Date, end: Date, timezone: string) {
  const a = partsOf(start, timezone);
  const b = partsOf(end, timezone);
  return a.day === b.day ? `${a.day} ${a.time}-${b.time}` : `${a.day} ${a.time}-${b.weekday} ${b.time}`;
}

export function shortDay(start: Date, timezone: string) {
  return partsOf(start, timezone).day;
}

export function formatPhone(e164: string | null | undefined) {
  if (!e164) return null;
  const p = parsePhoneNumberFromString(e164);
  return p ? p.formatNational() : e164;
}

/** "Truck N-314." / "Trucks N-314, N-502." — the unit numbers the crew takes (issue 16). */
export function trucksText(trucks: { unit: string }[] | undefined) {
  if (!trucks?.length) return "";
  return `${trucks.length > 1 ? "Trucks" : "Truck"} ${trucks.map((t) => t.unit).join(", ")}.`;
}

/** Where: the pole (unless the title already names it) and the address. */
function placeText(f: Pick<JobFacts, "title" | "structureNo" | "address">) {
  const bits: string[] = [];
  if (f.structureNo && !f.title.toLowerCase().includes(f.structureNo.toLowerCase())) bits.push(`pole ${f.structureNo}`);
  if (f.address) bits.push(f.address);
  return bits.join(", ");
}

// --- texts ---------------------------------------------------------------------------------------

export type OutboundKind = "assignment" | "change" | "removal" | "resend";

export function jobSms(kind: Exclude<OutboundKind, "removal">, f: JobFacts) {
  const lead = kind === "change" ? "Gaffline CHANGE:" : kind === "resend" ? "Gaffline reminder:" : "Gaffline:";
  const tail = `Reply Y ${f.replyCode} to confirm, N ${f.replyCode} to decline.`;
  return fitSms(
    (p) => `${lead} ${p.when} ${p.position} on ${p.number} ${p.title}${p.place ? `, ${p.place}` : ""}. ${p.trucks ? `${p.trucks} ` : ""}${tail}`,
    {
      when: whenText(f.start, f.end, f.timezone),
      position: positionLabel(f.position),
      number: f.orderNumber,
      title: f.title.trim(),
      place: placeText(f),
      trucks: trucksText(f.trucks),
    },
    ["title", "place"],
  );
}

export function removalSms(f: JobFacts) {
  const phone = formatPhone(f.dispatcherPhone);
  return fitSms(
    (p) => `Gaffline: you're off ${p.number} (${p.when}, ${p.position}) ${p.title}. No reply needed.${phone ? ` Questions: ${phone}.` : ""}`,
    { number: f.orderNumber, when: whenText(f.start, f.end, f.timezone), position: positionLabel(f.position), title: f.title.trim() },
    ["title"],
  );
}

/** Answers to a text reply (the TwiML message back). */
export const replyText = {
  confirmed: (first: string, number: string, position: string, when: string) =>
    fitSms((p) => `Thanks ${p.first}, you're confirmed: ${p.position} on ${p.number}, ${p.when}.`, { first, number, position: positionLabel(position), when }, ["first"]),
  alreadyConfirmed: (number: string) => `Gaffline: you're already confirmed on ${number}. Nothing changed.`,
  declined: (first: string, number: string, withReason: boolean) =>
    fitSms(
      (p) => `Got it, ${p.first}: you've declined ${p.number}.${withReason ? " Reason noted." : ""} Dispatch will fill the position.`,
      { first, number },
      ["first"],
    ),
  alreadyDeclined: (number: string, dispatcher: string | null) =>
    `Gaffline: you already declined ${number}.${dispatcher ? ` To change that, call dispatch at ${dispatcher}.` : " To change that, call dispatch."}`,
  notOpen: (number: string, dispatcher: string | null) =>
    `Gaffline: ${number} is no longer waiting for your answer.${dispatcher ? ` Questions: ${dispatcher}.` : ""}`,
  nothingOpen: (dispatcher: string | null) =>
    `Gaffline: nothing is waiting for your answer right now.${dispatcher ? ` Questions: call dispatch at ${dispatcher}.` : ""}`,
  noSuchCode: (code: string) =>
    `Gaffline: no job with code ${code} for this phone. Check the code in our text and reply Y or N with it, or HELP.`,
  ambiguous: (open: { code: string; number: string; day: string }[]) =>
    fitSms(
      (p) => `Gaffline: you have ${open.length} jobs waiting. Reply with the code, e.g. Y ${open[0].code}: ${p.list}`,
      { list: open.map((o) => `${o.code} = ${o.number} ${o.day}`).join("; ") + "." },
      ["list"],
    ),
  unknown: () => "Gaffline: reply Y and the code to confirm, or N and the code to decline (e.g. Y 4821). HELP for the dispatcher's number, STOP to end texts.",
  unknownNumber: () => "Gaffline: this phone number is not on file. Ask your dispatcher to add it.",
  help: (dispatcher: string | null) =>
    `Gaffline crew texts.${dispatcher ? ` Dispatch: ${dispatcher}.` : ""} Reply Y <code> to confirm a job, N <code> to decline, STOP to end texts. Msg&data rates may apply.`,
  stopped: () => "Gaffline: you won't get crew texts any more. Reply START to get them again.",
  started: () => "Gaffline: crew texts are back on. Reply HELP for help, STOP to end.",
};

// --- e-mail ----------------------------------------------------------------------------------------

export interface EmailContent {
  subject: string;
  text: string;
  html: string;
  attachments: { filename: string; contentType: string; content: string }[];
}

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);

function utcArray(d: Date): DateArray {
  return [d.getUTCFullYear(), d.getUTCMonth() + 1, d.getUTCDate(), d.getUTCHours(), d.getUTCMinutes()];
}

/** An iCalendar event for the job (RFC 5545), or its cancellation when the worker is taken off. */
export function jobIcs(f: JobFacts, opts: { cancel?: boolean; myWeekUrl: string }) {
  const place = [f.address, f.structureNo ? `pole ${f.structureNo}` : null].filter(Boolean).join(", ");
  const { error, value } = createEvent({
    productId: "gaffline/crew-dispatch",
    method: opts.cancel ? "CANCEL" : "PUBLISH",
    uid: `assignment-${f.assignmentId}@gaffline`,
    sequence: f.version,
    start: utcArray(f.start),
    startInputType: "utc",
    startOutputType: "utc",
    end: utcArray(f.end),
    endInputType: "utc",
    endOutputType: "utc",
    title: `${f.orderNumber} ${positionLabel(f.position)}: ${f.title}`,
    location: place || undefined,
    description:
      `${positionLabel(f.position)} on ${f.orderNumber} — ${f.title}.\n` +
      (f.crew.length ? `Crew: ${f.crew.map((c) => `${c.name} (${positionLabel(c.position)})`).join(", ")}.\n` : "") +
      `Reply to our text with Y ${f.replyCode} to confirm or N ${f.replyCode} to decline, or answer on My week: ${opts.myWeekUrl}`,
    status: opts.cancel ? "CANCELLED" : "CONFIRMED",
    busyStatus: opts.cancel ? "FREE" : "BUSY",
  });
  if (error || !value) throw error ?? new Error("could not build the calendar event");
  return value;
}

export function jobEmail(kind: OutboundKind, f: JobFacts, appUrl: string): EmailContent {
  const myWeek = `${appUrl.replace(/\/$/, "")}/me`;
  const when = whenText(f.start, f.end, f.timezone);
  const pos = positionLabel(f.position);
  const place = placeText(f) || "see the work order";
  const dispatcher = formatPhone(f.dispatcherPhone);
  const zoneNote = `times in ${f.timezone.replace(/_/g, " ")}`;
  if (kind === "removal") {
    const subject = `Off ${f.orderNumber} (${shortDay(f.start, f.timezone)}): you are no longer on this job`;
    const text = [
      `Hello ${f.workerFirstName},`,
      "",
      `You have been taken off ${f.orderNumber} — ${f.title}.`,
      `It was: ${pos}, ${when} (${zoneNote}), ${place}.`,
      "",
      "No reply is needed. The attached calendar update removes it from your calendar.",
      dispatcher ? `Questions: call dispatch at ${dispatcher}.` : "",
      `Your week: ${myWeek}`,
      "",
      `— Gaffline, ${f.yardName}`,
    ].join("\n");
    const html = `<p>Hello ${esc(f.workerFirstName)},</p><p>You have been taken off <strong>${esc(f.orderNumber)}</strong> — ${esc(f.title)}.</p><p>It was: ${esc(pos)}, ${esc(when)} (${esc(zoneNote)}), ${esc(place)}.</p><p>No reply is needed. The attached calendar update removes it from your calendar.${dispatcher ? ` Questions: call dispatch at ${esc(dispatcher)}.` : ""}</p><p><a href="${esc(myWeek)}">Open My week</a></p><p>— Gaffline, ${esc(f.yardName)}</p>`;
    return {
      subject,
      text,
      html,
      attachments: [{ filename: `${f.orderNumber}-cancel.ics`, contentType: "text/calendar; method=CANCEL; charset=utf-8", content: jobIcs(f, { cancel: true, myWeekUrl: myWeek }) }],
    };
  }
  const prefix = kind === "change" ? "Changed: " : kind === "resend" ? "Reminder: " : "";
  const subject = `${prefix}${shortDay(f.start, f.timezone)} ${pos} on ${f.orderNumber} — ${f.title}`.slice(0, 250);
  const crew = f.crew.map((c) => `  - ${c.name}, ${positionLabel(c.position)}`);
  const text = [
    `Hello ${f.workerFirstName},`,
    "",
    kind === "change" ? `The time or place of your job changed. Here it is as it stands now:` : `You are on this job:`,
    "",
    `  Work order: ${f.orderNumber} — ${f.title}`,
    `  Position:   ${pos}`,
    `  When:       ${when} (${zoneNote})`,
    `  Where:      ${place}`,
    ...(f.trucks?.length ? [`  Equipment:  ${f.trucks.map((t) => `${t.unit} ${t.name}`).join("; ")}`] : []),
    "",
    "Crew:",
    ...(crew.length ? crew : ["  (you so far)"]),
    "",
    `Please answer: reply to our text with Y ${f.replyCode} to confirm or N ${f.replyCode} to decline, or answer on My week: ${myWeek}`,
    dispatcher ? `Questions: call dispatch at ${dispatcher}.` : "",
    "",
    "The attached calendar file puts the job in your phone's calendar.",
    "",
    `— Gaffline, ${f.yardName}`,
  ].join("\n");
  const html =
    `<p>Hello ${esc(f.workerFirstName)},</p>` +
    `<p>${kind === "change" ? "The time or place of your job changed. Here it is as it stands now:" : "You are on this job:"}</p>` +
    `<table cellpadding="4" style="border-collapse:collapse">` +
    `<tr><th align="left">Work order</th><td>${esc(f.orderNumber)} — ${esc(f.title)}</td></tr>` +
    `<tr><th align="left">Position</th><td>${esc(pos)}</td></tr>` +
    `<tr><th align="left">When</th><td>${esc(when)} (${esc(zoneNote)})</td></tr>` +
    `<tr><th align="left">Where</th><td>${esc(place)}</td></tr>` +
    (f.trucks?.length ? `<tr><th align="left">Equipment</th><td>${f.trucks.map((t) => `${esc(t.unit)} ${esc(t.name)}`).join("; ")}</td></tr>` : "") +
    `</table>` +
    `<p><strong>Crew</strong></p><ul>${f.crew.map((c) => `<li>${esc(c.name)}, ${esc(positionLabel(c.position))}</li>`).join("") || "<li>(you so far)</li>"}</ul>` +
    `<p>Please answer: reply to our text with <strong>Y ${esc(f.replyCode)}</strong> to confirm or <strong>N ${esc(f.replyCode)}</strong> to decline, or answer on <a href="${esc(myWeek)}">My week</a>.${dispatcher ? ` Questions: call dispatch at ${esc(dispatcher)}.` : ""}</p>` +
    `<p>The attached calendar file puts the job in your phone's calendar.</p><p>— Gaffline, ${esc(f.yardName)}</p>`;
  return {
    subject,
    text,
    html,
    attachments: [{ filename: `${f.orderNumber}.ics`, contentType: "text/calendar; method=PUBLISH; charset=utf-8", content: jobIcs(f, { myWeekUrl: myWeek }) }],
  };
}
