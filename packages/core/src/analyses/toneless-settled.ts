import type { Diagnostic, SourceSpan } from "../circuit/diagnostic.js";
import type { StartupMetrics } from "../metrics/startup.js";
import { fundamentalAbsent, relativeToLargest, tonelessWarning } from "../steady/absent-fundamental.js";
import type { NumericalError } from "../steady/refine.js";

/**
 * A settled start-up's figures without THD when the probe's spectrum has no fundamental (see
 * `fundamentalAbsent`: 600 Hz and 900 Hz sources repeat at 300 Hz, where neither has a tone), with
 * the note that says so, as the steady analysis gives them; other figures unchanged.
 */
export function withoutAbsentFundamental<T extends { readonly metrics: StartupMetrics; readonly numericalError: NumericalError | null }>(
  refined: T,
  probe: string,
  driven: boolean,
  span: SourceSpan | undefined,
): { refined: T; warning: Diagnostic | null } {
  const m = refined.metrics;
  if (m.thd === null || m.frequency === null || !fundamentalAbsent(m.harmonics)) return { refined, warning: null };
  return {
    refined: {
      ...refined,
      metrics: { ...m, thd: null, thdPlusNoise: null, harmonics: relativeToLargest(m.harmonics) },
      numericalError: refined.numericalError && { ...refined.numericalError, thd: NaN },
    },
    warning: tonelessWarning(probe, m.frequency, driven, span),
  };
}
