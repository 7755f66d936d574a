// The phone's offline queue (issue 20, lib/offline/queue.ts) against a fake server that behaves
// as the routes do with lib/offline/data.ts: it records an action once per Idempotency-Key and
// answers a repeat with the first answer. Outside sources for the behaviour checked:
// - the Idempotency-Key header: IETF httpapi draft "The Idempotency-Key HTTP Header Field"
//   (a retry carries the same key; the server must not apply it twice) — recalled from memory;
// - status classes: RFC 9110 §15.6 (5xx: the server failed; the request may be tried again),
//   §15.5.2 (401: credentials needed), §15.5.10 (409 conflict with the target's state).
import { describe, expect, it } from "vitest";
import { flush, memoryStore, newAction, photoRefs, resolvePhotos, retryable, type QueuedAction, type SendResult } from "@/lib/offline/queue";
import { describeChanges, type ViewFacts } from "@/lib/offline/changes";
import { IDEMPOTENCY_KEY_RE } from "@/lib/offline/model";

type Input = Parameters<typeof newAction>[0];
const act = (over: Partial<Input> = {}): Input => ({
  userId: 7,
  kind: "briefing.ack",
  orderId: 1,
  label: "Gear check and acknowledgement, WO-1",
  url: "/api/briefings/1/ack",
  method: "POST",
  body: { round: 1 },
  ...over,
});

/** A server that stores each key's first answer (as lib/offline/data.ts does). */
function fakeServer() {
  const records: { key: string; url: string; body: unknown }[] = [];
  const answers = new Map<string, SendResult>();
  const seen: string[] = [];
  let nextFile = 500;
  const handle = (a: QueuedAction): SendResult => {
    seen.push(a.key);
    const prior = answers.get(a.key);
    if (prior) return prior;
    records.push({ key: a.key, url: a.url, body: a.body });
    const body = a.kind === "briefing.photo" ? { file: { id: nextFile++ } } : a.kind === "briefing.save" ? { briefing: { version: Number((a.body as { version: number }).version) + 1 } } : { ok: true };
    const res = { status: 201, body };
    answers.set(a.key, res);
    return res;
  };
  return { records, seen, handle };
}

describe("offline queue: order of entry", () => {
  it("sends a user's actions in the order they were entered, and only that user's", async () => {
    const store = memoryStore();
    const server = fakeServer();
    await store.add(newAction(act({ label: "first" })));
    await store.add(newAction(act({ label: "someone else", userId: 8 })));
    await store.add(newAction(act({ label: "second", kind: "briefing.save", body: { version: 3 } })));
    await store.add(newAction(act({ label: "third", kind: "assignment.respond", orderId: null, url: "/api/assignments/4/respond" })));
    const order: string[] = [];
    const report = await flush(store, async (a) => (order.push(a.label), server.handle(a)), 7);
    expect(order).toEqual(["first", "second", "third"]);
    expect(report.sent.map((s) => s.action.label)).toEqual(["first", "second", "third"]);
    expect(report.left).toBe(0);
    // The other user's action is neither sent nor removed.
    expect((await store.all()).map((a) => a.label)).toEqual(["someone else"]);
  });

  it("stops at the first action that cannot go: nothing behind it overtakes it", async () => {
    const store = memoryStore();
    await store.add(newAction(act({ label: "a" })));
    await store.add(newAction(act({ label: "b" })));
    const tried: string[] = [];
    const report = await flush(
      store,
      async (a) => {
        tried.push(a.label);
        throw new TypeError("Failed to fetch");
      },
      7,
    );
    expect(tried).toEqual(["a"]);
    expect(report.stopped).toBe("offline");
    expect(report.left).toBe(2);
    const [a, b] = await store.all();
    expect(a.attempts).toBe(1);
    expect(b.attempts).toBe(0);
  });
});

describe("offline queue: idempotency keys", () => {
  it("gives every action its own key, in the format the server accepts", () => {
    const keys = new Set(Array.from({ length: 50 }, () => newAction(act()).key));
    expect(keys.size).toBe(50);
    for (const k of keys) expect(k).toMatch(IDEMPOTENCY_KEY_RE);
  });

  it("resends with the same key after an answer was lost, and the server records it once", async () => {
    const store = memoryStore();
    const server = fakeServer();
    await store.add(newAction(act({ label: "ack" })));
    // The server handles it, but the signal drops before the answer reaches the phone.
    const lost = await flush(
      store,
      async (a) => {
        server.handle(a);
        throw new TypeError("network connection was lost");
      },
      7,
    );
    expect(lost.stopped).toBe("offline");
    expect(server.records).toHaveLength(1);
    const again = await flush(store, async (a) => server.handle(a), 7);
    expect(again.sent).toHaveLength(1);
    expect(server.seen).toHaveLength(2);
    expect(server.seen[0]).toBe(server.seen[1]); // the same key both times
    expect(server.records).toHaveLength(1); // recorded exactly once
    expect(await store.all()).toHaveLength(0);
  });
});

describe("offline queue: retry after a server error", () => {
  it("keeps the action after a 503 and sends it, then the rest, on the next run", async () => {
    const store = memoryStore();
    const server = fakeServer();
    await store.add(newAction(act({ label: "hold", kind: "briefing.hold", url: "/api/briefings/1/hold", body: { version: 1 } })));
    await store.add(newAction(act({ label: "ack" })));
    let down = true;
    const send = async (a: QueuedAction) => (down ? { status: 503, body: { error: "The database is not reachable right now; try again shortly." } } : server.handle(a));
    const first = await flush(store, send, 7);
    expect(first.stopped).toBe("server");
    expect(first.sent).toHaveLength(0);
    const [held] = await store.all();
    expect(held.attempts).toBe(1);
    expect(held.lastError).toContain("database");
    expect(held.state).toBe("queued");
    down = false;
    const second = await flush(store, send, 7);
    expect(second.sent.map((s) => s.action.label)).toEqual(["hold", "ack"]);
    expect(server.records.map((r) => r.url)).toEqual(["/api/briefings/1/hold", "/api/briefings/1/ack"]);
  });

  it("treats 5xx, 429 and a 409 'in progress' as worth another try, and a plain 409 or 422 as final", () => {
    expect(retryable({ status: 500, body: null })).toBe(true);
    expect(retryable({ status: 503, body: null })).toBe(true);
    expect(retryable({ status: 429, body: null })).toBe(true);
    expect(retryable({ status: 409, body: { reason: "in_progress" } })).toBe(true);
    expect(retryable({ status: 409, body: { reason: "on_hold" } })).toBe(false);
    expect(retryable({ status: 422, body: null })).toBe(false);
    expect(retryable({ status: 201, body: null })).toBe(false);
  });
});

describe("offline queue: the server's answer wins", () => {
  it("marks a refused action with the server's words and goes on with the next", async () => {
    const store = memoryStore();
    await store.add(newAction(act({ label: "draft", kind: "briefing.save", body: { version: 1 } })));
    await store.add(newAction(act({ label: "confirm", kind: "assignment.respond" })));
    const report = await flush(
      store,
      async (a) => (a.label === "draft" ? { status: 409, body: { error: "WO-1 is on hold; dispatch lifts the hold before a new briefing.", reason: "on_hold" } } : { status: 200, body: {} }),
      7,
    );
    expect(report.refused.map((r) => r.action.label)).toEqual(["draft"]);
    expect(report.sent.map((r) => r.action.label)).toEqual(["confirm"]);
    const [left] = await store.all();
    expect(left.state).toBe("refused");
    expect(left.refusal).toEqual({ status: 409, message: "WO-1 is on hold; dispatch lifts the hold before a new briefing." });
    // A refused action is not sent again.
    const again = await flush(store, async () => ({ status: 200, body: {} }), 7);
    expect(again.sent).toHaveLength(0);
  });

  it("stops on 401 and keeps the whole queue until the user signs in again", async () => {
    const store = memoryStore();
    await store.add(newAction(act({ label: "a" })));
    await store.add(newAction(act({ label: "b" })));
    const report = await flush(store, async () => ({ status: 401, body: { error: "Sign in first." } }), 7);
    expect(report.stopped).toBe("signin");
    expect(report.left).toBe(2);
    expect((await store.all()).every((a) => a.state === "queued")).toBe(true);
  });
});

describe("offline queue: actions that build on earlier ones", () => {
  it("puts the id of a photo sent first into the save that refers to it", async () => {
    const store = memoryStore();
    const server = fakeServer();
    const photo = newAction(act({ kind: "briefing.photo", label: "photo", url: "/api/briefings/1/photo", body: undefined, file: { blob: new Blob(["x"]), name: "ground-line.png" } }));
    await store.add(photo);
    const save = { version: 2, data: { poleCheck: { items: { groundLine: { result: "fail", photoFileId: { $photo: photo.key } }, rocking: { photoFileId: null } } } } };
    expect([...photoRefs(save)]).toEqual([photo.key]);
    await store.add(newAction(act({ kind: "briefing.hold", label: "hold", url: "/api/briefings/1/hold", body: save })));
    await flush(store, async (a) => server.handle(a), 7);
    expect(server.records.map((r) => r.url)).toEqual(["/api/briefings/1/photo", "/api/briefings/1/hold"]);
    const held = server.records[1];
    expect((held.body as typeof save).data.poleCheck.items.groundLine.photoFileId).toBe(500);
    expect(photoRefs(held.body).size).toBe(0);
  });

  it("gives a later save of the same order the version the earlier one produced", async () => {
    const store = memoryStore();
    const server = fakeServer();
    await store.add(newAction(act({ kind: "briefing.save", label: "draft 1", body: { version: 4, action: "save" } })));
    await store.add(newAction(act({ kind: "briefing.save", label: "draft 2", body: { version: 4, action: "save" } })));
    await store.add(newAction(act({ kind: "briefing.save", label: "other order", orderId: 2, body: { version: 4, action: "save" } })));
    await flush(store, async (a) => server.handle(a), 7);
    expect(server.records.map((r) => (r.body as { version: number }).version)).toEqual([4, 5, 4]);
  });

  it("resolvePhotos leaves unknown placeholders and other values alone", () => {
    const body = { a: { $photo: "k1" }, b: [{ $photo: "k2" }], c: { $photo: "k1", extra: 1 }, d: 3 };
    expect(resolvePhotos(body, (k) => (k === "k1" ? 9 : undefined))).toEqual({ a: 9, b: [{ $photo: "k2" }], c: { $photo: "k1", extra: 1 }, d: 3 });
  });
});

describe("what changed on the server (describeChanges)", () => {
  const base: ViewFacts = {
    order: { number: "WO-26-0101", status: "planned", holdReason: null },
    crew: [
      { workerId: 1, name: "Marcus Whitfield", positionLabel: "Crew lead" },
      { workerId: 2, name: "Priya Raman", positionLabel: "Climber" },
    ],
    leadWorkerId: 1,
    briefing: { round: 1, state: "draft" },
  };
  it("names a hold put on meanwhile, a crew change and a new round", () => {
    const after: ViewFacts = {
      order: { number: "WO-26-0101", status: "on_hold", holdReason: "Pole 1187 failed its pole check: ground line." },
      crew: [
        { workerId: 1, name: "Marcus Whitfield", positionLabel: "Crew lead" },
        { workerId: 3, name: "Luis Carrasco", positionLabel: "Climber" },
      ],
      leadWorkerId: 1,
      briefing: { round: 2, state: "on_hold" },
    };
    expect(describeChanges(base, after)).toEqual([
      "WO-26-0101 is now on hold (it was planned): Pole 1187 failed its pole check: ground line.",
      "Crew: Luis Carrasco joined as Climber.",
      "Crew: Priya Raman is no longer on WO-26-0101.",
      "Briefing: round 2 is on hold (you had round 1).",
    ]);
  });
  it("says nothing when nothing differs", () => {
    expect(describeChanges(base, structuredClone(base))).toEqual([]);
  });
});
