/** A copy of `a` in a longer array of `size` entries (the rest zero). */
export function widened(a: Float64Array, size: number): Float64Array {
  const b = new Float64Array(size);
  b.set(a);
  return b;
}

/** An append-only Float64Array that doubles its capacity, so appending is amortised O(1). */
export class GrowableSeries {
  private data: Float64Array;
  length = 0;
  constructor(capacity = 1024) {
    this.data = new Float64Array(capacity);
  }
  push(value: number): void {
    if (this.length === this.data.length) this.data = widened(this.data, this.data.length * 2);
    this.data[this.length++] = value;
  }
  /** A copy trimmed to the length. */
  toArray(): Float64Array {
    return this.data.slice(0, this.length);
  }
  /** A view (no copy) valid until the next push. */
  view(): Float64Array {
    return this.data.subarray(0, this.length);
  }
}
