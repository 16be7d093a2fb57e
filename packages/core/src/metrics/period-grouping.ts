import type { CrossingList } from "./crossings.js";
import type { CycleTable } from "./cycles.js";

/** Most rising mean-crossings one period may hold before the waveform counts as irregular. */
export const MAX_CROSSINGS_PER_PERIOD = 8;
/** Sub-cycles m apart must match in length and envelope to this relative tolerance. */
const PATTERN_TOLERANCE = 0.01;

const matches = (a: number, b: number): boolean => Math.abs(a - b) <= PATTERN_TOLERANCE * b;

// Whether cycles first − m … count − 1 repeat with lag m: each cycle's length, and its envelope
// or its strength (see `CycleTable.strength`: a corner overshoot moves only the first), match
// those of the cycle m earlier.
function repeatsWithLag(cycles: CycleTable, m: number, first: number): boolean {
  const { start, envelope, strength } = cycles;
  for (let k = first; k < cycles.count; k++) {
    if (!matches(start[k + 1] - start[k], start[k + 1 - m] - start[k - m])) return false;
    if (!matches(envelope[k], envelope[k - m]) && !matches(strength[k], strength[k - m])) return false;
  }
  return true;
}

/**
 * How many rising crossings through the mean make up one period of the waveform, judged on the
 * record's tail: the smallest m (up to {@link MAX_CROSSINGS_PER_PERIOD}) for which the last
 * m·(`periods` + 1) crossing-to-crossing cycles repeat with lag m, else 1.
 *
 * A waveform rich in harmonics, such as the voltage behind a notch network that removes most of
 * the fundamental, can cross its mean upwards several times per period; its sub-cycles then
 * alternate in length and height, and only a group of m of them is a period. A growing or
 * wandering envelope matches no lag and keeps m = 1.
 */
export function crossingsPerPeriod(cycles: CycleTable, periods: number): number {
  for (let m = 1; m <= MAX_CROSSINGS_PER_PERIOD; m++) {
    if (cycles.count < 3 * m) break;
    const first = Math.max(m, cycles.count - m * (periods + 1));
    if (repeatsWithLag(cycles, m, first)) return m;
  }
  return 1;
}

/** A boundary within this fraction of a period of where one is expected is taken at once. */
const CLOSE = 0.25;

// Whether some crossing before `j` lies within CLOSE·period of one period before it.
function periodBefore(times: Float64Array, j: number, period: number): boolean {
  for (let i = j - 1; i >= 0 && times[i] >= times[j] - (1 + CLOSE) * period; i--) {
    if (Math.abs(times[j] - times[i] - period) <= CLOSE * period) return true;
  }
  return false;
}

/**
 * The crossings that start whole periods when a period holds `m` crossings: from the last
 * crossing back, each boundary is the crossing nearest one period (the tail's mean over up to
 * `periods` periods of m crossings each) before the previous boundary. Early in a start-up,
 * while the waveform is still nearly sinusoidal and crosses once per period, every crossing is
 * kept. A boundary more than a quarter period (and less than half) from where it is expected
 * is taken only if another crossing follows one period before it, so the one cycle where the
 * two regimes meet may be irregular but the record's first, partial period is not counted.
 */
export function periodCrossings(crossings: CrossingList, m: number, periods: number): CrossingList {
  if (m === 1) return crossings;
  const times = crossings.times;
  const n = times.length;
  const groups = Math.min(periods, Math.floor((n - 1) / m));
  const period = (times[n - 1] - times[n - 1 - groups * m]) / groups;
  const kept = [n - 1];
  let boundary = n - 1;
  for (;;) {
    const target = times[boundary] - period;
    let best = -1;
    let bestError = 0.5 * period;
    for (let j = boundary - 1; j >= 0 && times[j] >= target - period; j--) {
      const error = Math.abs(times[j] - target);
      if (error < bestError) {
        bestError = error;
        best = j;
      }
    }
    if (best < 0 || (bestError > CLOSE * period && !periodBefore(times, best, period))) break;
    boundary = best;
    kept.push(best);
  }
  kept.reverse();
  return {
    times: Float64Array.from(kept, (j) => times[j]),
    intervals: Int32Array.from(kept, (j) => crossings.intervals[j]),
  };
}
