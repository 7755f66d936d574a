import { db } from "@/lib/db";
import { findingsAfter, seatedWorkerIds } from "@/lib/assignments/data";
import { liveOverrides } from "@/lib/assignments/data-overrides";
import { Badge, SafetyNote } from "@/components/status";
import { ruleName } from "@/lib/rules/rule-labels";

// The order's own findings, as the board shows them, with the caution (issue 18): the crew
// rules over this order and its crew's neighbouring orders, checked on the server.
export async function OrderFindings({ organisationId, orderId }: { organisationId: number; orderId: number }) {
  const conn = db();
  const workerIds = await seatedWorkerIds(conn, orderId);
  const { findings: all } = await findingsAfter(conn, organisationId, [orderId], workerIds);
  const findings = all.filter((f) => f.workOrderId === String(orderId));
  const overrides = await liveOverrides(conn, orderId);
  const overridden = new Set(overrides.map((o: { rule: string; worker_id: number | null }) => `${o.rule}|${o.worker_id ?? ""}`));
  const blocks = findings.filter((f) => f.level === "block");
  const warns = findings.filter((f) => f.level === "warn");
  return (
    <section className="card mb-4 p-4" aria-labelledby="order-findings" data-testid="order-findings">
      <div className="mb-2 flex flex-wrap items-center gap-2">
        <h2 id="order-findings" className="font-bold">
          Crew check
        </h2>
        {blocks.length > 0 ? <Badge tone="block">{blocks.length} block{blocks.length === 1 ? "" : "s"}</Badge> : <Badge tone="clear">No blocks</Badge>}
        {warns.length > 0 && <Badge tone="warn">{warns.length} warning{warns.length === 1 ? "" : "s"}</Badge>}
      </div>
      {findings.length > 0 ? (
        <ul className="space-y-1.5 text-sm">
          {findings.map((f, i) => (
            <li key={`${f.rule}-${f.workerId ?? ""}-${i}`} className="flex flex-wrap items-start gap-2" data-testid={`order-finding-${f.rule}`}>
              <Badge tone={f.level === "block" ? "block" : "warn"}>{ruleName(f.rule)}</Badge>
              <span className="min-w-0 basis-full break-words sm:basis-0 sm:flex-1">
                {f.message}
                {f.level === "block" && !f.locked && overridden.has(`${f.rule}|${f.workerId ?? ""}`) ? " (overridden by a supervisor)" : ""}
                {f.source ? <span className="ml-1 text-xs text-ink-500">({f.source})</span> : null}
              </span>
            </li>
          ))}
        </ul>
      ) : (
        <p className="text-sm text-ink-700">No findings for this crew.</p>
      )}
      <SafetyNote className="mt-3" />
    </section>
  );
}
