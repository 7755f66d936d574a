import { Badge } from "@/components/status";
import { GEAR_STATE_LABEL, type GearState } from "@/lib/gear/model";

/** A rubber goods item's state, with icon and words (never colour alone). */
export function GearStateBadge({ state, dueOn, daysLeft }: { state: GearState; dueOn: string; daysLeft: number }) {
  const tone = state === "overdue" ? "block" : state === "due" ? "warn" : state === "ok" ? "clear" : "muted";
  const detail =
    state === "retired"
      ? ""
      : state === "overdue"
        ? ` since ${dueOn}`
        : ` · next test by ${dueOn}${state === "due" ? ` (${daysLeft} day${daysLeft === 1 ? "" : "s"})` : ""}`;
  return (
    <Badge tone={tone}>
      {GEAR_STATE_LABEL[state]}
      {detail}
    </Badge>
  );
}
