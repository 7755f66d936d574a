import twilio from "twilio";
import { db } from "@/lib/db";
import { handler, readBodyText } from "@/lib/api/http";
import { handleInbound } from "@/lib/assignments/data-inbound";
import { inboundWebhookUrl } from "@/lib/notify/config";

export const dynamic = "force-dynamic";

// The SMS provider's webhook for inbound texts. Public, so every request must carry the
// provider's signature (X-Twilio-Signature, HMAC over the PUBLIC webhook URL and the form
// parameters, checked with the SDK's validateRequest): the URL the provider was configured
// with, not the one this instance sees behind a proxy or load balancer.

function twiml(text: string | null, status = 200) {
  const res = new twilio.twiml.MessagingResponse();
  if (text) res.message(text);
  return new Response(res.toString(), { status, headers: { "content-type": "text/xml; charset=utf-8" } });
}

// Public: no session; the signature is the check. Errors still answer as JSON via handler().
// A provider's form post is a few hundred bytes (a 1,600-character body at most); the limit is
// enforced while the body streams in, before anything is buffered or the signature checked.
const MAX_WEBHOOK_BYTES = 20_000;

export const POST = handler(async (req) => {
  const token = process.env.TWILIO_AUTH_TOKEN ?? "";
  const raw = await readBodyText(req, MAX_WEBHOOK_BYTES, "The webhook body");
  const params: Record<string, string> = {};
  for (const [k, v] of new URLSearchParams(raw)) params[k] = v;
  const signature = req.headers.get("x-twilio-signature") ?? "";
  if (!token || !signature || !twilio.validateRequest(token, signature, inboundWebhookUrl(), params)) {
    return new Response("Signature missing or not valid.", { status: 403, headers: { "content-type": "text/plain" } });
  }
  if (!params.MessageSid || !params.From) return twiml(null, 400);
  const result = await handleInbound(db(), { MessageSid: params.MessageSid, From: params.From, To: params.To, Body: params.Body });
  // A repeated MessageSid: 200 with an empty response, nothing changed.
  return twiml(result.duplicate ? null : result.reply);
}, { origin: "signed" });
