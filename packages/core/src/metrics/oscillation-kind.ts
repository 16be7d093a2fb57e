import type { WaveformShape } from "./waveform-shape.js";
import { commonPeriod } from "../steady/common-period.js";

/** What the circuit's bias point predicts, linearised: the rightmost complex pair and real poles. */
export interface LinearPrediction {
  /** Hz of the dominant (rightmost) complex pair, or null when every pole is real. */
  readonly frequency: number | null;
  /**
   * Hz of that pair's modulus |s|/2π, or null. A loop gain moves a resonator's pair along the
   * circle |s| = ω₀ (the Wien bridge's s² + (3 − A)·ω₀·s + ω₀²), and the amplitude control
   * brings it back to the axis at ω₀: with a large start-up gain the settled frequency is near
   * the modulus, far from the imaginary part.
   */
  readonly naturalFrequency?: number | null;
  /** True when that pair lies in the right half-plane: a sine oscillation starts. */
  readonly starts: boolean;
  /** True when a real pole lies in the right half-plane: the bias point runs away without ringing. */
  readonly realGrowth: boolean;
}

/** Kinds of steady oscillation. */
export type SteadyKind = "settled" | "relaxation" | "parasitic";

/** Why a steady oscillation got its kind. */
export type SteadyReason =
  | { readonly kind: "settled"; readonly driven?: number; readonly common?: boolean }
  | { readonly kind: "relaxation"; readonly why: "square" | "triangle" | "no-ringing"; readonly predicted: number | null }
  | { readonly kind: "parasitic"; readonly predicted: number | null };

/** Slope crest above this: a square-like swing (edges far steeper than a sine of its size). */
export const SQUARE_CREST = 4;
/** Slope crest below this: a triangle (straight slopes; a sine has π/2 ≈ 1.57). */
export const TRIANGLE_CREST = 1.2;
/** A frequency this factor or more away from the predicted pair's is not that pair's oscillation. */
export const FAR_FACTOR = 2;
/** A frequency within this fraction of a periodic source's follows that source. */
export const DRIVEN_TOLERANCE = 0.01;

/**
 * The kind of a steady oscillation, from the linear prediction (the mechanism, the same at every
 * probe) first and the probe's waveform shape only where the mechanism leaves it open:
 * 1. `settled` if its frequency is one of `drives`, a periodic source's, or their common one (a
 *    driven waveform, any shape; see {@link drivingFrequency});
 * 2. `relaxation` if the bias point has no growing complex pair but a growing real pole: the
 *    loop runs away to a limit and recovers instead of ringing;
 * 3. `settled` if its frequency lies within a factor {@link FAR_FACTOR} of the predicted pair's
 *    (its imaginary part or its modulus): the sine oscillation the poles predict, however hard
 *    it is limited, however far the start-up gain moved the pair;
 * 4. otherwise (far from the pair, or no pair): `relaxation` if the probe sees a square-like
 *    swing (slope crest above {@link SQUARE_CREST}) or a triangle (below {@link TRIANGLE_CREST}),
 *    else `parasitic`. Without a prediction, only the shape is used (square or triangle:
 *    `relaxation`, else `settled`).
 */
export function steadyKind(shape: WaveformShape, frequency: number, prediction: LinearPrediction | undefined, drives: readonly number[] = []): SteadyReason {
  const driven = drivingFrequency(frequency, drives, DRIVEN_TOLERANCE);
  if (driven !== undefined) return { kind: "settled", driven, ...(drives.includes(driven) ? {} : { common: true }) };
  const switching = shape.slopeCrest > SQUARE_CREST ? "square" : shape.slopeCrest < TRIANGLE_CREST ? "triangle" : null;
  if (!prediction) return switching ? { kind: "relaxation", why: switching, predicted: null } : { kind: "settled" };
  const predicted = prediction.frequency;
  if (!prediction.starts && prediction.realGrowth) return { kind: "relaxation", why: "no-ringing", predicted };
  const near = (f: number | null) => f !== null && Math.abs(Math.log(frequency / f)) < Math.log(FAR_FACTOR);
  if (near(predicted) || near(prediction.naturalFrequency ?? null)) return { kind: "settled" };
  return switching ? { kind: "relaxation", why: switching, predicted } : { kind: "parasitic", predicted };
}

/**
 * The periodic source a measured frequency is, within `tolerance` (relative): one source's, else
 * the sources' common frequency (600 Hz and 900 Hz repeat together at 300 Hz, of which they are
 * harmonics 2 and 3: the driven waveform's period is the common one, with no tone of its own).
 */
export function drivingFrequency(frequency: number, drives: readonly number[], tolerance: number): number | undefined {
  const driven = drives.find((f) => Math.abs(frequency / f - 1) <= tolerance);
  if (driven !== undefined || drives.length < 2) return driven;
  const common = commonPeriod(drives);
  return common !== null && Math.abs(frequency * common - 1) <= tolerance ? 1 / common : undefined;
}
