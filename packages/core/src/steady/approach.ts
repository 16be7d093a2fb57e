import type { ProbeReader } from "../analyses/probes.js";
import type { TransientStepper } from "../analyses/stepper.js";
import { risingCrossings } from "../metrics/crossings.js";
import { GrowableSeries } from "../analyses/growable.js";

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
  | { readonly kind: "oscillating"; readonly period: number; readonly periods: number }
  | { readonly kind: "died-out"; readonly periods: number };

/**
 * Runs a transient towards the orbit, one guessed period at a time, watching the probe's swing
 * per period. It stops after `most` periods, or earlier (with `level`) once the swing has
 * levelled off: the shooting converges from there, so waiting out the slow end of the
 * settling buys nothing. The period is then measured from the last few rising crossings of
 * the probe through its mean; a swing that shrank to nothing means the oscillation died out.
 */
export class OrbitApproach {
  private readonly time = new GrowableSeries(4096);
  private readonly values = new GrowableSeries(4096);
  private readonly swings: number[] = [];
  private largest = 0;

  constructor(
    private readonly stepper: TransientStepper,
    read: ProbeReader,
    private readonly guess: number,
    /** e^(σT) − 1: the swing's relative growth per period while the circuit is linear. */
    private readonly linearGrowth: number,
  ) {
    stepper.observe((t, x, dxdt) => {
      this.time.push(t);
      this.values.push(read(x, dxdt, t));
    });
  }

  /** Periods run so far. */
  get periods(): number {
    return this.swings.length;
  }

  /**
   * Runs up to `most` more periods (fewer once the swing changes by less than `level` per
   * period, when given) and says where that left the oscillation.
   */
  advance(most: number, level: number | undefined, check: () => void): Approach {
    const end = this.swings.length + most;
    while (this.swings.length < end) {
      check();
      const from = this.stepper.t;
      this.stepper.advance(from + this.guess);
      this.swings.push(this.swingSince(from));
      this.largest = Math.max(this.largest, this.swings[this.swings.length - 1]!);
      if (this.diedOut()) return { kind: "died-out", periods: this.periods };
      if (level !== undefined && this.levelled(level)) break;
    }
    return this.diedOut() ? { kind: "died-out", periods: this.periods } : { kind: "oscillating", period: this.measuredPeriod(), periods: this.periods };
  }

  private swingSince(from: number): number {
    const t = this.time.view();
    const v = this.values.view();
    let lo = Infinity;
    let hi = -Infinity;
    for (let k = t.length - 1; k >= 0 && t[k]! >= from; k--) {
      lo = Math.min(lo, v[k]!);
      hi = Math.max(hi, v[k]!);
    }
    return hi > lo ? hi - lo : 0;
  }

  private diedOut(): boolean {
    const last = this.swings[this.swings.length - 1] ?? 0;
    return !(last > DIED_OUT * this.largest) || (this.swings.length > 2 * LEVEL_PERIODS && this.shrinking() && last < 0.01 * this.largest);
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
    return true;
  }

  /** The mean interval between the rising crossings of the last few guessed periods; the guess when there are too few. */
  private measuredPeriod(): number {
    const t = this.time.view();
    const v = this.values.view();
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
