import Link from "next/link";
import { requirePageRole } from "@/lib/auth/session";
import { db } from "@/lib/db";
import { loadDaySheet } from "@/lib/daysheet/data";
import { crewLine, daySheetQuerySchema, DAY_SHEET_CAUTION } from "@/lib/daysheet/model";
import { listYards } from "@/lib/yards/data";
import { Badge, SafetyNote } from "@/components/status";
import { PrintButton } from "./print-button";
import "./print.css";

export const metadata = { title: "Day sheet" };
export const dynamic = "force-dynamic";

// Issue 18: a printable day sheet of all crews — per yard or every yard — with the caution,
// each order's crew, trucks and findings in words, times in the yard's zone. The same sheet as
// a PDF: /api/day-sheet.
export default async function DaySheetPage({ searchParams }: { searchParams: Promise<{ date?: string; yard?: string }> }) {
  const user = await requirePageRole("dispatcher", "supervisor", "admin");
  const parsed = daySheetQuerySchema.safeParse(await searchParams);
  const q = parsed.success ? parsed.data : {};
  const yards = await listYards(db(), user.organisationId);
  const yardCode = q.yard && yards.some((y) => y.code.toLowerCase() === q.yard!.toLowerCase()) ? q.yard : null;
  const sheet = await loadDaySheet(db(), { organisationId: user.organisationId, yardCode, day: q.date ?? null });
  const pdf = `/api/day-sheet?date=${sheet.day}${yardCode ? `&yard=${encodeURIComponent(yardCode)}` : ""}`;
  const back = `/board?date=${sheet.day}${yardCode ? `&yard=${encodeURIComponent(yardCode)}` : ""}`;
  return (
    <article className="day-sheet" data-testid="day-sheet">
      <div className="no-print mb-4 flex flex-wrap items-end justify-between gap-3">
        <form className="flex flex-wrap items-end gap-2" method="get">
          <label className="text-sm">
            <span className="label">Day</span>
            <input type="date" name="date" defaultValue={sheet.day} className="field w-auto" />
          </label>
          <label className="text-sm">
            <span className="label">Yard</span>
            <select name="yard" defaultValue={yardCode ?? ""} className="field w-auto">
              <option value="">Every yard</option>
              {yards.map((y) => (
                <option key={y.id} value={y.code}>
                  {y.name}
                </option>
              ))}
            </select>
          </label>
          <button type="submit" className="btn-quiet">
            Show
          </button>
        </form>
        <div className="flex flex-wrap gap-2">
          <Link href={back} className="btn-quiet">
            Back to the board
          </Link>
          <a href={pdf} className="btn-quiet" data-testid="day-sheet-pdf">
            PDF
          </a>
          <PrintButton />
        </div>
      </div>

      <header className="mb-3">
        <p className="text-xs font-bold uppercase tracking-widest text-copper">Day sheet</p>
        <h1 className="text-xl font-extrabold tracking-tight">{sheet.dayWords}</h1>
      </header>
      {/* The sheet's own caution, which also names the manufacturer's ratings (the PDF carries the same words). */}
      <p className="mb-4 rounded-md border border-rule bg-paper-200 px-3 py-2 text-xs text-ink-700" role="note" data-testid="day-sheet-caution">
        <strong>{DAY_SHEET_CAUTION.split(". ")[0]}.</strong> {DAY_SHEET_CAUTION.split(". ").slice(1).join(". ")}
      </p>

      {sheet.yards.map((y) => (
        <section key={y.code} className="sheet-yard mb-6" aria-labelledby={`yard-${y.code}`} data-testid={`sheet-yard-${y.code}`}>
          <h2 id={`yard-${y.code}`} className="mb-1 text-lg font-extrabold tracking-tight">
            {y.name}
          </h2>
          <p className="mb-3 text-xs text-ink-700">
            {y.orders.length === 1 ? "1 order" : `${y.orders.length} orders`} · times in {y.zone} ({y.timezone})
          </p>
          {y.orders.length === 0 && <p className="text-sm">No orders on this day.</p>}
          <div className="grid gap-3 lg:grid-cols-2 print:block">
            {y.orders.map((o) => (
              <section key={o.id} className="sheet-order card p-3 text-sm" aria-label={`${o.number} ${o.title}`} data-testid={`sheet-order-${o.number}`}>
                <div className="flex flex-wrap items-baseline gap-x-2">
                  <h3 className="font-bold">{o.number}</h3>
                  <span className="min-w-0 break-words font-semibold">{o.title}</span>
                  {o.status !== "Planned" && <span className="text-xs text-ink-700">· {o.status}</span>}
                </div>
                <p className="break-words">
                  <strong>{o.when}</strong> · {o.where}
                </p>
                <p className="text-xs text-ink-700">{o.work}</p>
                {o.holdReason && <p className="text-xs font-semibold text-warn">On hold: {o.holdReason}</p>}
                <h4 className="mt-2 text-xs font-bold uppercase tracking-wide text-ink-700">Crew</h4>
                <ul className="sheet-crew">
                  {o.crew.map((c, i) => (
                    <li key={`${c.position}-${i}`} data-testid="sheet-crew" className={c.name ? "" : "text-block"}>
                      {crewLine(c)}
                    </li>
                  ))}
                  {!o.crew.length && <li>No positions.</li>}
                </ul>
                <p className="mt-1">
                  <span className="font-semibold">{o.trucks.length === 1 ? "Truck" : "Trucks"}:</span> {o.trucks.length ? o.trucks.join("; ") : "none booked"}
                </p>
                {o.locateWarning && <p className="text-xs text-warn">Locate: {o.locateWarning}</p>}
                <h4 className="mt-2 text-xs font-bold uppercase tracking-wide text-ink-700">Findings</h4>
                {o.findings.length ? (
                  <ul className="space-y-1">
                    {o.findings.map((f, i) => (
                      <li key={`${f.rule}-${i}`} className="flex flex-wrap items-start gap-1.5">
                        <Badge tone={f.override ? "overridden" : f.level}>{f.ruleName}</Badge>
                        <span className="min-w-0 basis-full break-words sm:basis-0 sm:flex-1">
                          {f.message}
                          {f.override ? <em> ({f.override})</em> : null}
                        </span>
                      </li>
                    ))}
                  </ul>
                ) : (
                  <p>None for this crew.</p>
                )}
              </section>
            ))}
          </div>
        </section>
      ))}
      <SafetyNote className="mt-4" />
      <p className="mt-2 text-xs text-ink-500">Printed from Gaffline. Check the board before you rely on it: crews change after printing.</p>
    </article>
  );
}
