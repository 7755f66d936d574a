import knex, { type Knex } from "knex";
import { dbConfig } from "@/knexfile";

// One pool per process, kept across hot reloads in development. Any number of processes may
// share the database: nothing here assumes a single instance.
const globalForDb = globalThis as unknown as { gafflineDb?: Knex };

export function db(): Knex {
  if (!globalForDb.gafflineDb) globalForDb.gafflineDb = knex(dbConfig());
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
  ];
  if (e.code && codes.includes(e.code)) return true;
  if (e.name === "KnexTimeoutError") return true;
  return /connect|Connection lost|Pool is closed|Timeout acquiring/i.test(e.message ?? "");
}
