import { badArgument, describe } from "../circuit/arguments.js";
import { checkWaveform } from "./waveform-check.js";
import { intervalAt } from "./local-cubic.js";
import { resampleUniform } from "./resample.js";
import { harmonicList, powerOfTwoAtLeast, spectrumOfCheckedSamples, thdOfAmplitudes, transformOfSize } from "./spectrum.js";
import type { Harmonic } from "./spectrum.js";

/** Harmonic content of a whole number of cycles of a non-uniformly sampled waveform. */
export interface HarmonicAnalysis {
  /** THD_F over harmonics 2 … maxOrder, a fraction. */
  readonly thd: number;
  /** THD+N: everything in the band up to harmonic maxOrder but the fundamental and DC, over the fundamental. */
  readonly thdPlusNoise: number;
  /** Harmonics 1 … maxOrder. */
  readonly harmonics: Harmonic[];
  /** Mean over the cycles (V). */
  readonly offset: number;
  /** r.m.s. over the cycles, the offset included (V). */
  readonly rms: number;
  /** Uniform points the cycles were resampled to (a power of two). */
  readonly sampleCount: number;
}

/** Fewest uniform points per cycle of the resampled grid. */
const MIN_POINTS_PER_CYCLE = 64;
/** Largest resampled grid: 2^20 points (its cached buffers take 24 MiB). */
const MAX_POINTS = 2 ** 20;

/**
 * The uniform grid size for `cycles` cycles: at least twice the record's own density, so
 * resampling loses nothing the samples resolved, at least 64 points and 4·maxOrder points per
 * cycle, rounded up to a power of two for fft.js.
 */
export function resampledSize(sampleCount: number, cycles: number, maxOrder: number): number {
  const perCycle = Math.max(MIN_POINTS_PER_CYCLE, 4 * maxOrder, (2 * sampleCount) / cycles);
  return Math.min(MAX_POINTS, powerOfTwoAtLeast(Math.ceil(cycles * perCycle)));
}

/**
 * Harmonic analysis of `cycles` whole periods of 1/`fundamental` starting at `fromTime`: the
 * local cubic is resampled to a power-of-two uniform grid over exactly that span, so harmonic h
 * lands on FFT bin h·cycles, then transformed with fft.js.
 *
 * @param fundamental - Hz; the span `cycles / fundamental` must lie inside the record.
 * @param maxOrder - highest harmonic counted.
 * @defaultValue maxOrder = 10
 */
export function harmonicAnalysis(
  t: Float64Array,
  v: Float64Array,
  fromTime: number,
  cycles: number,
  fundamental: number,
  maxOrder = 10,
): HarmonicAnalysis {
  checkWaveform("harmonicAnalysis", t, v);
  if (!(Number.isInteger(cycles) && cycles >= 1)) {
    throw badArgument(`harmonicAnalysis: cycles must be a whole number >= 1 (got ${describe(cycles)})`);
  }
  if (!(fundamental > 0) || !Number.isFinite(fundamental)) {
    throw badArgument(`harmonicAnalysis: fundamental must be a positive frequency in Hz (got ${describe(fundamental)})`);
  }
  if (!(Number.isInteger(maxOrder) && maxOrder >= 1)) {
    throw badArgument(`harmonicAnalysis: maxOrder must be a whole number >= 1 (got ${describe(maxOrder)})`);
  }
  const toTime = fromTime + cycles / fundamental;
  const last = t[t.length - 1];
  // Allow rounding in a span that ends on the record's last sample.
  const slack = 1e-9 * (last - t[0]);
  if (!(fromTime >= t[0] - slack) || !(toTime <= last + slack)) {
    throw badArgument(
      `harmonicAnalysis: ${describe(cycles)} cycles of ${describe(fundamental)} Hz from ${describe(fromTime)} s end at ${describe(toTime)} s, outside the record [${describe(t[0])}, ${describe(last)}] s`,
    );
  }
  return analyseCycles(t, v, fromTime, toTime, cycles, maxOrder, fundamental);
}

/**
 * {@link harmonicAnalysis} on a span the caller has checked; harmonic h is labelled
 * h·`fundamental` (by default the span's own, cycles / (toTime − fromTime)).
 */
export function analyseCycles(
  t: Float64Array,
  v: Float64Array,
  fromTime: number,
  toTime: number,
  cycles: number,
  maxOrder: number,
  fundamental = cycles / (toTime - fromTime),
): HarmonicAnalysis {
  const inside = intervalAt(t, toTime) - intervalAt(t, fromTime) + 1;
  let size = resampledSize(inside, cycles, maxOrder);
  while (maxOrder * cycles > size / 2) size *= 2;
  const { samples } = transformOfSize(size);
  resampleUniform(t, v, fromTime, (toTime - fromTime) / size, samples);
  const spectrum = spectrumOfCheckedSamples(samples, cycles, maxOrder);
  return {
    thd: thdOfAmplitudes(spectrum.amplitudes),
    thdPlusNoise: Math.sqrt(spectrum.bandResidual) / spectrum.amplitudes[0]!,
    harmonics: harmonicList(spectrum.amplitudes, fundamental),
    offset: spectrum.mean,
    rms: spectrum.rms,
    sampleCount: size,
  };
}
