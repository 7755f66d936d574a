import Link from "next/link";
import { Badge } from "@/components/status";
import { fmtDateTimeZone } from "@/lib/format";
import type { unmatchedReplies } from "@/lib/messages/data";
import { formatPhone } from "@/lib/notify/wording";
import { HandledButton } from "./handled-button";

/** Text replies nobody's assignment matched: call the person, then mark it handled. */
export function UnmatchedReplies({ unmatched }: { unmatched: Awaited<ReturnType<typeof unmatchedReplies>> }) {
  return (
    <section aria-labelledby="unmatched-h" className={`card mb-4 p-3 ${unmatched.length ? "border-warn" : ""}`} data-testid="unmatched">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h2 id="unmatched-h" className="font-extrabold">
          Replies that need you
        </h2>
        {unmatched.length ? <Badge tone="warn">{unmatched.length} unmatched</Badge> : <Badge tone="clear">None waiting</Badge>}
      </div>
      {unmatched.length === 0 ? (
        <p className="mt-1 text-sm text-ink-500">Every text reply matched an assignment or was answered automatically.</p>
      ) : (
        <ul className="mt-2 divide-y divide-rule">
          {unmatched.map((m) => (
            <li key={m.key} className="flex flex-wrap items-start justify-between gap-2 py-2 text-sm">
              <div className="min-w-0 flex-1">
                <p className="text-xs text-ink-500">
                  {fmtDateTimeZone(m.at, m.timezone)} ·{" "}
                  {m.workerId ? (
                    <Link className="font-semibold text-info underline" href={`/messages/${m.workerId}`}>
                      {m.workerName}
                    </Link>
                  ) : (
                    <span className="font-semibold">Unknown number</span>
                  )}{" "}
                  · {formatPhone(m.address)}
                </p>
                <p className="mt-0.5 break-words font-bold">“{m.body}”</p>
                {m.reply && <p className="mt-0.5 break-words text-xs text-ink-700">We answered: {m.reply}</p>}
              </div>
              <div className="flex shrink-0 items-center gap-2">
                <a className="btn-quiet px-2 py-1 text-xs" href={`tel:${m.address}`}>
                  Call
                </a>
                <HandledButton id={m.id} />
              </div>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
