"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";

/** The crew lead confirms the lift plan with the weight read off the nameplate on site. */
export function LiftConfirmForm({ orderId, version, plannedLb, confirmed }: { orderId: number; version: number; plannedLb: number; confirmed: boolean }) {
  const router = useRouter();
  const [weight, setWeight] = useState(String(plannedLb));
  const [busy, setBusy] = useState(false);
  const [msg, setMsg] = useState<{ ok: boolean; text: string } | null>(null);

  async function confirm(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setMsg(null);
    try {
      const res = await fetch(`/api/briefings/${orderId}/lift`, {
        method: "POST",
        headers: { "content-type": "application/json" },
        body: JSON.stringify({ version, siteWeightLb: weight.trim() === "" ? null : Number(weight) }),
      });
      const body = await res.json().catch(() => ({}));
      if (!res.ok) {
        setMsg({ ok: false, text: body.error ?? "Not confirmed." });
        return;
      }
      const over = body.figures?.checks?.some((c: { over: boolean }) => c.over);
      setMsg({ ok: !over, text: over ? "Confirmed, but a part is over its WLL at this weight: change the rigging before lifting." : "Lift plan confirmed." });
      router.refresh();
    } catch {
      setMsg({ ok: false, text: "No signal? Nothing was sent; try again when the phone is back online." });
    } finally {
      setBusy(false);
    }
  }

  return (
    <form onSubmit={confirm} className="mt-3 flex flex-wrap items-end gap-2 print:hidden" aria-label="Confirm the lift plan" noValidate>
      <label className="text-sm">
        <span className="label">Nameplate weight read on site (lb)</span>
        <input className="field" type="number" min={1} step="any" inputMode="decimal" name="siteWeightLb" value={weight} onChange={(e) => setWeight(e.target.value)} />
      </label>
      <button className="btn-primary" type="submit" disabled={busy}>
        {busy ? "Confirming…" : confirmed ? "Confirm again" : "Confirm the lift plan"}
      </button>
      {msg && (
        <p role={msg.ok ? "status" : "alert"} className={`w-full text-sm ${msg.ok ? "text-clear" : "text-block"}`}>
          {msg.ok ? "✓ " : "✖ "}
          {msg.text}
        </p>
      )}
    </form>
  );
}
