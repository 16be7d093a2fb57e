import { DenseLu } from "./dense-lu.js";
import { SparseLu } from "./sparse-lu.js";

/**
 * LU solver of n×n row-major matrices for the analyses that build them dense (small-signal,
 * periodic, noise): partial pivoting (dense-lu.ts), or, once the matrices' structural pattern is
 * declared (`setPattern`), the sparse factorisation with a kept Markowitz order (sparse-lu.ts),
 * which then reads only the pattern's entries of each matrix. Factor once, solve many times.
 */
export class LuSolver {
  readonly n: number;
  private readonly dense: DenseLu;
  private sparse: SparseLu | undefined;
  /** Flat row-major index of each of the sparse solver's entries. */
  private gather = new Int32Array(0);
  private denseFactorings = 0;
  private usingSparse = false;
  /** A pivot smaller than this fraction of its column's largest entry counts as zero. */
  pivotTolerance = 1e-13;
  /** Column of the first zero pivot found by the last `factor`, or -1. */
  singularColumn = -1;
  /** Whether sparse schedules are turned into straight-line code (see compiled-elimination.ts). */
  private readonly compile: boolean;

  constructor(n: number, options: { readonly compile?: boolean } = {}) {
    this.n = n;
    this.compile = options.compile ?? true;
    this.dense = new DenseLu(n);
  }

  /** Factorisations that chose their pivots afresh (the rest reused an order). */
  get pivotings(): number {
    return this.sparse ? this.sparse.pivotings : this.denseFactorings;
  }

  /**
   * Declares which entries of the matrices to come may be nonzero (row-major, 1 = may be);
   * entries outside it must be zero. The next factorisation chooses its pivots afresh.
   */
  setPattern(pattern: Uint8Array): void {
    const n = this.n;
    const at: number[] = [];
    for (let k = 0; k < n * n; k++) if (pattern[k]) at.push(k);
    this.gather = Int32Array.from(at);
    const rows = Int32Array.from(at, (k) => Math.floor(k / n));
    const cols = Int32Array.from(at, (k) => k % n);
    this.sparse = new SparseLu(n, rows, cols, { compile: this.compile });
  }

  /**
   * Factors `a` (n×n, row-major; not modified). Returns false when a pivot is zero relative to
   * its column, leaving `singularColumn` set.
   */
  factor(a: Float64Array): boolean {
    const sparse = this.sparse;
    if (sparse) {
      const { gather } = this;
      const values = sparse.a;
      for (let e = 0; e < gather.length; e++) values[e] = a[gather[e]!]!;
      sparse.pivotTolerance = this.pivotTolerance;
      this.usingSparse = true;
      const ok = sparse.factor();
      this.singularColumn = sparse.singularColumn;
      return ok;
    }
    this.usingSparse = false;
    this.denseFactorings++;
    this.dense.pivotTolerance = this.pivotTolerance;
    const ok = this.dense.factor(a);
    this.singularColumn = this.dense.singularColumn;
    return ok;
  }

  /** Solves A·x = b for the last factored A; `b` and `x` may be the same array. */
  solve(b: Float64Array, x: Float64Array): void {
    if (this.usingSparse) this.sparse!.solve(b, x);
    else this.dense.solve(b, x);
  }

  /** Solves A·x = −b (the Newton update from a residual); `b` and `x` may be the same array. */
  solveNegated(b: Float64Array, x: Float64Array): void {
    if (this.usingSparse) {
      this.sparse!.solveNegated(b, x);
      return;
    }
    this.dense.solve(b, x);
    for (let i = 0; i < this.n; i++) x[i] = -x[i]!;
  }
}
