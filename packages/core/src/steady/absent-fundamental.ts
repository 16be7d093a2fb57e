import type { Harmonic } from "../metrics/spectrum.js";

/**
 * The fundamental counts as absent when it is 60 dB or more below the largest harmonic: then it
 * is not the waveform's tone but a residue — the numerical floor of a driven orbit whose tones
 * are all harmonics 2, 3, … of the sources' common period (1 kHz and 1.5 kHz share 2 ms, of
 * which they are the 2nd and 3rd), or of a probe that swings at twice the orbit's frequency (a
 * lamp's temperature follows the power, v²), an amplifier offset's trace in such a squared
 * quantity, an intermodulation product. A THD against it would read 1000 or more: no
 * distortion figure.
 */
const ABSENT_SHARE = 1e-3;

/** True when the orbit's spectrum has no fundamental to measure distortion against (see `ABSENT_SHARE`). */
export function fundamentalAbsent(harmonics: readonly Harmonic[]): boolean {
  const first = harmonics[0]?.amplitude ?? 0;
  let largest = 0;
  for (const h of harmonics) largest = Math.max(largest, h.amplitude);
  return largest > 0 && !(first >= ABSENT_SHARE * largest);
}

/** The harmonics' levels in dB relative to the largest of them (in place of the absent fundamental). */
export function relativeToLargest(harmonics: readonly Harmonic[]): Harmonic[] {
  let largest = 0;
  for (const h of harmonics) largest = Math.max(largest, h.amplitude);
  return harmonics.map((h) => ({ ...h, dBc: 20 * Math.log10(h.amplitude / largest) }));
}
