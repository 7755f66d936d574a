import http from "node:http";
import { isIP } from "node:net";

// The client's address for the sign-in limit (issue 15, finding 5). Route handlers see no
// socket, and Next keeps any X-Forwarded-For the client sends, so neither header can be
// believed on its own. installPeerStamp() (from instrumentation.ts) writes the TCP peer's
// address into PEER_HEADER on every request as it arrives, replacing anything the client sent
// under that name. X-Forwarded-For is then read only when that peer is a proxy named in
// TRUSTED_PROXIES (comma-separated addresses, or "loopback"); otherwise the peer is the client.

export const PEER_HEADER = "x-gaffline-peer";

const STAMPED = Symbol.for("gaffline.peerStamp");

export function installPeerStamp(): void {
  const proto = http.Server.prototype as unknown as Record<symbol, unknown> & { emit: (...a: unknown[]) => boolean };
  if (proto[STAMPED]) return;
  const original = proto.emit;
  proto.emit = function (this: http.Server, event: unknown, ...args: unknown[]) {
    if (event === "request") {
      const req = args[0] as http.IncomingMessage;
      try {
        const headers = req.headers;
        delete headers[PEER_HEADER];
        headers[PEER_HEADER] = normaliseAddress(req.socket?.remoteAddress ?? "") || "unknown";
      } catch {
        /* a request without headers: nothing to stamp */
      }
    }
    return original.call(this, event, ...args);
  };
  proto[STAMPED] = true;
}

/** "::ffff:127.0.0.1" → "127.0.0.1"; anything that is not an address → "". */
export function normaliseAddress(a: string): string {
  const s = a.trim().replace(/^\[|\]$/g, "").replace(/^::ffff:(?=\d+\.\d+\.\d+\.\d+$)/i, "");
  return isIP(s) ? s.toLowerCase() : "";
}

function isLoopback(a: string) {
  return a === "::1" || /^127\./.test(a);
}

export function trustedProxies(env: Record<string, string | undefined> = process.env): (a: string) => boolean {
  const list = (env.TRUSTED_PROXIES ?? env.TRUSTED_PROXY ?? "")
    .split(",")
    .map((s) => s.trim().toLowerCase())
    .filter(Boolean);
  const exact = new Set(list.map(normaliseAddress).filter(Boolean));
  const loopback = list.includes("loopback");
  return (a) => exact.has(a) || (loopback && isLoopback(a));
}

type HeaderBag = Record<string, string | string[] | undefined> | Headers | undefined;

function header(h: HeaderBag, name: string): string | undefined {
  if (!h) return undefined;
  if (typeof (h as Headers).get === "function") return (h as Headers).get(name) ?? undefined;
  const v = (h as Record<string, string | string[] | undefined>)[name];
  return Array.isArray(v) ? v.join(",") : v;
}

/**
 * The client's address: the stamped TCP peer, or — only when that peer is a trusted proxy —
 * the right-most X-Forwarded-For entry that is not itself a trusted proxy (entries further
 * left were written by the client and prove nothing).
 */
export function clientAddress(headers: HeaderBag, env: Record<string, string | undefined> = process.env): string {
  const peer = normaliseAddress(header(headers, PEER_HEADER) ?? "") || "unknown";
  const trusted = trustedProxies(env);
  if (peer === "unknown" || !trusted(peer)) return peer;
  const hops = (header(headers, "x-forwarded-for") ?? "").split(",").map(normaliseAddress);
  for (let i = hops.length - 1; i >= 0; i--) {
    if (!hops[i]) return peer; // a malformed hop: stop believing the chain
    if (!trusted(hops[i])) return hops[i];
  }
  return peer;
}
