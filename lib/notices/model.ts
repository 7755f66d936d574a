// In-app notices and the words of an override lapse (issue 18, point 13). Client-safe, pure.
import { POSITION_LABEL } from "@/lib/format";
import { ruleName } from "@/lib/rules/rule-labels";

export interface NoticeView {
  id: number;
  kind: string;
  title: string;
  body: string;
  workOrderId: number | null;
  createdAt: string;
  readAt: string | null;
}

/** One crew change, in words, as the lapse notice and the queue tell it. */
export type CrewChange =
  | { kind: "placed"; worker: string; position: string }
  | { kind: "removed"; worker: string }
  | { kind: "moved"; worker: string; position: string; fromOrder: string; toOrder: string }
  | { kind: "swapped"; a: string; b: string }
  | { kind: "declined"; worker: string };

const seat = (p: string) => (POSITION_LABEL[p] ?? p).toLowerCase();
/** "as ground", "as lead", but "in the bucket" for the aerial seat. */
const asSeat = (p: string) => (p === "aerial" ? "in the bucket" : `as ${seat(p)}`);

/** "Dana Ruiz placed Luis Carrasco as ground" / "Luis Carrasco declined by text". */
export function changeWords(c: CrewChange, by: string | null): string {
  const who = by ?? "Someone";
  switch (c.kind) {
    case "placed":
      return `${who} placed ${c.worker} ${asSeat(c.position)}`;
    case "removed":
      return `${who} took ${c.worker} off the crew`;
    case "moved":
      return c.fromOrder === c.toOrder
        ? `${who} moved ${c.worker} ${c.position === "aerial" ? "into the bucket" : `to ${seat(c.position)}`}`
        : `${who} moved ${c.worker} from ${c.fromOrder} to ${c.toOrder}, ${asSeat(c.position)}`;
    case "swapped":
      return `${who} swapped ${c.a} and ${c.b}`;
    case "declined":
      return `${c.worker} declined the assignment`;
  }
}

export interface LapseFacts {
  orderNumber: string;
  orderTitle: string;
  /** The order's day in words ("Fri, Dec 4"). */
  dayWords: string;
  yardName: string;
  rule: string;
  /** The worker the override was for, when it was about one person. */
  workerName: string | null;
  reason: string;
  /** When the override was given, in the yard's zone with its abbreviation. */
  givenWords: string;
  change: string;
  link: string;
}

/** Title, notice text and e-mail text of a lapsed override: no ids, rule by name, dates in words. */
export function lapseWords(f: LapseFacts) {
  const rule = ruleName(f.rule);
  const about = f.workerName ? `${rule} (${f.workerName})` : rule;
  const title = `Your override lapsed: ${about} on ${f.orderNumber}`;
  const body =
    `The crew of ${f.orderNumber} (${f.orderTitle}, ${f.dayWords}, ${f.yardName}) changed: ${f.change}. ` +
    `Your override of ${about}, given ${f.givenWords} ("${f.reason}"), was for the crew as it was then, so it no longer applies ` +
    `and the block is back until the crew is fixed or a supervisor overrides it again.`;
  const email =
    `${body}\n\nOpen the queue: ${f.link}\n\n` +
    "Gaffline assists; it does not decide. Its checks do not replace your employer's safety program, the crew lead's judgement, " +
    "OSHA 29 CFR 1910.269 / 1926 Subpart V, the NESC, or local codes and agreements.\n";
  return { title, body, subject: title, email };
}
