import { POSITION_LABEL } from "@/lib/format";
import { POSITIONS } from "@/lib/rules/types";

/** The <option>s of a seat's position; `lead` says it is the employee in charge when `explain` is set. */
export function PositionOptions({ explain = false }: { explain?: boolean }) {
  return (
    <>
      {POSITIONS.map((p) => (
        <option key={p} value={p}>
          {POSITION_LABEL[p]}
          {explain && p === "lead" ? " (employee in charge)" : ""}
        </option>
      ))}
    </>
  );
}
