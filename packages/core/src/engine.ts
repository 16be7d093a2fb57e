/**
 * The solver's internals, for tools that build on the engine itself: devices and their
 * stamps, the MNA system, LU factorisation, the Newton core, the transient stepper, probes,
 * linearisation and the random streams. Unlike the main entry, these may change in any
 * release.
 * @packageDocumentation
 */
export { deviceModels } from "./devices/registry.js";
export type { Device, DeviceModel, LinearStamp, NonlinearLoad, NonlinearTerm, PartTopology, SetupContext, SourceTerm } from "./devices/device.js";
export { LuSolver } from "./solver/lu.js";
export { buildSystem } from "./solver/system.js";
export type { MnaSystem, UnknownInfo } from "./solver/system.js";
export { NewtonSolver } from "./solver/newton.js";
export { solveBias } from "./analyses/bias.js";
export type { BiasPoint } from "./analyses/bias.js";
export { TransientStepper } from "./analyses/stepper.js";
export type { StepObserver, StepperSettings } from "./analyses/stepper.js";
export { ProbeRecorder, advanceWithProgress, defaultMaxStep } from "./analyses/transient.js";
export { allNodeProbes, probeReader } from "./analyses/probes.js";
export { linearize } from "./analyses/linearize.js";
export type { SmallSignal } from "./analyses/linearize.js";
export { dominantPair, pencilPoles } from "./analyses/poles.js";
export { PhasorSolver } from "./analyses/response.js";
export { randomStream } from "./random/stream.js";
export type { RandomStream } from "./random/stream.js";
