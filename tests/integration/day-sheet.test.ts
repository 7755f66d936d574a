// Issue 18: the printable day sheet as a PDF. Parsed with pdf-lib (the library that writes it)
// and its text read with unpdf (pdf.js; an independent reader): every order of the day, every
// placed worker's name as the board has them, and the caution. Times are in each yard's zone
// (IANA tz: America/Chicago is CST/CDT, America/Denver MST/MDT).
import { PDFDocument } from "pdf-lib";
import { extractText, getDocumentProxy } from "unpdf";
import { afterAll, describe, expect, it } from "vitest";
import { as, Client } from "../support/client";
import { makeOrder, removeMadeOrders, workerByNo } from "../support/fixtures";
import { testDb } from "../support/notify";
import { addDays, todayIn } from "@/lib/time/days";

const db = testDb();
afterAll(async () => {
  await removeMadeOrders(db);
  await db.destroy();
});

async function pdfText(bytes: Uint8Array) {
  const { text } = await extractText(await getDocumentProxy(new Uint8Array(bytes)), { mergePages: true });
  return (Array.isArray(text) ? text.join(" ") : text).replace(/\s+/g, " ");
}

describe("day sheet PDF", () => {
  it("holds every order of the day with its crew's names, and the caution", async () => {
    const disp = await as("dispatcher");
    const day = addDays(todayIn("America/Chicago"), 1); // the demo's busy day
    const res = await disp.fetch(`/api/day-sheet?date=${day}`);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("application/pdf");
    const bytes = new Uint8Array(await res.arrayBuffer());
    const doc = await PDFDocument.load(bytes);
    expect(doc.getPageCount()).toBeGreaterThan(0);
    expect(doc.getTitle()).toMatch(/^Day sheet /);
    const text = await pdfText(bytes);

    let orders = 0;
    let names = 0;
    for (const yard of ["NOR", "MES"]) {
      const board = (await disp.json(`/api/board?yard=${yard}&date=${day}`)).body;
      const nameOf = new Map(board.pool.map((w: { id: number; name: string }) => [w.id, w.name]));
      for (const o of board.orders) {
        orders++;
        expect(text, o.number).toContain(o.number);
        for (const s of o.seats) {
          if (!s.assignment) continue;
          names++;
          expect(text, `${o.number} ${s.position}`).toContain(String(nameOf.get(s.assignment.workerId)));
        }
      }
    }
    expect(orders).toBeGreaterThan(5); // the demo day has orders in both yards
    expect(names).toBeGreaterThan(3);
    // The caution: the product assists and does not replace the employer's program, the crew
    // lead's judgement, the manufacturer's ratings, OSHA/NESC and local codes (PRODUCT.md "Safety posture").
    for (const words of ["do not replace your employer's safety program", "crew lead's job briefing and judgement", "manufacturer's ratings", "OSHA 29 CFR 1910.269", "NESC", "local codes"]) {
      expect(text).toContain(words);
    }
  });

  it("one yard only, its times in the yard's zone, an overridden block marked with who and why", async () => {
    const o = await makeOrder(db, { offsetDays: 240 + Math.floor(Math.random() * 300), positions: ["climber", "lead"], start: "07:00", end: "15:30" });
    const climber = await workerByNo(db, "CP-1006"); // climbing lapsed (demo)
    const lead = await workerByNo(db, "CP-1001");
    const disp = await as("dispatcher");
    const sup = await as("supervisor");
    expect((await disp.json("/api/assignments", "POST", { positionId: o.positionIds.climber, workerId: climber.id })).status).toBe(201);
    expect((await disp.json("/api/assignments", "POST", { positionId: o.positionIds.lead, workerId: lead.id })).status).toBe(201);
    const reason = "Re-evaluation passed at the yard, card to HR today";
    expect((await sup.json("/api/overrides", "POST", { workOrderId: o.id, rule: "CLIMB_CERT", workerId: climber.id, reason })).status).toBe(201);
    const res = await sup.fetch(`/api/day-sheet?date=${o.day}&yard=NOR`);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-disposition")).toContain(`day-sheet-${o.day}-NOR.pdf`);
    const text = await pdfText(new Uint8Array(await res.arrayBuffer()));
    expect(text).toContain(o.number);
    expect(text).not.toContain("Mesa Yard");
    expect(text).toMatch(/07:00[–-]15:30 C[DS]T/); // North Yard is America/Chicago
    expect(text).toContain(`Climber: ${climber.first_name} ${climber.last_name} (CP-1006), not sent`);
    expect(text).toContain(`Lead: ${lead.first_name} ${lead.last_name} (CP-1001), not sent`);
    expect(text).toContain("Climbing qualification");
    expect(text).toContain(`overridden by Glenn Harrower: ${reason}`);
  });

  it("checks role and input: lineworkers and hr 403, signed out 401, a bad date 422 naming it, an unknown yard 404", async () => {
    expect((await (await as("lineworker")).fetch("/api/day-sheet")).status).toBe(403);
    expect((await (await as("hr")).fetch("/api/day-sheet")).status).toBe(403);
    expect((await new Client().fetch("/api/day-sheet")).status).toBe(401);
    const disp = await as("dispatcher");
    const bad = await disp.json("/api/day-sheet?date=2026-02-30");
    expect(bad.status).toBe(422);
    expect(bad.body.issues[0].field).toBe("date");
    const badYard = await disp.json("/api/day-sheet?yard=%3Cx%3E");
    expect(badYard.status).toBe(422);
    expect(badYard.body.issues[0].field).toBe("yard");
    expect((await disp.json("/api/day-sheet?yard=ZZZ")).status).toBe(404);
  });
});
