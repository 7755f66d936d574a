// POST /api/crew-check with the fields of CREW-CHECK.md "Corrections" (the same parser and
// engine as the command): a bucket day with the only aerial-rescue holder aloft answers RESCUE
// (29 CFR 1910.269(a)(2)(i)(B); OSHA letter of 1997-02-13); a bad shift time is a 422 naming
// workOrders[0].shifts[0].start; a digging order without a ticket answers LOCATE (the state's
// one-call law).
import { describe, expect, it } from "vitest";
import { as } from "../support/client";

const day = () => ({
  timezone: "America/Chicago",
  workers: [
    { id: "lead", name: "Brent Haugland", classification: "crew_lead", credentials: [{ type: "aerial_rescue", expiresOn: "2028-01-31" }, { type: "first_aid_cpr", expiresOn: "2028-01-31" }] },
    { id: "ap", name: "Rhea Sandford", classification: "apprentice", credentials: [{ type: "first_aid_cpr", expiresOn: "2028-01-31" }] },
  ],
  workOrders: [
    {
      id: "wo-1",
      title: "Replace cutout, bucket",
      start: "2027-04-06T07:00",
      end: "2027-04-08T15:30",
      workType: "bucket",
      voltageKv: 12.47,
      digs: false,
      shifts: [
        { start: "2027-04-06T07:00", end: "2027-04-06T15:30" },
        { start: "2027-04-08T07:00", end: "2027-04-08T15:30" },
      ],
    },
  ],
  assignments: [
    { workOrderId: "wo-1", workerId: "lead", position: "lead" },
    { workOrderId: "wo-1", workerId: "lead", position: "aerial" },
    { workOrderId: "wo-1", workerId: "ap", position: "ground" },
  ],
});

describe("POST /api/crew-check: the corrections", () => {
  it("the only aerial-rescue holder aloft: RESCUE, and nothing else on this crew", async () => {
    const r = await (await as("dispatcher")).json("/api/crew-check", "POST", day());
    expect(r.status).toBe(200);
    expect(r.body.findings.map((f: { rule: string; level: string }) => `${f.rule}/${f.level}`)).toEqual(["RESCUE/block"]);
    expect(r.body.findings[0].message).not.toMatch(/\(lead\)|\(ap\)/);
  });

  it("a digging order without a ticket: LOCATE citing the one-call law", async () => {
    const d = day();
    d.workOrders[0].digs = true;
    const r = await (await as("dispatcher")).json("/api/crew-check", "POST", d);
    expect(r.status).toBe(200);
    const locate = r.body.findings.find((f: { rule: string }) => f.rule === "LOCATE");
    expect(locate).toMatchObject({ level: "block", workOrderId: "wo-1", workerId: null });
    expect(locate.source).toMatch(/one-call/);
  });

  it("a bad shift: 422 naming workOrders[0].shifts[0].start, nothing evaluated", async () => {
    const d = day();
    d.workOrders[0].shifts[0].start = "Tuesday 7am";
    const r = await (await as("supervisor")).json("/api/crew-check", "POST", d);
    expect(r.status).toBe(422);
    expect(r.body.error).toMatch(/workOrders\[0\]\.shifts\[0\]\.start/);
    expect(r.body.issues[0].field).toBe("workOrders[0].shifts[0].start");
  });
});
