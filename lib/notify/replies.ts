// The text-reply parser. Pure: no I/O, so the webhook, the tests and any future channel share it.
//
// What a lineworker may send (case- and space-insensitive):
//   Y 4821 / YES 4821 / Y4821 / " y  4821 "   confirm the job with reply code 4821
//   N 4821 / NO 4821 / N4821 sick kid          decline it (anything after the code is the reason)
//   Y / YES / N / NO                            the one open request, when there is exactly one
//   STOP, STOPALL, UNSUBSCRIBE, CANCEL, END, QUIT   no more texts
//   START, UNSTOP                               texts again
//   HELP, INFO                                  the dispatcher's number
// The opt-out and help words are the carrier keywords every US short/long code honours
// (CTIA Messaging Principles and Best Practices, recalled from memory).

export type ParsedReply =
  | { kind: "confirm"; code: string | null }
  | { kind: "decline"; code: string | null; reason: string | null }
  | { kind: "stop" }
  | { kind: "start" }
  | { kind: "help" }
  | { kind: "unknown"; text: string };

export const STOP_WORDS = ["STOP", "STOPALL", "UNSUBSCRIBE", "CANCEL", "END", "QUIT"] as const;
export const START_WORDS = ["START", "UNSTOP"] as const;
export const HELP_WORDS = ["HELP", "INFO"] as const;

const YES = new Set(["Y", "YES", "YEP", "YEAH", "OK", "OKAY", "CONFIRM", "CONFIRMED"]);
const NO = new Set(["N", "NO", "NOPE", "DECLINE", "DECLINED"]);

/** Collapses whitespace (including non-breaking and zero-width spaces) and trims. */
function tidy(text: string) {
  return text
    .replace(/[\u200B-\u200D\uFEFF]/g, "")
    .replace(/[\s\u00A0]+/g, " ")
    .trim();
}

export function parseReply(raw: string): ParsedReply {
  const text = tidy(raw ?? "");
  // Punctuation a phone keyboard adds after a one-word answer ("Yes!", "y.") is ignored.
  const word = text.toUpperCase().replace(/[.!?,;:]+$/g, "");
  if ((STOP_WORDS as readonly string[]).includes(word)) return { kind: "stop" };
  if ((START_WORDS as readonly string[]).includes(word)) return { kind: "start" };
  if ((HELP_WORDS as readonly string[]).includes(word)) return { kind: "help" };

  // An answer word, then optionally a code of 4–6 digits (glued on or after spaces or "#"),
  // then for a decline an optional reason.
  const m = /^([A-Za-z]+)\s*#?\s*(\d{4,6})?(?:\s*[-:,.]?\s*(.*))?$/.exec(text);
  if (m) {
    const answer = m[1].toUpperCase();
    const code = m[2] ?? null;
    const rest = tidy(m[3] ?? "").replace(/^[-:,.]\s*/, "");
    if (YES.has(answer) && (rest === "" || /^[.!?]+$/.test(rest) || (code !== null && /^(thanks?|thank you|ty)[.!]*$/i.test(rest)))) {
      return { kind: "confirm", code };
    }
    if (NO.has(answer)) {
      const reason = rest.replace(/^[.!?]+$/, "");
      return { kind: "decline", code, reason: reason ? reason.slice(0, 500) : null };
    }
  }
  return { kind: "unknown", text };
}
