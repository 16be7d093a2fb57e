import { CountBuckets } from "./count-buckets.js";
import { SMALL_ORDERING, smallMarkowitzOrder } from "./markowitz-small.js";

/**
 * Rows and columns a step's search looks at once it has a pivot (Zlatev, "On some pivotal
 * strategies in Gaussian elimination by sparse technique", SIAM J. Numer. Anal. 17, 1980: 2–4).
 */
const SEARCH_ROWS = 4;

/**
 * Up to this size the search is exhaustive (pruned only where no unseen entry can tie), so a
 * small circuit gets the one order the criterion and its tie-breaks define: least cost, then the
 * largest pivot relative to its column, then the first in row-major order.
 */
const EXHAUSTIVE = 64;

/**
 * Pivot order for sparse Gaussian elimination by the Markowitz criterion with threshold
 * pivoting (Duff, Erisman & Reid, *Direct Methods for Sparse Matrices*, §7.2 and §4.4): at each
 * step, among the entries at least `threshold` of the largest in their column, take the one
 * whose row and column counts promise the least fill, (r − 1)·(c − 1). The search visits the
 * rows and columns of smallest count first and stops once no unvisited entry can do better, or
 * once SEARCH_ROWS rows and columns have been looked at and some pivot found (ibid. §10.2,
 * after Zlatev's restricted search), so a step costs about the entries it touches, not n².
 *
 * The active submatrix is kept as row lists (columns and values) and column lists (rows); the
 * elimination updates values and adds fill as the factorisation would. Memory is linear in the
 * entries and their fill.
 *
 * `rows[e]`, `cols[e]`, `a[e]`: the matrix's structural entries (each position once, any order).
 * Returns −1 when every step found a pivot, writing `rowOrder[k]`, `colOrder[k]` (the original
 * row and column of pivot k); otherwise the lowest original column left without a usable pivot
 * (the matrix is singular to working precision there).
 */
export const markowitzOrder: PivotOrdering = (n, rows, cols, a, threshold, pivotTolerance, rowOrder, colOrder) =>
  (n <= SMALL_ORDERING ? smallMarkowitzOrder : markowitzOrderByLists)(n, rows, cols, a, threshold, pivotTolerance, rowOrder, colOrder);

/** The arguments and result of {@link markowitzOrder}. */
export type PivotOrdering = (
  n: number,
  rows: Int32Array,
  cols: Int32Array,
  a: Float64Array,
  threshold: number,
  pivotTolerance: number,
  rowOrder: Int32Array,
  colOrder: Int32Array,
) => number;

/** {@link markowitzOrder} on row and column lists, whatever the size (exported for the tests). */
export const markowitzOrderByLists: PivotOrdering = (n, rows, cols, a, threshold, pivotTolerance, rowOrder, colOrder) => {
  const rowCols: number[][] = [];
  const rowValues: number[][] = [];
  const colRows: number[][] = [];
  for (let i = 0; i < n; i++) {
    rowCols.push([]);
    rowValues.push([]);
    colRows.push([]);
  }
  const originalMax = new Float64Array(n);
  for (let e = 0; e < rows.length; e++) {
    const i = rows[e]!;
    const j = cols[e]!;
    rowCols[i]!.push(j);
    rowValues[i]!.push(a[e]!);
    colRows[j]!.push(i);
    originalMax[j] = Math.max(originalMax[j]!, Math.abs(a[e]!));
  }
  const rowBuckets = new CountBuckets(n);
  const colBuckets = new CountBuckets(n);
  for (let i = 0; i < n; i++) {
    rowBuckets.insert(i, rowCols[i]!.length);
    colBuckets.insert(i, colRows[i]!.length);
  }
  // Column maxima of the active submatrix, computed at most once per column per step.
  const maxStep = new Int32Array(n).fill(-1);
  const maxValue = new Float64Array(n);
  const columnMax = (j: number, step: number): number => {
    if (maxStep[j] === step) return maxValue[j]!;
    let max = 0;
    for (const i of colRows[j]!) max = Math.max(max, Math.abs(valueAt(i, j)));
    maxStep[j] = step;
    maxValue[j] = max;
    return max;
  };
  const valueAt = (i: number, j: number): number => rowValues[i]![rowCols[i]!.indexOf(j)]!;
  const usable = (v: number, j: number, step: number): boolean =>
    v > 0 && v >= threshold * columnMax(j, step) && v > pivotTolerance * originalMax[j]!;
  // Scatter of one row: position of column j in it, valid where mark[j] is the current stamp.
  const position = new Int32Array(n);
  const mark = new Int32Array(n).fill(-1);
  let stamp = 0;
  const colDone = new Uint8Array(n);
  const exhaustive = n <= EXHAUSTIVE;

  // The step's search: its best candidate so far, and the rows and columns it has looked at.
  // (Declared once, not per step: closures made per step were most of a small circuit's ordering.)
  let step = 0;
  let pi = -1;
  let pj = -1;
  let bestCost = Infinity;
  let bestQuality = 0;
  let looked = 0;
  const consider = (i: number, j: number, v: number, cost: number): void => {
    const quality = v / columnMax(j, step);
    if (cost < bestCost || (cost === bestCost && (quality > bestQuality || (quality === bestQuality && (i < pi || (i === pi && j < pj)))))) {
      bestCost = cost;
      bestQuality = quality;
      pi = i;
      pj = j;
    }
  };
  // Stop once the best cost is below (exhaustive: strictly) what any unseen entry could cost.
  const enough = (bound: number): boolean => (exhaustive ? bestCost < bound : bestCost <= bound || (++looked >= SEARCH_ROWS && pi >= 0));

  for (step = 0; step < n; step++) {
    pi = -1;
    pj = -1;
    bestCost = Infinity;
    bestQuality = 0;
    looked = 0;
    search: for (let count = 1; count <= n; count++) {
      for (let j = colBuckets.head[count]!; j >= 0; j = colBuckets.next[j]!) {
        for (const i of colRows[j]!) {
          const v = Math.abs(valueAt(i, j));
          if (usable(v, j, step)) consider(i, j, v, (rowCols[i]!.length - 1) * (count - 1));
        }
        if (enough((count - 1) * (count - 1))) break search;
      }
      for (let i = rowBuckets.head[count]!; i >= 0; i = rowBuckets.next[i]!) {
        const cs = rowCols[i]!;
        const vs = rowValues[i]!;
        for (let t = 0; t < cs.length; t++) {
          const j = cs[t]!;
          const v = Math.abs(vs[t]!);
          if (usable(v, j, step)) consider(i, j, v, (count - 1) * (colRows[j]!.length - 1));
        }
        if (enough((count - 1) * (count - 1))) break search;
      }
      // Every entry not yet seen lies in a row and a column of more than `count` entries.
      if (exhaustive ? bestCost < count * count : bestCost <= count * count) break;
    }
    if (pi < 0) return colDone.indexOf(0);
    rowOrder[step] = pi;
    colOrder[step] = pj;
    colDone[pj] = 1;
    rowBuckets.remove(pi);
    colBuckets.remove(pj);
    const pivotCols = rowCols[pi]!;
    const pivotValues = rowValues[pi]!;
    const pivot = valueAt(pi, pj);
    // The pivot row leaves every column it touches.
    for (const j of pivotCols) {
      if (j === pj) continue;
      const list = colRows[j]!;
      list.splice(list.indexOf(pi), 1);
    }
    for (const i of colRows[pj]!) {
      if (i === pi) continue;
      const cs = rowCols[i]!;
      const vs = rowValues[i]!;
      const at = cs.indexOf(pj);
      const m = vs[at]! / pivot;
      // The pivot column leaves row i (swap with the last entry).
      const last = cs.length - 1;
      cs[at] = cs[last]!;
      vs[at] = vs[last]!;
      cs.pop();
      vs.pop();
      stamp++;
      for (let t = 0; t < cs.length; t++) {
        position[cs[t]!] = t;
        mark[cs[t]!] = stamp;
      }
      for (let t = 0; t < pivotCols.length; t++) {
        const j = pivotCols[t]!;
        if (j === pj) continue;
        const update = m * pivotValues[t]!;
        if (mark[j] === stamp) {
          vs[position[j]!] -= update;
        } else {
          cs.push(j);
          vs.push(-update);
          colRows[j]!.push(i);
        }
      }
      rowBuckets.move(i, cs.length);
    }
    for (const j of pivotCols) if (j !== pj) colBuckets.move(j, colRows[j]!.length);
    colRows[pj] = [];
    rowCols[pi] = [];
    rowValues[pi] = [];
  }
  return -1;
};
