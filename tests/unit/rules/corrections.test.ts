// CREW-CHECK.md "Corrections to the rules above", one table per point, each case with the
// paragraph or letter it rests on. Sources:
// - 29 CFR 1910.269 as printed on osha.gov (read for (l)(2)(i)(A)-(E) and (l)(2)(ii)(A)-(C),
//   and the same list in 1926.960(b)(3)); (p)(4)(ii) designated observer other than the
//   operator, with the exception "unless the employer can demonstrate that the operator can
//   accurately determine" the distance; (a)(2)(i)(B) training in emergency procedures such as
//   pole-top rescue; (c)(1) job briefing by the employee in charge: these three from memory.
// - OSHA letter of interpretation of 1994-11-08 to Edison Electric Institute (read on osha.gov):
//   "an employer must have at least two qualified employees present"; the insulated-aerial-lift
//   exception applies only to (D); a transformer installed from an insulated aerial lift near
//   parts above 600 V still needs the second employee under (C).
// - OSHA letter of interpretation of 1997-02-13 (read on osha.gov): under (a)(2)(i) "at least one
//   crew member other than the exposed employee must be trained" in pole-top rescue when the work
//   may need it; its reading for the bucket (someone not aloft) is common practice.
// - Locate tickets: each state's one-call (dig-safe) law sets a ticket's life (common practice;
//   the product quotes no number).
// The issue-14 "Why" holes are reproduced first; they gave no finding before these corrections.

import { describe, expect, it } from "vitest";
import { checkDay } from "@/lib/rules/engine";
import { locate } from "@/lib/rules/locate";
import { observer } from "@/lib/rules/observer";
import { qualified } from "@/lib/rules/qualified";
import { rescue } from "@/lib/rules/rescue";
import { rest } from "@/lib/rules/rest";
import { firstAid } from "@/lib/rules/first-aid";
import { operatorCert } from "@/lib/rules/operator-cert";
import { climbCert } from "@/lib/rules/climb-cert";
import type { Equipment, Finding, RuleCode } from "@/lib/rules/types";
import { type A, ALL_CREDS, brief, day, order, run, t, worker, type OrderOpts } from "./fixtures";

const NO_RESCUE = { climbing: "2028-03-31", first_aid_cpr: "2028-03-31", cdl_b: "2028-03-31" };
const rules = (fs: Finding[]) => fs.map((f) => `${f.rule}/${f.level}`);
const only = (fs: Finding[], code: RuleCode) => fs.filter((f) => f.rule === code);

describe("issue 14 'Why': the holes a practitioner found, now findings", () => {
  it("(a)(2)(i)(B) + Corrections 3: a 12.47 kV bucket job with the lead, the only aerial-rescue holder, up in the bucket and an apprentice on the ground", () => {
    const lead = worker("lead", "crew_lead", { name: "Brent Haugland" });
    const ap = worker("ap", "apprentice", { credentials: NO_RESCUE });
    const o = order("o", { workType: "bucket" });
    // No aerial position filled: the lead is the one aloft.
    expect(rules(checkDay(day([lead, ap], [o], [["o", "lead", "lead"], ["o", "ap", "ground"]])))).toEqual(["RESCUE/block"]);
    // The same with the bucket seat named.
    const found = checkDay(day([lead, ap], [o], [["o", "lead", "lead"], ["o", "lead", "aerial"], ["o", "ap", "ground"]]));
    expect(rules(found)).toEqual(["RESCUE/block"]);
    expect(found[0].message).toMatch(/the only trained worker is up in the bucket/);
  });

  it("(l)(2)(i)(A) + Corrections 2: one journeyman alone on an energized 12.47 kV order of work type other", () => {
    const found = checkDay(day([worker("j", "journeyman")], [order("o", { workType: "other" })], [["o", "j", "lead"]]));
    expect(rules(found)).toEqual(["CREW_MIN/block"]);
    expect(found[0].source).toMatch(/^29 CFR 1910\.269\(l\)\(2\)\(i\)\(A\); OSHA letter of interpretation of 1994-11-08/);
  });

  it("(l)(2)(i)(C) per the 1994-11-08 letter + Corrections 1: a crew lead and an equipment operator on an energized bucket change-out", () => {
    const lead = worker("lead", "crew_lead");
    const op = worker("op", "operator");
    const crew: A[] = [["o", "lead", "lead"], ["o", "lead", "aerial"], ["o", "op", "operator"], ["o", "op", "ground"]];
    const o = order("o", { workType: "bucket", title: "Change out 25 kVA transformer" });
    expect(rules(checkDay(day([lead, op], [o], crew)))).toEqual(["CREW_MIN/block"]);
    // With the qualified-electrical credential the operator counts.
    const opq = worker("op", "operator", { credentials: { ...ALL_CREDS, qualified_electrical: "2028-03-31" } });
    expect(rules(checkDay(day([lead, opq], [o], crew)))).toEqual([]);
  });

  it("(l)(2)(i)(B),(D) + (p)(4)(ii) + Corrections 2: a de-energized derrick job beside a live feeder", () => {
    const lead = worker("lead", "crew_lead");
    const op = worker("op", "operator");
    const o = order("o", { workType: "digger_derrick", energized: false, nearEnergizedKv: 12.47 });
    const found = checkDay(day([lead, op], [o], [["o", "lead", "lead"], ["o", "op", "operator"]]));
    expect(rules(found)).toEqual(["CREW_MIN/block", "OBSERVER/block"]);
    expect(found[0].source).toMatch(/\(l\)\(2\)\(i\)\(B\), 29 CFR 1910\.269\(l\)\(2\)\(i\)\(D\)/);
    expect(found[1].source).toBe("29 CFR 1910.269(p)(4)(ii)");
    // Without the live feeder nearby neither applies.
    const quiet = order("o", { workType: "digger_derrick", energized: false });
    expect(rules(checkDay(day([lead, op], [quiet], [["o", "lead", "lead"], ["o", "op", "operator"]])))).toEqual([]);
  });

  it("(c)(1) + Corrections 5: a crew without a lead is a block (its briefing could never be held)", () => {
    const found = checkDay(
      day([worker("j1", "journeyman"), worker("j2", "journeyman")], [order("o", { workType: "other" })], [["o", "j1", "ground"], ["o", "j2", "ground"]]),
    );
    expect(rules(found)).toEqual(["IN_CHARGE/block"]);
    expect(found[0].source).toBe("29 CFR 1910.269(c)(1)");
  });

  it("Corrections 6: a three-day storm order checks credentials on every day, and its shifts are its worked time", () => {
    const span: OrderOpts = { workType: "storm", exception: "emergency", start: "2027-04-06T06:00", end: "2027-04-08T22:00" };
    const shifts = [
      { start: t("2027-04-06T06:00"), end: t("2027-04-06T22:00") },
      { start: t("2027-04-07T06:00"), end: t("2027-04-07T22:00") },
      { start: t("2027-04-08T06:00"), end: t("2027-04-08T22:00") },
    ];
    const lead = worker("lead", "crew_lead");
    const climber = worker("c", "journeyman", { credentials: { ...ALL_CREDS, climbing: "2027-04-07" } });
    const obs = worker("obs", "ground_hand");
    const crew: A[] = [["o", "lead", "lead"], ["o", "c", "climber"], ["o", "obs", "observer"]];
    // Without shifts: one 64-hour stretch for everyone, and the climbing card lapses on day 2.
    const whole = checkDay(day([lead, climber, obs], [order("o", span)], crew));
    expect(brief(only(whole, "CLIMB_CERT"))).toEqual(["o/c/block"]);
    expect(only(whole, "REST")).toHaveLength(3);
    // With its shifts (16 h on, 8 h off): no REST; the lapsed card still blocks.
    const shifted = checkDay(day([lead, climber, obs], [order("o", { ...span, shifts })], crew));
    expect(rules(shifted)).toEqual(["CLIMB_CERT/block"]);
    expect(shifted[0].message).toMatch(/expires on 7 April 2027, before the order's last day, 8 April 2027/);
  });
});

describe("Corrections 1: operators count only with qualified_electrical (letter 1994-11-08)", () => {
  const QE = { ...ALL_CREDS, qualified_electrical: "2028-03-31" };
  const cases: Array<{ name: string; crew: Array<[string, "journeyman" | "apprentice" | "ground_hand" | "operator" | "crew_lead", Record<string, string | null>]>; expected: string[] }> = [
    { name: "(l)(2)(i)(A): journeyman + crew lead count", crew: [["a", "journeyman", ALL_CREDS], ["b", "crew_lead", ALL_CREDS]], expected: [] },
    { name: "(l)(2)(i)(A): journeyman + operator without the credential: block", crew: [["a", "journeyman", ALL_CREDS], ["b", "operator", ALL_CREDS]], expected: ["o/-/block"] },
    { name: "(l)(2)(i)(A): journeyman + operator with the credential", crew: [["a", "journeyman", ALL_CREDS], ["b", "operator", QE]], expected: [] },
    { name: "(l)(2)(i)(A): two qualified operators count", crew: [["a", "operator", QE], ["b", "operator", QE]], expected: [] },
    { name: "(l)(2)(i)(A): operator with an expired credential does not count", crew: [["a", "journeyman", ALL_CREDS], ["b", "operator", { ...ALL_CREDS, qualified_electrical: "2027-04-05" }]], expected: ["o/-/block"] },
    { name: "(l)(2)(i)(A): apprentice with a qualified operator but no journeyman: not supervised", crew: [["a", "apprentice", ALL_CREDS], ["b", "operator", QE]], expected: ["o/-/block"] },
    { name: "(l)(2)(i)(A): apprentice with a crew lead counts", crew: [["a", "apprentice", ALL_CREDS], ["b", "crew_lead", ALL_CREDS]], expected: [] },
    { name: "(l)(2)(i)(A): ground hands never, even with qualified_electrical", crew: [["a", "journeyman", ALL_CREDS], ["b", "ground_hand", QE]], expected: ["o/-/block"] },
  ];
  it.each(cases)("$name", ({ crew, expected }) => {
    const ws = crew.map(([id, c, creds]) => worker(id, c, { credentials: creds }));
    const found = checkDay(day(ws, [order("o", { workType: "other" })], [["o", crew[0][0], "lead"], ...crew.slice(1).map(([id]): A => ["o", id, "ground"])]));
    expect(brief(only(found, "CREW_MIN"))).toEqual(expected);
  });
});

describe("Corrections 2: (l)(2)(i)(D) mechanical equipment other than an insulated aerial lift (letter 1994-11-08: the exception is only in (D))", () => {
  const eq = (id: string, kind: Equipment["kind"], insulated = false): Equipment => ({ id, name: `Unit ${id}`, kind, insulated, dielectricTestedOn: "2027-01-10", licence: null });
  const cases: Array<{ name: string; order: OrderOpts; equipment: Equipment[]; expected: string[]; source?: RegExp }> = [
    { name: "(l)(2)(i)(D): a patrol with a derrick near a live 12.47 kV line", order: { workType: "patrol" }, equipment: [eq("d", "digger_derrick")], expected: ["o/-/block"], source: /^29 CFR 1910\.269\(l\)\(2\)\(i\)\(D\);/ },
    { name: "(l)(2)(i)(D): a patrol with only a pickup stays outside", order: { workType: "patrol" }, equipment: [eq("p", "pickup")], expected: [] },
    { name: "(l)(2)(i)(A),(D): bucket work from a bucket truck that is not insulated", order: { workType: "bucket" }, equipment: [eq("b", "bucket_truck")], expected: ["o/-/block"], source: /\(l\)\(2\)\(i\)\(A\), 29 CFR 1910\.269\(l\)\(2\)\(i\)\(D\)/ },
    { name: "(l)(2)(i)(A) only: an insulated aerial lift is (D)'s exception, (A) still applies (letter 1994-11-08)", order: { workType: "bucket" }, equipment: [eq("b", "bucket_truck", true)], expected: ["o/-/block"], source: /\(l\)\(2\)\(i\)\(A\); OSHA/ },
    { name: "(l)(2)(i)(D): a derrick on a patrol with nothing live above 600 V", order: { workType: "patrol", voltageKv: 0.24 }, equipment: [eq("d", "digger_derrick")], expected: [] },
  ];
  it.each(cases)("$name", ({ order: o, equipment, expected, source }) => {
    const s = day([worker("j", "journeyman")], [order("o", o)], [["o", "j", "lead"]]);
    s.equipment = equipment;
    s.equipmentAssignments = equipment.map((e) => ({ workOrderId: "o", equipmentId: e.id }));
    const found = only(checkDay(s), "CREW_MIN");
    expect(brief(found)).toEqual(expected);
    if (source) expect(found[0].source).toMatch(source);
  });
});

describe("Corrections 2 and 4: OBSERVER for derricks near live parts ((p)(4)(ii)) and the bucket observer warning", () => {
  const ws = [worker("op", "operator"), worker("j", "journeyman"), worker("g", "ground_hand")];
  const cases: Array<{ name: string; order: OrderOpts; crew: A[]; expected: string[] }> = [
    { name: "(p)(4)(ii): derrick energized at 12.47 kV, no observer", order: { workType: "digger_derrick" }, crew: [["o", "op", "operator"]], expected: ["o/-/block"] },
    { name: "(p)(4)(ii): derrick de-energized, 12.47 kV nearby, no observer", order: { workType: "digger_derrick", energized: false, nearEnergizedKv: 12.47 }, crew: [["o", "op", "operator"]], expected: ["o/-/block"] },
    { name: "(p)(4)(ii): derrick near parts at exactly 0.6 kV: not above 600 V", order: { workType: "digger_derrick", energized: false, nearEnergizedKv: 0.6 }, crew: [["o", "op", "operator"]], expected: [] },
    { name: "(p)(4)(ii) Corrections 2: derrick on 240 V secondary, nothing above 600 V", order: { workType: "digger_derrick", voltageKv: 0.24 }, crew: [["o", "op", "operator"]], expected: [] },
    { name: "(p)(4)(ii): derrick with an observer who is not the operator", order: { workType: "digger_derrick", energized: false, nearEnergizedKv: 7.2 }, crew: [["o", "op", "operator"], ["o", "g", "observer"]], expected: [] },
    { name: "(p)(4)(ii) Corrections 4: bucket at 12.47 kV, nobody on the ground: warn", order: { workType: "bucket" }, crew: [["o", "j", "aerial"], ["o", "j", "lead"]], expected: ["o/-/warn"] },
    { name: "(p)(4)(ii) Corrections 4: bucket de-energized beside 12.47 kV: warn", order: { workType: "bucket", energized: false, nearEnergizedKv: 12.47 }, crew: [["o", "j", "aerial"]], expected: ["o/-/warn"] },
    { name: "(p)(4)(ii) Corrections 4: bucket with a ground hand on the ground", order: { workType: "bucket" }, crew: [["o", "j", "aerial"], ["o", "g", "ground"]], expected: [] },
    { name: "(p)(4)(ii) Corrections 4: bucket with an observer on the ground", order: { workType: "bucket" }, crew: [["o", "j", "aerial"], ["o", "g", "observer"]], expected: [] },
    { name: "(p)(4)(ii) Corrections 4: the 'ground' seat held by the person aloft does not count", order: { workType: "bucket" }, crew: [["o", "j", "aerial"], ["o", "j", "ground"]], expected: ["o/-/warn"] },
    { name: "(p)(4)(ii) Corrections 4: bucket at 240 V: no warning", order: { workType: "bucket", voltageKv: 0.24 }, crew: [["o", "j", "aerial"]], expected: [] },
    { name: "(p)(4)(ii) Corrections 4: bucket of unknown voltage counts as above 600 V", order: { workType: "bucket", voltageKv: null }, crew: [["o", "j", "aerial"]], expected: ["o/-/warn"] },
  ];
  it.each(cases)("$name", ({ order: o, crew, expected }) => {
    const found = run(observer, day(ws, [order("o", o)], crew));
    expect(brief(found)).toEqual(expected);
    for (const f of found) expect(f.source).toMatch(/^29 CFR 1910\.269\(p\)\(4\)\(ii\)/);
  });
});

describe("Corrections 3: the person in the bucket, who is aloft, and who can rescue ((a)(2)(i)(B); letter 1997-02-13)", () => {
  const ar = worker("ar", "journeyman"); // holds every credential, aerial_rescue included
  const ar2 = worker("ar2", "journeyman");
  const j = worker("j", "journeyman", { credentials: NO_RESCUE });
  const g = worker("g", "ground_hand", { credentials: NO_RESCUE });
  const gr = worker("gr", "ground_hand"); // a ground hand trained in both rescues
  const ws = [ar, ar2, j, g, gr];
  const cases: Array<{ name: string; order?: OrderOpts; crew: A[]; expected: string[] }> = [
    { name: "(a)(2)(i)(B): bucket, trained worker aloft, untrained on the ground", order: { workType: "bucket" }, crew: [["o", "ar", "aerial"], ["o", "j", "lead"], ["o", "g", "ground"]], expected: ["o/-/block"] },
    { name: "(a)(2)(i)(B): bucket, trained ground hand on the ground", order: { workType: "bucket" }, crew: [["o", "j", "aerial"], ["o", "ar", "lead"], ["o", "gr", "ground"]], expected: [] },
    { name: "(a)(2)(i)(B): bucket, aerial filled: the lead on the ground may rescue", order: { workType: "bucket" }, crew: [["o", "j", "aerial"], ["o", "ar", "lead"]], expected: [] },
    { name: "(a)(2)(i)(B): bucket, no aerial filled: the lead is aloft and cannot be the rescuer", order: { workType: "bucket" }, crew: [["o", "ar", "lead"], ["o", "g", "ground"]], expected: ["o/-/block"] },
    { name: "(a)(2)(i)(B): bucket, two aloft both trained, nobody trained below", order: { workType: "bucket" }, crew: [["o", "ar", "aerial"], ["o", "ar2", "aerial"], ["o", "g", "ground"]], expected: ["o/-/block"] },
    { name: "(a)(2)(i)(B): bucket, a 'climber' on bucket work was the person in the bucket and is aloft", order: { workType: "bucket" }, crew: [["o", "ar", "climber"], ["o", "j", "aerial"], ["o", "g", "ground"]], expected: ["o/-/block"] },
    { name: "(a)(2)(i)(B): bucket, an earlier input (lead, climber in the bucket, ground): the lead on the ground may rescue", order: { workType: "bucket" }, crew: [["o", "ar", "lead"], ["o", "j", "climber"], ["o", "g", "ground"]], expected: [] },
    { name: "(a)(2)(i)(B): pole climb, the only pole-top holder climbs", crew: [["o", "ar", "climber"], ["o", "j", "lead"], ["o", "g", "observer"]], expected: ["o/-/block"] },
    { name: "(a)(2)(i)(B): pole climb, two climbers both trained, nobody else: someone other than every climber", crew: [["o", "ar", "climber"], ["o", "ar2", "climber"], ["o", "g", "observer"]], expected: ["o/-/block"] },
    { name: "(a)(2)(i)(B): pole climb, trained observer on the ground", crew: [["o", "j", "climber"], ["o", "gr", "observer"]], expected: [] },
  ];
  it.each(cases)("$name", ({ order: o, crew, expected }) => {
    const found = run(rescue, day(ws, [order("o", o)], crew));
    expect(brief(found)).toEqual(expected);
    for (const f of found) expect(f.source).toMatch(/^29 CFR 1910\.269\(a\)\(2\)\(i\)\(B\) .*1997-02-13/);
  });

  const qcases: Array<{ name: string; crew: A[]; expected: string[] }> = [
    { name: "1910.269(l)(1) + (x): a ground hand in the bucket on energized work is locked", crew: [["o", "g", "aerial"], ["o", "j", "lead"]], expected: ["o/g/block/locked"] },
    { name: "1910.269(l)(1) + (x): an unsupervised apprentice in the bucket blocks", crew: [["o", "ap", "aerial"], ["o", "g", "ground"]], expected: ["o/ap/block"] },
    { name: "1910.269(l)(1) + (x): a supervised apprentice in the bucket is fine", crew: [["o", "ap", "aerial"], ["o", "j", "lead"]], expected: [] },
    { name: "1910.269(l)(1) + (x): a journeyman in the bucket is fine", crew: [["o", "j", "aerial"]], expected: [] },
  ];
  it.each(qcases)("$name", ({ crew, expected }) => {
    const found = run(qualified, day([...ws, worker("ap", "apprentice")], [order("o", { workType: "bucket" })], crew));
    expect(brief(found)).toEqual(expected);
    if (expected.length) expect(found[0].message).toMatch(/aerial position \(in the bucket\)|working aloft on energized work/);
  });

  it("common practice: the aerial seat is not climbing: no CLIMB_CERT for it", () => {
    const noClimb = worker("n", "journeyman", { credentials: { first_aid_cpr: null } });
    expect(run(climbCert, day([noClimb], [order("o", { workType: "bucket" })], [["o", "n", "aerial"]]))).toEqual([]);
  });
});

describe("Corrections 6: multi-day orders (every day valid, warning window from the first day, shifts for REST)", () => {
  const three: OrderOpts = { start: "2027-04-06T07:00", end: "2027-04-08T17:00" };
  it("(b)(1)(i): first aid lapsing on day 2 no longer counts", () => {
    const a = worker("a", "journeyman");
    const b = worker("b", "journeyman", { credentials: { ...ALL_CREDS, first_aid_cpr: "2027-04-07" } });
    const crew: A[] = [["o", "a", "lead"], ["o", "b", "ground"]];
    expect(brief(run(firstAid, day([a, b], [order("o", three)], crew)))).toEqual(["o/-/block"]);
    expect(brief(run(firstAid, day([a, b], [order("o")], crew)))).toEqual([]);
  });

  it("employer policy: an operator card valid through the last day is fine, one lapsing before it blocks", () => {
    const ok = worker("ok", "operator", { credentials: { equipment_operator: "2027-04-08" } });
    const late = worker("late", "operator", { credentials: { equipment_operator: "2027-04-07" } });
    const found = run(operatorCert, day([ok, late], [order("o", three)], [["o", "ok", "operator"], ["o", "late", "operator"]]));
    expect(brief(found)).toEqual(["o/late/block"]);
    expect(found[0].message).toMatch(/valid on every day of the order/);
  });

  it("policy: the warning window counts back from the first day", () => {
    // Valid through 2027-05-05: 29 days after the first day (2027-04-06) warns with 30 days.
    const c = worker("c", "journeyman", { credentials: { climbing: "2027-05-05" } });
    const found = run(climbCert, day([c], [order("o", three)], [["o", "c", "climber"]]));
    expect(brief(found)).toEqual(["o/c/warn"]);
    expect(found[0].message).toMatch(/within 30 days of the order's first day, 6 April 2027/);
  });

  it("common practice: shifts replace the span as worked time; a 20 h shift still blocks", () => {
    const w = worker("w", "journeyman");
    const long = [{ start: t("2027-04-06T07:00"), end: t("2027-04-07T03:00") }, { start: t("2027-04-07T12:00"), end: t("2027-04-07T20:00") }];
    const found = run(rest, day([w], [order("o", { ...three, shifts: long })], [["o", "w", "lead"]]));
    expect(brief(found)).toEqual(["o/w/block"]);
    expect(found[0].message).toMatch(/20 h stretch \(6 April 2027 07:00 to 7 April 2027 03:00\)/);
  });

  it("common practice: shifts less than the minimum rest apart join into one stretch", () => {
    const w = worker("w", "journeyman");
    const close = [{ start: t("2027-04-06T07:00"), end: t("2027-04-06T17:00") }, { start: t("2027-04-06T21:00"), end: t("2027-04-07T05:00") }];
    expect(brief(run(rest, day([w], [order("o", { ...three, shifts: close })], [["o", "w", "lead"]])))).toEqual(["o/w/block"]);
  });

  it("common practice: two equally long stretches: the earliest is named, whatever the order of the shifts", () => {
    // Found by the permutation property: two 10 h shifts 14 h apart, an 8 h maximum.
    const w = worker("w", "journeyman");
    const a = { start: t("2027-04-06T07:00"), end: t("2027-04-06T17:00") };
    const b = { start: t("2027-04-07T07:00"), end: t("2027-04-07T17:00") };
    const msg = (shifts: typeof a[]) => run(rest, day([w], [order("o", { ...three, shifts })], [["o", "w", "lead"]], { maxShiftHours: 8 }))[0].message;
    expect(msg([a, b])).toMatch(/10 h stretch \(6 April 2027 07:00 to 17:00\)/);
    expect(msg([b, a])).toBe(msg([a, b]));
  });

  it("common practice: another order's shifts count for the worker's rest too", () => {
    const w = worker("w", "journeyman");
    const a = order("a", { ...three, shifts: [{ start: t("2027-04-06T07:00"), end: t("2027-04-06T17:00") }] });
    const b = order("b", { start: "2027-04-06T20:00", end: "2027-04-07T04:00" });
    // 07:00-17:00 then 20:00-04:00: 3 h apart, one 21 h stretch.
    expect(brief(run(rest, day([w], [a, b], [["a", "w", "lead"], ["b", "w", "lead"]])))).toEqual(["a/w/block", "b/w/block"]);
  });
});

describe("Corrections 7: LOCATE (the state's one-call law sets the ticket's life)", () => {
  const cases: Array<{ name: string; order: OrderOpts; expected: string[]; message?: RegExp }> = [
    { name: "one-call law: digs without a ticket", order: { digs: true }, expected: ["o/-/block"], message: /digs and has no locate ticket/ },
    { name: "one-call law: ticket valid through the order's day", order: { digs: true, locate: { ticket: "2704060123", validThrough: "2027-04-06" } }, expected: [] },
    {
      name: "one-call law: a three-day order whose ticket ends on day 2",
      order: { digs: true, start: "2027-04-06T07:00", end: "2027-04-08T17:00", locate: { ticket: "2704060123", validThrough: "2027-04-07" } },
      expected: ["o/-/block"],
      message: /^Locate ticket 2704060123 is valid through 7 April 2027, before the order's last day, 8 April 2027\./,
    },
    { name: "one-call law: ticket expired before the order", order: { digs: true, locate: { ticket: "1", validThrough: "2027-04-05" } }, expected: ["o/-/block"] },
    { name: "one-call law: an order that does not dig needs no ticket", order: { digs: false }, expected: [] },
    { name: "one-call law: digs absent means it does not dig (earlier inputs keep their meaning)", order: {}, expected: [] },
  ];
  it.each(cases)("$name", ({ order: o, expected, message }) => {
    const found = run(locate, day([worker("j", "journeyman")], [order("o", o)], [["o", "j", "lead"]]));
    expect(brief(found)).toEqual(expected);
    for (const f of found) {
      expect(f.source).toMatch(/one-call \(dig-safe\) law/);
      // The ticket's life is the state's: no number of days is quoted.
      expect(`${f.message} ${f.source}`).not.toMatch(/\d+\s*(business |working |calendar )?days?\b/);
    }
    if (message) expect(found[0].message).toMatch(message);
  });
});
