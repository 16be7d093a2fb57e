/**
 * The solver's internals, for tools that build on the engine itself: devices and their
 * stamps, the MNA system and its state table, LU factorisation, the Newton core, the transient
 * stepper and its snapshots, probes, linearisation, the noise sources, the periodic steady
 * state and the random streams. Unlike the main entry, these may change in any release.
 * @packageDocumentation
 */

// Devices
export { deviceModels } from "./devices/registry.js";
export type { Device, DeviceModel, LinearStamp, NoiseGenerator, NonlinearLoad, NonlinearTerm, PartTopology, PowerOn, SetupContext, SourceTerm } from "./devices/device.js";
export { powerOnLevel } from "./devices/device.js";
export { BOLTZMANN, thermalCurrent, thermalVoltage, ZERO_CELSIUS } from "./devices/thermal-noise.js";
export { lampConstants, lampNetwork, TUNGSTEN_EXPONENT } from "./devices/lamp.js";
export type { LampConstants } from "./devices/lamp.js";
export { REFERENCE_TEMPERATURE, thermistorConstants, thermistorNetwork } from "./devices/thermistor.js";
export type { ThermistorConstants } from "./devices/thermistor.js";
export type { ConductanceState, ResistanceLaw, ThermalNetwork } from "./devices/heated-resistor.js";
export { CHANNEL_LEAK, channelCurrent, GATE_SATURATION, jfetConstants } from "./devices/jfet.js";
export type { ChannelState, JfetConstants } from "./devices/jfet.js";

// The MNA system, its state table and the solvers
export { LuSolver } from "./solver/lu.js";
export { buildSystem, DEFAULT_AMBIENT, withSources } from "./solver/system.js";
export type { BuildOptions, MnaSystem, UnknownInfo, UnknownRole } from "./solver/system.js";
export { QUANTITIES, isQuantity, unitOf } from "./solver/quantities.js";
export type { Quantity, QuantityUnit } from "./solver/quantities.js";
export { resolveTolerances } from "./solver/tolerances.js";
export { NewtonSolver } from "./solver/newton.js";
export { Linearisation } from "./solver/linearisation.js";
export { solveBias } from "./analyses/bias.js";
export type { BiasPoint } from "./analyses/bias.js";

// Time stepping and probes
export { TransientStepper } from "./analyses/stepper.js";
export type { CircuitState, StepObserver, StepperSettings, StepperSnapshot } from "./analyses/stepper.js";
export { ProbeRecorder, advanceWithProgress, defaultMaxStep } from "./analyses/transient.js";
export { allNodeProbes, probeReader, probeWeights } from "./analyses/probes.js";
export type { ProbeReader, ProbeWeights } from "./analyses/probes.js";

// Small signal
export { linearize } from "./analyses/linearize.js";
export type { SmallSignal } from "./analyses/linearize.js";
export { dominantPair, pencilPoles } from "./analyses/poles.js";
export { PhasorSolver } from "./analyses/response.js";
export { noiseLevel, noiseShape } from "./analyses/noise-level.js";
export { ComplexLu } from "./solver/complex-lu.js";
export { eigenvalues } from "./solver/eigenvalues.js";
export type { Eigenvalues } from "./solver/eigenvalues.js";

// Periodic steady state (shooting)
export { PeriodicMap } from "./steady/periodic-map.js";
export type { MapSensitivity, PeriodStart } from "./steady/periodic-map.js";
export { shootOrbit } from "./steady/shooting.js";
export { trustStep, nextRadius } from "./steady/trust-region.js";
export { IterationCap, LONGEST_SHOOTING } from "./steady/iteration-cap.js";
export type { Multiplier, PeriodicOrbit, ShootingJacobian, ShootingOptions } from "./steady/shooting.js";
export { orbitFigures, orbitMetrics } from "./steady/orbit-metrics.js";
export type { OrbitExtremes, OrbitMetrics } from "./steady/orbit-metrics.js";
export { cornerIntegralBounds } from "./steady/corner-integrals.js";
export type { CornerIntegralBounds, PeriodSamples } from "./steady/corner-integrals.js";
export { orbitPointLimit, recordPeriod, refineOrbit } from "./steady/refine.js";
export { OrbitApproach } from "./steady/approach.js";
export { largestNode } from "./steady/growing-mode.js";
export { SampleWindow } from "./steady/sample-window.js";
export type { Approach } from "./steady/approach.js";
export type { NumericalError, RefinedOrbit } from "./steady/refine.js";

// A study's samples shot from the nominal's orbit, moved to first order
export { predictedStart, seedPredictor } from "./study/seed-predictor.js";
export type { SeedPart, SeedPredictor, SeedStart } from "./study/seed-predictor.js";

// Noise sources and random streams
export { randomStream } from "./random/stream.js";
export type { RandomStream } from "./random/stream.js";
export { normalAt, streamKey } from "./random/counter-normal.js";
export type { StreamKey } from "./random/counter-normal.js";
export { SmoothNoise, sigmaForDensity } from "./waves/smooth-noise.js";
export { NoiseBank } from "./waves/noise-bank.js";
export type { NoiseBankSettings } from "./waves/noise-bank.js";

// Name suggestions
export { editDistance, suggestionScore } from "./circuit/suggest.js";
