// Audit rows as plain sentences (issue 18 point 11): "Corinne Maddox placed Priya Raman as
// climber on WO-26-0101." The raw detail stays available on the page under "details".

import { ruleName } from "@/lib/rules/rule-labels";

const VERB: Record<string, string> = {
  "assignment.create": "placed",
  "assignment.move": "moved",
  "assignment.remove": "took off",
  "assignment.swap": "swapped",
  "assignment.resend": "re-sent the assignment to",
  "assignment.confirm": "confirmed",
  "assignment.decline": "declined",
  "override.create": "overrode",
  "send.crews": "sent crews",
  "order.create": "created order",
  "order.update": "changed order",
  "order.cancel": "cancelled order",
  "policy.update": "changed the crew-rule policy",
  "credential.add": "added a credential",
  "credential.renew": "renewed a credential",
  "credential.verify": "verified a credential",
  "credential.reject": "rejected a credential",
  "credential.submit": "submitted a credential",
  "credential.import": "imported credentials from CSV",
  "briefing.save": "saved a briefing draft",
  "briefing.complete": "completed a briefing",
  "briefing.ack": "acknowledged a briefing",
  "briefing.hold": "put an order on hold from its briefing",
  "briefing.lift_hold": "lifted a briefing hold",
  "briefing.rebrief": "started a re-brief",
  "briefing.start": "marked the work started",
  "worker.create": "added worker",
  "worker.update": "changed worker",
  "user.create": "added user",
  "user.update": "changed user",
  "user.password_change": "changed their password",
  "user.password_reset_sent": "sent a password link to",
  "rotation.create": "created an on-call rotation",
  "rotation.update": "changed an on-call rotation",
  "rotation.delete": "deleted an on-call rotation",
  "series.create": "created a repeating order series",
  "series.update": "changed a repeating order series",
  "series.end": "ended a repeating order series",
  "series.materialise": "added the next orders of a series",
  "file.upload": "uploaded a file",
  "unavailability.create": "recorded leave",
  "unavailability.request": "asked for leave",
  "unavailability.delete": "deleted leave",
  "time_record.create": "recorded worked time",
  "time_record.delete": "deleted a time record",
  "call_out.create": "recorded a call-out",
  "calendar.reset": "made a new calendar link",
  "equipment.create": "added equipment",
  "equipment.update": "changed equipment",
  "equipment.assign": "booked a truck",
  "equipment.move": "moved a truck",
  "equipment.unassign": "took a truck off",
  "equipment.rigging_add": "added rigging to a truck",
  "equipment.rigging_remove": "took rigging off a truck",
  "gear.create": "recorded rubber goods",
  "gear.import": "imported rubber goods from CSV",
  "gear.reminders": "sent rubber goods test reminders",
  "lift_plan.confirm": "confirmed a lift plan",
  "lift_plan.delete": "deleted a lift plan",
  "qualification_type.create": "added a qualification type",
  "qualification_type.update": "changed a qualification type",
  "qualification_type.delete": "deleted a qualification type",
  "reminders.send": "sent credential reminders",
  "reminders.daily": "sent the daily credential reminders",
  "work_type.update": "changed a work type",
  "fill.accept": "accepted proposed crews",
  "sms.handled": "marked a text reply handled",
};

type Detail = Record<string, unknown> | null;

function parse(detail: unknown): Detail {
  if (detail === null || detail === undefined) return null;
  if (typeof detail === "string") {
    try {
      const v = JSON.parse(detail);
      return v && typeof v === "object" ? (v as Record<string, unknown>) : null;
    } catch {
      return null;
    }
  }
  return typeof detail === "object" ? (detail as Record<string, unknown>) : null;
}

const str = (v: unknown) => (typeof v === "string" || typeof v === "number" ? String(v) : null);
const human = (code: string) => code.replace(/_/g, " ");

/** One sentence for one audit row; never raw JSON. A quoted reason's own full stop ends it. */
export function auditSentence(row: Parameters<typeof sentence>[0]): string {
  return sentence(row).replace(/([.!?])”\.$/, "$1”");
}

function sentence(row: {
  action: string;
  actor_name?: string | null;
  entity?: string | null;
  entity_id?: number | null;
  detail?: unknown;
  /** The order's number when the row is about a work order (looked up by the page). */
  order_number?: string | null;
}): string {
  const who = row.actor_name ?? "The system";
  const d = parse(row.detail) ?? {};
  const verb = VERB[row.action] ?? human(row.action.replace(".", ": "));
  const order = str(d.order) ?? str((d.to as Detail)?.order) ?? row.order_number ?? null;
  const worker = str(d.worker);
  const bits: string[] = [];
  switch (row.action) {
    case "assignment.create":
      return `${who} placed ${worker ?? "a worker"}${d.position ? ` as ${human(String(d.position))}` : ""}${order ? ` on ${order}` : ""}.`;
    case "assignment.move": {
      const from = d.from as Detail;
      const to = d.to as Detail;
      return `${who} moved ${worker ?? "a worker"}${from?.order ? ` from ${from.order}` : ""}${to?.order ? ` to ${to?.position ? `${human(String(to.position))} on ` : ""}${to.order}` : ""}.`;
    }
    case "assignment.remove":
      return `${who} took a worker off ${order ?? "an order"}.`;
    case "assignment.swap": {
      const a = d.a as Detail;
      const b = d.b as Detail;
      return `${who} swapped ${a?.worker ?? "a worker"} and ${b?.worker ?? "a worker"}${a?.from && (a.from as Detail)?.order ? ` (${(a.from as Detail)!.order} and ${((b?.from as Detail) ?? {}).order})` : ""}.`;
    }
    case "override.create":
      return `${who} overrode ${d.rule ? ruleName(String(d.rule)) : "a rule"}${order ? ` on ${order}` : ""}${d.reason ? `: “${String(d.reason)}”` : ""}.`;
    case "credential.import":
      return `${who} imported credentials from CSV: ${str(d.rows) ?? 0} written, ${str(d.superseded) ?? 0} older kept as history.`;
    case "policy.update":
      return `${who} changed the crew-rule policy${d.minRestHours !== undefined ? ` (rest ${d.minRestHours} h, stretch ${d.maxShiftHours} h)` : ""}.`;
  }
  if (worker) bits.push(worker);
  if (order) bits.push(`on ${order}`);
  else if (row.entity === "work_order" && row.entity_id) bits.push(`(order ${row.entity_id})`);
  const reason = d.reason ? `: “${String(d.reason)}”` : "";
  return `${who} ${verb}${bits.length ? " " + bits.join(" ") : ""}${reason}.`;
}

/** The action's words for the filter list. */
export function actionLabel(action: string): string {
  const v = VERB[action];
  return v ? `${v.charAt(0).toUpperCase()}${v.slice(1)} (${action})` : action;
}
