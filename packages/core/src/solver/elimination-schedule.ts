/**
 * Where the nonzeros of L and U fall for a matrix pattern eliminated in a fixed order: the
 * symbolic step of sparse Gaussian elimination (Duff, Erisman & Reid, *Direct Methods for Sparse
 * Matrices*, ch. 9), computed once and reused by every factorisation in that order. Positions are
 * flat row-major indices into the permuted, packed LU array unless stated otherwise.
 */
export class EliminationSchedule {
  /** Loading P·A·Q: lu[copyTo[e]] = a[copyFrom[e]] for the pattern's entries; fill entries start at 0. */
  readonly copyTo: Int32Array;
  readonly copyFrom: Int32Array;
  readonly fillAt: Int32Array;
  /** Column k's entries below the pivot: indices i·n + k (i > k), from lowerStart[k]. */
  readonly lowerStart: Int32Array;
  readonly lowerAt: Int32Array;
  /** Row k's entries right of the pivot, as offsets j − k (j > k), from upperStart[k]. */
  readonly upperStart: Int32Array;
  readonly upperAt: Int32Array;
  /** Row i's entries left of the diagonal: their columns j (j < i), from rowLowerStart[i]. */
  readonly rowLowerStart: Int32Array;
  readonly rowLowerCol: Int32Array;
  /** Pivot k's column in the original matrix: its structural entries, indices r·n + colOrder[k]. */
  readonly columnStart: Int32Array;
  readonly columnAt: Int32Array;

  /**
   * `pattern`: row-major, 1 where the original matrix may be nonzero; row i of P·A·Q is row
   * rowOrder[i] of A and column j is column colOrder[j].
   */
  constructor(n: number, pattern: Uint8Array, rowOrder: Int32Array, colOrder: Int32Array) {
    const filled = new Uint8Array(n * n);
    const copyTo: number[] = [];
    const copyFrom: number[] = [];
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        const from = rowOrder[i]! * n + colOrder[j]!;
        if (!pattern[from]) continue;
        filled[i * n + j] = 1;
        copyTo.push(i * n + j);
        copyFrom.push(from);
      }
    }
    for (let k = 0; k < n; k++) {
      for (let i = k + 1; i < n; i++) {
        if (!filled[i * n + k]) continue;
        for (let j = k + 1; j < n; j++) if (filled[k * n + j]) filled[i * n + j] = 1;
      }
    }
    const fill: number[] = [];
    for (let k = 0; k < n * n; k++) if (filled[k] && !pattern[rowOrder[(k / n) | 0]! * n + colOrder[k % n]!]) fill.push(k);
    this.copyTo = Int32Array.from(copyTo);
    this.copyFrom = Int32Array.from(copyFrom);
    this.fillAt = Int32Array.from(fill);
    const lower: number[] = [];
    const upper: number[] = [];
    const rowLower: number[] = [];
    const column: number[] = [];
    this.lowerStart = new Int32Array(n + 1);
    this.upperStart = new Int32Array(n + 1);
    this.rowLowerStart = new Int32Array(n + 1);
    this.columnStart = new Int32Array(n + 1);
    for (let k = 0; k < n; k++) {
      this.lowerStart[k] = lower.length;
      for (let i = k + 1; i < n; i++) if (filled[i * n + k]) lower.push(i * n + k);
      this.upperStart[k] = upper.length;
      for (let j = k + 1; j < n; j++) if (filled[k * n + j]) upper.push(j - k);
      this.rowLowerStart[k] = rowLower.length;
      for (let j = 0; j < k; j++) if (filled[k * n + j]) rowLower.push(j);
      this.columnStart[k] = column.length;
      const c = colOrder[k]!;
      for (let r = 0; r < n; r++) if (pattern[r * n + c]) column.push(r * n + c);
    }
    this.lowerStart[n] = lower.length;
    this.upperStart[n] = upper.length;
    this.rowLowerStart[n] = rowLower.length;
    this.columnStart[n] = column.length;
    this.lowerAt = Int32Array.from(lower);
    this.upperAt = Int32Array.from(upper);
    this.rowLowerCol = Int32Array.from(rowLower);
    this.columnAt = Int32Array.from(column);
  }
}
