import Link from "next/link";
import type { MessageRow } from "@/lib/messages/data";
import { fmtDateTimeZone } from "@/lib/format";
import { formatPhone } from "@/lib/notify/wording";
import { ChannelLabel, KIND_LABEL, StateBadge } from "./ui";

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

/** The messages: cards on phones, a table on wider screens. */
export function MessageList({ rows, filtered }: { rows: MessageRow[]; filtered: boolean }) {
  return (
    <>
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
