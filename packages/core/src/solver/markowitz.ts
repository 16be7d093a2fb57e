/**
 * Pivot order for sparse Gaussian elimination by the Markowitz criterion with threshold
 * pivoting (Duff, Erisman & Reid, *Direct Methods for Sparse Matrices*, §7.2 and §4.4): at each
 * step, among the entries at least `threshold` of the largest in their column, take the one
 * whose row and column counts (r − 1)·(c − 1) promise the least fill. Counts follow the
 * structural pattern with its fill; values decide which entries may be pivots. O(n³) on dense
 * storage, run only when a factorisation has to choose its pivots afresh.
 *
 * Returns false when some step finds no usable pivot (the matrix is singular to working
 * precision); `rowOrder[k]`, `colOrder[k]` are the original row and column of pivot k.
 */
export function markowitzOrder(
  a: Float64Array,
  n: number,
  pattern: Uint8Array,
  threshold: number,
  pivotTolerance: number,
  rowOrder: Int32Array,
  colOrder: Int32Array,
): boolean {
  const w = Float64Array.from(a.subarray(0, n * n));
  const s = Uint8Array.from(pattern.subarray(0, n * n));
  const rowActive = new Uint8Array(n).fill(1);
  const colActive = new Uint8Array(n).fill(1);
  const rowCount = new Int32Array(n);
  const colCount = new Int32Array(n);
  const colMax = new Float64Array(n);
  const originalMax = new Float64Array(n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) originalMax[j] = Math.max(originalMax[j]!, Math.abs(a[i * n + j]!));
  for (let k = 0; k < n; k++) {
    rowCount.fill(0);
    colCount.fill(0);
    colMax.fill(0);
    for (let i = 0; i < n; i++) {
      if (!rowActive[i]) continue;
      for (let j = 0; j < n; j++) {
        if (!colActive[j] || !s[i * n + j]) continue;
        rowCount[i]++;
        colCount[j]++;
        const v = Math.abs(w[i * n + j]!);
        if (v > colMax[j]!) colMax[j] = v;
      }
    }
    let pi = -1;
    let pj = -1;
    let bestCost = Infinity;
    let bestQuality = 0;
    for (let i = 0; i < n; i++) {
      if (!rowActive[i]) continue;
      for (let j = 0; j < n; j++) {
        if (!colActive[j] || !s[i * n + j]) continue;
        const v = Math.abs(w[i * n + j]!);
        const max = colMax[j]!;
        if (!(v > 0) || v < threshold * max || !(v > pivotTolerance * originalMax[j]!)) continue;
        const cost = (rowCount[i]! - 1) * (colCount[j]! - 1);
        const quality = v / max;
        if (cost < bestCost || (cost === bestCost && quality > bestQuality)) {
          bestCost = cost;
          bestQuality = quality;
          pi = i;
          pj = j;
        }
      }
    }
    if (pi < 0) return false;
    rowOrder[k] = pi;
    colOrder[k] = pj;
    rowActive[pi] = 0;
    colActive[pj] = 0;
    const pivot = w[pi * n + pj]!;
    for (let i = 0; i < n; i++) {
      if (!rowActive[i] || !s[i * n + pj]) continue;
      const m = w[i * n + pj]! / pivot;
      for (let j = 0; j < n; j++) {
        if (!colActive[j] || !s[pi * n + j]) continue;
        w[i * n + j] -= m * w[pi * n + j]!;
        s[i * n + j] = 1;
      }
    }
  }
  return true;
}
