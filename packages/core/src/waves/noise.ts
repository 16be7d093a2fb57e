import { streamKey } from "../random/counter-normal.js";
import { INTERPOLATED_VARIANCE, SmoothNoise } from "./smooth-noise.js";
import type { Wave } from "./wave.js";

export interface NoiseSettings {
  readonly rms: number;
  readonly seed: number;
  readonly corner: number;
  /** Time after which the level fades to zero within one sample interval. */
  readonly stop: number;
  /** Names the random stream under the seed (a part's name); default `noise`. */
  readonly stream?: string;
}

/**
 * Band-limited, seeded white noise of r.m.s. `rms`: independent normal samples every
 * 1/(2·corner) seconds joined by the Catmull–Rom spline (see `SmoothNoise`), so the level is a
 * fixed function of time (the same for any time step), has no corners to land on, and is
 * reproduced bit for bit from (seed, stream name).
 */
export function noiseWave(s: NoiseSettings): Wave {
  const noise = new SmoothNoise([streamKey(s.seed, s.stream ?? "noise")], [s.rms / Math.sqrt(INTERPOLATED_VARIANCE)], s.corner, s.stop);
  const out = new Float64Array(1);
  return {
    value(t) {
      noise.evaluate(t, out);
      return out[0]!;
    },
    nextBreakpoint: () => Infinity,
    quietAfter: Number.isFinite(noise.quietAfter) ? noise.quietAfter : undefined,
  };
}
