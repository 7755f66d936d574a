// Where the app is reached from outside: links in messages and the webhook URL the provider signs.
export function appPublicUrl() {
  return (process.env.APP_PUBLIC_URL || process.env.NEXTAUTH_URL || "http://127.0.0.1:3000").replace(/\/$/, "");
}

/** The inbound-text webhook exactly as configured at the provider (signatures cover this URL). */
export function inboundWebhookUrl() {
  return `${appPublicUrl()}/api/sms/inbound`;
}

/** A loopback host name or address (127.0.0.0/8, ::1, localhost). */
export function isLoopbackHost(host: string): boolean {
  const h = host.replace(/^\[|\]$/g, "").toLowerCase();
  return h === "localhost" || h === "::1" || /^127(\.\d{1,3}){3}$/.test(h);
}

function loopbackUrl(u: string | undefined): boolean {
  if (!u) return true;
  try {
    return isLoopbackHost(new URL(u).hostname);
  } catch {
    return false;
  }
}

/**
 * The local fakes are on (demo and tests): the phone simulator and mailbox links show. Only
 * when FAKES_ENABLED=1 is set explicitly AND the app is not exposed: its public URL, the
 * address it is bound to (APP_BIND_HOST / HOSTNAME when set) and the SMS API it talks to are
 * all loopback. An app reachable from other machines never offers the simulator, whatever
 * FAKES_ENABLED says (issue 15, finding 3).
 */
export function fakesEnabled() {
  if (process.env.FAKES_ENABLED !== "1") return false;
  const bind = process.env.APP_BIND_HOST || process.env.HOSTNAME_BIND;
  if (bind && !isLoopbackHost(bind)) return false;
  return loopbackUrl(process.env.APP_PUBLIC_URL) && loopbackUrl(process.env.NEXTAUTH_URL) && loopbackUrl(process.env.TWILIO_API_BASE);
}

/** The SMS fake's own base URL (its control endpoints), when the fakes are on. */
export function smsFakeBase() {
  return (process.env.TWILIO_API_BASE || `http://127.0.0.1:${process.env.SMS_FAKE_PORT || 4010}`).replace(/\/$/, "");
}

export function mailboxUrl() {
  return `http://127.0.0.1:${process.env.MAIL_FAKE_HTTP_PORT || 4020}`;
}
