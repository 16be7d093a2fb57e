import { cubicOnInterval, cubicScratch, cubicValue, intervalAt } from "../metrics/local-cubic.js";
import { orbitTimes } from "./orbit-metrics.js";
import type { PeriodicOrbit } from "./shooting.js";

/** Largest number of repeats looked for within one shot period. */
const MAX_REPEATS = 8;
/**
 * A state repeats after T/k when it differs from itself by less than this share of its swing
 * (plus `floor`). The grid's local cubic reads the shifted state to about 1e-6 of the swing at
 * a hundred points per period, but the k turns lie on different grids, each with its own
 * discretisation error: a Wien bridge clipped at its rails, shot over four turns from the poles'
 * period (a quarter of its own), had turns 2e-3 of its swing apart and was reported at a quarter
 * of its frequency. A period-doubled orbit differs by far more, except just past its
 * bifurcation, where the shooting then finds the period-1 orbit next to it.
 */
const REPEAT_SHARE = 1e-2;
/** The share of its interval's change a reading T/k later may be off by (see `repeatsWithin`). */
const CORNER_SHARE = 0.5;

/**
 * How many times an autonomous orbit repeats within its period T: the largest k ≤ 8 such that
 * every state in `columns` (the charged unknowns; the others follow them) returns to its value
 * T/k later, at every grid point. x(T) = x(0) also holds for 2T, 3T, …: a shooting started
 * from a guess of about twice the period can converge there, and the figures would then be
 * those of a fundamental at half the frequency. 1 when it does not repeat.
 */
export function repeatsWithin(orbit: PeriodicOrbit, columns: ArrayLike<number>, floor: ArrayLike<number>): number {
  const times = orbitTimes(orbit);
  const N = times.length - 1;
  if (N < 4 * 2) return 1;
  const T = orbit.start.period;
  const values = Array.from(columns, (j) => Float64Array.from(orbit.states, (x) => x[j]!));
  const swing = values.map((v) => Math.max(...v) - Math.min(...v));
  const cubic = cubicScratch();
  // The value T/k later, read off the local cubic, and how far that reading may be off: a share
  // of the change across its interval, since at a corner (a swing clipped at a rail) the cubic
  // through four points misses the true path by a good part of that change.
  let slack = 0;
  const at = (v: Float64Array, t: number) => {
    const i = intervalAt(times, t);
    cubicOnInterval(times, v, i, cubic);
    slack = CORNER_SHARE * Math.abs(v[i + 1]! - v[i]!);
    return cubicValue(cubic, (t - times[i]!) / (times[i + 1]! - times[i]!));
  };
  const repeats = (k: number) =>
    values.every((v, c) => {
      const allowed = REPEAT_SHARE * swing[c]! + floor[columns[c]!]!;
      for (let n = 0; n < N; n++) {
        const later = (times[n]! + T / k) % T;
        const gap = Math.abs(at(v, later) - v[n]!);
        if (!(gap <= allowed + slack)) return false;
      }
      return true;
    });
  for (let k = MAX_REPEATS; k >= 2; k--) if (N >= 8 * k && repeats(k)) return k;
  return 1;
}
