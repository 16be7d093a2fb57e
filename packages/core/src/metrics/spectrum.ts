import { badArgument, describe } from "../circuit/arguments.js";
import FFT from "fft.js";

/** One harmonic of a periodic waveform. */
export interface Harmonic {
  /** 1 for the fundamental. */
  readonly order: number;
  /** Hz: order × fundamental frequency. */
  readonly frequency: number;
  /** V peak. */
  readonly amplitude: number;
  /** 20·log10(amplitude / fundamental amplitude); 0 for the fundamental. */
  readonly dBc: number;
}

/** Harmonic content of uniformly spaced samples that span a whole number of periods. */
export interface PeriodicSpectrum {
  /** Peak amplitudes of harmonics 1 … maxOrder (index 0 is the fundamental). */
  readonly amplitudes: Float64Array;
  /** Mean of the samples (the DC bin). */
  readonly mean: number;
  /** r.m.s. of the samples, the mean included. */
  readonly rms: number;
  /**
   * The sum of squared peak amplitudes of every bin from the lowest up to harmonic `maxOrder`,
   * the fundamental and DC excluded: harmonics and whatever noise lies in the band.
   */
  readonly bandResidual: number;
}

interface Transform {
  readonly fft: FFT;
  readonly spectrum: Float64Array;
  readonly samples: Float64Array;
}

// fft.js builds twiddle and bit-reversal tables per size; one transform (with its buffers) per
// size serves every later call, which matters when this runs once per Monte Carlo sample.
const transforms = new Map<number, Transform>();

/** The cached transform of a power-of-two `size`; its `samples` buffer is free for the caller. */
export function transformOfSize(size: number): Transform {
  let entry = transforms.get(size);
  if (entry === undefined) {
    entry = { fft: new FFT(size), spectrum: new Float64Array(2 * size), samples: new Float64Array(size) };
    transforms.set(size, entry);
  }
  return entry;
}

function isPowerOfTwo(n: number): boolean {
  return Number.isInteger(n) && n >= 2 && (n & (n - 1)) === 0;
}

/** The smallest power of two >= n (n >= 2). */
export function powerOfTwoAtLeast(n: number): number {
  return 2 ** Math.ceil(Math.log2(n));
}

function checkPeriodicArguments(api: string, samples: Float64Array, cycles: number, maxOrder: number): void {
  if (!isPowerOfTwo(samples.length)) {
    throw badArgument(`${api}: the sample count must be a power of two >= 2 (got ${describe(samples.length)})`);
  }
  if (!(Number.isInteger(cycles) && cycles >= 1)) {
    throw badArgument(`${api}: cycles must be a whole number >= 1 (got ${describe(cycles)})`);
  }
  if (!(Number.isInteger(maxOrder) && maxOrder >= 1)) {
    throw badArgument(`${api}: maxOrder must be a whole number >= 1 (got ${describe(maxOrder)})`);
  }
  if (maxOrder * cycles > samples.length / 2) {
    throw badArgument(
      `${api}: harmonic ${describe(maxOrder)} of ${describe(cycles)} cycles lies above the Nyquist bin of ${describe(samples.length)} samples`,
    );
  }
}

/**
 * The spectrum of samples the caller has checked (power-of-two count, harmonics below Nyquist).
 * Harmonic h sits on bin h·cycles, so a periodic signal shows no leakage; its peak amplitude
 * is 2|X|/M, or |X|/M on the Nyquist bin.
 */
export function spectrumOfCheckedSamples(samples: Float64Array, cycles: number, maxOrder: number): PeriodicSpectrum {
  const size = samples.length;
  const { fft, spectrum } = transformOfSize(size);
  fft.realTransform(spectrum, samples);
  const amplitudes = new Float64Array(maxOrder);
  for (let h = 1; h <= maxOrder; h++) {
    const bin = h * cycles;
    const magnitude = Math.hypot(spectrum[2 * bin], spectrum[2 * bin + 1]);
    amplitudes[h - 1] = ((bin === size / 2 ? 1 : 2) * magnitude) / size;
  }
  let sumSquares = 0;
  for (let m = 0; m < size; m++) sumSquares += samples[m] * samples[m];
  let bandResidual = 0;
  for (let bin = 1; bin <= maxOrder * cycles; bin++) {
    if (bin === cycles) continue;
    const a = ((bin === size / 2 ? 1 : 2) * Math.hypot(spectrum[2 * bin], spectrum[2 * bin + 1])) / size;
    bandResidual += a * a;
  }
  return { amplitudes, mean: spectrum[0] / size, rms: Math.sqrt(sumSquares / size), bandResidual };
}

/**
 * Harmonic amplitudes, mean and r.m.s. of uniformly spaced samples covering exactly `cycles`
 * periods (the sample after the last would start the next period), by fft.js.
 *
 * @param samples - a power-of-two count of samples (fft.js needs one).
 * @param maxOrder - highest harmonic; `maxOrder·cycles` must not exceed half the sample count.
 */
export function periodicSpectrum(samples: Float64Array, cycles: number, maxOrder: number): PeriodicSpectrum {
  checkPeriodicArguments("periodicSpectrum", samples, cycles, maxOrder);
  return spectrumOfCheckedSamples(samples, cycles, maxOrder);
}

/** THD_F = √(Σ_{h=2..H} A_h²) / A_1 from harmonic peak amplitudes A_1 … A_H, as a fraction. */
export function thdOfAmplitudes(amplitudes: Float64Array): number {
  let sum = 0;
  for (let h = 1; h < amplitudes.length; h++) sum += amplitudes[h] * amplitudes[h];
  return Math.sqrt(sum) / amplitudes[0];
}

/**
 * THD_F (a fraction) of uniformly spaced samples covering exactly `cycles` periods, counting
 * harmonics 2 … `maxOrder`. The sample count must be a power of two (fft.js).
 *
 * @defaultValue maxOrder = 10
 */
export function thdOfPeriodicSamples(samples: Float64Array, cycles: number, maxOrder = 10): number {
  checkPeriodicArguments("thdOfPeriodicSamples", samples, cycles, maxOrder);
  return thdOfAmplitudes(spectrumOfCheckedSamples(samples, cycles, maxOrder).amplitudes);
}

/** The {@link Harmonic} list of peak amplitudes whose fundamental is at `fundamental` Hz. */
export function harmonicList(amplitudes: Float64Array, fundamental: number): Harmonic[] {
  const list: Harmonic[] = [];
  const a1 = amplitudes[0];
  for (let h = 1; h <= amplitudes.length; h++) {
    const a = amplitudes[h - 1];
    list.push({ order: h, frequency: h * fundamental, amplitude: a, dBc: h === 1 ? 0 : 20 * Math.log10(a / a1) });
  }
  return list;
}
