"use client";

// The board's head (split out of board-client.tsx): day and yard navigation, undo, Fill and
// Send crews; the day's summary line (blocks, warnings, open positions, live or polling); the
// toast.
import Link from "next/link";
import { usePathname, useRouter } from "next/navigation";
import type { BoardPayload } from "@/lib/board/model";
import { Badge } from "@/components/status";
import { fmtDate } from "@/lib/format";
import { addDays } from "@/lib/time/days";
import { FillPanel } from "./fill-panel";
import { SendCrewsButton } from "./send-crews";
import type { LiveMode } from "./use-board-live";

export function BoardToolbar(props: {
  data: BoardPayload;
  day: string;
  yardCode: string;
  role: string;
  history: { label: string }[];
  pending: boolean;
  onUndo: () => void;
  unresolved: number;
  onSent: () => void;
  notify: (msg: string, tone?: "ok" | "error") => void;
}) {
  const { data, day, yardCode, role, history } = props;
  const router = useRouter();
  const path = usePathname();
  const go = (d: string, y: string) => router.replace(`${path}?date=${d}&yard=${y}`);
  return (
    <div className="mb-4 flex flex-wrap items-end justify-between gap-3">
      <div>
        <p className="text-xs font-bold uppercase tracking-widest text-copper">Board · {data.yard.name}</p>
        <h1 className="text-xl font-extrabold tracking-tight" data-testid="board-day">
          {fmtDate(data.day, { weekday: "long", month: "long", day: "numeric", year: "numeric" })}
        </h1>
      </div>
      <div className="flex flex-wrap items-center gap-2">
        <button type="button" className="btn-quiet" onClick={() => go(addDays(day, -1), yardCode)} aria-label="Previous day">
          ←
        </button>
        <input type="date" aria-label="Day" className="field w-auto" value={day} onChange={(e) => e.target.value && go(e.target.value, yardCode)} />
        <button type="button" className="btn-quiet" onClick={() => go(addDays(day, 1), yardCode)} aria-label="Next day">
          →
        </button>
        <select aria-label="Yard" className="field w-auto" value={yardCode} onChange={(e) => go(day, e.target.value)}>
          {data.yards.map((y) => (
            <option key={y.id} value={y.code}>
              {y.name}
            </option>
          ))}
        </select>
        {(role === "dispatcher" || role === "supervisor") && (
          <button
            type="button"
            className="btn-quiet"
            data-testid="undo"
            disabled={history.length === 0 || props.pending}
            aria-keyshortcuts="Control+Z Meta+Z"
            title={history.length ? `Undo ${history[history.length - 1].label} (Ctrl+Z)` : "Nothing to undo"}
            onClick={props.onUndo}
          >
            ↶ Undo
            <span className="sr-only">{history.length ? `: ${history[history.length - 1].label}` : ""}</span>
          </button>
        )}
        <Link href={`/day-sheet?date=${day}&yard=${yardCode}`} className="btn-quiet" data-testid="day-sheet-link" title="Every crew of the day, to print or save as PDF">
          Day sheet
        </Link>
        <FillPanel day={day} yard={yardCode} role={role} />
        <SendCrewsButton day={day} yard={yardCode} unresolved={props.unresolved} role={role} onDone={props.onSent} notify={props.notify} />
      </div>
    </div>
  );
}

const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? "" : "s"}`;

export function DaySummary({ data, unresolved, warnCount, live, isFetching }: { data: BoardPayload; unresolved: number; warnCount: number; live: LiveMode; isFetching: boolean }) {
  return (
    <div className="mb-4 flex flex-wrap items-center gap-2 text-sm" data-testid="day-summary">
      {unresolved ? (
        <Badge tone="block">
          {unresolved} unresolved block{unresolved > 1 ? "s" : ""}
        </Badge>
      ) : (
        <Badge tone="clear">No unresolved blocks</Badge>
      )}
      {warnCount > 0 && <Badge tone="warn">{warnCount} warning{warnCount === 1 ? "" : "s"}</Badge>}
      <span className="text-ink-500">
        {plural(data.orders.length, "order")} · {plural(data.orders.reduce((n, o) => n + o.seats.filter((s) => !s.assignment).length, 0), "open position")}
      </span>
      <span className="text-xs text-ink-500" data-testid="live-status" data-mode={live}>
        · {live === "stream" ? "live" : live === "polling" ? "checking every 2 s" : "connecting…"}
      </span>
      {isFetching && <span className="text-xs text-ink-500">· refreshing…</span>}
      {unresolved > 0 && (
        <span className="text-xs text-ink-700" data-testid="send-reason">
          Send crews stays off until every block is fixed or overridden by a supervisor.
        </span>
      )}
    </div>
  );
}

export function Toast({ toast }: { toast: { msg: string; tone: "ok" | "error" } | null }) {
  return (
    <div aria-live="polite" className="fixed bottom-4 right-4 z-40">
      {toast && (
        <p
          role={toast.tone === "error" ? "alert" : "status"}
          className={`max-w-sm rounded-md px-3 py-2 text-sm font-semibold shadow-lg ${toast.tone === "error" ? "bg-block text-white" : "bg-ink text-paper"}`}
        >
          {toast.tone === "error" ? "✖ " : "✓ "}
          {toast.msg}
        </p>
      )}
    </div>
  );
}
