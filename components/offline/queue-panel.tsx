"use client";

// What is saved on this phone and not yet sent, what the server refused, and what went through
// since (issue 20). Shown on My week (everything) and on a briefing (that order's actions).
import { usePathname } from "next/navigation";
import { clearDelivered, dismissAction, fmtEntered, useFieldQueue } from "./field-queue";

function answerWords(kind: string, body: unknown): string {
  const b = (body ?? {}) as Record<string, any>;
  if (kind === "briefing.hold") return `${b.order?.number ?? "The order"} is on hold; dispatch has been told by text and e-mail.`;
  if (kind === "briefing.ack") return b.unchanged ? "It was already on record: nothing doubled." : "Recorded.";
  if (kind === "briefing.save") return b.briefing?.state === "briefed" ? "Briefing completed." : "Draft saved.";
  if (kind === "briefing.photo") return "Photo stored.";
  if (kind === "assignment.respond") return b.outcome ? `Dispatch has your answer (${String(b.outcome).replace(/_/g, " ")}).` : "Dispatch has your answer.";
  return "Recorded.";
}

export function QueuePanel({ userId, orderId, online }: { userId: number; orderId?: number; online: boolean }) {
  const q = useFieldQueue(userId);
  const path = usePathname();
  const mine = q.actions.filter((a) => orderId === undefined || a.orderId === orderId);
  const queued = mine.filter((a) => a.state === "queued");
  const refused = mine.filter((a) => a.state === "refused");
  const delivered = q.delivered.filter((d) => d.result.status < 300 && (orderId === undefined || d.action.orderId === orderId));
  if (online && queued.length === 0 && refused.length === 0 && delivered.length === 0) return null;
  return (
    <section aria-label="Saved on this phone" className="mb-4 space-y-2 print:hidden" data-testid="offline-queue">
      {!online && (
        <p className="rounded-md bg-warn-bg px-3 py-2 text-sm font-semibold text-warn" role="status" data-testid="offline-banner">
          ▲ No signal. What you record is saved on this phone and sent when it is back online.
        </p>
      )}
      {q.stopped === "signin" && queued.length > 0 && (
        <p className="rounded-md bg-block-bg px-3 py-2 text-sm font-semibold text-block" role="alert" data-testid="signin-needed">
          Your sign-in has expired. <a className="underline" href={`/login?callbackUrl=${encodeURIComponent(path ?? "/me")}`}>Sign in again</a> to send
          what is saved on this phone; it stays here until then.
        </p>
      )}
      {queued.length > 0 && (
        <div className="card border-warn p-3">
          <h2 className="text-sm font-bold">Saved on this phone, not yet sent ({queued.length})</h2>
          <ul className="mt-1 space-y-1 text-sm">
            {queued.map((a) => (
              <li key={a.key} data-testid="queued-action">
                <span className="font-semibold">{a.label}</span> · <span className="text-ink-500">saved on this phone, not yet sent · entered {fmtEntered(a.createdAt)}</span>
                {a.attempts > 0 && a.lastError && <span className="block text-xs text-ink-500">{a.lastError}</span>}
              </li>
            ))}
          </ul>
        </div>
      )}
      {refused.map((a) => (
        <div key={a.key} className="rounded-md bg-block-bg px-3 py-2 text-sm text-block" role="alert" data-testid="refused-action">
          <strong>Not recorded: {a.label}</strong> (entered {fmtEntered(a.createdAt)}). The server&apos;s answer stands: {a.refusal?.message}
          <button type="button" className="ml-2 underline" onClick={() => void dismissAction(userId, a.seq!)}>
            Seen
          </button>
        </div>
      ))}
      {delivered.length > 0 && (
        <div className="rounded-md bg-clear-bg px-3 py-2 text-sm text-clear" role="status" data-testid="delivered">
          <p className="font-semibold">Sent from this phone:</p>
          <ul>
            {delivered.map((d) => (
              <li key={d.action.key}>
                ✓ {d.action.label} (entered {fmtEntered(d.action.createdAt)}): {answerWords(d.action.kind, d.result.body)}
              </li>
            ))}
          </ul>
          <button type="button" className="mt-1 underline" onClick={clearDelivered}>
            Close
          </button>
        </div>
      )}
    </section>
  );
}
