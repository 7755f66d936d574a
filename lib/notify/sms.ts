// The SMS adapter: the official twilio SDK. Locally its documented custom HTTP client option
// (`httpClient`) points it at the SMS fake: a RequestClient subclass that rewrites
// https://api.twilio.com to TWILIO_API_BASE. With TWILIO_API_BASE unset it talks to the real API.
import twilio from "twilio";
import RequestClient from "twilio/lib/base/RequestClient";

export interface SmsSendResult {
  sid: string;
  status: string;
}

export interface SmsAdapter {
  send(msg: { to: string; body: string; statusCallback?: string }): Promise<SmsSendResult>;
  /** Messages the provider holds for this number since a time (used before re-sending a stale claim). */
  findSent(q: { to: string; since: Date }): Promise<{ sid: string; body: string; dateCreated: Date | null }[]>;
}

/** Rewrites the provider's host to a local base URL (the SMS fake). */
export class RewritingRequestClient extends RequestClient {
  constructor(
    private readonly base: string,
    opts?: RequestClient.RequestClientOptions,
  ) {
    super(opts);
  }
  request<TData>(opts: RequestClient.RequestOptions<TData>) {
    const target = this.base.replace(/\/$/, "");
    return super.request({ ...opts, uri: opts.uri.replace(/^https:\/\/[a-z0-9.-]*api\.twilio\.com/i, target) });
  }
}

export function smsConfig() {
  const accountSid = process.env.TWILIO_ACCOUNT_SID ?? "";
  const authToken = process.env.TWILIO_AUTH_TOKEN ?? "";
  const from = process.env.TWILIO_FROM_NUMBER ?? "";
  const apiBase = process.env.TWILIO_API_BASE || null;
  return { accountSid, authToken, from, apiBase, configured: Boolean(accountSid && authToken && from) };
}

/** Transient failures are retried by the outbox; these provider answers never will succeed. */
export function isPermanentSmsError(err: unknown) {
  const e = err as { status?: number; code?: number } | null;
  if (!e || typeof e.status !== "number") return false;
  // 400 (invalid number, unsubscribed recipient 21610, …) and 404 are the request's own fault.
  return e.status === 400 || e.status === 404 || e.status === 422;
}

let cached: { key: string; adapter: SmsAdapter } | null = null;

export function smsAdapter(): SmsAdapter {
  const cfg = smsConfig();
  const key = `${cfg.accountSid}|${cfg.authToken}|${cfg.from}|${cfg.apiBase}`;
  if (cached?.key === key) return cached.adapter;
  if (!cfg.configured) {
    const missing: SmsAdapter = {
      send: async () => {
        throw new Error("SMS is not configured: set TWILIO_ACCOUNT_SID, TWILIO_AUTH_TOKEN and TWILIO_FROM_NUMBER.");
      },
      findSent: async () => {
        throw new Error("SMS is not configured.");
      },
    };
    return missing;
  }
  const httpOpts = { timeout: 15_000, keepAlive: true };
  const client = twilio(cfg.accountSid, cfg.authToken, {
    httpClient: cfg.apiBase ? new RewritingRequestClient(cfg.apiBase, httpOpts) : new RequestClient(httpOpts),
  });
  const adapter: SmsAdapter = {
    async send({ to, body, statusCallback }) {
      const m = await client.messages.create({ to, from: cfg.from, body, ...(statusCallback ? { statusCallback } : {}) });
      return { sid: m.sid, status: m.status };
    },
    async findSent({ to, since }) {
      const list = await client.messages.list({ to, from: cfg.from, dateSentAfter: new Date(since.getTime() - 60_000), limit: 200 });
      return list.map((m) => ({ sid: m.sid, body: m.body, dateCreated: m.dateCreated ?? null }));
    },
  };
  cached = { key, adapter };
  return adapter;
}
