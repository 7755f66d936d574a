"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { GearStateBadge } from "@/components/gear-state";
import { GEAR_CLASSES, GEAR_KIND_LABEL, GEAR_KINDS, RETEST_MONTHS, classLabel, type GearItem } from "@/lib/gear/model";

type Issue = { field: string; message: string };

async function send(url: string, method: string, body: unknown) {
  try {
    const res = await fetch(url, { method, headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
    const data = await res.json().catch(() => ({}));
    return { ok: res.ok, status: res.status, body: data as { error?: string; issues?: Issue[] } };
  } catch {
    return { ok: false, status: 0, body: { error: "The server did not answer; nothing was saved." } };
  }
}

/**
 * The worker's rubber gloves and sleeves on the Credentials desk: class, size, serial, last
 * electrical test and when the next one is due (1910.137 Table I-5: gloves every 6 months,
 * sleeves every 12). HR records new items, new test dates and retirements; others read.
 */
export function GearSection({ workerId, items, today, canEdit }: { workerId: number; items: GearItem[]; today: string; canEdit: boolean }) {
  const router = useRouter();
  const [adding, setAdding] = useState(false);
  const [form, setForm] = useState({ kind: "rubber_gloves", class: "2", size: "", serial: "", testedOn: today, issuedOn: today });
  const [issues, setIssues] = useState<Issue[]>([]);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [testing, setTesting] = useState<{ id: number; date: string } | null>(null);
  const inService = items.filter((i) => i.state !== "retired");
  const retired = items.filter((i) => i.state === "retired");
  const fieldError = (f: string) => issues.find((i) => i.field === f)?.message;

  async function add(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setIssues([]);
    setError(null);
    const r = await send("/api/gear", "POST", {
      workerId,
      kind: form.kind,
      class: form.class,
      size: form.size || null,
      serial: form.serial,
      testedOn: form.testedOn,
      issuedOn: form.issuedOn || null,
    });
    setBusy(false);
    if (!r.ok) {
      setIssues(r.body.issues ?? []);
      setError(r.body.error ?? "Not saved.");
      return;
    }
    setAdding(false);
    setForm({ ...form, serial: "", size: "" });
    router.refresh();
  }

  async function patch(item: GearItem, body: Record<string, unknown>) {
    setBusy(true);
    setError(null);
    const r = await send(`/api/gear/${item.id}`, "PATCH", { version: item.version, ...body });
    setBusy(false);
    if (!r.ok) {
      setError(r.body.error ?? "Not saved.");
      return;
    }
    setTesting(null);
    router.refresh();
  }

  return (
    <section className="mt-8" aria-labelledby="gear-h" data-testid="gear-section">
      <div className="mb-2 flex flex-wrap items-end justify-between gap-2">
        <div>
          <h2 id="gear-h" className="text-base font-bold">
            Rubber goods
          </h2>
          <p className="text-xs text-ink-500">
            Gloves are retested every {RETEST_MONTHS.rubber_gloves} months, sleeves every {RETEST_MONTHS.rubber_sleeves} (29 CFR 1910.137 Table I-5). The class
            must be rated for the line&apos;s voltage (Table I-4).
          </p>
        </div>
        {canEdit && !adding && (
          <button type="button" className="btn-quiet" onClick={() => setAdding(true)}>
            Record gloves or sleeves
          </button>
        )}
      </div>

      {error && (
        <p role="alert" className="mb-2 rounded-md bg-block-bg px-3 py-2 text-sm text-block">
          ✖ {error}
        </p>
      )}

      {adding && (
        <form onSubmit={add} className="card mb-3 grid gap-3 p-4 sm:grid-cols-3" aria-label="Record rubber goods" noValidate>
          <label className="text-sm">
            <span className="label">Kind</span>
            <select className="field" value={form.kind} onChange={(e) => setForm({ ...form, kind: e.target.value })} name="kind">
              {GEAR_KINDS.map((k) => (
                <option key={k} value={k}>
                  {GEAR_KIND_LABEL[k]}
                </option>
              ))}
            </select>
          </label>
          <label className="text-sm">
            <span className="label">Class</span>
            <select className="field" value={form.class} onChange={(e) => setForm({ ...form, class: e.target.value })} name="class" aria-invalid={!!fieldError("class")}>
              {GEAR_CLASSES.map((c) => (
                <option key={c} value={c}>
                  {classLabel(c)}
                </option>
              ))}
            </select>
            {fieldError("class") && <span className="text-xs text-block">{fieldError("class")}</span>}
          </label>
          <label className="text-sm">
            <span className="label">Size</span>
            <input className="field" value={form.size} onChange={(e) => setForm({ ...form, size: e.target.value })} name="size" maxLength={10} />
          </label>
          <label className="text-sm">
            <span className="label">Serial or label</span>
            <input className="field" value={form.serial} onChange={(e) => setForm({ ...form, serial: e.target.value })} name="serial" aria-invalid={!!fieldError("serial")} required />
            {fieldError("serial") && <span className="text-xs text-block">{fieldError("serial")}</span>}
          </label>
          <label className="text-sm">
            <span className="label">Last electrical test</span>
            <input type="date" className="field" value={form.testedOn} max={today} onChange={(e) => setForm({ ...form, testedOn: e.target.value })} name="testedOn" aria-invalid={!!fieldError("testedOn")} />
            {fieldError("testedOn") && <span className="text-xs text-block">{fieldError("testedOn")}</span>}
          </label>
          <label className="text-sm">
            <span className="label">Issued</span>
            <input type="date" className="field" value={form.issuedOn} onChange={(e) => setForm({ ...form, issuedOn: e.target.value })} name="issuedOn" />
          </label>
          <div className="flex gap-2 sm:col-span-3">
            <button type="submit" className="btn-primary" disabled={busy}>
              {busy ? "Saving…" : "Save"}
            </button>
            <button type="button" className="btn-quiet" onClick={() => setAdding(false)}>
              Cancel
            </button>
          </div>
        </form>
      )}

      {inService.length === 0 ? (
        <p className="text-sm text-ink-500" data-testid="gear-none">
          No rubber gloves or sleeves on record. On energized work a climber, a worker aloft or a crew lead without rated, tested gloves is blocked on the board.
        </p>
      ) : (
        <ul className="grid gap-2 md:grid-cols-2">
          {inService.map((g) => (
            <li key={g.id} className="card p-3" data-testid={`gear-${g.serial}`}>
              <div className="flex flex-wrap items-start justify-between gap-2">
                <p className="font-semibold">
                  {GEAR_KIND_LABEL[g.kind]} · {classLabel(g.class)}
                </p>
                <GearStateBadge state={g.state} dueOn={g.dueOn} daysLeft={g.daysLeft} />
              </div>
              <p className="text-sm tabular-nums text-ink-700">
                Serial {g.serial}
                {g.size ? ` · size ${g.size}` : ""} · tested {g.testedOn}
                {g.issuedOn ? ` · issued ${g.issuedOn}` : ""}
              </p>
              {canEdit && (
                <div className="mt-2 flex flex-wrap items-end gap-2">
                  {testing?.id === g.id ? (
                    <>
                      <label className="text-sm">
                        <span className="label">New test date</span>
                        <input type="date" className="field" value={testing.date} max={today} onChange={(e) => setTesting({ id: g.id, date: e.target.value })} />
                      </label>
                      <button type="button" className="btn-primary" disabled={busy} onClick={() => patch(g, { testedOn: testing.date })}>
                        Save test
                      </button>
                      <button type="button" className="btn-quiet" onClick={() => setTesting(null)}>
                        Cancel
                      </button>
                    </>
                  ) : (
                    <>
                      <button type="button" className="btn-quiet" onClick={() => setTesting({ id: g.id, date: today })}>
                        Record a test
                      </button>
                      <button
                        type="button"
                        className="btn-quiet"
                        disabled={busy}
                        onClick={() => window.confirm(`Retire ${g.serial}? It stays on record but no longer counts.`) && patch(g, { retiredOn: today })}
                      >
                        Retire
                      </button>
                    </>
                  )}
                </div>
              )}
            </li>
          ))}
        </ul>
      )}
      {retired.length > 0 && (
        <details className="mt-2 text-sm">
          <summary className="cursor-pointer text-ink-700">Retired ({retired.length})</summary>
          <ul className="mt-1 space-y-1 text-ink-500">
            {retired.map((g) => (
              <li key={g.id}>
                {GEAR_KIND_LABEL[g.kind]}, class {g.class}, serial {g.serial}, retired {g.retiredOn}
              </li>
            ))}
          </ul>
        </details>
      )}
    </section>
  );
}
