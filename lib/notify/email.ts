// The e-mail adapter: nodemailer over SMTP (locally the mail fake on SMTP_HOST:SMTP_PORT).
import { connect, type Socket } from "node:net";
import nodemailer, { type Transporter } from "nodemailer";

export interface StoredAttachment {
  filename: string;
  contentType: string;
  content: string;
}

export interface EmailMessage {
  to: string;
  subject: string;
  text: string;
  html?: string | null;
  attachments?: StoredAttachment[];
  /** The Message-ID; a re-send of the same outbox row carries the same one. */
  messageId: string;
}

export interface EmailAdapter {
  send(msg: EmailMessage): Promise<{ messageId: string; response: string }>;
}

export function emailConfig() {
  return {
    host: process.env.SMTP_HOST || "127.0.0.1",
    port: Number(process.env.SMTP_PORT || 2525),
    secure: process.env.SMTP_SECURE === "1",
    user: process.env.SMTP_USER || "",
    pass: process.env.SMTP_PASSWORD || "",
    from: process.env.MAIL_FROM || "Gaffline dispatch <dispatch@gaffline.invalid>",
  };
}

/** SMTP 5xx answers (mailbox unknown, message refused) will not succeed on retry. */
export function isPermanentEmailError(err: unknown) {
  const e = err as { responseCode?: number; code?: string } | null;
  return Boolean(e && typeof e.responseCode === "number" && e.responseCode >= 500 && e.responseCode < 600);
}

let cached: { key: string; transport: Transporter } | null = null;

function transport() {
  const cfg = emailConfig();
  const key = JSON.stringify(cfg);
  if (cached?.key === key) return cached.transport;
  cached?.transport.close();
  const local = cfg.host === "127.0.0.1" || cfg.host === "localhost" || cfg.host === "::1";
  const t = nodemailer.createTransport({
    host: cfg.host,
    port: cfg.port,
    secure: cfg.secure,
    // The local fake speaks plain SMTP on loopback; anywhere else STARTTLS is required.
    ignoreTLS: local && !cfg.secure,
    requireTLS: !local && !cfg.secure,
    auth: cfg.user ? { user: cfg.user, pass: cfg.pass } : undefined,
    pool: true,
    maxConnections: 5,
    maxMessages: 500,
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 20_000,
    // SMTP is a chatty line protocol: with Nagle's algorithm each command's small write waits
    // for the previous one's delayed ACK (~40 ms a command). A no-delay socket avoids that.
    // (nodemailer's getSocket hook takes an open connection; TLS is still negotiated on it.)
    getSocket: (_opts: unknown, cb: (err: Error | null, socketOptions?: { connection: Socket }) => void) => {
      const socket = connect({ host: cfg.host, port: cfg.port, noDelay: true });
      const fail = (err: Error) => cb(err);
      socket.setTimeout(10_000, () => socket.destroy(Object.assign(new Error("SMTP connection timed out"), { code: "ETIMEDOUT" })));
      socket.once("error", fail);
      socket.once("connect", () => {
        socket.setTimeout(0);
        socket.off("error", fail);
        cb(null, { connection: socket });
      });
    },
  } as Parameters<typeof nodemailer.createTransport>[0]);
  cached = { key, transport: t };
  return t;
}

/** Closes pooled SMTP connections (scripts and tests, so the process can exit). */
export function closeEmailTransport() {
  cached?.transport.close();
  cached = null;
}

export function emailAdapter(): EmailAdapter {
  return {
    async send(msg) {
      const cfg = emailConfig();
      const info = await transport().sendMail({
        from: cfg.from,
        to: msg.to,
        subject: msg.subject,
        text: msg.text,
        html: msg.html ?? undefined,
        messageId: msg.messageId,
        attachments: (msg.attachments ?? []).map((a) => ({ filename: a.filename, content: a.content, contentType: a.contentType })),
      });
      return { messageId: info.messageId, response: String(info.response ?? "") };
    },
  };
}
