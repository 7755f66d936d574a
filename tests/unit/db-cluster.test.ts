// The node list, the conflict classification and the outbox partition (issue 17, README
// "Scaling out"). Error numbers from the MariaDB error reference (mariadb.com/kb "MariaDB Error
// Codes"): 1213 ER_LOCK_DEADLOCK (also what Galera returns for a certification failure:
// "WSREP detected deadlock/conflict and aborted the transaction"), 1205 ER_LOCK_WAIT_TIMEOUT,
// 1180 ER_ERROR_DURING_COMMIT, 1969 ER_STATEMENT_TIMEOUT (max_statement_time exceeded).
import { describe, expect, it } from "vitest";
import { contentionKind, dbHosts, DbContentionError, isDbUnavailable, statementTimeoutMs, withConflictRetry } from "@/lib/db";
import { deliveryPartition } from "@/lib/notify/data-outbox";

describe("DB_HOSTS", () => {
  it("reads host:port pairs in order, own node first", () => {
    expect(dbHosts({ DB_HOSTS: "127.0.0.1:3312, 127.0.0.1:3313,127.0.0.1:3311" })).toEqual([
      { host: "127.0.0.1", port: 3312 },
      { host: "127.0.0.1", port: 3313 },
      { host: "127.0.0.1", port: 3311 },
    ]);
  });
  it("falls back to DB_HOST/DB_PORT, and 3306 when a port is left out (MariaDB's default port)", () => {
    expect(dbHosts({ DB_HOST: "10.0.0.5", DB_PORT: "3307" })).toEqual([{ host: "10.0.0.5", port: 3307 }]);
    expect(dbHosts({ DB_HOSTS: "db1" })).toEqual([{ host: "db1", port: 3306 }]);
  });
  it("refuses a port out of range", () => {
    expect(() => dbHosts({ DB_HOSTS: "127.0.0.1:70000" })).toThrow(/bad port/);
  });
  it("statement time-out: DB_STATEMENT_TIMEOUT_MS, default 8000, nonsense ignored", () => {
    expect(statementTimeoutMs({})).toBe(8000);
    expect(statementTimeoutMs({ DB_STATEMENT_TIMEOUT_MS: "2500" })).toBe(2500);
    expect(statementTimeoutMs({ DB_STATEMENT_TIMEOUT_MS: "abc" })).toBe(8000);
  });
});

describe("conflicts", () => {
  it("classifies deadlocks and certification failures as conflicts, lock waits as busy", () => {
    expect(contentionKind({ code: "ER_LOCK_DEADLOCK", errno: 1213, message: "Deadlock found when trying to get lock; try restarting transaction" })).toBe("conflict");
    expect(contentionKind({ errno: 1213, message: "WSREP detected deadlock/conflict and aborted the transaction. Try restarting the transaction" })).toBe("conflict");
    expect(contentionKind({ errno: 1180, message: "Got error 149 during COMMIT" })).toBe("conflict");
    expect(contentionKind({ code: "ER_LOCK_WAIT_TIMEOUT", errno: 1205 })).toBe("busy");
    expect(contentionKind({ code: "ER_DUP_ENTRY", errno: 1062 })).toBeNull();
    expect(contentionKind(new Error("boom"))).toBeNull();
  });
  it("a statement time-out means the database is unavailable (503), not a bug (500)", () => {
    expect(isDbUnavailable({ errno: 1969, message: "Query execution was interrupted (max_statement_time exceeded)" })).toBe(true);
    expect(isDbUnavailable({ code: "PROTOCOL_SEQUENCE_TIMEOUT", message: "Query inactivity timeout" })).toBe(true);
  });
  it("retries a conflict, then succeeds", async () => {
    let calls = 0;
    const r = await withConflictRetry(async () => {
      if (++calls < 3) throw Object.assign(new Error("Deadlock found"), { code: "ER_LOCK_DEADLOCK", errno: 1213 });
      return "ok";
    });
    expect(r).toBe("ok");
    expect(calls).toBe(3);
  });
  it("gives up after a bounded number of attempts with a 409 naming the collision", async () => {
    let calls = 0;
    const err = await withConflictRetry(async () => {
      calls++;
      throw Object.assign(new Error("WSREP detected deadlock/conflict"), { errno: 1213 });
    }).catch((e) => e);
    expect(err).toBeInstanceOf(DbContentionError);
    expect(err.status).toBe(409);
    expect(err.message).toMatch(/same moment.*nothing of it was saved/);
    expect(calls).toBe(err.attempts);
    expect(calls).toBeGreaterThan(1);
    expect(calls).toBeLessThanOrEqual(10);
  });
  it("does not retry other errors", async () => {
    let calls = 0;
    await expect(withConflictRetry(async () => {
      calls++;
      throw Object.assign(new Error("dup"), { code: "ER_DUP_ENTRY" });
    })).rejects.toThrow("dup");
    expect(calls).toBe(1);
  });
});

describe("outbox partition", () => {
  it("one server: a single partition", () => {
    expect(deliveryPartition({ DB_HOST: "127.0.0.1", DB_PORT: "3307" })).toEqual({ index: 0, count: 1 });
  });
  it("three nodes: the own node's place in the sorted list, whatever order the list is in", () => {
    const a = deliveryPartition({ DB_HOSTS: "127.0.0.1:3311,127.0.0.1:3312,127.0.0.1:3313" });
    const b = deliveryPartition({ DB_HOSTS: "127.0.0.1:3312,127.0.0.1:3313,127.0.0.1:3311" });
    const c = deliveryPartition({ DB_HOSTS: "127.0.0.1:3313,127.0.0.1:3311,127.0.0.1:3312" });
    expect([a.index, b.index, c.index].sort()).toEqual([0, 1, 2]);
    expect(new Set([a.count, b.count, c.count])).toEqual(new Set([3]));
  });
  it("DELIVERY_PARTITION=k/P overrides", () => {
    expect(deliveryPartition({ DELIVERY_PARTITION: "1/4", DB_HOSTS: "a:1,b:2" })).toEqual({ index: 1, count: 4 });
  });
});
