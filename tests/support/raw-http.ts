// Plain node:http requests for what fetch() cannot do in tests: choose the local address the
// connection comes from (127.0.0.2, 127.0.0.3 … are all this machine: Linux routes 127.0.0.0/8
// to loopback), and stream a body in chunks without a Content-Length.
import http from "node:http";
import { APP_URL } from "./client";

export interface RawResponse {
  status: number;
  headers: http.IncomingHttpHeaders;
  text: string;
  /** Body bytes written before the response arrived (streamed requests). */
  sentBeforeAnswer: number;
}

export function raw(
  method: string,
  path: string,
  opts: { headers?: Record<string, string>; body?: string | Buffer; localAddress?: string; base?: string } = {},
): Promise<RawResponse> {
  const u = new URL(path, opts.base ?? APP_URL);
  return new Promise((resolve, reject) => {
    const req = http.request(
      { method, host: u.hostname, port: u.port, path: u.pathname + u.search, headers: opts.headers, localAddress: opts.localAddress },
      (res) => {
        const chunks: Buffer[] = [];
        res.on("data", (c) => chunks.push(c));
        res.on("end", () => resolve({ status: res.statusCode ?? 0, headers: res.headers, text: Buffer.concat(chunks).toString("utf8"), sentBeforeAnswer: 0 }));
      },
    );
    req.on("error", reject);
    if (opts.body !== undefined) req.write(opts.body);
    req.end();
  });
}

/**
 * Sends (POST unless told) `totalBytes` of filler in 64 kB chunks with Transfer-Encoding: chunked (no
 * Content-Length), stopping as soon as an answer arrives. Resolves with the answer and how
 * many bytes had been written by then; a server that reads everything first answers only
 * after all of them.
 */
export function streamed(
  path: string,
  totalBytes: number,
  opts: { headers?: Record<string, string>; head?: Buffer; base?: string; method?: string } = {},
): Promise<RawResponse> {
  const u = new URL(path, opts.base ?? APP_URL);
  return new Promise((resolve, reject) => {
    let sent = 0;
    let answered = false;
    const req = http.request(
      { method: opts.method ?? "POST", host: u.hostname, port: u.port, path: u.pathname + u.search, headers: { ...opts.headers, "transfer-encoding": "chunked" } },
      (res) => {
        answered = true;
        const at = sent;
        const chunks: Buffer[] = [];
        res.on("data", (c) => chunks.push(c));
        res.on("end", () => {
          resolve({ status: res.statusCode ?? 0, headers: res.headers, text: Buffer.concat(chunks).toString("utf8"), sentBeforeAnswer: at });
          req.destroy();
        });
      },
    );
    req.on("error", (err) => {
      // A reset right after the answer: the answer already counted.
      if (!answered) setTimeout(() => !answered && reject(err), 200);
    });
    const chunk = Buffer.alloc(64 * 1024, 0x61);
    // One chunk per turn of the event loop, so an early answer is read as soon as it comes
    // (writing in a tight loop would leave it unread until the server's reset discards it).
    const pump = () => {
      if (answered || req.destroyed) return;
      if (sent >= totalBytes) return void req.end();
      const piece = sent === 0 && opts.head ? opts.head : chunk;
      sent += piece.length;
      if (req.write(piece)) setImmediate(pump);
      else req.once("drain", () => setImmediate(pump));
    };
    pump();
  });
}

/** Signs in over node:http from a chosen local address; returns the status and next-auth's answer. */
export async function signInFrom(localAddress: string, email: string, password: string, extraHeaders: Record<string, string> = {}) {
  const csrf = await raw("GET", "/api/auth/csrf", { localAddress });
  const cookie = (csrf.headers["set-cookie"] ?? []).map((c) => c.split(";")[0]).join("; ");
  const token = JSON.parse(csrf.text).csrfToken as string;
  const res = await raw("POST", "/api/auth/callback/credentials", {
    localAddress,
    headers: { "content-type": "application/x-www-form-urlencoded", cookie, ...extraHeaders },
    body: new URLSearchParams({ csrfToken: token, email, password, json: "true" }).toString(),
  });
  const signedIn = (res.headers["set-cookie"] ?? []).some((c) => /session-token=[^;]+/.test(c) && !/max-age=0/i.test(c));
  return { status: res.status, text: decodeURIComponent(res.text), signedIn };
}
