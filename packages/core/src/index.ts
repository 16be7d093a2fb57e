/**
 * The Onset engine: circuits, analyses, start-up metrics, studies and design helpers. This
 * entry is the stable API (it runs on any JavaScript platform, no Node built-ins); the solver's
 * internals are in `@onset/core/engine` and the worker-thread pool in `@onset/core/node`.
 * @packageDocumentation
 */

// Circuit model
export { GROUND, probeName } from "./circuit/circuit.js";
export type {
  AnalysisSpec,
  BiasAnalysis,
  Circuit,
  OptionValue,
  PartSpec,
  PolesAnalysis,
  Probe,
  ResponseAnalysis,
  SpecAnalysis,
  SpecCriterion,
  SpecMetric,
  StartupAnalysis,
  StartupKick,
  SteadyAnalysis,
  StudyMeasure,
  SweepAnalysis,
  ToleranceAnalysis,
  ToleranceSpec,
  TransientAnalysis,
} from "./circuit/circuit.js";
export { analysisOf } from "./circuit/analysis-of.js";
export type { AnalysisKind } from "./circuit/analysis-of.js";
export { OnsetError, inputError, isOnsetError, simulationError } from "./circuit/diagnostic.js";
export { badArgument, describe as describeArgument } from "./circuit/arguments.js";
export type { Diagnostic, Severity, SourceSpan, Stage } from "./circuit/diagnostic.js";
export type {
  NameOption,
  NodePairOption,
  NumberOption,
  NumberPairOption,
  OptionSchema,
  PartKindSchema,
  PointsOption,
  StateSchema,
  UnitSymbol,
  ValueSchema,
  WordOption,
} from "./circuit/schema.js";
export { checkTopology, nodesOfPart } from "./circuit/topology.js";
export { closestName, didYouMean } from "./circuit/suggest.js";

// Parts
export { builtinPresets, partKinds } from "./devices/registry.js";
export { AUDIO_TAPER_BASE, taperFraction } from "./devices/pot.js";
export { DEFAULT_RAILS, opampConstants, opampPresets } from "./devices/opamp.js";
export { THERMAL_VOLTAGE } from "./devices/diode.js";

// Limits
export { budgetOf, isRunLimitError, LIMIT_CODES, RUN_LIMIT_FLAGS, RUN_LIMITS, RunBudget, RunLimitError, runLimitError } from "./analyses/limits.js";
export type { BudgetOptions, LimitName, RunLimitRecord, RunLimits, SteppingRun, WorkerLimits } from "./analyses/limits.js";

// Analyses
export { DEFAULT_TOLERANCES } from "./solver/tolerances.js";
export type { Tolerances } from "./solver/tolerances.js";
export type { QuantityUnit } from "./solver/quantities.js";
export type { BiasMethod } from "./analyses/bias.js";
export type { StepperStats } from "./analyses/stepper.js";
export { runTransient } from "./analyses/transient.js";
export type { ProgressListener, RunOptions, Signal, TransientResult } from "./analyses/transient.js";
export { probeUnit } from "./analyses/probes.js";
export { runBias } from "./analyses/bias-report.js";
export type { BiasResult } from "./analyses/bias-report.js";
export type { ImplausiblePart } from "./analyses/operating-check.js";
export { IMPLAUSIBLE_CURRENT, IMPLAUSIBLE_JUNCTION_VOLTAGE } from "./analyses/operating-check.js";
export { onImaginaryAxis, runPoles, startsFrom } from "./analyses/poles.js";
export type { Pole, PolesResult } from "./analyses/poles.js";
export { RESPONSE_DEFAULTS, runResponse } from "./analyses/response.js";
export type { PhaseCrossing, ResponsePoint, ResponseResult } from "./analyses/response.js";
export { DEFAULT_KICK, DEFAULT_KICK_LEVEL, runStartup } from "./analyses/startup.js";
export type { SettledFigures, StartupResult, StartupRun, StartupTimeSpread } from "./analyses/startup.js";
export type { NumericalError } from "./steady/refine.js";
export { DEFAULT_STEADY_CYCLES, runSteady, steadySeed } from "./analyses/steady.js";
export type { OrbitSeed, SteadyOptions, SteadyPrediction, SteadyResult } from "./analyses/steady.js";
export type { OrbitStability } from "./steady/stability.js";
export type { Multiplier } from "./steady/shooting.js";
export { RITZ_TOLERANCE } from "./steady/ritz-multipliers.js";
export type { RitzMultiplier } from "./steady/ritz-multipliers.js";
export { DEFAULT_RAMP, DEFAULT_TEMPERATURE, NOISE_BAND } from "./analyses/excitation.js";
export type { Excitation } from "./analyses/excitation.js";
export { circuitSpec, isSimulating, runAnalysis, runCircuit, specCriteria } from "./analyses/run.js";
export type { CircuitRun } from "./analyses/run.js";
export { analysisModel, analysisModels } from "./analyses/registry.js";
export type { AnalysisResult, SimulatingAnalysis, SimulatingKind } from "./analyses/registry.js";
export type { AnalysisModel, ResultOf, SpecOf } from "./analyses/analysis-model.js";
export type {
  AnalysisChecks,
  AnalysisNameOption,
  AnalysisNumberOption,
  AnalysisOption,
  AnalysisOptions,
  AnalysisOptionValues,
  AnalysisRange,
  AnalysisWordOption,
  OptionPlace,
} from "./circuit/analysis-schema.js";

// Metrics and specs
export { measureStartup } from "./metrics/startup.js";
export type { StartupEnvelope, StartupMetrics } from "./metrics/startup.js";
export { envelopeFitAt } from "./metrics/envelope-fit.js";
export type { EnvelopeFit } from "./metrics/envelope-fit.js";
export type { StartupMetricsOptions } from "./metrics/startup-options.js";
export type { LinearPrediction } from "./metrics/oscillation-kind.js";
export type { StartupVerdict } from "./metrics/verdict.js";
export { harmonicAnalysis } from "./metrics/harmonic-analysis.js";
export type { HarmonicAnalysis } from "./metrics/harmonic-analysis.js";
export { risingCrossings } from "./metrics/crossings.js";
export { periodicSpectrum, thdOfPeriodicSamples } from "./metrics/spectrum.js";
export type { Harmonic, PeriodicSpectrum } from "./metrics/spectrum.js";
export { evaluateSpec, judgedValue, meets, metricValue, sampleCriteria } from "./spec/evaluate.js";
export type { CriterionResult, JudgedMetrics, SpecReport } from "./spec/evaluate.js";

// Design and statistics
export { E_SERIES, isSeriesName, snapToSeries } from "./design/eseries.js";
export { chooseCapacitor, writeValue } from "./design/choose.js";
export { designOscillator, STARTUP_GROWTH, twinTCrossing } from "./design/oscillator.js";
export type { AmplitudeLimit, DesignChoice, DesignOptions, DesignRequest, DesignResult, SimulatedStartup, Topology } from "./design/oscillator.js";
export type { DesignedAnalysis, DesignedCriterion, DesignedFile, DesignedPart } from "./design/designed-file.js";
export { AMPLITUDE_LIMITS, lampWienAmplitude, thermistorWienAmplitude } from "./design/wien-limiters.js";
export type { SeriesName } from "./design/eseries.js";
export { wilsonInterval, Z95 } from "./stats/wilson.js";
export type { Interval } from "./stats/wilson.js";
export { percentileOfSorted, REPORTED_PERCENTILES, summarize } from "./stats/percentiles.js";
export type { PercentileSummary } from "./stats/percentiles.js";

// Studies: sweeps, tolerance Monte Carlo, design window
export { drawSample } from "./study/draw.js";
export type { Distribution } from "./study/draw.js";
export { runSample, SAMPLE_METRICS, startupAnalysisOf } from "./study/sample.js";
export { steadyAnalysisOf, steadySample, steadyVerdict } from "./study/steady-sample.js";
export { studyProbeUnit } from "./study/probe-unit.js";
export type { SampleMetrics, SampleOutcome, SampleSettings } from "./study/sample.js";
export { summarizeSamples } from "./study/summary.js";
export type { CriterionYield, ToleranceSample, ToleranceSummary, YieldSummary } from "./study/summary.js";
export { inThreadPool } from "./study/pool.js";
export type { JobPool, JobPoolContext, JobPoolFactory } from "./study/pool.js";
export { runJob, runSeed } from "./study/jobs.js";
export type { Job, JobResult, SeedOutcome } from "./study/jobs.js";
export { seedsOf, startupSpread, startupSpreadOnPool, timeSpread } from "./study/startup-spread.js";
export { runCircuitInParallel } from "./study/run-parallel.js";
export type { ParallelRunOptions } from "./study/run-parallel.js";
export { runToleranceStudy, shardIndices } from "./study/tolerance.js";
export type { CircuitBuilder, Shard, ToleranceStudyOptions } from "./study/tolerance.js";
export type { PortableBuilder } from "./study/shared-study.js";
export { oscillates, runSweep, sweepValues } from "./study/sweep.js";
export { sweepCount } from "./study/sweep-count.js";
export { refuseStudy } from "./study/study-size.js";
export type { StartThreshold, SweepOptions, SweepPoint, SweepResult } from "./study/sweep.js";
export { runSweepInParallel } from "./study/sweep-parallel.js";
export type { ParallelSweepOptions } from "./study/sweep-parallel.js";
export type { SteadySettingOutcome } from "./study/sweep-steady.js";
export { DEFAULT_REQUIRED_YIELD, requiredYield, runDesignWindow, widestPassingRange } from "./study/window.js";
export type { DesignWindow, WindowPoint } from "./study/window.js";
