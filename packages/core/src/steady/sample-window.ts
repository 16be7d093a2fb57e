import { widened } from "../analyses/growable.js";

/** Samples (t, v) appended in time order, from which the ones before a time can be dropped: memory bounded by the span kept. */
export class SampleWindow {
  private t: Float64Array = new Float64Array(1024);
  private v: Float64Array = new Float64Array(1024);
  length = 0;

  push(t: number, v: number): void {
    if (this.length === this.t.length) {
      this.t = widened(this.t, 2 * this.length);
      this.v = widened(this.v, 2 * this.length);
    }
    this.t[this.length] = t;
    this.v[this.length++] = v;
  }

  last(): number {
    return this.v[this.length - 1]!;
  }

  /** Drops the samples before `time`. */
  dropBefore(time: number): void {
    let first = 0;
    while (first < this.length && this.t[first]! < time) first++;
    if (first === 0) return;
    this.t.copyWithin(0, first, this.length);
    this.v.copyWithin(0, first, this.length);
    this.length -= first;
  }

  /**
   * The swing (highest − lowest) of the samples from `time` on (and the one before), each
   * extreme refined by the parabola through it and its neighbours: the steps' placement then
   * moves it by O(h³), not O(h²), so a swing that has levelled off measures level.
   */
  swingSince(time: number): number {
    const { t, v } = this;
    if (this.length === 0) return 0;
    let first = this.length - 1;
    while (first > 0 && t[first]! >= time) first--;
    let top = first;
    let bottom = first;
    for (let k = first; k < this.length; k++) {
      if (v[k]! > v[top]!) top = k;
      if (v[k]! < v[bottom]!) bottom = k;
    }
    const swing = this.vertex(top) - this.vertex(bottom);
    // A swing whose arithmetic overflows (an unlimited one, past 1e150) is Infinity, not 0.
    if (Number.isNaN(swing) || swing === Infinity) return Infinity;
    return swing > 0 ? swing : 0;
  }

  /** The value at the vertex of the parabola through samples k − 1, k, k + 1 (sample k's own value at the ends or where the vertex falls outside them). */
  private vertex(k: number): number {
    const { t, v } = this;
    if (k === 0 || k >= this.length - 1) return v[k]!;
    const h0 = t[k - 1]! - t[k]!;
    const h2 = t[k + 1]! - t[k]!;
    const d0 = v[k - 1]! - v[k]!;
    const d2 = v[k + 1]! - v[k]!;
    const det = h0 * h2 * (h0 - h2);
    const a = (d0 * h2 - d2 * h0) / det;
    const b = (d2 * h0 * h0 - d0 * h2 * h2) / det;
    const at = -b / (2 * a);
    return a !== 0 && at > h0 && at < h2 ? v[k]! - (b * b) / (4 * a) : v[k]!;
  }

  /** Views (no copy) valid until the next push or drop. */
  times(): Float64Array {
    return this.t.subarray(0, this.length);
  }

  values(): Float64Array {
    return this.v.subarray(0, this.length);
  }
}
