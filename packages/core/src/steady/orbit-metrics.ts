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
 * The unknowns' rates at grid point k of a periodic orbit, into `out`: the derivative of the
 * quadratic through the point and its two neighbours (wrapping around the period), second order
 * on any grid. One point at a time, so a period is read without a copy of its states.
 */
export function orbitRate(times: Float64Array, states: readonly Float64Array[], k: number, out: Float64Array): Float64Array {
  const N = times.length - 1;
  const T = times[N]! - times[0]!;
  const kk = k === N ? 0 : k;
  const before = kk === 0 ? N - 1 : kk - 1;
  const after = kk + 1;
  const hb = times[kk]! - (kk === 0 ? times[N - 1]! - T : times[before]!);
  const ha = times[after]! - times[kk]!;
  const xb = states[before]!;
  const x0 = states[kk]!;
  const xa = states[after]!;
  for (let i = 0; i < out.length; i++) {
    out[i] = (-ha / (hb * (ha + hb))) * xb[i]! + ((ha - hb) / (ha * hb)) * x0[i]! + (hb / (ha * (ha + hb))) * xa[i]!;
  }
  return out;
}

/** The times of the orbit's grid points from its start (step k is fractions[k]·T; the last is T exactly). */
export function orbitTimes(orbit: PeriodicOrbit): Float64Array {
  const N = orbit.fractions.length;
  const times = new Float64Array(N + 1);
  for (let k = 0; k < N; k++) times[k + 1] = times[k]! + orbit.fractions[k]! * orbit.start.period;
  times[N] = orbit.start.period;
  return times;
}

/** The probe over one period of the orbit: times from the orbit's start, and values. */
export function orbitWaveform(orbit: PeriodicOrbit, read: ProbeReader): { time: Float64Array; values: Float64Array } {
  const { states } = orbit;
  const time = orbitTimes(orbit);
  const rate = new Float64Array(states[0]!.length);
  const values = Float64Array.from(states, (x, k) => read(x, orbitRate(time, states, k, rate), orbit.start.t0 + time[k]!));
  return { time, values };
}

/**
 * Frequency, swing, r.m.s., offset, THD and harmonics of the probe over one period of the orbit.
 * The samples are extended by one point on each side from the other end of the period, so the
 * local cubics (the same interpolant the start-up metrics use) see a periodic signal; the
 * harmonics come from its uniform resampling over exactly one period.
 */
export function orbitMetrics(orbit: PeriodicOrbit, read: ProbeReader, maxOrder: number, corners: readonly number[] = []): OrbitMetrics {
  const { states } = orbit;
  const T = orbit.start.period;
  const N = orbit.fractions.length;
  const times = orbitTimes(orbit);
  const rate = new Float64Array(states[0]!.length);
  const t = new Float64Array(N + 3);
  const v = new Float64Array(N + 3);
  for (let k = 0; k <= N; k++) {
    t[k + 1] = times[k]!;
    v[k + 1] = read(states[k]!, orbitRate(times, states, k, rate), orbit.start.t0 + times[k]!);
  }
  t[0] = times[N - 1]! - T;
  v[0] = v[N]!;
  t[N + 2] = T + times[1]!;
  v[N + 2] = v[2]!;
  const analysis = analyseCycles(t, v, 0, T, 1, maxOrder, 1 / T);
  // Grid points on a source's corner (times from t₀): the waveform bends there, so no cubic spans them for the extremes.
  const span = 1e-9 * T;
  const bent = new Uint8Array(t.length);
  for (const c of corners) for (let k = 1; k < t.length - 1; k++) if (Math.abs(t[k]! - c) <= span) bent[k] = 1;
  const { maximum, minimum } = extremes(t, v, bent);
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

/**
 * The largest and smallest values over the samples' intervals (one period): the samples, and the
 * local cubics' stationary points on intervals whose cubic does not span a bent point.
 */
function extremes(t: Float64Array, v: Float64Array, bent: Uint8Array): { maximum: number; minimum: number } {
  const c = cubicScratch();
  const roots = new Float64Array(2);
  let maximum = -Infinity;
  let minimum = Infinity;
  for (let i = 1; i < t.length - 2; i++) {
    maximum = Math.max(maximum, v[i]!);
    minimum = Math.min(minimum, v[i]!);
    // The cubic on interval i passes through samples i − 1 … i + 2.
    if (bent[i - 1] || bent[i] || bent[i + 1] || bent[i + 2]) continue;
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
