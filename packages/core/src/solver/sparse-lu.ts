import { DenseLu } from "./dense-lu.js";
import { markowitzOrder } from "./markowitz.js";
import { planOf, type Plan } from "./plan-cache.js";

/**
 * Threshold for keeping the previous pivot order: a pivot at least this fraction of the largest
 * entry below it in its column (threshold partial pivoting; Duff, Erisman & Reid, *Direct Methods
 * for Sparse Matrices*, §4.4) bounds element growth almost as well as choosing the largest.
 */
export const KEEP_PIVOT = 0.1;

/**
 * Up to this size a matrix the sparse ordering finds singular is tried once more with dense
 * partial pivoting, which names the first dependent column in the natural order (and factors
 * the rare matrix whose only usable pivots the threshold rule turned down). Beyond it the n²
 * storage would outgrow the circuit.
 */
const DENSE_LIMIT = 400;

/**
 * Pivot orders kept for reuse. A circuit's devices swing between a few operating regions (a
 * diode conducting or not, an amplifier in its linear range or at a rail), and an order that
 * failed the threshold test in one region usually serves again when the circuit comes back to it;
 * trying the kept ones costs a refactorisation each, far less than ordering afresh.
 */
const KEPT_ORDERS = 4;

/** A factorisation as a snapshot keeps it: the kept pivot orders and the packed factors. */
export interface SparseLuState {
  /** Whether the factors follow the first kept order's schedule (else the dense fallback's). */
  readonly scheduled: boolean;
  /** The kept orders, the one in use first. */
  readonly orders: readonly { readonly rowOrder: Int32Array; readonly colOrder: Int32Array }[];
  readonly lu: Float64Array;
  /** The dense fallback's factors and row order, when it factored. */
  readonly dense: { readonly lu: Float64Array; readonly perm: Int32Array } | undefined;
}

/**
 * Sparse LU (P·A·Q = L·U) of matrices with a fixed set of structural entries, as the Newton
 * matrix of a circuit: the caller writes the entries' values into `a` (entry e at a[e], in the
 * order given to the constructor) and calls `factor`. The pivot order is chosen by the
 * Markowitz criterion with threshold pivoting (markowitz.ts) on the first factorisation and kept
 * while every pivot stays above KEEP_PIVOT of its column; only when one fails (and none of the
 * last KEPT_ORDERS orders serves either) is it chosen afresh.
 * The elimination in a kept order visits only the nonzeros of L and U (elimination-schedule.ts),
 * as straight-line code for small circuits (compiled-elimination.ts). No n×n storage.
 */
export class SparseLu {
  readonly n: number;
  /** The matrix's entry values, written by the caller before each `factor`. */
  readonly a: Float64Array;
  readonly rows: Int32Array;
  readonly cols: Int32Array;
  /** A pivot smaller than this fraction of its column's largest entry counts as zero. */
  pivotTolerance = 1e-13;
  /** Original column of the first zero pivot found by the last `factor`, or −1. */
  singularColumn = -1;
  /** Factorisations that chose their pivots afresh (the rest reused an order). */
  pivotings = 0;
  /** The order in use (undefined: none, or the dense fallback's), and the kept ones, most recent first. */
  private current: Plan | undefined;
  private plans: Plan[] = [];
  private lu = new Float64Array(0);
  private readonly work: Float64Array;
  private dense: DenseLu | undefined;
  private denseFactored = false;
  private readonly compile: boolean;

  /** `rows[e]`, `cols[e]`: the structural entries, each position at most once. */
  constructor(n: number, rows: Int32Array, cols: Int32Array, options: { readonly compile?: boolean } = {}) {
    if (rows.length !== cols.length) throw new RangeError("SparseLu: rows and cols differ in length");
    this.n = n;
    this.rows = rows;
    this.cols = cols;
    this.a = new Float64Array(rows.length);
    this.work = new Float64Array(n);
    this.compile = options.compile ?? true;
  }

  /** Row i of P·A·Q is row rowOrder[i] of A (of the order in use). */
  get rowOrder(): Int32Array {
    return this.current?.rowOrder ?? new Int32Array(0);
  }

  /** Column j of P·A·Q is column colOrder[j] of A (of the order in use). */
  get colOrder(): Int32Array {
    return this.current?.colOrder ?? new Int32Array(0);
  }

  /** Entries of L and U (with the pattern's own), or 0 before the first sparse factorisation. */
  get factorSize(): number {
    return this.current?.schedule.slots ?? 0;
  }

  /** Factors the matrix in `a`. Returns false when it is singular, leaving `singularColumn` set. */
  factor(): boolean {
    this.singularColumn = -1;
    this.denseFactored = false;
    const current = this.current;
    if (current !== undefined && this.refactor(current)) return true;
    return this.factorOtherwise(current);
  }

  /**
   * The kept orders other than `current`, else a fresh order, else the dense fallback. Apart from
   * `factor` so that the common path stays small enough for the JIT to inline into the Newton
   * loop (with room left for the devices' code there).
   */
  private factorOtherwise(current: Plan | undefined): boolean {
    for (const p of this.plans) if (p !== current && this.refactor(p)) return this.use(p);
    this.pivotings++;
    this.current = undefined;
    const rowOrder = new Int32Array(this.n);
    const colOrder = new Int32Array(this.n);
    const stuck = markowitzOrder(this.n, this.rows, this.cols, this.a, KEEP_PIVOT, this.pivotTolerance, rowOrder, colOrder);
    if (stuck < 0) {
      const p = this.plan(rowOrder, colOrder);
      if (this.refactor(p)) return this.use(p);
    }
    if (this.n > DENSE_LIMIT) {
      this.singularColumn = Math.max(stuck, 0);
      return false;
    }
    return this.factorDense();
  }

  /** Makes p the order in use and the most recent kept one. */
  private use(p: Plan): true {
    this.current = p;
    this.plans = [p, ...this.plans.filter((q) => q !== p)].slice(0, KEPT_ORDERS);
    return true;
  }

  private plan(rowOrder: Int32Array, colOrder: Int32Array): Plan {
    const p = planOf(this.n, this.rows, this.cols, rowOrder, colOrder, this.compile);
    if (this.lu.length < p.schedule.slots) this.lu = new Float64Array(p.schedule.slots);
    return p;
  }

  private factorDense(): boolean {
    const n = this.n;
    this.dense ??= new DenseLu(n);
    this.dense.pivotTolerance = this.pivotTolerance;
    const full = new Float64Array(n * n);
    for (let e = 0; e < this.a.length; e++) full[this.rows[e]! * n + this.cols[e]!] = this.a[e]!;
    this.denseFactored = this.dense.factor(full);
    this.singularColumn = this.dense.singularColumn;
    return this.denseFactored;
  }

  /** Elimination in a kept order over its nonzeros; false when a pivot got too small. */
  private refactor(p: Plan): boolean {
    const compiled = p.compiled;
    return compiled !== undefined ? compiled.refactor(this.a, this.lu, KEEP_PIVOT, this.pivotTolerance) : this.refactorByLoops(p);
  }

  private refactorByLoops(p: Plan): boolean {
    const { a, lu } = this;
    const s = p.schedule;
    const { pivotAt, lowerStart, lowerAt, upperStart, upperAt, updateAt, columnStart, columnAt } = s;
    lu.set(a);
    lu.fill(0, s.entries, s.slots);
    let t = 0;
    for (let k = 0; k < this.n; k++) {
      const pivot = lu[pivotAt[k]!]!;
      const pivotAbs = Math.abs(pivot);
      let below = 0;
      const lEnd = lowerStart[k + 1]!;
      for (let e = lowerStart[k]!; e < lEnd; e++) {
        const v = Math.abs(lu[lowerAt[e]!]!);
        if (v > below) below = v;
      }
      let original = 0;
      const cEnd = columnStart[k + 1]!;
      for (let e = columnStart[k]!; e < cEnd; e++) {
        const v = Math.abs(a[columnAt[e]!]!);
        if (v > original) original = v;
      }
      if (!(pivotAbs >= KEEP_PIVOT * below) || !(pivotAbs > this.pivotTolerance * original)) return false;
      const uStart = upperStart[k]!;
      const uEnd = upperStart[k + 1]!;
      for (let e = lowerStart[k]!; e < lEnd; e++) {
        const ik = lowerAt[e]!;
        const m = lu[ik]! / pivot;
        lu[ik] = m;
        for (let u = uStart; u < uEnd; u++) lu[updateAt[t++]!] -= m * lu[upperAt[u]!]!;
      }
    }
    return true;
  }

  /** Solves A·x = b for the last factored A; `b` and `x` may be the same array. */
  solve(b: Float64Array, x: Float64Array): void {
    this.solveSigned(b, x, 1);
  }

  /** Solves A·x = −b (the Newton update from a residual); `b` and `x` may be the same array. */
  solveNegated(b: Float64Array, x: Float64Array): void {
    this.solveSigned(b, x, -1);
  }

  // Kept small (see factorOtherwise): the generated code's call, everything else apart.
  private solveSigned(b: Float64Array, x: Float64Array, sign: number): void {
    const compiled = this.denseFactored ? undefined : this.current!.compiled;
    if (compiled !== undefined) compiled.solve(this.lu, b, x, sign);
    else this.solveByLoops(b, x, sign);
  }

  private solveByLoops(b: Float64Array, x: Float64Array, sign: number): void {
    if (this.denseFactored) {
      this.dense!.solve(b, x);
      if (sign < 0) for (let i = 0; i < this.n; i++) x[i] = -x[i]!;
      return;
    }
    const p = this.current!;
    const { n, lu, work: y } = this;
    const { rowOrder, colOrder } = p;
    const { rowLowerStart, rowLowerAt, rowLowerCol, upperStart, upperAt, upperCol, pivotAt } = p.schedule;
    for (let i = 0; i < n; i++) {
      let s = b[rowOrder[i]!]!;
      const end = rowLowerStart[i + 1]!;
      for (let e = rowLowerStart[i]!; e < end; e++) s -= lu[rowLowerAt[e]!]! * y[rowLowerCol[e]!]!;
      y[i] = s;
    }
    for (let i = n - 1; i >= 0; i--) {
      let s = y[i]!;
      const end = upperStart[i + 1]!;
      for (let u = upperStart[i]!; u < end; u++) s -= lu[upperAt[u]!]! * y[upperCol[u]!]!;
      y[i] = s / lu[pivotAt[i]!]!;
    }
    for (let j = 0; j < n; j++) x[colOrder[j]!] = sign * y[j]!;
  }

  /** The factors' entry at row i, column j of P·A·Q (L below the diagonal, U on and above), for checks. */
  factorEntry(i: number, j: number): number {
    const s = this.current?.schedule;
    if (!s) throw new RangeError("SparseLu.factorEntry: no sparse factorisation");
    if (i > j) {
      for (let e = s.rowLowerStart[i]!; e < s.rowLowerStart[i + 1]!; e++) if (s.rowLowerCol[e] === j) return this.lu[s.rowLowerAt[e]!]!;
      return 0;
    }
    if (i === j) return this.lu[s.pivotAt[i]!]!;
    for (let u = s.upperStart[i]!; u < s.upperStart[i + 1]!; u++) if (s.upperCol[u] === j) return this.lu[s.upperAt[u]!]!;
    return 0;
  }

  /** Whether the last factorisation followed a sparse schedule (else the dense fallback). */
  get scheduled(): boolean {
    return this.current !== undefined && !this.denseFactored;
  }

  state(): SparseLuState {
    const current = this.scheduled ? this.current : undefined;
    return {
      scheduled: current !== undefined,
      orders: (current ? [current, ...this.plans.filter((p) => p !== current)] : this.plans).map((p) => ({
        rowOrder: Int32Array.from(p.rowOrder),
        colOrder: Int32Array.from(p.colOrder),
      })),
      lu: current ? this.lu.slice(0, current.schedule.slots) : new Float64Array(0),
      dense: this.denseFactored ? { lu: Float64Array.from(this.dense!.lu), perm: Int32Array.from(this.dense!.perm) } : undefined,
    };
  }

  /** Continues from a snapshot's factorisation: same kept orders, same schedules, same factors. */
  restore(state: SparseLuState): void {
    this.plans = state.orders.map((o) => this.plan(Int32Array.from(o.rowOrder), Int32Array.from(o.colOrder)));
    this.current = state.scheduled ? this.plans[0] : undefined;
    this.denseFactored = false;
    if (state.dense) {
      this.dense ??= new DenseLu(this.n);
      this.dense.lu.set(state.dense.lu);
      this.dense.perm.set(state.dense.perm);
      this.denseFactored = true;
    }
    if (this.current) this.lu.set(state.lu);
  }
}
