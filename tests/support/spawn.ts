// Extra app instances and MariaDB servers of a test's own, for the reliability tests: `next start`
// on a free port from the build the suite already made (scripts/test builds .next before vitest;
// NEXT_DIST_DIR names another build directory), and a throwaway mariadbd on its own data
// directory and port, so stopping it never touches anyone else's database.
import { spawn, execFile, type ChildProcess } from "node:child_process";
import { mkdtemp, rm } from "node:fs/promises";
import { createServer } from "node:net";
import { tmpdir } from "node:os";
import path from "node:path";
import { promisify } from "node:util";

const run = promisify(execFile);
export const ROOT = process.cwd();

export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer();
    s.once("error", reject);
    s.listen(0, "127.0.0.1", () => {
      const port = (s.address() as { port: number }).port;
      s.close(() => resolve(port));
    });
  });
}

export const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

async function stopChild(child: ChildProcess, signal: NodeJS.Signals = "SIGTERM") {
  if (child.exitCode !== null || child.signalCode !== null) return;
  const exited = new Promise<void>((r) => child.once("exit", () => r()));
  child.kill(signal);
  const t = setTimeout(() => child.kill("SIGKILL"), 8_000);
  await exited;
  clearTimeout(t);
}

export interface AppInstance {
  url: string;
  port: number;
  child: ChildProcess;
  log: () => string;
  stop: () => Promise<void>;
}

/**
 * `next start` on a free port with the current environment plus `env`. Waits until /api/health
 * answers (any status when `anyHealth`, else 200).
 */
export async function startApp(opts: { env?: Record<string, string>; port?: number; anyHealth?: boolean; timeoutMs?: number } = {}): Promise<AppInstance> {
  const port = opts.port ?? (await freePort());
  const url = `http://127.0.0.1:${port}`;
  const env: Record<string, string> = {
    ...(process.env as Record<string, string>),
    NEXTAUTH_URL: url,
    APP_PUBLIC_URL: process.env.APP_PUBLIC_URL ?? url,
    NEXT_DIST_DIR: process.env.NEXT_DIST_DIR ?? ".next",
    ...opts.env,
  };
  delete env.NODE_OPTIONS; // vitest's loader flags are not for the server
  let out = "";
  // The next binary itself (not npx), so the pid is the server and stopping it stops it.
  const child = spawn(process.execPath, [path.join(ROOT, "node_modules/next/dist/bin/next"), "start", "-H", "127.0.0.1", "-p", String(port)], {
    cwd: ROOT,
    env: env as NodeJS.ProcessEnv,
    stdio: ["ignore", "pipe", "pipe"],
  });
  child.stdout!.on("data", (d) => (out += d));
  child.stderr!.on("data", (d) => (out += d));
  const stop = () => stopChild(child);
  const until = Date.now() + (opts.timeoutMs ?? 60_000);
  for (;;) {
    if (child.exitCode !== null) throw new Error(`next start on :${port} exited (${child.exitCode}):\n${out.slice(-3000)}`);
    try {
      const r = await fetch(`${url}/api/health`, { signal: AbortSignal.timeout(5_000) });
      if (opts.anyHealth || r.status === 200) break;
    } catch {
      /* not up yet */
    }
    if (Date.now() > until) {
      await stop();
      throw new Error(`next start on :${port} did not answer within ${opts.timeoutMs ?? 60_000} ms:\n${out.slice(-3000)}`);
    }
    await sleep(250);
  }
  return { url, port, child, log: () => out, stop };
}

export interface OwnMariaDb {
  port: number;
  dataDir: string;
  socket: string;
  /** mariadb as root over the socket. */
  sql: (statement: string) => Promise<string>;
  start: () => Promise<void>;
  /** mariadb-admin shutdown: a clean stop, as an operator would do it. */
  shutdown: () => Promise<void>;
  /** SIGKILL the server: a crash. */
  kill: () => Promise<void>;
  destroy: () => Promise<void>;
}

/** A MariaDB server of the test's own: fresh data directory, free port, loopback only. */
export async function ownMariaDb(): Promise<OwnMariaDb> {
  const dataDir = await mkdtemp(path.join(tmpdir(), "gaffline-mariadb-"));
  const socket = path.join(dataDir, "mysqld.sock");
  const port = await freePort();
  await run("mariadb-install-db", ["--no-defaults", `--datadir=${dataDir}`, "--auth-root-authentication-method=normal", "--skip-test-db"], { timeout: 120_000 });
  let child: ChildProcess | null = null;
  let log = "";
  const rootUser = process.getuid?.() === 0 ? ["--user=root"] : [];
  const sql = async (statement: string) =>
    (await run("mariadb", ["--no-defaults", `--socket=${socket}`, "-uroot", "-N", "-e", statement], { timeout: 20_000 })).stdout;
  const up = async () => {
    try {
      await sql("select 1");
      return true;
    } catch {
      return false;
    }
  };
  const start = async () => {
    child = spawn(
      "mariadbd",
      [
        "--no-defaults",
        `--datadir=${dataDir}`,
        `--port=${port}`,
        "--bind-address=127.0.0.1",
        `--socket=${socket}`,
        `--pid-file=${path.join(dataDir, "mysqld.pid")}`,
        ...rootUser,
        "--character-set-server=utf8mb4",
        "--collation-server=utf8mb4_unicode_ci",
        "--innodb-buffer-pool-size=64M",
        "--skip-name-resolve",
        "--skip-log-bin",
      ],
      { stdio: ["ignore", "pipe", "pipe"] },
    );
    child.stdout!.on("data", (d) => (log += d));
    child.stderr!.on("data", (d) => (log += d));
    for (let i = 0; i < 120; i++) {
      if (await up()) return;
      if (child.exitCode !== null) break;
      await sleep(250);
    }
    throw new Error(`mariadbd on :${port} did not start:\n${log.slice(-3000)}`);
  };
  const waitExit = async () => {
    const c = child;
    if (!c || c.exitCode !== null || c.signalCode !== null) return;
    await new Promise<void>((r) => c.once("exit", () => r()));
  };
  const shutdown = async () => {
    await run("mariadb-admin", ["--no-defaults", `--socket=${socket}`, "-uroot", "shutdown"], { timeout: 60_000 }).catch(() => undefined);
    await waitExit();
  };
  const kill = async () => {
    if (child) await stopChild(child, "SIGKILL");
  };
  const destroy = async () => {
    if (child && child.exitCode === null) await shutdown();
    await rm(dataDir, { recursive: true, force: true });
  };
  await start();
  return { port, dataDir, socket, sql, start, shutdown, kill, destroy };
}
