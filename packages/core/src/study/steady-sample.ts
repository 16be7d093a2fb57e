import type { Circuit, SteadyAnalysis } from "../circuit/circuit.js";
import { isRunLimitError, RunBudget } from "../analyses/limits.js";
import { runSteady, steadySeed, type OrbitSeed, type SteadyResult } from "../analyses/steady.js";
import { isOnsetError } from "../circuit/diagnostic.js";
import type { Tolerances } from "../solver/tolerances.js";
import type { SeedStart } from "./seed-predictor.js";
import type { StartupVerdict } from "../metrics/verdict.js";
import { judgedValue, meets, sampleCriteria } from "../spec/evaluate.js";
import { failureMessage, startupAnalysisOf, type SampleMetrics, type SampleOutcome, type SampleSettings } from "./sample.js";

/** The file's steady analysis, or one on its start-up's probe (with its THD orders, accuracy and temperature). */
export function steadyAnalysisOf(circuit: Circuit): SteadyAnalysis | undefined {
  const own = circuit.analyses.find((a): a is SteadyAnalysis => a.kind === "steady");
  if (own) return own;
  const startup = startupAnalysisOf(circuit);
  if (!startup) return undefined;
  return {
    kind: "steady",
    probe: startup.probe,
    ...(startup.harmonics === undefined ? {} : { harmonics: startup.harmonics }),
    ...(startup.bandwidth === undefined ? {} : { bandwidth: startup.bandwidth }),
    ...(startup.accuracy === undefined ? {} : { accuracy: startup.accuracy }),
    ...(startup.accuracyFloor === undefined ? {} : { accuracyFloor: startup.accuracyFloor }),
    ...(startup.maxStep === undefined ? {} : { maxStep: startup.maxStep }),
    ...(startup.temperature === undefined ? {} : { temperature: startup.temperature }),
    ...(startup.span ? { span: startup.span } : {}),
  };
}

/**
 * A steady result as a start-up verdict: a hard start's orbit `decaying` (left alone, the circuit
 * rests), a stable (or marginal) orbit `settled`, an unstable
 * one `unsettled` (the circuit would leave it); without an orbit, `decaying` when nothing at the
 * bias point grows (no pair starts, no real pole grows), else `unsettled` (it oscillates, latches
 * or relaxes, but no periodic orbit was found).
 */
export function steadyVerdict(r: SteadyResult): StartupVerdict {
  if (r.hardStart) return "decaying";
  if (r.found) return r.stability?.verdict === "unstable" ? "unsettled" : "settled";
  // Decaying only when nothing at the bias point grows: one that grows along a real pole latches or relaxes.
  return r.kind === "autonomous" && !r.predicted.starts && !r.predicted.realGrowth ? "decaying" : "unsettled";
}

/**
 * A steady result's figures as a sample's: its verdict (see {@link steadyVerdict}), the
 * predicted start-up time (when it was computed), no settling time and no measured growth rate.
 */
export function steadyMetrics(r: SteadyResult): SampleMetrics {
  return {
    verdict: steadyVerdict(r),
    frequency: r.frequency,
    amplitude: r.amplitude,
    thd: r.thd,
    startupTime: r.predicted.startupTime,
    settlingTime: null,
    growthRate: null,
    offset: r.offset,
    rms: r.rms,
    peakToPeak: r.peakToPeak,
    predictedFrequency: r.predicted.frequency,
    predictedGrowthRate: r.predicted.growthRate,
    numericalError: r.numericalError,
  };
}

/**
 * One Monte Carlo sample measured by its periodic steady state: the file's `steady` analysis (or
 * one on its start-up's probe) with the drawn values, on the transient's own grid only (the
 * samples' spread dwarfs the grid's error), shot from the nominal's orbit when the study has one
 * (`settings.seed`, see {@link nominalSeed}), moved to `start` (its predicted start, see
 * `predictedStart`) when given. There is no simulated start-up: the
 * start-up time is the linear prediction (see `SteadyPrediction.startupTime`), computed only
 * when a criterion reads it; settling time and measured growth rate are null.
 */
export function steadySample(circuit: Circuit, settings: SampleSettings, budget: RunBudget = new RunBudget(), start?: SeedStart): SampleOutcome {
  const analysis = steadyAnalysisOf(circuit);
  if (!analysis) return { metrics: null, pass: false, failures: ["no steady or startup analysis"], error: "the file has neither a steady nor a startup analysis" };
  const criteria = sampleCriteria(settings.criteria);
  try {
    const r = runSteady(circuit, analysis, {
      tolerances: settings.tolerances,
      budget,
      predictStartup: criteria.some((c) => c.metric === "startup"),
      singleGrid: true,
      waveform: false,
      operatingCheck: false,
      predictedMultipliers: true,
      hardStart: false,
      ...(settings.seed ? { seed: start ? { ...settings.seed, ...start } : settings.seed } : {}),
    });
    const metrics = steadyMetrics(r);
    const verdict = metrics.verdict;
    const failures = criteria.filter((c) => !meets(c, judgedValue(metrics, c))).map((c) => c.text);
    return { metrics, pass: failures.length === 0 && verdict === "settled", failures: verdict === "settled" ? failures : [`verdict ${verdict}`, ...failures] };
  } catch (error) {
    return { metrics: null, pass: false, failures: ["simulation failed"], error: failureMessage(error) };
  }
}

/**
 * The nominal circuit's orbit, which every sample's shooting starts from: computed once by the
 * study, the same whatever the number of workers or shards, so no sample depends on how the
 * work is shared out. Undefined when the nominal has no (autonomous) orbit; the samples then
 * start from their own transients.
 */
export function nominalSeed(nominal: Circuit, tolerances: Partial<Tolerances> | undefined, budget: RunBudget): OrbitSeed | undefined {
  const analysis = steadyAnalysisOf(nominal);
  if (!analysis) return undefined;
  try {
    return steadySeed(nominal, analysis, { ...(tolerances ? { tolerances } : {}), budget }) ?? undefined;
  } catch (error) {
    if (isRunLimitError(error) || !isOnsetError(error)) throw error;
    return undefined;
  }
}
