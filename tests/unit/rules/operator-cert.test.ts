import { describe, expect, it } from "vitest";
import { operatorCert } from "@/lib/rules/operator-cert";
import { type A, brief, day, order, run, worker, type OrderOpts } from "./fixtures";

// Sources: employer policy for the equipment operator credential; 49 CFR 383 for commercial
// licence classes (a class A licence also covers class B vehicles, recalled from memory).
const people = [
  worker("eo", "operator", { credentials: { equipment_operator: "2028-01-01" } }),
  worker("eox", "operator", { credentials: { equipment_operator: "2027-04-05" } }),
  worker("a", "journeyman", { credentials: { cdl_a: null } }),
  worker("b", "journeyman", { credentials: { cdl_b: "2027-04-06" } }),
  worker("bx", "journeyman", { credentials: { cdl_b: "2027-04-05" } }),
  worker("n", "ground_hand", { credentials: {} }),
];

const cases: Array<{ name: string; order?: OrderOpts; crew: A[]; expected: string[] }> = [
  { name: "policy: operator with a valid credential", crew: [["o", "eo", "operator"]], expected: [] },
  { name: "policy: operator credential lapsed the day before", crew: [["o", "eox", "operator"]], expected: ["o/eox/block"] },
  { name: "policy: operator without a credential", crew: [["o", "n", "operator"]], expected: ["o/n/block"] },
  { name: "49 CFR 383: class B truck, class B licence valid on the day", crew: [["o", "b", "driver"]], expected: [] },
  { name: "49 CFR 383: class B truck (the default), class A licence covers it", crew: [["o", "a", "driver"]], expected: [] },
  { name: "49 CFR 383: class A truck, class B licence is not enough", order: { driverLicence: "cdl_a" }, crew: [["o", "b", "driver"]], expected: ["o/b/block"] },
  { name: "49 CFR 383: class A truck, class A licence", order: { driverLicence: "cdl_a" }, crew: [["o", "a", "driver"]], expected: [] },
  { name: "49 CFR 383: lapsed licence blocks", crew: [["o", "bx", "driver"]], expected: ["o/bx/block"] },
  { name: "policy: one finding for a worker who lacks both", crew: [["o", "n", "operator"], ["o", "n", "driver"]], expected: ["o/n/block"] },
  { name: "policy: other positions need neither", crew: [["o", "n", "ground"], ["o", "n", "observer"]], expected: [] },
];

describe("OPERATOR_CERT", () => {
  it.each(cases)("$name", ({ order: o, crew, expected }) => {
    const found = run(operatorCert, day(people, [order("o", { workType: "bucket", ...o })], crew));
    expect(brief(found)).toEqual(expected);
  });

  it("49 CFR 383: the message names the class the truck needs", () => {
    const [f] = run(operatorCert, day(people, [order("o", { driverLicence: "cdl_a" })], [["o", "b", "driver"]]));
    expect(f.message).toMatch(/class A commercial driver's licence/);
    expect(f.source).toBe("employer policy; 49 CFR 383 for licence classes");
  });
});
