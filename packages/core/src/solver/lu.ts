import { compileElimination, type CompiledElimination } from "./compiled-elimination.js";
import { EliminationSchedule } from "./elimination-schedule.js";
import { markowitzOrder } from "./markowitz.js";

/**
 * Threshold for keeping the previous pivot order: a pivot at least this fraction of the largest
 * entry below it in its column (threshold partial pivoting; Duff, Erisman & Reid, *Direct Methods
 * for Sparse Matrices*, §4.4) bounds element growth almost as well as choosing the largest.
 */
const KEEP_PIVOT = 0.1;

/** A factorisation as a snapshot keeps it: the pattern, the pivot order and the packed factors. */
export interface LuState {
  readonly pattern: Uint8Array | undefined;
  /** Whether the factors follow the sparse schedule of that order (else dense partial pivoting). */
  readonly scheduled: boolean;
  readonly perm: Int32Array;
  readonly colPerm: Int32Array;
  readonly lu: Float64Array;
}

/**
 * LU factorisation with partial (row) pivoting on a row-major Float64Array, after Golub & Van
 * Loan, *Matrix Computations*, Algorithm 3.4.1 (Gaussian elimination with partial pivoting).
 * Factor once, solve many times; no allocation after construction.
 *
 * Given the matrix's structural pattern (`setPattern`), pivots are chosen for sparsity as well
 * (Markowitz with threshold pivoting, rows and columns permuted: P·A·Q = L·U), and the order and
 * the nonzeros of L and U are remembered: the next factorisations reuse both, and elimination
 * and solves visit only those nonzeros. The order is kept while every pivot stays above
 * KEEP_PIVOT of its column; otherwise it is chosen afresh. Without a pattern, or when the sparse
 * ordering finds no pivot, the dense factorisation with partial pivoting is used.
 */
export class LuSolver {
  readonly n: number;
  /** L (unit lower, below the diagonal) and U (on and above) of P·A·Q packed in place. */
  readonly lu: Float64Array;
  /** Row permutation: row i of P·A·Q is row `perm[i]` of A. */
  readonly perm: Int32Array;
  /** Column permutation: column j of P·A·Q is column `colPerm[j]` of A (identity when dense). */
  readonly colPerm: Int32Array;
  private readonly work: Float64Array;
  /** A pivot smaller than this fraction of its column's largest entry counts as zero. */
  pivotTolerance = 1e-13;
  /** Column of the first zero pivot found by the last `factor`, or -1. */
  singularColumn = -1;
  /** Factorisations that chose their pivots afresh (the rest reused an order). */
  pivotings = 0;
  private pattern: Uint8Array | undefined;
  private schedule: EliminationSchedule | undefined;
  private compiled: CompiledElimination | undefined;

  /** Whether sparse schedules are turned into straight-line code (see compiled-elimination.ts). */
  private readonly compile: boolean;

  constructor(n: number, options: { readonly compile?: boolean } = {}) {
    this.n = n;
    this.compile = options.compile ?? true;
    this.lu = new Float64Array(n * n);
    this.perm = new Int32Array(n);
    this.colPerm = new Int32Array(n);
    this.work = new Float64Array(n);
  }

  /**
   * Declares which entries of the matrices to come may be nonzero (row-major, 1 = may be);
   * entries outside it must be zero. The next factorisation chooses its pivots afresh.
   */
  setPattern(pattern: Uint8Array): void {
    this.pattern = pattern;
    this.schedule = undefined;
    this.compiled = undefined;
  }

  /**
   * Factors `a` (n×n, row-major; copied, not modified). Returns false when a pivot is zero
   * relative to its column, leaving `singularColumn` set.
   */
  factor(a: Float64Array): boolean {
    if (this.schedule && this.refactor(a)) return true;
    this.pivotings++;
    this.schedule = undefined;
    this.compiled = undefined;
    const pattern = this.pattern;
    if (pattern && markowitzOrder(a, this.n, pattern, KEEP_PIVOT, this.pivotTolerance, this.perm, this.colPerm)) {
      this.schedule = new EliminationSchedule(this.n, pattern, this.perm, this.colPerm);
      if (this.compile) this.compiled = compileElimination(this.schedule, this.n, this.perm, this.colPerm);
      if (this.refactor(a)) return true;
      this.schedule = undefined;
      this.compiled = undefined;
    }
    return this.factorDense(a);
  }

  /** Elimination in the remembered order over the remembered nonzeros; false when a pivot got too small. */
  private refactor(a: Float64Array): boolean {
    if (this.compiled) {
      if (!this.compiled.refactor(a, this.lu, KEEP_PIVOT, this.pivotTolerance)) return false;
      this.singularColumn = -1;
      return true;
    }
    const { n, lu } = this;
    const s = this.schedule!;
    const { copyTo, copyFrom, fillAt, lowerStart, lowerAt, upperStart, upperAt, columnStart, columnAt } = s;
    for (let e = 0; e < copyTo.length; e++) lu[copyTo[e]!] = a[copyFrom[e]!]!;
    for (let e = 0; e < fillAt.length; e++) lu[fillAt[e]!] = 0;
    for (let k = 0; k < n; k++) {
      const kk = k * n + k;
      const pivot = lu[kk]!;
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
        // Entry (i, j) sits at ik + (j − k); the upper offsets are stored relative to (k, k).
        for (let u = uStart; u < uEnd; u++) {
          const d = upperAt[u]!;
          lu[ik + d] -= m * lu[kk + d]!;
        }
      }
    }
    this.singularColumn = -1;
    return true;
  }

  private factorDense(a: Float64Array): boolean {
    const n = this.n;
    const lu = this.lu;
    const perm = this.perm;
    lu.set(a.subarray(0, n * n));
    for (let i = 0; i < n; i++) perm[i] = i;
    for (let j = 0; j < n; j++) this.colPerm[j] = j;
    this.singularColumn = -1;
    for (let k = 0; k < n; k++) {
      let pivotRow = k;
      let pivotAbs = Math.abs(lu[k * n + k]);
      let columnMax = pivotAbs;
      for (let i = k + 1; i < n; i++) {
        const v = Math.abs(lu[i * n + k]);
        if (v > pivotAbs) {
          pivotAbs = v;
          pivotRow = i;
        }
      }
      // Judge the pivot against the column as it was before elimination, so that a column
      // reduced to rounding noise counts as dependent.
      for (let i = 0; i < n; i++) {
        const v = Math.abs(a[i * n + k]);
        if (v > columnMax) columnMax = v;
      }
      if (!(pivotAbs > this.pivotTolerance * columnMax) || pivotAbs === 0) {
        this.singularColumn = k;
        return false;
      }
      if (pivotRow !== k) {
        const kr = k * n;
        const pr = pivotRow * n;
        for (let j = 0; j < n; j++) {
          const t = lu[kr + j];
          lu[kr + j] = lu[pr + j];
          lu[pr + j] = t;
        }
        const t = perm[k];
        perm[k] = perm[pivotRow];
        perm[pivotRow] = t;
      }
      const kr = k * n;
      const pivot = lu[kr + k];
      for (let i = k + 1; i < n; i++) {
        const ir = i * n;
        const m = lu[ir + k] / pivot;
        if (m === 0) continue;
        lu[ir + k] = m;
        for (let j = k + 1; j < n; j++) lu[ir + j] -= m * lu[kr + j];
      }
    }
    return true;
  }

  /** Solves A·x = b for the last factored A; `b` and `x` may be the same array. */
  solve(b: Float64Array, x: Float64Array): void {
    if (this.schedule) {
      this.solveSparse(b, x, 1);
      return;
    }
    const n = this.n;
    const lu = this.lu;
    const perm = this.perm;
    const y = this.work;
    for (let i = 0; i < n; i++) {
      let s = b[perm[i]];
      const ir = i * n;
      for (let j = 0; j < i; j++) s -= lu[ir + j] * y[j];
      y[i] = s;
    }
    for (let i = n - 1; i >= 0; i--) {
      let s = y[i];
      const ir = i * n;
      for (let j = i + 1; j < n; j++) s -= lu[ir + j] * y[j];
      y[i] = s / lu[ir + i];
    }
    x.set(y);
  }

  /** Solves A·x = −b (the Newton update from a residual); `b` and `x` may be the same array. */
  solveNegated(b: Float64Array, x: Float64Array): void {
    if (this.schedule) {
      this.solveSparse(b, x, -1);
      return;
    }
    this.solve(b, x);
    for (let i = 0; i < this.n; i++) x[i] = -x[i]!;
  }

  private solveSparse(b: Float64Array, x: Float64Array, sign: number): void {
    if (this.compiled) {
      this.compiled.solve(this.lu, b, x, sign);
      return;
    }
    const { n, lu, perm, colPerm, work: y } = this;
    const { rowLowerStart, rowLowerCol, upperStart, upperAt } = this.schedule!;
    for (let i = 0; i < n; i++) {
      let s = b[perm[i]!]!;
      const ir = i * n;
      const end = rowLowerStart[i + 1]!;
      for (let e = rowLowerStart[i]!; e < end; e++) {
        const j = rowLowerCol[e]!;
        s -= lu[ir + j]! * y[j]!;
      }
      y[i] = s;
    }
    for (let i = n - 1; i >= 0; i--) {
      let s = y[i]!;
      const ii = i * n + i;
      const end = upperStart[i + 1]!;
      for (let u = upperStart[i]!; u < end; u++) {
        const d = upperAt[u]!;
        s -= lu[ii + d]! * y[i + d]!;
      }
      y[i] = s / lu[ii]!;
    }
    for (let j = 0; j < n; j++) x[colPerm[j]!] = sign * y[j]!;
  }

  state(): LuState {
    return {
      pattern: this.pattern && Uint8Array.from(this.pattern),
      scheduled: this.schedule !== undefined,
      perm: Int32Array.from(this.perm),
      colPerm: Int32Array.from(this.colPerm),
      lu: Float64Array.from(this.lu),
    };
  }

  /** Continues from a snapshot's factorisation: same order, same schedule, same factors. */
  restore(state: LuState): void {
    this.pattern = state.pattern && Uint8Array.from(state.pattern);
    this.perm.set(state.perm);
    this.colPerm.set(state.colPerm);
    this.lu.set(state.lu);
    this.schedule = undefined;
    this.compiled = undefined;
    if (state.scheduled && this.pattern) {
      this.schedule = new EliminationSchedule(this.n, this.pattern, this.perm, this.colPerm);
      if (this.compile) this.compiled = compileElimination(this.schedule, this.n, this.perm, this.colPerm);
    }
  }
}
