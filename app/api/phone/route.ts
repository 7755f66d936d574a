import { randomBytes } from "node:crypto";
import { db } from "@/lib/db";
import { audit } from "@/lib/audit/data";
import { ApiError, handler, json, readJson, readQuery } from "@/lib/api/http";
import { requireRole, type SessionUser } from "@/lib/auth/session";
import { yardScope } from "@/lib/auth/yard-scope";
import { fakesEnabled, inboundWebhookUrl, smsFakeBase } from "@/lib/notify/config";
import { phoneQuerySchema, phoneReplySchema } from "@/lib/notify/schema";
import { inboundBySid } from "@/lib/messages/data";
import { workerIdByPhone } from "@/lib/workers/data";

export const dynamic = "force-dynamic";

// The phone simulator's back end (demo only, FAKES_ENABLED=1): reads a phone's texts from the
// SMS fake, and asks the fake to deliver a reply to the real, signature-checked webhook.
const ROLES = ["dispatcher", "supervisor", "admin"] as const;

async function fake(path: string, init?: RequestInit) {
  try {
    const res = await fetch(`${smsFakeBase()}${path}`, { ...init, signal: AbortSignal.timeout(20_000), cache: "no-store" });
    const body = await res.json().catch(() => ({}));
    if (!res.ok) throw new ApiError(502, `The SMS fake answered ${res.status}: ${body.error ?? "no detail"}`);
    return body;
  } catch (err) {
    if (err instanceof ApiError) throw err;
    throw new ApiError(503, "The SMS fake is not reachable. Start it with scripts/start (or node --import tsx scripts/fakes/run.ts).");
  }
}

async function ownPhone(user: SessionUser, phone: string) {
  const workerId = await workerIdByPhone(db(), user.organisationId, phone);
  if (workerId === null) throw new ApiError(404, "No worker in your organisation has that phone number.");
  // A phone's texts are contact details: only for the worker's own yard's dispatchers.
  await yardScope(user, "contact", { workerId });
}

export const GET = handler(async (req) => {
  const user = await requireRole(...ROLES);
  if (!fakesEnabled()) throw new ApiError(404, "The phone simulator is off (it needs FAKES_ENABLED=1 and an app served on loopback only).");
  const { phone } = readQuery(req, phoneQuerySchema);
  await ownPhone(user, phone);
  const body = await fake(`/_fake/messages?phone=${encodeURIComponent(phone)}`);
  return json({ phone, messages: body.messages ?? [] });
});

export const POST = handler(async (req) => {
  const user = await requireRole(...ROLES);
  if (!fakesEnabled()) throw new ApiError(404, "The phone simulator is off (it needs FAKES_ENABLED=1 and an app served on loopback only).");
  const input = await readJson(req, phoneReplySchema);
  await ownPhone(user, input.from);
  // Our own message id, so the reply the webhook stores can be tied to who typed it.
  const messageSid = `SMsim${randomBytes(14).toString("hex")}`;
  const body = await fake("/_fake/inbound", {
    method: "POST",
    headers: { "content-type": "application/json" },
    body: JSON.stringify({ from: input.from, body: input.body, webhookUrl: inboundWebhookUrl(), messageSid }),
  });
  // The webhook handled it like any text (its own audit rows have no user); this row says it
  // came from the simulator and who typed it (issue 15, finding 11).
  const inbound = await inboundBySid(db(), messageSid);
  await audit(db(), user, user.organisationId, "phone.simulated_reply", "inbound_message", inbound ? Number(inbound.id) : null, {
    from: input.from,
    body: input.body.slice(0, 200),
    messageSid,
    outcome: inbound?.outcome ?? null,
    workerId: inbound?.worker_id ?? null,
    typedBy: user.name,
  });
  return json({ status: body.status, replies: body.replies ?? [] });
});
