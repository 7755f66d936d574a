import Papa from "papaparse";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import knex, { type Knex } from "knex";
import { dbConfig } from "@/knexfile";
import { as, Client, type DemoRole } from "@/tests/support/client";
import { makeOrder, removeMadeOrders, workerByNo } from "@/tests/support/fixtures";
import { addDays, todayIn } from "@/lib/time/days";
import { addMonthsIso } from "@/lib/credentials/model";

// Rubber goods and lift plans against the running app and MariaDB. Rubber goods written here
// belong to workers made for this test (inactive, so no board shows them) or carry serials
// with this run's prefix, and are removed afterwards; the demo's own items are not changed.
// Board checks use orders on far days of their own (tests/support/fixtures.ts).

let db: Knex;
const c: Partial<Record<DemoRole, Client>> = {};
const run = Date.now().toString(36).slice(-5).toUpperCase();
const nos = Array.from({ length: 6 }, (_, i) => `GR${run}-${i + 1}`);
let ids: number[] = [];
const today = todayIn("America/Chicago");
const serial = (s: string) => `T${run}-${s}`;
const count = async () => Number((await db("rubber_goods").count({ n: "*" }).first())?.n);

beforeAll(async () => {
  db = knex(dbConfig());
  for (const r of ["hr", "admin", "dispatcher", "supervisor", "lineworker"] as const) c[r] = await as(r);
  await db("workers").insert(
    nos.map((no, i) => ({ organisation_id: 1, yard_id: 1, employee_no: no, first_name: "Gear", last_name: `Test ${i + 1}`, classification: "journeyman", active: false })),
  );
  ids = (await db("workers").whereIn("employee_no", nos).orderBy("employee_no").select("id")).map((w) => Number(w.id));
});

afterAll(async () => {
  await db("rubber_goods").where("serial", "like", `T${run}-%`).orWhereIn("worker_id", ids).delete();
  await db("rubber_goods").where("serial", "like", `'=T${run}%`).orWhere("serial", "like", `=T${run}%`).delete();
  await db("workers").whereIn("id", ids).delete();
  await removeMadeOrders(db);
  await db.destroy();
});

const glove = (workerId: number, s: string, extra: Record<string, unknown> = {}) => ({
  workerId,
  kind: "rubber_gloves",
  class: "2",
  size: "10",
  serial: serial(s),
  testedOn: addDays(today, -10),
  ...extra,
});

describe("rubber goods: roles and scope", () => {
  it("hr and admin record; dispatcher, supervisor and lineworker may not; signed out is 401", async () => {
    for (const r of ["dispatcher", "supervisor", "lineworker"] as const) {
      expect((await c[r]!.json("/api/gear", "POST", glove(ids[0], `role-${r}`))).status).toBe(403);
    }
    expect((await new Client().json("/api/gear", "POST", glove(ids[0], "anon"))).status).toBe(401);
    const a = await c.hr!.json("/api/gear", "POST", glove(ids[0], "hr"));
    expect(a.status).toBe(201);
    const b = await c.admin!.json("/api/gear", "POST", glove(ids[0], "admin", { kind: "rubber_sleeves" }));
    expect(b.status).toBe(201);
    // The write's audit row and the board event (an open board re-checks), same transaction.
    const audit = await db("audit_log").where({ entity: "rubber_goods", entity_id: String(a.body.item.id), action: "gear.create" }).first();
    expect(audit).toBeTruthy();
    const ev = await db("board_events").orderBy("id", "desc").where("kind", "credential").first();
    expect((typeof ev.payload === "string" ? JSON.parse(ev.payload) : ev.payload).gear).toBe(b.body.item.id);
  });

  it("dispatcher, supervisor, hr and admin read everyone's; a lineworker reads only their own", async () => {
    for (const r of ["hr", "admin", "dispatcher", "supervisor"] as const) {
      const l = await c[r]!.json(`/api/gear?workerId=${ids[0]}`);
      expect(l.status).toBe(200);
      expect(l.body.gear.map((g: { serial: string }) => g.serial)).toContain(serial("hr"));
    }
    // Marcus Whitfield (CP-1001) is the demo lineworker sign-in.
    const marcus = await workerByNo(db, "CP-1001");
    const own = await c.lineworker!.json("/api/gear?view=all");
    expect(own.status).toBe(200);
    expect(own.body.gear.length).toBeGreaterThan(0);
    expect(own.body.gear.every((g: { workerId: number }) => g.workerId === marcus.id)).toBe(true);
    expect((await c.lineworker!.json(`/api/gear?workerId=${ids[0]}`)).status).toBe(403);
    const someone = await db("rubber_goods").whereNot("worker_id", marcus.id).first("id");
    expect((await c.lineworker!.json(`/api/gear/${someone.id}`)).status).toBe(403);
    expect((await c.lineworker!.json(`/api/gear/${own.body.gear[0].id}`)).status).toBe(200);
  });
});

describe("rubber goods: bad input is 422 naming the field, nothing stored", () => {
  const cases: [string, Record<string, unknown>, string][] = [
    // 1910.137 Table I-4 has classes 00, 0, 1, 2, 3 and 4 only.
    ["a class that does not exist", { class: "5" }, "class"],
    ["a kind that is not gloves or sleeves", { kind: "rubber_blanket" }, "kind"],
    ["an impossible test date", { testedOn: "2026-02-30" }, "testedOn"],
    ["a test date after today", { testedOn: addDays(today, 3) }, "testedOn"],
    ["an empty serial", { serial: "" }, "serial"],
    ["an unknown worker", { workerId: 999_999_999 }, "workerId"],
  ];
  for (const [what, patch, field] of cases) {
    it(what, async () => {
      const before = await count();
      const r = await c.hr!.json("/api/gear", "POST", { ...glove(ids[1], `bad-${field}`), ...patch });
      expect(r.status).toBe(422);
      expect(r.body.issues[0].field).toBe(field);
      expect(await count()).toBe(before);
    });
  }

  it("a serial already on record", async () => {
    const r = await c.hr!.json("/api/gear", "POST", glove(ids[1], "hr"));
    expect(r.status).toBe(422);
    expect(r.body.issues[0].field).toBe("serial");
  });
});

describe("rubber goods: retest due dates (29 CFR 1910.137 Table I-5)", () => {
  it("gloves fall due 6 months after their last test, sleeves 12; 30 days ahead they are on the due list", async () => {
    // Table I-5: rubber insulating gloves, "before first issue and every 6 months thereafter";
    // sleeves, "before first issue and every 12 months thereafter".
    const t = addDays(today, -160);
    const g = await c.hr!.json("/api/gear", "POST", glove(ids[2], "due-g", { testedOn: t }));
    const s = await c.hr!.json("/api/gear", "POST", glove(ids[2], "due-s", { testedOn: t, kind: "rubber_sleeves" }));
    expect(g.body.item.dueOn).toBe(addMonthsIso(t, 6));
    expect(s.body.item.dueOn).toBe(addMonthsIso(t, 12));
    expect(g.body.item.state).toBe("due"); // 160 days + ~21 days left
    expect(s.body.item.state).toBe("ok");
    const due = await c.hr!.json(`/api/gear?view=due&workerId=${ids[2]}`);
    expect(due.body.gear.map((x: { serial: string }) => x.serial)).toEqual([serial("due-g")]);
    const old = await c.hr!.json("/api/gear", "POST", glove(ids[2], "over", { testedOn: addDays(today, -200) }));
    expect(old.body.item.state).toBe("overdue");
    const overdue = await c.hr!.json(`/api/gear?view=overdue&workerId=${ids[2]}`);
    expect(overdue.body.gear.map((x: { serial: string }) => x.serial)).toEqual([serial("over")]);
  });

  it("a new test date moves the due date; a stale version is 409; retiring takes it off the lists", async () => {
    const { body } = await c.hr!.json(`/api/gear?view=overdue&workerId=${ids[2]}`);
    const item = body.gear[0];
    const ok = await c.hr!.json(`/api/gear/${item.id}`, "PATCH", { version: item.version, testedOn: today });
    expect(ok.status).toBe(200);
    expect(ok.body.item.dueOn).toBe(addMonthsIso(today, 6));
    expect(ok.body.item.state).toBe("ok");
    expect((await c.hr!.json(`/api/gear/${item.id}`, "PATCH", { version: item.version, class: "3" })).status).toBe(409);
    expect((await c.dispatcher!.json(`/api/gear/${item.id}`, "PATCH", { version: ok.body.item.version, retiredOn: today })).status).toBe(403);
    const bad = await c.hr!.json(`/api/gear/${item.id}`, "PATCH", { version: ok.body.item.version, class: "X" });
    expect(bad.status).toBe(422);
    expect(bad.body.issues[0].field).toBe("class");
    const ret = await c.hr!.json(`/api/gear/${item.id}`, "PATCH", { version: ok.body.item.version, retiredOn: today });
    expect(ret.body.item.state).toBe("retired");
    const all = await c.hr!.json(`/api/gear?workerId=${ids[2]}`);
    expect(all.body.gear.map((x: { id: number }) => x.id)).not.toContain(item.id);
  });
});

describe("rubber goods CSV", () => {
  const exportRows = async (q: string) => {
    const res = await c.hr!.fetch(`/api/gear/export?q=${encodeURIComponent(q)}&view=all`);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toMatch(/text\/csv/);
    return (await res.text()).replace(/^\uFEFF/, "");
  };

  beforeAll(async () => {
    for (let i = 0; i < 5; i++) {
      const r = await c.hr!.json("/api/gear", "POST", glove(ids[3], `csv-${i}`, { testedOn: addDays(today, -20 - i), class: i % 2 ? "2" : "3" }));
      expect(r.status).toBe(201);
    }
  });

  it("export → import is a no-op: nothing changes and no audit row is written", async () => {
    const text = await exportRows(`T${run}-csv-`);
    const parsed = Papa.parse<string[]>(text.trim(), { skipEmptyLines: true });
    expect(parsed.data[0].slice(0, 8)).toEqual(["serial", "employee_no", "kind", "class", "size", "tested_on", "issued_on", "retired_on"]);
    expect(parsed.data.length).toBe(6);
    const versions = await db("rubber_goods").where("serial", "like", `T${run}-csv-%`).orderBy("id").pluck("version");
    const audits = Number((await db("audit_log").where({ action: "gear.import" }).count({ n: "*" }).first())?.n);
    const r = await c.hr!.json("/api/gear/import", "POST", { csv: text, dryRun: false });
    expect(r.status).toBe(200);
    expect(r.body).toMatchObject({ ok: true, created: 0, updated: 0, unchanged: 5 });
    expect(await db("rubber_goods").where("serial", "like", `T${run}-csv-%`).orderBy("id").pluck("version")).toEqual(versions);
    expect(Number((await db("audit_log").where({ action: "gear.import" }).count({ n: "*" }).first())?.n)).toBe(audits);
  });

  it("an edited export changes exactly the edited rows; a new serial is created", async () => {
    const rows = Papa.parse<string[]>((await exportRows(`T${run}-csv-`)).trim(), { skipEmptyLines: true }).data;
    const header = rows[0];
    const col = (n: string) => header.indexOf(n);
    const edited = rows.map((r) => [...r]);
    edited[1][col("class")] = "4";
    edited[3][col("tested_on")] = today;
    edited.push([serial("csv-new"), nos[3], "gloves", "class 2", "9", addDays(today, -1), "", "", "", "", "", ""]);
    const before = new Map((await db("rubber_goods").where("serial", "like", `T${run}-csv-%`).select("serial", "version", "class", "tested_on")).map((r) => [r.serial, r]));
    const r = await c.hr!.json("/api/gear/import", "POST", { csv: Papa.unparse(edited), dryRun: false });
    expect(r.status).toBe(201);
    expect(r.body).toMatchObject({ created: 1, updated: 2, unchanged: 3 });
    const after = await db("rubber_goods").where("serial", "like", `T${run}-csv-%`).select("serial", "version", "class", "tested_on");
    const changed = after.filter((a) => !before.has(a.serial) || before.get(a.serial).version !== a.version).map((a) => a.serial).sort();
    expect(changed).toEqual([edited[1][col("serial")], edited[3][col("serial")], serial("csv-new")].sort());
    expect(after.find((a) => a.serial === edited[1][col("serial")])!.class).toBe("4");
    expect(after.find((a) => a.serial === serial("csv-new"))!.class).toBe("2");
    expect(await db("audit_log").where({ action: "gear.import" }).orderBy("id", "desc").first()).toBeTruthy();
  });

  it("one bad row: 422 with every line and field, and nothing is stored (all or nothing)", async () => {
    const before = await count();
    const versions = await db("rubber_goods").where("serial", "like", `T${run}-csv-%`).orderBy("id").pluck("version");
    const csv = [
      "serial,employee_no,kind,class,tested_on",
      `${serial("imp-1")},${nos[4]},rubber_gloves,2,${addDays(today, -3)}`,
      `${serial("csv-0")},${nos[3]},rubber_gloves,1,${addDays(today, -3)}`, // a real change...
      `${serial("imp-2")},${nos[4]},rubber_gloves,7,${addDays(today, -3)}`, // line 4: no class 7
      `${serial("imp-3")},NOBODY-${run},rubber_gloves,2,${addDays(today, -3)}`, // line 5
      `${serial("imp-4")},${nos[4]},rubber_gloves,2,2026-13-01`, // line 6
      `${serial("imp-1")},${nos[4]},rubber_gloves,2,${addDays(today, -3)}`, // line 7: repeated serial
    ].join("\r\n");
    const r = await c.hr!.json("/api/gear/import", "POST", { csv, dryRun: false });
    expect(r.status).toBe(422);
    expect(r.body.issues.map((i: { line: number; field: string }) => `${i.line}:${i.field}`)).toEqual(["4:class", "5:employee_no", "6:tested_on", "7:serial"]);
    expect(await count()).toBe(before);
    expect(await db("rubber_goods").where("serial", "like", `T${run}-csv-%`).orderBy("id").pluck("version")).toEqual(versions);
  });

  it("a cell starting with = is escaped on export and reads back as it was (CSV injection guard)", async () => {
    const r = await c.hr!.json("/api/gear", "POST", glove(ids[4], "x", { serial: `=T${run}+1` }));
    expect(r.status).toBe(201);
    const text = await exportRows(`=T${run}`);
    expect(text).toContain(`'=T${run}+1`);
    expect(text).not.toMatch(new RegExp(`(^|[\\r\\n,])=T${run}`));
    const back = await c.hr!.json("/api/gear/import", "POST", { csv: text, dryRun: true });
    expect(back.body).toMatchObject({ ok: true, created: 0, updated: 0, unchanged: 1 });
  });

  it("import and export roles: hr and admin import; dispatcher and supervisor export only; lineworker neither", async () => {
    const csv = `serial,employee_no,kind,class,tested_on\r\n${serial("role")},${nos[5]},rubber_gloves,2,${addDays(today, -1)}\r\n`;
    for (const r of ["dispatcher", "supervisor", "lineworker"] as const) expect((await c[r]!.json("/api/gear/import", "POST", { csv, dryRun: true })).status).toBe(403);
    expect((await c.admin!.json("/api/gear/import", "POST", { csv, dryRun: true })).status).toBe(200);
    for (const r of ["dispatcher", "supervisor", "hr", "admin"] as const) expect((await c[r]!.fetch("/api/gear/export")).status).toBe(200);
    expect((await c.lineworker!.fetch("/api/gear/export")).status).toBe(403);
  });
});

describe("rubber goods on the board (RUBBER_GOODS, CREW-CHECK.md)", () => {
  it("a climber with class 0 gloves only on a 12.47 kV order is blocked; class 2 gloves tested today clear it", async () => {
    // 1910.137 Table I-4: class 0 is rated for 1,000 V AC at most; 12.47 kV needs class 2 (17,000 V).
    const o = await makeOrder(db, { yardCode: "MES", offsetDays: 33, positions: ["climber"] });
    const dominic = await workerByNo(db, "CP-2010"); // the demo's apprentice with class 0 gloves only
    const mesa = await as("dispatcher", "dispatch.mesa@cedarprairie.example");
    expect((await mesa.json("/api/assignments", "POST", { positionId: o.positionIds.climber, workerId: dominic.id })).status).toBe(201);
    const board = async () => (await mesa.json(`/api/board?date=${o.day}&yard=MES`)).body;
    const rubber = (b: { findings: { rule: string; workOrderId: string; workerId: string | null }[] }) =>
      b.findings.filter((f) => f.rule === "RUBBER_GOODS" && f.workOrderId === String(o.id) && f.workerId === String(dominic.id));
    expect(rubber(await board())).toHaveLength(1);
    const added = await c.hr!.json("/api/gear", "POST", { workerId: dominic.id, kind: "rubber_gloves", class: "2", serial: serial("dominic"), testedOn: todayIn("America/Denver") });
    expect(added.status).toBe(201);
    expect(rubber(await board())).toHaveLength(0);
  });
});

describe("lift plans", () => {
  let orderId: number;
  beforeAll(async () => {
    orderId = (await makeOrder(db, { offsetDays: 34, positions: ["climber", "lead"] })).id;
  });
  const plan = (p: Record<string, unknown> = {}) => ({ loadLb: 640, partsOfLine: 3, blockWllLb: 2000, lineWllLb: 450, slingWllLb: 1000, slingLegs: 2, slingAngleDeg: 60, ...p });

  const bad: [string, Record<string, unknown>, string][] = [
    ["a negative weight", { loadLb: -640 }, "loadLb"],
    ["zero parts of line", { partsOfLine: 0 }, "partsOfLine"],
    ["a sling angle of 0°", { slingAngleDeg: 0 }, "slingAngleDeg"],
    ["a sling angle above 90°", { slingAngleDeg: 91 }, "slingAngleDeg"],
    ["a negative WLL", { lineWllLb: -5 }, "lineWllLb"],
    ["rigging that is not on the order's truck", { blockRiggingId: 999_999 }, "blockRiggingId"],
  ];
  for (const [what, p, field] of bad) {
    it(`${what}: 422 naming ${field}, nothing stored`, async () => {
      const r = await c.dispatcher!.json(`/api/orders/${orderId}/lift`, "PUT", plan(p));
      expect(r.status).toBe(422);
      expect(r.body.issues[0].field).toBe(field);
      expect(await db("lift_plans").where({ work_order_id: orderId }).first()).toBeUndefined();
    });
  }

  it("saves a plan with its figures; only dispatch roles write it", async () => {
    for (const r of ["hr", "lineworker"] as const) expect((await c[r]!.json(`/api/orders/${orderId}/lift`, "PUT", plan())).status).toBe(403);
    const r = await c.dispatcher!.json(`/api/orders/${orderId}/lift`, "PUT", plan());
    expect(r.status).toBe(200);
    // The contract's example lift (CREW-CHECK.md): W = 640 lb on 3 parts over 3 sheaves at
    // f = 0.10: P = 640 × 1.1^3 × 0.1 / (1.1^3 − 1) = 85.184 / 0.331 = 257.35 → 257.4 lb;
    // block W + P = 897.4 lb; two legs at 60°: 640 / (2 × sin 60°) = 369.5 lb.
    expect(r.body.figures).toMatchObject({ leadLinePullLb: 257.4, blockLoadLb: 897.4, slingLegLb: 369.5 });
    expect(r.body.figures.checks.every((x: { over: boolean }) => !x.over)).toBe(true);
    expect(await db("audit_log").where({ action: "lift_plan.create", entity_id: String(orderId) }).first()).toBeTruthy();
    const g = await c.supervisor!.json(`/api/orders/${orderId}/lift`);
    expect(g.body.plan.version).toBe(1);
    // Without its version, a second save could overwrite someone else's: 422; a stale one 409.
    expect((await c.dispatcher!.json(`/api/orders/${orderId}/lift`, "PUT", plan())).status).toBe(422);
    expect((await c.dispatcher!.json(`/api/orders/${orderId}/lift`, "PUT", plan({ version: 7 }))).status).toBe(409);
  });

  it("a plan over the hand line's WLL is a RIGGING block on the board; fixing the plan clears it", async () => {
    const day = (await db("work_orders").where({ id: orderId }).first("work_date")).work_date;
    const findings = async () =>
      (await c.dispatcher!.json(`/api/board?date=${day}&yard=NOR`)).body.findings.filter((f: { rule: string; workOrderId: string }) => f.rule === "RIGGING" && f.workOrderId === String(orderId));
    // 640 lb on a single part of line with no friction allowance: the line carries all 640 lb,
    // over a 450 lb hand line (f = 0: P = W / N).
    const v = (await c.dispatcher!.json(`/api/orders/${orderId}/lift`)).body.plan.version;
    const over = await c.dispatcher!.json(`/api/orders/${orderId}/lift`, "PUT", plan({ version: v, partsOfLine: 1, sheaves: 1, frictionPerSheave: 0 }));
    expect(over.body.figures.leadLinePullLb).toBe(640);
    expect(over.body.figures.checks.find((x: { part: string }) => x.part === "line").over).toBe(true);
    const f = await findings();
    expect(f).toHaveLength(1);
    expect(f[0].level).toBe("block");
    const fixed = await c.dispatcher!.json(`/api/orders/${orderId}/lift`, "PUT", plan({ version: over.body.plan.version }));
    expect(fixed.status).toBe(200);
    expect(await findings()).toHaveLength(0);
  });
});
