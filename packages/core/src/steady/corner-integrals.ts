import type { Harmonic } from "../metrics/spectrum.js";
import { bendAt, CORNER_BEND, periodicSample } from "./orbit-metrics.js";

/** How far a grid's r.m.s. and THD may be off from the corners of its waveform (see `cornerIntegralBounds`). */
export interface CornerIntegralBounds {
  readonly rms: number;
  readonly thd: number;
  /** Corners found, on the grid and on the uniform resampling. */
  readonly corners: number;
}

/** The probe over one period laid out as `orbitFigures` does: samples 1 … N + 1 span it, one more from the other end on each side. */
export interface PeriodSamples {
  readonly t: Float64Array;
  readonly v: Float64Array;
}

/**
 * Bounds on the error that the waveform's corners (an op-amp running into its rail clamp, a
 * diode turning on: a jump Δs in the slope within one step) put into the period's integrals on
 * one grid. rms and THD are integrals over the period, and across a corner neither the map's
 * step, nor the local cubic, nor the uniform resampling the spectrum is taken from is second
 * order in the usual sense: each errs by O(Δs·step²) with a coefficient set by where the corner
 * falls within its step, so the error does not shrink steadily from one grid to the next and
 * the two grids' difference can miss it (a Wien clipped at its rails: the grids' r.m.s. agreed
 * to 1e-7 where both were 1e-6 off).
 *
 * The area error near one corner, in ∫v dt:
 * - on the orbit's own grid (`samples`, step h about the corner): Δs·h²/8 from the map's step
 *   across it (a trapezoid-like rule on an integrand with a kink at θ·h errs by θ(1 − θ)·Δs·h²/2,
 *   the triangle between chord and kink, largest at θ = ½), and Δs·h²/8 from the local cubics
 *   whose four samples straddle it (∫|p − r| over those intervals for a ramp r of unit slope
 *   jump, largest over θ: 0.1250, computed on a uniform grid);
 * - on the uniform resampling (`uniform`, spacing Δ = T/size): the periodic trapezoid rule on a
 *   kink at θ·Δ errs by Δs·Δ²·B₂(θ)/2 (Euler–Maclaurin; B₂(θ) = θ² − θ + 1/6), at most Δs·Δ²/12.
 * An area error A at time τ moves ∫v² by 2·v(τ)·A, so the r.m.s. by v(τ)·A/(T·rms), and each
 * harmonic's amplitude by at most 2A/T; the harmonics 2 … M then move the THD by at most
 * (2A/T)/a₁ · (Σ aₙ/‖a‖ + THD) (first order: the distortion's value at τ is at most Σ aₙ, the
 * fundamental's at most a₁).
 */
export function cornerIntegralBounds(samples: PeriodSamples, uniform: Float64Array, rms: number, thd: number, harmonics: readonly Harmonic[]): CornerIntegralBounds {
  const T = samples.t[samples.t.length - 2]! - samples.t[1]!;
  const own = cornerAreas(samples, 1 / 4);
  const resampled = cornerAreas(uniformSamples(uniform, T), 1 / 12);
  const area = own.area + resampled.area;
  const corners = own.corners + resampled.corners;
  if (area === 0) return { rms: 0, thd: 0, corners };
  const fundamental = harmonics[0]?.amplitude ?? 0;
  let sum = 0;
  let squares = 0;
  for (let n = 1; n < harmonics.length; n++) {
    sum += harmonics[n]!.amplitude;
    squares += harmonics[n]!.amplitude ** 2;
  }
  const spread = squares > 0 ? sum / Math.sqrt(squares) : 1;
  return {
    rms: rms > 0 ? (own.weighted + resampled.weighted) / (T * rms) : 0,
    thd: fundamental > 0 ? ((2 * area) / T / fundamental) * (spread + (Number.isFinite(thd) ? thd : 0)) : 0,
    corners,
  };
}

/**
 * The corners of the samples and their area error bounds, `coefficient`·Δs·h² each (h the longer
 * step next to the corner's sample, Δs the slope's jump between the steps beyond those two), in
 * all, weighted by |v| at the corner, and their count. A corner is a sample where the curvature (the second
 * divided difference) peaks at more than `CORNER_BEND` times its value two samples away on both
 * sides: a slope jump inside a step puts all of its bend into the two samples around it, where a
 * bend the samples resolve (a smooth extremum, a diode's knee spread over several steps) changes
 * little over two samples, and its error then follows the step's square like the rest.
 */
function cornerAreas(samples: PeriodSamples, coefficient: number): { area: number; weighted: number; corners: number } {
  const { t, v } = samples;
  const N = t.length - 3;
  const slope = (a: number, b: number) => {
    const p = periodicSample(t, v, a);
    const q = periodicSample(t, v, b);
    return (q.value - p.value) / (q.time - p.time);
  };
  let area = 0;
  let weighted = 0;
  let corners = 0;
  for (let k = 1; k <= N; k++) {
    const bend = bendAt(t, v, k);
    if (!(bend >= bendAt(t, v, k - 1) && bend > bendAt(t, v, k + 1)) || !(bend > CORNER_BEND * Math.max(bendAt(t, v, k - 2), bendAt(t, v, k + 2)))) continue;
    // The corner lies in one of the two steps next to sample k: the slopes of the steps beyond those give its jump.
    const jump = Math.abs(slope(k + 1, k + 2) - slope(k - 2, k - 1));
    const here = periodicSample(t, v, k);
    const h = Math.max(periodicSample(t, v, k + 1).time - here.time, here.time - periodicSample(t, v, k - 1).time);
    const a = coefficient * jump * h * h;
    area += a;
    weighted += Math.abs(here.value) * a;
    corners++;
  }
  return { area, weighted, corners };
}

/** Uniform samples over one period (the first at its start) in the layout of `PeriodSamples`. */
function uniformSamples(uniform: Float64Array, T: number): PeriodSamples {
  const size = uniform.length;
  const step = T / size;
  const t = Float64Array.from({ length: size + 3 }, (_, j) => (j - 1) * step);
  const v = Float64Array.from({ length: size + 3 }, (_, j) => uniform[(j - 1 + size) % size]!);
  return { t, v };
}
