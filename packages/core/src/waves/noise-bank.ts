import type { NoiseGenerator, SourceTerm } from "../devices/device.js";
import { streamKey } from "../random/counter-normal.js";
import { sigmaForDensity, SmoothNoise } from "./smooth-noise.js";

/** How a set of noise generators is turned into time signals. */
export interface NoiseBankSettings {
  /** Seed of every stream; each generator's stream is keyed by (seed, its name). */
  readonly seed: number;
  /** Band: samples every 1/(2·corner), flat to within 0.4 % up to corner/5. */
  readonly corner: number;
  /** Time after which the noise fades out (Infinity: it lasts the whole run). */
  readonly stop?: number;
}

/**
 * Every generator of a circuit as one excitation: white noise of each generator's density,
 * band-limited at `corner`, from its own stream, injected as its small-signal description says
 * (gain·x into row `to`, out of row `from`). One object for all of them, so the spline weights
 * are computed once per time point and the solver calls one source, not dozens.
 */
export class NoiseBank implements SourceTerm {
  readonly quietAfter?: number;
  private readonly noise: SmoothNoise;
  private readonly levels: Float64Array;
  private readonly from: Int32Array;
  private readonly to: Int32Array;
  private readonly gain: Float64Array;

  constructor(generators: readonly NoiseGenerator[], settings: NoiseBankSettings) {
    const keys = generators.map((g) => streamKey(settings.seed, g.name));
    const sigmas = generators.map((g) => sigmaForDensity(g.density, settings.corner));
    this.noise = new SmoothNoise(keys, sigmas, settings.corner, settings.stop ?? Infinity);
    if (Number.isFinite(this.noise.quietAfter)) this.quietAfter = this.noise.quietAfter;
    this.levels = new Float64Array(generators.length);
    this.from = Int32Array.from(generators, (g) => g.from);
    this.to = Int32Array.from(generators, (g) => g.to);
    this.gain = Float64Array.from(generators, (g) => g.gain);
  }

  addSource(t: number, scale: number, u: Float64Array): void {
    const { levels, from, to, gain } = this;
    this.noise.evaluate(t, levels);
    for (let j = 0; j < levels.length; j++) {
      const v = scale * gain[j]! * levels[j]!;
      const a = from[j]!;
      const b = to[j]!;
      if (a >= 0) u[a] -= v;
      if (b >= 0) u[b] += v;
    }
  }

  nextBreakpoint(): number {
    return Infinity;
  }
}
