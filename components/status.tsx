// State is never told by colour alone: every badge carries an icon and a word.
const STYLES = {
  block: { cls: "bg-block-bg text-block", icon: "⛔", word: "Block" },
  warn: { cls: "bg-warn-bg text-warn", icon: "▲", word: "Warn" },
  clear: { cls: "bg-clear-bg text-clear", icon: "✓", word: "Clear" },
  info: { cls: "bg-info-bg text-info", icon: "●", word: "Info" },
  waived: { cls: "bg-waived-bg text-waived", icon: "✎", word: "Overridden" },
  muted: { cls: "bg-paper-200 text-ink-500", icon: "○", word: "" },
} as const;

export type Tone = keyof typeof STYLES;

export function Badge({ tone, children, title }: { tone: Tone; children?: React.ReactNode; title?: string }) {
  const s = STYLES[tone];
  return (
    <span
      title={title}
      className={`inline-flex items-center gap-1 whitespace-nowrap rounded px-1.5 py-0.5 text-xs font-bold ${s.cls}`}
    >
      <span aria-hidden="true">{s.icon}</span>
      {children ?? s.word}
    </span>
  );
}

export function PageHeader({ title, children, eyebrow }: { title: string; eyebrow?: string; children?: React.ReactNode }) {
  return (
    <div className="mb-5 flex flex-wrap items-end justify-between gap-3">
      <div>
        {eyebrow && <p className="text-xs font-bold uppercase tracking-widest text-copper">{eyebrow}</p>}
        <h1 className="text-xl font-extrabold tracking-tight">{title}</h1>
      </div>
      {children && <div className="flex flex-wrap items-center gap-2">{children}</div>}
    </div>
  );
}

/** The standing caution on every screen that shows rule findings or the briefing. */
export function SafetyNote({ className = "" }: { className?: string }) {
  return (
    <p className={`rounded-md border border-rule bg-paper-200 px-3 py-2 text-xs text-ink-700 ${className}`} role="note">
      <strong>Gaffline assists; it does not decide.</strong> These checks do not replace your employer&apos;s safety
      program, the crew lead&apos;s judgement, OSHA 29 CFR 1910.269 / 1926 Subpart V, the NESC, or local codes and
      agreements.
    </p>
  );
}
