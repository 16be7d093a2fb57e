import { widened } from "./growable.js";
import { badArgument } from "../circuit/arguments.js";

/**
 * A record of time points and several signals that never holds more than `capacity` points:
 * when full it keeps every other point and from then on records every 2nd accepted step (then
 * every 4th, …), so memory is set by what the outputs can show, not by the run's length. The
 * last point is always kept, and each signal's smallest and largest values are tracked over
 * every step, thinned or not, so a report's extremes stay exact.
 */
export class ThinnedRecord {
  private time: Float64Array;
  private readonly series: Float64Array[];
  /** Points stored. */
  length = 0;
  /** Every `stride`-th accepted step is stored. */
  stride = 1;
  /** Steps seen, the first point included. */
  private seen = 0;
  private readonly lastValues: Float64Array;
  private lastTime = NaN;
  private lastStored = true;
  readonly min: Float64Array;
  readonly max: Float64Array;

  constructor(
    signals: number,
    readonly capacity: number,
  ) {
    if (!(Number.isSafeInteger(capacity) || capacity === Infinity) || capacity < 4) throw badArgument(`ThinnedRecord: capacity must be a whole number ≥ 4, got ${capacity}`);
    const start = Math.min(1024, capacity);
    this.time = new Float64Array(start);
    this.series = Array.from({ length: signals }, () => new Float64Array(start));
    this.lastValues = new Float64Array(signals);
    this.min = new Float64Array(signals).fill(Infinity);
    this.max = new Float64Array(signals).fill(-Infinity);
  }

  /** Writes the value of signal `k` at the point being added (call for every k, then {@link add}). */
  set(k: number, value: number): void {
    this.lastValues[k] = value;
    if (value < this.min[k]!) this.min[k] = value;
    if (value > this.max[k]!) this.max[k] = value;
  }

  /** Adds the point at time `t` with the values just set. */
  add(t: number): void {
    this.lastTime = t;
    const step = this.seen++;
    let keep = step % this.stride === 0;
    if (keep && this.length === this.capacity) {
      this.halve();
      keep = step % this.stride === 0;
    }
    this.lastStored = keep;
    if (!keep) return;
    if (this.length === this.time.length) this.grow();
    this.time[this.length] = t;
    for (let k = 0; k < this.series.length; k++) this.series[k]![this.length] = this.lastValues[k]!;
    this.length++;
  }

  private grow(): void {
    const size = Math.min(this.capacity, this.time.length * 2);
    this.time = widened(this.time, size);
    for (let k = 0; k < this.series.length; k++) this.series[k] = widened(this.series[k]!, size);
  }

  /** Keeps the points at even positions (steps 0, 2·stride, 4·stride, …) and doubles the stride. */
  private halve(): void {
    const half = (a: Float64Array) => {
      for (let i = 0, j = 0; i < this.length; i += 2, j++) a[j] = a[i]!;
    };
    half(this.time);
    for (const s of this.series) half(s);
    this.length = Math.ceil(this.length / 2);
    this.stride *= 2;
  }

  /** The stored times, with the last point added when the stride skipped it. */
  times(): Float64Array {
    return this.finish(this.time, this.lastTime);
  }

  /** The stored values of signal `k`, with the last point added when the stride skipped it. */
  values(k: number): Float64Array {
    return this.finish(this.series[k]!, this.lastValues[k]!);
  }

  private finish(a: Float64Array, last: number): Float64Array {
    const out = new Float64Array(this.length + (this.lastStored ? 0 : 1));
    out.set(a.subarray(0, this.length));
    if (!this.lastStored) out[this.length] = last;
    return out;
  }
}
