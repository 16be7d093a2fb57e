import { checkAnalysis, checkAnalysisFields, checkCircuit, checkOptions, checkSeconds } from "../circuit/arguments.js";
import { transientOptions } from "./kinds/transient-options.js";
import type { Circuit, PartSpec, Probe, TransientAnalysis } from "../circuit/circuit.js";
import { probeName } from "../circuit/circuit.js";
import { buildSystem, type MnaSystem } from "../solver/system.js";
import type { QuantityUnit } from "../solver/quantities.js";
import { accuracyTolerances, type Tolerances } from "../solver/tolerances.js";
import { ThinnedRecord } from "./thinned-record.js";
import { allNodeProbes, probeReader, probeUnit } from "./probes.js";
import { TransientStepper, type StepperStats } from "./stepper.js";
import { budgetOf, RUN_LIMITS, type BudgetOptions } from "./limits.js";
import { watchOperation, type ImplausiblePart } from "./operating-check.js";

/** One recorded signal. */
export interface Signal {
  /** As the probe is written: `o`, `o-ref`, `R1.i`. */
  readonly name: string;
  readonly probe: Probe;
  readonly unit: QuantityUnit;
  readonly values: Float64Array;
  /** Smallest and largest value over every accepted step (the stored values may be thinned). */
  readonly min?: number;
  readonly max?: number;
}

/** What `runTransient` returns: the accepted time points, every probed signal and the stepper's counts. */
export interface TransientResult {
  readonly analysis: "transient";
  /**
   * Time points (s), starting at 0: every accepted step, or on a long run every `stride`-th
   * (and the last), within `limits.maxStoredPoints`.
   */
  readonly time: Float64Array;
  /** Every how many accepted steps a point is stored (1 unless the run was long enough to thin). */
  readonly stride?: number;
  readonly signals: readonly Signal[];
  readonly stats: StepperStats;
  /** Parts far outside any physical operating point during the run (`implausible-operation`); absent when there are none. */
  readonly warnings?: readonly ImplausiblePart[];
}

/** Progress of a long run, reported every few thousand steps. */
export type ProgressListener = (time: number, until: number) => void;

/** Settings every analysis accepts. */
export interface RunOptions extends BudgetOptions {
  /** Solver tolerances to change from their defaults (`DEFAULT_TOLERANCES`). */
  readonly tolerances?: Partial<Tolerances>;
  /** Called every few thousand steps of a time-domain run. */
  readonly onProgress?: ProgressListener;
  /** Parts added for this run only (a start-up kick). */
  readonly extraParts?: readonly PartSpec[];
  /**
   * Whether a `startup` with `seeds=N` repeats its run for the other N − 1 seeds (default true);
   * sweeps and tolerance studies run each setting or sample with the first seed only.
   */
  readonly seedSpread?: boolean;
  /**
   * Whether a settled `startup` takes its settled figures from the periodic orbit next to the run,
   * with error bars (default true); false keeps the run's own last cycles, without bars — what the
   * refinement costs is the difference (the validation bench).
   */
  readonly settledFromOrbit?: boolean;
}

/** Smallest number of time points a transient keeps, however many probes it has. */
const MIN_STORED_TIMES = 64;

/**
 * Records the chosen probes at every accepted point, thinned to at most `maxValues` stored
 * values (time points × (probes + 1)); see {@link ThinnedRecord}.
 */
export class ProbeRecorder {
  private readonly store: ThinnedRecord;
  private readonly readers: ReturnType<typeof probeReader>[];
  private readonly units: QuantityUnit[];
  readonly probes: readonly Probe[];

  constructor(system: MnaSystem, probes: readonly Probe[], maxValues: number = RUN_LIMITS.maxStoredPoints) {
    this.probes = probes;
    this.units = probes.map((p) => probeUnit(system, p));
    this.readers = probes.map((p) => probeReader(system, p));
    const times = maxValues === Infinity ? Infinity : Math.max(MIN_STORED_TIMES, Math.floor(maxValues / (probes.length + 1)));
    this.store = new ThinnedRecord(probes.length, times);
  }

  readonly record = (t: number, x: Float64Array, dxdt: Float64Array): void => {
    for (let k = 0; k < this.readers.length; k++) this.store.set(k, this.readers[k]!(x, dxdt, t));
    this.store.add(t);
  };

  /** The stored time points (every `stride`-th accepted step, and the last). */
  times(): Float64Array {
    return this.store.times();
  }

  /** Every how many accepted steps a point was stored (1: every step). */
  get stride(): number {
    return this.store.stride;
  }

  signals(): Signal[] {
    return this.probes.map((probe, k) => ({
      name: probeName(probe),
      probe,
      unit: this.units[k]!,
      values: this.store.values(k),
      min: this.store.min[k]!,
      max: this.store.max[k]!,
    }));
  }
}

/** How often (in accepted steps) progress is reported. */
const PROGRESS_EVERY = 4096;

/** Advances a stepper to `until`, reporting progress between chunks. */
export function advanceWithProgress(stepper: TransientStepper, until: number, onProgress?: ProgressListener): void {
  if (!onProgress) {
    stepper.advance(until);
    return;
  }
  let steps = 0;
  stepper.observe(() => {
    if (++steps % PROGRESS_EVERY === 0) onProgress(stepper.t, until);
  });
  stepper.advance(until);
  onProgress(stepper.t, until);
}

/** The default largest step when the file sets none: a hundredth of the run. */
export function defaultMaxStep(until: number): number {
  return until / 100;
}

/** Runs a `transient` analysis on a circuit; left out, `start` is `bias` and `probes` every node, as in the statement. */
export function runTransient(circuit: Circuit, analysis: TransientAnalysis, options: RunOptions = {}): TransientResult {
  checkCircuit("runTransient", circuit);
  checkAnalysis("runTransient", analysis, "transient");
  checkSeconds("runTransient", "until", analysis.until);
  checkSeconds("runTransient", "maxStep", analysis.maxStep, true);
  checkAnalysisFields("runTransient", analysis as unknown as Readonly<Record<string, unknown>>, transientOptions);
  checkOptions("runTransient", options);
  const budget = budgetOf(options);
  budget.refuseLength(analysis.until, "the transient", analysis.span);
  const maxStep = analysis.maxStep ?? defaultMaxStep(analysis.until);
  budget.refuseSteps(analysis.until, maxStep, "the transient", analysis.span);
  const system = buildSystem(circuit, options.extraParts);
  const stepper = new TransientStepper(system, {
    // The statement's defaults where an API caller left them out.
    start: analysis.start ?? "bias",
    maxStep,
    tolerances: { ...accuracyTolerances(analysis.accuracy, analysis.accuracyFloor), ...options.tolerances },
  });
  const probes = analysis.probes !== undefined && analysis.probes.length > 0 ? analysis.probes : allNodeProbes(system);
  const recorder = new ProbeRecorder(system, probes, budget.maxStoredPoints);
  stepper.observe(recorder.record);
  const watch = watchOperation(stepper);
  budget.watch(stepper, "the transient", analysis.span);
  advanceWithProgress(stepper, analysis.until, options.onProgress);
  const thinned = recorder.stride > 1 ? { stride: recorder.stride } : {};
  const warnings = watch.finish("in the transient");
  return { analysis: "transient", time: recorder.times(), signals: recorder.signals(), stats: { ...stepper.stats }, ...thinned, ...(warnings.length > 0 ? { warnings } : {}) };
}
