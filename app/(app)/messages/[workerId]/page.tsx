import Link from "next/link";
import { notFound, redirect } from "next/navigation";
import { requirePageRole } from "@/lib/auth/session";
import { contactWorkerIds } from "@/lib/auth/yard-scope";
import { db } from "@/lib/db";
import { workerThread } from "@/lib/messages/data";
import { formatPhone } from "@/lib/notify/wording";
import { Badge, PageHeader } from "@/components/status";
import { CLASSIFICATION_LABEL, fmtDateTimeZone } from "@/lib/format";
import { AutoRefresh } from "../auto-refresh";
import { KIND_LABEL, StateBadge } from "../ui";

export const metadata = { title: "Messages · thread" };
export const dynamic = "force-dynamic";

export default async function ThreadPage({ params }: { params: Promise<{ workerId: string }> }) {
  const user = await requirePageRole("dispatcher", "supervisor");
  const { workerId } = await params;
  const id = Number(workerId);
  if (!Number.isInteger(id) || id <= 0) notFound();
  // Another yard's worker: their texts and number are not this dispatcher's to read.
  const mine = await contactWorkerIds(user);
  if (mine && !mine.has(id)) redirect("/forbidden?from=/messages");
  const thread = await workerThread(db(), user.organisationId, id);
  if (!thread) notFound();
  const { worker: w, items } = thread;
  const tz = w.timezone as string;

  return (
    <>
      <AutoRefresh />
      <p className="mb-2 text-sm">
        <Link href="/messages" className="font-semibold text-info underline">
          ← All messages
        </Link>
      </p>
      <PageHeader eyebrow={`Messages · ${w.yard_name}`} title={`${w.first_name} ${w.last_name}`}>
        {w.phone_e164 && (
          <a className="btn-quiet" href={`tel:${w.phone_e164}`}>
            Call {formatPhone(w.phone_e164)}
          </a>
        )}
      </PageHeader>
      <div className="mb-4 flex flex-wrap items-center gap-x-4 gap-y-1 text-sm text-ink-700">
        <span>
          {w.employee_no} · {CLASSIFICATION_LABEL[w.classification] ?? w.classification}
        </span>
        <span>{w.phone_e164 ? formatPhone(w.phone_e164) : "No phone on file"}</span>
        <span className="break-all">{w.email ?? "No e-mail on file"}</span>
        {w.phone_e164 && (w.sms_opt_in ? <Badge tone="clear">Texts on</Badge> : <Badge tone="warn">Opted out of texts</Badge>)}
      </div>

      {items.length === 0 ? (
        <p className="card p-6 text-sm text-ink-500">No messages with {w.first_name} yet.</p>
      ) : (
        <ol className="mx-auto max-w-3xl space-y-3" data-testid="thread">
          {items.map((m) => {
            const out = m.direction === "out";
            return (
              <li key={m.key} className={`flex ${out ? "justify-end" : "justify-start"}`}>
                <div
                  className={`max-w-[85%] rounded-card border px-3 py-2 text-sm shadow-sm sm:max-w-[70%] ${
                    out ? "border-copper-100 bg-copper-100/60" : "border-rule bg-white"
                  }`}
                >
                  <p className="mb-1 flex flex-wrap items-center gap-x-2 gap-y-1 text-[11px] font-bold uppercase tracking-wide text-ink-500">
                    <span>{out ? (m.channel === "sms" ? "→ Text" : "→ E-mail") : "← Reply"}</span>
                    <span className="font-semibold normal-case tracking-normal">{fmtDateTimeZone(m.at, tz)}</span>
                    {out && <span className="normal-case tracking-normal">{KIND_LABEL[m.kind] ?? m.kind}</span>}
                    {m.orderNumber && <span className="normal-case tracking-normal">{m.orderNumber}</span>}
                    <span className="normal-case tracking-normal">
                      <StateBadge m={m} />
                    </span>
                  </p>
                  {out && m.channel === "email" ? (
                    <details>
                      <summary className="cursor-pointer font-bold">{m.subject}</summary>
                      <pre className="mt-1 whitespace-pre-wrap break-words font-sans text-xs text-ink-700">{m.body}</pre>
                    </details>
                  ) : (
                    <p className="whitespace-pre-wrap break-words">{m.body}</p>
                  )}
                  {!out && m.reply && <p className="mt-1 border-t border-rule pt-1 text-xs text-ink-700">We answered: {m.reply}</p>}
                  {out && m.state === "failed" && m.lastError && <p className="mt-1 text-xs text-block">{m.lastError}</p>}
                </div>
              </li>
            );
          })}
        </ol>
      )}
    </>
  );
}
