// Where the app is reached from outside: links in messages and the webhook URL the provider signs.
export function appPublicUrl() {
  return (process.env.APP_PUBLIC_URL || process.env.NEXTAUTH_URL || "http://127.0.0.1:3000").replace(/\/$/, "");
}

/** The inbound-text webhook exactly as configured at the provider (signatures cover this URL). */
export function inboundWebhookUrl() {
  return `${appPublicUrl()}/api/sms/inbound`;
}

/** The local fakes are on (demo and tests): the phone simulator and mailbox links show. */
export function fakesEnabled() {
  return process.env.FAKES_ENABLED === "1";
}

/** The SMS fake's own base URL (its control endpoints), when the fakes are on. */
export function smsFakeBase() {
  return (process.env.TWILIO_API_BASE || `http://127.0.0.1:${process.env.SMS_FAKE_PORT || 4010}`).replace(/\/$/, "");
}

export function mailboxUrl() {
  return `http://127.0.0.1:${process.env.MAIL_FAKE_HTTP_PORT || 4020}`;
}
