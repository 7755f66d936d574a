// The two helpers the fuzz run (tests/integration/fuzz.test.ts) led to. Lone surrogates: JSON
// can escape them (RFC 8259 §8.2 allows the escape, calls the result unpredictable), UTF-8 cannot
// encode them (RFC 3629 §3), and MariaDB's JSON check refuses them — so readJson turns them away.
import { describe, expect, it } from "vitest";
import { malformedTextAt, readJson } from "@/lib/api/http";
import { shown } from "@/lib/rules/input";
import { z } from "zod";

describe("malformedTextAt", () => {
  it("finds a lone surrogate in a value or a key and names its path", () => {
    expect(malformedTextAt({ a: "fine 😀", b: ["x", { c: "\ud800" }] })).toBe("b.1.c");
    expect(malformedTextAt({ ["k\udfff"]: 1 })).toBe("k\udfff");
    expect(malformedTextAt("\ud83d")).toBe("(body)");
    expect(malformedTextAt({ a: "😀", b: "e\u0301", c: null, d: 3 })).toBeNull();
  });

  it("walks 100,000 levels of nesting without overflowing the stack", () => {
    const deep = JSON.parse("[".repeat(100_000) + '"\\ud800"' + "]".repeat(100_000));
    expect(malformedTextAt(deep)).toMatch(/^0(\.0)+$/);
  });

  it("readJson answers 422 naming the field", async () => {
    const req = new Request("http://x/", { method: "POST", body: '{"name":"\\ud83d"}' });
    await expect(readJson(req, z.object({ name: z.string() }))).rejects.toMatchObject({ status: 422, body: { issues: [{ field: "name" }] } });
  });
});

describe("shown (crew-check error messages)", () => {
  it("quotes short values as JSON and cuts long ones to 80 characters", () => {
    expect(shown("tomorrow")).toBe('"tomorrow"');
    expect(shown("x".repeat(1_000_000))).toHaveLength(80);
  });

  it("describes a value nested too deep for JSON.stringify instead of throwing", () => {
    let v: unknown = 1;
    for (let i = 0; i < 200_000; i++) v = [v];
    expect(shown(v)).toBe("an array nested too deep to show");
  });
});
