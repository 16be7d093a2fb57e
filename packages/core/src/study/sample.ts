import type { Circuit, SpecCriterion, StartupAnalysis, StudyMeasure } from "../circuit/circuit.js";
import { steadySample } from "./steady-sample.js";
import { isOnsetError } from "../circuit/diagnostic.js";
import { runStartup } from "../analyses/startup.js";
import { isRunLimitError, RunBudget } from "../analyses/limits.js";
import type { Tolerances } from "../solver/tolerances.js";
import type { StartupVerdict } from "../metrics/verdict.js";
import { judgedValue, meets, sampleCriteria } from "../spec/evaluate.js";
import type { NumericalError } from "../steady/refine.js";
import type { OrbitSeed } from "../analyses/steady.js";
import type { SeedStart } from "./seed-predictor.js";

/** The metrics kept for every Monte Carlo sample (SI units). */
export interface SampleMetrics {
  readonly verdict: StartupVerdict;
  readonly frequency: number | null;
  readonly amplitude: number | null;
  readonly thd: number | null;
  readonly startupTime: number | null;
  readonly settlingTime: number | null;
  readonly growthRate: number | null;
  readonly offset: number | null;
  readonly rms: number | null;
  readonly peakToPeak: number | null;
  /** The linear prediction at the bias point. */
  readonly predictedFrequency: number | null;
  readonly predictedGrowthRate: number | null;
  /** Each settled figure's estimated numerical error (absolute), or null when it has none. */
  readonly numericalError: NumericalError | null;
}

/** The metric names summarised over samples, in report order. */
export const SAMPLE_METRICS = [
  "frequency",
  "amplitude",
  "thd",
  "startupTime",
  "settlingTime",
  "growthRate",
  "offset",
  "predictedFrequency",
] as const satisfies ReadonlyArray<keyof SampleMetrics>;

/** One Monte Carlo sample's result: its metrics (null when its simulation failed), pass/fail and why. */
export interface SampleOutcome {
  readonly metrics: SampleMetrics | null;
  readonly pass: boolean;
  /** Texts of the criteria this sample failed. */
  readonly failures: readonly string[];
  /** When the simulation itself failed: its message. */
  readonly error?: string;
}

/** What every sample of a study shares: plain data, so it can be posted to a worker thread. */
export interface SampleSettings {
  /** The spec criteria each sample is judged on. */
  readonly criteria: readonly SpecCriterion[];
  /** Solver tolerances to change from their defaults. */
  readonly tolerances?: Partial<Tolerances>;
  /** `steady`: each sample's figures come from its periodic steady state (see `steadySample`). */
  readonly measure?: StudyMeasure;
  /** Under `steady`: the nominal's orbit each sample's shooting starts from. */
  readonly seed?: OrbitSeed;
}

/** The first startup analysis of a circuit, which every sample is judged on. */
export function startupAnalysisOf(circuit: Circuit): StartupAnalysis | undefined {
  return circuit.analyses.find((a): a is StartupAnalysis => a.kind === "startup");
}

/**
 * Runs one sample: the circuit's startup analysis (and the linear prediction) with the drawn
 * values already elaborated into it, then its criteria (under `steady`, `start` is where its
 * shooting starts, see {@link predictedStart}). A simulation failure fails the sample;
 * a limit that runs out ({@link RunLimitError}) stops it and is thrown, so the study stops too.
 */
export function runSample(circuit: Circuit, settings: SampleSettings, budget: RunBudget = new RunBudget(), start?: SeedStart): SampleOutcome {
  if (settings.measure === "steady") return steadySample(circuit, settings, budget, start);
  const analysis = startupAnalysisOf(circuit);
  if (!analysis) return { metrics: null, pass: false, failures: ["no startup analysis"], error: "the file has no startup analysis" };
  try {
    const r = runStartup(circuit, analysis, { tolerances: settings.tolerances, budget });
    // The startup run already linearised this circuit at its bias point: that is the poles analysis.
    const { frequency: predictedFrequency, growthRate: predictedGrowthRate } = r.run.predicted;
    const metrics: SampleMetrics = {
      verdict: r.verdict,
      frequency: r.frequency,
      amplitude: r.amplitude,
      thd: r.thd,
      startupTime: r.startupTime,
      settlingTime: r.settlingTime,
      growthRate: r.growthRate,
      offset: r.offset,
      rms: r.rms,
      peakToPeak: r.peakToPeak,
      predictedFrequency,
      predictedGrowthRate,
      numericalError: r.numericalError,
    };
    const failures = sampleCriteria(settings.criteria)
      .filter((c) => !meets(c, judgedValue(r, c)))
      .map((c) => c.text);
    return { metrics, pass: failures.length === 0 && r.verdict === "settled", failures: r.verdict === "settled" ? failures : [`verdict ${r.verdict}`, ...failures] };
  } catch (error) {
    return { metrics: null, pass: false, failures: ["simulation failed"], error: failureMessage(error) };
  }
}

/** The message of a run that failed; a limit that ran out ({@link RunLimitError}) is thrown on, so the study stops too. */
export function failureMessage(error: unknown): string {
  if (isRunLimitError(error)) throw error;
  return isOnsetError(error) ? error.diagnostic.message : error instanceof Error ? error.message : String(error);
}
