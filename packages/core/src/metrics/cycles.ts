import { isJump, type CrossingList } from "./crossings.js";
import { cubicOnInterval, cubicScratch, cubicStationaryPoints, cubicValue } from "./local-cubic.js";

/**
 * The complete cycles between consecutive rising crossings, with each cycle's extremes refined
 * on the local cubic. Cycle k runs from `start[k]` to `start[k+1]`.
 */
export interface CycleTable {
  readonly count: number;
  /** Crossing times; `count + 1` of them. */
  readonly start: Float64Array;
  readonly maximum: Float64Array;
  readonly minimum: Float64Array;
  /** Per-cycle envelope (maximum − minimum)/2, V. */
  readonly envelope: Float64Array;
  /**
   * Per-cycle strength √2 × the r.m.s. about the cycle's own mean, V: the amplitude of a sine of
   * the same power. Unlike the extremes, a corner overshoot of one or two samples barely moves it
   * (its share of the cycle's power is its share of the time), so settling is judged on it.
   */
  readonly strength: Float64Array;
  /** Per-cycle mean, V: moves while the DC levels still settle (a power-on transient). */
  readonly mean: Float64Array;
  /** Midpoint of each cycle, the time its envelope value is plotted and fitted at. */
  readonly midTime: Float64Array;
}

/** How far below its inner neighbour each outer node of a cap must lie, relative to their span. */
const CAP_MARGIN = 1e-4;

/**
 * Largest (`sign` = 1) or smallest (`sign` = −1) value of the piecewise cubic near sample `k`,
 * over the intervals either side of it that lie within `[from, to]`.
 *
 * An interval's cubic is trusted between samples only where its four samples form a cap (each
 * outer one clearly below its inner neighbour, for a maximum): a smooth peak always does. At
 * the edge of a clipped plateau the outer sample on the plateau side is level with the inner
 * one, and the cubic there bulges past the plateau by a few tenths of a percent of the swing,
 * by an amount that changes with where the samples fall; that would make a clipped, perfectly
 * steady oscillation look unsettled. There the extreme sample itself is used. So it is at a
 * corner (a triangle's tip, where the slope flips between two straight stretches: the second
 * difference there is more than {@link CORNER_RATIO} times those beside it), which the cubic
 * would round over by a fraction of a step's change.
 */
function refinedExtreme(
  t: Float64Array,
  v: Float64Array,
  k: number,
  sign: 1 | -1,
  from: number,
  to: number,
  c: Float64Array,
  roots: Float64Array,
): number {
  let best = sign * v[k];
  if (isCorner(t, v, k) || isJump(v, k) || (k > 0 && isJump(v, k - 1))) return v[k];
  for (let i = k - 1; i <= k; i++) {
    if (i < 1 || i + 2 >= t.length) continue;
    const a = sign * v[i - 1];
    const b = sign * v[i];
    const d = sign * v[i + 1];
    const e = sign * v[i + 2];
    const margin = CAP_MARGIN * (Math.max(a, b, d, e) - Math.min(a, b, d, e));
    if (!(b - a > margin && d - e > margin)) continue;
    cubicOnInterval(t, v, i, c);
    const count = cubicStationaryPoints(c, roots);
    const h = t[i + 1] - t[i];
    for (let r = 0; r < count; r++) {
      const time = t[i] + roots[r] * h;
      if (time < from || time > to) continue;
      const value = sign * cubicValue(c, roots[r]);
      if (value > best) best = value;
    }
  }
  return sign * best;
}

// v at time `time` within interval i (t[i] ≤ time ≤ t[i+1]), on the straight line between them.
function linearAt(t: Float64Array, v: Float64Array, i: number, time: number): number {
  const h = t[i + 1] - t[i];
  return h > 0 ? v[i] + ((v[i + 1] - v[i]) * (time - t[i])) / h : v[i];
}

/** The mean between two crossing times and √2 × the r.m.s. about it, by the trapezoid rule, into `out`. */
function cycleStrength(t: Float64Array, v: Float64Array, from: number, fromInterval: number, to: number, toInterval: number, out: Float64Array): void {
  let area = 0;
  let squares = 0;
  const piece = (ta: number, va: number, tb: number, vb: number) => {
    const h = tb - ta;
    area += 0.5 * h * (va + vb);
    squares += 0.5 * h * (va * va + vb * vb);
  };
  let time = from;
  let value = linearAt(t, v, fromInterval, from);
  for (let i = fromInterval + 1; i <= toInterval; i++) {
    piece(time, value, t[i], v[i]);
    time = t[i];
    value = v[i];
  }
  piece(time, value, to, linearAt(t, v, toInterval, to));
  const span = to - from;
  const mean = area / span;
  out[0] = mean;
  out[1] = Math.sqrt(2 * Math.max(0, squares / span - mean * mean));
}

/** A corner's second difference exceeds its neighbours' by this factor. */
const CORNER_RATIO = 20;

// Second divided difference at sample i (0 at the record's ends).
function secondDifference(t: Float64Array, v: Float64Array, i: number): number {
  if (i < 1 || i + 1 >= t.length) return 0;
  const right = (v[i + 1] - v[i]) / (t[i + 1] - t[i]);
  const left = (v[i] - v[i - 1]) / (t[i] - t[i - 1]);
  return (right - left) / (t[i + 1] - t[i - 1]);
}

/** Whether sample k is a corner between two straight stretches. */
function isCorner(t: Float64Array, v: Float64Array, k: number): boolean {
  if (k < 2 || k + 2 >= t.length) return false;
  const here = Math.abs(secondDifference(t, v, k));
  const beside = Math.max(Math.abs(secondDifference(t, v, k - 1)), Math.abs(secondDifference(t, v, k + 1)));
  return here > CORNER_RATIO * beside;
}

/** Builds the cycle table from the crossings found by `findRisingCrossings`. */
export function cyclesBetween(t: Float64Array, v: Float64Array, crossings: CrossingList): CycleTable {
  const count = Math.max(0, crossings.times.length - 1);
  const maximum = new Float64Array(count);
  const minimum = new Float64Array(count);
  const envelope = new Float64Array(count);
  const strength = new Float64Array(count);
  const mean = new Float64Array(count);
  const pair = new Float64Array(2);
  const midTime = new Float64Array(count);
  const c = cubicScratch();
  const roots = new Float64Array(2);
  for (let k = 0; k < count; k++) {
    const from = crossings.times[k];
    const to = crossings.times[k + 1];
    // Samples strictly after the first crossing's interval start, up to the second crossing's.
    const first = crossings.intervals[k] + 1;
    const last = Math.max(first, crossings.intervals[k + 1]);
    let iMax = first;
    let iMin = first;
    for (let i = first + 1; i <= last; i++) {
      if (v[i] > v[iMax]) iMax = i;
      if (v[i] < v[iMin]) iMin = i;
    }
    maximum[k] = refinedExtreme(t, v, iMax, 1, from, to, c, roots);
    minimum[k] = refinedExtreme(t, v, iMin, -1, from, to, c, roots);
    envelope[k] = 0.5 * (maximum[k] - minimum[k]);
    cycleStrength(t, v, from, crossings.intervals[k], to, crossings.intervals[k + 1], pair);
    mean[k] = pair[0]!;
    strength[k] = pair[1]!;
    midTime[k] = 0.5 * (from + to);
  }
  return { count, start: crossings.times, maximum, minimum, envelope, strength, mean, midTime };
}
