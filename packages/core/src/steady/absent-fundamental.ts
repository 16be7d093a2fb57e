import type { Diagnostic, SourceSpan } from "../circuit/diagnostic.js";
import { formatQuantity } from "../metrics/format.js";
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
  const largest = largestAmplitude(harmonics);
  return largest > 0 && !(first >= ABSENT_SHARE * largest);
}

/** The harmonics' levels in dB relative to the largest of them (in place of the absent fundamental). */
export function relativeToLargest(harmonics: readonly Harmonic[]): Harmonic[] {
  const largest = largestAmplitude(harmonics);
  return harmonics.map((h) => ({ ...h, dBc: 20 * Math.log10(h.amplitude / largest) }));
}

function largestAmplitude(harmonics: readonly Harmonic[]): number {
  let largest = 0;
  for (const h of harmonics) largest = Math.max(largest, h.amplitude);
  return largest;
}

/** A source's frequency within this fraction of the orbit's is a tone at it. */
const SAME_TONE = 1e-6;

/** True when one of the sources' frequencies `drives` is `frequency` itself. */
export function sourceToneAt(drives: readonly number[], frequency: number): boolean {
  return drives.some((d) => Math.abs(d / frequency - 1) <= SAME_TONE);
}

/**
 * The note of a waveform without a fundamental at `frequency` at the probe: a driven one whose
 * sources' tones are all harmonics 2, 3, … of their common period, a driven one the probe sees
 * only at the harmonics of the sources' tone (a full-wave rectifier's output repeats at twice
 * it), or an oscillation the probe sees only at its harmonics. No THD is given. `drives`: the
 * sources' frequencies (none for an autonomous circuit).
 */
export function tonelessWarning(probe: string, frequency: number, drives: readonly number[], span: SourceSpan | undefined): Diagnostic {
  const f = formatQuantity(frequency, "Hz");
  const driven = drives.length > 0;
  const sourceTone = sourceToneAt(drives, frequency);
  const probeHint = "THD is not given; the harmonics' levels are relative to the largest of them. Probe a node that swings at";
  return {
    severity: "warning",
    stage: "simulation",
    code: "orbit-without-fundamental",
    message: !driven
      ? `the probe ${probe} carries no tone at the oscillation's frequency (${f}), only at its harmonics (a temperature or a power follows v², at twice the frequency): there is no fundamental to measure THD against`
      : sourceTone
        ? `the probe ${probe} carries no tone at the sources' frequency (${f}), only at its harmonics (a full-wave rectifier's output or a power repeats at twice it): there is no fundamental to measure THD against`
        : `the orbit's period is the sources' common one (${f}), at which no source has a tone: there is no fundamental to measure THD against`,
    ...(span ? { span } : {}),
    hint: !driven ? `${probeHint} the oscillation's frequency for its distortion` : sourceTone ? `${probeHint} the sources' frequency for its distortion` : "THD is not given; the harmonics' levels are relative to the largest of them",
  };
}
