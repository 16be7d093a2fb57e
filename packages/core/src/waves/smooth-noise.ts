import { normalPairAt, type StreamKey } from "../random/counter-normal.js";

// Catmull–Rom weights of the four samples around a point u ∈ [0, 1) of an interval.
function weights(u: number, w: Float64Array): void {
  const u2 = u * u;
  const u3 = u2 * u;
  w[0] = 0.5 * (-u3 + 2 * u2 - u);
  w[1] = 0.5 * (3 * u3 - 5 * u2 + 2);
  w[2] = 0.5 * (-3 * u3 + 4 * u2 + u);
  w[3] = 0.5 * (u3 - u2);
}

/**
 * Time-averaged variance of the interpolant of unit-variance independent samples, ∫₀¹ Σ wₖ² du,
 * by the midpoint rule: a wave whose samples have σ = rms/√(this) has the r.m.s. `rms`.
 */
export const INTERPOLATED_VARIANCE = (() => {
  const w = new Float64Array(4);
  const n = 4096;
  let sum = 0;
  for (let i = 0; i < n; i++) {
    weights((i + 0.5) / n, w);
    sum += w[0]! ** 2 + w[1]! ** 2 + w[2]! ** 2 + w[3]! ** 2;
  }
  return sum / n;
})();

/**
 * The sample σ that gives a one-sided density `density` (unit²/Hz) at low frequencies when
 * samples 1/(2·corner) apart are joined by the Catmull–Rom spline. The interpolant is
 * Σ aₖ·φ(t/Δ − k) with ∫φ = 1 (the weights sum to 1), so its time-averaged two-sided spectrum is
 * (σ²/Δ)·|Φ(f)|² with Φ(0) = Δ: one-sided 2σ²Δ = σ²/corner at f ≪ corner (mathematics: the
 * spectrum of a pulse train with independent amplitudes). Hence σ = √(density·corner).
 */
export function sigmaForDensity(density: number, corner: number): number {
  return Math.sqrt(density * corner);
}

/** The one-sided low-frequency density of samples with deviation σ, 1/(2·corner) apart. */
export function densityOfSigma(sigma: number, corner: number): number {
  return (sigma * sigma) / corner;
}

/**
 * Several band-limited, seeded white-noise streams on one sample clock: independent normal
 * samples every 1/(2·corner) seconds, joined by the C¹ Catmull–Rom spline, so each level is a
 * fixed function of time (the same for any time step) with no corners to land on.
 *
 * Sample k of a stream is σ·normalAt(key, k) (a pure function; `random/counter-normal.ts`), 0
 * for k ≤ 0 (every stream starts from 0 at t = 0) and past `lastSample`. Only the four samples
 * around the time last asked for are kept per stream, so memory does not grow with the run;
 * stepping forward computes one new sample per stream per sample interval.
 */
export class SmoothNoise {
  readonly count: number;
  readonly interval: number;
  /** Last nonzero sample index (Infinity: never stops). */
  readonly lastSample: number;
  /** From this time on every level is 0 (Infinity: never). */
  readonly quietAfter: number;
  private readonly keys: readonly StreamKey[];
  private readonly sigmas: Float64Array;
  /** Samples base … base + 3 of each stream, stream-major. */
  private readonly window: Float64Array;
  private base = Number.NaN;
  private readonly w = new Float64Array(4);
  /** Per stream, the Box–Muller pair last drawn and its pair index (samples come in pairs). */
  private readonly pairs: Float64Array;
  private readonly pairIndex: Float64Array;

  constructor(keys: readonly StreamKey[], sigmas: ArrayLike<number>, corner: number, stop = Infinity) {
    this.count = keys.length;
    this.keys = keys;
    this.sigmas = Float64Array.from(sigmas);
    this.interval = 1 / (2 * corner);
    this.lastSample = Number.isFinite(stop) ? Math.floor(stop / this.interval) : Infinity;
    // value() is 0 once k − 1 > lastSample, i.e. from t = (lastSample + 2)·interval on.
    this.quietAfter = Number.isFinite(this.lastSample) ? (this.lastSample + 2) * this.interval : Infinity;
    this.window = new Float64Array(4 * this.count);
    this.pairs = new Float64Array(2 * this.count);
    this.pairIndex = new Float64Array(this.count).fill(-1);
  }

  private sample(stream: number, k: number): number {
    if (k <= 0 || k > this.lastSample) return 0;
    const m = Math.floor(k / 2);
    if (this.pairIndex[stream] !== m) {
      normalPairAt(this.keys[stream]!, m, this.pair);
      this.pairs[2 * stream] = this.pair[0]!;
      this.pairs[2 * stream + 1] = this.pair[1]!;
      this.pairIndex[stream] = m;
    }
    return this.sigmas[stream]! * this.pairs[2 * stream + (k - 2 * m)]!;
  }

  private readonly pair = new Float64Array(2);

  /** Makes the window hold samples base … base + 3 of every stream. */
  private slide(base: number): void {
    const { window, count } = this;
    if (base === this.base + 1) {
      for (let j = 0; j < count; j++) {
        const o = 4 * j;
        window[o] = window[o + 1]!;
        window[o + 1] = window[o + 2]!;
        window[o + 2] = window[o + 3]!;
        window[o + 3] = this.sample(j, base + 3);
      }
    } else {
      for (let j = 0; j < count; j++) for (let m = 0; m < 4; m++) window[4 * j + m] = this.sample(j, base + m);
    }
    this.base = base;
  }

  /** Every stream's level at time t into `out` (zeros for t ≤ 0 and from `quietAfter` on). */
  evaluate(t: number, out: Float64Array): void {
    const count = this.count;
    if (!(t > 0) || t >= this.quietAfter) {
      for (let j = 0; j < count; j++) out[j] = 0;
      return;
    }
    const pos = t / this.interval;
    const k = Math.floor(pos);
    if (k - 1 !== this.base) this.slide(k - 1);
    const w = this.w;
    weights(pos - k, w);
    const w0 = w[0]!;
    const w1 = w[1]!;
    const w2 = w[2]!;
    const w3 = w[3]!;
    const window = this.window;
    for (let j = 0; j < count; j++) {
      const o = 4 * j;
      out[j] = w0 * window[o]! + w1 * window[o + 1]! + w2 * window[o + 2]! + w3 * window[o + 3]!;
    }
  }
}
