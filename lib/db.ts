import "@/lib/server-only";
import knex, { type Knex } from "knex";
import { dbConfig } from "@/knexfile";

// One pool per process, kept across hot reloads in development. Any number of processes may
// share the database: nothing here assumes a single instance.
//
// Scaled out (README "Scaling out"), DB_HOSTS lists the database nodes, this instance's own node
// first: `DB_HOSTS=127.0.0.1:3311,127.0.0.1:3312,127.0.0.1:3313`. Every new pooled connection
// tries the nodes in that order, skipping one that failed in the last few seconds, and takes
// the first that completes a handshake and is ready for work (on Galera: wsrep_ready = ON). A
// connection to another node than the first is replaced after a while, so the instance returns
// to its own node once that node is back. Without DB_HOSTS, DB_HOST and DB_PORT name the one server.
//
// Every statement has a bound: the server's max_statement_time (per session) and, for a node
// that stopped answering altogether, a client-side timeout that also drops the connection.

const globalForDb = globalThis as unknown as { gafflineDb?: Knex; gafflineDbStats?: DbStats };

export interface DbHost {
  host: string;
  port: number;
}

/** Counters for /api/health and the logs. */
export interface DbStats {
  hosts: string[];
  /** New connections opened on a node other than the first listed. */
  failovers: number;
  /** Connection attempts that failed, per node. */
  nodeFailures: Record<string, number>;
  /** Transactions retried after a deadlock, a lock wait time-out or a certification failure. */
  conflictRetries: number;
  /** Transactions that still conflicted after every retry (answered 409/503). */
  conflictsGivenUp: number;
  /** Statements stopped by the time-out (server or client side). */
  statementTimeouts: number;
  lastConnectedHost: string | null;
}

export function dbStats(): DbStats {
  if (!globalForDb.gafflineDbStats) {
    globalForDb.gafflineDbStats = {
      hosts: dbHosts().map((h) => `${h.host}:${h.port}`),
      failovers: 0,
      nodeFailures: {},
      conflictRetries: 0,
      conflictsGivenUp: 0,
      statementTimeouts: 0,
      lastConnectedHost: null,
    };
  }
  return globalForDb.gafflineDbStats;
}

/** The node list: DB_HOSTS ("host:port,host:port"), else DB_HOST/DB_PORT. */
export function dbHosts(env: Record<string, string | undefined> = process.env): DbHost[] {
  const list = (env.DB_HOSTS ?? "").split(",").map((s) => s.trim()).filter(Boolean);
  if (!list.length) return [{ host: env.DB_HOST ?? "127.0.0.1", port: Number(env.DB_PORT ?? 3307) }];
  return list.map((item) => {
    const m = /^\[?([^\]]+?)\]?(?::(\d+))?$/.exec(item);
    if (!m) throw new Error(`DB_HOSTS: cannot read "${item}" (expected host:port)`);
    const port = m[2] ? Number(m[2]) : 3306;
    if (!(port > 0 && port < 65536)) throw new Error(`DB_HOSTS: bad port in "${item}"`);
    return { host: m[1], port };
  });
}

/** The server-side bound on one statement (max_statement_time), in ms. DB_STATEMENT_TIMEOUT_MS, default 8000. */
export function statementTimeoutMs(env: Record<string, string | undefined> = process.env) {
  const v = Number(env.DB_STATEMENT_TIMEOUT_MS ?? 8000);
  return Number.isFinite(v) && v >= 100 ? v : 8000;
}

const HOST_PAUSE_MS = 5_000; // a node that failed is skipped this long
const RETURN_HOME_MS = 15_000; // a connection to a fallback node is replaced after this long
const CONNECT_TIMEOUT_MS = Number(process.env.DB_CONNECT_TIMEOUT_MS ?? 2500); // per node tried

type RawConn = {
  connect: (cb: (err: unknown) => void) => void;
  query: (sql: string, cb: (err: unknown, rows: unknown) => void) => void;
  destroy: () => void;
  removeAllListeners: () => void;
  on: (ev: string, cb: (err: unknown) => void) => void;
  __knex__disposed?: unknown;
  __gafflineHost?: string;
  __gafflineSince?: number;
};

const downUntil = new Map<string, number>();

function sqlOn(conn: RawConn, sql: string): Promise<unknown> {
  return new Promise((resolve, reject) => conn.query(sql, (err, rows) => (err ? reject(err) : resolve(rows))));
}

// knex's own mysql2 client class, extended; taken from a connection-less instance so the app
// needs no private import path.
type ClientCtor = new (config: Knex.Config) => {
  connectionSettings: Record<string, unknown>;
  driver: { createConnection: (settings: Record<string, unknown>) => RawConn };
  validateConnection(c: RawConn): boolean;
  _query(c: RawConn, obj: unknown): Promise<unknown>;
  checkVersion?(c: RawConn): Promise<unknown>;
};
let failoverClient: ClientCtor | null = null;

function failoverClientClass(): ClientCtor {
  if (failoverClient) return failoverClient;
  const probe = knex({ client: "mysql2" });
  const Base = probe.client.constructor as ClientCtor;
  void probe.destroy();
  const hosts = dbHosts();
  const names = hosts.map((h) => `${h.host}:${h.port}`);
  const stmtMs = statementTimeoutMs();
  const clientMs = stmtMs + 2_000;

  failoverClient = class FailoverMySQL2 extends Base {
    async acquireRawConnection(): Promise<RawConn> {
      const stats = dbStats();
      const now = Date.now();
      const live = hosts.filter((_, i) => (downUntil.get(names[i]) ?? 0) <= now);
      const order = live.length ? live : hosts; // every node paused: try them all anyway
      let last: unknown = new Error("No database node answered.");
      for (const h of order) {
        const name = `${h.host}:${h.port}`;
        try {
          const conn = await this.openOn(h);
          downUntil.delete(name);
          if (name !== names[0]) stats.failovers++;
          stats.lastConnectedHost = name;
          return conn;
        } catch (err) {
          last = err;
          stats.nodeFailures[name] = (stats.nodeFailures[name] ?? 0) + 1;
          if (hosts.length > 1) downUntil.set(name, Date.now() + HOST_PAUSE_MS);
        }
      }
      throw last;
    }

    async openOn(h: DbHost): Promise<RawConn> {
      // knex keeps the password as a hidden (non-enumerable) property: copy it by name.
      const settings = { ...this.connectionSettings, password: this.connectionSettings.password, host: h.host, port: h.port, connectTimeout: CONNECT_TIMEOUT_MS };
      const conn = this.driver.createConnection(settings);
      conn.on("error", (err) => {
        conn.__knex__disposed = err;
      });
      try {
        await new Promise<void>((resolve, reject) => conn.connect((err) => (err ? reject(err) : resolve())));
        const guard = setTimeout(() => conn.destroy(), CONNECT_TIMEOUT_MS * 2);
        try {
          // Galera: a node outside the primary component answers but refuses work.
          // A plain MariaDB (wsrep_on = OFF) also reports wsrep_ready = OFF: ask only a Galera node.
          const wsrep = (await sqlOn(conn, "SELECT @@global.wsrep_on AS w")) as { w?: number | string }[];
          const ready = Number(wsrep[0]?.w ?? 0) ? ((await sqlOn(conn, "SHOW STATUS LIKE 'wsrep_ready'")) as { Value?: string }[]) : [];
          if (ready.length && ready[0].Value !== "ON") throw Object.assign(new Error(`Database node ${h.host}:${h.port} is not ready (wsrep_ready=${ready[0].Value}).`), { code: "WSREP_NOT_READY" });
          await this.checkVersion?.(conn).catch(() => undefined);
          await sqlOn(conn, `SET SESSION max_statement_time = ${(stmtMs / 1000).toFixed(3)}, innodb_lock_wait_timeout = ${Math.max(1, Math.ceil(stmtMs / 1000))}`);
        } finally {
          clearTimeout(guard);
        }
      } catch (err) {
        conn.removeAllListeners();
        conn.destroy();
        throw err;
      }
      conn.__gafflineHost = `${h.host}:${h.port}`;
      conn.__gafflineSince = Date.now();
      return conn;
    }

    validateConnection(conn: RawConn): boolean {
      if (!super.validateConnection(conn)) return false;
      const host = conn.__gafflineHost;
      if (!host || hosts.length < 2) return true;
      if ((downUntil.get(host) ?? 0) > Date.now()) return false; // its node failed: drop it
      // On a fallback node: replace it now and then, so the first node is tried again.
      if (host !== names[0] && Date.now() - (conn.__gafflineSince ?? 0) > RETURN_HOME_MS) return false;
      return true;
    }

    async _query(conn: RawConn, obj: unknown): Promise<unknown> {
      const o = (typeof obj === "string" ? { sql: obj } : obj) as { options?: Record<string, unknown> };
      o.options = { timeout: clientMs, ...(o.options ?? {}) };
      try {
        return await super._query(conn, o);
      } catch (err) {
        const { code, errno } = err as { code?: string; errno?: number };
        // 1969: MariaDB's "max_statement_time exceeded" (mysql2 has no name for it).
        if (code === "PROTOCOL_SEQUENCE_TIMEOUT" || code === "ER_STATEMENT_TIMEOUT" || errno === 1969) dbStats().statementTimeouts++;
        if (code === "PROTOCOL_SEQUENCE_TIMEOUT") {
          // The node stopped answering: this connection is useless (its command never ended),
          // and so are the node's other connections for now.
          conn.__knex__disposed = err;
          conn.destroy();
          if (conn.__gafflineHost && hosts.length > 1) downUntil.set(conn.__gafflineHost, Date.now() + HOST_PAUSE_MS);
        }
        throw err;
      }
    }
  } as unknown as ClientCtor;
  return failoverClient;
}

/** The app's Knex configuration: the shared one with the node list and the statement bound. */
export function appDbConfig(): Knex.Config {
  const base = dbConfig();
  return { ...base, client: failoverClientClass() as unknown as Knex.Config["client"] };
}

export function db(): Knex {
  if (!globalForDb.gafflineDb) globalForDb.gafflineDb = knex(appDbConfig());
  return globalForDb.gafflineDb;
}

/** True when an error means the database could not be reached (as opposed to a bad query). */
export function isDbUnavailable(err: unknown): boolean {
  const e = err as { code?: string; name?: string; message?: string } | null;
  if (!e) return false;
  const codes = [
    "ECONNREFUSED",
    "ECONNRESET",
    "ETIMEDOUT",
    "EPIPE",
    "PROTOCOL_CONNECTION_LOST",
    "ER_CON_COUNT_ERROR",
    "ER_SERVER_SHUTDOWN",
    "PROTOCOL_SEQUENCE_TIMEOUT",
    "ER_STATEMENT_TIMEOUT",
    "WSREP_NOT_READY",
    "ER_UNKNOWN_COM_ERROR", // Galera: "WSREP has not yet prepared node for application use"
  ];
  if (e.code && codes.includes(e.code)) return true;
  if (e.name === "KnexTimeoutError") return true;
  return /connect|Connection lost|Pool is closed|Timeout acquiring|closed state|max_statement_time/i.test(e.message ?? "");
}

// --- conflicts: deadlocks, lock wait time-outs, Galera certification failures ------------------

/**
 * A write lost to another one at the same moment (a deadlock, or on Galera a certification
 * failure at commit: error 1213 "WSREP detected deadlock/conflict"), or waited too long for a
 * lock. Retried by `transact`; once the retries are spent the caller gets 409 (conflict) or
 * 503 (busy) with this message. The transaction was rolled back: nothing was written.
 */
export class DbContentionError extends Error {
  constructor(
    public status: 409 | 503,
    message: string,
    public attempts: number,
  ) {
    super(message);
  }
}

/** 'conflict' for a deadlock or certification failure, 'busy' for a lock wait time-out, else null. */
export function contentionKind(err: unknown): "conflict" | "busy" | null {
  const e = err as { code?: string; errno?: number; message?: string } | null;
  if (!e) return null;
  if (e.code === "ER_LOCK_DEADLOCK" || e.errno === 1213 || /WSREP detected deadlock\/conflict/i.test(e.message ?? "")) return "conflict";
  // 1180: "Got error … during COMMIT" (a write set refused at commit on some versions).
  if (e.code === "ER_ERROR_DURING_COMMIT" || e.errno === 1180) return "conflict";
  if (e.code === "ER_LOCK_WAIT_TIMEOUT" || e.errno === 1205) return "busy";
  return null;
}

export const RETRY_ATTEMPTS = Number(process.env.DB_CONFLICT_RETRIES ?? 5);

/**
 * Runs `fn` (one whole transaction) and runs it again, a bounded number of times with a growing,
 * jittered pause, when it lost a conflict. Retries and give-ups are counted in dbStats().
 */
export async function withConflictRetry<T>(fn: () => Promise<T>, what = "write"): Promise<T> {
  const stats = dbStats();
  for (let attempt = 1; ; attempt++) {
    try {
      return await fn();
    } catch (err) {
      const kind = contentionKind(err);
      if (!kind) throw err;
      if (attempt >= RETRY_ATTEMPTS) {
        stats.conflictsGivenUp++;
        console.warn(`[db] ${what}: still conflicting after ${attempt} attempts (${(err as Error).message}); answered ${kind === "conflict" ? 409 : 503}`);
        throw kind === "conflict"
          ? new DbContentionError(409, "Another change to the same records was saved at the same moment, and this one kept colliding with it; nothing of it was saved. Reload and try again.", attempt)
          : new DbContentionError(503, "The database is busy with another change to the same records; nothing was saved. Try again shortly.", attempt);
      }
      stats.conflictRetries++;
      const pause = Math.min(400, 15 * 2 ** attempt) * (0.5 + Math.random());
      await new Promise((r) => setTimeout(r, pause));
    }
  }
}

/** A READ COMMITTED (by default) transaction, retried on conflicts: see withConflictRetry. */
export function transact<T>(q: Knex, fn: (trx: Knex.Transaction) => Promise<T>, opts: { isolationLevel?: "read committed" | "repeatable read"; what?: string } = {}): Promise<T> {
  return withConflictRetry(() => q.transaction(fn, { isolationLevel: opts.isolationLevel ?? "read committed" }), opts.what);
}

/** The port of the database server that answers this pool (GET /api/health?stats=1): a real query. */
export async function answeringPort(): Promise<number> {
  const [rows] = (await db().raw("select @@port as port")) as unknown as [{ port: number }[]];
  return Number(rows[0]?.port);
}
