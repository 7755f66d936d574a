import type { Tone } from "@/lib/tone";

export type { Tone };

// State is never told by colour alone: every badge carries an icon and a word.
const STYLES: Record<Tone, { cls: string; word: string }> = {
  block: { cls: "bg-block-bg text-block", word: "Block" },
  warn: { cls: "bg-warn-bg text-warn", word: "Warn" },
  clear: { cls: "bg-clear-bg text-clear", word: "Clear" },
  info: { cls: "bg-info-bg text-info", word: "Info" },
  overridden: { cls: "bg-waived-bg text-waived", word: "Overridden" },
  muted: { cls: "bg-paper-200 text-ink-500", word: "" },
};

/** Shape-coded state icons (drawn, so they look the same on every device): a shape per state. */
export function StateIcon({ tone, className = "h-3 w-3" }: { tone: Tone; className?: string }) {
  const common = { className, viewBox: "0 0 12 12", "aria-hidden": true } as const;
  switch (tone) {
    case "block": // octagon with a bar: stop
      return (
        <svg {...common}>
          <path d="M3.5 0.5h5l3 3v5l-3 3h-5l-3-3v-5z" fill="currentColor" />
          <path d="M3 5.2h6v1.6H3z" fill="#fff" />
        </svg>
      );
    case "warn": // triangle with a mark
      return (
        <svg {...common}>
          <path d="M6 0.6l5.6 10.4H0.4z" fill="currentColor" />
          <path d="M5.3 3.8h1.4v3.6H5.3zM5.3 8.3h1.4v1.3H5.3z" fill="#fff" />
        </svg>
      );
    case "clear": // tick
      return (
        <svg {...common}>
          <path d="M1 6.4l1.3-1.3 2.3 2.3L9.7 2.3 11 3.6 4.6 10z" fill="currentColor" />
        </svg>
      );
    case "overridden": // pen stroke
      return (
        <svg {...common}>
          <path d="M8.3 0.8l2.9 2.9-7 7H1.3V7.8z" fill="currentColor" />
        </svg>
      );
    case "info":
      return (
        <svg {...common}>
          <circle cx="6" cy="6" r="5" fill="currentColor" />
        </svg>
      );
    default:
      return (
        <svg {...common}>
          <circle cx="6" cy="6" r="4.2" fill="none" stroke="currentColor" strokeWidth="1.6" />
        </svg>
      );
  }
}

export function Badge({ tone, children, title }: { tone: Tone; children?: React.ReactNode; title?: string }) {
  const s = STYLES[tone];
  return (
    <span
      title={title}
      className={`inline-flex items-center gap-1 whitespace-nowrap rounded px-1.5 py-0.5 text-xs font-bold ${s.cls}`}
    >
      <StateIcon tone={tone} />
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
