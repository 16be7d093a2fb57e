import type { CycleTable } from "./cycles.js";
import { resampledSize } from "./harmonic-analysis.js";
import { intervalAt } from "./local-cubic.js";
import { resampleUniform } from "./resample.js";
import { transformOfSize } from "./spectrum.js";

/**
 * The level the signal oscillates about, over the last `window` cycles of `cycles`: the mean of
 * v weighted by 1/E(t), where E is the per-cycle envelope interpolated log-linearly between
 * cycle mid-times (and extended the same way past the first and last).
 *
 * When the envelope is steady this is the plain mean over whole cycles. When it grows or
 * decays, the plain mean is pulled towards the larger cycles' lopsided halves by about
 * σ/ω of the envelope, which for a fast start-up is larger than the early cycles themselves,
 * so they would not cross it. For c + E₀e^{σt}·s(t) with s periodic and of zero mean, the
 * weighted mean is exactly c (mathematics: the weight cancels the growth).
 */
export function centreLevel(t: Float64Array, v: Float64Array, cycles: CycleTable, window: number): number {
  const n = cycles.count;
  const from = n - window;
  const start = cycles.start[from];
  const end = cycles.start[n];
  const size = resampledSize(intervalAt(t, end) - intervalAt(t, start) + 1, window, 1);
  const { samples } = transformOfSize(size);
  const step = (end - start) / size;
  resampleUniform(t, v, start, step, samples);
  const mid = cycles.midTime;
  const envelope = cycles.envelope;
  // Logarithms relative to the first cycle's, so the weights stay near 1.
  const base = Math.log(envelope[from]);
  let k = from;
  let sumWeights = 0;
  let sumWeighted = 0;
  for (let m = 0; m < size; m++) {
    let weight = 1;
    if (window > 1) {
      const time = start + m * step;
      while (k < n - 2 && time > mid[k + 1]) k++;
      const slope = (Math.log(envelope[k + 1]) - Math.log(envelope[k])) / (mid[k + 1] - mid[k]);
      weight = Math.exp(base - Math.log(envelope[k]) - slope * (time - mid[k]));
    }
    sumWeights += weight;
    sumWeighted += weight * samples[m];
  }
  return sumWeighted / sumWeights;
}
