import type { CycleTable } from "./cycles.js";

/** A collapse: the envelope falls below this share of its largest value since the last restart… */
export const COLLAPSE = 0.2;
/** …and a restart: it rises again to this many times the lowest value of the collapse. */
export const RESTART = 5;
/** A cycle this many times the median period long is a gap: the oscillation stopped and started again. */
export const GAP = 3;

/** One collapse and restart of the per-cycle envelope. */
export interface Collapse {
  /** The largest envelope since the last restart, before the collapse. */
  readonly peak: number;
  /** The lowest envelope of the collapse; 0 when the oscillation stopped (a gap). */
  readonly low: number;
  /** s: from the fall below {@link COLLAPSE} of the peak to the restart. */
  readonly duration: number;
  /** s: the fall below {@link COLLAPSE} of the peak (the start of that cycle). */
  readonly at: number;
}

function medianPeriod(cycles: CycleTable): number {
  const periods = Array.from({ length: cycles.count }, (_, k) => cycles.start[k + 1] - cycles.start[k]).sort((a, b) => a - b);
  return periods[Math.floor(periods.length / 2)] ?? 0;
}

/**
 * Each time the per-cycle envelope collapsed and restarted: fell below {@link COLLAPSE} of
 * its largest value since the last restart (or stopped for a gap, a cycle over {@link GAP}
 * median periods long, when the swing fell inside the crossing hysteresis) and then rose again
 * to {@link RESTART} times the lowest value of the collapse and above `floor` (twice the noise
 * floor: noise alone does not restart) — after a stop, to {@link RESTART} times `floor`: a swing
 * that fell inside the hysteresis has no lowest value to read, and noise a circuit near its
 * start threshold amplifies past the floor comes back through it in bursts. So every deep valley
 * between two peaks counts, whatever the first overshoot was; a ring-down to nothing is no
 * restart, a dip to 60 % no collapse.
 */
export function collapses(cycles: CycleTable, floor = 0): Collapse[] {
  const n = cycles.count;
  const e = cycles.envelope;
  const period = medianPeriod(cycles);
  const found: Collapse[] = [];
  let peak = 0;
  let low = Infinity;
  let fell = 0;
  let down = false;
  for (let k = 0; k < n; k++) {
    const gap = cycles.start[k + 1] - cycles.start[k] > GAP * period;
    // after a stop the swing's lowest is unknown, under the hysteresis: the floor stands for it
    if (down && !gap && e[k] >= RESTART * (low > 0 ? low : floor) && e[k] > floor) {
      down = false;
      found.push({ peak, low, duration: cycles.start[k] - fell, at: fell });
      peak = 0;
    }
    if (!down && peak > floor && (gap || e[k] < COLLAPSE * peak)) {
      down = true;
      low = gap ? 0 : e[k];
      fell = cycles.start[k];
    }
    if (down) low = Math.min(low, gap ? 0 : e[k]);
    else peak = Math.max(peak, e[k]);
  }
  return found;
}

/** How many times the per-cycle envelope collapsed and restarted (see {@link collapses}). */
export function collapsesAndRestarts(cycles: CycleTable, floor = 0): number {
  return collapses(cycles, floor).length;
}

/** A collapse's depth: ln(peak/low), infinite for a stop. */
function depth(c: Collapse): number {
  return Math.log(c.peak / c.low);
}

/**
 * Whether collapse `b` is shallower than `a`, the one before it, by at least the factor `keep`:
 * its depth ln(peak/low) (a higher dip, a lower peak) at most `keep` times `a`'s; a dip after a
 * stop is shallower; after two stops, whose depth cannot be read, the oscillation stayed down at
 * most `keep` times as long (it regrows at the loop's own rate, so a deeper collapse lasts longer).
 */
function shallower(b: Collapse, a: Collapse, keep: number): boolean {
  if (a.low > 0) return b.low > 0 && depth(b) <= keep * depth(a);
  return b.low > 0 || b.duration <= keep * a.duration;
}

/**
 * Collapses alike that make a repeating envelope cycle: three cycles of it, as many bounces as
 * make a sustained one (`SUSTAINED_BOUNCES`); fewer can agree by chance in a loop thrown about
 * by its overshoots.
 */
export const REPEATS = 4;
/** Collapses, each deeper than the one before, that show the excursions growing. */
export const GROWING = 3;

/** Whether `b`/`a` lies within the factor `keep` either way. */
function within(b: number, a: number, keep: number): boolean {
  return b >= keep * a && a >= keep * b;
}

/** Whether collapse `b` repeats `a`, the one before it: its peak, and its depth when both are dips, within the factor `keep`. */
function alike(b: Collapse, a: Collapse, keep: number): boolean {
  return within(b.peak, a.peak, keep) && !(a.low > 0 && b.low > 0 && !within(depth(b), depth(a), keep));
}

/**
 * Whether a series of collapses shows the envelope's own cycle, not a transient that may yet
 * settle: its last {@link REPEATS} collapses are alike (see `alike`) and evenly spaced (each
 * time from the fall before within the factor `keep` of the one before: a limit cycle of the
 * envelope repeats itself), or it has at least {@link GROWING} collapses, each deeper than the
 * one before by at least 1/`keep` (the excursions grow: the mirror of {@link collapsesDying}).
 * Irregular collapses, of wandering heights or spacings, are neither: a stable loop thrown
 * about by its large-signal overshoots can land on its orbit after any of them.
 */
export function collapsesRepeat(series: readonly Collapse[], keep: number): boolean {
  const n = series.length;
  let growing = n >= GROWING;
  for (let k = 1; k < n && growing; k++) growing = shallower(series[k - 1], series[k], keep);
  if (growing) return true;
  if (n < REPEATS) return false;
  for (let k = n - REPEATS + 1; k < n; k++) {
    if (!alike(series[k], series[k - 1], keep)) return false;
    if (k >= n - REPEATS + 2 && !within(series[k].at - series[k - 1].at, series[k - 1].at - series[k - 2].at, keep)) return false;
  }
  return true;
}

/**
 * Whether a series of collapses is dying away, the swing's excursions about its level shrinking
 * geometrically: each collapse since the deepest (deeper than every one before it) shallower than
 * the one before by at least the factor `keep`. Collapses of the same or a growing depth are not.
 */
export function collapsesDying(series: readonly Collapse[], keep: number): boolean {
  let k = series.length - 1;
  while (k > 0 && shallower(series[k], series[k - 1], keep)) k--;
  if (k === series.length - 1) return false;
  for (let j = 0; j < k; j++) if (shallower(series[k], series[j], 1)) return false;
  return true;
}
