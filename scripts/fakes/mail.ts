// A local mail catcher: an SMTP server (no auth, no TLS, loopback only) that keeps every
// message in memory, and a small web mailbox to read them.
//
//   SMTP  127.0.0.1:SMTP_PORT
//   HTTP  127.0.0.1:MAIL_FAKE_HTTP_PORT
//     GET  /                     the mailbox (HTML list; ?to= filters)
//     GET  /m/:id                one message; /m/:id/a/:n downloads attachment n
//     GET  /api/messages?to=     JSON
//     POST /api/reset
//     POST /api/down {seconds}   refuse SMTP connections (421) for a while
//     GET  /api/health
import http from "node:http";
import { simpleParser } from "mailparser";
import { SMTPServer } from "smtp-server";

export interface FakeMail {
  id: number;
  messageId: string | null;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
  date: string;
  receivedAt: string;
  attachments: { filename: string; contentType: string; size: number; content: string }[];
  /** Same Message-ID as an earlier message (a re-send after an interrupted delivery). */
  duplicateOf: number | null;
}

export interface MailFakeOptions {
  smtpPort: number;
  httpPort: number;
  host?: string;
  log?: (msg: string) => void;
}

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);

function addresses(v: unknown): string[] {
  const list = Array.isArray(v) ? v : v ? [v] : [];
  return list.flatMap((a: { value?: { address?: string }[] }) => (a.value ?? []).map((x) => (x.address ?? "").toLowerCase())).filter(Boolean);
}

function page(title: string, body: string) {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width,initial-scale=1"><title>${esc(title)}</title>
<style>
body{font-family:system-ui,sans-serif;margin:0;background:#f6f4ef;color:#16232b}
header{background:#16232b;color:#f6f4ef;padding:10px 16px;font-weight:800}
main{max-width:1100px;margin:0 auto;padding:16px}
table{width:100%;border-collapse:collapse;background:#fbfaf7;border:1px solid #d9d4c7}
th,td{text-align:left;padding:6px 8px;border-top:1px solid #d9d4c7;font-size:14px;vertical-align:top}
th{background:#ebe7dd;font-size:12px;text-transform:uppercase;color:#56656c}
a{color:#005a8c} pre{white-space:pre-wrap;background:#fbfaf7;border:1px solid #d9d4c7;padding:12px;border-radius:8px}
.dup{color:#8a5a00;font-weight:700} form{display:inline}
</style></head><body><header>Gaffline local mailbox (e-mail fake)</header><main>${body}</main></body></html>`;
}

export function startMailFake(opts: MailFakeOptions) {
  const log = opts.log ?? (() => {});
  const host = opts.host ?? "127.0.0.1";
  let mails: FakeMail[] = [];
  let nextId = 1;
  let downUntil = 0;

  const sockets = new Set<import("node:net").Socket>();
  const unavailable = () => Object.assign(new Error("Service not available, try again later"), { responseCode: 421 });
  const smtp = new SMTPServer({
    secure: false,
    authOptional: true,
    disabledCommands: ["AUTH", "STARTTLS"],
    banner: "Gaffline mail fake",
    size: 10 * 1024 * 1024,
    logger: false,
    onConnect(_session, cb) {
      if (Date.now() < downUntil) return cb(unavailable());
      cb();
    },
    onMailFrom(_address, _session, cb) {
      if (Date.now() < downUntil) return cb(unavailable());
      cb();
    },
    onData(stream, session, cb) {
      simpleParser(stream)
        .then((p) => {
          const messageId = p.messageId ?? null;
          const earlier = messageId ? mails.find((m) => m.messageId === messageId) : undefined;
          const rcpt = session.envelope.rcptTo.map((r) => r.address.toLowerCase());
          const mail: FakeMail = {
            id: nextId++,
            messageId,
            from: p.from?.text ?? String(session.envelope.mailFrom && session.envelope.mailFrom.address),
            to: rcpt.length ? rcpt : addresses(p.to),
            subject: p.subject ?? "",
            text: p.text ?? "",
            html: typeof p.html === "string" ? p.html : null,
            date: (p.date ?? new Date()).toISOString(),
            receivedAt: new Date().toISOString(),
            attachments: (p.attachments ?? []).map((a) => ({
              filename: a.filename ?? "attachment",
              contentType: a.contentType,
              size: a.size,
              content: a.content.toString(/^text\//.test(a.contentType) ? "utf8" : "base64"),
            })),
            duplicateOf: earlier?.id ?? null,
          };
          mails.push(mail);
          log(`mail to ${mail.to.join(", ")}: ${mail.subject.slice(0, 60)}`);
          cb();
        })
        .catch((err) => cb(err));
    },
  });
  smtp.on("error", (err) => log(`smtp error: ${err.message}`));
  // Small SMTP replies otherwise wait on Nagle's algorithm + delayed ACKs (~40 ms a command).
  smtp.server.on("connection", (socket: import("node:net").Socket) => {
    socket.setNoDelay(true);
    sockets.add(socket);
    socket.once("close", () => sockets.delete(socket));
  });

  const httpServer = http.createServer(async (req, res) => {
    const url = new URL(req.url ?? "/", `http://${host}`);
    const sendJson = (status: number, body: unknown) => {
      res.writeHead(status, { "content-type": "application/json" });
      res.end(JSON.stringify(body));
    };
    const to = url.searchParams.get("to")?.toLowerCase() ?? null;
    const filtered = () => mails.filter((m) => !to || m.to.includes(to));
    try {
      if (url.pathname === "/api/health") return sendJson(200, { ok: true, down: Date.now() < downUntil, messages: mails.length });
      if (url.pathname === "/api/messages" && req.method === "GET") return sendJson(200, { messages: filtered() });
      if (req.method === "POST") {
        let raw = "";
        for await (const c of req) raw += c;
        let body: Record<string, unknown> = {};
        try {
          body = raw ? JSON.parse(raw) : {};
        } catch {
          /* form posts from the mailbox page */
        }
        if (url.pathname === "/api/reset") {
          mails = [];
          downUntil = 0;
          if (req.headers["content-type"]?.includes("form")) {
            res.writeHead(303, { location: "/" });
            return res.end();
          }
          return sendJson(200, { ok: true });
        }
        if (url.pathname === "/api/down") {
          downUntil = Date.now() + Math.max(0, Number(body.seconds ?? 5)) * 1000;
          // Down means down: open (pooled) client connections drop too.
          for (const s of sockets) s.destroy();
          return sendJson(200, { downUntil: new Date(downUntil).toISOString() });
        }
        return sendJson(404, { error: "not found" });
      }
      const att = /^\/m\/(\d+)\/a\/(\d+)$/.exec(url.pathname);
      if (att) {
        const m = mails.find((x) => x.id === Number(att[1]));
        const a = m?.attachments[Number(att[2])];
        if (!a) return sendJson(404, { error: "not found" });
        const data = /^text\//.test(a.contentType) ? Buffer.from(a.content, "utf8") : Buffer.from(a.content, "base64");
        res.writeHead(200, { "content-type": a.contentType, "content-disposition": `attachment; filename="${a.filename.replace(/"/g, "")}"` });
        return res.end(data);
      }
      const one = /^\/m\/(\d+)$/.exec(url.pathname);
      res.setHeader("content-type", "text/html; charset=utf-8");
      if (one) {
        const m = mails.find((x) => x.id === Number(one[1]));
        if (!m) {
          res.statusCode = 404;
          return res.end(page("Not found", "<p>No such message.</p>"));
        }
        return res.end(
          page(
            m.subject,
            `<p><a href="/">← All messages</a></p><h2>${esc(m.subject)}</h2>
<p><strong>From</strong> ${esc(m.from)}<br><strong>To</strong> ${esc(m.to.join(", "))}<br><strong>Date</strong> ${esc(m.date)}<br><strong>Message-ID</strong> ${esc(m.messageId ?? "")}${m.duplicateOf ? ` <span class="dup">▲ same Message-ID as #${m.duplicateOf}</span>` : ""}</p>
<pre>${esc(m.text)}</pre>
${m.attachments.length ? `<h3>Attachments</h3><ul>${m.attachments.map((a, i) => `<li><a href="/m/${m.id}/a/${i}">${esc(a.filename)}</a> (${esc(a.contentType)}, ${a.size} bytes)${/calendar/.test(a.contentType) ? `<pre>${esc(a.content)}</pre>` : ""}</li>`).join("")}</ul>` : ""}`,
          ),
        );
      }
      if (url.pathname === "/") {
        const list = filtered().slice().reverse();
        return res.end(
          page(
            "Mailbox",
            `<p>${list.length} message${list.length === 1 ? "" : "s"}${to ? ` to ${esc(to)} · <a href="/">show all</a>` : ""} · <form method="post" action="/api/reset"><button>Empty the mailbox</button></form></p>
<table><thead><tr><th>#</th><th>Received (UTC)</th><th>To</th><th>Subject</th><th>Files</th></tr></thead><tbody>
${list.map((m) => `<tr><td>${m.id}</td><td>${esc(m.receivedAt.slice(0, 19).replace("T", " "))}</td><td><a href="/?to=${encodeURIComponent(m.to[0] ?? "")}">${esc(m.to.join(", "))}</a></td><td><a href="/m/${m.id}">${esc(m.subject || "(no subject)")}</a>${m.duplicateOf ? ` <span class="dup">▲ repeat of #${m.duplicateOf}</span>` : ""}</td><td>${m.attachments.map((a) => esc(a.filename)).join(", ")}</td></tr>`).join("")}
</tbody></table>`,
          ),
        );
      }
      res.statusCode = 404;
      res.end(page("Not found", "<p>Not found.</p>"));
    } catch (err) {
      if (!res.headersSent) sendJson(500, { error: (err as Error).message });
    }
  });

  return new Promise<{ close: () => Promise<void> }>((resolve, reject) => {
    smtp.server.once("error", reject);
    smtp.listen(opts.smtpPort, host, () => {
      httpServer.once("error", reject);
      httpServer.listen(opts.httpPort, host, () =>
        resolve({
          close: () =>
            new Promise<void>((r) => {
              httpServer.closeAllConnections?.();
              httpServer.close(() => smtp.close(() => r()));
            }),
        }),
      );
    });
  });
}
