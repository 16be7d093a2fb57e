/** An append-only Float64Array that doubles its capacity, so appending is amortised O(1). */
export class GrowableSeries {
  private data: Float64Array;
  length = 0;
  constructor(capacity = 1024) {
    this.data = new Float64Array(capacity);
  }
  push(value: number): void {
    if (this.length === this.data.length) {
      const grown = new Float64Array(this.data.length * 2);
      grown.set(this.data);
      this.data = grown;
    }
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
