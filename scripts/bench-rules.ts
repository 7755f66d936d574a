// bench:rules — times the crew rules on a generated day (deterministic, seeded).
//   npm run bench:rules [-- --workers 1500 --orders 400 --days 60 --seed 42]
// Targets: full check < 50 ms, single-drop re-check < 2 ms (medians).

import { checkDay, createEngine } from "../lib/rules/engine";
import { generateDay, toDayInput } from "../lib/rules/generate";
import { randomDrops } from "../lib/rules/random-drops";
import { parseDayInput } from "../lib/rules/input";

function option(name: string, fallback: number): number {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 ? Number(process.argv[i + 1]) : fallback;
}

function stats(samples: number[]): { median: number; p95: number; max: number } {
  const s = [...samples].sort((a, b) => a - b);
  const at = (q: number) => s[Math.min(s.length - 1, Math.ceil(q * s.length) - 1)];
  return { median: at(0.5), p95: at(0.95), max: s[s.length - 1] };
}

const ms = (n: number) => `${n.toFixed(3)} ms`;

const opts = {
  workers: option("workers", 1500),
  orders: option("orders", 400),
  days: option("days", 60),
  seed: option("seed", 42),
  trucks: option("trucks", 150),
};

let t = performance.now();
const snapshot = generateDay(opts);
const genMs = performance.now() - t;
const input = toDayInput(snapshot);
const inputJson = JSON.stringify(input);
t = performance.now();
const parsed = parseDayInput(JSON.parse(inputJson));
const parseMs = performance.now() - t;
if (!parsed.ok) throw new Error(`generated input does not parse: ${parsed.errors.slice(0, 3).join("; ")}`);

const count = (f: (w: (typeof snapshot.workers)[number]) => number) => snapshot.workers.reduce((n, w) => n + f(w), 0);
console.log(`day: ${JSON.stringify(opts)}`);
console.log(
  `  ${snapshot.workers.length} workers, ${snapshot.workOrders.length} orders, ${snapshot.assignments.length} assignments, ` +
    `${count((w) => w.timeRecords.length)} time records, ${count((w) => w.credentials.length)} credentials, ` +
    `${count((w) => w.unavailable.length)} unavailability entries`,
);
console.log(
  `  ${snapshot.equipment?.length ?? 0} pieces of equipment, ${snapshot.equipmentAssignments?.length ?? 0} equipment assignments, ` +
    `${count((w) => w.gear?.length ?? 0)} gloves and sleeves, ${snapshot.workOrders.filter((o) => o.lift).length} planned lifts`,
);
console.log(
  `  snapshot JSON ${Buffer.byteLength(JSON.stringify(snapshot))} bytes; crew-check input JSON ${Buffer.byteLength(inputJson)} bytes`,
);
console.log(`  generate ${ms(genMs)}; parse + validate input ${ms(parseMs)} (once, cold)`);

// Full check: index + all rules + sort, from the snapshot.
for (let i = 0; i < 10; i++) checkDay(snapshot);
const full: number[] = [];
let findings = 0;
for (let i = 0; i < 50; i++) {
  t = performance.now();
  findings = checkDay(snapshot).length;
  full.push(performance.now() - t);
}
const f = stats(full);
console.log(`full check (50 runs): median ${ms(f.median)}, p95 ${ms(f.p95)}, max ${ms(f.max)}; ${findings} findings`);

// Single drop: one add, remove or move on the live engine, timed; then undone (untimed).
const engine = createEngine(snapshot);
const randomDrop = randomDrops(snapshot, engine, opts.seed + 1);
for (let i = 0; i < 50; i++) {
  const [drop, undo] = randomDrop();
  engine.apply(drop);
  engine.apply(undo);
}
const drops: number[] = [];
for (let i = 0; i < 500; i++) {
  const [drop, undo] = randomDrop();
  t = performance.now();
  engine.apply(drop);
  drops.push(performance.now() - t);
  engine.apply(undo);
}
const d = stats(drops);
console.log(`single-drop re-check (500 runs): median ${ms(d.median)}, p95 ${ms(d.p95)}, max ${ms(d.max)}`);

const same = JSON.stringify(engine.findings()) === JSON.stringify(checkDay(engine.snapshot()));
console.log(`incremental findings equal a full check after ${drops.length * 2 + 100} changes: ${same}`);
console.log(
  `targets: full < 50 ms ${f.median < 50 ? "met" : "MISSED"}; drop < 2 ms ${d.median < 2 ? "met" : "MISSED"} (medians)`,
);
