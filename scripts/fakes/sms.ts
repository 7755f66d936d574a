// A local stand-in for the SMS provider's REST API (the parts Gaffline uses), on 127.0.0.1 only.
//
//   POST /2010-04-01/Accounts/{Sid}/Messages.json   form: To, From, Body → 201 message resource
//   GET  /2010-04-01/Accounts/{Sid}/Messages.json   ?To=&From=&DateSent>= … → a page of messages
//        (both with HTTP basic auth SID:token, else 401)
// Test and demo controls:
//   GET  /_fake/health
//   GET  /_fake/messages?to=+1…  (or ?phone= for both directions)  what was received and replied
//   POST /_fake/fail  {count, status}   answer the next N sends with that status (default 500)
//   POST /_fake/down  {seconds}         drop every API connection for a while (controls stay up)
//   POST /_fake/reset
//   POST /_fake/inbound {from, body, to?, messageSid?, webhookUrl?}
//        delivers a text from `from` to the app's webhook, form-encoded and signed the way the
//        provider signs (X-Twilio-Signature from the SDK's own getExpectedTwilioSignature), and
//        returns the app's TwiML answer (whose messages are stored as texts to `from`).
import http from "node:http";
import { randomBytes } from "node:crypto";
import twilio from "twilio";

export interface FakeSms {
  sid: string;
  direction: "outbound-api" | "outbound-reply" | "inbound";
  source: "api" | "twiml" | "inbound";
  to: string;
  from: string;
  body: string;
  status: string;
  numSegments: number;
  dateCreated: string; // ISO
}

export interface SmsFakeOptions {
  port: number;
  host?: string;
  accountSid: string;
  authToken: string;
  fromNumber: string;
  appPublicUrl?: string;
  log?: (msg: string) => void;
}

const rfc2822 = (d: Date) => d.toUTCString().replace("GMT", "+0000");
const newSid = (prefix: string) => prefix + randomBytes(16).toString("hex");

function segments(body: string) {
  // Enough for the resource's num_segments (the app measures properly itself).
  const gsm = /^[\x20-\x7E\n\r£¥èéùìòÇØøÅåΔ_ΦΓΛΩΠΨΣΘΞÆæßÉ¤¡ÄÖÑÜ§¿äöñüà€]*$/.test(body);
  const n = [...body].length;
  return gsm ? (n <= 160 ? 1 : Math.ceil(n / 153)) : n <= 70 ? 1 : Math.ceil(n / 67);
}

function unescapeXml(s: string) {
  return s
    .replace(/&lt;/g, "<")
    .replace(/&gt;/g, ">")
    .replace(/&quot;/g, '"')
    .replace(/&apos;/g, "'")
    .replace(/&#(\d+);/g, (_, n) => String.fromCodePoint(Number(n)))
    .replace(/&#x([0-9a-f]+);/gi, (_, n) => String.fromCodePoint(parseInt(n, 16)))
    .replace(/&amp;/g, "&");
}

/** The text of each <Message> in a TwiML document. */
export function twimlMessages(xml: string) {
  const out: string[] = [];
  const re = /<Message(?:\s[^>]*)?>([\s\S]*?)<\/Message>/g;
  let m: RegExpExecArray | null;
  while ((m = re.exec(xml))) {
    const inner = m[1];
    const body = /<Body(?:\s[^>]*)?>([\s\S]*?)<\/Body>/.exec(inner);
    out.push(unescapeXml(body ? body[1] : inner));
  }
  return out;
}

async function readBody(req: http.IncomingMessage, max = 100_000) {
  const chunks: Buffer[] = [];
  let size = 0;
  for await (const c of req) {
    size += (c as Buffer).length;
    if (size > max) throw new Error("body too large");
    chunks.push(c as Buffer);
  }
  return Buffer.concat(chunks).toString("utf8");
}

function send(res: http.ServerResponse, status: number, body: unknown) {
  const text = JSON.stringify(body);
  res.writeHead(status, { "content-type": "application/json", "content-length": Buffer.byteLength(text) });
  res.end(text);
}

export function startSmsFake(opts: SmsFakeOptions) {
  const log = opts.log ?? (() => {});
  const host = opts.host ?? "127.0.0.1";
  let messages: FakeSms[] = [];
  let failNext = 0;
  let failStatus = 500;
  let downUntil = 0;
  let apiRequests = 0;

  const resource = (m: FakeSms) => ({
    sid: m.sid,
    account_sid: opts.accountSid,
    api_version: "2010-04-01",
    body: m.body,
    date_created: rfc2822(new Date(m.dateCreated)),
    date_sent: m.source === "api" ? rfc2822(new Date(m.dateCreated)) : null,
    date_updated: rfc2822(new Date(m.dateCreated)),
    direction: m.direction,
    error_code: null,
    error_message: null,
    from: m.from,
    messaging_service_sid: null,
    num_media: "0",
    num_segments: String(m.numSegments),
    price: null,
    price_unit: "USD",
    status: m.status,
    subresource_uris: { media: `/2010-04-01/Accounts/${opts.accountSid}/Messages/${m.sid}/Media.json` },
    to: m.to,
    uri: `/2010-04-01/Accounts/${opts.accountSid}/Messages/${m.sid}.json`,
  });

  const authorised = (req: http.IncomingMessage, sid: string) => {
    const h = req.headers.authorization ?? "";
    if (!h.startsWith("Basic ")) return false;
    const [user, ...rest] = Buffer.from(h.slice(6), "base64").toString("utf8").split(":");
    return user === opts.accountSid && rest.join(":") === opts.authToken && sid === opts.accountSid;
  };

  const apiError = (res: http.ServerResponse, status: number, code: number, message: string) =>
    send(res, status, { code, message, more_info: `https://www.twilio.com/docs/errors/${code}`, status });

  const server = http.createServer(async (req, res) => {
    try {
      const url = new URL(req.url ?? "/", `http://${host}`);
      const path = url.pathname;
      const api = /^\/2010-04-01\/Accounts\/([^/]+)\/Messages\.json$/.exec(path);
      if (api) {
        apiRequests++;
        if (Date.now() < downUntil) {
          // "Down": the connection is dropped without an answer, as a dead host or proxy would.
          req.socket.destroy();
          return;
        }
        if (!authorised(req, api[1])) return apiError(res, 401, 20003, "Authenticate");
        if (req.method === "POST") {
          const form = new URLSearchParams(await readBody(req));
          if (failNext > 0) {
            failNext--;
            return apiError(res, failStatus, failStatus === 429 ? 20429 : 20500, failStatus === 429 ? "Too Many Requests" : "Internal server error");
          }
          const to = form.get("To") ?? "";
          const from = form.get("From") ?? "";
          const body = form.get("Body") ?? "";
          if (!/^\+[1-9]\d{6,14}$/.test(to)) return apiError(res, 400, 21211, `The 'To' number ${to} is not a valid phone number.`);
          if (from !== opts.fromNumber) return apiError(res, 400, 21606, `The 'From' phone number provided (${from}) is not a valid message-capable phone number for this account.`);
          if (!body) return apiError(res, 400, 21602, "Message body is required.");
          if (body.length > 1600) return apiError(res, 400, 21617, "The concatenated message body exceeds the 1600 character limit.");
          const m: FakeSms = {
            sid: newSid("SM"),
            direction: "outbound-api",
            source: "api",
            to,
            from,
            body,
            status: "queued",
            numSegments: segments(body),
            dateCreated: new Date().toISOString(),
          };
          messages.push(m);
          log(`SMS to ${to}: ${body.slice(0, 60)}${body.length > 60 ? "…" : ""}`);
          return send(res, 201, resource(m));
        }
        if (req.method === "GET") {
          const to = url.searchParams.get("To");
          const from = url.searchParams.get("From");
          const after = url.searchParams.get("DateSent>") ?? url.searchParams.get("DateSent>=");
          const since = after ? new Date(after.length === 10 ? `${after}T00:00:00Z` : after).getTime() : 0;
          const pageSize = Math.min(Number(url.searchParams.get("PageSize") ?? 50) || 50, 1000);
          const list = messages
            .filter((m) => m.source === "api")
            .filter((m) => (!to || m.to === to) && (!from || m.from === from) && new Date(m.dateCreated).getTime() >= since)
            .reverse()
            .slice(0, pageSize);
          return send(res, 200, {
            messages: list.map(resource),
            end: Math.max(0, list.length - 1),
            first_page_uri: path,
            next_page_uri: null,
            page: 0,
            page_size: pageSize,
            previous_page_uri: null,
            start: 0,
            uri: path,
          });
        }
        return apiError(res, 405, 20004, "Method not allowed");
      }

      if (path === "/_fake/health") return send(res, 200, { ok: true, down: Date.now() < downUntil, messages: messages.length });
      if (path === "/_fake/messages" && req.method === "GET") {
        const to = url.searchParams.get("to");
        const phone = url.searchParams.get("phone");
        const list = messages.filter((m) => (!to || m.to === to) && (!phone || m.to === phone || m.from === phone));
        return send(res, 200, { messages: list, apiRequests });
      }
      if (req.method !== "POST") return send(res, 404, { error: "not found" });
      const raw = await readBody(req);
      let body: Record<string, unknown> = {};
      try {
        body = raw ? JSON.parse(raw) : {};
      } catch {
        return send(res, 400, { error: "JSON body expected" });
      }
      if (path === "/_fake/fail") {
        failNext = Math.max(0, Number(body.count ?? 1));
        failStatus = Number(body.status ?? 500);
        return send(res, 200, { failNext, failStatus });
      }
      if (path === "/_fake/down") {
        const seconds = Math.max(0, Number(body.seconds ?? 5));
        downUntil = Date.now() + seconds * 1000;
        log(`down for ${seconds} s`);
        return send(res, 200, { downUntil: new Date(downUntil).toISOString() });
      }
      if (path === "/_fake/reset") {
        messages = [];
        failNext = 0;
        downUntil = 0;
        apiRequests = 0;
        return send(res, 200, { ok: true });
      }
      if (path === "/_fake/inbound") {
        const from = String(body.from ?? "");
        const text = String(body.body ?? "");
        if (!/^\+[1-9]\d{6,14}$/.test(from)) return send(res, 422, { error: "from must be an E.164 number" });
        const base = String(body.webhookUrl ?? "") || `${(opts.appPublicUrl ?? process.env.APP_PUBLIC_URL ?? "http://127.0.0.1:3000").replace(/\/$/, "")}/api/sms/inbound`;
        const sid = String(body.messageSid ?? "") || newSid("SM");
        const params: Record<string, string> = {
          ToCountry: "US",
          SmsMessageSid: sid,
          NumMedia: "0",
          SmsSid: sid,
          SmsStatus: "received",
          Body: text,
          To: String(body.to ?? opts.fromNumber),
          NumSegments: String(segments(text)),
          MessageSid: sid,
          AccountSid: opts.accountSid,
          From: from,
          ApiVersion: "2010-04-01",
        };
        const signature = twilio.getExpectedTwilioSignature(opts.authToken, base, params);
        messages.push({ sid, direction: "inbound", source: "inbound", to: params.To, from, body: text, status: "received", numSegments: segments(text), dateCreated: new Date().toISOString() });
        let status = 0;
        let xml = "";
        try {
          const r = await fetch(base, {
            method: "POST",
            headers: { "content-type": "application/x-www-form-urlencoded", "x-twilio-signature": signature, "user-agent": "TwilioProxy/1.1 (gaffline fake)" },
            body: new URLSearchParams(params).toString(),
            signal: AbortSignal.timeout(15_000),
          });
          status = r.status;
          xml = await r.text();
        } catch (err) {
          return send(res, 502, { error: `could not reach the webhook ${base}: ${(err as Error).message}` });
        }
        const replies = status === 200 ? twimlMessages(xml) : [];
        for (const r of replies) {
          messages.push({ sid: newSid("SM"), direction: "outbound-reply", source: "twiml", to: from, from: params.To, body: r, status: "sent", numSegments: segments(r), dateCreated: new Date().toISOString() });
        }
        log(`inbound from ${from} → ${status}${replies.length ? `, answered: ${replies[0].slice(0, 60)}` : ""}`);
        return send(res, 200, { status, messageSid: sid, twiml: xml, replies });
      }
      return send(res, 404, { error: "not found" });
    } catch (err) {
      if (!res.headersSent) send(res, 500, { error: (err as Error).message });
    }
  });
  server.keepAliveTimeout = 30_000;
  return new Promise<{ server: http.Server; close: () => Promise<void> }>((resolve, reject) => {
    server.once("error", reject);
    server.listen(opts.port, host, () =>
      resolve({
        server,
        close: () =>
          new Promise<void>((r) => {
            server.closeAllConnections?.();
            server.close(() => r());
          }),
      }),
    );
  });
}
