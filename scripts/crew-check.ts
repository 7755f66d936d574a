// crew-check: evaluate a day's crews from a JSON file (or - for standard input).
// Contract: /work/shared/CREW-CHECK.md. Only file reading and printing live here; the rules
// are lib/rules, the same engine the board and the API use.

import { readFileSync } from "node:fs";
import { parseDayInput } from "../lib/rules/input";
import { crewCheckReport } from "../lib/rules/report";

function fail(headline: string, details: string[] = []): void {
  process.stderr.write(`crew-check: ${headline}\n${details.map((d) => `  ${d}\n`).join("")}`);
  process.exitCode = 2;
}

function main(args: string[]): void {
  const file = args[0];
  if (file === undefined || args.length > 1) {
    fail("usage: crew-check FILE   (FILE may be - for standard input)");
    return;
  }
  let raw: string;
  try {
    raw = readFileSync(file === "-" ? 0 : file, "utf8");
  } catch (err) {
    fail(`cannot read ${file === "-" ? "standard input" : file}: ${(err as Error).message}`);
    return;
  }
  let json: unknown;
  try {
    json = JSON.parse(raw);
  } catch (err) {
    fail(`invalid JSON: ${(err as Error).message}`);
    return;
  }
  const parsed = parseDayInput(json);
  if (!parsed.ok) {
    fail("invalid input:", parsed.errors);
    return;
  }
  process.stdout.write(`${JSON.stringify(crewCheckReport(parsed.snapshot), null, 2)}\n`);
}

main(process.argv.slice(2));
