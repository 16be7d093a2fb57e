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
  SweepAnalysis,
  ToleranceAnalysis,
  ToleranceSpec,
  TransientAnalysis,
} from "./circuit/circuit.js";
export { OnsetError, inputError, isOnsetError, simulationError } from "./circuit/diagnostic.js";
export type { Diagnostic, Severity, SourceSpan, Stage } from "./circuit/diagnostic.js";
export type {
  NameOption,
  NodePairOption,
  NumberOption,
  NumberPairOption,
  OptionSchema,
  PartKindSchema,
  PointsOption,
  UnitSymbol,
  ValueSchema,
  WordOption,
} from "./circuit/schema.js";
export { checkTopology, nodesOfPart } from "./circuit/topology.js";
export { closestName, didYouMean, editDistance, suggestionScore } from "./circuit/suggest.js";

// Devices
export { builtinPresets, deviceModels, partKinds } from "./devices/registry.js";
export type { Device, DeviceModel, LinearStamp, NoiseGenerator, NonlinearLoad, NonlinearTerm, PartTopology, PowerOn, SetupContext, SourceTerm } from "./devices/device.js";
export { powerOnLevel } from "./devices/device.js";
export { BOLTZMANN, thermalCurrent, thermalVoltage, ZERO_CELSIUS } from "./devices/thermal-noise.js";
export { AUDIO_TAPER_BASE, taperFraction } from "./devices/pot.js";
export { DEFAULT_RAILS, opampConstants, opampPresets } from "./devices/opamp.js";
export { THERMAL_VOLTAGE } from "./devices/diode.js";

// Numerics
export { LuSolver } from "./solver/lu.js";
export { randomStream } from "./random/stream.js";
export type { RandomStream } from "./random/stream.js";
export { buildSystem, withSources } from "./solver/system.js";
export type { BuildOptions, MnaSystem, UnknownInfo } from "./solver/system.js";
export { normalAt, streamKey } from "./random/counter-normal.js";
export type { StreamKey } from "./random/counter-normal.js";
export { SmoothNoise, sigmaForDensity } from "./waves/smooth-noise.js";
export { NoiseBank } from "./waves/noise-bank.js";
export type { NoiseBankSettings } from "./waves/noise-bank.js";
export { NewtonSolver } from "./solver/newton.js";
export { DEFAULT_TOLERANCES } from "./solver/tolerances.js";
export type { Tolerances } from "./solver/tolerances.js";

// Analyses
export { solveBias } from "./analyses/bias.js";
export type { BiasMethod, BiasPoint } from "./analyses/bias.js";
export { TransientStepper } from "./analyses/stepper.js";
export type { StepObserver, StepperSettings, StepperStats } from "./analyses/stepper.js";
export { ProbeRecorder, defaultMaxStep, runTransient } from "./analyses/transient.js";
export type { ProgressListener, RunOptions, Signal, TransientResult } from "./analyses/transient.js";
export { allNodeProbes, probeReader, probeWeights } from "./analyses/probes.js";
export type { ProbeWeights } from "./analyses/probes.js";
export { noiseLevel, noiseShape } from "./analyses/noise-level.js";
export { runBias } from "./analyses/bias-report.js";
export type { BiasResult } from "./analyses/bias-report.js";
export { linearize } from "./analyses/linearize.js";
export type { SmallSignal } from "./analyses/linearize.js";
export { dominantPair, pencilPoles, runPoles, startsFrom } from "./analyses/poles.js";
export type { Pole, PolesResult } from "./analyses/poles.js";
export { PhasorSolver, RESPONSE_DEFAULTS, runResponse } from "./analyses/response.js";
export type { PhaseCrossing, ResponsePoint, ResponseResult } from "./analyses/response.js";

// Design and statistics
export { E_SERIES, isSeriesName, snapToSeries } from "./design/eseries.js";
export { chooseCapacitor, writeValue } from "./design/choose.js";
export { designOscillator, STARTUP_GROWTH, twinTCrossing } from "./design/oscillator.js";
export type { DesignChoice, DesignOptions, DesignRequest, DesignResult, SimulatedStartup, Topology } from "./design/oscillator.js";
export type { SeriesName } from "./design/eseries.js";
export { wilsonInterval, Z95 } from "./stats/wilson.js";
export type { Interval } from "./stats/wilson.js";
export { percentileOfSorted, REPORTED_PERCENTILES, summarize } from "./stats/percentiles.js";
export type { PercentileSummary } from "./stats/percentiles.js";
export { DEFAULT_KICK, DEFAULT_KICK_LEVEL, runStartup } from "./analyses/startup.js";
export type { StartupResult, StartupRun, StartupTimeSpread } from "./analyses/startup.js";
export { DEFAULT_RAMP, DEFAULT_TEMPERATURE, NOISE_BAND } from "./analyses/excitation.js";
export type { Excitation } from "./analyses/excitation.js";
export type { LinearPrediction } from "./metrics/oscillation-kind.js";
export { measureStartup } from "./metrics/startup.js";
export type { StartupMetrics } from "./metrics/startup.js";
export type { StartupMetricsOptions } from "./metrics/startup-options.js";
export type { StartupVerdict } from "./metrics/verdict.js";
export { harmonicAnalysis } from "./metrics/harmonic-analysis.js";
export type { HarmonicAnalysis } from "./metrics/harmonic-analysis.js";
export { risingCrossings } from "./metrics/crossings.js";
export { periodicSpectrum, thdOfPeriodicSamples } from "./metrics/spectrum.js";
export type { Harmonic, PeriodicSpectrum } from "./metrics/spectrum.js";
export { circuitSpec, isSimulating, runAnalysis, runCircuit, specCriteria } from "./analyses/run.js";
export type { AnalysisResult, CircuitRun, SimulatingAnalysis } from "./analyses/run.js";
export { evaluateSpec, judgedValue, meets, metricValue, sampleCriteria } from "./spec/evaluate.js";
export type { CriterionResult, JudgedMetrics, SpecReport } from "./spec/evaluate.js";

// Studies: sweeps, tolerance Monte Carlo, design window
export { drawSample } from "./study/draw.js";
export type { Distribution } from "./study/draw.js";
export { runSample, SAMPLE_METRICS, startupAnalysisOf } from "./study/sample.js";
export type { SampleMetrics, SampleOutcome, SampleSettings } from "./study/sample.js";
export { summarizeSamples } from "./study/summary.js";
export type { CriterionYield, ToleranceSample, ToleranceSummary, YieldSummary } from "./study/summary.js";
export { createJobPool, createSamplePool, defaultJobs } from "./study/pool.js";
export type { JobPool, SamplePool } from "./study/pool.js";
export { runJob, runSeed } from "./study/jobs.js";
export type { Job, JobResult, SeedOutcome } from "./study/jobs.js";
export { seedsOf, startupSpread, startupSpreadOnPool, timeSpread } from "./study/startup-spread.js";
export { runCircuitInParallel } from "./study/run-parallel.js";
export { runToleranceStudy, shardIndices } from "./study/tolerance.js";
export type { CircuitBuilder, Shard, ToleranceStudyOptions } from "./study/tolerance.js";
export { oscillates, runSweep, sweepValues } from "./study/sweep.js";
export type { StartThreshold, SweepOptions, SweepPoint, SweepResult } from "./study/sweep.js";
export { DEFAULT_REQUIRED_YIELD, requiredYield, runDesignWindow, widestPassingRange } from "./study/window.js";
export type { DesignWindow, WindowPoint } from "./study/window.js";
