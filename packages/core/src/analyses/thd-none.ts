import type { Diagnostic, SourceSpan } from "../circuit/diagnostic.js";
import { formatQuantity } from "../metrics/format.js";
import type { StartupMetrics } from "../metrics/startup.js";
import { fundamentalAbsent, relativeToLargest, tonelessWarning } from "../steady/absent-fundamental.js";
import type { NumericalError } from "../steady/refine.js";

type Refined = { readonly metrics: StartupMetrics; readonly numericalError: NumericalError | null };

/** The figures without THD (and THD+N): its error bar NaN (null in JSON). */
function withoutThd<T extends Refined>(refined: T, harmonics = refined.metrics.harmonics): T {
  return {
    ...refined,
    metrics: { ...refined.metrics, thd: null, thdPlusNoise: null, harmonics },
    numericalError: refined.numericalError && { ...refined.numericalError, thd: NaN },
  };
}

/**
 * A settled start-up's figures without THD when the probe's spectrum has no fundamental (see
 * `fundamentalAbsent`: 600 Hz and 900 Hz sources repeat at 300 Hz, where neither has a tone), with
 * the note that says so, as the steady analysis gives them; other figures unchanged.
 */
export function withoutAbsentFundamental<T extends Refined>(refined: T, probe: string, drives: readonly number[], span: SourceSpan | undefined): { refined: T; warning: Diagnostic | null } {
  const m = refined.metrics;
  if (m.thd === null || m.frequency === null || !fundamentalAbsent(m.harmonics)) return { refined, warning: null };
  return { refined: withoutThd(refined, relativeToLargest(m.harmonics)), warning: tonelessWarning(probe, m.frequency, drives, span) };
}

/** True when `bandwidth=` lies below the 2nd harmonic of `frequency`: THD has no harmonic to count. */
export function noHarmonicInBand(bandwidth: number | undefined, frequency: number): boolean {
  return bandwidth !== undefined && bandwidth < 2 * frequency;
}

/** The note of a THD that `bandwidth=` leaves without a harmonic. */
export function bandWarning(bandwidth: number, frequency: number, span: SourceSpan | undefined): Diagnostic {
  return {
    severity: "warning",
    stage: "simulation",
    code: "no-harmonic-in-band",
    message: `no harmonic lies below bandwidth=${formatQuantity(bandwidth, "Hz")}: the 2nd is at ${formatQuantity(2 * frequency, "Hz")}, so there is no distortion to count`,
    ...(span ? { span } : {}),
    hint: `THD is not given; raise bandwidth= above ${formatQuantity(2 * frequency, "Hz")} (or use harmonics=) to measure it`,
  };
}

/** A settled start-up's figures without THD when `bandwidth=` lies below its 2nd harmonic, with the note that says so. */
export function withoutBandHarmonics<T extends Refined>(refined: T, bandwidth: number | undefined, span: SourceSpan | undefined): { refined: T; warning: Diagnostic | null } {
  const m = refined.metrics;
  if (m.thd === null || m.frequency === null || !noHarmonicInBand(bandwidth, m.frequency)) return { refined, warning: null };
  return { refined: withoutThd(refined), warning: bandWarning(bandwidth!, m.frequency, span) };
}
