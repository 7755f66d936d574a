// Issue 19: pushed board changes and slim board answers, against the running app.
// Sources: Server-Sent Events as the HTML Living Standard defines them (§9.2: text/event-stream,
// the id field and Last-Event-ID on reconnection); RFC 9110 §8.4 / §12.5.3 (Content-Encoding
// and Accept-Encoding: gzip only when the client accepts it); fast-check for the property runs.
import fc from "fast-check";
import knex from "knex";
import { afterAll, describe, expect, it } from "vitest";
import { dbConfig } from "@/knexfile";
import { applyBoardPatch, type BoardPatch } from "@/lib/board/patch";
import { account, as, Client } from "../support/client";
import { makeOrder, removeMadeOrders, yard } from "../support/fixtures";
import { openStream } from "../support/sse";

const db = knex(dbConfig());
const OFFSET = 251; // days out: this file's own day
const fakeEvents: number[] = [];

afterAll(async () => {
  if (fakeEvents.length) await db("board_events").whereIn("id", fakeEvents).delete();
  await removeMadeOrders(db);
  await db.destroy();
});

const latestId = async () => Number((await db("board_events").max({ id: "id" }).first())?.id ?? 0);

/** The board events a North board of `day` must receive after `after`: its yard or none, its day or none. */
async function expectedIds(orgId: number, yardId: number, day: string, after: number) {
  return (
    await db("board_events")
      .where("organisation_id", orgId)
      .where("id", ">", after)
      .andWhere((w) => w.whereNull("yard_id").orWhere("yard_id", yardId))
      .andWhere((w) => w.whereNull("day").orWhere("day", day))
      .orderBy("id")
      .pluck("id")
  ).map(Number);
}

/** Orders made straight in the database (fixtures) write no board event: one here, as the app's own order writes do. */
async function touch(day: string) {
  const y = await yard(db, "NOR");
  await db("board_events").insert({ organisation_id: y.organisation_id, yard_id: y.id, day, kind: "order", payload: JSON.stringify({ test: "fixture order" }) });
}

async function freeWorkers(n: number) {
  return (await db("workers").where({ active: true }).orderBy("id", "desc").limit(n).pluck("id")).map(Number);
}

describe("board event stream (Server-Sent Events)", () => {
  it("delivers every event once, in order, within moments of the write, and resumes from Last-Event-ID without losing or repeating one", async () => {
    const c = await as("dispatcher");
    const o = await makeOrder(db, { offsetDays: OFFSET, positions: ["lead", "ground", "ground"], workType: "patrol", energized: false });
    const y = await yard(db, "NOR");
    const seats = (await db("positions").where({ work_order_id: o.id }).orderBy("id").pluck("id")).map(Number);
    const workers = await freeWorkers(6);
    const start = await latestId();
    const path = `/api/board/stream?yard=NOR&date=${o.day}&after=${start}`;

    const s1 = await openStream(c, path);
    expect(s1.status).toBe(200);
    expect(s1.contentType).toMatch(/^text\/event-stream/);
    const lag: number[] = [];
    const placed: number[] = [];
    for (let i = 0; i < 3; i++) {
      const r = await c.json("/api/assignments", "POST", { positionId: seats[i], workerId: workers[i] });
      expect(r.status).toBe(201);
      // The event is committed before the answer: from the answer on, any wait is the push's own
      // (an event that came first counts 0).
      const wrote = Date.now();
      placed.push(r.body.assignmentId);
      const want = (await expectedIds(y.organisation_id, y.id, o.day, start)).length;
      const got = await s1.waitFor(want, 5_000);
      lag.push(Math.max(0, got[got.length - 1].at - wrote));
    }
    const firstPart = s1.events.filter((e) => e.event === "board").map((e) => Number(e.id));
    const resumeFrom = s1.lastId();
    s1.close();
    await s1.ended;

    // While disconnected: two seats emptied.
    for (const id of placed.slice(0, 2)) expect((await c.json(`/api/assignments/${id}?version=1`, "DELETE")).status).toBe(200);
    const s2 = await openStream(c, path, resumeFrom);
    expect(s2.status).toBe(200);
    expect((await c.json("/api/assignments", "POST", { positionId: seats[0], workerId: workers[4] })).status).toBe(201);
    const all = await expectedIds(y.organisation_id, y.id, o.day, start);
    await s2.waitFor(all.length - firstPart.length, 5_000);
    await new Promise((r) => setTimeout(r, 400)); // nothing more, no repeat, comes after
    s2.close();
    const secondPart = s2.events.filter((e) => e.event === "board").map((e) => Number(e.id));
    const delivered = [...firstPart, ...secondPart];
    expect(delivered).toEqual(await expectedIds(y.organisation_id, y.id, o.day, start));
    expect(new Set(delivered).size).toBe(delivered.length);
    expect(Math.min(...secondPart)).toBeGreaterThan(Number(resumeFrom));
    // The aim is 500 ms (issue 19, measured by npm run bench:browser); this check only catches a
    // stream that does not push at all, with room for a machine shared by a whole test suite.
    console.log(`[board-stream] write answered → event on the stream: ${lag.join(", ")} ms`);
    expect(Math.max(...lag)).toBeLessThan(5_000);
  });

  it("another yard's dispatcher: nothing of North on the Mesa stream; North's own stream only as bare events (no worker or order ids)", async () => {
    const north = await as("dispatcher");
    const mesa = await as("dispatcher", "dispatch.mesa@cedarprairie.example");
    const o = await makeOrder(db, { offsetDays: OFFSET, positions: ["lead"], workType: "patrol", energized: false });
    const start = await latestId();
    const onMesa = await openStream(mesa, `/api/board/stream?yard=MES&date=${o.day}&after=${start}`);
    const mesaOnNorth = await openStream(mesa, `/api/board/stream?yard=NOR&date=${o.day}&after=${start}`);
    const northOwn = await openStream(north, `/api/board/stream?yard=NOR&date=${o.day}&after=${start}`);
    const [w] = await freeWorkers(1);
    expect((await north.json("/api/assignments", "POST", { positionId: o.positionIds.lead, workerId: w })).status).toBe(201);
    const own = await northOwn.waitFor(1);
    const bare = await mesaOnNorth.waitFor(1);
    expect(JSON.parse(own[0].data).payload).toEqual({ orderId: o.id });
    expect(JSON.parse(bare[0].data)).not.toHaveProperty("payload");
    await new Promise((r) => setTimeout(r, 600));
    const northIds = new Set(own.map((e) => e.id));
    expect(onMesa.events.filter((e) => e.event === "board" && northIds.has(e.id))).toEqual([]);
    for (const s of [onMesa, mesaOnNorth, northOwn]) s.close();
  });

  it("refuses the signed out (401), the roles without the board (403), a bad query (422 naming the field), an unknown yard (404)", async () => {
    expect((await new Client().json("/api/board/stream?yard=NOR&date=2030-01-01")).status).toBe(401);
    expect((await (await as("lineworker")).json("/api/board/stream?yard=NOR&date=2030-01-01")).status).toBe(403);
    const c = await as("dispatcher");
    const bad = await c.json("/api/board/stream?yard=NOR&date=tomorrow");
    expect(bad.status).toBe(422);
    expect(bad.body.issues[0].field).toBe("date");
    expect((await c.json("/api/board/stream?yard=NOR&date=2030-01-01&after=-3")).body.issues[0].field).toBe("after");
    expect((await c.json("/api/board/stream?yard=ZZZ&date=2030-01-01")).status).toBe(404);
  });

  it("a signed-out user's open stream ends (the session is checked again while it runs)", async () => {
    const a = account("dispatcher");
    const c = new Client();
    expect((await c.signIn(a.email, a.password)).signedIn).toBe(true);
    const s = await openStream(c, `/api/board/stream?yard=NOR&date=2030-01-01`);
    expect(s.status).toBe(200);
    const csrf = await c.json<{ csrfToken: string }>("/api/auth/csrf");
    await c.fetch("/api/auth/signout", { method: "POST", headers: { "content-type": "application/x-www-form-urlencoded" }, body: new URLSearchParams({ csrfToken: csrf.body.csrfToken, json: "true" }) });
    const t0 = Date.now();
    await Promise.race([s.ended, new Promise((_, reject) => setTimeout(() => reject(new Error("stream still open 12 s after sign-out")), 12_000))]);
    expect(s.events.find((e) => e.event === "end")?.data).toMatch(/signed out/);
    expect(Date.now() - t0).toBeLessThan(12_000);
  }, 20_000);
});

/** GET the board: `since` = the held version → a patch or a full answer (headers say which). */
async function getBoard(c: Client, day: string, since?: { version: string; cursor: number }) {
  const qs = new URLSearchParams({ yard: "NOR", date: day });
  if (since) {
    qs.set("since", since.version);
    qs.set("cursor", String(since.cursor));
  }
  const res = await c.fetch(`/api/board?${qs}`, { headers: { "x-board-gzip": "1", "accept-encoding": "gzip" } });
  expect(res.status).toBe(200);
  return { answer: res.headers.get("x-board-answer"), version: res.headers.get("x-board-version")!, encoding: res.headers.get("content-encoding"), body: await res.json() };
}

describe("slim board answers", () => {
  it("a browser that holds the current version gets an empty patch; one whose cursor is too old, or whose version this instance never served, gets the full board", async () => {
    const c = await as("dispatcher");
    const o = await makeOrder(db, { offsetDays: OFFSET, positions: ["lead"], workType: "patrol", energized: false });
    const full = await getBoard(c, o.day);
    expect(full.answer).toBe("full; cold");
    expect(full.encoding).toBe("gzip"); // pre-compressed, and fetch undid it: the JSON parsed
    const held = { version: full.version, cursor: full.body.cursor };
    const same = await getBoard(c, o.day, held);
    if (same.version === held.version) {
      expect(same.answer).toBe("patch");
      expect(same.body.collections).toEqual({});
    }
    expect((await getBoard(c, o.day, { version: "never-served", cursor: held.cursor })).answer).toBe("full; gap");
    // 501 events of the organisation on a day no board shows: the held cursor is now too old.
    const org = (await yard(db, "NOR")).organisation_id;
    const rows = Array.from({ length: 501 }, () => ({ organisation_id: org, yard_id: null, day: "2001-01-01", kind: "order", payload: null }));
    const before = await latestId();
    await db("board_events").insert(rows);
    fakeEvents.push(...(await db("board_events").where("id", ">", before).where({ day: "2001-01-01" }).pluck("id")).map(Number));
    const old = await getBoard(c, o.day, held);
    expect(old.answer).toBe("full; gap");
    expect(old.body.cursor).toBeGreaterThan(held.cursor + 500);
    expect(old.body.pool.length).toBe(full.body.pool.length);
  });

  it("property: the held board plus the patch equals the full answer after any random sequence of drops (fast-check)", async () => {
    const c = await as("dispatcher");
    const o = await makeOrder(db, { offsetDays: OFFSET, positions: ["lead", "ground", "ground", "ground"], workType: "patrol", energized: false });
    await touch(o.day);
    const seats = (await db("positions").where({ work_order_id: o.id }).orderBy("id").pluck("id")).map(Number);
    const workers = await freeWorkers(12);
    const op = fc.record({ seat: fc.nat({ max: seats.length - 1 }), worker: fc.nat({ max: workers.length - 1 }), remove: fc.boolean() });
    await fc.assert(
      fc.asyncProperty(fc.array(op, { minLength: 1, maxLength: 5 }), async (ops) => {
        const start = await getBoard(c, o.day);
        let held = { version: start.version, board: start.body };
        for (const x of ops) {
          const seat = held.board.orders.find((card: { id: number }) => card.id === o.id).seats.find((s: { id: number }) => s.id === seats[x.seat]);
          if (x.remove && seat.assignment) await c.json(`/api/assignments/${seat.assignment.id}?version=${seat.assignment.version}`, "DELETE");
          else if (!seat.assignment) await c.json("/api/assignments", "POST", { positionId: seats[x.seat], workerId: workers[x.worker] });
          // The browser's refresh after the event: a patch against what it holds.
          for (let attempt = 0; ; attempt++) {
            const slim = await getBoard(c, o.day, { version: held.version, cursor: held.board.cursor });
            const next = slim.answer === "patch" ? applyBoardPatch(held.board, slim.body as BoardPatch) : slim.body;
            const full = await getBoard(c, o.day);
            if (full.version !== slim.version && attempt < 3) continue; // the board moved on between the two reads
            expect(slim.answer).toBe("patch");
            expect(next).toEqual(full.body);
            held = { version: slim.version, board: next };
            break;
          }
        }
        // Clean up this run's placements straight in the database for the next run.
        await db("assignments").whereIn("position_id", seats).delete();
        await db("board_events").insert({ organisation_id: (await yard(db, "NOR")).organisation_id, yard_id: null, day: null, kind: "order", payload: JSON.stringify({ test: "reset" }) });
      }),
      { numRuns: 5 },
    );
  }, 300_000);
});
