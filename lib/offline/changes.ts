// What the server's answer changed, in words (issue 20): after the phone sends what it recorded
// offline, the server's state wins, and the phone says where it differs from the copy the
// lineworker was looking at. Pure; client-safe.

export interface ViewFacts {
  order: { number: string; status: string; holdReason: string | null };
  crew: { workerId: number; name: string; positionLabel: string }[];
  leadWorkerId: number | null;
  briefing: { round: number; state: string } | null;
}

const STATUS_WORD: Record<string, string> = {
  draft: "draft",
  planned: "planned",
  sent: "sent to the crew",
  in_progress: "in progress",
  on_hold: "on hold",
  completed: "completed",
  cancelled: "cancelled",
};
const ROUND_WORD: Record<string, string> = { draft: "a draft", briefed: "completed", on_hold: "on hold" };

export function describeChanges(before: ViewFacts, after: ViewFacts): string[] {
  const out: string[] = [];
  const n = after.order.number;
  if (before.order.status !== after.order.status) {
    const word = STATUS_WORD[after.order.status] ?? after.order.status;
    out.push(
      `${n} is now ${word} (it was ${STATUS_WORD[before.order.status] ?? before.order.status})` +
        (after.order.status === "on_hold" && after.order.holdReason ? `: ${after.order.holdReason.replace(/[.\s]+$/, "")}.` : "."),
    );
  }
  const was = new Map(before.crew.map((c) => [c.workerId, c]));
  const now = new Map(after.crew.map((c) => [c.workerId, c]));
  const added = after.crew.filter((c) => !was.has(c.workerId));
  const removed = before.crew.filter((c) => !now.has(c.workerId));
  const moved = after.crew.filter((c) => was.has(c.workerId) && was.get(c.workerId)!.positionLabel !== c.positionLabel);
  if (added.length) out.push(`Crew: ${added.map((c) => `${c.name} joined as ${c.positionLabel}`).join("; ")}.`);
  if (removed.length) out.push(`Crew: ${removed.map((c) => `${c.name} is no longer on ${n}`).join("; ")}.`);
  if (moved.length) out.push(`Crew: ${moved.map((c) => `${c.name} is now ${c.positionLabel}`).join("; ")}.`);
  if (before.leadWorkerId !== after.leadWorkerId) {
    const lead = after.crew.find((c) => c.workerId === after.leadWorkerId);
    out.push(lead ? `Crew lead: ${lead.name}.` : "Nobody holds the lead seat now.");
  }
  const b = before.briefing;
  const a = after.briefing;
  if (a && (!b || b.round !== a.round)) out.push(`Briefing: round ${a.round} is ${ROUND_WORD[a.state] ?? a.state}${b ? ` (you had round ${b.round})` : ""}.`);
  else if (a && b && a.state !== b.state) out.push(`Briefing: round ${a.round} is ${ROUND_WORD[a.state] ?? a.state} (it was ${ROUND_WORD[b.state] ?? b.state}).`);
  return out;
}
