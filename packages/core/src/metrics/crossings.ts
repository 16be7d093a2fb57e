import { badArgument, describe } from "../circuit/arguments.js";
import { checkWaveform } from "./waveform-check.js";
import { cubicLevelCrossing, cubicOnInterval, cubicScratch } from "./local-cubic.js";

/** Crossing times and, for each, the sample interval it falls in (`t[i] <= time <= t[i+1]`). */
export interface CrossingList {
  readonly times: Float64Array;
  readonly intervals: Int32Array;
}

/** An interval whose neighbours change by at most this fraction of its own change is a jump. */
const JUMP_FLAT = 1e-3;

/**
 * Whether interval i holds a jump: a change between two flat stretches, as at an ideal source
 * edge. The solver lands on such an edge and records the level just before it, so the jump
 * happens right after t[i].
 */
export function isJump(v: Float64Array, i: number): boolean {
  const change = Math.abs(v[i + 1] - v[i]);
  const before = i > 0 ? Math.abs(v[i] - v[i - 1]) : 0;
  const after = i + 2 < v.length ? Math.abs(v[i + 2] - v[i + 1]) : 0;
  return change > 0 && Math.max(before, after) <= JUMP_FLAT * change;
}

/**
 * Rising crossings of `level` with a Schmitt-trigger band: the detector arms when a sample
 * falls below `level − hysteresis` and fires when one reaches `level + hysteresis`; the crossing
 * reported is the last rising pass through `level` itself before it fired, timed on the local
 * cubic (at the start of the interval when it holds a jump, see `isJump`). Noise of peak size
 * below `hysteresis` can therefore neither add nor remove a crossing of a signal that swings
 * through the whole band. Samples `first … last` (inclusive) are used.
 */
export function findRisingCrossings(
  t: Float64Array,
  v: Float64Array,
  level: number,
  hysteresis: number,
  first = 0,
  last = t.length - 1,
): CrossingList {
  const low = level - hysteresis;
  const high = level + hysteresis;
  const c = cubicScratch();
  let times = new Float64Array(64);
  let intervals = new Int32Array(64);
  let count = 0;
  let armed = false;
  let lastBelow = -1;
  for (let k = first; k <= last; k++) {
    const x = v[k];
    if (!armed && x < low) armed = true;
    if (!armed) continue;
    if (x < level) lastBelow = k;
    else if (x >= high && lastBelow >= 0) {
      const i = lastBelow;
      let u = 0;
      if (!isJump(v, i)) {
        cubicOnInterval(t, v, i, c);
        u = cubicLevelCrossing(c, level);
      }
      if (count === times.length) {
        const grownTimes = new Float64Array(2 * count);
        grownTimes.set(times);
        times = grownTimes;
        const grownIntervals = new Int32Array(2 * count);
        grownIntervals.set(intervals);
        intervals = grownIntervals;
      }
      times[count] = t[i] + u * (t[i + 1] - t[i]);
      intervals[count] = i;
      count++;
      armed = false;
      lastBelow = -1;
    }
  }
  return { times: times.slice(0, count), intervals: intervals.slice(0, count) };
}

/**
 * Interpolated times at which `v` rises through `level`, with a hysteresis band of
 * ± `hysteresis` volts around it (see {@link findRisingCrossings}); only samples with
 * `from <= t <= to` take part.
 *
 * @param hysteresis - half-width of the band in volts, `>= 0`; 0 gives plain sign changes.
 */
export function risingCrossings(
  t: Float64Array,
  v: Float64Array,
  level: number,
  hysteresis: number,
  from = -Infinity,
  to = Infinity,
): Float64Array {
  checkWaveform("risingCrossings", t, v);
  if (!Number.isFinite(level)) throw badArgument(`risingCrossings: level must be finite (got ${describe(level)})`);
  if (!(hysteresis >= 0) || !Number.isFinite(hysteresis)) {
    throw badArgument(`risingCrossings: hysteresis must be finite and >= 0 (got ${describe(hysteresis)})`);
  }
  let first = 0;
  while (first < t.length && t[first] < from) first++;
  let last = t.length - 1;
  while (last >= 0 && t[last] > to) last--;
  if (last - first < 1) return new Float64Array(0);
  return findRisingCrossings(t, v, level, hysteresis, first, last).times;
}
