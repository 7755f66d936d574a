import { describe, expect, it } from "vitest";
import { checkDay, compareFindings, createEngine, findingsForOrders, SnapshotIndex } from "@/lib/rules/engine";
import { parseDayInput } from "@/lib/rules/input";
import type { Finding } from "@/lib/rules/types";
import { ALL_CREDS, day, exampleInput, order, worker } from "./fixtures";

const good = () => [
  worker("lead", "crew_lead"),
  worker("climb", "journeyman"),
  worker("obs", "ground_hand", { credentials: ALL_CREDS }),
];

/** A pole climb that passes every rule. */
const clean = (id = "o") =>
  [
    [id, "lead", "lead"],
    [id, "climb", "climber"],
    [id, "obs", "observer"],
  ] as Array<[string, string, "lead" | "climber" | "observer"]>;

describe("checkDay", () => {
  it("a well-built pole climb has no findings", () => {
    expect(checkDay(day(good(), [order("o")], clean()))).toEqual([]);
  });

  it("the CREW-CHECK.md example: one CREW_MIN naming the crew template (Corrections 1) and (l)(2)(i)(A)", () => {
    const parsed = parseDayInput(exampleInput());
    if (!parsed.ok) throw new Error(parsed.errors.join("\n"));
    const findings = checkDay(parsed.snapshot);
    const crewMin = findings.filter((f) => f.rule === "CREW_MIN");
    expect(crewMin).toHaveLength(1);
    expect(crewMin[0]).toMatchObject({ level: "block", workOrderId: "wo-2201", workerId: null });
    expect(crewMin[0].message).toMatch(/^This order's crew template asks for at least 3 people on site; 1 assigned\. Add 2 more workers\./);
    expect(crewMin[0].source).toBe(
      "the organisation's crew template for this work (policy); 29 CFR 1910.269(l)(2)(i)(A); OSHA letter of interpretation of 1994-11-08 (two qualified employees)",
    );
    expect(findings.map((f) => f.rule)).toEqual(["CREW_MIN", "OBSERVER", "RESCUE"]);
  });

  it("sorts by order, then rule, then worker (null first), by plain string comparison", () => {
    const ws = [worker("B", "ground_hand", { credentials: {} }), worker("a", "ground_hand", { credentials: {} })];
    // "B" < "a" in code-unit order, though a locale-aware sort would put "a" first.
    const f = checkDay(day(ws, [order("o2"), order("O1"), order("o10")], [["o2", "a", "climber"], ["o2", "B", "climber"], ["O1", "a", "lead"], ["o10", "B", "driver"]]));
    for (let i = 1; i < f.length; i++) expect(compareFindings(f[i - 1], f[i])).toBeLessThan(0);
    expect([...new Set(f.map((x) => x.workOrderId))]).toEqual(["O1", "o10", "o2"]);
    const o2climb = f.filter((x) => x.workOrderId === "o2" && x.rule === "CLIMB_CERT").map((x) => x.workerId);
    expect(o2climb).toEqual(["B", "a"]);
    const o2 = f.filter((x) => x.workOrderId === "o2").map((x) => x.rule);
    expect(o2).toEqual([...o2].sort((a, b) => (a < b ? -1 : a > b ? 1 : 0)));
  });

  it("puts the order-level finding (workerId null) before per-worker findings of the same rule", () => {
    const a: Finding = { rule: "REST", level: "block", workOrderId: "o", workerId: "a", message: "", source: "" };
    const n: Finding = { ...a, workerId: null };
    expect([a, n].sort(compareFindings)).toEqual([n, a]);
  });
});

describe("policy levels", () => {
  const twoNoLead = () => day(good(), [order("o", { workType: "other" })], [["o", "climb", "ground"], ["o", "obs", "ground"]]);

  it("IN_CHARGE is block by default (Corrections 5, 1910.269(c)(1))", () => {
    // De-energized "other" work: outside the two-worker minimum, so IN_CHARGE stands alone.
    const s = twoNoLead();
    s.workOrders[0].energized = false;
    expect(checkDay(s).map((f) => [f.rule, f.level])).toEqual([["IN_CHARGE", "block"]]);
  });

  it("a policy may raise warn to block", () => {
    // The bucket observer warning (Corrections 4) raised to block.
    const s = day(good(), [order("o", { workType: "bucket" })], [["o", "lead", "lead"], ["o", "climb", "aerial"]]);
    expect(checkDay(s).filter((f) => f.rule === "OBSERVER").map((f) => f.level)).toEqual(["warn"]);
    s.policy.levels = { OBSERVER: "block" };
    expect(checkDay(s).filter((f) => f.rule === "OBSERVER").map((f) => f.level)).toEqual(["block"]);
  });

  it("a policy may not lower block to warn, and a locked finding stays block", () => {
    const s = day(good(), [order("o")], [["o", "lead", "lead"], ["o", "obs", "climber"], ["o", "climb", "observer"]]);
    s.policy.levels = { QUALIFIED: "warn", OBSERVER: "warn" };
    const q = checkDay(s).find((f) => f.rule === "QUALIFIED")!;
    expect(q).toMatchObject({ level: "block", locked: true, workerId: "obs" });
    const alone = day(good(), [order("o")], [["o", "climb", "climber"]], { levels: { CREW_MIN: "warn", OBSERVER: "warn" } });
    const levels = checkDay(alone).map((f) => [f.rule, f.level]);
    expect(levels).toContainEqual(["CREW_MIN", "block"]);
    expect(levels).toContainEqual(["OBSERVER", "block"]);
  });

  it("a raised CLIMB_CERT blocks inside the warning window too", () => {
    const ws = good();
    ws[1] = worker("climb", "journeyman", { credentials: { ...ALL_CREDS, climbing: "2027-04-20" } });
    const s = day(ws, [order("o")], clean());
    expect(checkDay(s).map((f) => f.level)).toEqual(["warn"]);
    s.policy.levels = { CLIMB_CERT: "block" };
    expect(checkDay(s).map((f) => f.level)).toEqual(["block"]);
  });

  it("a raised CREW_MIN ignores the exceptions", () => {
    const s = day(good(), [order("o", { exception: "emergency" })], [["o", "climb", "climber"], ["o", "obs", "observer"]]);
    expect(checkDay(s).find((f) => f.rule === "CREW_MIN")!.level).toBe("warn");
    s.policy.levels = { CREW_MIN: "block" };
    expect(checkDay(s).find((f) => f.rule === "CREW_MIN")!.level).toBe("block");
  });
});

describe("findingsForOrders", () => {
  const s = () =>
    day(good(), [order("a"), order("b"), order("c", { start: "2027-04-06T16:00", end: "2027-04-06T18:00" })], [
      ...clean("a"),
      ["b", "climb", "climber"],
      ["c", "obs", "climber"],
    ]);

  it("equals the full check filtered to those orders, from a snapshot or an index", () => {
    const all = checkDay(s());
    const want = all.filter((f) => f.workOrderId === "b" || f.workOrderId === "c");
    expect(findingsForOrders(s(), ["c", "b", "nope"])).toEqual(want);
    expect(findingsForOrders(new SnapshotIndex(s()), new Set(["b", "c"]))).toEqual(want);
  });
});

describe("createEngine", () => {
  it("starts with the full check and applies add, remove and move", () => {
    const s = day(good(), [order("a"), order("b", { start: "2027-04-06T12:00", end: "2027-04-06T18:00" })], clean("a"));
    const engine = createEngine(s);
    expect(engine.findings()).toEqual(checkDay(s));
    const step = (f: Finding[]) => {
      expect(f).toEqual(checkDay(engine.snapshot()));
      expect(engine.findings()).toEqual(f);
    };
    step(engine.apply({ kind: "add", assignment: { workOrderId: "b", workerId: "climb", position: "climber" } }));
    expect(engine.findingsFor("a").some((f) => f.rule === "DOUBLE_BOOKED")).toBe(true);
    step(engine.apply({ kind: "remove", assignment: { workOrderId: "b", workerId: "climb", position: "climber" } }));
    expect(engine.findings()).toEqual(checkDay(s));
    step(
      engine.apply({
        kind: "move",
        from: { workOrderId: "a", workerId: "obs", position: "observer" },
        to: { workOrderId: "b", workerId: "obs", position: "observer" },
      }),
    );
    expect(engine.findingsFor("a").some((f) => f.rule === "OBSERVER")).toBe(true);
  });

  it("does not mutate the snapshot it was given", () => {
    const s = day(good(), [order("a")], clean("a"));
    const before = JSON.stringify(s);
    const engine = createEngine(s);
    engine.apply({ kind: "remove", assignment: { workOrderId: "a", workerId: "obs", position: "observer" } });
    expect(JSON.stringify(s)).toBe(before);
  });

  it("removing or moving an assignment that is not there changes nothing", () => {
    const s = day(good(), [order("a")], clean("a"));
    const engine = createEngine(s);
    const ghost = { workOrderId: "a", workerId: "obs", position: "driver" as const };
    expect(engine.apply({ kind: "remove", assignment: ghost })).toEqual([]);
    expect(engine.apply({ kind: "move", from: ghost, to: { ...ghost, position: "climber" } })).toEqual([]);
  });

  it("rejects an unknown order or worker", () => {
    const engine = createEngine(day(good(), [order("a")], []));
    expect(() => engine.apply({ kind: "add", assignment: { workOrderId: "zz", workerId: "obs", position: "ground" } })).toThrow(/unknown work order/);
    expect(() => engine.apply({ kind: "add", assignment: { workOrderId: "a", workerId: "zz", position: "ground" } })).toThrow(/unknown worker/);
  });
});
