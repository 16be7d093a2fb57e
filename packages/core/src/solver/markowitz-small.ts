import type { PivotOrdering } from "./markowitz.js";

/**
 * Up to this size the ordering works on dense n×n arrays: a small circuit orders afresh a few
 * times per run, and for it the row and column lists, their searches and closures cost more
 * than scanning every entry of the active submatrix (n³ work, a few thousand operations).
 */
export const SMALL_ORDERING = 24;

/**
 * The order `markowitzOrder` chooses with its exhaustive search (same arguments, same result,
 * bit for bit), on dense arrays for n ≤ SMALL_ORDERING: at each step the usable entry of least
 * Markowitz cost (r − 1)·(c − 1), then of the largest ratio to its column's largest entry, then
 * first in row-major order; the active submatrix is updated by the same operations in the same
 * order, and an entry stays structural once present, whatever its value (it counts in r and c).
 */
export const smallMarkowitzOrder: PivotOrdering = (n, rows, cols, a, threshold, pivotTolerance, rowOrder, colOrder) => {
  const value = new Float64Array(n * n);
  const present = new Uint8Array(n * n);
  const rowCount = new Int32Array(n);
  const colCount = new Int32Array(n);
  const originalMax = new Float64Array(n);
  const columnMax = new Float64Array(n);
  const rowDone = new Uint8Array(n);
  const colDone = new Uint8Array(n);
  for (let e = 0; e < rows.length; e++) {
    const i = rows[e]!;
    const j = cols[e]!;
    value[i * n + j] = a[e]!;
    present[i * n + j] = 1;
    rowCount[i]++;
    colCount[j]++;
    originalMax[j] = Math.max(originalMax[j]!, Math.abs(a[e]!));
  }
  for (let step = 0; step < n; step++) {
    for (let j = 0; j < n; j++) {
      let max = 0;
      if (colDone[j] === 0) for (let i = 0; i < n; i++) if (rowDone[i] === 0 && present[i * n + j] === 1) max = Math.max(max, Math.abs(value[i * n + j]!));
      columnMax[j] = max;
    }
    let pi = -1;
    let pj = -1;
    let bestCost = Infinity;
    let bestQuality = 0;
    // Row-major, so the first of equal candidates is kept by the strict comparisons.
    for (let i = 0; i < n; i++) {
      if (rowDone[i] === 1) continue;
      for (let j = 0; j < n; j++) {
        if (colDone[j] === 1 || present[i * n + j] === 0) continue;
        const v = Math.abs(value[i * n + j]!);
        if (!(v > 0 && v >= threshold * columnMax[j]! && v > pivotTolerance * originalMax[j]!)) continue;
        const cost = (rowCount[i]! - 1) * (colCount[j]! - 1);
        const quality = v / columnMax[j]!;
        if (cost < bestCost || (cost === bestCost && quality > bestQuality)) {
          bestCost = cost;
          bestQuality = quality;
          pi = i;
          pj = j;
        }
      }
    }
    if (pi < 0) return colDone.indexOf(0);
    rowOrder[step] = pi;
    colOrder[step] = pj;
    rowDone[pi] = 1;
    colDone[pj] = 1;
    for (let j = 0; j < n; j++) if (present[pi * n + j] === 1) colCount[j]--;
    const pivot = value[pi * n + pj]!;
    for (let i = 0; i < n; i++) {
      if (rowDone[i] === 1 || present[i * n + pj] === 0) continue;
      const m = value[i * n + pj]! / pivot;
      rowCount[i]--;
      for (let j = 0; j < n; j++) {
        if (colDone[j] === 1 || present[pi * n + j] === 0) continue;
        const update = m * value[pi * n + j]!;
        const at = i * n + j;
        if (present[at] === 1) {
          value[at] -= update;
        } else {
          value[at] = -update;
          present[at] = 1;
          rowCount[i]++;
          colCount[j]++;
        }
      }
    }
  }
  return -1;
};
