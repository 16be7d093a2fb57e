/**
 * LU factorisation with partial (row) pivoting on a row-major n×n Float64Array, after Golub & Van
 * Loan, *Matrix Computations*, Algorithm 3.4.1 (Gaussian elimination with partial pivoting), for
 * the small dense systems of the small-signal and periodic analyses. Factor once, solve many
 * times; no allocation after construction.
 */
export class DenseLu {
  readonly n: number;
  /** L (unit lower, below the diagonal) and U (on and above) of P·A packed in place. */
  readonly lu: Float64Array;
  /** Row permutation: row i of P·A is row `perm[i]` of A. */
  readonly perm: Int32Array;
  private readonly work: Float64Array;
  /** A pivot smaller than this fraction of its column's largest entry counts as zero. */
  pivotTolerance = 1e-13;
  /** Column of the first zero pivot found by the last `factor`, or -1. */
  singularColumn = -1;

  constructor(n: number) {
    this.n = n;
    this.lu = new Float64Array(n * n);
    this.perm = new Int32Array(n);
    this.work = new Float64Array(n);
  }

  /**
   * Factors `a` (n×n, row-major; copied, not modified). Returns false when a pivot is zero
   * relative to its column, leaving `singularColumn` set.
   */
  factor(a: Float64Array): boolean {
    const n = this.n;
    const lu = this.lu;
    const perm = this.perm;
    lu.set(a.subarray(0, n * n));
    for (let i = 0; i < n; i++) perm[i] = i;
    this.singularColumn = -1;
    for (let k = 0; k < n; k++) {
      let pivotRow = k;
      let pivotAbs = Math.abs(lu[k * n + k]!);
      let columnMax = pivotAbs;
      for (let i = k + 1; i < n; i++) {
        const v = Math.abs(lu[i * n + k]!);
        if (v > pivotAbs) {
          pivotAbs = v;
          pivotRow = i;
        }
      }
      // Judge the pivot against the column as it was before elimination, so that a column
      // reduced to rounding noise counts as dependent.
      for (let i = 0; i < n; i++) {
        const v = Math.abs(a[i * n + k]!);
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
          const t = lu[kr + j]!;
          lu[kr + j] = lu[pr + j]!;
          lu[pr + j] = t;
        }
        const t = perm[k]!;
        perm[k] = perm[pivotRow]!;
        perm[pivotRow] = t;
      }
      const kr = k * n;
      const pivot = lu[kr + k]!;
      for (let i = k + 1; i < n; i++) {
        const ir = i * n;
        const m = lu[ir + k]! / pivot;
        if (m === 0) continue;
        lu[ir + k] = m;
        for (let j = k + 1; j < n; j++) lu[ir + j] -= m * lu[kr + j]!;
      }
    }
    return true;
  }

  /**
   * Solves A·X = B for `columns` right-hand sides at once (B and X n rows of `columns`,
   * row-major; not the same array): the substitutions of {@link solve}, each row update applied to
   * a whole row of columns.
   */
  solveColumns(b: Float64Array, x: Float64Array, columns: number): void {
    const { n, lu, perm } = this;
    for (let i = 0; i < n; i++) {
      const row = i * columns;
      const from = perm[i]! * columns;
      for (let c = 0; c < columns; c++) x[row + c] = b[from + c]!;
      for (let j = 0; j < i; j++) {
        const l = lu[i * n + j]!;
        if (l === 0) continue;
        const other = j * columns;
        for (let c = 0; c < columns; c++) x[row + c] -= l * x[other + c]!;
      }
    }
    for (let i = n - 1; i >= 0; i--) {
      const row = i * columns;
      for (let j = i + 1; j < n; j++) {
        const u = lu[i * n + j]!;
        if (u === 0) continue;
        const other = j * columns;
        for (let c = 0; c < columns; c++) x[row + c] -= u * x[other + c]!;
      }
      const pivot = lu[i * n + i]!;
      for (let c = 0; c < columns; c++) x[row + c] /= pivot;
    }
  }

  /** Solves A·x = b for the last factored A; `b` and `x` may be the same array. */
  solve(b: Float64Array, x: Float64Array): void {
    const n = this.n;
    const lu = this.lu;
    const perm = this.perm;
    const y = this.work;
    for (let i = 0; i < n; i++) {
      let s = b[perm[i]!]!;
      const ir = i * n;
      for (let j = 0; j < i; j++) s -= lu[ir + j]! * y[j]!;
      y[i] = s;
    }
    for (let i = n - 1; i >= 0; i--) {
      let s = y[i]!;
      const ir = i * n;
      for (let j = i + 1; j < n; j++) s -= lu[ir + j]! * y[j]!;
      y[i] = s / lu[ir + i]!;
    }
    x.set(y);
  }
}
