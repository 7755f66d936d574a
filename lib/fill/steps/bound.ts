// The lower bound that makes the gap honest on big days: a Lagrangian bound over every column,
// including those the restricted LP never saw.

import { Y, Z, type Built } from "./context";
import type { Columns } from "./columns";

/**
 * Every row but the seat rows priced at the LP's duals π, the seat rows kept. Each order then
 * costs min over y of y·(rc(y) + the k cheapest reduced costs of each of its seat groups);
 * other columns min(0, rc). Valid for any sign-consistent π (weak duality), so for the LP over
 * every pair and the integer program.
 */
export function lagrangianBound(
  full: Built,
  cs: Columns,
  cost: Float64Array,
  pi: Float64Array,
  yCols: readonly number[],
  groupsOfOrder: Map<number, number[]>,
  fixY?: Map<number, number>,
): number {
  const { start, row, val } = cs.view();
  const n = cs.n;
  let L = 0;
  for (let r = 0; r < full.lp.numRows; r++) {
    if (full.seatRow[r] || pi[r] === 0) continue;
    const v = pi[r];
    const bound = v > 0 ? full.lp.rowLo[r] : full.lp.rowHi[r];
    if (!Number.isFinite(bound)) {
      if (Math.abs(v) > 1e-9) return -Infinity;
      continue;
    }
    L += v * bound;
  }
  const rcs = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    if (full.kind[j] === Z) continue; // pair bonuses: left out of the bound (phases.ts compares without them)
    let rc = cost[j];
    for (let e = start[j]; e < start[j + 1]; e++) if (!full.seatRow[row[e]]) rc -= val[e] * pi[row[e]];
    rcs[j] = rc;
  }
  const inGroup = inGroupOf(full, n);
  for (const yc of yCols) {
    let term = rcs[yc];
    for (const g of groupsOfOrder.get(yc) ?? []) {
      const k = full.groups[g].ctx.open.get(full.groups[g].p)!.length;
      const vals = full.groupCols[g].map((j) => rcs[j]).sort((a, b) => a - b);
      if (vals.length < k) {
        term = Infinity; // cannot be staffed at all
        break;
      }
      for (let i = 0; i < k; i++) term += vals[i];
    }
    const lo = fixY?.has(yc) ? fixY.get(yc)! : full.lp.lower[yc];
    const hi = fixY?.has(yc) ? fixY.get(yc)! : full.lp.upper[yc];
    L += term === Infinity ? (lo > 0 ? Infinity : 0) : Math.min(term * lo, term * hi);
  }
  for (let j = 0; j < n; j++) {
    const k = full.kind[j];
    if (k === Y || k === Z || inGroup[j]) continue;
    L += Math.min(rcs[j] * full.lp.lower[j], rcs[j] * full.lp.upper[j]);
  }
  return L;
}

const inGroupCache = new WeakMap<Built, Uint8Array>();
/** 1 for the seat columns (those in a seat group); the same for every bound of one model. */
function inGroupOf(full: Built, n: number): Uint8Array {
  let m = inGroupCache.get(full);
  if (!m || m.length !== n) {
    m = new Uint8Array(n);
    for (const cols of full.groupCols) for (const j of cols) m[j] = 1;
    inGroupCache.set(full, m);
  }
  return m;
}
