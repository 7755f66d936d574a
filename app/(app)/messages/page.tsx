import Link from "next/link";
import { requirePageRole } from "@/lib/auth/session";
import { contactWorkerIds } from "@/lib/auth/yard-scope";
import { db } from "@/lib/db";
import { listMessages, messageWorkers, unmatchedReplies, type MessageRow } from "@/lib/inbox/data";
import { messagesFilterSchema } from "@/lib/notify/schema";
import { fakesEnabled, mailboxUrl } from "@/lib/notify/config";
import { formatPhone } from "@/lib/notify/messages";
import { Badge, PageHeader } from "@/components/status";
import { fmtDate, fmtDateTimeZone } from "@/lib/format";
import { AutoRefresh } from "./auto-refresh";
import { HandledButton } from "./handled-button";
import { ChannelLabel, KIND_LABEL, StateBadge } from "./ui";

export const metadata = { title: "Messages" };
export const dynamic = "force-dynamic";

function What({ m, dash = true }: { m: MessageRow; dash?: boolean }) {
  if (m.direction === "in") return m.orderNumber ? <span>{m.orderNumber}</span> : dash ? <span className="text-ink-500">—</span> : null;
  return (
    <span>
      {KIND_LABEL[m.kind] ?? m.kind}
      {m.orderNumber ? ` · ${m.orderNumber}` : ""}
    </span>
  );
}

function Preview({ m }: { m: MessageRow }) {
  const text = m.channel === "email" && m.direction === "out" ? m.subject ?? m.body : m.body;
  return (
    <span className="line-clamp-2 break-words" title={m.body}>
      {m.direction === "in" ? `“${text}”` : text}
    </span>
  );
}

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

      <form method="get" className="card mb-4 grid grid-cols-2 gap-3 p-3 sm:flex sm:flex-wrap sm:items-end" aria-label="Filter messages">
        <div>
          <label className="label" htmlFor="channel">
            Channel
          </label>
          <select id="channel" name="channel" defaultValue={f.channel ?? ""} className="field">
            <option value="">All</option>
            <option value="sms">Texts out</option>
            <option value="email">E-mails out</option>
            <option value="inbound">Text replies in</option>
          </select>
        </div>
        <div>
          <label className="label" htmlFor="state">
            State
          </label>
          <select id="state" name="state" defaultValue={f.state ?? ""} className="field">
            <option value="">Any</option>
            <option value="queued">Queued</option>
            <option value="sending">Sending</option>
            <option value="sent">Sent</option>
            <option value="failed">Failed</option>
          </select>
        </div>
        <div className="col-span-2 sm:col-span-1">
          <label className="label" htmlFor="worker">
            Worker
          </label>
          <select id="worker" name="worker" defaultValue={f.worker ? String(f.worker) : ""} className="field">
            <option value="">Everyone</option>
            {workers.map((w) => (
              <option key={w.id} value={w.id}>
                {w.last_name}, {w.first_name}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label className="label" htmlFor="day">
            Day
          </label>
          <input id="day" name="day" type="date" defaultValue={f.day ?? ""} className="field" />
        </div>
        <div className="flex items-end gap-2">
          <button type="submit" className="btn-primary">
            Filter
          </button>
          {filtered && (
            <Link href="/messages" className="btn-quiet">
              Clear
            </Link>
          )}
        </div>
      </form>

      <div className="mb-2 flex flex-wrap items-center gap-2 text-sm" data-testid="message-summary">
        <span className="font-semibold">{rows.length === 300 ? "Latest 300 messages" : `${rows.length} message${rows.length === 1 ? "" : "s"}`}</span>
        {f.day && <span className="text-ink-500">for {fmtDate(f.day)}</span>}
        {waiting > 0 && <Badge tone="info">{waiting} on the way</Badge>}
        {failed > 0 && <Badge tone="block">{failed} failed</Badge>}
        <span className="text-xs text-ink-500">“Sent” means the provider accepted it.</span>
      </div>

      {rows.length === 0 ? (
        <p className="card p-6 text-sm text-ink-500">{filtered ? "Nothing matches these filters." : "No messages yet. Send crews from the Board to text and e-mail them."}</p>
      ) : (
        <>
          {/* Phones: one card per message. */}
          <ul className="space-y-2 md:hidden" data-testid="message-cards">
            {rows.map((m) => (
              <li key={m.key} className="card p-3 text-sm">
                <div className="flex items-center justify-between gap-2">
                  <ChannelLabel m={m} />
                  <StateBadge m={m} />
                </div>
                <p className="mt-1 text-xs text-ink-500">
                  {fmtDateTimeZone(m.at, m.timezone)} ·{" "}
                  {m.workerId ? (
                    <Link className="font-semibold text-info underline" href={`/messages/${m.workerId}`}>
                      {m.workerName}
                    </Link>
                  ) : (
                    (formatPhone(m.address) ?? m.address)
                  )}
                  {(m.direction === "out" || m.orderNumber) && (
                    <>
                      {" · "}
                      <What m={m} dash={false} />
                    </>
                  )}
                </p>
                <p className="mt-1">
                  <Preview m={m} />
                </p>
                {m.state === "failed" && m.lastError && <p className="mt-1 break-words text-xs text-block">{m.lastError}</p>}
              </li>
            ))}
          </ul>
          {/* Wider screens: a table. */}
          <div className="card hidden overflow-x-auto md:block">
            <table className="w-full text-left text-sm" data-testid="message-table">
              <thead className="bg-paper-200 text-xs uppercase text-ink-500">
                <tr>
                  <th className="px-3 py-2">When</th>
                  <th className="px-3 py-2">Channel</th>
                  <th className="px-3 py-2">Worker</th>
                  <th className="px-3 py-2">To / from</th>
                  <th className="px-3 py-2">What</th>
                  <th className="px-3 py-2">Message</th>
                  <th className="px-3 py-2">State</th>
                </tr>
              </thead>
              <tbody>
                {rows.map((m) => (
                  <tr key={m.key} className="border-t border-rule align-top">
                    <td className="whitespace-nowrap px-3 py-2 text-ink-700">{fmtDateTimeZone(m.at, m.timezone)}</td>
                    <td className="px-3 py-2">
                      <ChannelLabel m={m} />
                    </td>
                    <td className="whitespace-nowrap px-3 py-2">
                      {m.workerId ? (
                        <Link className="font-semibold text-info underline" href={`/messages/${m.workerId}`}>
                          {m.workerName}
                        </Link>
                      ) : (
                        <span className="text-ink-500">—</span>
                      )}
                    </td>
                    <td className="whitespace-nowrap px-3 py-2 text-ink-700">{m.channel === "sms" ? formatPhone(m.address) : m.address}</td>
                    <td className="whitespace-nowrap px-3 py-2">
                      <What m={m} />
                    </td>
                    <td className="max-w-md px-3 py-2">
                      <Preview m={m} />
                      {m.direction === "in" && m.reply && <span className="mt-0.5 block text-xs text-ink-500">We answered: {m.reply}</span>}
                    </td>
                    <td className="px-3 py-2">
                      <StateBadge m={m} />
                      {m.state === "failed" && m.lastError && <span className="mt-1 block max-w-[14rem] break-words text-xs text-block">{m.lastError}</span>}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </>
      )}
    </>
  );
}
