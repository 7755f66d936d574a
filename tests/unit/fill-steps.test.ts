// The steps of Fill open positions one by one (issue 13: lib/fill/steps), on small generated
// days (lib/fill/scenario.ts over the benchmark generator, seeded). The oracles are outside the
// step under test: the crew rules engine (lib/rules) for eligibility and the re-check, brute
// force for the interval cliques and the rest pairs, HiGHS itself (the `highs` npm package,
// University of Edinburgh's solver) for the bound, and weak duality (any Lagrangian bound lies
// between the LP relaxation and the integer optimum; Geoffrion 1974, "Lagrangean relaxation for
// integer programming", recalled from memory).

import { describe, expect, it } from "vitest";
import { createEngine } from "@/lib/rules/engine";
import { createRun, fill, FillCancelled, runEligibility } from "@/lib/fill/fill";
import { solveLp } from "@/lib/fill/highs";
import { fillScenario } from "@/lib/fill/scenario";
import { lagrangianBound } from "@/lib/fill/steps/bound";
import { buildModel } from "@/lib/fill/steps/build-model";
import { Columns, integral } from "@/lib/fill/steps/columns";
import { D, X, Y, push, relGap } from "@/lib/fill/steps/context";
import { explain } from "@/lib/fill/steps/explain";
import { recheck } from "@/lib/fill/steps/recheck";
import { partnersOf, restPairsOf } from "@/lib/fill/steps/relations";
import { nothingToSolve, solve } from "@/lib/fill/steps/solve";
import type { Assignment } from "@/lib/rules/types";

const small = (seed: number, workers = 40, orders = 12) => fillScenario({ workers, orders, days: 14, seed }).problem;

describe("step 1, eligibility", () => {
  it("marks exactly the pairs the rule engine lets a worker take alone (no per-worker block)", () => {
    const problem = small(5);
    const run = createRun(problem);
    runEligibility(run);
    expect(run.ctxs.length).toBeGreaterThan(0);
    const perWorker = new Set(["CLIMB_CERT", "QUALIFIED", "OPERATOR_CERT", "RUBBER_GOODS", "UNAVAILABLE", "REST", "DOUBLE_BOOKED"]);
    const engine = createEngine(problem.snapshot);
    let pairs = 0;
    let checked = 0;
    for (const c of run.ctxs) {
      for (const p of c.open.keys()) {
        const eligible = new Set(c.eligible.get(p));
        pairs += eligible.size;
        for (const w of run.pool) {
          if (c.existingIds.has(w.id)) continue;
          // The engine's own answer: place the worker, read their per-worker blocks on this order, take them off.
          const a: Assignment = { workOrderId: c.fo.id, workerId: w.id, position: p };
          engine.apply({ kind: "add", assignment: a });
          const blocked = engine
            .findings()
            .some((f) => f.workOrderId === c.fo.id && f.workerId === w.id && perWorker.has(f.rule) && (f.level === "block" || f.locked) && !(f.rule === "QUALIFIED" && w.classification === "apprentice" && (p === "climber" || p === "aerial")));
          engine.apply({ kind: "remove", assignment: a });
          expect(eligible.has(w.id), `${w.id} as ${p} on ${c.fo.id}`).toBe(!blocked);
          checked++;
        }
      }
    }
    expect(run.eligiblePairs).toBe(pairs);
    expect(checked).toBeGreaterThan(100);
  });

  it("leaves an order with fewer eligible people than open seats as statically impossible, naming the position", () => {
    const problem = small(8);
    const run = createRun(problem);
    runEligibility(run);
    for (const c of run.ctxs) {
      const short = [...c.open].find(([p, seats]) => c.eligible.get(p)!.length < seats.length);
      if (short) expect(c.impossible?.reason).toMatch(/eligible/);
    }
    expect(run.live.every((c) => c.impossible === null)).toBe(true);
  });
});

describe("relations between orders", () => {
  it("every two overlapping live orders share a clique, and no clique holds two that do not overlap (brute force)", () => {
    const run = createRun(small(11, 60, 24));
    runEligibility(run);
    const overlap = (a: { start: number; end: number }, b: { start: number; end: number }) => a.start < b.end && b.start < a.end;
    for (const a of run.live)
      for (const b of run.live) {
        if (a === b || !overlap(a.order, b.order)) continue;
        expect(run.cliques.some((k) => k.includes(a) && k.includes(b))).toBe(true);
      }
    for (const k of run.cliques) for (const a of k) for (const b of k) if (a !== b) expect(overlap(a.order, b.order)).toBe(true);
  });

  it("pairs orders too close for the rest rule exactly when they do not overlap, are under the minimum rest apart and span over the maximum stretch", () => {
    const H = 3_600_000;
    const mk = (id: string, s: number, e: number) => ({ order: { start: s * H, end: e * H }, fo: { id } }) as never;
    const a = mk("a", 0, 8);
    const b = mk("b", 12, 20); // 4 h apart, span 20 h
    const c = mk("c", 30, 34); // 10 h after b
    const d = mk("d", 6, 10); // overlaps a
    const pairs = restPairsOf([a, b, c, d], { minRestHours: 8, maxShiftHours: 16 });
    expect(pairs).toEqual([[a, b]]);
    // d–b: 2 h apart but the span (6→20 = 14 h) is within 16 h, so no pair (the rule only bites past the stretch).
    expect(restPairsOf([d, b], { minRestHours: 8, maxShiftHours: 16 })).toEqual([]);
  });

  it("yesterday's pairs go both ways and leave out a person paired with themselves", () => {
    const p = partnersOf([["a", "b"], ["c", "c"], ["b", "d"]]);
    expect([...p.get("b")!].sort()).toEqual(["a", "d"]);
    expect(p.has("c")).toBe(false);
  });
});

describe("step 2, the model", () => {
  it("has one x column per eligible pair, a seat row per open position, and a doubling column only where the lead may take a second seat", () => {
    const run = createRun(small(5));
    runEligibility(run);
    const built = buildModel(run, run.live, { pairs: true });
    const xs = built.kind.filter((k) => k === X).length;
    expect(xs).toBe(run.live.reduce((n, c) => n + [...c.cand.values()].reduce((m, ps) => m + ps.length, 0), 0));
    expect(built.kind.filter((k) => k === Y).length).toBe(run.live.length);
    expect(built.groups.length).toBe(run.live.reduce((n, c) => n + c.open.size, 0));
    for (const [dc, [xl, nl]] of built.dLinks) {
      expect(built.kind[dc]).toBe(D);
      expect(built.kind[xl]).toBe(X);
      expect(nl.length).toBeGreaterThan(0);
    }
    // person(w,o) is Σ x − d: every term is one of the worker's own columns on that order.
    const c = run.live[0];
    const [w] = c.cand.keys();
    const terms = built.person(c.fo.id, w);
    expect(terms.filter(([, v]) => v === 1).length).toBe(c.cand.get(w)!.length);
  });
});

describe("step 3, solve: the Lagrangian bound", () => {
  it("lies between the LP relaxation and the integer optimum at the LP's duals (weak duality), on two seeds", async () => {
    for (const seed of [5, 13]) {
      const run = createRun(small(seed));
      runEligibility(run);
      const built = buildModel(run, run.live, { pairs: false });
      const cs = new Columns(built, true);
      const lp = await solveLp(built.lp, built.costA, { timeLimitSeconds: 10, gap: 0, relax: true });
      const ip = await solveLp(built.lp, built.costA, { timeLimitSeconds: 10, gap: 0 });
      expect(lp.optimal && ip.optimal).toBe(true);
      const yCols = built.ctxs.map((c) => built.y.get(c.fo.id)!);
      const groupsOf = new Map<number, number[]>();
      built.groups.forEach((g, i) => push(groupsOf, built.y.get(g.ctx.fo.id)!, i));
      const L = lagrangianBound(built, cs, built.costA, lp.duals!, yCols, groupsOf);
      expect(L).toBeGreaterThanOrEqual(lp.objective - 1e-6 * Math.max(1, Math.abs(lp.objective)));
      expect(L).toBeLessThanOrEqual(ip.objective + 1e-6 * Math.max(1, Math.abs(ip.objective)));
    }
  });

  it("integral() and relGap() say what they mean", () => {
    expect(integral(Float64Array.from([0, 1, 0.5]), Uint8Array.from([1, 1, 0]))).toBe(true);
    expect(integral(Float64Array.from([0, 1, 0.5]), Uint8Array.from([1, 1, 1]))).toBe(false);
    expect(relGap(101, 100)).toBeCloseTo(1 / 101, 12);
    expect(relGap(99, 100)).toBe(0);
  });

  it("a doubling column comes in with its seats, and its seats bring it once both sides are in", () => {
    const run = createRun(small(5));
    runEligibility(run);
    const built = buildModel(run, run.live, { pairs: false });
    const [dc, [xl, nl]] = [...built.dLinks][0];
    const cs = new Columns(built, false);
    cs.activate(xl);
    expect(cs.act[dc]).toBe(0);
    cs.activate(nl[0]);
    expect(cs.act[dc]).toBe(1);
    const cs2 = new Columns(built, false);
    cs2.activate(dc);
    expect([xl, ...nl].every((k) => cs2.act[k] === 1)).toBe(true);
  });

  it("solves a small day to a proposal the rule engine re-checks clean (column generation forced with exactUpTo 0)", async () => {
    const problem = small(21, 60, 16);
    const run = createRun(problem, { exactUpTo: 0, timeLimitSeconds: 20 });
    runEligibility(run);
    const built = buildModel(run, run.live, { pairs: true });
    run.deadline = performance.now() + 20_000;
    const solved = await solve(run, built);
    expect(solved.staffed.size).toBeGreaterThan(0);
    expect(solved.pricingRounds).toBeGreaterThan(0);
    const check = recheck(problem, run.ix, solved.staffed);
    expect(check.problems.size).toBe(0);
  });
});

describe("the re-check", () => {
  it("turns a person on two overlapping orders into a block and a cut over both placements", () => {
    const problem = small(5);
    const run = createRun(problem);
    runEligibility(run);
    // Two overlapping orders, and one person eligible on both taken onto both.
    let found: [string, string, string, string, string] | null = null;
    for (const a of run.live)
      for (const b of run.live) {
        if (a === b || !(a.order.start < b.order.end && b.order.start < a.order.end)) continue;
        for (const [w, ps] of a.cand) if (b.cand.has(w)) found ??= [a.fo.id, b.fo.id, w, ps[0], b.cand.get(w)![0]];
      }
    expect(found).not.toBeNull();
    const [oa, ob, w, pa, pb] = found!;
    const proposal = new Map<string, Assignment[]>([
      [oa, [{ workOrderId: oa, workerId: w, position: pa as never }]],
      [ob, [{ workOrderId: ob, workerId: w, position: pb as never }]],
    ]);
    const check = recheck(problem, run.ix, proposal);
    expect([...check.problems.values()].flat().some((f) => f.workerId === w)).toBe(true);
    expect(check.cuts.some((c) => c.people?.length === 2 && c.max === 1)).toBe(true);
  });
});

describe("step 5, explain", () => {
  it("counts every excluded person once in the summary and lists the closest first", async () => {
    const problem = small(5);
    const run = createRun(problem);
    runEligibility(run);
    const { openSeats } = await explain(run, nothingToSolve(run), new Map());
    expect(openSeats.length).toBeGreaterThan(0);
    for (const seat of openSeats) {
      const counted = [...seat.summary.matchAll(/(\d+) /g)].reduce((n, m) => n + Number(m[1]), 0);
      if (seat.summary && seat.summary !== "no one in the pool") expect(counted).toBe(seat.excludedCount);
      const n = seat.candidates.map((c) => c.rules.length);
      expect(n).toEqual([...n].sort((a, b) => a - b));
      expect(seat.eligibleCount + seat.excludedCount).toBeLessThanOrEqual(run.pool.length);
    }
  });
});

describe("progress and cancel", () => {
  it("reports the steps in order, and stops with FillCancelled when the signal aborts", async () => {
    const problem = small(5);
    const phases: string[] = [];
    const r = await fill(problem, { timeLimitSeconds: 10 }, { onProgress: (p) => phases.push(p.phase) });
    expect(r.proposals.length).toBeGreaterThan(0);
    const order = ["eligibility", "model", "staffing", "cost", "check", "explain"];
    const firsts = order.map((p) => phases.indexOf(p));
    expect(firsts.every((i) => i >= 0)).toBe(true);
    expect(firsts).toEqual([...firsts].sort((a, b) => a - b));

    const ac = new AbortController();
    const seen: string[] = [];
    const run = fill(problem, {}, { signal: ac.signal, onProgress: (p) => (seen.push(p.phase), p.phase === "model" && ac.abort()) });
    await expect(run).rejects.toBeInstanceOf(FillCancelled);
    expect(seen).not.toContain("staffing");
  });
});

describe("the time limit covers the whole fill", () => {
  it("leaves the explanations 15 % (at most 2 s) and the solver at least half the limit after the model (arithmetic of solverDeadline)", async () => {
    const { solverDeadline } = await import("@/lib/fill/fill");
    const s = (timeLimitSeconds: number) => ({ timeLimitSeconds }) as never;
    expect(solverDeadline({ t0: 0, s: s(10) }, 1600)).toBe(8500); // 10 s − 1.5 s
    expect(solverDeadline({ t0: 0, s: s(60) }, 1600)).toBe(58_000); // 60 s − 2 s cap
    expect(solverDeadline({ t0: 0, s: s(10) }, 7000)).toBe(12_000); // a slow start: 7 s + 5 s
    expect(solverDeadline({ t0: 0, s: s(10) }, 3000)).toBe(8500); // 3 s + 5 s is earlier than 8.5 s
  });
});

describe("explanations within the time", () => {
  it("past its deadline an open seat says it was not worked out, and no probe runs; before it, seats are explained", async () => {
    const problem = small(5);
    const run = createRun(problem);
    runEligibility(run);
    const before = run.probe.probes;
    const late = await explain(run, nothingToSolve(run), new Map(), 0);
    expect(late.openSeats.length).toBeGreaterThan(0);
    expect(late.openSeats.every((s) => s.summary === "not worked out in the time allowed" && s.candidates.length === 0)).toBe(true);
    expect(late.openSeats.every((s) => s.eligibleCount === run.ctxById.get(s.orderId)!.eligible.get(s.position)!.length)).toBe(true);
    expect(run.probe.probes).toBe(before);
    const inTime = await explain(run, nothingToSolve(run), new Map(), Infinity);
    expect(inTime.openSeats.some((s) => s.summary !== "not worked out in the time allowed")).toBe(true);
    expect(run.probe.probes).toBeGreaterThan(before);
  });

  it("the explanations' deadline is the end of the fill's time limit, or a second from now if that is later", async () => {
    const { explainDeadlineOf } = await import("@/lib/fill/steps/explain");
    const s = { timeLimitSeconds: 10 } as never;
    expect(explainDeadlineOf({ t0: 0, s }, 8500)).toBe(10_000);
    expect(explainDeadlineOf({ t0: 0, s }, 9500)).toBe(10_500);
  });
});
