// The database stopped and started again under load (issue 10). Everything here is the test's
// own: a MariaDB on a fresh data directory and a free port (never the shared .data/mariadb on
// :3307), migrated and seeded with the demo, and a `next start` of the suite's build pointed at
// it. Four fetchers with 3 s client timeouts hit /api/health, /api/board and POST /api/send
// while the server is shut down (mariadb-admin shutdown) or killed (SIGKILL), kept down, and
// started again (InnoDB recovers the killed one on start).
// Expected (README "an unreachable database answers 503 with JSON"): during the outage every
// answer is a fast 503 with a JSON error — never a hang, never a crash — and the app, not
// restarted, answers /api/board 200 within 10 s of the database coming back.
import { execFile } from "node:child_process";
import { promisify } from "node:util";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { account, Client } from "../support/client";
import { dbPassword } from "@/knexfile";
import { ownMariaDb, sleep, startApp, type AppInstance, type OwnMariaDb } from "../support/spawn";

const run = promisify(execFile);
const FULL = process.env.GAFFLINE_FULL === "1";
const DOWN_MS = FULL ? 20_000 : 5_000;
const CLIENT_TIMEOUT_MS = 3_000;
const DB_NAME = "gaffline_outage";
const DB_USER = process.env.DB_USER ?? "gaffline";
const DB_PASSWORD = dbPassword() ?? "";

let maria: OwnMariaDb;
let app: AppInstance;

beforeAll(async () => {
  maria = await ownMariaDb();
  await maria.sql(
    `CREATE DATABASE ${DB_NAME} CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci; ` +
      `CREATE USER '${DB_USER}'@'127.0.0.1' IDENTIFIED BY '${DB_PASSWORD}'; ` +
      `GRANT ALL PRIVILEGES ON ${DB_NAME}.* TO '${DB_USER}'@'127.0.0.1'; FLUSH PRIVILEGES;`,
  );
  const env = { ...process.env, DB_PORT: String(maria.port), DB_NAME, NODE_OPTIONS: "" };
  await run(process.execPath, ["--import", "tsx", "scripts/db.ts", "migrate"], { env, timeout: 120_000 });
  await run(process.execPath, ["--import", "tsx", "scripts/db.ts", "seed"], { env, timeout: 120_000 });
  app = await startApp({ env: { DB_PORT: String(maria.port), DB_NAME, DELIVERY_LOOP: "off" } });
}, 240_000);

afterAll(async () => {
  await app?.stop();
  await maria?.destroy();
});

interface Hit {
  at: number; // ms since the test started
  path: string;
  status: number | "timeout" | "network";
  ms: number;
  json: boolean;
  body: string;
}

describe.each([
  ["shut down (mariadb-admin shutdown)", () => maria.shutdown()],
  ["killed (SIGKILL, a crash)", () => maria.kill()],
] as const)("MariaDB %s and started again under load", (_how, stopDb) => {
  it(`answers 503 with JSON while it is down (${DOWN_MS / 1000} s), never hangs, and recovers within 10 s without a restart`, async () => {
    const c = new Client(app.url);
    const a = account("dispatcher", "dispatch@cedarprairie.example");
    expect((await c.signIn(a.email, a.password)).signedIn).toBe(true);
    const day = (await c.json<{ day: string }>("/api/board?yard=NOR")).body.day;
    const pid = app.child.pid;

    const t0 = Date.now();
    const now = () => Date.now() - t0;
    const hits: Hit[] = [];
    let stop = false;
    const targets = [
      { path: "/api/health", method: "GET" },
      { path: `/api/board?yard=NOR&date=${day}`, method: "GET" },
      { path: `/api/board/events?after=0&yard=NOR&date=${day}`, method: "GET" },
      { path: "/api/send", method: "POST", body: JSON.stringify({ date: "2099-01-05", yard: "NOR" }) },
    ];
    const fetcher = async (n: number) => {
      for (let i = n; !stop; i++) {
        const t = targets[i % targets.length];
        const started = Date.now();
        const at = now();
        let hit: Hit;
        try {
          const res = await c.fetch(t.path, {
            method: t.method,
            body: t.body,
            headers: t.body ? { "content-type": "application/json" } : {},
            signal: AbortSignal.timeout(CLIENT_TIMEOUT_MS),
          });
          const body = await res.text();
          let json = false;
          try {
            JSON.parse(body);
            json = /application\/json/.test(res.headers.get("content-type") ?? "");
          } catch {
            /* not JSON */
          }
          hit = { at, path: t.path, status: res.status, ms: Date.now() - started, json, body: body.slice(0, 200) };
        } catch (err) {
          const name = (err as Error).name;
          hit = { at, path: t.path, status: name === "TimeoutError" || name === "AbortError" ? "timeout" : "network", ms: Date.now() - started, json: false, body: String(err) };
        }
        hits.push(hit);
        await sleep(50);
      }
    };
    const load = Promise.all([0, 1, 2, 3].map(fetcher));

    await sleep(2_000);
    const shutdownAt = now();
    await stopDb();
    const downAt = now();
    await sleep(DOWN_MS);
    const restartAt = now();
    await maria.start();
    const upAt = now();
    // Until the board answers 200 again (at most 10 s), then 1.5 s more of normal service.
    let recoveredAt: number | null = null;
    while (now() - upAt < 10_000) {
      const ok = hits.find((h) => h.at >= upAt && h.path.startsWith("/api/board?") && h.status === 200);
      if (ok) {
        recoveredAt = ok.at + ok.ms;
        break;
      }
      await sleep(100);
    }
    await sleep(1_500);
    stop = true;
    await load;

    const before = hits.filter((h) => h.at + h.ms < shutdownAt);
    const outage = hits.filter((h) => h.at >= downAt && h.at + h.ms <= restartAt);
    const after = hits.filter((h) => recoveredAt !== null && h.at >= recoveredAt);
    const summary = (hs: Hit[]) => [...hs.reduce((m, h) => m.set(String(h.status), (m.get(String(h.status)) ?? 0) + 1), new Map<string, number>())].map(([s, n]) => `${s}×${n}`).join(" ");
    console.log(
      `[db-outage] ${hits.length} requests; before ${summary(before)}; down ${(restartAt - downAt) / 1000} s: ${summary(outage)} ` +
        `(slowest ${Math.max(...outage.map((h) => h.ms))} ms); up after ${upAt - restartAt} ms; board 200 again ${recoveredAt === null ? "never" : `${recoveredAt - upAt} ms`} after the database; after ${summary(after)}`,
    );

    // Before: normal service.
    expect(before.length).toBeGreaterThan(10);
    expect(before.every((h) => h.status === 200), summary(before)).toBe(true);
    // Never a hang or a dropped connection, at any point (the app kept serving).
    expect(hits.filter((h) => h.status === "timeout" || h.status === "network"), JSON.stringify(hits.filter((h) => typeof h.status !== "number").slice(0, 5))).toEqual([]);
    expect(hits.filter((h) => typeof h.status === "number" && h.status >= 500 && h.status !== 503), JSON.stringify(hits.filter((h) => h.status === 500).slice(0, 5))).toEqual([]);
    // While down: every answer a fast 503 with a JSON error.
    expect(outage.length).toBeGreaterThan(20);
    for (const h of outage) {
      expect(h.status, `${h.path} at ${h.at} ms: ${h.body}`).toBe(503);
      expect(h.json, `${h.path}: ${h.body}`).toBe(true);
      expect(JSON.parse(h.body).error, h.body).toBeTruthy();
      expect(h.ms).toBeLessThan(CLIENT_TIMEOUT_MS);
    }
    expect(outage.filter((h) => h.path === "/api/health").every((h) => JSON.parse(h.body).db === "down")).toBe(true);
    // Back within 10 s of the database, without restarting the app; then normal service.
    expect(recoveredAt, "the board answered 200 again").not.toBeNull();
    expect(recoveredAt! - upAt).toBeLessThan(10_000);
    expect(after.length).toBeGreaterThan(5);
    expect(after.every((h) => h.status === 200), summary(after)).toBe(true);
    expect(app.child.exitCode).toBeNull();
    expect(app.child.pid).toBe(pid);
  });
});
