/**
 * Most multiply-adds a schedule may hold (its update targets take 4 bytes each): beyond it the
 * factors of the circuit would not fit in a bounded memory, and the schedule is refused.
 */
export const MAX_SCHEDULE_OPERATIONS = 50_000_000;

/**
 * Where the nonzeros of L and U fall for a matrix pattern eliminated in a fixed order, and which
 * operations the elimination performs: the symbolic step of sparse Gaussian elimination (Duff,
 * Erisman & Reid, *Direct Methods for Sparse Matrices*, ch. 9), computed once per order and
 * reused by every factorisation in it.
 *
 * The factors live in one packed array of slots: slot e < entries is the pattern's entry e (so a
 * matrix is loaded by copying its entry values in, whatever the order), the fill follows. Indices
 * i, j, k below are of the permuted matrix P·A·Q. Memory is linear in the entries, the fill and
 * the elimination's operations.
 */
export class EliminationSchedule {
  /** Pattern entries (slots 0..entries−1) plus fill. */
  readonly slots: number;
  readonly entries: number;
  /** Slot of pivot (k, k). */
  readonly pivotAt: Int32Array;
  /** Column k's entries below the pivot: their slots, from lowerStart[k]. */
  readonly lowerStart: Int32Array;
  readonly lowerAt: Int32Array;
  /** Row k's entries right of the pivot: their slots and columns, from upperStart[k]. */
  readonly upperStart: Int32Array;
  readonly upperAt: Int32Array;
  readonly upperCol: Int32Array;
  /**
   * The updates lu[(i, j)] −= l(i, k)·u(k, j): for each k, each lower entry in order, each upper
   * entry in order, the slot of (i, j).
   */
  readonly updateAt: Int32Array;
  /** Row i's entries left of the diagonal: their slots and columns, from rowLowerStart[i]. */
  readonly rowLowerStart: Int32Array;
  readonly rowLowerAt: Int32Array;
  readonly rowLowerCol: Int32Array;
  /** Pivot k's column in the original matrix: the pattern entries in it, from columnStart[k]. */
  readonly columnStart: Int32Array;
  readonly columnAt: Int32Array;

  /**
   * `rows[e]`, `cols[e]`: the pattern's entries; row i of P·A·Q is row rowOrder[i] of A and
   * column j is column colOrder[j]. Throws when a pivot position is not in the pattern (an order
   * not made for it).
   */
  constructor(n: number, rows: Int32Array, cols: Int32Array, rowOrder: Int32Array, colOrder: Int32Array) {
    const entries = rows.length;
    this.entries = entries;
    const rowOf = new Int32Array(n);
    const colOf = new Int32Array(n);
    for (let k = 0; k < n; k++) {
      rowOf[rowOrder[k]!] = k;
      colOf[colOrder[k]!] = k;
    }
    // Per permuted row: its columns and slots (growing with fill); per column: its rows below the diagonal.
    const rowCols: number[][] = [];
    const rowSlots: number[][] = [];
    const below: number[][] = [];
    for (let i = 0; i < n; i++) {
      rowCols.push([]);
      rowSlots.push([]);
      below.push([]);
    }
    const columnCount = new Int32Array(n + 1);
    for (let e = 0; e < entries; e++) {
      const i = rowOf[rows[e]!]!;
      const j = colOf[cols[e]!]!;
      rowCols[i]!.push(j);
      rowSlots[i]!.push(e);
      if (i > j) below[j]!.push(i);
      columnCount[j + 1]++;
    }
    for (let k = 0; k < n; k++) columnCount[k + 1] += columnCount[k]!;
    this.columnStart = Int32Array.from(columnCount);
    const columnAt = new Int32Array(entries);
    const columnFill = Int32Array.from(columnCount.subarray(0, n));
    for (let e = 0; e < entries; e++) columnAt[columnFill[colOf[cols[e]!]!]!++] = e;
    this.columnAt = columnAt;

    // Slot of each position (i·n + j) of L and U: one lookup per update, whatever the rows' lengths.
    const slotOf = new Map<number, number>();
    for (let i = 0; i < n; i++) {
      const cs = rowCols[i]!;
      for (let t = 0; t < cs.length; t++) slotOf.set(i * n + cs[t]!, rowSlots[i]![t]!);
    }
    let slots = entries;
    const pivotAt = new Int32Array(n);
    const lowerStart = new Int32Array(n + 1);
    const upperStart = new Int32Array(n + 1);
    const lowerAt: number[] = [];
    const upperAt: number[] = [];
    const upperCol: number[] = [];
    const updateAt: number[] = [];
    for (let k = 0; k < n; k++) {
      const cs = rowCols[k]!;
      const ss = rowSlots[k]!;
      upperStart[k] = upperAt.length;
      pivotAt[k] = -1;
      // By column, so that the substitutions sum in the same order whatever order the entries came in.
      for (const t of byColumn(cs)) {
        if (cs[t] === k) pivotAt[k] = ss[t]!;
        else if (cs[t]! > k) {
          upperAt.push(ss[t]!);
          upperCol.push(cs[t]!);
        }
      }
      if (pivotAt[k]! < 0) throw new RangeError(`EliminationSchedule: pivot ${k} is not in the pattern`);
      const uStart = upperStart[k]!;
      const uEnd = upperAt.length;
      lowerStart[k] = lowerAt.length;
      for (const i of below[k]!) {
        lowerAt.push(slotOf.get(i * n + k)!);
        if (updateAt.length + (uEnd - uStart) > MAX_SCHEDULE_OPERATIONS) {
          throw new RangeError(`EliminationSchedule: the elimination needs more than ${MAX_SCHEDULE_OPERATIONS} operations`);
        }
        for (let u = uStart; u < uEnd; u++) {
          const j = upperCol[u]!;
          const at = slotOf.get(i * n + j);
          if (at !== undefined) {
            updateAt.push(at);
          } else {
            slotOf.set(i * n + j, slots);
            rowCols[i]!.push(j);
            rowSlots[i]!.push(slots);
            updateAt.push(slots++);
            if (i > j) below[j]!.push(i);
          }
        }
      }
    }
    lowerStart[n] = lowerAt.length;
    upperStart[n] = upperAt.length;
    this.slots = slots;
    this.pivotAt = pivotAt;
    this.lowerStart = lowerStart;
    this.upperStart = upperStart;
    this.lowerAt = Int32Array.from(lowerAt);
    this.upperAt = Int32Array.from(upperAt);
    this.upperCol = Int32Array.from(upperCol);
    this.updateAt = Int32Array.from(updateAt);
    const rowLowerStart = new Int32Array(n + 1);
    const rowLowerAt: number[] = [];
    const rowLowerCol: number[] = [];
    for (let i = 0; i < n; i++) {
      rowLowerStart[i] = rowLowerAt.length;
      const cs = rowCols[i]!;
      for (const t of byColumn(cs)) {
        if (cs[t]! >= i) continue;
        rowLowerAt.push(rowSlots[i]![t]!);
        rowLowerCol.push(cs[t]!);
      }
    }
    rowLowerStart[n] = rowLowerAt.length;
    this.rowLowerStart = rowLowerStart;
    this.rowLowerAt = Int32Array.from(rowLowerAt);
    this.rowLowerCol = Int32Array.from(rowLowerCol);
  }

  /** Multiply-adds of one refactorisation (its cost, and the size of its generated code). */
  get operations(): number {
    return this.updateAt.length;
  }
}

/** Positions of a row's entries in increasing column order. */
function byColumn(cols: readonly number[]): number[] {
  return cols.map((_, t) => t).sort((p, q) => cols[p]! - cols[q]!);
}
