/** Bin edges (one more than the bins) and the count in each bin. */
export interface Histogram {
  readonly edges: Float64Array;
  readonly counts: Uint32Array;
}

/**
 * Sturges' rule, ⌈log2 n⌉ + 1 bins (H. A. Sturges, "The choice of a class interval",
 * J. Am. Stat. Assoc. 21, 1926), kept from 5 to 50 so small runs still show a shape and
 * large ones stay legible.
 */
export function defaultBinCount(samples: number): number {
  if (samples < 2) return 5;
  return Math.min(50, Math.max(5, Math.ceil(Math.log2(samples)) + 1));
}

/**
 * Counts the finite values in `bins` equal bins from the smallest to the largest; the last
 * bin includes its upper edge. Equal values get a bin of width 1 ‰ of their size (1 when
 * zero) centred on them; no finite values give zero counts over [0, 1].
 */
export function histogram(values: ArrayLike<number>, bins?: number): Histogram {
  let lo = Number.POSITIVE_INFINITY;
  let hi = Number.NEGATIVE_INFINITY;
  let finite = 0;
  for (let i = 0; i < values.length; i += 1) {
    const v = values[i] as number;
    if (!Number.isFinite(v)) continue;
    finite += 1;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  const count = bins ?? defaultBinCount(finite);
  if (!(Number.isInteger(count) && count >= 1)) {
    throw new RangeError(`histogram: bins must be a positive integer, got ${count}`);
  }
  if (finite === 0) {
    lo = 0;
    hi = 1;
  } else if (!(hi - lo > 1e-12 * Math.max(Math.abs(lo), Math.abs(hi), 1e-290))) {
    // The floor keeps the bin open for subnormal values, whose thousandth underflows to 0.
    const half = lo === 0 ? 0.5 : Math.max(Math.abs(lo) * 5e-4, 1e-300);
    lo -= half;
    hi += half;
  }
  const edges = new Float64Array(count + 1);
  // lo + i·width with the last edge set exactly, so the largest value lands inside.
  const width = (hi - lo) / count;
  for (let i = 0; i < count; i += 1) edges[i] = lo + i * width;
  edges[count] = hi;
  const counts = new Uint32Array(count);
  for (let i = 0; i < values.length; i += 1) {
    const v = values[i] as number;
    if (!Number.isFinite(v)) continue;
    let bin = Math.floor((v - lo) / width);
    if (bin >= count) bin = count - 1;
    if (bin < 0) bin = 0;
    // Floating-point division can put a value one bin off near an edge; the edges decide.
    while (bin > 0 && v < (edges[bin] as number)) bin -= 1;
    while (bin < count - 1 && v >= (edges[bin + 1] as number)) bin += 1;
    counts[bin] = (counts[bin] as number) + 1;
  }
  return { edges, counts };
}
