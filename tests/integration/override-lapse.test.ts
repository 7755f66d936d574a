// Issue 18, point 13: an override lapses silently when the crew changes — now the supervisor
// who gave it gets an in-app notice and an e-mail (through the outbox and the local SMTP fake),
// and supervisors have a queue of blocks waiting on them and of lapsed overrides, scoped to
// their yards on the server.
// Sources: CLIMB_CERT as a block rests on employer qualification under 29 CFR 1910.269(a)(2)
// (PRODUCT.md); that an override holds for one crew only is the product's own rule (PRODUCT.md
// "Crew rules", README "Try it", step 2). Mail is read from the fake's JSON list
// (scripts/fakes/mail.ts, GET /api/messages?to=).
import bcrypt from "bcryptjs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { as, Client } from "../support/client";
import { makeOrder, removeMadeOrders, workerByNo } from "../support/fixtures";
import { fakeMails, testDb, waitFor } from "../support/notify";
import { account } from "../support/client";

const db = testDb();
const mesaSupervisor = { email: `mesa.super.${process.pid}@cedarprairie.example`, password: "mesa-only-supervisor-26" };

beforeAll(async () => {
  const org = await db("organisations").first("id");
  const mes = await db("yards").where({ code: "MES" }).first("id");
  await db("users").where({ email: mesaSupervisor.email }).delete();
  const [id] = await db("users").insert({
    organisation_id: org.id,
    email: mesaSupervisor.email,
    name: "Mesa Test Supervisor",
    role: "supervisor",
    password_hash: await bcrypt.hash(mesaSupervisor.password, 4),
  });
  await db("user_yards").insert({ user_id: id, yard_id: mes.id });
});

afterAll(async () => {
  await removeMadeOrders(db);
  await db("users").where({ email: mesaSupervisor.email }).delete();
  await db.destroy();
});

describe("override lapse notice and the supervisor queue", () => {
  it("a block waits in the queue, the override takes it out, a crew change lapses it and tells the supervisor", async () => {
    const o = await makeOrder(db, { offsetDays: 6, positions: ["climber", "ground"], start: "07:00", end: "12:00" });
    const climber = await workerByNo(db, "CP-1006"); // climbing qualification lapsed (demo scenario)
    const ground = await workerByNo(db, "CP-1014");
    const disp = await as("dispatcher");
    const sup = await as("supervisor");
    expect((await disp.json("/api/assignments", "POST", { positionId: o.positionIds.climber, workerId: climber.id })).status).toBe(201);

    // The queue lists the CLIMB_CERT block by its name, for this order, before any override.
    const before = await sup.json(`/api/queue?yard=NOR`);
    expect(before.status).toBe(200);
    const waiting = before.body.blocks.filter((b: { orderId: number }) => b.orderId === o.id);
    const climb = waiting.find((b: { rule: string }) => b.rule === "CLIMB_CERT");
    expect(climb, JSON.stringify(waiting)).toBeTruthy();
    expect(climb.ruleName).toBe("Climbing qualification");
    expect(climb.startWords).toMatch(/07:00 C[DS]T/); // North Yard is America/Chicago (IANA tz)

    const reason = "Climbing re-evaluation passed this morning, card to follow";
    const ov = await sup.json("/api/overrides", "POST", { workOrderId: o.id, rule: "CLIMB_CERT", workerId: climber.id, reason });
    expect(ov.status).toBe(201);
    const after = await sup.json(`/api/queue?yard=NOR`);
    expect(after.body.blocks.some((b: { orderId: number; rule: string }) => b.orderId === o.id && b.rule === "CLIMB_CERT")).toBe(false);

    // The dispatcher changes the crew: the override lapses, with who and what.
    expect((await disp.json("/api/assignments", "POST", { positionId: o.positionIds.ground, workerId: ground.id })).status).toBe(201);
    const row = await db("overrides").where({ id: ov.body.id }).first();
    expect(row.lapsed_at).not.toBeNull();
    const dispatcherUser = await db("users").where({ email: account("dispatcher").email }).first("id", "name");
    expect(row.lapsed_by_user_id).toBe(dispatcherUser.id);
    expect(row.lapse_change).toBe(`${dispatcherUser.name} placed ${ground.first_name} ${ground.last_name} as ground`);

    const q = await sup.json(`/api/queue?yard=NOR`);
    const lapse = q.body.lapsed.find((l: { overrideId: number }) => l.overrideId === ov.body.id);
    expect(lapse).toMatchObject({ orderNumber: o.number, ruleName: "Climbing qualification", reason, blockNow: true });
    expect(lapse.givenBy).toBe("Glenn Harrower");
    expect(lapse.change).toContain(`placed ${ground.first_name} ${ground.last_name}`);
    expect(lapse.lapsedWords).toMatch(/C[DS]T$/);
    // The block is back in the queue.
    expect(q.body.blocks.some((b: { orderId: number; rule: string }) => b.orderId === o.id && b.rule === "CLIMB_CERT")).toBe(true);

    // The in-app notice: to the supervisor who gave it, in words, no ids.
    const supUser = await db("users").where({ email: account("supervisor").email }).first("id", "email");
    const notice = q.body.notices.find((n: { title: string }) => n.title.includes(o.number));
    expect(notice.title).toBe(`Your override lapsed: Climbing qualification (${climber.first_name} ${climber.last_name}) on ${o.number}`);
    expect(notice.body).not.toMatch(/\(\d+\)|\d{4}-\d{2}-\d{2}/);
    expect(notice.readAt).toBeNull();

    // The e-mail reaches the local SMTP fake.
    const mail = await waitFor("lapse e-mail", async () => (await fakeMails(supUser.email)).find((m) => m.subject.includes(o.number)), 30_000);
    expect(mail.subject).toBe(notice.title);
    expect(mail.text).toContain(reason);
    expect(mail.text).toContain("/queue");
    expect(mail.text).toMatch(/does not replace|do not replace/);

    // Marking it read: only the caller's own notices change.
    const read = await sup.json("/api/notices/read", "POST", { ids: [notice.id] });
    expect(read.status).toBe(200);
    expect(read.body.marked).toBe(1);
    const other = await disp.json("/api/notices/read", "POST", { ids: [notice.id] });
    expect(other.body.marked).toBe(0);
  });

  it("a decline by the worker lapses the override too", async () => {
    const o = await makeOrder(db, { offsetDays: 5, positions: ["climber"], workType: "pole_climb", start: "13:00", end: "16:00" });
    const climber = await workerByNo(db, "CP-1006");
    const disp = await as("dispatcher");
    const sup = await as("supervisor");
    const placed = await disp.json("/api/assignments", "POST", { positionId: o.positionIds.climber, workerId: climber.id });
    expect(placed.status).toBe(201);
    const ov = await sup.json("/api/overrides", "POST", { workOrderId: o.id, rule: "CLIMB_CERT", workerId: climber.id, reason: "Evaluation passed at the yard this morning" });
    expect(ov.status).toBe(201);
    // As if sent: the worker declines on the web path's state machine.
    await db("assignments").where({ id: placed.body.assignmentId }).update({ status: "sent", sent_at: new Date() });
    const { respond } = await import("@/lib/assignments/data-responses");
    await respond(db, { assignmentId: placed.body.assignmentId, workerId: climber.id, answer: "decline", reason: "sick", channel: "sms", actor: null });
    const row = await db("overrides").where({ id: ov.body.id }).first();
    expect(row.lapsed_at).not.toBeNull();
    expect(row.lapse_change).toBe(`${climber.first_name} ${climber.last_name} declined the assignment`);
  });

  it("is for supervisors only, and a Mesa-only supervisor sees only Mesa", async () => {
    expect((await (await as("dispatcher")).json("/api/queue")).status).toBe(403);
    expect((await (await as("admin")).json("/api/queue")).status).toBe(403);
    expect((await new Client().json("/api/queue")).status).toBe(401);
    const mesa = new Client();
    expect((await mesa.signIn(mesaSupervisor.email, mesaSupervisor.password)).signedIn).toBe(true);
    const q = await mesa.json("/api/queue");
    expect(q.status).toBe(200);
    expect(q.body.yards.map((y: { code: string }) => y.code)).toEqual(["MES"]);
    expect(q.body.blocks.every((b: { yardCode: string }) => b.yardCode === "MES")).toBe(true);
    expect(q.body.lapsed.every((l: { yardCode: string }) => l.yardCode === "MES")).toBe(true);
    const north = await mesa.json("/api/queue?yard=NOR");
    expect(north.status).toBe(403);
    expect(north.body.error).toMatch(/North/);
    // Bad input: a clear 422 naming the field.
    const bad = await mesa.json("/api/queue?yard=%3Cscript%3E");
    expect(bad.status).toBe(422);
    expect(bad.body.issues[0].field).toBe("yard");
    const badRead = await mesa.json("/api/notices/read", "POST", { ids: "some" });
    expect(badRead.status).toBe(422);
    expect(badRead.body.issues[0].field).toBe("ids");
  });
});
