import type { StartupAnalysis } from "../circuit/circuit.js";
import { inputError } from "../circuit/diagnostic.js";

/** Periods of the predicted oscillation the shortest start-up window holds: enough to see a cycle begin and end (common practice). */
export const MIN_WINDOW_PERIODS = 3;

/** Samples the start-up measurement needs at the least (its local cubic). */
const MIN_SAMPLES = 4;

function shown(seconds: number): string {
  return `${Number(seconds.toPrecision(3))} s`;
}

/**
 * Refuses a start-up run whose fixed `until` is too short for what it measures, at its
 * `until=` with the minimum: {@link MIN_WINDOW_PERIODS} periods of the predicted oscillation,
 * or, without one, the samples the measurement needs at the step the run takes.
 */
export function refuseShortWindow(analysis: StartupAnalysis, predictedFrequency: number | null, maxStep: number): void {
  if (typeof analysis.until !== "number") return;
  const periods = predictedFrequency !== null && predictedFrequency > 0 ? MIN_WINDOW_PERIODS / predictedFrequency : 0;
  const needed = Math.max(periods, MIN_SAMPLES * maxStep);
  if (analysis.until >= needed) return;
  const why = needed === periods ? `${MIN_WINDOW_PERIODS} periods of the predicted ${Number(predictedFrequency!.toPrecision(4))} Hz oscillation` : `${MIN_SAMPLES} steps of at most ${shown(maxStep)}`;
  throw inputError("window-too-short", `the start-up run until=${shown(analysis.until)} is too short to measure: it needs at least ${shown(needed)} (${why})`, {
    span: analysis.optionSpans?.until ?? analysis.span,
    hint: `write until=${Number(needed.toPrecision(2))} or longer, or until=auto`,
  });
}

/**
 * Refuses the measurement of an `until=auto` start-up run that kept fewer points than it needs:
 * a `max-step=` many periods long lets the step control take steps as long as the run when the
 * swing stays below the accuracy floor. Placed at `max-step=` (or the analysis), with the largest
 * step that would give enough.
 */
export function refuseSparseRecord(analysis: StartupAnalysis, points: number, until: number, maxStep: number): void {
  if (points >= MIN_SAMPLES) return;
  throw inputError("window-too-short", `the start-up run kept ${points} points over ${shown(until)} with max-step=${shown(maxStep)}, too few to measure (it needs ${MIN_SAMPLES})`, {
    span: analysis.optionSpans?.["max-step"] ?? analysis.span,
    hint: `give max-step= at most ${shown(until / (4 * MIN_SAMPLES))}, or leave it out (a hundredth of the predicted period)`,
  });
}
