// npm run bench:fill — only the fill part of `npm run bench`: Fill open positions on the
// generated large day (lib/fill/scenario.ts over lib/rules/generate.ts: 1,500 workers,
// 400 orders, 60 days of time records, two yards), pure (no database, no app).
//
//   node --import tsx scripts/bench-fill.ts [--workers 1500 --orders 400 --days 60 --seed 42
//                                             --fill-limit 10 --fill-gap 0.01 --runs 1]
// Prints the figures and the aim (≤ 10 s at ≤ 1 % gap) as met or not met.

import { benchFill, fillAim } from "./bench/fill";

const arg = (name: string) => {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 ? process.argv[i + 1] : undefined;
};
const num = (name: string, fallback: number) => (arg(name) === undefined ? fallback : Number(arg(name)));

async function main() {
  const opts = {
    workers: num("workers", 1500),
    orders: num("orders", 400),
    days: num("days", 60),
    seed: num("seed", 42),
    fillLimit: num("fill-limit", 10),
    fillGap: num("fill-gap", 0.01),
  };
  const runs = num("runs", 1);
  for (let i = 0; i < runs; i++) {
    const f = await benchFill(opts);
    console.log(JSON.stringify({ wallMs: f.wallMs, cpuMs: f.cpuMs, status: f.status, optimal: f.optimal, gap: f.gap, positionsFilled: f.positionsFilled, openSeats: f.openSeats, ordersStaffed: f.ordersStaffed, ordersLeftOpen: f.ordersLeftOpen, objective: f.objective, timings: f.timings, size: f.size }));
    console.log(fillAim(f).line);
  }
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
