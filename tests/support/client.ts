// An HTTP client for integration tests: signs in through next-auth's credentials flow
// (csrf token, then the callback) and keeps the session cookie.
import { DEMO_ACCOUNTS } from "@/db/demo/accounts";

export const APP_URL = process.env.APP_URL ?? "http://127.0.0.1:3100";

export type DemoRole = (typeof DEMO_ACCOUNTS)[number]["role"];

export class Client {
  private cookies = new Map<string, string>();
  constructor(public base = APP_URL) {}

  private cookieHeader() {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join("; ");
  }

  private keep(res: Response) {
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(";");
      const i = pair.indexOf("=");
      const name = pair.slice(0, i);
      const value = pair.slice(i + 1);
      if (value === "" || /max-age=0/i.test(c)) this.cookies.delete(name);
      else this.cookies.set(name, value);
    }
  }

  async fetch(path: string, init: RequestInit = {}) {
    const headers = new Headers(init.headers);
    if (this.cookies.size) headers.set("cookie", this.cookieHeader());
    const res = await fetch(this.base + path, { ...init, headers, redirect: "manual" });
    this.keep(res);
    return res;
  }

  async json<T = any>(path: string, method = "GET", body?: unknown): Promise<{ status: number; body: T }> {
    const res = await this.fetch(path, {
      method,
      headers: body === undefined ? {} : { "content-type": "application/json" },
      body: body === undefined ? undefined : typeof body === "string" ? body : JSON.stringify(body),
    });
    const text = await res.text();
    let parsed: any = text;
    try {
      parsed = JSON.parse(text);
    } catch {
      /* not JSON */
    }
    return { status: res.status, body: parsed as T };
  }

  /** Signs in; returns the status of the credentials callback (200 ok, 401 refused). */
  async signIn(email: string, password: string, ip = "127.0.0.1") {
    const csrf = await this.json<{ csrfToken: string }>("/api/auth/csrf");
    const res = await this.fetch("/api/auth/callback/credentials", {
      method: "POST",
      headers: { "content-type": "application/x-www-form-urlencoded", "x-forwarded-for": ip },
      body: new URLSearchParams({ csrfToken: csrf.body.csrfToken, email, password, json: "true" }),
    });
    const body = await res.text();
    return { status: res.status, body, signedIn: this.cookies.has("next-auth.session-token") };
  }
}

export function account(role: DemoRole, email?: string) {
  const a = DEMO_ACCOUNTS.find((x) => x.role === role && (!email || x.email === email));
  if (!a) throw new Error(`no demo account for ${role}`);
  return a;
}

/** A client already signed in as the demo user of a role. */
export async function as(role: DemoRole, email?: string) {
  const c = new Client();
  const a = account(role, email);
  const r = await c.signIn(a.email, a.password);
  if (!r.signedIn) throw new Error(`sign-in as ${role} failed: ${r.status} ${r.body.slice(0, 200)}`);
  return c;
}
