import type { ProbeReader } from "../analyses/probes.js";
import { analyseCycles } from "../metrics/harmonic-analysis.js";
import { cubicOnInterval, cubicScratch, cubicStationaryPoints, cubicValue } from "../metrics/local-cubic.js";
import type { Harmonic } from "../metrics/spectrum.js";
import type { PeriodicOrbit } from "./shooting.js";

/** The settled figures of one period of an orbit, at one probe (same definitions as the start-up metrics). */
export interface OrbitMetrics {
  /** Hz: 1/T. */
  readonly frequency: number;
  /** Half the peak-to-peak swing over the period. */
  readonly amplitude: number;
  readonly peakToPeak: number;
  /** r.m.s. over the period, the offset included. */
  readonly rms: number;
  /** Mean over the period. */
  readonly offset: number;
  /** THD_F over harmonics 2 … maxOrder, a fraction. */
  readonly thd: number;
  readonly harmonics: Harmonic[];
}

/**
 * The unknowns' rates at the grid points of a periodic orbit: the derivative of the quadratic
 * through each point and its two neighbours (wrapping around the period), second order on any grid.
 */
function orbitRates(times: Float64Array, states: readonly Float64Array[], n: number): Float64Array[] {
  const N = times.length - 1;
  const T = times[N]! - times[0]!;
  return states.map((_, k) => {
    const kk = k === N ? 0 : k;
    const before = kk === 0 ? N - 1 : kk - 1;
    const after = kk + 1;
    const hb = times[kk]! - (kk === 0 ? times[N - 1]! - T : times[before]!);
    const ha = times[after]! - times[kk]!;
    const xb = states[before]!;
    const x0 = states[kk]!;
    const xa = states[after]!;
    const rate = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      rate[i] = (-ha / (hb * (ha + hb))) * xb[i]! + ((ha - hb) / (ha * hb)) * x0[i]! + (hb / (ha * (ha + hb))) * xa[i]!;
    }
    return rate;
  });
}

/**
 * Frequency, swing, r.m.s., offset, THD and harmonics of the probe over one period of the orbit.
 * The samples are extended by one point on each side from the other end of the period, so the
 * local cubics (the same interpolant the start-up metrics use) see a periodic signal; the
 * harmonics come from its uniform resampling over exactly one period.
 */
export function orbitMetrics(orbit: PeriodicOrbit, read: ProbeReader, maxOrder: number): OrbitMetrics {
  const { states, fractions } = orbit;
  const T = orbit.start.period;
  const N = fractions.length;
  const times = new Float64Array(N + 1);
  for (let k = 0; k < N; k++) times[k + 1] = times[k]! + fractions[k]! * T;
  times[N] = T;
  const n = states[0]!.length;
  const rates = orbitRates(times, states, n);
  const t = new Float64Array(N + 3);
  const v = new Float64Array(N + 3);
  for (let k = 0; k <= N; k++) {
    t[k + 1] = times[k]!;
    v[k + 1] = read(states[k]!, rates[k]!, orbit.start.t0 + times[k]!);
  }
  t[0] = times[N - 1]! - T;
  v[0] = v[N]!;
  t[N + 2] = T + times[1]!;
  v[N + 2] = v[2]!;
  const analysis = analyseCycles(t, v, 0, T, 1, maxOrder, 1 / T);
  const { maximum, minimum } = extremes(t, v);
  return {
    frequency: 1 / T,
    amplitude: 0.5 * (maximum - minimum),
    peakToPeak: maximum - minimum,
    rms: analysis.rms,
    offset: analysis.offset,
    thd: analysis.thd,
    harmonics: analysis.harmonics,
  };
}

/** The largest and smallest values of the local cubics over the samples' intervals (one period). */
function extremes(t: Float64Array, v: Float64Array): { maximum: number; minimum: number } {
  const c = cubicScratch();
  const roots = new Float64Array(2);
  let maximum = -Infinity;
  let minimum = Infinity;
  for (let i = 1; i < t.length - 2; i++) {
    maximum = Math.max(maximum, v[i]!);
    minimum = Math.min(minimum, v[i]!);
    cubicOnInterval(t, v, i, c);
    const count = cubicStationaryPoints(c, roots);
    for (let r = 0; r < count; r++) {
      const value = cubicValue(c, roots[r]!);
      maximum = Math.max(maximum, value);
      minimum = Math.min(minimum, value);
    }
  }
  return { maximum, minimum };
}
