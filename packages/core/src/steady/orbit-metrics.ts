import type { ProbeReader } from "../analyses/probes.js";
import { analyseCycles } from "../metrics/harmonic-analysis.js";
import { cubicOnInterval, cubicScratch, cubicStationaryPoints, cubicValue } from "../metrics/local-cubic.js";
import { resampleUniform } from "../metrics/resample.js";
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
  return orbitFigures(orbit, read, maxOrder, corners).metrics;
}

/** The probe's extremes over one period, each with how far its interpolant may be off (see `extremes`). */
export interface OrbitExtremes {
  readonly maximum: number;
  readonly minimum: number;
  readonly maximumSpread: number;
  readonly minimumSpread: number;
  /** The extremum sits on a corner of the waveform (see `onCorner`). */
  readonly maximumCorner: boolean;
  readonly minimumCorner: boolean;
}

/**
 * `orbitMetrics`, with the extremes the swing comes from and their interpolation spreads, the
 * probe's samples the figures were read from (times from the orbit's start; samples 1 … N + 1
 * span the period, one more from the other end of it on each side) and the uniform resampling
 * the r.m.s. and the spectrum were taken from (its first point at the orbit's start).
 */
export function orbitFigures(
  orbit: PeriodicOrbit,
  read: ProbeReader,
  maxOrder: number,
  corners: readonly number[] = [],
): { metrics: OrbitMetrics; extremes: OrbitExtremes; samples: { readonly t: Float64Array; readonly v: Float64Array }; uniform: Float64Array } {
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
  const found = extremes(t, v, bent);
  const { maximum, minimum } = found;
  const metrics = {
    frequency: 1 / T,
    amplitude: 0.5 * (maximum - minimum),
    peakToPeak: maximum - minimum,
    rms: analysis.rms,
    offset: analysis.offset,
    thd: analysis.thd,
    harmonics: analysis.harmonics,
  };
  const uniform = new Float64Array(analysis.sampleCount);
  resampleUniform(t, v, 0, T / analysis.sampleCount, uniform);
  return { metrics, extremes: found, samples: { t, v }, uniform };
}

/**
 * The largest and smallest values over the samples' intervals (one period): the samples, and the
 * local cubics' stationary points on intervals whose cubic does not span a bent point. Each comes
 * with its spread: how far the cubics through the neighbouring four samples (one sample earlier,
 * one later) lie from it at its time — O(h⁴) at a smooth extremum, O(h) at a corner (a diode
 * turning on right at it), where the extremum is not resolved to the order the extrapolation assumes.
 */
function extremes(t: Float64Array, v: Float64Array, bent: Uint8Array): OrbitExtremes {
  const c = cubicScratch();
  const roots = new Float64Array(2);
  let maximum = -Infinity;
  let minimum = Infinity;
  // Where each extreme lies: its nearest sample, and the interval and point of the cubic it is the stationary value of (interval −1: a sample).
  let maximumAt = 1;
  let minimumAt = 1;
  let maximumOn = -1;
  let minimumOn = -1;
  let maximumU = 0;
  let minimumU = 0;
  for (let i = 1; i < t.length - 2; i++) {
    if (Math.max(maximum, v[i]!) !== maximum) [maximum, maximumAt, maximumOn] = [Math.max(maximum, v[i]!), i, -1];
    if (Math.min(minimum, v[i]!) !== minimum) [minimum, minimumAt, minimumOn] = [Math.min(minimum, v[i]!), i, -1];
    // The cubic on interval i passes through samples i − 1 … i + 2.
    if (bent[i - 1] || bent[i] || bent[i + 1] || bent[i + 2]) continue;
    cubicOnInterval(t, v, i, c);
    const count = cubicStationaryPoints(c, roots);
    for (let r = 0; r < count; r++) {
      const u = roots[r]!;
      const value = cubicValue(c, u);
      const nearest = u < 0.5 ? i : i + 1;
      if (Math.max(maximum, value) !== maximum) [maximum, maximumAt, maximumOn, maximumU] = [Math.max(maximum, value), nearest, i, u];
      if (Math.min(minimum, value) !== minimum) [minimum, minimumAt, minimumOn, minimumU] = [Math.min(minimum, value), nearest, i, u];
    }
  }
  // (The spreads of the two extremes only, once the scan has found them.)
  const spread = (on: number, u: number, value: number) => (on < 0 ? 0 : stencilSpread(t, v, bent, on, u, value));
  return {
    maximum,
    minimum,
    maximumSpread: spread(maximumOn, maximumU, maximum),
    minimumSpread: spread(minimumOn, minimumU, minimum),
    maximumCorner: onCorner(t, v, maximumAt),
    minimumCorner: onCorner(t, v, minimumAt),
  };
}

/**
 * A waveform bends this many times more sharply at an extremum than three samples away on either
 * sides: a corner the grid does not resolve (a smooth extremum's curvature changes by a few per
 * cent over three steps; a diode turning on at a capacitor's minimum makes it thousands of times).
 */
export const CORNER_BEND = 2;

/**
 * True when the samples' curvature next to sample k (the second divided differences at k − 1, k,
 * k + 1) exceeds `CORNER_BEND` times the curvature three samples away on one side (the
 * samples taken around the period: t[1] … t[N + 1] span it, the first and last the same point).
 */
function onCorner(t: Float64Array, v: Float64Array, k: number): boolean {
  const near = Math.max(bendAt(t, v, k - 1), bendAt(t, v, k), bendAt(t, v, k + 1));
  const far = Math.min(bendAt(t, v, k - 3), bendAt(t, v, k + 3));
  return near > CORNER_BEND * far;
}

/** Sample j of the period laid out as `orbitFigures` does (t[1] … t[N + 1] span it), any j, continued periodically. */
export function periodicSample(t: Float64Array, v: Float64Array, j: number): { time: number; value: number } {
  const N = t.length - 3;
  const T = t[N + 1]! - t[1]!;
  const turns = Math.floor((j - 1) / N);
  const m = j - turns * N;
  return { time: t[m]! + turns * T, value: v[m]! };
}

/** The samples' curvature at sample j: |the second divided difference| through j − 1, j, j + 1 (periodic, see `periodicSample`). */
export function bendAt(t: Float64Array, v: Float64Array, j: number): number {
  const a = periodicSample(t, v, j - 1);
  const b = periodicSample(t, v, j);
  const c = periodicSample(t, v, j + 1);
  return Math.abs((2 * ((c.value - b.value) / (c.time - b.time) - (b.value - a.value) / (b.time - a.time))) / (c.time - a.time));
}

/**
 * The largest difference from `value` (the cubic of interval i at u) of the cubics through samples
 * i − 2 … i + 1 and i … i + 3 at the same time, those that exist and span no bent point.
 */
function stencilSpread(t: Float64Array, v: Float64Array, bent: Uint8Array, i: number, u: number, value: number): number {
  const tau = t[i]! + u * (t[i + 1]! - t[i]!);
  let spread = 0;
  const c = cubicScratch();
  for (const first of [i - 2, i]) {
    if (first < 0 || first + 3 >= t.length) continue;
    if (bent[first] || bent[first + 1] || bent[first + 2] || bent[first + 3]) continue;
    // The cubic on interval first + 1 passes through samples first … first + 3.
    cubicOnInterval(t, v, first + 1, c);
    spread = Math.max(spread, Math.abs(cubicValue(c, (tau - t[first + 1]!) / (t[first + 2]! - t[first + 1]!)) - value));
  }
  return spread;
}
