import type { ProbeReader } from "../analyses/probes.js";
import type { TransientStepper } from "../analyses/stepper.js";
import { risingCrossings } from "../metrics/crossings.js";
import { SampleWindow } from "./sample-window.js";

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
/** A swing that grew to more than this many times its first period's before it died out grew first (see `Approach`). */
const GREW = 10;
/** Hysteresis of the period's crossings, as a fraction of the swing. */
const HYSTERESIS = 0.05;

/** Where a short transient left the oscillation: the period measured on the probe, or why none. */
export type Approach =
  | { readonly kind: "oscillating"; readonly period: number; readonly periods: number; readonly levelled: boolean }
  | {
      readonly kind: "died-out";
      readonly periods: number;
      /** The swing first grew to more than `GREW` times its first period's, then died: an amplitude loop that over-corrected. */
      readonly afterGrowth: boolean;
    }
  /** The swing grew until its arithmetic overflowed (nothing limits it): `largest` is the last finite one. */
  | { readonly kind: "diverged"; readonly periods: number; readonly largest: number };

/**
 * Runs a transient towards the orbit, one guessed period at a time, watching the probe's swing
 * per period. It stops after `most` periods, or earlier (with `level`) once the swing has
 * levelled off: the shooting converges from there, so waiting out the slow end of the
 * settling buys nothing. An amplitude loop's envelope can bounce (an overshoot, then a dip far
 * below the orbit, where the swing lingers as if levelled), and Newton's method does not
 * converge from there: once the swing has peaked, the bounce about the peak (from the dip
 * before it, if any, to the dip after it, or to now) must be within the level too. The period is
 * then measured from the last few rising crossings of the probe through its mean; a swing that
 * shrank to nothing means the oscillation died out, one that overflowed that it diverged.
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
  /** The first period's swing. */
  private first = 0;
  /** Periods the swing has looked died out, in all; and whether it does now. */
  private quietPeriods = 0;
  private isQuiet = false;

  constructor(
    private readonly stepper: TransientStepper,
    read: ProbeReader,
    private readonly guess: number,
    /** e^(σT) − 1: the swing's relative growth per period while the circuit is linear. */
    private readonly linearGrowth: number,
    /**
     * Periods a swing that looks died out is watched before it counts as died out: an amplitude
     * loop's envelope can dip far below its orbit after an overshoot (a peak detector charged
     * past its level holds the gain down) and grow again once the loop's slow state bleeds back.
     * The quiet periods (in all, over every dip) do not count towards `advance`'s `most`.
     */
    private readonly patience = 0,
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
   * period, when given, and `earliest` periods have been run in all) and says where that left
   * the oscillation.
   */
  advance(most: number, level: number | undefined, check: () => void, earliest = 0): Approach {
    let end = this.count + most;
    let levelled = false;
    while (this.count < end) {
      check();
      const from = this.stepper.t;
      this.stepper.advance(from + this.guess);
      const swing = this.samples.swingSince(from);
      // An unlimited swing (a linear circuit's growing pair) overflows: it must not read as died out.
      if (!Number.isFinite(swing)) {
        this.count++;
        return { kind: "diverged", periods: this.count, largest: this.largest };
      }
      this.record(swing);
      this.isQuiet = this.quiet();
      if (this.isQuiet) this.quietPeriods++;
      this.samples.dropBefore(this.stepper.t - (LEVEL_PERIODS + 1) * this.guess);
      if (this.diedOut()) return this.diedOutHere();
      if (this.isQuiet) {
        end++;
        continue;
      }
      if (level !== undefined && this.count >= earliest && (levelled = this.levelled(level))) break;
    }
    return this.diedOut() ? this.diedOutHere() : { kind: "oscillating", period: this.measuredPeriod(), periods: this.periods, levelled };
  }

  private diedOutHere(): Approach {
    return { kind: "died-out", periods: this.periods, afterGrowth: this.largest > GREW * this.first };
  }

  private record(swing: number): void {
    if (this.count === 0) this.first = swing;
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

  /** The swing looks died out, and has for more than `patience` periods in all (see the constructor). */
  private diedOut(): boolean {
    return this.isQuiet && this.quietPeriods > this.patience;
  }

  private quiet(): boolean {
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
