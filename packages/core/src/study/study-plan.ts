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

/** Sample `index` drawn and elaborated: its values, its circuit and where its shooting starts. */
export function sampleJob(plan: StudyPlan, build: CircuitBuilder, index: number): { readonly drawn: Record<string, number>; readonly circuit: Circuit; readonly start?: SeedStart } {
  const drawn = drawSample(plan.tolerances, plan.analysis.seed, index, plan.analysis.dist);
  const circuit = build({ ...plan.fixed, ...drawn });
  if (!hasMeasure(circuit, plan.analysis)) throw nothingToMeasure(plan.analysis);
  const seed = plan.settings.seed;
  const start = plan.predictor && seed ? predictedStart(seed, plan.predictor, drawn) : undefined;
  return { drawn, circuit, ...(start ? { start } : {}) };
}

/** Runs sample `index` of the plan in this thread. */
export function sampleHere(plan: StudyPlan, build: CircuitBuilder, index: number, budget: RunBudget): ToleranceSample {
  const { drawn, circuit, start } = sampleJob(plan, build, index);
  const outcome: SampleOutcome = runSample(circuit, plan.settings, budget, start);
  return { index, drawn, ...outcome };
}
