import { widened } from "./growable.js";
import { badArgument } from "../circuit/arguments.js";
import { ThinnedRecord } from "./thinned-record.js";

/** The share of the stored points kept at full resolution for the run's last steps. */
const TAIL_SHARE = 4;

/**
 * One signal recorded at every accepted step within `capacity` stored points: the latest
 * `capacity / 4` steps at full resolution (a ring), the steps before them in a
 * {@link ThinnedRecord} (every 2nd, 4th, … step once it fills). A record shorter than the
 * capacity is kept whole, so measuring it gives what the whole record would; a longer one keeps
 * its last cycles exact (the settled figures, THD) and its start at a coarser but still even
 * spacing (the envelope, the start-up time).
 */
export class TailRecord {
  private readonly older: ThinnedRecord;
  private readonly ringCapacity: number;
  private time: Float64Array;
  private value: Float64Array;
  /** Index of the oldest point in the ring, and how many it holds. */
  private head = 0;
  private count = 0;
  private first = NaN;
  /** Called when the older points are thinned again (their stride doubled). */
  onThin: ((spacing: number, now: number) => void) | undefined;
  /** The latest time pushed. */
  lastTime = NaN;

  constructor(capacity: number) {
    if (!(Number.isSafeInteger(capacity) || capacity === Infinity) || capacity < 8) throw badArgument(`TailRecord: capacity must be a whole number ≥ 8, got ${capacity}`);
    this.ringCapacity = capacity === Infinity ? Infinity : Math.floor(capacity / TAIL_SHARE);
    this.older = new ThinnedRecord(1, capacity === Infinity ? Infinity : capacity - this.ringCapacity);
    const start = Math.min(4096, this.ringCapacity);
    this.time = new Float64Array(start);
    this.value = new Float64Array(start);
  }

  push(t: number, v: number): void {
    if (this.count === 0 && this.older.length === 0) this.first = t;
    this.lastTime = t;
    if (this.count === this.ringCapacity) {
      this.older.set(0, this.value[this.head]!);
      const stride = this.older.stride;
      this.older.add(this.time[this.head]!);
      this.time[this.head] = t;
      this.value[this.head] = v;
      this.head = (this.head + 1) % this.ringCapacity;
      if (this.older.stride !== stride && this.onThin) this.onThin(this.olderSpacing(), t);
      return;
    }
    if (this.count === this.time.length) this.grow();
    this.time[this.count] = t;
    this.value[this.count] = v;
    this.count++;
  }

  /** Mean spacing (s) of the thinned older points; 0 while nothing was thinned. */
  olderSpacing(): number {
    if (this.older.stride === 1 || this.older.length < 2) return 0;
    const times = this.older.times();
    return (times[times.length - 1]! - this.first) / (times.length - 1);
  }

  /** Points kept now. */
  get length(): number {
    return this.older.length + this.count;
  }

  /** Every how many accepted steps an older point is kept (1: every step). */
  get stride(): number {
    return this.older.stride;
  }

  private grow(): void {
    const size = Math.min(this.ringCapacity, this.time.length * 2);
    this.time = widened(this.time, size);
    this.value = widened(this.value, size);
  }

  /** The kept time points and values, in order (copies). */
  toArrays(): { time: Float64Array; values: Float64Array } {
    const olderTime = this.older.length > 0 ? this.older.times() : new Float64Array(0);
    const olderValues = this.older.length > 0 ? this.older.values(0) : new Float64Array(0);
    const n = olderTime.length + this.count;
    const time = new Float64Array(n);
    const values = new Float64Array(n);
    time.set(olderTime);
    values.set(olderValues);
    for (let i = 0, j = olderTime.length; i < this.count; i++, j++) {
      const k = this.ringCapacity === Infinity ? i : (this.head + i) % this.ringCapacity;
      time[j] = this.time[k]!;
      values[j] = this.value[k]!;
    }
    return { time, values };
  }
}
