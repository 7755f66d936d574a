import { spawnSync } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { exampleInput } from "./fixtures";

// The crew-check command-line contract (CREW-CHECK.md): JSON on stdout and exit 0 when the
// input could be evaluated; a message naming the path on stderr and exit 2 otherwise.
const CWD = join(__dirname, "../../..");

function crewCheck(args: string[], stdin?: string) {
  const r = spawnSync(process.execPath, ["--import", "tsx", "scripts/crew-check.ts", ...args], {
    cwd: CWD,
    input: stdin,
    encoding: "utf8",
    timeout: 30_000,
  });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

const dir = mkdtempSync(join(tmpdir(), "crew-check-"));
function file(name: string, content: string): string {
  const p = join(dir, name);
  writeFileSync(p, content);
  return p;
}

describe("crew-check CLI", () => {
  it("evaluates the CREW-CHECK.md example: exit 0, the contract's finding shape and summary", () => {
    const r = crewCheck([file("day.json", JSON.stringify(exampleInput()))]);
    expect(r.stderr).toBe("");
    expect(r.status).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(Object.keys(out)).toEqual(["findings", "summary", "orders"]);
    for (const f of out.findings) expect(Object.keys(f)).toEqual(["rule", "level", "workOrderId", "workerId", "message", "source"]);
    // Corrections 1: the order's own minimum cites the crew template; the two-worker part cites (l)(2)(i)(A).
    const own = out.findings.find((f: { message: string }) => f.message.startsWith("This order's crew template asks for at least 3 people on site; 1 assigned."));
    expect(own).toMatchObject({ rule: "CREW_MIN", level: "block", workOrderId: "wo-2201", workerId: null });
    expect(own.source).toMatch(/^the organisation's crew template for this work \(policy\); 29 CFR 1910\.269\(l\)\(2\)\(i\)\(A\)/);
    const blocks = out.findings.filter((f: { level: string }) => f.level === "block").length;
    expect(out.summary).toEqual({ block: blocks, warn: out.findings.length - blocks });
  });

  it("reads standard input with -", () => {
    const fromFile = crewCheck([file("same.json", JSON.stringify(exampleInput()))]);
    const fromStdin = crewCheck(["-"], JSON.stringify(exampleInput()));
    expect(fromStdin.status).toBe(0);
    expect(fromStdin.stdout).toBe(fromFile.stdout);
  });

  it("prints no locked field (exactly the contract's fields) and exits 0 with findings", () => {
    const input = exampleInput();
    input.workers.push({ id: "w-9", name: "Tam Rookley", classification: "ground_hand", credentials: [] });
    input.assignments.push({ workOrderId: "wo-2201", workerId: "w-9", position: "climber" });
    const r = crewCheck(["-"], JSON.stringify(input));
    expect(r.status).toBe(0);
    const q = JSON.parse(r.stdout).findings.find((f: { rule: string }) => f.rule === "QUALIFIED");
    expect(q).toMatchObject({ workerId: "w-9", level: "block" });
    expect(q).not.toHaveProperty("locked");
  });

  it("exits 0 with no findings for a clean day", () => {
    const r = crewCheck(["-"], JSON.stringify({ timezone: "UTC", workers: [], workOrders: [], assignments: [] }));
    expect(r.status).toBe(0);
    expect(JSON.parse(r.stdout)).toEqual({ findings: [], summary: { block: 0, warn: 0 }, orders: [] });
  });

  it("invalid input: exit 2, the path on stderr, nothing on stdout", () => {
    const input = exampleInput();
    input.workOrders[0].start = "tomorrow at seven";
    delete input.workers[0].classification;
    const r = crewCheck(["-"], JSON.stringify(input));
    expect(r.status).toBe(2);
    expect(r.stdout).toBe("");
    expect(r.stderr).toContain("workOrders[0].start: expected YYYY-MM-DDTHH:mm");
    expect(r.stderr).toContain("workers[0].classification: required");
  });

  it("invalid JSON: exit 2", () => {
    const r = crewCheck([file("broken.json", '{"timezone": ')]);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/invalid JSON/);
  });

  it("unreadable file: exit 2", () => {
    const r = crewCheck([join(dir, "missing.json")]);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/cannot read/);
  });

  it("no file argument: exit 2 with usage", () => {
    const r = crewCheck([]);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/usage/);
  });
});
