import { afterEach, describe, expect, it, vi } from "vitest";
import { z } from "zod";
import { ApiError, errorResponse, readJson } from "@/lib/api/http";
import { ApiFailure, apiFetch, placeFailure, sendJson, UNREACHABLE } from "@/lib/api/client";

// The client fetch wrapper (lib/api/client.ts) against the answers the app's own routes make:
// every error response below comes from lib/api/http.ts (`readJson` + `errorResponse`, the same
// code every route handler runs), so the test fails if either side changes its shape alone.
// Status meanings: RFC 9110 §15.5.10 (409 Conflict: the request conflicts with the current state
// of the resource) and §15.5.21 (422 Unprocessable Content: well-formed but not acceptable).
// The form side follows react-hook-form's documented `setError(name, { type, message })`, where
// `name` is the dotted path ("shifts.0.start") zod also reports (react-hook-form docs, setError).

const orderish = z.object({
  title: z.string().min(3, "At least 3 characters"),
  shifts: z.array(z.object({ start: z.string().min(16, "Pick a start"), end: z.string() })),
});

/** What a route answers when `readJson(req, schema)` refuses the body. */
async function routeAnswerFor(body: unknown): Promise<Response> {
  const req = new Request("http://app.test/api/x", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
  try {
    await readJson(req, orderish);
  } catch (err) {
    return errorResponse(err);
  }
  throw new Error("the schema accepted the body");
}

function answerWith(res: Response | (() => Promise<Response>)) {
  const fetchMock = vi.fn(async (_url: string, _init?: RequestInit) => (typeof res === "function" ? res() : res));
  vi.stubGlobal("fetch", fetchMock);
  return fetchMock;
}

/** A form stand-in that records setError calls as react-hook-form receives them. */
function recorder(known?: string[]) {
  const calls: { name: string; type?: string; message?: string }[] = [];
  return {
    calls,
    setError: (name: string, error: { type?: string; message?: string }) => {
      if (known && !known.includes(name)) throw new Error(`unknown field ${name}`);
      calls.push({ name, type: error.type, message: error.message });
    },
  };
}

/** The rejection of a call that must fail (a resolved call fails the test). */
async function failureOf(p: Promise<unknown>): Promise<ApiFailure> {
  return p.then(
    () => {
      throw new Error("expected the call to fail");
    },
    (e) => e as ApiFailure,
  );
}

afterEach(() => {
  vi.unstubAllGlobals();
});

describe("apiFetch", () => {
  it("sends a plain value as JSON with the method asked and returns the parsed body on 2xx", async () => {
    const f = answerWith(Response.json({ id: 7, created: 1 }, { status: 201 }));
    const out = await apiFetch<{ id: number }>("/api/orders", { method: "POST", body: { title: "Pole swap" } });
    expect(out).toEqual({ id: 7, created: 1 });
    const [url, init] = f.mock.calls[0];
    expect(url).toBe("/api/orders");
    expect(init?.method).toBe("POST");
    expect((init?.headers as Record<string, string>)["content-type"]).toBe("application/json");
    expect(init?.body).toBe('{"title":"Pole swap"}');
  });

  it("defaults to GET without a body, and sends FormData untouched (the browser sets the multipart boundary)", async () => {
    const f = answerWith(() => Promise.resolve(Response.json({ ok: true })));
    await apiFetch("/api/board");
    expect(f.mock.calls[0][1]?.method).toBe("GET");
    expect(f.mock.calls[0][1]?.body).toBeUndefined();
    const fd = new FormData();
    fd.set("kind", "evidence");
    await apiFetch("/api/files", { method: "POST", body: fd });
    expect(f.mock.calls[1][1]?.body).toBe(fd);
    expect((f.mock.calls[1][1]?.headers as Record<string, string>)["content-type"]).toBeUndefined();
  });

  it("turns a route's 422 into an ApiFailure with the issues readJson named", async () => {
    answerWith(await routeAnswerFor({ title: "ab", shifts: [{ start: "2026", end: "x" }] }));
    const err = await failureOf(apiFetch("/api/orders", { method: "POST", body: {} }));
    expect(err).toBeInstanceOf(ApiFailure);
    expect(err.status).toBe(422);
    expect(err.invalid).toBe(true);
    expect(err.conflict).toBe(false);
    expect(err.issues).toEqual([
      { field: "title", message: "At least 3 characters" },
      { field: "shifts.0.start", message: "Pick a start" },
    ]);
    expect(err.message).toBe("Invalid title: At least 3 characters");
  });

  it("turns a stale write (409 with the current record) into a conflict with the route's sentence", async () => {
    const current = { id: 3, version: 5 };
    answerWith(errorResponse(new ApiError(409, "Someone else changed this rotation since you loaded it. Reload to see their changes.", { current })));
    const err = await failureOf(apiFetch("/api/rotations/3", { method: "PATCH", body: {} }));
    expect(err.status).toBe(409);
    expect(err.conflict).toBe(true);
    expect(err.message).toMatch(/^Someone else changed this rotation/);
    expect(err.body.current).toEqual(current);
    expect(err.issues).toEqual([]);
  });

  it("says the server could not be reached when fetch itself fails (status 0)", async () => {
    vi.stubGlobal("fetch", vi.fn(async () => Promise.reject(new TypeError("Failed to fetch"))));
    const err = await failureOf(apiFetch("/api/x", { method: "POST", body: {} }));
    expect(err.status).toBe(0);
    expect(err.unreachable).toBe(true);
    expect(err.message).toBe(UNREACHABLE);
  });

  it("keeps a non-JSON error page's first words as the message (a proxy's 502)", async () => {
    answerWith(new Response("Bad gateway: upstream closed", { status: 502 }));
    const err = await failureOf(apiFetch("/api/x"));
    expect(err.status).toBe(502);
    expect(err.message).toBe("Bad gateway: upstream closed");
  });

  it("lets an abort through as an abort, not as a failure to reach the server", async () => {
    vi.stubGlobal("fetch", vi.fn(async () => Promise.reject(new DOMException("aborted", "AbortError"))));
    const err = await failureOf(apiFetch("/api/x"));
    expect(err).not.toBeInstanceOf(ApiFailure);
    expect(err.name).toBe("AbortError");
  });
});

describe("placeFailure (409/422 onto react-hook-form fields)", () => {
  it("puts every 422 issue on its field by its dotted path, type server, and returns the route's sentence for the alert", async () => {
    answerWith(await routeAnswerFor({ title: "", shifts: [{ start: "", end: "" }] }));
    const failure = await failureOf(apiFetch("/api/orders", { method: "POST", body: {} }));
    const form = recorder();
    const placed = placeFailure(form as never, failure);
    expect(form.calls).toEqual([
      { name: "title", type: "server", message: "At least 3 characters" },
      { name: "shifts.0.start", type: "server", message: "Pick a start" },
    ]);
    // the alert says the first field's problem in its own words (the route's sentence names "title" by its code)
    expect(placed).toEqual({ message: "At least 3 characters", fields: ["title", "shifts.0.start"], conflict: false });
  });

  it("puts a 409 that names its field (a taken employee number) on that field and flags the conflict", async () => {
    const message = "Employee no. 1042 is already on the roster.";
    answerWith(errorResponse(new ApiError(409, message, { issues: [{ field: "employeeNo", message }] })));
    const failure = await failureOf(apiFetch("/api/workers", { method: "POST", body: {} }));
    const form = recorder();
    const placed = placeFailure(form as never, failure);
    expect(form.calls).toEqual([{ name: "employeeNo", type: "server", message }]);
    expect(placed.conflict).toBe(true);
    expect(placed.message).toBe(message);
  });

  it("puts nothing on fields for a 409 without issues, or for other statuses that carry issues", () => {
    const form = recorder();
    expect(placeFailure(form as never, new ApiFailure(409, { error: "Reload.", current: {} })).fields).toEqual([]);
    expect(placeFailure(form as never, new ApiFailure(403, { error: "Not your yard.", issues: [{ field: "yardId", message: "x" }] })).fields).toEqual([]);
    expect(form.calls).toEqual([]);
  });

  it("skips fields the form does not have (setError throws) and the whole-body '(body)' issue, keeping the rest", () => {
    const form = recorder(["note"]);
    const failure = new ApiFailure(422, {
      error: "Invalid workerId: No such worker",
      issues: [
        { field: "workerId", message: "No such worker" },
        { field: "(body)", message: "Expected object" },
        { field: "note", message: "Too long" },
      ],
    });
    const placed = placeFailure(form as never, failure);
    expect(placed.fields).toEqual(["note"]);
    expect(form.calls).toEqual([{ name: "note", type: "server", message: "Too long" }]);
    expect(placed.message).toBe("Too long");
    // nothing placed: the route's own sentence
    expect(placeFailure(recorder([]) as never, failure).message).toBe("Invalid workerId: No such worker");
  });

  it("limits placement to the fields named in `only` (children by dotted prefix)", () => {
    const form = recorder();
    const failure = new ApiFailure(422, {
      error: "x",
      issues: [
        { field: "shifts.1.end", message: "After the start" },
        { field: "positions", message: "Add a position" },
      ],
    });
    expect(placeFailure(form as never, failure, ["shifts"]).fields).toEqual(["shifts.1.end"]);
  });

  it("works without a form (the alert still gets the sentence)", () => {
    expect(placeFailure(null, new ApiFailure(422, { error: "Invalid end: before start", issues: [{ field: "end", message: "before start" }] }))).toEqual({
      message: "Invalid end: before start",
      fields: [],
      conflict: false,
    });
  });
});

describe("sendJson (the older never-throwing shape)", () => {
  it("keeps the real status on success and on failure, and the route's error in body.error", async () => {
    answerWith(Response.json({ id: 1 }, { status: 201 }));
    expect(await sendJson("/api/x", "POST", {})).toEqual({ ok: true, status: 201, body: { id: 1 } });
    answerWith(errorResponse(new ApiError(409, "Stale.", { current: { v: 2 } })));
    expect(await sendJson("/api/x", "PATCH", {})).toEqual({ ok: false, status: 409, body: { error: "Stale.", current: { v: 2 } } });
  });
});
