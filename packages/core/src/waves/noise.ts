import { randomStream } from "../random/stream.js";
import type { Wave } from "./wave.js";

export interface NoiseSettings {
  readonly rms: number;
  readonly seed: number;
  readonly corner: number;
  /** Time after which the level fades to zero within one sample interval. */
  readonly stop: number;
}

// Catmull–Rom weights of the four samples around a point u ∈ [0, 1) of an interval.
function weights(u: number, w: Float64Array): void {
  const u2 = u * u;
  const u3 = u2 * u;
  w[0] = 0.5 * (-u3 + 2 * u2 - u);
  w[1] = 0.5 * (3 * u3 - 5 * u2 + 2);
  w[2] = 0.5 * (-3 * u3 + 4 * u2 + u);
  w[3] = 0.5 * (u3 - u2);
}

// Time-averaged variance of the interpolant of unit-variance independent samples, ∫₀¹ Σ wₖ² du,
// by the midpoint rule; dividing by its square root makes the continuous r.m.s. equal `rms`.
const interpolatedVariance = (() => {
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
 * Band-limited, seeded white noise: independent normal samples every 1/(2·corner) seconds,
 * joined by a C¹ Catmull–Rom spline, so the level is a fixed function of time (the same for any
 * time step) and has no corners to land on.
 */
export function noiseWave(s: NoiseSettings): Wave {
  const interval = 1 / (2 * s.corner);
  const scale = s.rms / Math.sqrt(interpolatedVariance);
  const lastSample = Number.isFinite(s.stop) ? Math.floor(s.stop / interval) : Infinity;
  const stream = randomStream(s.seed, 0x6e6f6973);
  let samples = new Float64Array(256);
  let drawn = 0;
  const w = new Float64Array(4);
  const sample = (k: number): number => {
    if (k <= 0 || k > lastSample) return 0;
    while (k >= drawn) {
      if (drawn === samples.length) {
        const grown = new Float64Array(samples.length * 2);
        grown.set(samples);
        samples = grown;
      }
      samples[drawn++] = stream.normal();
    }
    return samples[k]!;
  };
  return {
    value(t) {
      if (!(t > 0)) return 0;
      const pos = t / interval;
      const k = Math.floor(pos);
      if (k - 1 > lastSample) return 0;
      weights(pos - k, w);
      return scale * (w[0]! * sample(k - 1) + w[1]! * sample(k) + w[2]! * sample(k + 1) + w[3]! * sample(k + 2));
    },
    nextBreakpoint: () => Infinity,
    // value() is 0 once k − 1 > lastSample, i.e. from t = (lastSample + 2)·interval on.
    quietAfter: Number.isFinite(lastSample) ? (lastSample + 2) * interval : undefined,
  };
}
