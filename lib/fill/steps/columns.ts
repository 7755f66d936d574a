// Which columns HiGHS sees. Small days: every column. Big days (more than `exactUpTo` eligible
// pairs): a restricted set that grows (column generation); a doubling column comes in with its
// seats, and a pair bonus only when both people's seats are in.

import { columns as columnView } from "../highs";
import { D, G, X, Y, Z, type Built } from "./context";

export class Columns {
  readonly n: number;
  /** 1 = the column is in the restricted model. */
  readonly act: Uint8Array;
  /** Columns switched on since the growing LP last took them. */
  readonly pending: number[] = [];
  private csc: ReturnType<typeof columnView>;
  private cscRows: number;

  constructor(
    readonly full: Built,
    /** Every column at once (no pricing). */
    readonly exact: boolean,
  ) {
    this.n = full.lp.numCols;
    this.act = new Uint8Array(this.n);
    for (let j = 0; j < this.n; j++) if (full.kind[j] === Y || full.kind[j] === G || (exact && full.kind[j] !== Z)) this.on(j);
    this.csc = columnView(full.lp);
    this.cscRows = full.lp.numRows;
  }

  private on(j: number) {
    if (this.act[j]) return;
    this.act[j] = 1;
    this.pending.push(j);
  }

  /** Switches a column on (a seat brings its doubling column once both of its sides are in; a doubling column brings its seats). */
  activate = (j: number): boolean => {
    const { act, full } = this;
    if (act[j]) return false;
    this.on(j);
    if (full.kind[j] === X) {
      const dc = full.dOfX.get(j);
      if (dc !== undefined && !act[dc]) {
        const [xl, nl] = full.dLinks.get(dc)!;
        if (act[xl] && nl.some((k) => act[k])) this.on(dc);
      }
    } else if (full.kind[j] === D) {
      const [xl, nl] = full.dLinks.get(j)!;
      this.on(xl);
      for (const k of nl) this.on(k);
    }
    return true;
  };

  /** The model's matrix by column (rebuilt when cuts added rows). */
  view() {
    if (this.cscRows !== this.full.lp.numRows) {
      this.csc = columnView(this.full.lp);
      this.cscRows = this.full.lp.numRows;
    }
    return this.csc;
  }

  /** The active columns plus each pair bonus whose two people both have a seat in. */
  withPairs(base: Uint8Array = this.act): Uint8Array {
    const a = Uint8Array.from(base);
    for (const [z, [xa, xb]] of this.full.zLinks) if (xa.some((k) => base[k]) && xb.some((k) => base[k])) a[z] = 1;
    return a;
  }

  /** Every active column to be (re)loaded into a new growing LP. */
  reloadAll() {
    this.pending.splice(0);
    for (let j = 0; j < this.n; j++) if (this.act[j]) this.pending.push(j);
  }

  count(kind?: number): number {
    let m = 0;
    for (let j = 0; j < this.n; j++) if (this.act[j] && (kind === undefined || this.full.kind[j] === kind)) m++;
    return m;
  }
}

/** Every active column at 0 or 1 (within 1e-6). */
export function integral(v: Float64Array, active: Uint8Array): boolean {
  for (let j = 0; j < v.length; j++) {
    if (!active[j]) continue;
    const x = v[j];
    if (x > 1e-6 && x < 1 - 1e-6) return false;
  }
  return true;
}
