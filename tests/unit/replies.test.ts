import { describe, expect, it } from "vitest";
import { parseReply, type ParsedReply } from "@/lib/notify/replies";

// The reply forms of issue 5. Opt-out / opt-in / help keywords: the standard carrier keywords
// (CTIA Messaging Principles and Best Practices; the provider's default opt-out keyword list:
// STOP, STOPALL, UNSUBSCRIBE, CANCEL, END, QUIT; START, UNSTOP; HELP, INFO), recalled from memory.
const cases: [string, string, ParsedReply][] = [
  // confirm, with a code: case- and space-insensitive, glued or spaced
  ["Y and a code", "Y 4821", { kind: "confirm", code: "4821" }],
  ["lower-case y", "y 4821", { kind: "confirm", code: "4821" }],
  ["glued", "Y4821", { kind: "confirm", code: "4821" }],
  ["spaces around and between", " y  4821 ", { kind: "confirm", code: "4821" }],
  ["tabs and a non-breaking space", "\tY\u00A04821\n", { kind: "confirm", code: "4821" }],
  ["YES and a code", "YES 4821", { kind: "confirm", code: "4821" }],
  ["yes glued", "yes4821", { kind: "confirm", code: "4821" }],
  ["a # before the code", "Y #4821", { kind: "confirm", code: "4821" }],
  ["thanks after the code", "Y 4821 thanks", { kind: "confirm", code: "4821" }],
  // confirm without a code (the person's one open request)
  ["bare Y", "Y", { kind: "confirm", code: null }],
  ["bare yes", "yes", { kind: "confirm", code: null }],
  ["Yes!", "Yes!", { kind: "confirm", code: null }],
  // decline, with and without a code and reason
  ["N and a code", "N 4821", { kind: "decline", code: "4821", reason: null }],
  ["NO and a code", "NO 4821", { kind: "decline", code: "4821", reason: null }],
  ["glued n", "n4821", { kind: "decline", code: "4821", reason: null }],
  ["a reason after the code", "N 4821 sick kid", { kind: "decline", code: "4821", reason: "sick kid" }],
  ["a reason after a dash", "N 4821 - truck in the shop", { kind: "decline", code: "4821", reason: "truck in the shop" }],
  ["reason keeps its case", "no 4821 Sick kid, sorry", { kind: "decline", code: "4821", reason: "Sick kid, sorry" }],
  ["bare N", "N", { kind: "decline", code: null, reason: null }],
  ["bare no", "no", { kind: "decline", code: null, reason: null }],
  ["no code, a reason", "N sick kid", { kind: "decline", code: null, reason: "sick kid" }],
  // opt-out words
  ["STOP", "STOP", { kind: "stop" }],
  ["stop, lower case", "stop", { kind: "stop" }],
  ["STOPALL", "STOPALL", { kind: "stop" }],
  ["UNSUBSCRIBE", "Unsubscribe", { kind: "stop" }],
  ["CANCEL", "cancel", { kind: "stop" }],
  ["END", "END", { kind: "stop" }],
  ["QUIT", " quit ", { kind: "stop" }],
  // opt back in
  ["START", "START", { kind: "start" }],
  ["UNSTOP", "unstop", { kind: "start" }],
  // help
  ["HELP", "HELP", { kind: "help" }],
  ["help?", "help?", { kind: "help" }],
  ["INFO", "info", { kind: "help" }],
  // nothing we know
  ["a question", "what time?", { kind: "unknown", text: "what time?" }],
  ["a word starting with Y", "Yesterday 4821", { kind: "unknown", text: "Yesterday 4821" }],
  ["empty", "   ", { kind: "unknown", text: "" }],
  ["yes with more words", "yes but late", { kind: "unknown", text: "yes but late" }],
];

describe("parseReply (issue 5 reply forms)", () => {
  it.each(cases)("%s: %j", (_name, text, expected) => {
    expect(parseReply(text)).toEqual(expected);
  });

  it("keeps a long reason to 500 characters (assignments.decline_reason is VARCHAR(500))", () => {
    const r = parseReply(`N 4821 ${"x".repeat(900)}`);
    expect(r.kind).toBe("decline");
    expect(r.kind === "decline" && r.reason?.length).toBe(500);
  });

  it("STOP with a code is not an opt-out (only the bare keyword is)", () => {
    expect(parseReply("STOP 4821").kind).toBe("unknown");
  });
});
