import { Badge, type Tone } from "@/components/status";
import type { MessageRow } from "@/lib/messages/data";

// Words for message states: always an icon and a word (Badge supplies the icon).
const OUT_STATE: Record<string, { tone: Tone; word: string }> = {
  queued: { tone: "info", word: "Queued" },
  sending: { tone: "info", word: "Sending" },
  sent: { tone: "clear", word: "Sent" },
  failed: { tone: "block", word: "Failed" },
};

const IN_STATE: Record<string, { tone: Tone; word: string }> = {
  confirmed: { tone: "clear", word: "Confirmed" },
  declined: { tone: "block", word: "Declined" },
  unchanged: { tone: "muted", word: "No change" },
  opt_out: { tone: "warn", word: "Opted out" },
  opt_in: { tone: "info", word: "Opted in" },
  help: { tone: "info", word: "Help sent" },
  unmatched: { tone: "warn", word: "Unmatched" },
  received: { tone: "muted", word: "Received" },
};

export const KIND_LABEL: Record<string, string> = {
  assignment: "Assignment",
  change: "Change",
  removal: "Taken off",
  resend: "Re-send",
  reminder: "Reminder",
  digest: "Digest",
  hold: "Hold",
  reply: "Reply",
};

export function StateBadge({ m }: { m: MessageRow }) {
  if (m.direction === "in") {
    const s = m.state === "unmatched" && m.handled ? { tone: "muted" as const, word: "Handled" } : (IN_STATE[m.state] ?? { tone: "muted" as const, word: m.state });
    return <Badge tone={s.tone}>{s.word}</Badge>;
  }
  const s = OUT_STATE[m.state] ?? { tone: "muted" as const, word: m.state };
  const title = m.state === "sent" ? "Accepted by the provider" : (m.lastError ?? undefined);
  return (
    <Badge tone={s.tone} title={title}>
      {s.word}
      {m.state === "queued" && m.attempts > 0 ? ` · retry ${m.attempts}` : ""}
    </Badge>
  );
}

export function ChannelLabel({ m }: { m: MessageRow }) {
  if (m.direction === "in") return <span className="whitespace-nowrap font-semibold text-info">← Text reply</span>;
  return <span className="whitespace-nowrap font-semibold text-ink-700">{m.channel === "sms" ? "→ Text" : "→ E-mail"}</span>;
}
