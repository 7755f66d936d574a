// The streamed fill answer (lib/fill/stream.ts): newline-delimited JSON, one object per line
// (the NDJSON convention, common practice), progress lines before the result, and the
// reader's cancel reaching the fill's abort signal (the WHATWG Streams standard: a consumer's
// cancel() calls the underlying source's cancel; recalled from memory).

import { describe, expect, it } from "vitest";
import { FillCancelled } from "@/lib/fill/fill";
import { streamFill, wantsStream } from "@/lib/fill/stream";

async function readAll(stream: ReadableStream<Uint8Array>) {
  const text = await new Response(stream).text();
  expect(text.endsWith("\n")).toBe(true);
  return text.trim().split("\n").map((l) => JSON.parse(l));
}

describe("streamFill", () => {
  it("writes each progress line, then the result", async () => {
    const s = streamFill(async ({ onProgress }) => {
      onProgress({ phase: "eligibility", elapsedMs: 1, gap: null });
      onProgress({ phase: "cost", elapsedMs: 5, gap: 0.25 });
      return { answer: 42 };
    });
    expect(await readAll(s)).toEqual([
      { type: "progress", phase: "eligibility", elapsedMs: 1, gap: null },
      { type: "progress", phase: "cost", elapsedMs: 5, gap: 0.25 },
      { type: "result", preview: { answer: 42 } },
    ]);
  });

  it("ends with an error line (no stack, nothing about the server's insides) when the work throws", async () => {
    const s = streamFill(async () => {
      throw new Error("secret detail");
    });
    const out = await readAll(s);
    expect(out).toHaveLength(1);
    expect(out[0].type).toBe("error");
    expect(JSON.stringify(out[0])).not.toMatch(/secret/);
  });

  it("a reader's cancel aborts the work's signal; the work stops and nothing more is sent", async () => {
    let signal: AbortSignal | null = null;
    let stopped = false;
    const s = streamFill(async (hooks) => {
      signal = hooks.signal;
      hooks.onProgress({ phase: "eligibility", elapsedMs: 0, gap: null });
      while (!hooks.signal.aborted) await new Promise((r) => setTimeout(r, 5));
      stopped = true;
      throw new FillCancelled();
    });
    const reader = s.getReader();
    const first = await reader.read();
    expect(new TextDecoder().decode(first.value)).toContain('"phase":"eligibility"');
    await reader.cancel();
    await new Promise((r) => setTimeout(r, 50));
    expect(signal!.aborted).toBe(true);
    expect(stopped).toBe(true);
  });

  it("the request's own signal (the client went away) aborts it too, and the stream says cancelled", async () => {
    const req = new AbortController();
    const s = streamFill(async ({ signal }) => {
      req.abort();
      await new Promise((r) => setTimeout(r, 5));
      if (signal.aborted) throw new FillCancelled();
      return 1;
    }, req.signal);
    expect(await readAll(s)).toEqual([{ type: "cancelled" }]);
  });

  it("streams only when the client asks for application/x-ndjson", () => {
    expect(wantsStream(new Request("http://x/", { headers: { accept: "application/x-ndjson" } }))).toBe(true);
    expect(wantsStream(new Request("http://x/", { headers: { accept: "application/json" } }))).toBe(false);
  });
});
