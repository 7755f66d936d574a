// The session cookie's flags follow the public URL: Secure (with next-auth's __Secure- and
// __Host- prefixes) whenever NEXTAUTH_URL is https, as when TLS ends at a proxy; HttpOnly and
// SameSite=Lax always. tests/integration/security.test.ts checks the Set-Cookie headers of real
// instances (http and https NEXTAUTH_URL). Source: next-auth v4 "useSecureCookies" option.
import { afterEach, describe, expect, it, vi } from "vitest";

const saved = process.env.NEXTAUTH_URL;
afterEach(() => {
  process.env.NEXTAUTH_URL = saved;
  vi.resetModules();
});

async function optionsWith(url: string | undefined) {
  vi.resetModules();
  if (url === undefined) delete process.env.NEXTAUTH_URL;
  else process.env.NEXTAUTH_URL = url;
  return (await import("@/lib/auth/options")).authOptions;
}

describe("authOptions.useSecureCookies", () => {
  it("is on for an https public URL", async () => {
    expect((await optionsWith("https://gaffline.cedarprairie.example")).useSecureCookies).toBe(true);
  });

  it("is off for plain http on loopback (the demo) and when unset", async () => {
    expect((await optionsWith("http://127.0.0.1:3000")).useSecureCookies).toBe(false);
    expect((await optionsWith(undefined)).useSecureCookies).toBe(false);
  });

  it("leaves next-auth's HttpOnly, SameSite=Lax cookie defaults in place (no cookie overrides)", async () => {
    const o = await optionsWith("https://gaffline.cedarprairie.example");
    expect(o.cookies).toBeUndefined();
    expect(o.session?.strategy).toBe("jwt");
  });
});
