import { Badge } from "./status";
import { DaysLeft } from "./days-left";

/** A credential's state as a badge with an icon and a word: waiting, superseded, rejected, or days left. */
export function CredentialState({
  status,
  daysLeft,
  warnDays,
}: {
  status: string;
  daysLeft: number | null;
  warnDays: number;
}) {
  if (status === "pending") return <Badge tone="info">Waiting for HR</Badge>;
  if (status === "superseded") return <Badge tone="muted">Superseded</Badge>;
  if (status === "rejected") return <Badge tone="muted">Rejected</Badge>;
  return <DaysLeft days={daysLeft} warnDays={warnDays} />;
}

/** "Current" / "Lapsed" as a word for the per-worker page. */
export function CurrentWord({ daysLeft }: { daysLeft: number | null }) {
  if (daysLeft !== null && daysLeft < 0) return <Badge tone="block">Lapsed</Badge>;
  return <Badge tone="clear">Current</Badge>;
}
