"use client";

import { useRouter } from "next/navigation";
import { useCallback, useEffect, useRef, useState } from "react";
import { SelectField, TextField } from "@/components/form/fields";
import { apiFetch, asFailure } from "@/lib/api/client";
import { useApiMutation } from "@/lib/api/mutations";

export interface PhoneOwner {
  workerId: number;
  name: string;
  phone: string;
  display: string;
  optedIn: boolean;
  yard: string;
  /** The worker's yard zone: the phone shows times as that worker's clock would. */
  timezone: string;
}

interface Text {
  sid: string;
  source: "api" | "twiml" | "inbound";
  to: string;
  from: string;
  body: string;
  dateCreated: string;
}

function time(iso: string, timeZone: string) {
  return new Intl.DateTimeFormat("en-US", { timeZone, month: "short", day: "numeric", hour: "2-digit", minute: "2-digit", hour12: false }).format(new Date(iso));
}

/** Codes offered in the texts this phone received ("Reply Y 4821 …"), newest first. */
function openCodes(texts: Text[]) {
  const seen: string[] = [];
  for (const t of [...texts].reverse()) {
    if (t.source === "inbound") continue;
    const m = /Reply Y (\d{4,6})/.exec(t.body);
    if (m && !seen.includes(m[1])) seen.push(m[1]);
  }
  return seen.slice(0, 2);
}

export function PhoneClient({ owners, initialPhone, fromNumber }: { owners: PhoneOwner[]; initialPhone: string | null; fromNumber: string }) {
  const router = useRouter();
  const [phone, setPhone] = useState<string | null>(initialPhone);
  const [texts, setTexts] = useState<Text[]>([]);
  const [draft, setDraft] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [loaded, setLoaded] = useState(false);
  const listRef = useRef<HTMLOListElement>(null);
  const owner = owners.find((o) => o.phone === phone) ?? null;

  const load = useCallback(async () => {
    if (!phone) return;
    try {
      const body = await apiFetch<{ messages?: Text[] }>(`/api/phone?phone=${encodeURIComponent(phone)}`);
      setTexts(body.messages ?? []);
      setError(null);
    } catch (err) {
      setError(asFailure(err).message);
    } finally {
      setLoaded(true);
    }
  }, [phone]);

  useEffect(() => {
    setTexts([]);
    setLoaded(false);
    load();
    const t = setInterval(() => !document.hidden && load(), 1500);
    return () => clearInterval(t);
  }, [load]);

  useEffect(() => {
    listRef.current?.scrollTo({ top: listRef.current.scrollHeight });
  }, [texts.length]);

  // A reply goes to the SMS fake, which signs it and delivers it to the app's webhook; the
  // answer carries the webhook's own status.
  const reply = useApiMutation<string, { status: number }>({
    request: (body) => ({ url: "/api/phone", method: "POST", body: { from: phone, body } }),
    onSuccess: async (r) => {
      if (r.status !== 200) return setError(`The app answered the webhook with ${r.status}.`);
      setDraft("");
      await load();
    },
    onFailure: (f) => setError(f.message),
  });
  const busy = reply.isPending;
  function send(body: string) {
    if (!phone || !body.trim()) return;
    setError(null);
    void reply.submit(body);
  }

  const codes = openCodes(texts);
  const chips = [...codes.flatMap((c) => [`Y ${c}`, `N ${c}`]), "HELP", owner?.optedIn === false ? "START" : "STOP"];

  return (
    <div className="grid gap-6 lg:grid-cols-[400px_minmax(0,36rem)]">
      <section className="order-2 space-y-3 self-start text-sm lg:mt-[4.25rem]">
        <div className="card p-4">
          <h2 className="font-extrabold">Act as a lineworker</h2>
          <p className="mt-1 text-ink-700">
            Pick a worker&apos;s phone and read what Gaffline texted them. A reply you type goes to the local SMS fake, which delivers it to
            Gaffline&apos;s webhook signed exactly as the provider signs a real text, so the board updates just as it would for a real reply.
          </p>
          <p className="mt-2 text-ink-700">
            Try <strong>Y</strong> and the code to confirm, <strong>N</strong> and the code with a reason to decline (&ldquo;N 4821 truck in the shop&rdquo;),
            <strong> HELP</strong>, or <strong>STOP</strong>.
          </p>
          <p className="mt-2 text-xs text-ink-500">Demo only: this page exists while the local fakes are on (FAKES_ENABLED=1).</p>
        </div>
        {owner && (
          <div className="card flex flex-wrap items-center justify-between gap-2 p-4">
            <div>
              <p className="font-bold">{owner.name}</p>
              <p className="text-xs text-ink-500">
                {owner.display} · {owner.yard}
              </p>
            </div>
            <div className="flex gap-2">
              <a className="btn-quiet" href={`/messages/${owner.workerId}`}>
                Their messages
              </a>
              <a className="btn-quiet" href="/board">
                Board
              </a>
            </div>
          </div>
        )}
        {owner && !owner.optedIn && (
          <p className="card border-warn p-3 font-semibold text-warn" role="status">
            ▲ {owner.name} has opted out of texts: new texts are not sent until they reply START.
          </p>
        )}
      </section>

      <section className="order-1" aria-label="Phone">
        <SelectField
          id="phone-owner"
          label="Phone of"
          wrapperClassName="mb-3"
          value={phone ?? ""}
          onChange={(e) => {
            setPhone(e.target.value);
            router.replace(`/phone?phone=${encodeURIComponent(e.target.value)}`);
          }}
        >
          {owners.map((o) => (
            <option key={o.phone} value={o.phone}>
              {o.name} · {o.display} · {o.yard}
            </option>
          ))}
        </SelectField>

        <div className="mx-auto flex h-[640px] max-h-[78vh] w-full max-w-[380px] flex-col overflow-hidden rounded-[2.25rem] border-[10px] border-ink bg-paper-50 shadow-lg">
          <div className="flex items-center justify-between bg-ink px-4 pb-2 pt-1 text-[11px] font-semibold text-paper/80" aria-hidden="true">
            <span>{owner?.name ?? ""}</span>
            <span className="h-1.5 w-16 rounded-full bg-paper/30" />
            <span>LTE ▮▮▮</span>
          </div>
          <header className="border-b border-rule bg-white px-4 py-2 text-center">
            <p className="text-sm font-extrabold">Gaffline dispatch</p>
            <p className="text-[11px] text-ink-500">{fromNumber || "crew texts"}</p>
          </header>
          <ol ref={listRef} className="flex-1 space-y-2 overflow-y-auto px-3 py-3" aria-live="polite" aria-label="Texts" data-testid="phone-texts">
            {loaded && texts.length === 0 && <li className="pt-10 text-center text-xs text-ink-500">No texts on this phone yet. Send crews from the Board.</li>}
            {texts.map((t) => {
              const mine = t.source === "inbound";
              return (
                <li key={t.sid} className={`flex ${mine ? "justify-end" : "justify-start"}`}>
                  <div
                    className={`max-w-[82%] rounded-2xl px-3 py-2 text-sm leading-snug ${
                      mine ? "rounded-br-sm bg-copper text-white" : "rounded-bl-sm bg-paper-200 text-ink"
                    }`}
                  >
                    <p className="whitespace-pre-wrap break-words">{t.body}</p>
                    <p className={`mt-0.5 text-right text-[10px] ${mine ? "text-white/80" : "text-ink-500"}`}>{time(t.dateCreated, owner?.timezone ?? "UTC")}</p>
                  </div>
                </li>
              );
            })}
          </ol>
          <div className="flex flex-wrap gap-1.5 border-t border-rule bg-white px-3 pt-2">
            {chips.map((c) => (
              <button key={c} type="button" className="rounded-full border border-rule px-2.5 py-1 text-xs font-semibold hover:bg-paper-200 disabled:opacity-50" disabled={busy || !phone} onClick={() => send(c)}>
                {c}
              </button>
            ))}
          </div>
          <form
            className="flex items-center gap-2 bg-white px-3 py-2"
            onSubmit={(e) => {
              e.preventDefault();
              send(draft);
            }}
          >
            <TextField
              id="phone-reply"
              hideLabel
              label="Reply text"
              wrapperClassName="flex-1"
              name="reply"
              className="field rounded-full"
              placeholder="Text message"
              autoComplete="off"
              value={draft}
              maxLength={1600}
              onChange={(e) => setDraft(e.target.value)}
              disabled={!phone}
            />
            <button type="submit" className="btn-accent rounded-full px-4" disabled={busy || !draft.trim() || !phone}>
              {busy ? "…" : "Send"}
            </button>
          </form>
          {error && (
            <p role="alert" className="bg-block-bg px-3 py-2 text-xs font-semibold text-block">
              ✖ {error}
            </p>
          )}
        </div>
      </section>
    </div>
  );
}
