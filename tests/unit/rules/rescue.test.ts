import { describe, expect, it } from "vitest";
import { rescue } from "@/lib/rules/rescue";
import { type A, ALL_CREDS, brief, day, order, run, worker, type OrderOpts } from "./fixtures";

// Source: 29 CFR 1910.269(a)(2)(i)(B) (recalled from memory): training in emergency procedures
// such as pole-top rescue. One trained person besides the exposed worker is common practice.
const none = { climbing: "2028-03-31", first_aid_cpr: "2028-03-31" };
const people = [
  worker("cl", "journeyman", { credentials: ALL_CREDS }), // climber, trained in everything
  worker("pt", "ground_hand", { credentials: { pole_top_rescue: "2028-01-01" } }),
  worker("ar", "ground_hand", { credentials: { aerial_rescue: null } }),
  worker("lapsed", "ground_hand", { credentials: { pole_top_rescue: "2027-04-05", aerial_rescue: "2027-04-05" } }),
  worker("today", "ground_hand", { credentials: { pole_top_rescue: "2027-04-06", aerial_rescue: "2027-04-06" } }),
  worker("no", "ground_hand", { credentials: none }),
];

const cases: Array<{ name: string; order?: OrderOpts; crew: A[]; expected: string[] }> = [
  { name: "(a)(2)(i)(B): a trained ground worker besides the climber", crew: [["o", "cl", "climber"], ["o", "pt", "observer"]], expected: [] },
  {
    name: "(a)(2)(i)(B) + common practice: the climber's own training does not count",
    crew: [["o", "cl", "climber"], ["o", "no", "observer"]],
    expected: ["o/-/block"],
  },
  { name: "(a)(2)(i)(B): lapsed the day before the order blocks", crew: [["o", "cl", "climber"], ["o", "lapsed", "observer"]], expected: ["o/-/block"] },
  { name: "(a)(2)(i)(B): expiring on the order's start date is still valid", crew: [["o", "cl", "climber"], ["o", "today", "observer"]], expected: [] },
  {
    name: "(a)(2)(i)(B): a trained person who is also climbing does not count",
    crew: [["o", "cl", "climber"], ["o", "pt", "climber"]],
    expected: ["o/-/block"],
  },
  { name: "(a)(2)(i)(B): an empty climbing order blocks", crew: [], expected: ["o/-/block"] },
  {
    name: "(a)(2)(i)(B): aerial-lift rescue training does not cover pole-top rescue",
    crew: [["o", "cl", "climber"], ["o", "ar", "observer"]],
    expected: ["o/-/block"],
  },
  {
    name: "(a)(2)(i)(B): bucket work has someone on the ground with aerial-lift rescue",
    order: { workType: "bucket" },
    crew: [["o", "cl", "climber"], ["o", "ar", "ground"]],
    expected: [],
  },
  {
    name: "(a)(2)(i)(B): bucket work, only the person in the bucket is trained",
    order: { workType: "bucket" },
    crew: [["o", "cl", "climber"], ["o", "pt", "ground"]],
    expected: ["o/-/block"],
  },
  {
    name: "(a)(2)(i)(B): storm work with a climber needs pole-top rescue",
    order: { workType: "storm" },
    crew: [["o", "cl", "climber"], ["o", "ar", "ground"]],
    expected: ["o/-/block"],
  },
  { name: "patrol without climbers needs no rescuer", order: { workType: "patrol" }, crew: [["o", "no", "lead"]], expected: [] },
];

describe("RESCUE", () => {
  it.each(cases)("$name", ({ order: o, crew, expected }) => {
    const found = run(rescue, day(people, [order("o", o)], crew));
    expect(brief(found)).toEqual(expected);
    for (const f of found) expect(f.source).toMatch(/^29 CFR 1910\.269\(a\)\(2\)\(i\)\(B\)/);
  });
});
