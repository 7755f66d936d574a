import Link from "next/link";
import { requirePageRole } from "@/lib/auth/session";
import { contactWorkerIds } from "@/lib/auth/yard-scope";
import { db } from "@/lib/db";
import { listMessages, messageWorkers, unmatchedReplies } from "@/lib/messages/data";
import { messagesFilterSchema } from "@/lib/notify/schema";
import { fakesEnabled, mailboxUrl } from "@/lib/notify/config";
import { Badge, PageHeader } from "@/components/status";
import { fmtDate } from "@/lib/format";
import { AutoRefresh } from "./auto-refresh";
import { MessageFilters } from "./message-filters";
import { MessageList } from "./message-list";
import { UnmatchedReplies } from "./unmatched-replies";

export const metadata = { title: "Messages" };
export const dynamic = "force-dynamic";

export default async function MessagesPage({ searchParams }: { searchParams: Promise<Record<string, string | undefined>> }) {
  const user = await requirePageRole("dispatcher", "supervisor");
  const sp = await searchParams;
  const f = messagesFilterSchema.parse(sp);
  const [allRows, allUnmatched, allWorkers, mine] = await Promise.all([
    listMessages(db(), user.organisationId, f),
    unmatchedReplies(db(), user.organisationId),
    messageWorkers(db(), user.organisationId),
    contactWorkerIds(user),
  ]);
  // A dispatcher sees the texts of their own yards' workers only (and replies from unknown numbers).
  const rows = mine ? allRows.filter((r) => r.workerId === null || mine.has(Number(r.workerId))) : allRows;
  const workers = mine ? allWorkers.filter((w) => mine.has(Number(w.id))) : allWorkers;
  const unmatched = mine ? allUnmatched.filter((r) => r.workerId === null || mine.has(Number(r.workerId))) : allUnmatched;
  const failed = rows.filter((r) => r.direction === "out" && r.state === "failed").length;
  const waiting = rows.filter((r) => r.direction === "out" && (r.state === "queued" || r.state === "sending")).length;
  const filtered = Boolean(f.channel || f.state || f.worker || f.day);

  return (
    <>
      <AutoRefresh />
      <PageHeader eyebrow="Messages" title="Texts and e-mails">
        {fakesEnabled() && (
          <>
            <Link className="btn-quiet" href="/phone">
              Phone simulator
            </Link>
            <a className="btn-quiet" href={mailboxUrl()} target="_blank" rel="noreferrer">
              Local mailbox ↗
            </a>
          </>
        )}
      </PageHeader>

      <UnmatchedReplies unmatched={unmatched} />

      <MessageFilters f={f} workers={workers} filtered={filtered} />

      <div className="mb-2 flex flex-wrap items-center gap-2 text-sm" data-testid="message-summary">
        <span className="font-semibold">{rows.length === 300 ? "Latest 300 messages" : `${rows.length} message${rows.length === 1 ? "" : "s"}`}</span>
        {f.day && <span className="text-ink-500">for {fmtDate(f.day)}</span>}
        {waiting > 0 && <Badge tone="info">{waiting} on the way</Badge>}
        {failed > 0 && <Badge tone="block">{failed} failed</Badge>}
        <span className="text-xs text-ink-500">“Sent” means the provider accepted it.</span>
      </div>

      <MessageList rows={rows} filtered={filtered} />
    </>
  );
}
