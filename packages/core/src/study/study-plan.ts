import type { Circuit, SpecCriterion, ToleranceAnalysis, ToleranceSpec } from "../circuit/circuit.js";
import type { RunBudget } from "../analyses/limits.js";
import type { Tolerances } from "../solver/tolerances.js";
import { drawSample } from "./draw.js";
import { runSample, type SampleOutcome, type SampleSettings } from "./sample.js";
import { predictedStart, seedPredictor, type SeedPredictor, type SeedStart } from "./seed-predictor.js";
import { nominalSeed } from "./steady-sample.js";
import { hasMeasure, nothingToMeasure } from "./study-size.js";
import type { ToleranceSample } from "./summary.js";

/** Builds the circuit with some values overridden by name (the elaborator behind it). */
export type CircuitBuilder = (overrides: Readonly<Record<string, number>>) => Circuit;

/** What a study's samples are drawn and run from (the same in every thread that runs them). */
export interface StudyPlan {
  /** The tolerances, their nominals at the study's fixed values. */
  readonly tolerances: readonly ToleranceSpec[];
  readonly analysis: ToleranceAnalysis;
  readonly fixed?: Readonly<Record<string, number>>;
  /** One object for every sample (a worker is sent it once). */
  readonly settings: SampleSettings;
  readonly predictor?: SeedPredictor;
}

/**
 * The settings every sample shares: under `steady`, the nominal's orbit (see `nominalSeed`) and
 * how each sample's start moves from it (see `seedPredictor`). Deterministic: any thread that
 * plans the same study gets the same plan, so a sample does not depend on where it runs.
 */
export function studyPlan(
  build: CircuitBuilder,
  tolerances: readonly ToleranceSpec[],
  analysis: ToleranceAnalysis,
  criteria: readonly SpecCriterion[],
  options: { readonly fixed?: Readonly<Record<string, number>>; readonly tolerances?: Partial<Tolerances>; readonly budget: RunBudget },
): StudyPlan {
  const { fixed, budget } = options;
  const seed = analysis.measure === "steady" ? nominalSeed(build({ ...fixed }), options.tolerances, budget) : undefined;
  const settings: SampleSettings = {
    criteria,
    ...(options.tolerances ? { tolerances: options.tolerances } : {}),
    ...(analysis.measure === "steady" ? { measure: "steady" as const } : {}),
    ...(seed ? { seed } : {}),
  };
  const predictor = seed ? seedPredictor(build, fixed, tolerances, seed, { ...(options.tolerances ? { tolerances: options.tolerances } : {}), budget }) : undefined;
  return { tolerances, analysis, ...(fixed ? { fixed } : {}), settings, ...(predictor ? { predictor } : {}) };
}

/** What a sample is drawn and built from: the part of a plan that needs no orbit. */
export type SampleSource = Pick<StudyPlan, "tolerances" | "analysis" | "fixed">;

/** A sample's drawn values and its circuit. */
export interface BuiltSample {
  readonly drawn: Record<string, number>;
  readonly circuit: Circuit;
}

/** Sample `index` drawn and elaborated. */
export function builtSample(source: SampleSource, build: CircuitBuilder, index: number): BuiltSample {
  const drawn = drawSample(source.tolerances, source.analysis.seed, index, source.analysis.dist);
  const circuit = build({ ...source.fixed, ...drawn });
  if (!hasMeasure(circuit, source.analysis)) throw nothingToMeasure(source.analysis);
  return { drawn, circuit };
}

/** Where a drawn sample's shooting starts: moved from the nominal's orbit by the plan's predictor (see `predictedStart`). */
function sampleStart(plan: StudyPlan, drawn: Readonly<Record<string, number>>): SeedStart | undefined {
  const seed = plan.settings.seed;
  return plan.predictor && seed ? predictedStart(seed, plan.predictor, drawn) : undefined;
}

/** Sample `index` drawn and elaborated: its values, its circuit and where its shooting starts. */
export function sampleJob(plan: StudyPlan, build: CircuitBuilder, index: number): BuiltSample & { readonly start?: SeedStart } {
  const built = builtSample(plan, build, index);
  const start = sampleStart(plan, built.drawn);
  return { ...built, ...(start ? { start } : {}) };
}

/** Runs a built sample of the plan in this thread. */
export function runBuilt(plan: StudyPlan, index: number, { drawn, circuit }: BuiltSample, budget: RunBudget): ToleranceSample {
  const outcome: SampleOutcome = runSample(circuit, plan.settings, budget, sampleStart(plan, drawn));
  return { index, drawn, ...outcome };
}

/** Runs sample `index` of the plan in this thread. */
export function sampleHere(plan: StudyPlan, build: CircuitBuilder, index: number, budget: RunBudget): ToleranceSample {
  return runBuilt(plan, index, builtSample(plan, build, index), budget);
}
