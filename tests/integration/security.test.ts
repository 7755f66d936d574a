// Security headers and session cookies (issue 10), against the running app (APP_URL) and, for
// the Secure flag, a second `next start` of the same build with an https NEXTAUTH_URL (as behind
// a TLS-terminating proxy). The CSP the pages really run under is checked in a browser by
// tests/e2e/security.spec.ts. Elsewhere: the sign-in limit (platform.test.ts), upload refusals
// (credentials-upload.test.ts), forged and replayed SMS webhooks (notify.test.ts).
// Header semantics: CSP Level 3 (W3C), X-Content-Type-Options (Fetch §3.5 "nosniff"),
// Referrer-Policy (W3C), cookie attributes and prefixes (RFC 6265bis §4.1.3).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { account, APP_URL, Client } from "../support/client";
import { startApp, type AppInstance } from "../support/spawn";

function directives(csp: string | null) {
  const out = new Map<string, string>();
  for (const part of (csp ?? "").split(";")) {
    const [name, ...values] = part.trim().split(/\s+/);
    if (name) out.set(name.toLowerCase(), values.join(" "));
  }
  return out;
}

function expectSecurityHeaders(res: Response, what: string) {
  const h = res.headers;
  const csp = directives(h.get("content-security-policy"));
  expect(csp.get("default-src"), `${what}: default-src`).toBe("'self'");
  expect(csp.get("frame-ancestors"), `${what}: frame-ancestors`).toBe("'none'");
  expect(csp.get("object-src"), `${what}: object-src`).toBe("'none'");
  expect(csp.get("base-uri"), `${what}: base-uri`).toBe("'self'");
  expect(csp.get("form-action"), `${what}: form-action`).toBe("'self'");
  expect(csp.get("connect-src"), `${what}: connect-src`).toBe("'self'");
  // No third-party origin anywhere in the policy, and no eval outside development.
  expect(h.get("content-security-policy"), `${what}: no other origin`).not.toMatch(/https?:|\*/);
  expect(csp.get("script-src"), `${what}: no eval`).not.toContain("unsafe-eval");
  expect(h.get("x-content-type-options"), what).toBe("nosniff");
  expect(h.get("x-frame-options"), what).toBe("DENY");
  expect(h.get("referrer-policy"), what).toBe("strict-origin-when-cross-origin");
  expect(h.get("permissions-policy"), what).toMatch(/microphone=\(\)/);
  expect(h.get("x-powered-by"), `${what}: no X-Powered-By`).toBeNull();
}

interface SetCookie {
  name: string;
  attrs: Map<string, string | true>;
}
const parseSetCookie = (lines: string[]): SetCookie[] =>
  lines.map((line) => {
    const [pair, ...rest] = line.split(";");
    const attrs = new Map<string, string | true>();
    for (const a of rest) {
      const [k, ...v] = a.trim().split("=");
      if (k) attrs.set(k.toLowerCase(), v.length ? v.join("=") : true);
    }
    return { name: pair.slice(0, pair.indexOf("=")).trim(), attrs };
  });

/** Signs in through next-auth's credentials flow by hand, returning every Set-Cookie seen. */
async function signInRaw(base: string, role: "dispatcher") {
  const a = account(role, "dispatch@cedarprairie.example");
  const jar = new Map<string, string>();
  const seen: string[] = [];
  const keep = (res: Response) => {
    for (const c of res.headers.getSetCookie()) {
      seen.push(c);
      const [pair] = c.split(";");
      jar.set(pair.slice(0, pair.indexOf("=")), pair.slice(pair.indexOf("=") + 1));
    }
  };
  const cookie = () => [...jar].map(([k, v]) => `${k}=${v}`).join("; ");
  const csrf = await fetch(`${base}/api/auth/csrf`);
  keep(csrf);
  const { csrfToken } = (await csrf.json()) as { csrfToken: string };
  const cb = await fetch(`${base}/api/auth/callback/credentials`, {
    method: "POST",
    redirect: "manual",
    headers: { "content-type": "application/x-www-form-urlencoded", cookie: cookie() },
    body: new URLSearchParams({ csrfToken, email: a.email, password: a.password, json: "true" }),
  });
  keep(cb);
  return { status: cb.status, cookies: parseSetCookie(seen), cookie };
}

describe("security headers on every kind of response", () => {
  it("a page, a JSON route, an API error, 404s, a redirect and a static asset all carry them", async () => {
    const login = await fetch(`${APP_URL}/login`);
    expect(login.status).toBe(200);
    expectSecurityHeaders(login, "/login");
    const html = await login.text();
    const asset = /\/_next\/static\/[^"']+\.(?:js|css)/.exec(html)?.[0];
    expect(asset, "a static asset linked from /login").toBeTruthy();
    const checks: [string, number][] = [
      ["/api/health", 200],
      ["/api/board", 401],
      ["/api/no-such-route", 404],
      ["/_next/static/no-such-file.js", 404],
      ["/no-such-page-at-all", 307], // signed out: proxy.ts sends every page to /login
      [asset!, 200],
    ];
    for (const [path, status] of checks) {
      const r = await fetch(`${APP_URL}${path}`, { redirect: "manual" });
      expect(r.status, path).toBe(status);
      expectSecurityHeaders(r, path);
      await r.arrayBuffer();
    }
  });

  it("JSON routes answer application/json, even for errors, and never a stack trace", async () => {
    const c = await (async () => {
      const x = new Client();
      await x.signIn(account("dispatcher").email, account("dispatcher").password);
      return x;
    })();
    for (const [path, method, body] of [
      ["/api/board?date=2026-02-30", "GET", undefined],
      ["/api/assignments", "POST", "{not json"],
      ["/api/orders/0x1f", "GET", undefined],
    ] as const) {
      const res = await c.fetch(path, { method, body, headers: body ? { "content-type": "application/json" } : {} });
      expect(res.headers.get("content-type"), path).toMatch(/^application\/json/);
      const text = await res.text();
      expect(res.status, `${path}: ${text}`).toBeGreaterThanOrEqual(400);
      expect(res.status, `${path}: ${text}`).toBeLessThan(500);
      expect(text).not.toMatch(/\bat .+\.(js|ts):\d+|node_modules/);
    }
  });

  it("a page cannot be framed and a signed-out page visit is sent to sign in (not served)", async () => {
    const r = await fetch(`${APP_URL}/board`, { redirect: "manual" });
    expect([302, 303, 307, 308]).toContain(r.status);
    expect(r.headers.get("location")).toMatch(/\/login/);
    expectSecurityHeaders(r, "/board redirect");
  });
});

describe("session cookies", () => {
  it("over the demo's plain http: HttpOnly, SameSite=Lax, Path=/, not Secure", async () => {
    const r = await signInRaw(APP_URL, "dispatcher");
    expect(r.status).toBe(200);
    const session = r.cookies.find((c) => c.name === "next-auth.session-token");
    expect(session, "session cookie set").toBeTruthy();
    expect(session!.attrs.get("httponly")).toBe(true);
    expect(String(session!.attrs.get("samesite")).toLowerCase()).toBe("lax");
    expect(session!.attrs.get("path")).toBe("/");
    expect(session!.attrs.has("secure")).toBe(false);
    const csrf = r.cookies.find((c) => c.name === "next-auth.csrf-token");
    expect(csrf!.attrs.get("httponly")).toBe(true);
  });

  describe("behind https (NEXTAUTH_URL https://…)", () => {
    let app: AppInstance;
    beforeAll(async () => {
      app = await startApp({ env: { NEXTAUTH_URL: "https://gaffline.cedarprairie.example", DELIVERY_LOOP: "off" } });
    }, 90_000);
    afterAll(async () => {
      await app?.stop();
    });

    it("every cookie is Secure, the session cookie __Secure-, the CSRF cookie __Host-; the session works", async () => {
      const r = await signInRaw(app.url, "dispatcher");
      expect(r.status).toBe(200);
      expect(r.cookies.length).toBeGreaterThan(0);
      for (const c of r.cookies) {
        expect(c.attrs.has("secure"), `${c.name} is Secure`).toBe(true);
        expect(c.attrs.get("httponly"), `${c.name} is HttpOnly`).toBe(true);
        expect(String(c.attrs.get("samesite")).toLowerCase(), `${c.name} is SameSite=Lax`).toBe("lax");
      }
      const session = r.cookies.find((c) => c.name === "__Secure-next-auth.session-token");
      expect(session, `cookies: ${r.cookies.map((c) => c.name).join(", ")}`).toBeTruthy();
      // RFC 6265bis §4.1.3.2: a __Host- cookie is Secure, has Path=/ and no Domain.
      const csrf = r.cookies.find((c) => c.name === "__Host-next-auth.csrf-token");
      expect(csrf).toBeTruthy();
      expect(csrf!.attrs.get("path")).toBe("/");
      expect(csrf!.attrs.has("domain")).toBe(false);
      expect(r.cookies.some((c) => c.name === "next-auth.session-token")).toBe(false);
      // The prefixed cookie is the one the server reads: the API and the page guard accept it.
      const board = await fetch(`${app.url}/api/board?yard=NOR`, { headers: { cookie: r.cookie() } });
      expect(board.status).toBe(200);
      const page = await fetch(`${app.url}/board`, { headers: { cookie: r.cookie() }, redirect: "manual" });
      expect(page.status).toBe(200);
      await page.text();
      // The unprefixed name is not accepted there.
      const plain = r.cookie().replace("__Secure-next-auth.session-token", "next-auth.session-token");
      expect((await fetch(`${app.url}/api/board?yard=NOR`, { headers: { cookie: plain } })).status).toBe(401);
    });
  });
});
