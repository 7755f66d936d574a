import bcrypt from "bcryptjs";
import knex from "knex";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { dbConfig } from "@/knexfile";
import { as, Client } from "../support/client";

const db = knex(dbConfig());
afterAll(() => db.destroy());

describe("health", () => {
  it("answers db ok after a real query", async () => {
    const r = await new Client().json("/api/health");
    expect(r.status).toBe(200);
    expect(r.body).toEqual({ db: "ok" });
  });
});

describe("roles are checked server-side", () => {
  it("a signed-out caller gets 401 from the board API", async () => {
    const r = await new Client().json("/api/board");
    expect(r.status).toBe(401);
    expect(r.body.error).toMatch(/Sign in/);
  });

  it("a lineworker gets 403 from dispatcher-only APIs", async () => {
    const c = await as("lineworker");
    expect((await c.json("/api/board")).status).toBe(403);
    const post = await c.json("/api/assignments", "POST", { positionId: 1, workerId: 7 });
    expect(post.status).toBe(403);
    expect(post.body.error).toMatch(/dispatcher or supervisor/);
  });

  it("a dispatcher reads the board", async () => {
    const c = await as("dispatcher");
    const r = await c.json("/api/board?yard=NOR");
    expect(r.status).toBe(200);
    expect(r.body.yard.code).toBe("NOR");
    expect(r.body.orders.length).toBeGreaterThan(0);
  });
});

describe("sign-in", () => {
  const email = `locktest-${Date.now()}@cedarprairie.example`;
  const password = "right-password-123";
  beforeAll(async () => {
    const org = await db("organisations").first("id");
    await db("users").insert({ organisation_id: org.id, email, name: "Lock Test", role: "dispatcher", password_hash: await bcrypt.hash(password, 4) });
  });
  afterAll(async () => {
    await db("users").where({ email }).delete();
    await db("sign_in_attempts").where({ email }).delete();
  });

  it("refuses a wrong password with 401 and no session", async () => {
    const r = await new Client().signIn(email, "wrong-password");
    expect(r.status).toBe(401);
    expect(r.signedIn).toBe(false);
  });

  it("after 5 failures in 15 minutes even the right password is refused, with a clear message", async () => {
    for (let i = 0; i < 5; i++) await new Client().signIn(email, `wrong-${i}`, "10.9.9.9");
    const r = await new Client().signIn(email, password, "10.9.9.8");
    expect(r.status).toBe(401);
    expect(r.signedIn).toBe(false);
    expect(decodeURIComponent(r.body)).toMatch(/Too many failed sign-ins/);
    const failures = await db("sign_in_attempts").where({ email, success: false }).count({ n: "*" }).first();
    expect(Number(failures?.n)).toBeGreaterThanOrEqual(5);
  });

  it("an unknown account is refused the same way as a wrong password", async () => {
    const r = await new Client().signIn("nobody@cedarprairie.example", "whatever-123");
    expect(r.status).toBe(401);
    expect(r.signedIn).toBe(false);
  });
});
