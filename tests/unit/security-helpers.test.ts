// The pure pieces of issue 15's fixes. Sources beside each check.
import { describe, expect, it } from "vitest";
import Papa from "papaparse";
import { clientAddress, normaliseAddress } from "@/lib/auth/client-address";
import { safePath, safeRedirect } from "@/lib/auth/options";
import { holdMs, SIGN_IN_LIMIT, waitSeconds } from "@/lib/auth/rate-limit";
import { CSV_FORMULA, isFormulaCell, unguardCell } from "@/lib/csv";

describe("same-origin paths only (OWASP Unvalidated Redirects and Forwards cheat sheet)", () => {
  it.each([
    ["/board", "/board"],
    ["/orders/12?tab=crew#x", "/orders/12?tab=crew#x"],
    ["//evil.example", null], // protocol-relative URL: another host
    ["/\\evil.example", null], // browsers read "\" as "/" (WHATWG URL: special schemes)
    ["/\t/evil.example", null], // tab is stripped by the URL parser: "//evil.example"
    ["https://evil.example", null],
    ["javascript:alert(1)", null],
    ["", null],
  ])("%j → %j", (input, want) => expect(safePath(input)).toBe(want));

  it("a redirect URL that does not parse goes to the base, never throws", () => {
    expect(safeRedirect("http://[", "http://127.0.0.1:3000")).toBe("http://127.0.0.1:3000");
    expect(safeRedirect("http://127.0.0.1:3000/me", "http://127.0.0.1:3000")).toBe("http://127.0.0.1:3000/me");
    expect(safeRedirect("http://127.0.0.1:3001/me", "http://127.0.0.1:3000")).toBe("http://127.0.0.1:3000"); // another port is another origin (RFC 6454 §4)
  });
});

describe("client address: X-Forwarded-For only from a trusted proxy", () => {
  const h = (peer: string, xff?: string) => ({ "x-gaffline-peer": peer, ...(xff ? { "x-forwarded-for": xff } : {}) });
  it("no proxy configured: the TCP peer, whatever the header says", () => {
    expect(clientAddress(h("203.0.113.9", "198.51.100.1"), {})).toBe("203.0.113.9");
  });
  it("a trusted proxy: the right-most hop that is not a proxy (the left ones are the client's own words)", () => {
    const env = { TRUSTED_PROXIES: "10.0.0.5" };
    expect(clientAddress(h("10.0.0.5", "1.2.3.4, 198.51.100.7"), env)).toBe("198.51.100.7");
    expect(clientAddress(h("203.0.113.9", "198.51.100.7"), env)).toBe("203.0.113.9"); // not from the proxy
    expect(clientAddress(h("127.0.0.1", "198.51.100.7, 127.0.0.1"), { TRUSTED_PROXIES: "loopback" })).toBe("198.51.100.7");
  });
  it("IPv4-mapped IPv6 is the IPv4 address (RFC 4291 §2.5.5.2); garbage is no address", () => {
    expect(normaliseAddress("::ffff:192.0.2.1")).toBe("192.0.2.1");
    expect(normaliseAddress("not-an-ip")).toBe("");
  });
});

describe("sign-in waits grow instead of locking the account", () => {
  it("free tries, then 30 s doubling, capped at 15 min", () => {
    expect(waitSeconds(SIGN_IN_LIMIT.pairFree - 1, SIGN_IN_LIMIT.pairFree)).toBe(0);
    expect(waitSeconds(SIGN_IN_LIMIT.pairFree, SIGN_IN_LIMIT.pairFree)).toBe(30);
    expect(waitSeconds(SIGN_IN_LIMIT.pairFree + 1, SIGN_IN_LIMIT.pairFree)).toBe(60);
    expect(waitSeconds(SIGN_IN_LIMIT.pairFree + 20, SIGN_IN_LIMIT.pairFree)).toBe(900);
  });
  it("failures from many addresses only slow the account's answers (at most 5 s), never refuse them", () => {
    expect(holdMs(SIGN_IN_LIMIT.accountFree - 1)).toBe(0);
    expect(holdMs(SIGN_IN_LIMIT.accountFree)).toBe(250);
    expect(holdMs(10_000)).toBe(5000);
  });
});

describe("CSV formula guard (OWASP CSV Injection)", () => {
  it.each(["=1+1", "+1", "-1+1", "@SUM(A1)", "\n=HYPERLINK(\"http://x\")", "  =1", "\r\n@x", "\t=1", "\u00a0=1", "＝1"])("%j is guarded", (v) => {
    expect(isFormulaCell(v)).toBe(true);
    const csv = Papa.unparse([[v]], { escapeFormulae: CSV_FORMULA });
    expect(Papa.parse<string[]>(csv).data[0][0].startsWith("'")).toBe(true);
  });
  it.each(["Marcus Whitfield", "CP-1001", "2026-01-05", "a=b", ""])("%j is left as it is", (v) => {
    expect(isFormulaCell(v)).toBe(false);
  });
  it("a guarded cell reads back as it was; a plain leading quote stays", () => {
    expect(unguardCell("'\n=HYPERLINK(1)")).toBe("\n=HYPERLINK(1)");
    expect(unguardCell("'twas")).toBe("'twas");
  });
});
