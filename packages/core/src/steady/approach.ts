import type { ProbeReader } from "../analyses/probes.js";
import type { TransientStepper } from "../analyses/stepper.js";
import { widened } from "../analyses/growable.js";
import { risingCrossings } from "../metrics/crossings.js";

/**
 * The swing counts as levelled off when it changes by less than a given fraction per period
 * (see `advance`), and by less than this share of the linear growth per period (so a slowly
 * growing swing, still in the linear range, does not pass)…
 */
const LEVEL_SHARE = 0.25;
/** …over this many periods in a row. */
const LEVEL_PERIODS = 3;
/** A swing below this fraction of the largest seen has died out. */
const DIED_OUT = 1e-4;
/** Hysteresis of the period's crossings, as a fraction of the swing. */
const HYSTERESIS = 0.05;

/** Where a short transient left the oscillation: the period measured on the probe, or why none. */
export type Approach =
  | { readonly kind: "oscillating"; readonly period: number; readonly periods: number; readonly levelled: boolean }
  | { readonly kind: "died-out"; readonly periods: number };

/**
 * Runs a transient towards the orbit, one guessed period at a time, watching the probe's swing
 * per period. It stops after `most` periods, or earlier (with `level`) once the swing has
 * levelled off: the shooting converges from there, so waiting out the slow end of the
 * settling buys nothing. An amplitude loop's envelope can bounce (an overshoot, then a dip far
 * below the orbit, where the swing lingers as if levelled), and Newton's method does not
 * converge from there: once the swing has peaked, the bounce about the peak (from the dip
 * before it, if any, to the dip after it, or to now) must be within the level too. The period is
 * then measured from the last few rising crossings of the probe through its mean; a swing that
 * shrank to nothing means the oscillation died out.
 */
export class OrbitApproach {
  /** The probe's samples over the last few guessed periods only (all the period's measurement reads). */
  private readonly samples = new SampleWindow();
  /** The swings of the last periods (the level and died-out criteria look no further back). */
  private readonly swings: number[] = [];
  /** The swing at the envelope's last peak, and at the dips before and after it. */
  private peak = NaN;
  private before = NaN;
  private dip = NaN;
  private count = 0;
  private largest = 0;

  constructor(
    private readonly stepper: TransientStepper,
    read: ProbeReader,
    private readonly guess: number,
    /** e^(σT) − 1: the swing's relative growth per period while the circuit is linear. */
    private readonly linearGrowth: number,
  ) {
    stepper.observe((t, x, dxdt) => this.samples.push(t, read(x, dxdt, t)));
  }

  /** Periods run so far. */
  get periods(): number {
    return this.count;
  }

  /** Probe samples held (bounded by the samples of a few periods, however long the approach). */
  get samplesHeld(): number {
    return this.samples.length;
  }

  /**
   * Runs up to `most` more periods (fewer once the swing changes by less than `level` per
   * period, when given) and says where that left the oscillation.
   */
  advance(most: number, level: number | undefined, check: () => void): Approach {
    const end = this.count + most;
    let levelled = false;
    while (this.count < end) {
      check();
      const from = this.stepper.t;
      this.stepper.advance(from + this.guess);
      this.record(this.samples.swingSince(from));
      this.samples.dropBefore(this.stepper.t - (LEVEL_PERIODS + 1) * this.guess);
      if (this.diedOut()) return { kind: "died-out", periods: this.periods };
      if (level !== undefined && (levelled = this.levelled(level))) break;
    }
    return this.diedOut() ? { kind: "died-out", periods: this.periods } : { kind: "oscillating", period: this.measuredPeriod(), periods: this.periods, levelled };
  }

  private record(swing: number): void {
    this.count++;
    this.largest = Math.max(this.largest, swing);
    this.swings.push(swing);
    if (this.swings.length > LEVEL_PERIODS + 1) this.swings.shift();
    const [a, b, c] = this.swings.slice(-3);
    // The envelope's turning points: a peak (the dip before it kept), or a dip.
    if (c !== undefined && b! > a! && b! >= c) {
      this.before = this.dip;
      this.peak = b!;
      this.dip = NaN;
    } else if (c !== undefined && b! < a! && b! <= c) this.dip = b!;
  }

  private diedOut(): boolean {
    const last = this.swings[this.swings.length - 1] ?? 0;
    return !(last > DIED_OUT * this.largest) || (this.count > 2 * LEVEL_PERIODS && this.shrinking() && last < 0.01 * this.largest);
  }

  /** Every one of the last periods smaller than the one before. */
  private shrinking(): boolean {
    const s = this.swings;
    for (let k = s.length - LEVEL_PERIODS; k < s.length; k++) if (!(s[k]! < s[k - 1]!)) return false;
    return true;
  }

  private levelled(level: number): boolean {
    const s = this.swings;
    if (s.length <= LEVEL_PERIODS) return false;
    const change = Math.min(level, LEVEL_SHARE * this.linearGrowth);
    for (let k = s.length - LEVEL_PERIODS; k < s.length; k++) if (!(Math.abs(s[k]! / s[k - 1]! - 1) < change)) return false;
    // After a peak of the envelope, its bounce (from the dip before it, down to the dip after it or to now) must be small too.
    const last = s[s.length - 1]!;
    const after = Number.isNaN(this.dip) ? last : this.dip;
    return !(Math.abs(this.peak - after) >= level * last || Math.abs(this.peak - this.before) >= level * last);
  }

  /** The mean interval between the rising crossings of the last few guessed periods; the guess when there are too few. */
  private measuredPeriod(): number {
    const t = this.samples.times();
    const v = this.samples.values();
    const from = this.stepper.t - (LEVEL_PERIODS + 1) * this.guess;
    let sum = 0;
    let count = 0;
    let lo = Infinity;
    let hi = -Infinity;
    for (let k = t.length - 1; k >= 0 && t[k]! >= from; k--) {
      sum += v[k]!;
      count++;
      lo = Math.min(lo, v[k]!);
      hi = Math.max(hi, v[k]!);
    }
    if (count < 4) return this.guess;
    const crossings = risingCrossings(t, v, sum / count, HYSTERESIS * (hi - lo), from);
    if (crossings.length < 2) return this.guess;
    return (crossings[crossings.length - 1]! - crossings[0]!) / (crossings.length - 1);
  }
}

/** Samples (t, v) appended in time order, from which the ones before a time can be dropped: memory bounded by the span kept. */
class SampleWindow {
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
    let first = this.length - 1;
    while (first > 0 && t[first]! >= time) first--;
    let top = first;
    let bottom = first;
    for (let k = first; k < this.length; k++) {
      if (v[k]! > v[top]!) top = k;
      if (v[k]! < v[bottom]!) bottom = k;
    }
    const swing = this.vertex(top) - this.vertex(bottom);
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
