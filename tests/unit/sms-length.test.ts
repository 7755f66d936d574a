import { describe, expect, it } from "vitest";
import { gsmUnits, isGsm7, jobSms, MAX_GSM_UNITS, removalSms, replyText, smsSegments, toGsm7, type JobFacts } from "@/lib/notify/wording";

// SMS length rules, recalled from GSM 03.38 / 3GPP TS 23.038 and TS 23.040 (concatenation):
// the GSM 7-bit default alphabet carries 160 characters in one message and 153 per part when
// concatenated (a 6-octet user data header takes 7 septets); the extension table's characters
// (^ { } \ [ ] ~ | €) are sent as escape + character, two septets each. A single character
// outside the alphabet makes the message UCS-2: 70 per message, 67 per part.
describe("segment counting", () => {
  it.each([
    ["160 plain characters fit one segment", "a".repeat(160), { encoding: "GSM-7", units: 160, segments: 1 }],
    ["161 need two (153 + 8)", "a".repeat(161), { encoding: "GSM-7", units: 161, segments: 2 }],
    ["306 is the most two segments hold", "a".repeat(306), { encoding: "GSM-7", units: 306, segments: 2 }],
    ["307 need three", "a".repeat(307), { encoding: "GSM-7", units: 307, segments: 3 }],
    ["an extension character counts two (80 × € = 160 septets)", "€".repeat(80), { encoding: "GSM-7", units: 160, segments: 1 }],
    ["81 × € = 162 septets: two segments", "€".repeat(81), { encoding: "GSM-7", units: 162, segments: 2 }],
    ["[ ] { } ~ ^ | \\ are extension characters", "[]{}~^|\\", { encoding: "GSM-7", units: 16, segments: 1 }],
    ["basic-set accents stay GSM-7 (é ñ ü à Ç)", "éñüàÇ", { encoding: "GSM-7", units: 5, segments: 1 }],
    ["one emoji makes it UCS-2 (70 single)", "a".repeat(68) + "👍", { encoding: "UCS-2", units: 70, segments: 1 }],
    ["UCS-2 past 70: 67 per part", "á".repeat(71), { encoding: "UCS-2", units: 71, segments: 2 }],
  ])("%s", (_n, text, expected) => {
    expect(smsSegments(text)).toEqual(expected);
  });

  it("toGsm7 makes typographic marks plain and drops accents the alphabet lacks", () => {
    const t = toGsm7("O’Brien – “Piñon” Flats… á í ó ú ç ½");
    expect(t).toBe("O'Brien - \"Piñon\" Flats... a i o u c 1/2");
    expect(isGsm7(t)).toBe(true);
  });
});

const base: JobFacts = {
  assignmentId: 1,
  orderNumber: "WO-26-0101",
  title: "Change out 25 kVA transformer, pole N-1187",
  address: "418 Elm Rd",
  structureNo: "N-1187",
  start: new Date("2026-12-02T13:00:00Z"), // 07:00 in America/Chicago
  end: new Date("2026-12-02T21:30:00Z"),
  timezone: "America/Chicago",
  position: "climber",
  replyCode: "4821",
  workerFirstName: "Priya",
  workerName: "Priya Raman",
  yardName: "North Yard",
  dispatcherPhone: "+13205550191",
  crew: [],
  version: 1,
};

const long = (n: number) => Array.from({ length: n }, (_, i) => `word${i}`).join(" ");

describe("generated texts stay within two segments (≤ 306 GSM-7 septets)", () => {
  it("the ordinary assignment text reads as intended and fits one or two segments", () => {
    const t = jobSms("assignment", base);
    expect(t).toBe("Gaffline: Wed Dec 2 07:00-15:30 Climber on WO-26-0101 Change out 25 kVA transformer, pole N-1187, 418 Elm Rd. Reply Y 4821 to confirm, N 4821 to decline.");
    expect(smsSegments(t).segments).toBeLessThanOrEqual(2);
  });

  const variants: [string, Partial<JobFacts>][] = [
    ["a 200-character title", { title: long(40).slice(0, 200) }],
    ["a 1000-character title and address", { title: long(200), address: long(150) }],
    ["typographic and accented characters", { title: "Replace “woodpecker” – damaged pole at Piñon Flats… café ½ mile N of Ōtake", address: "733 Piñon Flats Road — Quillan Mesa" }],
    ["extension characters in the title", { title: "[URGENT] {feeder 7} ~ ^ | \\ € ".repeat(20) }],
    ["an emoji in the title", { title: "⚡ Storm restoration ⚡ ".repeat(10) }],
    ["an overnight job", { start: new Date("2026-12-03T04:00:00Z"), end: new Date("2026-12-03T12:00:00Z"), title: long(100) }],
  ];
  for (const kind of ["assignment", "change", "resend"] as const) {
    it.each(variants)(`${kind}: %s`, (_n, v) => {
      const t = jobSms(kind, { ...base, ...v });
      const s = smsSegments(t);
      expect(s.encoding).toBe("GSM-7");
      expect(s.units).toBeLessThanOrEqual(MAX_GSM_UNITS);
      expect(s.segments).toBeLessThanOrEqual(2);
      // What, where, when, position and how to answer always survive the shortening.
      expect(t).toContain("WO-26-0101");
      expect(t).toMatch(/Reply Y 4821 to confirm, N 4821 to decline\.$/);
      expect(t).toMatch(/\d\d:\d\d-/);
    });
  }

  it.each(variants)("removal: %s", (_n, v) => {
    const t = removalSms({ ...base, ...v });
    expect(smsSegments(t).segments).toBeLessThanOrEqual(2);
    expect(t).toContain("you're off WO-26-0101");
  });

  it("reply answers fit too, even for a worker with a very long name or many open jobs", () => {
    const texts = [
      replyText.confirmed("X".repeat(400), "WO-26-0101", "climber", "Wed Dec 2 07:00-15:30"),
      replyText.declined("Y".repeat(400), "WO-26-0101", true),
      replyText.ambiguous(Array.from({ length: 30 }, (_, i) => ({ code: String(1000 + i), number: `WO-26-0${100 + i}`, day: "Wed Dec 2" }))),
      replyText.help("(320) 555-0191"),
      replyText.unknown(),
      replyText.stopped(),
      replyText.started(),
      replyText.nothingOpen("(320) 555-0191"),
      replyText.noSuchCode("123456"),
      replyText.alreadyDeclined("WO-26-0101", "(320) 555-0191"),
    ];
    for (const t of texts) {
      expect(gsmUnits(t)).toBeLessThanOrEqual(MAX_GSM_UNITS);
      expect(smsSegments(t).segments).toBeLessThanOrEqual(2);
    }
  });
});
